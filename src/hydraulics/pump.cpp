// Pump curve (monotone piecewise-cubic Hermite interpolation, Fritsch & Carlson 1980, SIAM J.
// Numer. Anal. 17(2) 238-246), system curve H = static lift + Sf L + sum K V^2/2g, and the
// operating point where they meet.
#include "rimline/hydraulics/pump.hpp"

#include <cmath>
#include <string>

#include "hydraulics/solve_1d.hpp"
#include "rimline/error.hpp"
#include "rimline/hydraulics/losses.hpp"

namespace rimline::hydraulics {

namespace {
[[noreturn]] void bad(const std::string& what) { throw Error(ErrorKind::bad_argument, what); }
}  // namespace

PumpCurve::PumpCurve(std::vector<CurvePoint> points) : points_(std::move(points)) {
  if (points_.size() < 2) bad("a pump curve needs at least two points");
  for (std::size_t i = 0; i < points_.size(); ++i) {
    const CurvePoint& p = points_[i];
    if (!std::isfinite(p.flow_m3_s) || !std::isfinite(p.head_m) || p.flow_m3_s < 0.0 || p.head_m < 0.0)
      bad("pump curve point " + std::to_string(i + 1) + " must have finite, non-negative flow and head");
    if (i > 0 && !(p.flow_m3_s > points_[i - 1].flow_m3_s))
      bad("pump curve flows must increase strictly (point " + std::to_string(i + 1) + ")");
    if (i > 0 && !(p.head_m < points_[i - 1].head_m))
      bad("pump curve heads must fall strictly with flow (point " + std::to_string(i + 1) + ")");
  }
  // Fritsch-Carlson: secant slopes, three-point interior tangents, then limit each pair of
  // tangents to the circle of radius 3 so the interpolant stays monotone.
  const std::size_t n = points_.size();
  std::vector<double> secant(n - 1);
  for (std::size_t i = 0; i + 1 < n; ++i)
    secant[i] = (points_[i + 1].head_m - points_[i].head_m) / (points_[i + 1].flow_m3_s - points_[i].flow_m3_s);
  slopes_.assign(n, 0.0);
  slopes_.front() = secant.front();
  slopes_.back() = secant.back();
  for (std::size_t i = 1; i + 1 < n; ++i) slopes_[i] = 0.5 * (secant[i - 1] + secant[i]);
  for (std::size_t i = 0; i + 1 < n; ++i) {
    const double a = slopes_[i] / secant[i], b = slopes_[i + 1] / secant[i];
    const double r2 = a * a + b * b;
    if (r2 > 9.0) {
      const double tau = 3.0 / std::sqrt(r2);
      slopes_[i] = tau * a * secant[i];
      slopes_[i + 1] = tau * b * secant[i];
    }
  }
}

double PumpCurve::head_m(double flow_m3_s) const {
  if (!std::isfinite(flow_m3_s) || flow_m3_s < points_.front().flow_m3_s || flow_m3_s > points_.back().flow_m3_s)
    bad("flow " + std::to_string(flow_m3_s) + " m3/s lies outside the pump curve (" + std::to_string(points_.front().flow_m3_s) +
        " .. " + std::to_string(points_.back().flow_m3_s) + " m3/s)");
  std::size_t i = 0;
  while (i + 2 < points_.size() && flow_m3_s > points_[i + 1].flow_m3_s) ++i;
  const CurvePoint &p0 = points_[i], &p1 = points_[i + 1];
  const double h = p1.flow_m3_s - p0.flow_m3_s, t = (flow_m3_s - p0.flow_m3_s) / h;
  const double t2 = t * t, t3 = t2 * t;
  return (2 * t3 - 3 * t2 + 1) * p0.head_m + (t3 - 2 * t2 + t) * h * slopes_[i] + (-2 * t3 + 3 * t2) * p1.head_m +
         (t3 - t2) * h * slopes_[i + 1];
}

double PumpCurve::max_flow_m3_s() const { return points_.back().flow_m3_s; }
double PumpCurve::min_flow_m3_s() const { return points_.front().flow_m3_s; }
double PumpCurve::shutoff_head_m() const { return points_.front().head_m; }

double SystemCurve::head_m(double flow_m3_s) const {
  if (!std::isfinite(static_lift_m)) bad("static lift must be finite");
  if (!std::isfinite(length_m) || length_m <= 0.0) bad("force main length must be positive, got " + std::to_string(length_m));
  if (!std::isfinite(minor_k_total) || minor_k_total < 0.0) bad("minor loss K must be zero or positive");
  const double velocity = flow_m3_s / full_geometry(section).area_m2;
  return static_lift_m + full_friction_slope(roughness, section, flow_m3_s) * length_m + minor_k_total * velocity_head_m(velocity);
}

OperatingPoint operating_point(const PumpCurve& pump, int pumps_in_parallel, const SystemCurve& system) {
  return operating_point(pump, pumps_in_parallel, [&system](double q) { return system.head_m(q); });
}

OperatingPoint operating_point(const PumpCurve& pump, int pumps_in_parallel,
                               const std::function<double(double flow_m3_s)>& system_head_m) {
  if (pumps_in_parallel < 1) bad("at least one pump is needed, got " + std::to_string(pumps_in_parallel));
  const double n = pumps_in_parallel;
  // Identical pumps in parallel deliver n times the flow at the same head: H(Q) = H_pump(Q/n).
  auto surplus = [&](double q) { return pump.head_m(q / n) - system_head_m(q); };
  const double q_lo = n * pump.min_flow_m3_s(), q_hi = n * pump.max_flow_m3_s();
  const double f_lo = surplus(q_lo), f_hi = surplus(q_hi);
  OperatingPoint op;
  if (f_lo < 0.0 || f_hi > 0.0) return op;  // static lift above shut-off, or run-out beyond the curve
  const auto root = detail::brent_root(surplus, q_lo, q_hi, f_lo, f_hi, 1e-12 * std::max(q_hi, 1e-9), 200);
  op.exists = root.converged;
  op.flow_m3_s = root.x;
  op.head_m = system_head_m(root.x);
  op.iterations = root.iterations;
  return op;
}

}  // namespace rimline::hydraulics
