// Hydraulic jump between the two branches of a profile: scanned from upstream on interpolated
// surfaces, refined by Brent's method on exact standard steps.
#include "hydraulics/gvf_join.hpp"

#include <algorithm>
#include <cmath>
#include <functional>

#include "hydraulics/solve_1d.hpp"
#include "rimline/hydraulics/depth.hpp"

namespace rimline::hydraulics::detail {

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

namespace {
// Specific force of the subcritical minus the supercritical surface at x: exact, and rough.
double force_gap(const PreparedReach& r, const Branch& sub, const Branch& sup, double x) {
  return specific_force_at(r, branch_at(r, sub, x)) - specific_force_at(r, branch_at(r, sup, x));
}

double rough_gap(const PreparedReach& r, const Branch& sub, const Branch& sup, double x) {
  return specific_force_at(r, interpolated(sub, x)) - specific_force_at(r, interpolated(sup, x));
}
}  // namespace

Joined join(const PreparedReach& r, const Branch& sub, const Branch* sup) {
  Joined j;
  const double sub_top = sub.end == BranchEnd::reached_end ? r.length : sub.far_x();
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
    j.ok = sub.end == BranchEnd::reached_end;
    return j;
  }
  const double sup_bottom = sup->end == BranchEnd::reached_end ? 0.0 : sup->far_x();
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
        jump = brent_root(f, a, b, fa, fb, 1e-6 * r.length, 100).x;
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
  const Node sub_at = branch_at(r, sub, *jump);
  Node sup_at = branch_at(r, *sup, *jump);
  take_sub_below(*jump);
  j.nodes.push_back(sub_at);
  j.super_from = j.nodes.size();
  j.has_super = true;
  // A jump loses energy. Conjugate depths within a hair of critical can put the supercritical
  // side's energy below the subcritical one's by round-off (third order in the distance from
  // critical); the supercritical depth is then taken where the two energies are equal.
  const double head_sub = total_head(r, sub_at);
  if (total_head(r, sup_at) < head_sub && !sub_at.full) {
    const double spec = head_sub - r.invert(*jump);
    auto excess = [&](double y) { return specific_energy_m(r.section, r.flow, y) - spec; };
    const double lo_y = 1e-9 * r.rise;
    sup_at.y = brent_root(excess, lo_y, r.yc, excess(lo_y), excess(r.yc), r.closure * r.yc, 200).x;
    sup_at.hgl = r.invert(*jump) + sup_at.y;
  }
  // Should that still fail, supercritical sections are dropped until the energy line rises
  // again, so the EGL never climbs in the flow direction.
  std::vector<Node> upstream{sup_at};
  for (auto it = sup->nodes.rbegin(); it != sup->nodes.rend(); ++it)
    if (it->x > *jump) upstream.push_back(*it);
  std::size_t first = 0;
  while (first < upstream.size() && total_head(r, upstream[first]) < head_sub) ++first;
  j.nodes.insert(j.nodes.end(), upstream.begin() + static_cast<std::ptrdiff_t>(first), upstream.end());
  j.jump_x = *jump;
  if (first == 0) j.jump_loss = std::max(0.0, total_head(r, sup_at) - head_sub);
  return j;
}

}  // namespace rimline::hydraulics::detail
