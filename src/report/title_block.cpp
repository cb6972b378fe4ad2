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

// A caption over a value, the caption small and grey so the value reads first. A value too long
// for its cell is set smaller, down to the sheet's smallest text, then wrapped onto a second line.
void field(Canvas& c, double x, double y, double width, const std::string& name, const std::string& value,
           double value_size = 3.0) {
  const double fit = width / (bold_char_w * static_cast<double>(std::max<std::size_t>(value.size(), 1)));
  const double size = std::max(min_text_mm, std::min(value_size, fit));
  c.text({x, y}, name, TextStyle{min_text_mm, Anchor::start, false, 0.0, caption});
  if (fit >= min_text_mm) {
    c.text({x, y + value_size + 1.2}, value, TextStyle{size, Anchor::start, true, 0.0, ink});
    return;
  }
  const auto chars = static_cast<std::size_t>(std::max(8.0, width / (bold_char_w * min_text_mm)));
  double line_y = y + min_text_mm + 1.2;
  for (const auto& line : wrap_words(value, chars)) {
    c.text({x, line_y}, line, TextStyle{min_text_mm, Anchor::start, true, 0.0, ink});
    line_y += min_text_mm + 0.6;
  }
}

// A line to sign on, with its caption.
void signature(Canvas& c, double x, double y, double width, const std::string& name, const std::string& value) {
  c.text({x, y}, name, TextStyle{min_text_mm, Anchor::start, false, 0.0, caption});
  c.polyline({{x + 20.0, y + 0.6}, {x + width, y + 0.6}}, Pen{0.15, {}, caption});
  if (!value.empty()) c.text({x + 21.0, y - 0.3}, value, TextStyle{min_text_mm, Anchor::start, true, 0.0, ink});
}

}  // namespace

void draw_title_block(const TitleInfo& info, double width_mm, double height_mm, Canvas& c) {
  const double m = sheet_margin_mm;
  const double left = m, right = width_mm - m, bottom = height_mm - m, top = bottom - title_block_h_mm;
  c.begin_group("title-block", "");
  c.polygon({{left, m}, {right, m}, {right, bottom}, {left, bottom}}, std::nullopt, Pen{0.6, {}, ink});
  c.polyline({{left, top}, {right, top}}, Pen{0.6, {}, ink});
  // Cells: identity and caution | project and drawing | case, flow, units | scales, datum, date |
  // number, revision, sheet | drawn, checked, approved | the engineer's seal.
  const double w = right - left;
  const double cut[] = {left + 0.21 * w, left + 0.38 * w, left + 0.54 * w, left + 0.69 * w, left + 0.78 * w, left + 0.89 * w};
  for (double x : cut) c.polyline({{x, top}, {x, bottom}}, Pen{0.3, {}, ink});

  c.text({left + 3.0, top + 7.0}, "rimline", TextStyle{6.0, Anchor::start, true, 0.0, ink});
  c.text({left + 31.0, top + 7.0}, "hydraulic grade line review", TextStyle{min_text_mm, Anchor::start, false, 0.0, caption});
  c.polyline({{left + 3.0, top + 9.5}, {cut[0] - 3.0, top + 9.5}}, Pen{0.2, {}, ink});
  c.text({left + 3.0, top + 13.5}, "CAUTION", TextStyle{min_text_mm, Anchor::start, true, 0.0, ink});
  double y = top + 17.5;
  for (const auto& line : wrap_words(caution, 58)) {
    c.text({left + 3.0, y}, line, TextStyle{min_text_mm, Anchor::start, false, 0.0, ink});
    y += 3.3;
  }

  const double w1 = cut[1] - cut[0] - 6.0, w2 = cut[2] - cut[1] - 6.0, w3 = cut[3] - cut[2] - 6.0,
               w4 = cut[4] - cut[3] - 6.0, w5 = cut[5] - cut[4] - 6.0;
  field(c, cut[0] + 3.0, top + 5.0, w1, "PROJECT", info.project, 3.4);
  field(c, cut[0] + 3.0, top + 20.0, w1, "DRAWING", info.drawing, 3.0);
  field(c, cut[1] + 3.0, top + 4.0, w2, info.case_caption, info.tailwater);
  field(c, cut[1] + 3.0, top + 16.0, w2, "FLOW CASE", info.flow_case, 2.6);
  field(c, cut[1] + 3.0, top + 30.0, w2, "UNITS", info.units, 2.6);
  field(c, cut[2] + 3.0, top + 4.0, w3, "SCALES (ON A3)", info.scales, 2.6);
  field(c, cut[2] + 3.0, top + 18.0, w3, "VERTICAL DATUM", info.datum.empty() ? "not stated" : info.datum, 2.6);
  field(c, cut[2] + 3.0, top + 30.0, w3, "DATE", info.date);
  field(c, cut[3] + 3.0, top + 4.0, w4, "DRAWING NO.", info.number);
  field(c, cut[3] + 3.0, top + 16.0, w4, "REVISION", info.revision);
  field(c, cut[3] + 3.0, top + 28.0, w4, "SHEET", std::to_string(info.sheet) + " of " + std::to_string(info.sheets));
  signature(c, cut[4] + 3.0, top + 8.0, w5, "DRAWN", "rimline");
  signature(c, cut[4] + 3.0, top + 20.0, w5, "CHECKED", "");
  signature(c, cut[4] + 3.0, top + 32.0, w5, "APPROVED", "");
  // The seal area is left empty for the engineer of record.
  c.text({cut[5] + 3.0, top + 4.0}, "ENGINEER'S SEAL", TextStyle{min_text_mm, Anchor::start, false, 0.0, caption});
  c.polygon({{cut[5] + 3.0, top + 6.0}, {right - 3.0, top + 6.0}, {right - 3.0, bottom - 3.0}, {cut[5] + 3.0, bottom - 3.0}},
            std::nullopt, Pen{0.2, {1.0, 1.0}, caption});
  c.end_group();
}

}  // namespace rimline::report
