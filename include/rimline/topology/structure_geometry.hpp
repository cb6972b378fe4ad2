#pragma once
// What a conduit meets at its downstream structure: the bend into the main outflow and the
// step between inverts, the inputs of bend and drop losses in the march.
#include "rimline/model/network.hpp"
#include "rimline/topology/build.hpp"

namespace rimline::topology {

// Angle [deg] between two plan directions, 0..180; NaN if either is (nearly) zero.
double angle_between_deg(model::Point2 a, model::Point2 b);

// Fills topology.deflection_deg and topology.invert_drop_m (needs nodes from build_march_order).
void compute_structure_geometry(const model::Network& network, Topology& topology);

}  // namespace rimline::topology
