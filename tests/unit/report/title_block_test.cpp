// The sheet's title block, drawn into an SVG canvas so its text can be read back.
#include <catch2/catch.hpp>

#include "report/svg_canvas.hpp"
#include "report/title_block.hpp"
#include "rimline/report/outputs.hpp"
#include "xml_check.hpp"

using namespace rimline;

TEST_CASE("the title block carries project, case, flow case, units, scales, date, sheet and caution",
          "[report][pdf]") {
  report::TitleInfo info{"Quay & Co <west>", "Profile OF-1-1: T-20 to outfall OF-1", "tailwater 3.200 m",
                         "design flows from the pipe layer", "SI: m, m3/s, m/s",
                         "H 1:5000   V 1:100   vertical exaggeration 50:1", "2026-01-02", 2, 7, "TAILWATER",
                         "QH local survey datum", "HGL-OF-1-1", "0"};
  report::SvgCanvas c;
  report::draw_title_block(info, 420.0, 297.0, c);
  const std::string& b = c.body();
  CHECK(test::check_xml("<g>" + b + "</g>").error.empty());
  for (const char* text : {"Quay &amp; Co &lt;west&gt;", "Profile OF-1-1: T-20 to outfall OF-1", "tailwater 3.200 m",
                           "design flows from the pipe layer", "SI: m, m3/s, m/s", "exaggeration 50:1",
                           "2026-01-02", "2 of 7", "CAUTION", "VERTICAL DATUM", "QH local survey datum", "DRAWING NO.",
                           "HGL-OF-1-1", "REVISION", "DRAWN", "CHECKED", "APPROVED", "ENGINEER&#39;S SEAL"}) {
    INFO(text);
    CHECK(b.find(text) != std::string::npos);
  }
  // No text under 2.5 mm on the A3 sheet (font-size in mm, the SVG's user unit).
  for (auto p = b.find("font-size=\""); p != std::string::npos; p = b.find("font-size=\"", p + 1))
    CHECK(std::stod(b.substr(p + 11)) >= 2.5 - 1e-9);
  // The caution is wrapped over lines: every word of it is on the sheet, in order.
  std::size_t at = 0;
  const std::string caution = report::caution;
  for (std::size_t p = 0, q; p < caution.size(); p = q + 1) {
    q = caution.find(' ', p);
    if (q == std::string::npos) q = caution.size();
    const auto found = b.find(caution.substr(p, q - p), at);
    REQUIRE(found != std::string::npos);
    at = found;
  }
}
