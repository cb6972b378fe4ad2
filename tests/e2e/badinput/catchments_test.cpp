// Bad-input catalogue, catchments (flows mode "rational"): broken polygons, values out of range,
// outlets that cannot be found, land-use composite C, and project-file errors in the catchment
// sections. Expected codes from include/rimline/flows/catchment_outlets.hpp and src/gis/read_catchments.hpp;
// every input is invented for the test.
#include "e2e/badinput/fixture.hpp"

using namespace rimline;
using namespace rimline::badinput;

namespace {

// A square catchment of side `size` m centred on (x, y); `props` are raw JSON properties.
std::string square(const std::string& props, double x, double y, double size) {
  const double h = size / 2;
  return feature(props, R"({"type":"Polygon","coordinates":[[[)" + num(x - h) + "," + num(y - h) + "],[" + num(x + h) +
                            "," + num(y - h) + "],[" + num(x + h) + "," + num(y + h) + "],[" + num(x - h) + "," +
                            num(y + h) + "],[" + num(x - h) + "," + num(y - h) + "]]]}");
}

std::string props(const std::string& id, const std::string& c = "0.6", const std::string& inlet = "10",
                  const std::string& outlet = "null") {
  return R"("CATCH_ID":")" + id + R"(","RUNOFF_C":)" + c + R"(,"INLET_MIN":)" + inlet + R"(,"OUTLET":)" + outlet +
         R"(,"POP":500)";
}

// Catchments around M3, M4 and M2 (20 m squares).
std::vector<std::string> base_catchments() {
  return {square(props("K3"), ox - 150, oy, 20), square(props("K4"), ox - 50, oy + 50, 20),
          square(props("K2"), ox - 100, oy, 20)};
}

std::string rational_project(const std::string& extra = "") {
  return replace(base_project(), R"(mode = "structure_inflows")", R"(mode = "rational")") + R"(
[catchments]
source = "catchments.geojson"

[catchments.fields]
id = "CATCH_ID"
structure = "OUTLET"
runoff_c = "RUNOFF_C"
inlet_time = { field = "INLET_MIN", unit = "min" }

[catchments.defaults]
runoff_c = 0.5
inlet_time = "12 min"

[rational.idf.t10]
a = 1500
b = "10 min"
c = 0.8
intensity_unit = "mm/h"
)" + extra;
}

run::CheckRun run_with(Case& c, const std::vector<std::string>& catchments,
                       const std::string& project = rational_project()) {
  c.write_network(base_pipes(), base_structures(), project);
  c.write("catchments.geojson", collection(catchments));
  return c.run();
}

std::size_t catchment(const run::CheckRun& r, const std::string& id) {
  for (std::size_t i = 0; i < r.catchments.size(); ++i)
    if (r.catchments[i].id == id) return i;
  FAIL("no catchment " << id);
  return 0;
}

std::string parse_error(const std::string& toml) {
  return error_of([&] { config::parse_project(toml, "project.toml"); });
}

}  // namespace

TEST_CASE("badinput catchments: the base case gives every pipe a flow and no finding") {
  Case c("catchments_base");
  const auto r = run_with(c, base_catchments());
  INFO(dump(r));
  REQUIRE(r.catchment_flows);
  CHECK(r.catchments.size() == 3);
  for (const auto& k : r.catchments) CHECK(k.structure != model::no_index);
  for (const auto& f : r.findings) CHECK(f.layer != LayerRole::catchments);
  CHECK(r.catchment_flows->pipes[conduit_index(r, "P1")].area_m2 == Approx(1200.0).epsilon(1e-9));
}

TEST_CASE("badinput catchments: null, point and zero-area geometry leave the catchment out, the rest counts") {
  Case c("catchments_geometry");
  auto ks = base_catchments();
  ks.push_back(feature(props("KN"), "null"));
  ks.push_back(feature(props("KP"), R"({"type":"Point","coordinates":[452250,5385200]})"));
  ks.push_back(feature(
      props("KZ"),
      R"({"type":"Polygon","coordinates":[[[452250,5385200],[452260,5385200],[452270,5385200],[452250,5385200]]]})"));
  const auto r = run_with(c, ks, replace(rational_project(), "source = \"catchments.geojson\"\n",
                                         "source = \"catchments.geojson\"\nallow_left_out = true\n"));
  INFO(dump(r));
  CHECK(message(find(r, "DATA_GEOMETRY", "KN")) == "The catchment has no geometry; it is left out.");
  CHECK(message(find(r, "DATA_GEOMETRY", "KP")) ==
        "The geometry is a POINT, not a polygon; the catchment is left out.");
  CHECK(message(find(r, "DATA_GEOMETRY", "KZ")) == "The polygon has no area; the catchment is left out.");
  CHECK(find(r, "DATA_GEOMETRY", "KZ")->layer == LayerRole::catchments);
  CHECK(r.catchments.size() == 3);
  check_solved(r, {"OF", "M1", "M2", "M3", "M4"});
}

