#include "rimline/topology/plan_geometry.hpp"

#include <cmath>

namespace rimline::topology {

namespace {
model::Point2 unit(model::Point2 from, model::Point2 to) {
  const double dx = to.x - from.x, dy = to.y - from.y, n = std::hypot(dx, dy);
  return n > 0.0 ? model::Point2{dx / n, dy / n} : model::Point2{0.0, 0.0};
}
}  // namespace

void set_plan_geometry(model::Conduit& c, std::vector<model::Point2> vertices) {
  c.vertices = std::move(vertices);
  c.up_direction = c.down_direction = {0.0, 0.0};
  c.geometry_length_m = 0.0;
  if (c.vertices.empty()) return;
  c.up_point = c.vertices.front();
  c.down_point = c.vertices.back();
  for (std::size_t k = 1; k < c.vertices.size(); ++k)
    c.geometry_length_m += std::hypot(c.vertices[k].x - c.vertices[k - 1].x, c.vertices[k].y - c.vertices[k - 1].y);
  for (std::size_t k = 1; k < c.vertices.size(); ++k) {
    c.up_direction = unit(c.vertices[k - 1], c.vertices[k]);
    if (c.up_direction.x != 0.0 || c.up_direction.y != 0.0) break;
  }
  for (std::size_t k = c.vertices.size() - 1; k > 0; --k) {
    c.down_direction = unit(c.vertices[k - 1], c.vertices[k]);
    if (c.down_direction.x != 0.0 || c.down_direction.y != 0.0) break;
  }
  if (!(c.length_m > 0.0)) c.length_m = c.geometry_length_m;
}

}  // namespace rimline::topology
