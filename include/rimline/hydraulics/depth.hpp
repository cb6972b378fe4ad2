#pragma once
// Normal and critical depth, Froude number, specific energy and specific force.
#include <optional>
#include <string>

#include "rimline/hydraulics/friction.hpp"

namespace rimline::hydraulics {

// Root-finding tolerance for depths: 1e-10 of the rise (Brent's method, absolute); at most 200
// iterations.
struct DepthSolve {
  bool exists = false;   // false: no free-surface solution (see note)
  double depth_m = 0.0;
  int iterations = 0;
  bool converged = false;
  std::string note;      // why not, in one sentence
};

// Normal depth for Q at slope S > 0. No solution when Q exceeds the section's maximum
// partly-full discharge (for a circle at y/D ~ 0.938): exists = false, depth = rise.
// S <= 0 (horizontal, adverse): exists = false.
DepthSolve normal_depth(const Roughness& r, const Section& s, double flow_m3_s, double slope);

// Critical depth for Q (Fr = 1: Q^2 T / (g A^3) = 1). When Q is so large that critical depth
// would exceed the rise (near-full circle), exists = false and depth = rise.
DepthSolve critical_depth(const Section& s, double flow_m3_s);

// Maximum discharge a partly full section carries at slope S (peak of the Q(y) curve) and its depth.
struct PeakFlow {
  double flow_m3_s = 0.0;
  double depth_m = 0.0;
};
PeakFlow peak_partly_full_flow(const Roughness& r, const Section& s, double slope);

double froude_number(const Section& s, double flow_m3_s, double depth_m);  // 0 when full
double specific_energy_m(const Section& s, double flow_m3_s, double depth_m);  // y + V^2/2g
double specific_force_m3(const Section& s, double flow_m3_s, double depth_m);  // Q^2/(gA) + A*zbar

}  // namespace rimline::hydraulics