TEST_CASE("badinput catchments: C outside 0-1 and a negative inlet time take the defaults") {
  Case c("catchments_values");
  auto ks = base_catchments();
  ks[0] = square(props("K3", "1.4", "-5"), ox - 150, oy, 20);
  const auto r = run_with(c, ks);
  INFO(dump(r));
  CHECK(message(find(r, "DATA_IMPLAUSIBLE", "K3", "RUNOFF_C")) ==
        "RUNOFF_C 1.4 is outside 0 to 1; the default C 0.5 is used.");
  CHECK(message(find(r, "DATA_IMPLAUSIBLE", "K3", "INLET_MIN")) ==
        "INLET_MIN -5 min is negative; the default inlet time 12.0 min is used.");
  const auto& k = r.catchments[catchment(r, "K3")];
  CHECK(k.runoff_c == 0.5);
  CHECK(k.inlet_time_s == 720.0);
}

TEST_CASE("badinput catchments: an unknown outlet id falls back to the structure inside") {
  Case c("catchments_outlet");
  auto ks = base_catchments();
  ks[0] = square(props("K3", "0.6", "10", R"("M9")"), ox - 150, oy, 20);
  const auto r = run_with(c, ks);
  INFO(dump(r));
  CHECK(
      message(find(r, "CATCHMENT_OUTLET", "K3", "structure")) ==
      R"(catchment K3 names structure "M9", which is not in the network; the structure inside or nearest the catchment is used instead.)");
  CHECK(r.read.network.structures[r.catchments[catchment(r, "K3")].structure].id == "M3");
}

TEST_CASE("badinput catchments: a catchment far from every structure contributes nothing and says so") {
  Case c("catchments_far");
  auto ks = base_catchments();
  ks.push_back(square(props("KFAR"), ox + 500, oy + 500, 20));
  const auto r = run_with(c, ks, replace(rational_project(), "source = \"catchments.geojson\"\n",
                                         "source = \"catchments.geojson\"\nallow_left_out = true\n"));
  INFO(dump(r));
  CHECK(message(find(r, "CATCHMENT_NO_OUTLET", "KFAR")) ==
        "catchment KFAR has no structure a pipe leaves within 30.000 m; it contributes no flow.");
  CHECK(r.catchment_flows->pipes[conduit_index(r, "P1")].area_m2 == Approx(1200.0).epsilon(1e-9));
}

// K3 is 20 m x 20 m = 400 m^2 with its own C 0.6; a land-use polygon with C 0.9 covers its east
// half (x 452150..452160: 200 m^2), and likewise the west half of K2. Composite
// C = (0.9 x 200 + 0.6 x 200) / 400 = 0.75; K4 lies outside it and keeps 0.6 without a finding.
TEST_CASE("badinput catchments: land-use polygons give an area-weighted C, the uncovered part keeps its own") {
  Case c("catchments_land_use");
  c.write(
      "land_use.geojson",
      collection({feature(
          R"("C":0.9)",
          R"({"type":"Polygon","coordinates":[[[452150,5385180],[452200,5385180],[452200,5385220],[452150,5385220],[452150,5385180]]]})")}));
  const auto r = run_with(c, base_catchments(),
                          rational_project("\n[land_use]\nsource = \"land_use.geojson\"\nrunoff_c = \"C\"\n"));
  INFO(dump(r));
  CHECK(r.catchments[catchment(r, "K3")].runoff_c == Approx(0.75).epsilon(1e-9));
  CHECK(r.catchments[catchment(r, "K2")].runoff_c == Approx(0.75).epsilon(1e-9));
  CHECK(r.catchments[catchment(r, "K4")].runoff_c == Approx(0.6).epsilon(1e-12));
  CHECK(message(find(r, "DATA_MISSING", "K3")) ==
        "0.02 ha of the catchment lies outside every land-use polygon; that part takes C 0.6.");
  CHECK(find(r, "DATA_MISSING", "K4") == nullptr);
}

