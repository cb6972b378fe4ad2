#pragma once
// The structure each catchment drains to: the one its structure field names, else the structure
// inside the polygon (inlets before other kinds), else the nearest within `search_m` of the
// polygon. Only structures a marched pipe leaves can take a catchment (elsewhere its flow would
// vanish). Findings (layer catchments):
//   CATCHMENT_OUTLET     warning  the named structure is unknown or no pipe leaves it; the geometric
//                                 choice is used instead
//   CATCHMENT_AMBIGUOUS  warning  more than one candidate inside the polygon; the one nearest the
//                                 centroid is taken (named in the message)
//   CATCHMENT_NEAREST    info     no structure inside; the nearest one (within search_m) is taken
//   CATCHMENT_NO_OUTLET  warning  no structure within search_m; the catchment contributes nothing
#include <vector>

#include "rimline/finding.hpp"
#include "rimline/model/catchment.hpp"
#include "rimline/topology/build.hpp"

namespace rimline::flows {

// Sets Catchment::structure for each catchment.
void assign_outlets(const model::Network& network, const topology::Topology& topo,
                    std::vector<model::Catchment>& catchments, double search_m, Findings& findings);

// Plan geometry helpers (run CRS, metres), exposed for the tests.
bool inside_rings(const std::vector<std::vector<model::Point2>>& rings, model::Point2 p);           // even-odd rule
double distance_to_rings_m(const std::vector<std::vector<model::Point2>>& rings, model::Point2 p);  // 0 inside

}  // namespace rimline::flows
