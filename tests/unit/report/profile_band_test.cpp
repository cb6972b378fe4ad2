// The band, the short-freeboard shading, the flow arrow and the finding markers of a profile sheet,
// on the literal fixture (report_fixture.hpp; invented data: plumbing, not check values). S2's HGL
// (4.050 m) stands above its required-freeboard line (rim 4.200 - 0.300 = 3.900 m).
#include <catch2/catch.hpp>

#include "report_fixture.hpp"
#include "rimline/report/profile_svg.hpp"
#include "text_count.hpp"

using namespace rimline;

TEST_CASE("a profile's band gives every structure's station and freeboard and every pipe's Q, V and length",
          "[report][svg]") {
  const auto run = test::fixture_run();
  const std::string svg = report::profile_svg(run, report::path_from(run.read.network, run.topology, 4), 0, 1);
  for (const char* row : {">Station<", ">Rim (m)<", ">Invert (m)<", ">HGL (m)<", ">Freeboard (m)<", ">Q (m3/s)<",
                          ">V (m/s)<", ">Length (m)<", ">FLOW<"})
    CHECK(svg.find(row) != std::string::npos);
  CHECK(svg.find(">0.150<") != std::string::npos);   // S2's freeboard, 4.200 - 4.050
  CHECK(svg.find(">100.0<") != std::string::npos);   // C0's length
  CHECK(test::count_of(svg, "class=\"short-freeboard\"") == 1);
  // Markers are numbered squares: no three-point (triangle) shape in the finding groups.
  const auto first = svg.find("class=\"finding finding-warning\"");
  REQUIRE(first != std::string::npos);
  const auto group = svg.substr(first, svg.find("</g>", first) - first);
  const auto pts = group.find("<polygon points=\"");
  REQUIRE(pts != std::string::npos);
  const auto from = pts + std::string("<polygon points=\"").size(), to = group.find('"', from);
  CHECK(test::count_of(group.substr(from, to - from), ",") == 4);  // four corners
  // No tick reads "-0".
  CHECK(svg.find(">-0<") == std::string::npos);
  CHECK(svg.find(">-0.0") == std::string::npos);
}