TEST_CASE("badinput catchments project: mode rational without [catchments] is an error") {
  const std::string toml = replace(base_project(), R"(mode = "structure_inflows")", R"(mode = "rational")") +
                           "\n[rational.idf.t10]\na = 1500\nb = \"10 min\"\nintensity_unit = \"mm/h\"\n";
  CHECK(
      parse_error(toml) ==
      R"(project.toml: key catchments.source: flows mode "rational" needs a [catchments] table with the catchment polygons' source)");
}

TEST_CASE("badinput catchments project: an IDF without its intensity unit is an error naming the key") {
  CHECK(parse_error(replace(rational_project(), "intensity_unit = \"mm/h\"\n", "")) ==
        R"(project.toml: line 52: key rational.idf.t10.intensity_unit: the unit of i ("mm/h", "in/h") is missing)");
}

TEST_CASE("badinput catchments project: an IDF giving both the formula and a table is an error") {
  CHECK(
      parse_error(replace(rational_project(), "c = 0.8\n", "c = 0.8\ndurations = [\"5 min\", \"10 min\"]\n")) ==
      R"(project.toml: line 56: key rational.idf.t10.durations: give either the formula (a, b, c, intensity_unit) or the table (durations, intensities), not both)");
}

TEST_CASE("badinput catchments project: an IDF table out of order is an error") {
  const std::string table = "durations = [\"10 min\", \"5 min\"]\nintensities = [\"100 mm/h\", \"140 mm/h\"]\n";
  CHECK(parse_error(
            replace(rational_project(), "a = 1500\nb = \"10 min\"\nc = 0.8\nintensity_unit = \"mm/h\"\n", table)) ==
        R"(project.toml: line 53: key rational.idf.t10.durations: must be greater than 0 and increasing)");
}

TEST_CASE("badinput catchments project: an unknown return period is an error with a did-you-mean") {
  CHECK(
      parse_error(rational_project("\n[rational]\nreturn_period = \"t1O\"\n")) ==
      R"(project.toml: line 59: key rational.return_period: "t1O" is not a key of [rational.idf]; did you mean "t10"?)");
}

TEST_CASE("badinput catchments project: a default C above 1 is an error naming the key") {
  CHECK(parse_error(replace(rational_project(), "runoff_c = 0.5", "runoff_c = 1.5")) ==
        R"(project.toml: line 49: key catchments.defaults.runoff_c: a runoff coefficient must lie between 0 and 1)");
}

// Sanitary mode on the same catchments, 500 persons each: P1 carries 1500 persons and 200 m of
// pipe (P1..P4, 50 m each). PF = 1 + 14 / (4 + sqrt 1.5) = 3.679557 (Harmon); Qavg = 1500 x 300 L/d
// = 5.208333 L/s; peak 19.164358 L/s; infiltration 0.5 L/s/km x 0.2 km = 0.1 L/s; plus the
// structures' own inflows (Q_LOCAL 20 L/s at M1..M4, the fixture's) 80 L/s: Q = 99.264358 L/s.
TEST_CASE("badinput catchments: sanitary mode accumulates population and infiltration through the run") {
  Case c("catchments_sanitary");
  std::string project = replace(rational_project(), R"(mode = "rational")", R"(mode = "sanitary")");
  project = replace(project, "runoff_c = \"RUNOFF_C\"\n", "runoff_c = \"RUNOFF_C\"\npopulation = \"POP\"\n");
  project += "\n[sanitary]\nper_capita = \"300 L/d\"\npeaking = \"harmon\"\ninfiltration_per_length = \"0.5 L/s/km\"\n";
  const auto r = run_with(c, base_catchments(), project);
  INFO(dump(r));
  REQUIRE(r.catchment_flows);
  const auto& p = r.catchment_flows->pipes[conduit_index(r, "P1")];
  CHECK(p.population == 1500.0);
  CHECK(p.peaking_factor == Approx(3.679557).epsilon(1e-6));
  CHECK(p.infiltration_m3_s * 1e3 == Approx(0.1).epsilon(1e-9));
  CHECK(r.flows.flow_m3_s[conduit_index(r, "P1")] * 1e3 == Approx(99.264358).epsilon(1e-6));
  check_solved(r, {"OF", "M1", "M2", "M3", "M4"});
}

TEST_CASE("badinput catchments project: sanitary mode without a population field is an error") {
  std::string project = replace(rational_project(), R"(mode = "rational")", R"(mode = "sanitary")");
  project += "\n[sanitary]\nper_capita = \"300 L/d\"\n";
  CHECK(
      parse_error(project) ==
      R"(project.toml: line 42: key catchments.fields: mode "sanitary" needs catchments.fields.population or structures.fields.population)");
}

