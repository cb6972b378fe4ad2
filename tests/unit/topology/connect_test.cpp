// Connecting pipe ends to structures: by id, by snapping, by deriving structures. Every
// expected value follows from the construction of the literal network (plane geometry and the
// rules in build.hpp); no outside data is involved.
#include <catch2/catch.hpp>

#include <algorithm>
#include <limits>
#include <optional>
#include <string>

#include "rimline/topology/build.hpp"
#include "rimline/topology/plan_geometry.hpp"

using namespace rimline;
using model::no_index;
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

model::Conduit pipe(std::string id, std::vector<Point2> line, std::string from_id = {}, std::string to_id = {}) {
  model::Conduit c;
  c.id = std::move(id);
  c.from_id = std::move(from_id);
  c.to_id = std::move(to_id);
  c.section.diameter_m = 0.3;
  topology::set_plan_geometry(c, std::move(line));
  return c;
}

std::vector<const Finding*> with_code(const Findings& fs, const std::string& code) {
  std::vector<const Finding*> out;
  for (const Finding& f : fs)
    if (f.code == code) out.push_back(&f);
  return out;
}

}  // namespace

TEST_CASE("pipes link to structures by from/to id") {
  model::Network n;
  n.structures = {structure("S1", 0, 0), structure("S2", 10, 0), structure("S3", 20, 0)};
  n.conduits = {pipe("P2", {{10, 0}, {20, 0}}, "S2", "S3"), pipe("P1", {{0, 0}, {10, 0}}, "S1", "S2")};
  Findings fs;
  const auto t = topology::build_topology(n, {}, fs);
  CHECK(fs.empty());
  CHECK(n.conduits[0].from == 1);
  CHECK(n.conduits[0].to == 2);
  CHECK(n.conduits[1].from == 0);
  CHECK(n.conduits[1].to == 1);
  CHECK(t.derived_structures == 0);
  REQUIRE(t.trees.size() == 1);
  CHECK(t.trees[0].outfall == 2);
  CHECK(t.trees[0].structures == std::vector<std::size_t>{2, 1, 0});
  CHECK(t.trees[0].conduits == std::vector<std::size_t>{0, 1});
}

TEST_CASE("an id missing from the structure layer is reported and the end is snapped instead") {
  model::Network n;
  n.structures = {structure("S1", 0, 0), structure("S2", 10, 0)};
  n.conduits = {pipe("P1", {{0, 0}, {10.1, 0}}, "S1", "X9")};
  Findings fs;
  topology::build_topology(n, {}, fs);
  const auto missing = with_code(fs, "TOPOLOGY");
  REQUIRE(missing.size() == 1);
  CHECK(missing[0]->severity == Severity::warning);
  CHECK(missing[0]->layer == LayerRole::conduits);
  CHECK(missing[0]->feature_id == "P1");
  CHECK(missing[0]->field == "to_id");
  CHECK(missing[0]->message ==
        "pipe P1: to-structure id 'X9' not found in structures; that end is snapped by geometry instead");
  CHECK(n.conduits[0].to == 1);
  CHECK(n.conduits[0].to_id == "S2");
}

