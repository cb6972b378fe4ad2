#pragma once
// A Canvas that writes SVG elements (millimetre user units).
#include <string>

#include "report/canvas.hpp"

namespace rimline::report {

class SvgCanvas final : public Canvas {
 public:
  void polyline(const std::vector<Pt>& pts, const Pen& pen) override;
  void polygon(const std::vector<Pt>& pts, const std::optional<Rgb>& fill, const std::optional<Pen>& pen) override;
  void text(Pt at, const std::string& utf8, const TextStyle& style) override;
  void begin_group(const std::string& css_class, const std::string& tooltip) override;
  void end_group() override;

  const std::string& body() const { return body_; }

 private:
  std::string body_;
};

// Scene to document: width x height mm, with a heading line and the caution as a footer.
struct ProfileScene;
std::string scene_svg(const ProfileScene& scene, const std::string& project_name);

}  // namespace rimline::report
