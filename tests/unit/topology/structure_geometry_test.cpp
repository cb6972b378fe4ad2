// Deflection and invert drop at a conduit's downstream structure. Expected angles are exact
// plane geometry of the literal lines (a right angle, a straight run, a 45 deg turn).
#include <catch2/catch.hpp>

#include <cmath>

#include "rimline/topology/build.hpp"
#include "rimline/topology/plan_geometry.hpp"
#include "rimline/topology/structure_geometry.hpp"

using namespace rimline;
using model::Point2;

namespace {

model::Network chain(std::vector<Point2> nodes, std::vector<double> diameters = {}) {
  model::Network n;
  for (std::size_t i = 0; i < nodes.size(); ++i) {
    model::Structure s;
    s.id = "S" + std::to_string(i);
    s.location = nodes[i];
    n.structures.push_back(s);
  }
  for (std::size_t i = 0; i + 1 < nodes.size(); ++i) {
    model::Conduit c;
    c.id = "P" + std::to_string(i);
    c.section.diameter_m = diameters.empty() ? 0.3 : diameters[i];
    topology::set_plan_geometry(c, {nodes[i], nodes[i + 1]});
    n.conduits.push_back(c);
  }
  return n;
}

}  // namespace

TEST_CASE("angle between plan directions") {
  CHECK(topology::angle_between_deg({1, 0}, {0, 1}) == Approx(90.0));
  CHECK(topology::angle_between_deg({1, 0}, {1, 0}) == 0.0);
  CHECK(topology::angle_between_deg({1, 0}, {-1, 0}) == Approx(180.0));
  CHECK(topology::angle_between_deg({1, 0}, {1, -1}) == Approx(45.0));
  CHECK(std::isnan(topology::angle_between_deg({0, 0}, {1, 0})));
}

TEST_CASE("deflection of a 90 deg bend, of a straight run, and NaN at the outfall") {
  model::Network n = chain({{0, 0}, {10, 0}, {20, 0}, {20, 10}});
  n.conduits[0].invert_down_m = 9.00;
  n.conduits[1].invert_up_m = 8.95;
  Findings fs;
  const auto t = topology::build_topology(n, {}, fs);
  REQUIRE(t.deflection_deg.size() == 3);
  CHECK(t.deflection_deg[0] == Approx(0.0).margin(1e-12));  // straight through S1
  CHECK(t.deflection_deg[1] == Approx(90.0));               // right-angle turn at S2
  CHECK(std::isnan(t.deflection_deg[2]));                   // S3 is the outfall
  CHECK(t.invert_drop_m[0] == Approx(0.05));
  CHECK(std::isnan(t.invert_drop_m[1]));  // inverts not given
  CHECK(std::isnan(t.invert_drop_m[2]));
}

TEST_CASE("deflection is measured against the largest outflow of a diversion") {
  model::Network n = chain({{0, 0}, {10, 0}, {20, 0}});
  model::Structure side;
  side.id = "SIDE";
  side.location = {20, 10};
  n.structures.push_back(side);
  model::Conduit branch;
  branch.id = "B";
  branch.section.diameter_m = 0.6;  // larger than P1 (0.3): the main outflow of S1
  topology::set_plan_geometry(branch, {{10, 0}, {20, 10}});
  n.conduits.push_back(branch);
  Findings fs;
  const auto t = topology::build_topology(n, {}, fs);
  CHECK(t.nodes[1].main_outflow == 2);
  CHECK(t.deflection_deg[0] == Approx(45.0));
}
