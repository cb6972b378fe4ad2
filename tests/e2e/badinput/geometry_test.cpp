// Bad-input catalogue, geometry: null, empty, multi-part with a gap, points given as pipes,
// zero-length and self-overlapping lines. Expected codes from include/rimline/gis/read_network.hpp
// and include/rimline/topology/build.hpp; every input is invented for the test.
#include "e2e/badinput/fixture.hpp"

using namespace rimline;
using namespace rimline::badinput;

TEST_CASE("badinput geometry: a pipe with null geometry is unusable, the rest is marched") {
  Case c("null_geometry");
  auto pipes = base_pipes();
  pipes.push_back(feature(R"("PIPE_ID":"PX","SIZE":300,"US_INV":3.0,"DS_INV":2.8)", "null"));
  c.write_network(pipes, base_structures());
  const auto r = c.run();
  INFO(dump(r));
  const Finding* f = find(r, "DATA_GEOMETRY", "PX");
  REQUIRE(f != nullptr);
  CHECK(f->severity == Severity::error);
  CHECK(message(f) == R"(The pipe has no geometry; it is left out of the analysis.)");
  CHECK_FALSE(r.read.network.conduits[conduit_index(r, "PX")].usable);
  // Its ends have no coordinates: no structure is invented for them (regression: they were
  // snapped at (0, 0), placing a derived structure there).
  const Finding* u = find(r, "TOPOLOGY_UNCONNECTED", "PX");
  REQUIRE(u != nullptr);
  CHECK(message(u) ==
        R"(pipe PX: its first end (as digitised) has no coordinates; it is left unconnected and out of the march)");
  CHECK(r.read.network.structures.size() == 5);
  check_solved(r, {"OF", "M1", "M2", "M3", "M4"});
}

TEST_CASE("badinput geometry: a pipe with an empty line is unusable, the rest is marched") {
  Case c("empty_geometry");
  auto pipes = base_pipes();
  pipes.push_back(
      feature(R"("PIPE_ID":"PX","SIZE":300,"US_INV":3.0,"DS_INV":2.8)", R"({"type":"LineString","coordinates":[]})"));
  c.write_network(pipes, base_structures());
  const auto r = c.run();
  INFO(dump(r));
  const Finding* f = find(r, "DATA_GEOMETRY", "PX");
  REQUIRE(f != nullptr);
  CHECK(f->severity == Severity::error);
  CHECK(message(f) == R"(The pipe has no geometry; it is left out of the analysis.)");
  check_solved(r, {"OF", "M1", "M2", "M3", "M4"});
}

TEST_CASE("badinput geometry: a multi-part line with a gap is unusable; touching parts are merged") {
  Case c("multipart_gap");
  auto pipes = base_pipes();
  // P3 as two parts 10 m apart (gap) and P2 as two parts that touch (merged, info).
  pipes[2] = feature(R"("PIPE_ID":"P3","SIZE":300,"US_INV":2.75,"DS_INV":2.5)",
                     R"({"type":"MultiLineString","coordinates":[[[452150,5385200],[452170,5385200]],)"
                     R"([[452180,5385200],[452200,5385200]]]})");
  pipes[1] = feature(R"("PIPE_ID":"P2","SIZE":375,"US_INV":2.5,"DS_INV":2.25)",
                     R"({"type":"MultiLineString","coordinates":[[[452200,5385200],[452220,5385200]],)"
                     R"([[452220,5385200],[452250,5385200]]]})");
  c.write_network(pipes, base_structures());
  const auto r = c.run();
  INFO(dump(r));
  const Finding* gap = find(r, "DATA_GEOMETRY", "P3");
  REQUIRE(gap != nullptr);
  CHECK(gap->severity == Severity::error);
  CHECK(
      message(gap) ==
      R"(The MULTILINESTRING has 2 parts that do not join end to end within the snap tolerance of 0.500 m (gap 10.000 m); the pipe is left out of the analysis.)");
  const Finding* merged = find(r, "DATA_GEOMETRY", "P2");
  REQUIRE(merged != nullptr);
  CHECK(merged->severity == Severity::info);
  CHECK(r.read.network.conduits[conduit_index(r, "P2")].usable);
  check_solved(r, {"OF", "M1", "M2", "M4"});
}

TEST_CASE("badinput geometry: a point layer given as the pipe layer stops the run naming the layer") {
  Case c("points_as_pipes");
  // The structure layer named as the pipes, with a mapping its fields satisfy.
  auto p = replace(base_project(), R"(source = "pipes.geojson")", R"(source = "structures.geojson")");
  p = replace(replace(p, R"(id = "PIPE_ID")", R"(id = "NODE_ID")"), R"(field = "SIZE")", R"(field = "RIM")");
  p = replace(replace(p, R"(field = "US_INV")", R"(field = "SUMP")"), R"(field = "DS_INV")", R"(field = "SUMP")");
  c.write_network(base_pipes(), base_structures(), p);
  CHECK(error_of([&] { c.run(); }) == c.path("structures.geojson") +
                                          ":structures: the pipes layer holds Point geometries, not lines; is it the "
                                          "structure layer?");
  // With the pipes' own field names too: the geometry type is checked before any field.
  c.write("project.toml", replace(base_project(), R"(source = "pipes.geojson")", R"(source = "structures.geojson")"));
  CHECK_THAT(error_of([&] { c.run(); }), Catch::EndsWith(":structures: the pipes layer holds Point geometries, not "
                                                         "lines; is it the structure layer?"));
}

TEST_CASE("badinput geometry: a zero-length pipe is reported and left out, the rest is marched") {
  Case c("zero_length");
  auto pipes = base_pipes();
  pipes.push_back(pipe("PZ", ox - 150, oy, ox - 150, oy, 300, 2.8, 2.75));
  c.write_network(pipes, base_structures());
  const auto r = c.run();
  INFO(dump(r));
  const Finding* f = find(r, "DATA_GEOMETRY", "PZ");
  REQUIRE(f != nullptr);
  CHECK(message(f) == R"(The line has zero length; the pipe is left out of the analysis.)");
  check_solved(r, {"OF", "M1", "M2", "M3", "M4"});
}

TEST_CASE("badinput geometry: a line that doubles back over itself is reported") {
  Case c("self_overlap");
  auto pipes = base_pipes();
  // P3 runs from M3 past M2 by 20 m and back to M2: 90 m of line for 50 m of plan distance.
  pipes[2] = feature(R"("PIPE_ID":"P3","SIZE":300,"US_INV":2.75,"DS_INV":2.5)",
                     R"({"type":"LineString","coordinates":[[452150,5385200],[452220,5385200],[452200,5385200]]})");
  c.write_network(pipes, base_structures());
  const auto r = c.run();
  INFO(dump(r));
  const Finding* f = find(r, "DATA_GEOMETRY", "P3");
  REQUIRE(f != nullptr);
  CHECK(message(f) == R"(The line crosses or runs back over itself; its plan length 90.000 m may be overstated.)");
  check_solved(r, {"OF", "M1", "M2", "M4"});
}
