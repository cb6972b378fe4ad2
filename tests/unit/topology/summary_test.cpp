// Network summary counts on a literal network: two outfalls, one diversion, one unusable
// pipe, one derived structure. Expected counts follow from the construction.
#include <catch2/catch.hpp>

#include "rimline/topology/build.hpp"
#include "rimline/topology/plan_geometry.hpp"
#include "rimline/topology/summary.hpp"

using namespace rimline;

TEST_CASE("summary counts structures, conduits, outfalls, trees, diversions and lengths") {
  model::Network n;
  for (auto [id, x, y] : {std::tuple{"S1", 0.0, 0.0}, {"S2", 10.0, 0.0}, {"S3", 0.0, 10.0}, {"O1", 20.0, 0.0}}) {
    model::Structure s;
    s.id = id;
    s.location = {x, y};
    n.structures.push_back(s);
  }
  auto add = [&](const char* id, model::Point2 a, model::Point2 b, double d) {
    model::Conduit c;
    c.id = id;
    c.section.diameter_m = d;
    topology::set_plan_geometry(c, {a, b});
    n.conduits.push_back(c);
  };
  add("Pmain", {0, 0}, {10, 0}, 0.6);
  add("Pside", {0, 0}, {0, 10}, 0.3);
  add("P2", {10, 0}, {20, 0}, 0.6);
  add("Pout", {0, 10}, {0, 30}, 0.3);  // ends away from any structure: derived outfall
  add("Pbad", {20, 0}, {25, 0}, 0.3);
  n.conduits.back().usable = false;
  Findings fs;
  const auto t = topology::build_topology(n, {}, fs);
  const auto s = topology::summarize(n, t);
  CHECK(s.structures == 6);  // Pbad's far end also gets a derived structure
  CHECK(s.derived_structures == 2);
  CHECK(s.conduits == 5);
  CHECK(s.usable_conduits == 4);
  CHECK(s.marched_conduits == 4);
  CHECK(s.outfalls == 2);
  CHECK(s.trees == 2);
  CHECK(s.diversions == 1);
  CHECK(s.loops_cut == 0);
  CHECK(s.total_length_m == Approx(10 + 10 + 10 + 20 + 5));
  REQUIRE(s.per_tree.size() == 2);
  CHECK(s.per_tree[0].outfall_id == "O1");
  CHECK(s.per_tree[0].conduits == 2);
  CHECK(s.per_tree[0].structures == 3);
  CHECK(s.per_tree[0].length_m == Approx(20.0));
  CHECK(s.per_tree[1].conduits == 2);
  CHECK(s.per_tree[1].structures == 2);  // the derived outfall and S3; S1 sits in O1's tree
  CHECK(s.per_tree[1].length_m == Approx(30.0));
}
