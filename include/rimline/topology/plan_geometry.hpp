#pragma once
// Fills a conduit's plan fields from its vertices as digitised, the way the reader does, so
// networks built from literals (tests, generators) match what build_topology expects.
#include <vector>

#include "rimline/model/network.hpp"

namespace rimline::topology {

// Sets vertices, up_point / down_point (first / last vertex), up_direction / down_direction
// (unit vectors of the first / last segment of non-zero length; (0, 0) if there is none) and
// geometry_length_m. length_m is set to the geometry length when it is not positive.
void set_plan_geometry(model::Conduit& c, std::vector<model::Point2> vertices);

}  // namespace rimline::topology
