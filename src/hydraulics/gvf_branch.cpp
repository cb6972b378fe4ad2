// Standard step method (Chow 1959, Open-Channel Hydraulics, sec. 10-3): between stations x0 and
// x1 the energy equation
//     z1 + E(y1) = z0 + E(y0) + (x1 - x0) (Sf0 + Sf1) / 2        (x increasing upstream)
// is solved for y1 on the branch's side of critical depth. The step length is adapted so that
// the local error estimated by Milne's device (the trapezoidal energy balance against an
// Adams-Bashforth predictor of H' = Sf: error ~ |H_corrected - H_predicted| / 6, divided by
// dE/dy = 1 - Fr^2 to become a depth) stays below the tolerance, and the depth change per step
// below max_dy. Where the surface reaches the crown or critical depth, a direct
// step (solve the same equation for the distance) places the point exactly.
#include "hydraulics/gvf_branch.hpp"

#include <algorithm>
#include <cmath>

#include "hydraulics/kernels.hpp"
#include "hydraulics/solve_1d.hpp"
#include "rimline/units.hpp"

namespace rimline::hydraulics::detail {

namespace {
constexpr double g = units::gravity_m_s2;

struct State {
  double y = 0.0, area = 0.0, sf = 0.0, e = 0.0, fr2 = 0.0;
};

State free_state(const PreparedReach& r, double y) {
  const Geometry geo = free_surface_geometry(r.section, y);
  State s;
  s.y = y;
  s.area = geo.area_m2;
  s.sf = friction_slope_of(r.roughness, r.flow, geo.area_m2, geo.hydraulic_radius_m);
  const double v = r.flow / geo.area_m2;
  s.e = y + v * v / (2.0 * g);
  s.fr2 = geo.top_width_m > 0.0 ? r.flow * r.flow * geo.top_width_m / (g * geo.area_m2 * geo.area_m2 * geo.area_m2) : 0.0;
  return s;
}

// dy/dx with x increasing upstream: -(S0 - Sf) / (1 - Fr^2).
double depth_slope(const PreparedReach& r, const State& s) { return (s.sf - r.slope) / (1.0 - s.fr2); }

enum class StepOutcome { ok, crown, critical };
struct StepResult {
  StepOutcome outcome = StepOutcome::ok;
  State state;
};

StepResult standard_step(const PreparedReach& r, double x0, double head0, double sf0, double x1, Side side,
                         double guess = -1.0, double width = 0.0) {
  const double dx = x1 - x0, z1 = r.invert(x1);
  // The state of the last depth tried is kept: the converged depth is the last one tried, and
  // its state is the step's result (one geometry and friction evaluation fewer per step).
  State last;
  last.y = -1.0;
  auto residual = [&](double y) {
    last = free_state(r, y);
    return z1 + last.e - head0 - 0.5 * dx * (sf0 + last.sf);
  };
  auto state_at = [&](double y) { return y == last.y ? last : free_state(r, y); };
  // Closure relative to the depth: in very shallow, fast flow E changes by 2E/y per metre of depth.
  const double tol = r.closure * std::clamp(guess > 0.0 ? guess : r.yc, 1e-6 * r.rise, r.rise);
  // Residual rises with y on the subcritical limb (dE/dy = 1 - Fr^2 > 0, Sf falls with y) and
  // falls with y on the supercritical limb.
  const double lo_limit = side == Side::sub ? r.yc : 1e-9 * r.rise, hi_limit = side == Side::sub ? r.rise : r.yc;
  if (guess > lo_limit && guess < hi_limit) {
    // Secant iteration from the predictor: the root is unique on this limb, so a converged
    // iterate inside the limb is the answer; anything else falls back to the bracketing solve.
    double ya = guess, fa = residual(ya);
    double yb = std::clamp(guess + 1e-3 * width, lo_limit, hi_limit), fb = residual(yb);
    for (int i = 0; i < 8 && fb != fa; ++i) {
      const double y_next = yb - fb * (yb - ya) / (fb - fa);
      if (!(y_next > lo_limit && y_next < hi_limit)) break;
      ya = yb;
      fa = fb;
      yb = y_next;
      fb = residual(yb);
      if (std::fabs(yb - ya) <= tol) return {StepOutcome::ok, state_at(yb)};
    }
  }
  if (side == Side::sub) {
    const double f_lo = residual(r.yc);
    if (f_lo > 0.0) return {StepOutcome::critical, {}};
    const double f_hi = residual(r.rise);
    if (f_hi < 0.0) return {StepOutcome::crown, {}};
    return {StepOutcome::ok, state_at(brent_root(residual, r.yc, r.rise, f_lo, f_hi, tol, 200).x)};
  }
  const double f_hi = residual(r.yc);
  if (f_hi > 0.0) return {StepOutcome::critical, {}};
  return {StepOutcome::ok, state_at(brent_root(residual, lo_limit, r.yc, residual(lo_limit), f_hi, tol, 200).x)};
}

// Direct step: the signed distance from (x0, state0) to where the depth is y_target.
double direct_step(const PreparedReach& r, double x0, double head0, double sf0, double y_target) {
  const State t = free_state(r, y_target);
  const double spec0 = head0 - r.invert(x0);
  const double denom = 0.5 * (sf0 + t.sf) - r.slope;
  return denom == 0.0 ? 0.0 : (t.e - spec0) / denom;
}

// Marches a free surface from `start` towards x_end (dir = +1 upstream, -1 downstream), appending
// accepted nodes to b. Returns how the march ended: at x_end, at the crown (sub side only; the
// last node sits at the soffit), at critical depth, at the step cap, or stopped by the rule.
enum class FreeEnd { end, crown, critical, cap, stopped };

FreeEnd march_free(const PreparedReach& r, Branch& b, const Node& start, double x_end, int dir, const StopRule& stop) {
  const double dir_d = static_cast<double>(dir);
  double x = start.x;
  State s0 = free_state(r, start.y);
  double head0 = r.invert(x) + s0.e;
  bool have_prev = false;
  double f_prev = 0.0, sf_prev = 0.0, dx_prev = 0.0;
  const double min_step = 1e-7 * r.length;
  // Critical depth at or above the rise: no subcritical free surface exists below the crown.
  if (b.side == Side::sub && r.yc >= r.rise && start.y >= r.rise) return FreeEnd::critical;

  // Depth changes per step are capped absolutely (max_dy) and relative to the depth, so that
  // very shallow flows are stepped as finely as deep ones.
  auto dy_cap = [&](double y) { return std::min(r.max_dy, 0.25 * y); };
  // At critical depth dy/dx is infinite: take the first step by depth, not by distance. (Near a
  // circle's crown Fr changes so fast with y that the depth itself is the test.)
  const bool at_critical = std::fabs(start.y - r.yc) <= 1e-9 * r.rise || std::fabs(1.0 - s0.fr2) < 1e-6;
  if (!at_critical && (b.side == Side::sub ? start.y < r.yc : start.y > r.yc)) return FreeEnd::critical;  // wrong limb
  if (at_critical) {
    const double drift = b.side == Side::sub ? s0.sf - r.slope : r.slope - s0.sf;  // > 0: leaves critical on this side
    if (drift <= 0.0) return FreeEnd::critical;
    double delta = 0.25 * dy_cap(r.yc);
    if (r.has_normal) delta = std::min(delta, 0.5 * std::fabs(r.yn - r.yc));
    const double y1 = b.side == Side::sub ? std::min(r.yc + delta, r.rise) : std::max(r.yc - delta, 1e-6 * r.rise);
    const double remaining = std::fabs(x_end - x);
    double dx = direct_step(r, x, head0, s0.sf, y1);
    double y_end = y1;
    if (dx * dir_d > 0.0 && std::fabs(dx) >= remaining) {
      // A conduit shorter than the first depth step: find the depth whose direct-step distance
      // is the remaining length (the distance grows monotonically away from critical depth).
      const double h0 = head0, sf_start = s0.sf, x_start = x;
      auto excess = [&](double y) { return std::fabs(direct_step(r, x_start, h0, sf_start, y)) - remaining; };
      y_end = brent_root(excess, r.yc, y1, -remaining, std::fabs(dx) - remaining, r.closure * r.rise, 200).x;
      dx = dir_d * remaining;
    }
    if (dx * dir_d > 0.0) {
      x = std::fabs(dx) >= remaining ? x_end : x + dx;
      s0 = free_state(r, y_end);
      head0 = r.invert(x) + s0.e;
      b.nodes.push_back({x, y_end, r.invert(x) + y_end, false});
      ++b.steps;
      if (x == x_end) return FreeEnd::end;
    }
  }

  const double f_start = depth_slope(r, s0);
  double h = std::fabs(x_end - x);
  if (std::isfinite(f_start) && f_start != 0.0) h = std::min(h, r.max_dy / std::fabs(f_start));
  int attempts = 0;
  bool uniform = false;
  while (true) {
    const double remaining = std::fabs(x_end - x);
    if (remaining <= 1e-9 * r.length) return FreeEnd::end;
    if (b.steps >= r.max_steps || attempts > 20 * r.max_steps) return FreeEnd::cap;
    ++attempts;
    const double f0 = depth_slope(r, s0);
    // (Not where the normal depth is close: there the surface flattens and distance steps fit.)
    const bool near_normal = r.has_normal && std::fabs(r.yn - s0.y) < dy_cap(s0.y);
    if (std::fabs(1.0 - s0.fr2) < 0.5 && std::isfinite(f0) && f0 != 0.0 && !near_normal) {
      // Near critical depth the surface curves sharply in x but smoothly in y: step by depth.
      const double y_sign = f0 * dir_d > 0.0 ? 1.0 : -1.0;
      double dy = 0.5 * dy_cap(s0.y);
      const double toward_yc = (r.yc - s0.y) * y_sign;
      if (toward_yc > 0.0) dy = std::min(dy, toward_yc);
      if (r.has_normal && (r.yn - s0.y) * y_sign > 0.0) dy = std::min(dy, 0.5 * (r.yn - s0.y) * y_sign);
      double y1 = s0.y + y_sign * dy;
      const bool to_crown = y1 >= r.rise;
      if (to_crown) y1 = r.rise;
      const double dx = direct_step(r, x, head0, s0.sf, y1);
      if (dx * dir_d > 0.0 && std::fabs(dx) < remaining) {
        const double sf_before = s0.sf;
        x += dx;
        s0 = free_state(r, y1);
        head0 = r.invert(x) + s0.e;
        b.nodes.push_back({x, y1, r.invert(x) + y1, to_crown});
        ++b.steps;
        have_prev = true;  // the depth step is a history point for the next predictor too
        f_prev = f0;
        sf_prev = sf_before;
        dx_prev = dx;
        h = 2.0 * std::fabs(dx);
        if (to_crown) return FreeEnd::crown;
        if (stop && stop(b.nodes.back())) return FreeEnd::stopped;
        if (toward_yc > 0.0 && dy == toward_yc) return FreeEnd::critical;
        continue;
      }
      h = std::min(h, remaining);
    }
    const bool last = h >= remaining * (1.0 - 1e-12);
    const double step = last ? remaining : h;
    const double x1 = last ? x_end : x + dir_d * step;
    const double dx = x1 - x;
    // Predictors: Adams-Bashforth 2 (Euler without history) for the depth, to seed the solver,
    // and for the energy head H' = Sf, whose difference from the trapezoidal corrector estimates
    // the step's local error (Milne's device; the Euler difference is O(h^2), a safe over-estimate).
    double predicted = -1.0, head_predicted = head0 + dx * s0.sf, divisor = 2.0;
    if (std::isfinite(f0)) {
      predicted = s0.y + dx * f0;
      if (have_prev && std::isfinite(f_prev)) {
        const double w = 0.5 * dx / dx_prev;
        predicted = s0.y + dx * (f0 + w * (f0 - f_prev));
        head_predicted = head0 + dx * (s0.sf + w * (s0.sf - sf_prev));
        divisor = 6.0;
      }
    }
    const double width = std::max(0.5 * std::fabs(predicted - s0.y), 2e-3 * r.rise);
    const StepResult res = standard_step(r, x, head0, s0.sf, x1, b.side, predicted, width);
    if (res.outcome != StepOutcome::ok) {
      const double target = res.outcome == StepOutcome::crown ? r.rise : r.yc;
      // A normal depth between here and the target is an asymptote the surface cannot cross: the
      // step was too long for the trapezoidal balance, not a real transition.
      const bool behind_normal = r.has_normal && (r.yn - s0.y) * (target - r.yn) > 0.0;
      if ((std::fabs(target - s0.y) > dy_cap(s0.y) || behind_normal) && step > min_step) {
        h = 0.5 * step;
        continue;
      }
      const double reach_dx = direct_step(r, x, head0, s0.sf, target);
      x += dir_d * std::clamp(reach_dx * dir_d, 0.0, remaining);
      const bool crown = res.outcome == StepOutcome::crown;
      b.nodes.push_back({x, target, r.invert(x) + target, crown});
      ++b.steps;
      return crown ? FreeEnd::crown : FreeEnd::critical;
    }
    const State& s1 = res.state;
    const double dy = s1.y - s0.y;
    if (std::fabs(dy) > dy_cap(s0.y) && step > min_step) {
      h = step * std::max(0.1, 0.9 * dy_cap(s0.y) / std::fabs(dy));
      continue;
    }
    // A head error becomes a depth error through dE/dy = 1 - Fr^2.
    const double head1 = r.invert(x1) + s1.e;
    const double err = std::fabs(head1 - head_predicted) / divisor / std::max(std::fabs(1.0 - s1.fr2), 0.05);
    if (err > r.step_tolerance && step > min_step && !uniform) {
      h = step * std::max(0.2, 0.9 * std::cbrt(r.step_tolerance / err));
      continue;
    }
    have_prev = true;
    f_prev = f0;
    sf_prev = s0.sf;
    dx_prev = dx;
    x = x1;
    s0 = s1;
    head0 = r.invert(x) + s0.e;
    b.nodes.push_back({x, s0.y, r.invert(x) + s0.y, false});
    ++b.steps;
    if (stop && stop(b.nodes.back())) return FreeEnd::stopped;
    h = step * (err > 0.0 ? std::min(4.0, 0.9 * std::cbrt(r.step_tolerance / err)) : 4.0);
    // Uniform flow reached (within a tenth of the step tolerance): one step to the end. Shallow
    // flow relaxes to normal depth over millimetres, where the trapezoidal rule would otherwise
    // oscillate about it at every step.
    if (r.has_normal && std::fabs(s0.y - r.yn) <= std::max(1e-7 * r.rise, 0.1 * r.step_tolerance)) {
      // A direct step onto normal depth itself, then exact uniform flow (Sf = S0) to the end.
      const double to_end = std::fabs(x_end - x);
      const double dx_snap = s0.y == r.yn ? 0.0 : direct_step(r, x, head0, s0.sf, r.yn);
      if (dx_snap * dir_d >= 0.0 && std::fabs(dx_snap) < to_end) {
        if (dx_snap != 0.0) {
          x += dx_snap;
          b.nodes.push_back({x, r.yn, r.invert(x) + r.yn, false});
          ++b.steps;
        }
        b.nodes.push_back({x_end, r.yn, r.invert(x_end) + r.yn, false});
        ++b.steps;
        return FreeEnd::end;
      }
      uniform = true;
      h = to_end;
    }
  }
}
BranchEnd end_of(FreeEnd e) {
  switch (e) {
    case FreeEnd::end: return BranchEnd::reached_end;
    case FreeEnd::critical: return BranchEnd::critical;
    case FreeEnd::stopped: return BranchEnd::stopped;
    case FreeEnd::crown:
    case FreeEnd::cap: break;
  }
  return BranchEnd::step_cap;
}
}  // namespace

void close_with_uniform_flow(const PreparedReach& r, Branch& b, double x_end) {
  const Node last = b.nodes.back();
  const State s = free_state(r, last.y);
  const double dx = direct_step(r, last.x, r.invert(last.x) + s.e, s.sf, r.yn);
  const double span = x_end - last.x;
  if (dx * span > 0.0 && std::fabs(dx) < std::fabs(span)) b.nodes.push_back({last.x + dx, r.yn, r.invert(last.x + dx) + r.yn, false});
  b.nodes.push_back({x_end, r.yn, r.invert(x_end) + r.yn, false});
  b.end = BranchEnd::reached_end;
}

double velocity_at(const PreparedReach& r, const Node& n) {
  if (r.flow == 0.0) return 0.0;  // still water, also where dry
  if (n.full) return r.flow / r.area_full;
  return r.flow / free_surface_geometry(r.section, n.y).area_m2;
}

double total_head(const PreparedReach& r, const Node& n) {
  const double v = velocity_at(r, n);
  return n.hgl + v * v / (2.0 * g);
}

double specific_force_at(const PreparedReach& r, const Node& n) {
  const double q2g = r.flow * r.flow / g;
  if (n.full) return q2g / r.area_full + r.area_full * (n.hgl - r.invert(n.x) - 0.5 * r.rise);
  const double y = n.y;
  const Geometry geo = free_surface_geometry(r.section, y);
  return q2g / geo.area_m2 + area_moment(r.section, y);
}

double friction_slope_at(const PreparedReach& r, const Node& n) {
  if (n.full) return r.sf_full;
  return free_state(r, n.y).sf;
}

Branch march_subcritical(const PreparedReach& r, const Node& start, const StopRule& stop) {
  Branch b;
  b.side = Side::sub;
  b.nodes.push_back(start);
  Node node = start;
  bool from_free = false;
  while (true) {
    if (node.full) {
      // Pressure flow: the HGL rises upstream at the full-flow friction slope until it meets
      // the crown, which rises at the bed slope.
      const double excess = node.hgl - r.crown(node.x);
      if (r.slope > r.sf_full && !(from_free && excess <= r.closure * r.rise)) {
        const double x_meet = node.x + excess / (r.slope - r.sf_full);
        if (x_meet >= r.length) {
          b.nodes.push_back({r.length, r.rise, node.hgl + r.sf_full * (r.length - node.x), true});
          return b;
        }
        if (x_meet > node.x) {
          node = {x_meet, r.rise, r.crown(x_meet), true};
          b.nodes.push_back(node);
        }
      } else {
        const double hgl = node.hgl + r.sf_full * (r.length - node.x);
        b.nodes.push_back({r.length, r.rise, std::max(hgl, r.crown(r.length)), true});
        return b;
      }
    }
    const FreeEnd end = march_free(r, b, node, r.length, +1, stop);
    if (end == FreeEnd::crown) {
      node = b.nodes.back();
      from_free = true;
      continue;
    }
    b.end = end_of(end);
    return b;
  }
}

Branch march_supercritical(const PreparedReach& r, const Node& start) {
  Branch b;
  b.side = Side::super;
  b.nodes.push_back(start);
  b.end = end_of(march_free(r, b, start, 0.0, -1, {}));
  return b;
}

Node branch_at(const PreparedReach& r, const Branch& b, double x) {
  const auto& n = b.nodes;
  std::size_t i = 0;  // the control-side neighbour of x
  if (b.side == Side::sub) {
    while (i + 1 < n.size() && n[i + 1].x <= x) ++i;
  } else {
    while (i + 1 < n.size() && n[i + 1].x >= x) ++i;
  }
  const Node& a = n[i];
  if (a.x == x || i + 1 == n.size()) return {x, a.y, a.hgl + (a.full ? 0.0 : r.slope * (x - a.x)), a.full};
  const Node& c = n[i + 1];
  if (a.full && c.full) return {x, r.rise, a.hgl + (c.hgl - a.hgl) * (x - a.x) / (c.x - a.x), true};
  const double guess = a.y + (c.y - a.y) * (x - a.x) / (c.x - a.x);  // seeds the solver
  const State s0 = free_state(r, a.y);
  const StepResult res = standard_step(r, a.x, r.invert(a.x) + s0.e, s0.sf, x, b.side, guess, std::fabs(c.y - a.y) + 1e-3 * r.rise);
  // A step inside a computed interval has a root; should round-off lose it, interpolate.
  const double y = res.outcome == StepOutcome::ok ? res.state.y : guess;
  return {x, y, r.invert(x) + y, false};
}

}  // namespace rimline::hydraulics::detail
