// The profile scene and its SVG on the literal fixture (report_fixture.hpp).
// Well-formedness per W3C XML 1.0 (5th ed.) via xml_check.hpp; entity escapes per XML 1.0
// sec. 2.4 and 4.6 (predefined entities). Feet: 0.3048 m exactly (NIST SP 811, 2008 ed., B.8).
#include <catch2/catch.hpp>

#include "report/profile_scene.hpp"
#include "report_fixture.hpp"
#include "rimline/report/profile_svg.hpp"
#include "xml_check.hpp"

using namespace rimline;
using report::Stroke;

namespace {
report::ProfilePath s4_path(const run::CheckRun& run) { return report::path_from(run.read.network, run.topology, 4); }

std::size_t count(const std::string& s, const std::string& what) {
  std::size_t n = 0;
  for (auto p = s.find(what); p != std::string::npos; p = s.find(what, p + 1)) ++n;
  return n;
}
}  // namespace

TEST_CASE("xml_escape covers the predefined entities", "[report][svg]") {
  CHECK(report::xml_escape("a<b & \"c\" 'd' >") == "a&lt;b &amp; &quot;c&quot; &#39;d&#39; &gt;");
  CHECK(report::xml_escape(std::string("x\x01y")) == "x y");  // C0 controls are not XML 1.0 characters
}

TEST_CASE("the HGL and EGL pass through every step point and step at structures", "[report][scene]") {
  const auto run = test::fixture_run();
  const auto s = report::build_scene(run, s4_path(run), 0, 1);
  const auto& hgl = s.line(Stroke::hgl);
  REQUIRE(hgl.parts.size() == 1);
  // 4 pools + 3 + 3 + 2 step points of C0, C1, C3.
  CHECK(hgl.parts[0].size() == 12);
  CHECK(hgl.parts[0].front().x == 0.0);
  CHECK(hgl.parts[0].front().y == Approx(3.0));      // the tailwater
  CHECK(hgl.parts[0][2].x == Approx(50.0));          // mid-step of C0
  CHECK(hgl.parts[0][2].y == Approx(3.1));
  CHECK(hgl.parts[0].back().x == Approx(210.0));
  CHECK(hgl.parts[0].back().y == Approx(4.10));      // pool at S4
  const auto& egl = s.line(Stroke::egl);
  CHECK(egl.parts[0][1].y == Approx(3.05));          // C0 outlet: hgl + V^2/2g
  // Ground and freeboard join the rims; the freeboard line sits 0.3 m under them.
  CHECK(s.line(Stroke::ground).parts[0].size() == 4);
  CHECK(s.line(Stroke::freeboard).parts[0][2].y == Approx(4.2 - 0.3));
  CHECK(s.line(Stroke::crown).parts[0][0].y == Approx(2.0 + 1.2));
  CHECK(s.y_min == Approx(2.0));
  CHECK(s.y_max == Approx(6.2));
}

TEST_CASE("a structure without a rim breaks the ground line", "[report][scene]") {
  auto run = test::fixture_run();
  run.read.network.structures[2].rim_m.reset();
  const auto s = report::build_scene(run, s4_path(run), 0, 1);
  CHECK(s.line(Stroke::ground).parts.size() == 2);
  CHECK(std::isnan(s.structures[2].rim));
}

TEST_CASE("findings are placed at their structure or mid-pipe; others are left out", "[report][scene]") {
  const auto run = test::fixture_run();
  const auto s = report::build_scene(run, s4_path(run), 0, 1);
  REQUIRE(s.markers.size() == 3);  // DATA_MISSING at S1, SURCHARGED C1, FREEBOARD S2; not C4-not-here
  CHECK(s.markers[0].code == "DATA_MISSING");
  CHECK(s.markers[0].station == Approx(100.0));
  CHECK(s.markers[1].code == "SURCHARGED");
  CHECK(s.markers[1].station == Approx(140.0));  // midway along C1 (100 .. 180 m)
  CHECK(s.markers[2].code == "FREEBOARD");
  CHECK(s.markers[2].station == Approx(180.0));
  CHECK(s.markers[2].elevation == Approx(4.05));  // at the structure's HGL
  CHECK(s.markers[2].number == 3);
}

