// Path selection and stationing on the literal fixture (tests/unit/report/report_fixture.hpp).
// Expected stations are sums of the fixture's pipe lengths; station 0 at the outfall and
// increasing upstream is the profile convention of /work/shared/GUIDE.md section 3.
#include <catch2/catch.hpp>

#include "report_fixture.hpp"
#include "rimline/error.hpp"
#include "rimline/report/profile_path.hpp"

using namespace rimline;
using report::PathSelection;

TEST_CASE("path_from follows main outflows down to the outfall, stationed from the outfall", "[report][path]") {
  const auto run = test::fixture_run();
  const auto p = report::path_from(run.read.network, run.topology, 4);  // S4
  CHECK(p.structures == std::vector<std::size_t>{0, 1, 2, 4});
  CHECK(p.conduits == std::vector<std::size_t>{0, 1, 3});
  REQUIRE(p.station_m.size() == 4);
  CHECK(p.station_m[0] == 0.0);
  CHECK(p.station_m[1] == Approx(100.0));
  CHECK(p.station_m[2] == Approx(180.0));
  CHECK(p.station_m[3] == Approx(210.0));
  CHECK(p.outfall == 0);
  CHECK(p.tree == 0);
}

TEST_CASE("the longest path is chosen by plan length, not by pipe count", "[report][path]") {
  const auto run = test::fixture_run();
  const auto paths = report::longest_paths(run.read.network, run.topology);
  REQUIRE(paths.size() == 2);  // one per tree
  CHECK(paths[0].structures.back() == 3);  // S3: 220 m over two pipes beats S4: 210 m over three
  CHECK(paths[0].length_m() == Approx(220.0));
  CHECK(paths[1].structures == std::vector<std::size_t>{5, 6});
  CHECK(paths[1].length_m() == Approx(60.0));
}

TEST_CASE("distance to outfall is the plan length along main outflows", "[report][path]") {
  const auto run = test::fixture_run();
  const auto d = report::distance_to_outfall_m(run.read.network, run.topology);
  CHECK(d[0] == 0.0);
  CHECK(d[2] == Approx(180.0));
  CHECK(d[3] == Approx(220.0));
  CHECK(d[6] == Approx(60.0));
}

TEST_CASE("a structure in no tree gives a path of itself alone", "[report][path]") {
  auto run = test::fixture_run();
  run.topology.nodes[6].tree = model::no_index;
  const auto p = report::path_from(run.read.network, run.topology, 6);
  CHECK(p.structures == std::vector<std::size_t>{6});
  CHECK(p.conduits.empty());
  CHECK(p.length_m() == 0.0);
}

TEST_CASE("trunks begin where pipes of the size begin", "[report][path]") {
  const auto run = test::fixture_run();
  // 0.9 m and up: C0 (1.2) and C1 (0.9); the trunk begins at S2 (its inflow C3 is 0.45 m).
  auto big = report::trunk_paths(run.read.network, run.topology, 0.9);
  REQUIRE(big.size() == 1);
  CHECK(big[0].structures == std::vector<std::size_t>{0, 1, 2});
  // 0.5 m and up: S3 (C2 0.6 m, 220 m) and S2 (180 m) in tree 0, longest first; S6 (C4 0.6 m) in tree 1.
  auto mid = report::trunk_paths(run.read.network, run.topology, 0.5);
  REQUIRE(mid.size() == 3);
  CHECK(mid[0].structures.back() == 3);
  CHECK(mid[1].structures.back() == 2);
  CHECK(mid[2].structures.back() == 6);
  CHECK(report::trunk_paths(run.read.network, run.topology, 2.0).empty());
}

TEST_CASE("sheets are numbered per outfall over paths and cases", "[report][path]") {
  const auto run = test::fixture_run();
  const auto sheets = report::plan_sheets(run.read.network, run.topology, 2, {});
  REQUIRE(sheets.size() == 4);
  CHECK(sheets[0].number == 1);
  CHECK(sheets[0].case_index == 0);
  CHECK(sheets[1].number == 2);
  CHECK(sheets[1].case_index == 1);
  CHECK(sheets[2].path.outfall == 5);
  CHECK(sheets[2].number == 1);
}

TEST_CASE("a profile from a named structure; an unknown name is a config error with a suggestion",
          "[report][path]") {
  const auto run = test::fixture_run();
  report::DrawingOptions o;
  o.selection = PathSelection::from_structure;
  o.from_structure_id = "S4";
  const auto sheets = report::plan_sheets(run.read.network, run.topology, 1, o);
  REQUIRE(sheets.size() == 1);
  CHECK(sheets[0].path.length_m() == Approx(210.0));
  o.from_structure_id = "s4";
  try {
    report::plan_sheets(run.read.network, run.topology, 1, o);
    FAIL("expected an error");
  } catch (const Error& e) {
    CHECK(e.kind() == ErrorKind::bad_config);
    CHECK_THAT(e.what(), Catch::Contains("did you mean S4?"));
  }
}
