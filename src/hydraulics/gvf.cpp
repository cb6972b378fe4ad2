// Water-surface profile along one conduit: picks the controls, marches the subcritical branch
// from the outlet and the supercritical branch from an inlet control, and joins them by a
// hydraulic jump where their specific forces are equal (momentum balance, Chow 1959 ch. 15).
#include "rimline/hydraulics/gvf.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include "hydraulics/gvf_branch.hpp"
#include "hydraulics/gvf_summary.hpp"
#include "hydraulics/kernels.hpp"
#include "hydraulics/solve_1d.hpp"
#include "rimline/error.hpp"

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

// Joins the subcritical branch (from the outlet) and the supercritical branch (from the inlet).
struct Joined {
  std::vector<Node> nodes;  // ascending station
  std::optional<double> jump_x;
  double jump_loss = 0.0;
  std::size_t super_from = 0;  // index of the first node belonging to the supercritical branch
  bool has_super = false;
  bool ok = true;
  std::string note;
};

double force_gap(const PreparedReach& r, const Branch& sub, const Branch& sup, double x) {
  return detail::specific_force_at(r, detail::branch_at(r, sub, x)) - detail::specific_force_at(r, detail::branch_at(r, sup, x));
}

// The branch's surface at x by linear interpolation between its computed sections: cheap, and
// good enough to bracket the jump before the exact refinement.
Node interpolated(const Branch& b, double x) {
  const auto& n = b.nodes;
  for (std::size_t i = 0; i + 1 < n.size(); ++i) {
    const double x0 = n[i].x, x1 = n[i + 1].x;
    if ((x - x0) * (x - x1) <= 0.0 && x0 != x1) {
      const double w = (x - x0) / (x1 - x0);
      return {x, n[i].y + w * (n[i + 1].y - n[i].y), n[i].hgl + w * (n[i + 1].hgl - n[i].hgl), n[i].full && n[i + 1].full};
    }
  }
  const Node& last = std::fabs(n.front().x - x) < std::fabs(n.back().x - x) ? n.front() : n.back();
  return {x, last.y, last.hgl, last.full};
}

double rough_gap(const PreparedReach& r, const Branch& sub, const Branch& sup, double x) {
  return detail::specific_force_at(r, interpolated(sub, x)) - detail::specific_force_at(r, interpolated(sup, x));
}

