#include "report/title_block.hpp"

#include <algorithm>

#include "report/sheet_text.hpp"
#include "rimline/report/outputs.hpp"

namespace rimline::report {
namespace {

const Rgb ink{0, 0, 0};
const Rgb caption{0.38, 0.38, 0.38};

// Average bold glyph width over the font size, to keep a value inside its cell
// (common practice, no source).
constexpr double bold_char_w = 0.62;

// A caption over a value, the caption small and grey so the value reads first. A value too
// long for the cell is set smaller rather than run into the next cell.
void field(Canvas& c, double x, double y, double width, const std::string& name, const std::string& value,
           double value_size = 3.0) {
  const double fit = width / (bold_char_w * static_cast<double>(std::max<std::size_t>(value.size(), 1)));
  const double size = std::min(value_size, fit);
  c.text({x, y}, name, TextStyle{1.8, Anchor::start, false, 0.0, caption});
  c.text({x, y + value_size + 1.2}, value, TextStyle{size, Anchor::start, true, 0.0, ink});
}

}  // namespace

void draw_title_block(const TitleInfo& info, double width_mm, double height_mm, Canvas& c) {
  const double m = sheet_margin_mm;
  const double left = m, right = width_mm - m, bottom = height_mm - m, top = bottom - title_block_h_mm;
  c.begin_group("title-block", "");
  c.polygon({{left, m}, {right, m}, {right, bottom}, {left, bottom}}, std::nullopt, Pen{0.6, {}, ink});
  c.polyline({{left, top}, {right, top}}, Pen{0.6, {}, ink});
  // Cells: identity and caution | project and drawing | case | scales, date, sheet.
  const double w = right - left;
  const double cut[] = {left + 0.30 * w, left + 0.58 * w, left + 0.80 * w};
  for (double x : cut) c.polyline({{x, top}, {x, bottom}}, Pen{0.3, {}, ink});

  c.text({left + 3.0, top + 7.0}, "rimline", TextStyle{6.0, Anchor::start, true, 0.0, ink});
  c.text({left + 31.0, top + 7.0}, "hydraulic grade line review", TextStyle{2.4, Anchor::start, false, 0.0, caption});
  c.polyline({{left + 3.0, top + 9.5}, {cut[0] - 3.0, top + 9.5}}, Pen{0.2, {}, ink});
  c.text({left + 3.0, top + 13.5}, "CAUTION", TextStyle{2.2, Anchor::start, true, 0.0, ink});
  double y = top + 17.5;
  for (const auto& line : wrap_words(caution, 78)) {
    c.text({left + 3.0, y}, line, TextStyle{2.3, Anchor::start, false, 0.0, ink});
    y += 3.4;
  }

  const double w1 = cut[1] - cut[0] - 6.0, w2 = cut[2] - cut[1] - 6.0, w3 = right - cut[2] - 6.0;
  field(c, cut[0] + 3.0, top + 5.0, w1, "PROJECT", info.project, 3.6);
  field(c, cut[0] + 3.0, top + 18.0, w1, "DRAWING", info.drawing, 3.0);
  field(c, cut[1] + 3.0, top + 4.0, w2, "TAILWATER", info.tailwater);
  field(c, cut[1] + 3.0, top + 15.0, w2, "FLOW CASE", info.flow_case, 2.4);
  field(c, cut[1] + 3.0, top + 26.0, w2, "UNITS", info.units, 2.6);
  field(c, cut[2] + 3.0, top + 4.0, w3, "SCALES (ON A3)", info.scales, 2.2);
  field(c, cut[2] + 3.0, top + 15.0, w3, "DATE", info.date);
  field(c, cut[2] + 3.0, top + 26.0, w3, "SHEET", std::to_string(info.sheet) + " of " + std::to_string(info.sheets));
  c.end_group();
}

}  // namespace rimline::report