TEST_CASE("without a structure layer every id becomes a derived structure where the pipe ends agree") {
  model::Network n;
  // A -> B -> C, the middle pipe digitised from C's end back to B's end.
  n.conduits = {pipe("P1", {{0, 0}, {10, 0}}, "A", "B"), pipe("P2", {{20, 0}, {15, 1}, {10, 0}}, "B", "C"),
                pipe("P3", {{20, 0}, {30, 0}}, "C", "D")};
  n.conduits[1].invert_up_m = 9.0;  // named for the ids' ends: B upstream
  n.conduits[1].invert_down_m = 8.8;
  Findings fs;
  const auto t = topology::build_topology(n, {}, fs);
  REQUIRE(n.structures.size() == 4);
  CHECK(t.derived_structures == 4);
  for (const auto& s : n.structures) CHECK(s.kind == StructureKind::derived);
  CHECK_FALSE(n.structures[0].rim_m.has_value());
  const auto b = model::find_structure(n, "B"), c = model::find_structure(n, "C");
  CHECK(n.structures[b].location.x == 10.0);
  CHECK(n.structures[c].location.x == 20.0);
  const model::Conduit& p2 = n.conduits[1];
  CHECK(p2.from == b);
  CHECK(p2.to == c);
  CHECK(p2.reversed);
  CHECK(p2.up_point.x == 10.0);
  CHECK(p2.down_point.x == 20.0);
  CHECK(p2.vertices.front().x == 10.0);
  CHECK(p2.vertices[1].x == 15.0);
  CHECK(p2.up_direction.x == Approx(5.0 / std::hypot(5.0, 1.0)));
  CHECK(p2.up_direction.y == Approx(1.0 / std::hypot(5.0, 1.0)));
  CHECK(p2.down_direction.y == Approx(-1.0 / std::hypot(5.0, 1.0)));
  CHECK(*p2.invert_up_m == 9.0);  // the inverts stay with the ends the ids name
  CHECK(*p2.invert_down_m == 8.8);
  const auto turned = with_code(fs, "TOPOLOGY_REVERSED_GEOMETRY");
  REQUIRE(turned.size() == 1);
  CHECK(turned[0]->severity == Severity::info);
  CHECK(turned[0]->message == "pipe P2 was digitised against its from/to ids; its line was turned to run from B to C");
  CHECK(t.turned_conduits == 1);
  CHECK(with_code(fs, "ADVERSE_SLOPE").empty());
  // A head with a single pipe is placed at that pipe's upstream end.
  CHECK(n.structures[model::find_structure(n, "A")].location.x == 0.0);
  CHECK(n.structures[model::find_structure(n, "D")].location.x == 30.0);
}

TEST_CASE("pipe ends snap to the nearest structure within the tolerance") {
  model::Network n;
  n.structures = {structure("S1", 0, 0), structure("S2", 10, 0)};
  n.conduits = {pipe("P1", {{0.2, 0}, {9.9, 0.1}})};
  Findings fs;
  topology::build_topology(n, {}, fs);
  CHECK(fs.empty());
  CHECK(n.conduits[0].from == 0);
  CHECK(n.conduits[0].to == 1);
  CHECK(n.conduits[0].from_id == "S1");
  CHECK(n.conduits[0].to_id == "S2");
}

TEST_CASE("an ambiguous snap takes the nearest structure and says so") {
  model::Network n;
  n.structures = {structure("S1", 0, 0), structure("S2", 10, 0), structure("S2b", 10.3, 0)};
  n.conduits = {pipe("P1", {{0, 0}, {10.1, 0}})};
  Findings fs;
  topology::build_topology(n, {}, fs);
  CHECK(n.conduits[0].to == 1);
  const auto amb = with_code(fs, "TOPOLOGY_AMBIGUOUS");
  REQUIRE(amb.size() == 1);
  CHECK(amb[0]->feature_id == "P1");
  CHECK(amb[0]->value == Approx(0.2));
  CHECK(amb[0]->limit == 0.5);
  CHECK(render_message(amb[0]->message, units::System::si) ==
        "pipe P1: 2 structures lie within 0.500 m of its last end (as digitised); snapped to the nearest, S2 (0.100 m), "
        "not S2b (0.200 m)");
}

TEST_CASE("an end far from every structure is reported and gets a derived structure") {
  model::Network n;
  n.structures = {structure("S1", 0, 0)};
  n.conduits = {pipe("P1", {{0, 0}, {30, 0}}), pipe("P2", {{30.2, 5}, {30.1, 0.1}})};
  Findings fs;
  const auto t = topology::build_topology(n, {}, fs);
  const auto un = with_code(fs, "TOPOLOGY_UNCONNECTED");
  REQUIRE(un.size() == 3);  // P1's last end, both ends of P2
  CHECK(render_message(un[0]->message, units::System::si) ==
        "pipe P1: its last end (as digitised) at (30.00, 0.00) is more than 0.500 m from every structure; derived "
        "structure derived-1 placed there");
  // P1's end and P2's end are 0.14 m apart: they share one derived structure.
  CHECK(t.derived_structures == 2);
  CHECK(n.conduits[0].to == n.conduits[1].to);
  CHECK(n.structures[n.conduits[0].to].kind == StructureKind::derived);
  CHECK(n.structures[n.conduits[0].to].location.x == Approx(30.05));
  CHECK(t.nodes[n.conduits[0].to].outfall);
}

