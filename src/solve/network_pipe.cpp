#include "solve/network_pipe.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "hydraulics/solve_1d.hpp"
#include "rimline/hydraulics/losses.hpp"
#include "rimline/solve/structure_level.hpp"

namespace rimline::solve::detail {
namespace {
constexpr double nan = std::numeric_limits<double>::quiet_NaN();
// A step in the needed level is seen by Newton as a ramp over this share of the flow.
constexpr double jump_ramp = 0.01;
}

StructureRelation::StructureRelation(const model::Network& network, const MarchOptions& options,
                                     const std::vector<bool>& outlet)
    : net_(network), opt_(options), outlet_(outlet) {
  if (opt_.loss_method != hydraulics::StructureLossMethod::constant_k) inflows_.resize(net_.structures.size());
}

void StructureRelation::set_inflows(const std::vector<std::size_t>& structures, const std::vector<std::size_t>& conduits,
                                    const std::vector<double>& signed_flow_m3_s,
                                    const std::vector<double>& deflection_deg) {
  if (inflows_.empty()) return;  // constant K: the loss depends on the outflow alone
  for (std::size_t s : structures) inflows_[s].clear();
  for (std::size_t ci : conduits) {
    const double q = ci < signed_flow_m3_s.size() ? signed_flow_m3_s[ci] : nan;
    if (!std::isfinite(q) || q == 0.0) continue;
    const auto& c = net_.conduits[ci];
    const std::size_t into = q > 0.0 ? c.to : c.from;
    const auto& st = net_.structures[into];
    // Against the digitised direction the arrival angle is not the one topology measured: straight.
    const double d = q > 0.0 && ci < deflection_deg.size() ? deflection_deg[ci] : 0.0;
    inflows_[into].push_back(structure_inflow(c, std::fabs(q), d, st.invert_m.value_or(c.invert_down_m.value_or(0.0))));
  }
}

double StructureRelation::loss_m(std::size_t s, std::size_t outflow, double flow_m3_s,
                                 const hydraulics::ProfilePoint& inlet) const {
  if (!(inlet.velocity_m_s > 0.0)) return 0.0;
  if (inflows_.empty())  // the same product as hydraulics::structure_loss's constant K
    return structure_k(net_.structures[s], opt_) * hydraulics::velocity_head_m(inlet.velocity_m_s);
  const auto in = structure_loss_inputs(net_, opt_, s, outflow, flow_m3_s, inlet, inflows_[s]);
  return structure_loss_for(opt_, in, nullptr).loss_m;
}

bool StructureRelation::outlet_energy_control(std::size_t s) const {
  if (s < outlet_.size() && outlet_[s]) return false;
  return structure_energy_at(opt_, s) == hydraulics::StructureEnergy::whole_loss;
}

double threshold_level(const PipeLaw& pipe, bool /*forward: still water stands level either way*/, double h_down) {
  return std::max({h_down, pipe.invert_a_m, pipe.invert_b_m});
}

Required required_level(const model::Network& network, const PipeLaw& pipe, bool forward, double q, double h_down,
                        const StructureRelation& loss, const hydraulics::GvfOptions& gvf) {
  const auto& c = network.conduits[pipe.conduit];
  const double z_up = forward ? pipe.invert_a_m : pipe.invert_b_m;
  const double z_down = forward ? pipe.invert_b_m : pipe.invert_a_m;
  const hydraulics::ConduitReach reach{c.section, c.roughness, c.length_m, z_up, z_down, q};
  const auto profile = loss.outlet_energy_control(forward ? pipe.b : pipe.a)
                           ? hydraulics::compute_profile_to_energy(reach, h_down, gvf)
                           : hydraulics::compute_profile(reach, downstream_level_of_inflow(h_down), gvf);
  hydraulics::StructureLoss l;
  l.loss_m = loss.loss_m(forward ? pipe.a : pipe.b, pipe.conduit, q, profile.inlet());
  Required r;
  r.level_m = structure_level_for_outflow(profile.inlet(), l);
  r.free_outlet = profile.free_outlet;
  r.outlet_control_m = z_down + profile.critical_depth_m;
  return r;
}

PipeFlow pipe_flow(const model::Network& network, const PipeLaw& pipe, double h_a, double h_b, double q_guess,
                   const StructureRelation& loss, const hydraulics::GvfOptions& gvf, const PipeFlowSettings& set,
                   bool derivatives) {
  PipeFlow out;
  const bool forward = h_a >= h_b;
  const double h_up = forward ? h_a : h_b;
  const double h_down = forward ? h_b : h_a;
  const double e0 = threshold_level(pipe, forward, h_down);
  const double c = pipe.resistance_s2_m5;
  const double sign = forward ? 1.0 : -1.0;
  if (h_up <= e0) {
    // No flow: the water at the higher end stands below an invert. The derivative is not zero but
    // a thousandth of what a flowing pipe has at 1 cm of excess head, fading as the level falls
    // below the threshold: enough to keep the matrix regular and to move a structure whose pipes
    // all stand dry towards flowing, too little to slow Newton where a dry pipe stays dry.
    out.dead = true;
    const double d1 = 0.01;
    const double g = 1.0e-3 * d1 / (2.0 * std::sqrt(c * d1) * (d1 + (e0 - h_up)));
    out.dq_da = out.chord_da = g;
    out.dq_db = out.chord_db = -g;
    return out;
  }
  auto level_at = [&](double q) {
    ++out.evaluations;
    return required_level(network, pipe, forward, q, h_down, loss, gvf);
  };
  // Bracket [q_lo, q_hi] with G(q_lo) < h_up <= G(q_hi); g = G - h_up (true values kept for the slope).
  double q_lo = 0.0, g_lo = e0 - h_up, q_hi = nan, g_hi = nan;
  double q = (q_guess != 0.0 && (q_guess > 0.0) == forward) ? std::fabs(q_guess) : std::sqrt((h_up - e0) / c);
  Required at_root;
  double q_root = nan;
  double jump_m = 0.0;  // the step in the needed level at the flow found (see below)
  for (;;) {
    const Required r = level_at(q);
    const double g = r.level_m - h_up;
    if (std::fabs(g) <= set.level_tolerance_m) {
      q_root = q, at_root = r;
      break;
    }
    if (g > 0.0) {
      q_hi = q, g_hi = g;
      break;
    }
    q_lo = q, g_lo = g;
    // G - G(0) grows about as Q^2: aim just past the root that model gives.
    const double model = q * std::sqrt((h_up - e0) / std::max(r.level_m - e0, 1e-12));
    q = std::clamp(1.1 * model, 1.2 * q, 100.0 * q);
    if (q > 1.0e6 || out.evaluations >= set.max_evaluations) {
      out.converged = false;
      q_root = q_lo, at_root = r;
      break;
    }
  }
  // Regula falsi in w = Q^2 with the Illinois modification (the end kept twice in a row has its
  // value halved), so the bracket closes from both sides.
  double f_lo = g_lo, f_hi = g_hi;  // the modified values
  int kept = 0;                     // -1: lo kept last time, +1: hi kept
  while (std::isnan(q_root)) {
    if (out.evaluations >= set.max_evaluations || q_hi - q_lo <= 1e-12 * q_hi) {
      out.converged = out.evaluations < set.max_evaluations;
      if (out.converged && q_lo > 0.0 && -g_lo > 10.0 * set.level_tolerance_m && g_hi > 10.0 * set.level_tolerance_m) {
        // The level needed jumps at this flow: the march runs a pipe over its full-flow capacity
        // surcharged from the outlet crown, a step above the part-full profile just below it.
        // Every upstream level inside the step passes that flow; Newton sees the step as a ramp.
        jump_m = g_hi - g_lo;
        q_root = q_lo + (q_hi - q_lo) * (-g_lo) / (g_hi - g_lo);
        at_root = level_at(q_lo);
        break;
      }
      const bool hi_closer = std::fabs(g_hi) < std::fabs(g_lo) || q_lo == 0.0;
      q_root = hi_closer ? q_hi : q_lo;
      at_root = level_at(q_root);
      break;
    }
    const double w_lo = q_lo * q_lo, w_hi = q_hi * q_hi;
    double w = w_lo - f_lo * (w_hi - w_lo) / (f_hi - f_lo);
    if (!(w > w_lo && w < w_hi)) w = 0.5 * (w_lo + w_hi);
    q = std::sqrt(w);
    const Required r = level_at(q);
    const double g = r.level_m - h_up;
    if (std::fabs(g) <= set.level_tolerance_m) {
      q_root = q, at_root = r;
      break;
    }
    if (g < 0.0) {
      q_lo = q, g_lo = g, f_lo = g;
      if (kept == +1) f_hi *= 0.5;
      kept = +1;
    } else {
      q_hi = q, g_hi = g, f_hi = g;
      if (kept == -1) f_lo *= 0.5;
      kept = -1;
    }
  }
  out.q = sign * q_root;
  if (at_root.free_outlet) out.free_outlet_until_m = at_root.outlet_control_m;
  if (!derivatives) return out;
  // dG/dQ: the bracket's secant where it is neither too wide nor too narrow to trust, else a step.
  double g_q = nan;
  if (jump_m > 0.0)
    g_q = jump_m / (jump_ramp * q_root);
  else if (q_lo > 0.0 && std::isfinite(q_hi) && q_hi / q_lo - 1.0 >= 1e-4 && q_hi / q_lo - 1.0 <= 0.2)
    g_q = (g_hi - g_lo) / (q_hi - q_lo);
  else
    g_q = (level_at(1.01 * q_root).level_m - at_root.level_m) / (0.01 * q_root);
  // dG/dh_down: none while the outlet still falls freely a step higher, else a step.
  double g_h = 0.0;
  if (!(at_root.free_outlet && h_down + set.derivative_step_m < at_root.outlet_control_m)) {
    ++out.evaluations;
    g_h = (required_level(network, pipe, forward, q_root, h_down + set.derivative_step_m, loss, gvf).level_m -
           at_root.level_m) /
          set.derivative_step_m;
    g_h = std::clamp(g_h, 0.0, 1.5);
  }
  // Near no flow dQ/dH grows without bound (G - G(0) ~ Q^2): capped at its value for a small head.
  const double c_w = std::max(at_root.level_m - e0, 1e-12) / (q_root * q_root);
  g_q = std::max(g_q, 2.0 * std::sqrt(c_w * set.regularise_head_m));
  const double d_up = 1.0 / g_q, d_down = -g_h / g_q;
  out.dq_da = forward ? d_up : -d_down;
  out.dq_db = forward ? d_down : -d_up;
  const double c_up = std::max(d_up, q_root / std::max(h_up - e0, 1e-9)), c_down = -g_h * c_up;
  out.chord_da = forward ? c_up : -c_down;
  out.chord_db = forward ? c_down : -c_up;
  return out;
}

double downstream_level(const model::Network& network, const PipeLaw& pipe, bool forward, double q, double h_up,
                        const StructureRelation& loss, const hydraulics::GvfOptions& gvf) {
  const double z_down = forward ? pipe.invert_b_m : pipe.invert_a_m;
  const Required free = required_level(network, pipe, forward, q, z_down - 1.0, loss, gvf);
  if (free.level_m >= h_up) return free.outlet_control_m;  // it cannot pass q even falling freely
  auto f = [&](double h) { return required_level(network, pipe, forward, q, h, loss, gvf).level_m - h_up; };
  const double lo = free.outlet_control_m, hi = h_up;
  const double f_lo = f(lo), f_hi = f(hi);
  if (f_lo >= 0.0) return lo;
  const auto root = hydraulics::detail::brent_root(f, lo, hi, f_lo, f_hi, 1e-6, 100);
  return root.x;
}

}  // namespace rimline::solve::detail