TEST_CASE("badinput catchments project: sanitary mode on structure populations alone needs no catchments") {
  std::string project = replace(base_project(), R"(mode = "structure_inflows")", R"(mode = "sanitary")");
  project = replace(project, "inflow = { field = \"Q_LOCAL\", unit = \"L/s\" }\n",
                    "inflow = { field = \"Q_LOCAL\", unit = \"L/s\" }\npopulation = \"POP\"\n");
  CHECK(parse_error(project + "\n[sanitary]\nper_capita = \"250 L/d\"\n").empty());
  CHECK(parse_error(project) ==
        R"(project.toml: key sanitary.per_capita: mode "sanitary" needs the average flow per person)");
}

// Issue 17: a catchment a design-flow mode leaves out stops the run unless the project allows it,
// naming each one and why (the flows would be too low without a word otherwise).
TEST_CASE("badinput catchments: a catchment left out stops the run unless allow_left_out is set") {
  Case c("catchments_left_out");
  auto ks = base_catchments();
  ks.push_back(feature(props("KN"), "null"));
  ks.push_back(square(props("KFAR"), ox + 500, oy + 500, 20));
  c.write_network(base_pipes(), base_structures(), rational_project());
  c.write("catchments.geojson", collection(ks));
  const std::string e = error_of([&] { c.run(); });
  CHECK(e == c.path("catchments.geojson") +
                 ":catchments: 2 catchment(s) would contribute no flow, so the design flows would be too low:\n"
                 "  KN (The catchment has no geometry; it is left out.)\n"
                 "  KFAR (catchment KFAR has no structure a pipe leaves within 30.000 m; it contributes no flow.)\n"
                 "Fix them, or set [catchments] allow_left_out = true to run without them (each stays a finding)");
}

// Issue 17: each flows mode reads only its own inputs. A sanitary run used to drop every catchment
// without a runoff coefficient (a storm input) and go on with population 0.
TEST_CASE("badinput catchments: sanitary mode needs no runoff coefficient, keeps every catchment's population") {
  Case c("catchments_sanitary_no_c");
  std::string project = replace(rational_project(), R"(mode = "rational")", R"(mode = "sanitary")");
  project = replace(project, "runoff_c = \"RUNOFF_C\"\n", "population = \"POP\"\n");
  project = replace(project, "[catchments.defaults]\nrunoff_c = 0.5\n", "[catchments.defaults]\n");
  project += "\n[sanitary]\nper_capita = \"300 L/d\"\n";
  auto ks = base_catchments();
  for (auto& k : ks) k = replace(k, R"("RUNOFF_C":0.6,)", "");  // no C anywhere
  const auto r = run_with(c, ks, project);
  INFO(dump(r));
  REQUIRE(r.catchment_flows);
  CHECK(r.catchments.size() == 3);
  CHECK(r.catchment_flows->pipes[conduit_index(r, "P1")].population == 1500.0);
  for (const auto& f : r.findings) CHECK(f.layer != LayerRole::catchments);
}

// Issue 18, defect 5: a self-intersecting (bow-tie) ring's signed area cancels part of itself: the
// ring below encloses 266.67 + 66.67 = 333.33 m2 (two triangles meeting at (40/3, 40/3), worked by
// hand) but its shoelace area is 200 m2, which was used without a finding.
TEST_CASE("badinput catchments: a bow-tie polygon is repaired, its true area used and said") {
  Case c("catchment_bow_tie");
  const double x = ox - 160, y = oy - 20;
  auto at = [&](double dx, double dy) { return "[" + num(x + dx) + "," + num(y + dy) + "]"; };
  const std::string bow_tie = feature(props("K3"), R"({"type":"Polygon","coordinates":[[)" + at(0, 0) + "," +
                                                       at(20, 20) + "," + at(20, 0) + "," + at(0, 40) + "," + at(0, 0) +
                                                       "]]}");
  const auto r = run_with(c, {bow_tie, square(props("K4"), ox - 50, oy + 50, 20), square(props("K2"), ox - 100, oy, 20)});
  INFO(dump(r));
  CHECK(r.catchments[catchment(r, "K3")].area_m2 == Approx(1000.0 / 3.0).epsilon(1e-9));
  const Finding* f = find(r, "DATA_GEOMETRY", "K3");
  REQUIRE(f != nullptr);
  CHECK(f->severity == Severity::warning);
  CHECK(message(f) == "The polygon is invalid (its rings cross or touch themselves); it was repaired (GEOS make-valid) "
                      "and its area 0.03 ha is used (the rings as drawn give 0.02 ha).");
  CHECK(f->value == Approx(1000.0 / 3.0));
}
