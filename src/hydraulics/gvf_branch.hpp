#pragma once
// Internal: one branch of a water-surface profile, marched by the standard step method from a
// control: the subcritical branch upstream from the outlet (with surcharged stretches), the
// supercritical branch downstream from an inlet control. gvf.cpp joins them (hydraulic jump).
#include <functional>
#include <vector>

#include "rimline/hydraulics/gvf.hpp"

namespace rimline::hydraulics::detail {

struct PreparedReach {
  Section section;
  Roughness roughness;
  double length = 0.0, z_down = 0.0, slope = 0.0, flow = 0.0, rise = 0.0;
  double yc = 0.0;  // critical depth (rise when none below the rise)
  double yn = 0.0;  // normal depth; valid when has_normal
  bool has_normal = false;
  // Normal depth within 1 % of critical: the varied-flow equation is 0/0 there, so no S2 curve is
  // marched from the inlet and uniform flow closes a profile that reaches critical depth.
  bool near_critical_slope = false;
  double area_full = 0.0, sf_full = 0.0;
  double step_tolerance = 1e-4, max_dy = 0.0, closure = 1e-10;
  int max_steps = 4000;
  double invert(double x) const { return z_down + slope * x; }
  double crown(double x) const { return invert(x) + rise; }
};

// A computed section. Free surface: hgl = invert + y. Full: y = rise and hgl >= crown.
struct Node {
  double x = 0.0;
  double y = 0.0;
  double hgl = 0.0;
  bool full = false;
};

enum class Side { sub, super };
enum class BranchEnd { reached_end, critical, step_cap, stopped };

// Asked after every accepted section; true ends the march there (used to stop the subcritical
// branch once it is known to lie downstream of the jump).
using StopRule = std::function<bool(const Node&)>;

struct Branch {
  Side side = Side::sub;
  std::vector<Node> nodes;  // in marching order (sub: x rising from the outlet; super: x falling from the inlet)
  BranchEnd end = BranchEnd::reached_end;
  int steps = 0;
  double far_x() const { return nodes.back().x; }
};

Branch march_subcritical(const PreparedReach& r, const Node& start, const StopRule& stop = {});
Branch march_supercritical(const PreparedReach& r, const Node& start);

// Closes a branch that stopped at critical depth with uniform flow at normal depth up to x_end:
// a direct step onto normal depth where the energy equation allows one, then Sf = S0 exactly.
void close_with_uniform_flow(const PreparedReach& r, Branch& b, double x_end);

double velocity_at(const PreparedReach& r, const Node& n);
double total_head(const PreparedReach& r, const Node& n);      // EGL
double specific_force_at(const PreparedReach& r, const Node& n);
double friction_slope_at(const PreparedReach& r, const Node& n);
// The branch's water surface at station x within its extent (a standard step from the nearest
// computed section on the control side).
Node branch_at(const PreparedReach& r, const Branch& b, double x);

}  // namespace rimline::hydraulics::detail