TEST_CASE("US report units convert stations and levels to feet", "[report][scene]") {
  auto run = test::fixture_run();
  run.report_units = units::System::us;
  const auto s = report::build_scene(run, s4_path(run), 0, 1);
  CHECK(s.length_unit == "ft");
  CHECK(s.structures[3].station == Approx(210.0 / 0.3048));
  CHECK(s.structures[2].rim == Approx(4.2 / 0.3048));
  CHECK(s.freeboard == Approx(0.3 / 0.3048));
  CHECK(s.markers[1].station == Approx(140.0 / 0.3048));
  CHECK(s.case_label == "tailwater 9.84 ft");  // levels to 0.01 ft
}

TEST_CASE("the profile SVG is well-formed and carries every layer of the drawing", "[report][svg]") {
  const auto run = test::fixture_run();
  const std::string svg = report::profile_svg(run, s4_path(run), 0, 1);
  const auto x = test::check_xml(svg);
  INFO(x.error);
  REQUIRE(x.error.empty());
  CHECK(svg.rfind("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n<svg xmlns=\"http://www.w3.org/2000/svg\"", 0) == 0);
  CHECK(x.elements.at("svg") == 1);
  for (const char* cls : {"ground", "freeboard", "invert", "crown", "hgl", "egl", "structures", "band", "legend"})
    CHECK(count(svg, std::string("class=\"") + cls + "\"") == 1);
  CHECK(count(svg, "class=\"finding finding-") == 3);
  CHECK(svg.find("vertical exaggeration") != std::string::npos);
  CHECK(svg.find("S4") != std::string::npos);
  // Messages are escaped: the fixture's DATA_MISSING text has <, " and &.
  CHECK(svg.find("cover level &lt;taken&gt; from the &quot;survey&quot; &amp; drawings") != std::string::npos);
  // No external assets: no links, images, scripts or fonts fetched.
  CHECK(svg.find("href") == std::string::npos);
  CHECK(svg.find("<script") == std::string::npos);
  CHECK(count(svg, "http") == 1);  // the SVG namespace name only
}

TEST_CASE("xml_check itself rejects broken markup", "[report][svg]") {
  CHECK_FALSE(test::check_xml("<a><b></a></b>").error.empty());
  CHECK_FALSE(test::check_xml("<a x=1></a>").error.empty());
  CHECK_FALSE(test::check_xml("<a>1 & 2</a>").error.empty());
  CHECK_FALSE(test::check_xml("<a>").error.empty());
  CHECK(test::check_xml("<a x=\"1\"><b/>&amp;</a>").error.empty());
}

TEST_CASE("an unsolved pipe breaks the HGL and EGL", "[report][scene]") {
  auto run = test::fixture_run();
  run.cases[0].march.conduits[1].solved = false;  // C1, between S1 (100 m) and S2 (180 m)
  const auto s = report::build_scene(run, s4_path(run), 0, 1);
  const auto& hgl = s.line(Stroke::hgl);
  REQUIRE(hgl.parts.size() == 2);
  CHECK(hgl.parts[0].back().x == Approx(100.0));
  CHECK(hgl.parts[1].front().x == Approx(180.0));
  CHECK(s.line(Stroke::egl).parts.size() == 2);
  CHECK_FALSE(s.pipes[1].solved);
}

TEST_CASE("a hydraulic jump is placed on the drawn pipe and marked", "[report][scene]") {
  auto run = test::fixture_run();
  run.cases[0].march.conduits[1].profile.jump_station_m = 40.0;  // mid C1: drawn at 100 + 40 m
  const auto path = s4_path(run);
  const auto s = report::build_scene(run, path, 0, 1);
  CHECK(s.pipes[1].jump_station == Approx(140.0));
  CHECK(s.pipes[1].jump_elevation == Approx(3.40));  // HGL of C1's step point at 40 m
  CHECK(std::isnan(s.pipes[0].jump_station));
  const std::string svg = report::profile_svg(run, path, 0, 1);
  CHECK(svg.find(">jump</text>") != std::string::npos);
}
