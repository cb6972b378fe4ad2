#include "rimline/topology/structure_geometry.hpp"

#include <cmath>
#include <limits>
#include <numbers>

namespace rimline::topology {

using model::no_index;

double angle_between_deg(model::Point2 a, model::Point2 b) {
  const double na = std::hypot(a.x, a.y), nb = std::hypot(b.x, b.y);
  if (!(na > 1e-12) || !(nb > 1e-12)) return std::numeric_limits<double>::quiet_NaN();
  // atan2(|a x b|, a . b) stays accurate near 0 and 180 deg, where acos(dot) loses digits.
  const double cross = a.x * b.y - a.y * b.x;
  const double dot = a.x * b.x + a.y * b.y;
  return std::atan2(std::abs(cross), dot) * 180.0 / std::numbers::pi;
}

void compute_structure_geometry(const model::Network& network, Topology& topology) {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  topology.deflection_deg.assign(network.conduits.size(), nan);
  topology.invert_drop_m.assign(network.conduits.size(), nan);
  for (std::size_t i = 0; i < network.conduits.size(); ++i) {
    const model::Conduit& c = network.conduits[i];
    if (c.to == no_index || c.to >= topology.nodes.size()) continue;
    const std::size_t main = topology.nodes[c.to].main_outflow;
    if (main == no_index || main == i) continue;
    const model::Conduit& out = network.conduits[main];
    topology.deflection_deg[i] = angle_between_deg(c.down_direction, out.up_direction);
    if (c.invert_down_m && out.invert_up_m) topology.invert_drop_m[i] = *c.invert_down_m - *out.invert_up_m;
  }
}

}  // namespace rimline::topology
