// Orientation rule of build.hpp on literal networks: ids decide; else an outfall end; else the
// inverts; else the digitising. Expected values follow from the construction; no outside data.
#include <catch2/catch.hpp>

#include <string>

#include "rimline/topology/build.hpp"
#include "rimline/topology/plan_geometry.hpp"

using namespace rimline;
using model::Point2;
using model::StructureKind;

namespace {

model::Structure structure(std::string id, double x, double y, StructureKind kind = StructureKind::manhole) {
  model::Structure s;
  s.id = std::move(id);
  s.location = {x, y};
  s.kind = kind;
  return s;
}

model::Conduit pipe(std::string id, std::vector<Point2> line, double invert_first, double invert_last,
                    std::string from_id = {}, std::string to_id = {}) {
  model::Conduit c;
  c.id = std::move(id);
  c.from_id = std::move(from_id);
  c.to_id = std::move(to_id);
  c.section.diameter_m = 0.3;
  c.invert_up_m = invert_first;
  c.invert_down_m = invert_last;
  topology::set_plan_geometry(c, std::move(line));
  return c;
}

std::size_t count(const Findings& fs, const std::string& code) {
  std::size_t n = 0;
  for (const Finding& f : fs) n += f.code == code;
  return n;
}

const Finding& first(const Findings& fs, const std::string& code) {
  for (const Finding& f : fs)
    if (f.code == code) return f;
  FAIL("no finding " << code);
  return fs.front();
}

}  // namespace

TEST_CASE("a snapped pipe whose inverts fall toward its first vertex is turned") {
  model::Network n;
  n.structures = {structure("S1", 0, 0), structure("S2", 10, 0)};
  // Digitised from S2 to S1, but the invert at S2 (first vertex) is the lower one.
  n.conduits = {pipe("P", {{10, 0}, {5, 0.5}, {0, 0}}, 9.0, 10.0)};
  Findings fs;
  const auto t = topology::build_topology(n, {}, fs);
  const model::Conduit& c = n.conduits[0];
  CHECK(c.reversed);
  CHECK(c.from == 0);
  CHECK(c.to == 1);
  CHECK(*c.invert_up_m == 10.0);
  CHECK(*c.invert_down_m == 9.0);
  CHECK(c.up_point.x == 0.0);
  CHECK(c.down_point.x == 10.0);
  CHECK(c.vertices.front().x == 0.0);
  CHECK(c.vertices.back().x == 10.0);
  CHECK(c.up_direction.x > 0.0);
  CHECK(c.up_direction.y > 0.0);
  CHECK(c.down_direction.x > 0.0);
  CHECK(c.down_direction.y < 0.0);
  CHECK(t.turned_conduits == 1);
  REQUIRE(count(fs, "REVERSED") == 1);
  const Finding& f = first(fs, "REVERSED");
  CHECK(f.severity == Severity::info);
  CHECK(render_message(f.message, units::System::si) ==
        "pipe P was digitised against the flow (its inverts fall from 10.000 m at its last vertex to 9.000 m at its "
        "first); turned so it runs from S1 to S2");
  // A US run reads the same sentence in feet (10 m = 32.81 ft, 9 m = 29.53 ft; NIST SP 811 B.8 foot).
  CHECK(render_message(f.message, units::System::us) ==
        "pipe P was digitised against the flow (its inverts fall from 32.81 ft at its last vertex to 29.53 ft at its "
        "first); turned so it runs from S1 to S2");
  CHECK(count(fs, "ADVERSE_SLOPE") == 0);
  REQUIRE(t.trees.size() == 1);
  CHECK(t.trees[0].outfall == 1);
}

TEST_CASE("inverts within the tolerance leave the digitised direction") {
  model::Network n;
  n.structures = {structure("S1", 0, 0), structure("S2", 10, 0)};
  n.conduits = {pipe("P", {{0, 0}, {10, 0}}, 9.0, 9.0005)};
  Findings fs;
  topology::build_topology(n, {}, fs);
  CHECK_FALSE(n.conduits[0].reversed);
  CHECK(n.conduits[0].to == 1);
  CHECK(fs.empty());
}

TEST_CASE("a pipe whose inverts rise toward an outfall is an adverse slope, not turned") {
  model::Network n;
  n.structures = {structure("S1", 0, 0), structure("O", 10, 0, StructureKind::outfall)};
  n.conduits = {pipe("P", {{0, 0}, {10, 0}}, 9.0, 9.5)};
  n.conduits[0].length_m = 10.0;
  Findings fs;
  const auto t = topology::build_topology(n, {}, fs);
  CHECK_FALSE(n.conduits[0].reversed);
  CHECK(n.conduits[0].to == 1);
  CHECK(count(fs, "REVERSED") == 0);
  REQUIRE(count(fs, "ADVERSE_SLOPE") == 1);
  const Finding& f = first(fs, "ADVERSE_SLOPE");
  CHECK(f.severity == Severity::warning);
  CHECK(f.value == Approx(-0.05));
  CHECK(f.dimension == units::Dimension::slope);
  CHECK(render_message(f.message, units::System::si) ==
        "pipe P: inverts rise 0.500 m along the flow from S1 (9.000 m) to O (9.500 m) that the outfall at its "
        "downstream end fixes; kept in that direction");
  CHECK(t.nodes[1].outfall);
}

