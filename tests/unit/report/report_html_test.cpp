// The HTML review report on the literal fixture.
// SHA-256 of "abc": FIPS 180-2 (2002), Appendix B.1 example digest.
// Well-formedness checked as XML (xml_check.hpp, W3C XML 1.0 5th ed.) with HTML void <meta>.
#include <catch2/catch.hpp>

#include <cstdio>
#include <filesystem>
#include <fstream>

#include "report_fixture.hpp"
#include "rimline/report/outputs.hpp"
#include "rimline/report/profile_svg.hpp"
#include "rimline/report/report_html.hpp"
#include "xml_check.hpp"

using namespace rimline;
namespace fs = std::filesystem;

namespace {

std::string temp_file(const std::string& name, const std::string& text) {
  const auto p = fs::temp_directory_path() / ("rimline-report-test-" + std::to_string(::getpid()) + "-" + name);
  std::ofstream(p, std::ios::binary) << text;
  return p.string();
}

std::string html_of(const run::CheckRun& run) {
  const auto path = report::path_from(run.read.network, run.topology, 3);
  std::string svg = report::profile_svg(run, path, 0, 1);
  svg = svg.substr(svg.find("<svg"));
  report::RenderedProfile r;
  r.name = "S0-1";
  r.caption = "S3 to outfall S0";
  r.svg = svg;
  return report::report_html(run, {r}, "2026-01-02", true);
}

}  // namespace

TEST_CASE("report.html is one self-contained, well-formed page", "[report][html]") {
  const auto project = temp_file("project.toml", "abc");
  const auto run = test::fixture_run(project);
  const std::string h = html_of(run);
  const auto x = test::check_xml(h.substr(h.find("<html")), true);
  INFO(x.error);
  REQUIRE(x.error.empty());
  CHECK(h.rfind("<!DOCTYPE html>", 0) == 0);
  // Scripts are inline (the plan map's panel and the tables' sorting), never fetched.
  CHECK(h.find("<script src") == std::string::npos);
  CHECK(h.find("<script") != std::string::npos);
  CHECK(h.find("<link") == std::string::npos);
  CHECK(h.find("src=") == std::string::npos);
  CHECK(h.find("url(") == std::string::npos);
  // Every section is there; the caution at head and foot of the page and on each drawing.
  for (const char* id : {"summary", "inputs", "methods", "exceptions", "exception-table", "profiles",
                         "data-findings", "caution"})
    CHECK(h.find(std::string("id=\"") + id + "\"") != std::string::npos);
  std::size_t cautions = 0;
  for (auto p = h.find(report::caution); p != std::string::npos; p = h.find(report::caution, p + 1)) ++cautions;
  CHECK(cautions == 3);  // head, foot, and the foot of the one inline profile
  CHECK(h.find("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad") != std::string::npos);
  CHECK(x.elements.at("svg") == 2);  // the plan map and the one profile
  std::remove(project.c_str());
}

TEST_CASE("the exception list groups criteria findings by severity, data findings apart", "[report][html]") {
  const auto run = test::fixture_run();
  const std::string h = html_of(run);
  const auto table = h.substr(h.find("id=\"exception-table\""), h.find("id=\"profiles\"") - h.find("id=\"exception-table\""));
  const auto e = table.find("sev-error"), w = table.find("sev-warning"), i = table.find("sev-info");
  REQUIRE(e != std::string::npos);
  CHECK(e < w);
  CHECK(w < i);
  CHECK(table.find("warning (3)") != std::string::npos);  // FREEBOARD S2, SURCHARGED C1 and C4-not-here
  CHECK(table.find("DATA_MISSING") == std::string::npos);
  const auto data = h.substr(h.find("id=\"data-findings\""));
  CHECK(data.find("DATA_MISSING") != std::string::npos);
  CHECK(data.find("info (1)") != std::string::npos);
}

TEST_CASE("a structure finding carries its energy budget, summing to its HGL", "[report][html]") {
  const auto run = test::fixture_run();
  const std::string h = html_of(run);
  const auto b = h.find("Energy budget to the outfall");
  REQUIRE(b != std::string::npos);
  const auto budget = h.substr(b, h.find("</details>", b) - b);
  // S2: tailwater 3.000, exit C0 0.050, conduit C0 0.200, structure S1 0.050, exit C1 0.050,
  // conduit C1 0.200, structure S2 0.500 (the fixture's levels) -> 4.050 m.
  // Columns: item, feature, how, K, V, V^2/2g, length, friction slope, head, level.
  CHECK(budget.find("<td>tailwater</td><td>S0</td><td>the level at the outfall</td><td></td><td></td><td></td><td></td>"
                    "<td></td><td>3.000</td><td>3.000</td>") != std::string::npos);
  const auto s2 = budget.find("<td>structure</td><td>S2</td><td>K V_o^2/2g on the velocity at the inlet of C1");
  REQUIRE(s2 != std::string::npos);
  CHECK(budget.find("<td>0.500</td><td>4.050</td></tr>", s2) != std::string::npos);
  CHECK(budget.find("<td>conduit</td><td>C1</td><td>friction along the pipe</td>") != std::string::npos);
  CHECK(budget.find("HGL in the structure (its energy level)</td><td>4.050</td>") != std::string::npos);
  // Friction slope of C1: 0.200 m over 80 m = 0.00250.
  CHECK(budget.find("<td>0.00250</td><td>0.200</td>") != std::string::npos);
  // Ending with the ground: rim 4.200, freeboard 4.200 - 4.050 = 0.150 against 0.300, short by 0.150.
  CHECK(budget.find("Rim</td><td>4.200</td>") != std::string::npos);
  CHECK(budget.find("Freeboard (rim &#8722; HGL)</td><td>0.150</td>") != std::string::npos);
  CHECK(budget.find("Required freeboard</td><td>0.300</td>") != std::string::npos);
  CHECK(budget.find("Shortfall (freeboard &#8722; required)</td><td>-0.150</td>") != std::string::npos);
  // The shares: losses 0.050 + 0.500 (structures) + 0.200 + 0.200 (friction) + 0.050 + 0.050 (exits)
  // = 1.050 m; above S0's invert 2.000 m the HGL stands 2.050 m: tailwater 1.000 m (49 %), losses 51 %.
  CHECK(budget.find("HGL 4.050 m = the level at the outfall S0 3.000 m + losses 1.050 m (structures 0.550 m, pipe "
                    "friction 0.400 m, exits and drops 0.100 m).") != std::string::npos);
  CHECK(budget.find("the tailwater accounts for 49&#160;% and the losses for 51&#160;%.") != std::string::npos);
}

TEST_CASE("the report is the same for the same run apart from the date", "[report][html]") {
  const auto run = test::fixture_run();
  const auto path = report::path_from(run.read.network, run.topology, 3);
  const auto a = report::report_html(run, {}, "2026-01-02", false);
  const auto b = report::report_html(run, {}, "2026-01-02", false);
  CHECK(a == b);
  CHECK(a.find("No path with a pipe was found") != std::string::npos);
}

TEST_CASE("an info finding at a structure carries no budget", "[report][html]") {
  auto run = test::fixture_run();
  for (auto& f : run.findings)
    if (f.code == "FREEBOARD") f.severity = Severity::info;
  const std::string h = html_of(run);
  CHECK(h.find("Energy budget to the outfall") == std::string::npos);
}
