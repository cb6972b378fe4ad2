#include "rimline/report/profile_svg.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "base/number_text.hpp"
#include "report/profile_draw.hpp"
#include "report/svg_canvas.hpp"
#include "rimline/report/outputs.hpp"

namespace rimline::report {
namespace {

constexpr double sheet_w = 420.0, sheet_h = 270.0, margin = 10.0;

std::string num(double v) {
  return fixed_text(std::isfinite(v) ? v : 0.0, 2);
}

std::string rgb(const Rgb& c) {
  char buf[32];
  auto b = [](double v) { return static_cast<int>(std::lround(std::clamp(v, 0.0, 1.0) * 255.0)); };
  std::snprintf(buf, sizeof buf, "#%02x%02x%02x", b(c.r), b(c.g), b(c.b));
  return buf;
}

std::string points(const std::vector<Pt>& pts) {
  std::string s;
  for (const auto& p : pts) s += (s.empty() ? "" : " ") + num(p.x) + "," + num(p.y);
  return s;
}

std::string stroke_attrs(const Pen& pen) {
  std::string s = " stroke=\"" + rgb(pen.color) + "\" stroke-width=\"" + num(pen.width_mm) + "\"";
  if (!pen.dash_mm.empty()) {
    std::string d;
    for (double v : pen.dash_mm) d += (d.empty() ? "" : " ") + num(v);
    s += " stroke-dasharray=\"" + d + "\"";
  }
  return s;
}

}  // namespace

std::string xml_escape(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  for (char c : text) {
    switch (c) {
      case '&': out += "&amp;"; break;
      case '<': out += "&lt;"; break;
      case '>': out += "&gt;"; break;
      case '"': out += "&quot;"; break;
      case '\'': out += "&#39;"; break;
      default:
        // Control characters other than tab and newline are not allowed in XML 1.0.
        if (static_cast<unsigned char>(c) < 0x20 && c != '\t' && c != '\n') out += ' ';
        else out += c;
    }
  }
  return out;
}

void SvgCanvas::polyline(const std::vector<Pt>& pts, const Pen& pen) {
  if (pts.size() < 2) return;
  body_ += "<polyline points=\"" + points(pts) + "\" fill=\"none\"" + stroke_attrs(pen) + "/>\n";
}

void SvgCanvas::polygon(const std::vector<Pt>& pts, const std::optional<Rgb>& fill, const std::optional<Pen>& pen) {
  if (pts.size() < 3) return;
  body_ += "<polygon points=\"" + points(pts) + "\" fill=\"" + (fill ? rgb(*fill) : "none") + "\"" +
           (pen ? stroke_attrs(*pen) : std::string(" stroke=\"none\"")) + "/>\n";
}

void SvgCanvas::text(Pt at, const std::string& utf8, const TextStyle& st) {
  const char* anchor = st.anchor == Anchor::middle ? "middle" : st.anchor == Anchor::end ? "end" : "start";
  body_ += "<text x=\"" + num(at.x) + "\" y=\"" + num(at.y) + "\" font-size=\"" + num(st.size_mm) +
           "\" text-anchor=\"" + anchor + "\"" + (st.bold ? " font-weight=\"bold\"" : "") + " fill=\"" +
           rgb(st.color) + "\"";
  if (st.rotate_deg != 0.0)  // SVG rotates clockwise for positive angles (y down)
    body_ += " transform=\"rotate(" + num(-st.rotate_deg) + " " + num(at.x) + " " + num(at.y) + ")\"";
  body_ += ">" + xml_escape(utf8) + "</text>\n";
}

void SvgCanvas::begin_group(const std::string& css_class, const std::string& tooltip) {
  body_ += "<g class=\"" + xml_escape(css_class) + "\">";
  if (!tooltip.empty()) body_ += "<title>" + xml_escape(tooltip) + "</title>";
  body_ += "\n";
}

void SvgCanvas::end_group() { body_ += "</g>\n"; }

std::string scene_svg(const ProfileScene& scene, const std::string& project_name) {
  SvgCanvas c;
  const Panel panel{margin, margin + 8.0, sheet_w - 2 * margin, sheet_h - 2 * margin - 14.0};
  draw_profile(scene, panel, c);
  const std::string title = "Profile " + scene.name() + ": " + scene.head_id + " to outfall " + scene.outfall_id;
  std::string svg = "<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" class=\"profile\" id=\"profile-" +
                    xml_escape(scene.name()) + "\" width=\"" + num(sheet_w) + "mm\" height=\"" + num(sheet_h) +
                    "mm\" viewBox=\"0 0 " + num(sheet_w) + " " + num(sheet_h) +
                    "\" font-family=\"DejaVu Sans, Liberation Sans, Arial, sans-serif\">\n";
  svg += "<title>" + xml_escape(title) + "</title>\n";
  svg += "<rect x=\"0\" y=\"0\" width=\"" + num(sheet_w) + "\" height=\"" + num(sheet_h) + "\" fill=\"#ffffff\"/>\n";
  SvgCanvas head;
  head.text({margin, margin + 3.0}, title, TextStyle{3.5, Anchor::start, true, 0.0, Rgb{}});
  head.text({sheet_w - margin, margin + 3.0},
            project_name + "  |  " + scene.case_label + "  |  elevations and stations in " + scene.length_unit,
            TextStyle{2.6, Anchor::end, false, 0.0, Rgb{}});
  head.text({margin, sheet_h - margin + 2.0}, caution, TextStyle{min_text_mm, Anchor::start, false, 0.0, Rgb{0.3, 0.3, 0.3}});
  svg += head.body() + c.body() + "</svg>\n";
  return svg;
}

std::string profile_svg(const run::CheckRun& run, const ProfilePath& path, std::size_t case_index, int number) {
  return "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n" +
         scene_svg(build_scene(run, path, case_index, number), run.project.name);
}

}  // namespace rimline::report
