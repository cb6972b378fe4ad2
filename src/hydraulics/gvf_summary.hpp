#pragma once
// Internal: turns the joined nodes of a profile into the public ConduitProfile (points with
// HGL/EGL/velocity, regime, what governed, profile class, surcharged length).
#include <cstddef>
#include <vector>

#include "hydraulics/gvf_branch.hpp"

namespace rimline::hydraulics::detail {

// nodes ascending in station; nodes[super_from..] belong to the supercritical branch.
ConduitProfile summarise(const PreparedReach& r, std::vector<Node> nodes, std::size_t super_from, bool free_outlet);
ConduitProfile summarise_still(const PreparedReach& r, const std::vector<Node>& nodes);

}  // namespace rimline::hydraulics::detail
