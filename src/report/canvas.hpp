#pragma once
// The few drawing primitives the profile sheets need, in paper millimetres (y down), so the
// same drawing code feeds the SVG writer and the cairo PDF writer.
#include <optional>
#include <string>
#include <vector>

namespace rimline::report {

struct Pt {
  double x = 0.0;
  double y = 0.0;
};

struct Rgb {
  double r = 0.0, g = 0.0, b = 0.0;  // 0..1
};

// Line style: weight and dash pattern carry the meaning, so a greyscale print stays readable.
struct Pen {
  double width_mm = 0.25;
  std::vector<double> dash_mm;  // empty: solid
  Rgb color;
};

enum class Anchor { start, middle, end };

// The smallest text on a sheet: 2.5 mm on A3, so a print or a half-size copy stays legible
// (common drafting practice for A3 sheets, no source).
inline constexpr double min_text_mm = 2.5;

struct TextStyle {
  double size_mm = 2.5;  // cap-to-descender height, roughly the font size
  Anchor anchor = Anchor::start;
  bool bold = false;
  double rotate_deg = 0.0;  // counter-clockwise on the page
  Rgb color;
};

class Canvas {
 public:
  virtual ~Canvas() = default;
  virtual void polyline(const std::vector<Pt>& pts, const Pen& pen) = 0;
  // Closed shape, filled and/or outlined.
  virtual void polygon(const std::vector<Pt>& pts, const std::optional<Rgb>& fill, const std::optional<Pen>& pen) = 0;
  virtual void text(Pt at, const std::string& utf8, const TextStyle& style) = 0;
  // Groups let the SVG carry classes and tooltips; the PDF ignores them.
  virtual void begin_group(const std::string& css_class, const std::string& tooltip) = 0;
  virtual void end_group() = 0;
};

}  // namespace rimline::report
