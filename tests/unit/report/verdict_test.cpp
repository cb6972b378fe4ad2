// The verdict at the top of report.html, on the literal fixture (report_fixture.hpp). The figures
// are the fixture's own arithmetic (invented data: plumbing and consistency, not check values):
// S2 rim 4.200 m, HGL 4.050 m, required freeboard 0.300 m -> short by 0.150 m; the HGL above the
// crown at the worse end of C3 (4.050 - 3.000), C2 (3.300 - 3.000) and C1 (3.500 - 3.400).
#include <catch2/catch.hpp>

#include "report/verdict.hpp"
#include "report_fixture.hpp"
#include "rimline/report/report_html.hpp"

using namespace rimline;

TEST_CASE("the verdict names each failing structure with its shortfall, per case", "[report][verdict]") {
  auto run = test::fixture_run();
  const auto v = report::case_verdicts(run);
  REQUIRE(v.size() == 1);
  REQUIRE(v[0].freeboard.size() == 1);
  CHECK(v[0].freeboard[0].id == "S2");
  CHECK(v[0].freeboard[0].short_by_m == Approx(0.15).margin(1e-9));
  CHECK_FALSE(v[0].freeboard[0].flooded);
  REQUIRE(v[0].surcharged.size() == 3);
  CHECK(v[0].surcharged[0].id == "C3");
  CHECK(v[0].surcharged[0].short_by_m == Approx(1.05).margin(1e-9));
  CHECK(v[0].surcharged[1].id == "C2");
  CHECK(v[0].surcharged[2].id == "C1");
  CHECK(report::verdict_sentence(run, v, true) == "does not meet freeboard at tailwater 3.000 m: S2 short by 0.150 m (1 structure)");

  // A second case in which every structure keeps its freeboard: "meets it at" that case.
  run::Case low = run.cases[0];
  low.label = "tailwater " + q(2.5, units::Dimension::length);
  low.march.structures[2].hgl_m = 3.8;
  run.cases.push_back(low);
  CHECK(report::verdict_sentence(run, report::case_verdicts(run), true) ==
        "does not meet freeboard at tailwater 3.000 m: S2 short by 0.150 m (1 structure); meets it at tailwater 2.500 m");

  // In US customary units the shortfall is in feet (0.150 m = 0.49 ft).
  run.report_units = units::System::us;
  CHECK(report::verdict_sentence(run, report::case_verdicts(run), true).find("S2 short by 0.49 ft") != std::string::npos);
}

TEST_CASE("a flooded structure is named flooded, and the verdict leads the page", "[report][verdict]") {
  auto run = test::fixture_run();
  run.cases[0].march.structures[2].hgl_m = 4.3;  // 0.100 m above the rim of S2
  const auto v = report::case_verdicts(run);
  REQUIRE(v[0].freeboard.size() == 1);
  CHECK(v[0].freeboard[0].flooded);
  CHECK(v[0].freeboard[0].short_by_m == Approx(0.4).margin(1e-9));
  const std::string h = report::report_html(run, {}, "2026-01-02", false);
  const auto verdict = h.find("id=\"verdict\"");
  REQUIRE(verdict != std::string::npos);
  CHECK(verdict < h.find("id=\"summary\""));
  CHECK(h.find("S2 flooded (HGL above the rim; short by 0.400 m)") != std::string::npos);
  CHECK(h.find("Does not meet the freeboard criterion in 1 of 1 tailwater case.") != std::string::npos);
}