TEST_CASE("a pipe digitised out of an outfall is turned toward it") {
  model::Network n;
  n.structures = {structure("S1", 0, 0), structure("O", 10, 0, StructureKind::outfall)};
  n.conduits = {pipe("P", {{10, 0}, {0, 0}}, 9.0, 9.5)};
  Findings fs;
  topology::build_topology(n, {}, fs);
  CHECK(n.conduits[0].reversed);
  CHECK(n.conduits[0].from == 0);
  CHECK(n.conduits[0].to == 1);
  CHECK(*n.conduits[0].invert_up_m == 9.5);
  CHECK(count(fs, "REVERSED") == 1);
  CHECK(first(fs, "REVERSED").message ==
        "pipe P was digitised against the flow (its first end is outfall O); turned so it runs from S1 to O");
  CHECK(count(fs, "ADVERSE_SLOPE") == 0);
}

TEST_CASE("ids fix the direction: rising inverts are an adverse slope, the pipe is not turned") {
  model::Network n;
  n.structures = {structure("S1", 0, 0), structure("S2", 10, 0)};
  n.conduits = {pipe("P", {{0, 0}, {10, 0}}, 9.0, 9.2, "S1", "S2")};
  Findings fs;
  topology::build_topology(n, {}, fs);
  CHECK_FALSE(n.conduits[0].reversed);
  CHECK(n.conduits[0].from == 0);
  CHECK(count(fs, "ADVERSE_SLOPE") == 1);
  CHECK(count(fs, "REVERSED") == 0);
}

TEST_CASE("a rising force main is not an adverse slope") {
  model::Network n;
  n.structures = {structure("S1", 0, 0), structure("S2", 10, 0)};
  n.conduits = {pipe("P", {{0, 0}, {10, 0}}, 9.0, 12.0, "S1", "S2")};
  n.conduits[0].force_main = true;
  Findings fs;
  topology::build_topology(n, {}, fs);
  CHECK(fs.empty());
}

TEST_CASE("a line digitised against its ids is turned with its inverts left at the named ends") {
  model::Network n;
  n.structures = {structure("S1", 0, 0), structure("S2", 10, 0)};
  n.conduits = {pipe("P", {{10, 0}, {0, 0}}, 9.5, 9.0, "S1", "S2")};
  Findings fs;
  topology::build_topology(n, {}, fs);
  const model::Conduit& c = n.conduits[0];
  CHECK(c.reversed);
  CHECK(c.up_point.x == 0.0);
  CHECK(c.up_direction.x == 1.0);
  CHECK(*c.invert_up_m == 9.5);
  CHECK(count(fs, "TOPOLOGY_REVERSED_GEOMETRY") == 1);
  CHECK(count(fs, "ADVERSE_SLOPE") == 0);
}

TEST_CASE("a pipe rising in the middle of a digitised chain is an adverse slope, not turned into a false outfall") {
  model::Network n;
  n.structures = {structure("S1", 0, 0), structure("S2", 10, 0), structure("S3", 20, 0),
                  structure("O", 30, 0, StructureKind::outfall)};
  n.conduits = {pipe("P1", {{0, 0}, {10, 0}}, 10.0, 9.9), pipe("P2", {{10, 0}, {20, 0}}, 9.8, 9.85),
                pipe("P3", {{20, 0}, {30, 0}}, 9.7, 9.6)};
  Findings fs;
  const auto t = topology::build_topology(n, {}, fs);
  CHECK_FALSE(n.conduits[1].reversed);
  CHECK(n.conduits[1].from == 1);
  CHECK(n.conduits[1].to == 2);
  CHECK(*n.conduits[1].invert_up_m == 9.8);
  CHECK(count(fs, "REVERSED") == 0);
  REQUIRE(count(fs, "ADVERSE_SLOPE") == 1);
  CHECK(first(fs, "ADVERSE_SLOPE").feature_id == "P2");
  CHECK(render_message(first(fs, "ADVERSE_SLOPE").message, units::System::si) ==
        "pipe P2: inverts rise 0.050 m along the flow from S2 (9.800 m) to S3 (9.850 m) that the pipes flowing into and "
        "out of its ends fix; kept in that direction");
  REQUIRE(t.trees.size() == 1);
  CHECK(t.trees[0].outfall == 3);
}

TEST_CASE("a pipe digitised backwards in a chain is turned by its inverts") {
  model::Network n;
  n.structures = {structure("S1", 0, 0), structure("S2", 10, 0), structure("S3", 20, 0), structure("S4", 30, 0)};
  // P2 digitised from S3 to S2; its inverts (9.7 at S3, 9.8 at S2) fall toward S3.
  n.conduits = {pipe("P1", {{0, 0}, {10, 0}}, 10.0, 9.9), pipe("P2", {{20, 0}, {10, 0}}, 9.7, 9.8),
                pipe("P3", {{20, 0}, {30, 0}}, 9.6, 9.5)};
  Findings fs;
  const auto t = topology::build_topology(n, {}, fs);
  CHECK(n.conduits[1].reversed);
  CHECK(n.conduits[1].from == 1);
  CHECK(n.conduits[1].to == 2);
  CHECK(count(fs, "REVERSED") == 1);
  CHECK(count(fs, "ADVERSE_SLOPE") == 0);
  REQUIRE(t.trees.size() == 1);
  CHECK(t.trees[0].structures == std::vector<std::size_t>{3, 2, 1, 0});
}
