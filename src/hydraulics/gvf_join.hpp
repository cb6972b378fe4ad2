#pragma once
// Internal: joins the subcritical branch (marched upstream from the outlet) and the supercritical
// branch (marched downstream from an inlet control) by a hydraulic jump where their specific
// forces are equal (momentum balance, Chow 1959, Open-Channel Hydraulics, ch. 15).
#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "hydraulics/gvf_branch.hpp"

namespace rimline::hydraulics::detail {

struct Joined {
  std::vector<Node> nodes;  // ascending station
  std::optional<double> jump_x;
  double jump_loss = 0.0;
  std::size_t super_from = 0;  // index of the first node belonging to the supercritical branch
  bool has_super = false;
  bool ok = true;  // false: neither branch spans the conduit
  std::string note;
};

// sup may be null (no supercritical control).
Joined join(const PreparedReach& r, const Branch& sub, const Branch* sup);

// The branch's surface at x by linear interpolation between its computed sections: cheap, and
// good enough to bracket the jump before the exact refinement.
Node interpolated(const Branch& b, double x);

}  // namespace rimline::hydraulics::detail
