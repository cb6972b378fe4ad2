// Water-surface profile along one conduit: picks the controls, marches the subcritical branch
// from the outlet and the supercritical branch from an inlet control, and has them joined by a
// hydraulic jump (gvf_join.cpp).
#include "rimline/hydraulics/gvf.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include "hydraulics/gvf_branch.hpp"
#include "hydraulics/gvf_join.hpp"
#include "hydraulics/gvf_summary.hpp"
#include "hydraulics/kernels.hpp"
#include "hydraulics/solve_1d.hpp"
#include "rimline/error.hpp"
#include "rimline/units.hpp"

namespace rimline::hydraulics {

std::string_view regime_name(Regime r) {
  switch (r) {
    case Regime::dry: return "dry";
    case Regime::subcritical: return "subcritical";
    case Regime::supercritical: return "supercritical";
    case Regime::mixed: return "mixed";
    case Regime::pressurized: return "pressurized";
    case Regime::partly_pressurized: return "partly_pressurized";
  }
  return "subcritical";
}

std::string_view governs_name(Governs g) {
  switch (g) {
    case Governs::outlet_water_level: return "outlet_water_level";
    case Governs::critical_depth_outlet: return "critical_depth_outlet";
    case Governs::normal_depth: return "normal_depth";
    case Governs::inlet_control: return "inlet_control";
    case Governs::surcharge: return "surcharge";
    case Governs::still_water: return "still_water";
  }
  return "outlet_water_level";
}

namespace {
using detail::Branch;
using detail::Node;
using detail::PreparedReach;

void require_finite(double v, const char* what) {
  if (!std::isfinite(v)) throw Error(ErrorKind::bad_argument, std::string(what) + " must be finite, got " + std::to_string(v));
}

PreparedReach prepare(const ConduitReach& reach, const GvfOptions& opt) {
  validate(reach.section);
  validate(reach.roughness);
  require_finite(reach.length_m, "conduit length");
  if (reach.length_m <= 0.0)
    throw Error(ErrorKind::bad_argument, "conduit length must be positive, got " + std::to_string(reach.length_m) + " m");
  require_finite(reach.invert_up_m, "upstream invert");
  require_finite(reach.invert_down_m, "downstream invert");
  require_finite(reach.flow_m3_s, "flow");
  if (reach.flow_m3_s < 0.0)
    throw Error(ErrorKind::bad_argument, "flow must not be negative (flows are positive downstream), got " + std::to_string(reach.flow_m3_s));
  if (!(opt.depth_tolerance_m > 0.0) || !(opt.max_depth_change_m >= 0.0) || opt.max_steps < 2)
    throw Error(ErrorKind::bad_argument, "profile options: depth tolerance must be > 0, max depth change >= 0, max steps >= 2");
  PreparedReach r;
  r.section = reach.section;
  r.roughness = reach.roughness;
  r.length = reach.length_m;
  r.z_down = reach.invert_down_m;
  r.slope = (reach.invert_up_m - reach.invert_down_m) / reach.length_m;
  r.flow = reach.flow_m3_s;
  r.rise = rise_m(reach.section);
  r.area_full = full_geometry(reach.section).area_m2;
  r.step_tolerance = opt.depth_tolerance_m;
  r.max_dy = opt.max_depth_change_m > 0.0 ? opt.max_depth_change_m : 0.02 * r.rise;
  r.max_steps = opt.max_steps;
  return r;
}

ConduitProfile still_water(const PreparedReach& r, double level) {
  // No flow: a level pool. Water cannot stand below the outlet invert's sill, so an adverse
  // conduit keeps a pool at the outlet invert in its low end (dead storage).
  const double pool = std::max(level, r.z_down);
  std::vector<Node> nodes;
  auto at = [&](double x) {
    const double depth = pool - r.invert(x);
    if (depth <= 0.0) return Node{x, 0.0, r.invert(x), false};
    return Node{x, std::min(depth, r.rise), pool, depth >= r.rise};
  };
  nodes.push_back(at(0.0));
  if (r.slope != 0.0) {
    for (double depth : {r.rise, 0.0}) {  // where the pool meets the crown and the invert
      const double x = (pool - depth - r.z_down) / r.slope;
      if (x > 0.0 && x < r.length) nodes.push_back(at(x));
    }
  }
  nodes.push_back(at(r.length));
  std::sort(nodes.begin(), nodes.end(), [](const Node& a, const Node& b) { return a.x < b.x; });
  ConduitProfile p = detail::summarise_still(r, nodes);
  return p;
}

// The outlet's condition, from the water level it discharges into or from the energy level it must
// have: the depth of the water surface above the outlet invert (below critical depth: a free outlet),
// and the HGL when the outlet runs full.
struct Outlet {
  double depth = 0.0;
  bool free = false;
  double full_hgl = 0.0;
};

Outlet outlet_from_level(const PreparedReach& r, double level) {
  const double depth = level - r.z_down;
  return {depth, depth < r.yc, level};
}

// Energy control: the outlet's EGL is given (the structure loss is the whole loss across the
// structure). The depth is the subcritical root of y + V(y)^2/2g = E - z; above the full-pipe
// energy the outlet runs full with HGL = E - V_full^2/2g; below the critical energy no subcritical
// depth carries the flow there, and critical depth governs (the pipe falls freely into the structure).
Outlet outlet_from_energy(const PreparedReach& r, bool critical_below_rise, double energy) {
  constexpr double g = units::gravity_m_s2;
  const double v_full = r.flow / r.area_full;
  const double e = energy - r.z_down;
  const double e_full = r.rise + v_full * v_full / (2.0 * g);
  if (e >= e_full) return {e - v_full * v_full / (2.0 * g), false, energy - v_full * v_full / (2.0 * g)};
  const Outlet free{-1.0, true, r.crown(0.0)};
  if (!critical_below_rise) return free;  // no free surface at critical depth: full at the crown, free
  auto excess = [&](double y) {
    const double v = r.flow / detail::free_surface_geometry(r.section, y).area_m2;
    return y + v * v / (2.0 * g) - e;
  };
  const double f_lo = excess(r.yc);
  if (f_lo > 0.0) return free;
  const double f_hi = e_full - e;  // the specific energy at the soffit, full area
  const auto root = detail::brent_root(excess, r.yc, r.rise, f_lo, f_hi, r.closure * r.rise, 200);
  return {root.x, false, r.z_down + root.x};
}

ConduitProfile profile_from(PreparedReach& r, const GvfOptions& options, double control_level, bool energy_control);

}  // namespace

ConduitProfile compute_profile(const ConduitReach& reach, double downstream_level_m, const GvfOptions& options) {
  PreparedReach r = prepare(reach, options);
  require_finite(downstream_level_m, "downstream water level");
  return profile_from(r, options, downstream_level_m, false);
}

ConduitProfile compute_profile_to_energy(const ConduitReach& reach, double downstream_energy_m, const GvfOptions& options) {
  PreparedReach r = prepare(reach, options);
  require_finite(downstream_energy_m, "downstream energy level");
  return profile_from(r, options, downstream_energy_m, true);
}

namespace {

ConduitProfile profile_from(PreparedReach& r, const GvfOptions& options, double control_level, bool energy_control) {
  if (r.flow == 0.0) return still_water(r, control_level);  // still water: energy and water level agree

  const DepthSolve yc = critical_depth(r.section, r.flow);
  r.yc = yc.exists ? yc.depth_m : r.rise;
  r.sf_full = detail::friction_slope_of(r.roughness, r.flow, r.area_full, full_geometry(r.section).hydraulic_radius_m);
  double q_full = 0.0;
  if (r.slope > 0.0) {
    q_full = full_capacity_m3_s(r.roughness, r.section, r.slope);
    const DepthSolve yn = normal_depth(r.roughness, r.section, r.flow, r.slope);
    r.has_normal = yn.exists;
    r.yn = yn.depth_m;
    r.near_critical_slope = yn.exists && yc.exists && std::fabs(r.yn - r.yc) <= 0.01 * r.yc;
  }
  const Outlet outlet = energy_control ? outlet_from_energy(r, yc.exists, control_level) : outlet_from_level(r, control_level);
  const double outlet_depth = outlet.depth;
  const bool free_outlet = outlet.free;
  std::string note;

  // Controls. Above full capacity no free surface can carry the flow: the conduit runs full from
  // the outlet crown or the tailwater, whichever is higher. With critical depth above the rise no
  // subcritical free surface exists: the outlet runs full, and a steep conduit runs supercritical
  // from a soffit-high inlet (the supercritical branch below starts at r.yc = rise).
  Node start;
  const bool over_capacity = r.slope > 0.0 && r.flow > q_full;
  if (over_capacity || outlet_depth >= r.rise || !yc.exists) {
    start = {0.0, r.rise, std::max(outlet.full_hgl, r.crown(0.0)), true};
  } else {
    const double y0 = std::max(outlet_depth, r.yc);
    start = {0.0, y0, r.invert(0.0) + y0, false};
  }
  // The supercritical branch first: once the subcritical one falls below its specific force,
  // the jump lies downstream and the subcritical march can stop.
  Branch sup;
  bool has_sup = false;
  if (!over_capacity) {
    const double given = options.inlet_supercritical_depth_m;
    const double band = r.near_critical_slope ? 0.01 * r.yc : 0.0;
    if (std::isfinite(given) && given > 0.0 && given < r.yc - band) {
      sup = detail::march_supercritical(r, {r.length, given, r.invert(r.length) + given, false});
      has_sup = true;
    } else if (r.has_normal && r.yn < r.yc && r.near_critical_slope) {
      // Barely steep: the S2 drop from critical to normal depth is within 1 % of the depth and
      // ill-conditioned to march; the supercritical branch is uniform flow at normal depth.
      sup.side = detail::Side::super;
      sup.nodes = {{r.length, r.yn, r.invert(r.length) + r.yn, false}, {0.0, r.yn, r.invert(0.0) + r.yn, false}};
      has_sup = true;
      note = "near-critical slope: the supercritical reach is taken at normal depth";
    } else if (r.has_normal && r.yn < r.yc) {  // steep: critical depth at the inlet
      sup = detail::march_supercritical(r, {r.length, r.yc, r.invert(r.length) + r.yc, false});
      has_sup = true;
    }
  }
  if (has_sup && sup.end == detail::BranchEnd::critical && r.near_critical_slope) {
    // An S3/M3 curve met critical depth on its way to a normal depth barely off it: uniform flow
    // is taken from there to the outlet.
    note = "near-critical slope: uniform flow assumed downstream of station " + std::to_string(sup.far_x()) + " m";
    detail::close_with_uniform_flow(r, sup, 0.0);
  }
  detail::StopRule below_super;
  if (has_sup) {
    const double sup_bottom = sup.end == detail::BranchEnd::reached_end ? 0.0 : sup.far_x();
    below_super = [&r, &sup, sup_bottom](const Node& n) {
      return n.x > sup_bottom && n.x < r.length && detail::specific_force_at(r, n) < detail::specific_force_at(r, detail::interpolated(sup, n.x));
    };
  }
  Branch sub = over_capacity ? Branch{} : detail::march_subcritical(r, start, below_super);
  if (sub.end == detail::BranchEnd::critical && r.has_normal && r.yn >= r.yc && !has_sup) {
    // Likewise an M1/C1 curve that met critical depth on its way to a normal depth barely above it.
    note = "near-critical slope: uniform flow assumed upstream of station " + std::to_string(sub.far_x()) + " m";
    detail::close_with_uniform_flow(r, sub, r.length);
  }
  if (over_capacity) {
    sub.nodes = {start, {r.length, r.rise, start.hgl + r.sf_full * r.length, true}};
    note = "flow exceeds the full-flow capacity at this slope: the conduit runs surcharged";
  }

  const detail::Joined joined = detail::join(r, sub, has_sup ? &sup : nullptr);
  ConduitProfile p = detail::summarise(r, joined.nodes, joined.has_super ? joined.super_from : joined.nodes.size(), free_outlet);
  p.free_outlet = free_outlet;
  p.jump_station_m = joined.jump_x;
  p.jump_loss_m = joined.jump_loss;
  p.steps = sub.steps + (has_sup ? sup.steps : 0);
  p.normal_depth_m = r.has_normal ? r.yn : std::nan("");
  p.critical_depth_m = r.yc;
  const bool capped = sub.end == detail::BranchEnd::step_cap || (joined.has_super && sup.end == detail::BranchEnd::step_cap);
  if (capped) {
    p.converged = false;
    note = "the step method hit its step cap of " + std::to_string(r.max_steps) + " steps";
  } else if (!joined.ok) {
    p.converged = false;
    note = "neither the outlet nor an inlet control spans the conduit; the profile stops at critical depth";
  }
  if (note.empty()) note = joined.note;
  if (p.points.size() < 2) {  // a degenerate march: keep the two ends
    p.converged = false;
    note = "the profile could not be marched; ends only";
  }
  p.note = note;
  return p;
}

}  // namespace

}  // namespace rimline::hydraulics