Joined join(const PreparedReach& r, const Branch& sub, const Branch* sup) {
  Joined j;
  const double sub_top = sub.end == detail::BranchEnd::reached_end ? r.length : sub.far_x();
  auto take_sub_below = [&](double x_limit) {
    for (const Node& n : sub.nodes)
      if (n.x < x_limit) j.nodes.push_back(n);
  };
  auto take_super_above = [&](double x_limit) {
    j.super_from = j.nodes.size();
    j.has_super = true;
    for (auto it = sup->nodes.rbegin(); it != sup->nodes.rend(); ++it)
      if (it->x > x_limit) j.nodes.push_back(*it);
  };
  if (!sup) {
    j.nodes = sub.nodes;
    j.ok = sub.end == detail::BranchEnd::reached_end;
    return j;
  }
  const double sup_bottom = sup->end == detail::BranchEnd::reached_end ? 0.0 : sup->far_x();
  const double hi = std::min(r.length, sub_top), lo = std::max(0.0, sup_bottom);
  if (sub.nodes.size() < 2 || hi <= lo) {
    // No overlap: the supercritical flow leaves the conduit (tailwater too low to hold a jump).
    if (lo <= 0.0) {
      take_super_above(-1.0);
      return j;
    }
    j.nodes = sub.nodes;  // neither branch spans the conduit: keep what the outlet control gives
    j.ok = false;
    return j;
  }
  // Scan from upstream: the jump stands at the first station where the downstream (subcritical)
  // specific force reaches the supercritical one.
  std::vector<double> stations{hi};
  for (const Node& n : sub.nodes)
    if (n.x > lo && n.x < hi) stations.push_back(n.x);
  for (const Node& n : sup->nodes)
    if (n.x > lo && n.x < hi) stations.push_back(n.x);
  stations.push_back(lo);
  std::sort(stations.begin(), stations.end(), std::greater<>());
  const double gap_hi = force_gap(r, sub, *sup, hi);
  if (gap_hi >= 0.0 && hi >= r.length) {  // jump drowned at the inlet: subcritical throughout
    j.nodes = sub.nodes;
    return j;
  }
  std::optional<double> jump;
  if (gap_hi >= 0.0) jump = hi;
  double prev_x = hi, prev_gap = gap_hi;
  for (std::size_t k = 1; k < stations.size() && !jump; ++k) {
    const double x = stations[k];
    if (x >= prev_x) continue;
    const double gap = rough_gap(r, sub, *sup, x);
    if (gap >= 0.0) {
      // Refine on the exact surfaces; widen to the neighbouring stations if interpolation moved the sign.
      auto f = [&](double s) { return force_gap(r, sub, *sup, s); };
      double a = x, b = prev_x, fa = f(a), fb = b == hi ? gap_hi : f(b);
      if (fa < 0.0 && k + 1 < stations.size()) {
        a = stations[k + 1];
        fa = f(a);
      }
      if (fb >= 0.0 && k >= 2) {
        b = stations[k - 2];
        fb = f(b);
      }
      if (fa >= 0.0 && fb < 0.0) {
        jump = detail::brent_root(f, a, b, fa, fb, 1e-6 * r.length, 100).x;
      } else {
        jump = x + (prev_x - x) * gap / (gap - prev_gap);  // linear estimate between the stations
      }
    }
    prev_x = x;
    prev_gap = gap;
  }
  if (!jump) {  // supercritical to the outlet: any jump forms beyond the conduit
    take_super_above(-1.0);
    return j;
  }
  const Node sub_at = detail::branch_at(r, sub, *jump);
  Node sup_at = detail::branch_at(r, *sup, *jump);
  take_sub_below(*jump);
  j.nodes.push_back(sub_at);
  j.super_from = j.nodes.size();
  j.has_super = true;
  // A jump loses energy. Conjugate depths within a hair of critical can put the supercritical
  // side's energy below the subcritical one's by round-off (third order in the distance from
  // critical); the supercritical depth is then taken where the two energies are equal.
  const double head_sub = detail::total_head(r, sub_at);
  if (detail::total_head(r, sup_at) < head_sub && !sub_at.full) {
    const double spec = head_sub - r.invert(*jump);
    auto excess = [&](double y) { return specific_energy_m(r.section, r.flow, y) - spec; };
    const double lo_y = 1e-9 * r.rise;
    sup_at.y = detail::brent_root(excess, lo_y, r.yc, excess(lo_y), excess(r.yc), r.closure * r.yc, 200).x;
    sup_at.hgl = r.invert(*jump) + sup_at.y;
  }
  // Should that still fail, supercritical sections are dropped until the energy line rises
  // again, so the EGL never climbs in the flow direction.
  std::vector<Node> upstream{sup_at};
  for (auto it = sup->nodes.rbegin(); it != sup->nodes.rend(); ++it)
    if (it->x > *jump) upstream.push_back(*it);
  std::size_t first = 0;
  while (first < upstream.size() && detail::total_head(r, upstream[first]) < head_sub) ++first;
  j.nodes.insert(j.nodes.end(), upstream.begin() + static_cast<std::ptrdiff_t>(first), upstream.end());
  j.jump_x = *jump;
  if (first == 0) j.jump_loss = std::max(0.0, detail::total_head(r, sup_at) - head_sub);
  return j;
}
}  // namespace

ConduitProfile compute_profile(const ConduitReach& reach, double downstream_level_m, const GvfOptions& options) {
  PreparedReach r = prepare(reach, options);
  require_finite(downstream_level_m, "downstream water level");
  if (r.flow == 0.0) return still_water(r, downstream_level_m);

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
  const double outlet_depth = downstream_level_m - r.z_down;
  const bool free_outlet = outlet_depth < r.yc;
  std::string note;

  // Controls. Above full capacity no free surface can carry the flow: the conduit runs full from
  // the outlet crown or the tailwater, whichever is higher. With critical depth above the rise no
  // subcritical free surface exists: the outlet runs full, and a steep conduit runs supercritical
  // from a soffit-high inlet (the supercritical branch below starts at r.yc = rise).
  Node start;
  const bool over_capacity = r.slope > 0.0 && r.flow > q_full;
  if (over_capacity || outlet_depth >= r.rise || !yc.exists) {
    start = {0.0, r.rise, std::max(downstream_level_m, r.crown(0.0)), true};
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
  detail::StopRule below_super;
  if (has_sup) {
    const double sup_bottom = sup.end == detail::BranchEnd::reached_end ? 0.0 : sup.far_x();
    below_super = [&](const Node& n) {
      return n.x > sup_bottom && n.x < r.length && detail::specific_force_at(r, n) < detail::specific_force_at(r, interpolated(sup, n.x));
    };
  }
  if (has_sup && sup.end == detail::BranchEnd::critical && r.near_critical_slope) {
    // An S3/M3 curve met critical depth on its way to a normal depth barely off it: uniform flow
    // is taken from there to the outlet.
    note = "near-critical slope: uniform flow assumed downstream of station " + std::to_string(sup.far_x()) + " m";
    detail::close_with_uniform_flow(r, sup, 0.0);
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

  const Joined joined = join(r, sub, has_sup ? &sup : nullptr);
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

}  // namespace rimline::hydraulics