TEST_CASE("without a structure layer, pipe ends within the tolerance cluster into derived junctions") {
  model::Network n;
  n.conduits = {pipe("P1", {{0, 10}, {10, 0.1}}), pipe("P2", {{0, -10}, {10, -0.1}}), pipe("P3", {{10.1, 0}, {20, 0}})};
  Findings fs;
  const auto t = topology::build_topology(n, {}, fs);
  CHECK(fs.empty());  // no structure layer: derived structures are expected, not findings
  CHECK(t.derived_structures == 4);
  CHECK(n.conduits[0].to == n.conduits[1].to);
  CHECK(n.conduits[2].from == n.conduits[0].to);
  REQUIRE(t.trees.size() == 1);
  CHECK(t.trees[0].outfall == n.conduits[2].to);
  CHECK(t.trees[0].conduits.size() == 3);
}

TEST_CASE("duplicate conduit ids are reported and the pipes stay distinct") {
  model::Network n;
  n.structures = {structure("S1", 0, 0), structure("S2", 10, 0), structure("S3", 20, 0)};
  n.conduits = {pipe("P1", {{0, 0}, {10, 0}}), pipe("P1", {{10, 0}, {20, 0}})};
  n.conduits[0].fid = 7;
  n.conduits[1].fid = 8;
  Findings fs;
  const auto t = topology::build_topology(n, {}, fs);
  const auto dup = with_code(fs, "TOPOLOGY_DUPLICATE_ID");
  REQUIRE(dup.size() == 1);
  CHECK(dup[0]->message == "pipe id 'P1' is used again by feature fid 8 (first by fid 7); both are kept as distinct pipes");
  REQUIRE(t.trees.size() == 1);
  CHECK(t.trees[0].conduits == std::vector<std::size_t>{1, 0});
}

TEST_CASE("duplicate structure ids are reported; ids link to the first") {
  model::Network n;
  n.structures = {structure("S1", 0, 0), structure("S1", 50, 0), structure("S2", 10, 0)};
  n.conduits = {pipe("P1", {{0, 0}, {10, 0}}, "S1", "S2")};
  Findings fs;
  topology::build_topology(n, {}, fs);
  const auto dup = with_code(fs, "TOPOLOGY_DUPLICATE_ID");
  REQUIRE(dup.size() == 1);
  CHECK(dup[0]->layer == LayerRole::structures);
  CHECK(n.conduits[0].from == 0);
}

TEST_CASE("a pipe end without coordinates stays unconnected and out of the march") {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  model::Network n;
  n.structures = {structure("S1", 0, 0), structure("S2", 10, 0)};
  n.conduits = {pipe("P1", {{0, 0}, {10, 0}}), pipe("P2", {{nan, nan}, {0, 0}})};
  Findings fs;
  const auto t = topology::build_topology(n, {}, fs);
  const auto un = with_code(fs, "TOPOLOGY_UNCONNECTED");
  REQUIRE(un.size() == 1);
  CHECK(un[0]->feature_id == "P2");
  CHECK(un[0]->message == "pipe P2: its first end (as digitised) has no coordinates; it is left unconnected and out of the march");
  CHECK(n.conduits[1].from == no_index);
  CHECK(n.conduits[1].to == 0);
  CHECK(t.status[1] == topology::MarchStatus::unusable);
  CHECK(t.derived_structures == 0);
  REQUIRE(t.trees.size() == 1);
  CHECK(t.trees[0].conduits == std::vector<std::size_t>{0});
}

TEST_CASE("a pipe with only its from-id mapped links that end by id and snaps the other") {
  model::Network n;
  n.structures = {structure("S1", 0, 0), structure("S2", 10, 0)};
  n.conduits = {pipe("P1", {{10.2, 0}, {0, 0}}, "S1", "")};  // digitised from S2's end to S1
  Findings fs;
  const auto t = topology::build_topology(n, {}, fs);
  CHECK(n.conduits[0].from == 0);
  CHECK(n.conduits[0].to == 1);
  CHECK(n.conduits[0].to_id == "S2");
  CHECK(n.conduits[0].reversed);
  CHECK(n.conduits[0].up_point.x == 0.0);
  REQUIRE(with_code(fs, "TOPOLOGY_REVERSED_GEOMETRY").size() == 1);
  CHECK(fs.size() == 1);
  CHECK(t.nodes[1].outfall);
}
