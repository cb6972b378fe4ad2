// Normal depth (uniform flow: conveyance * sqrt(S) = Q) and critical depth (Q^2 T / (g A^3) = 1),
// specific energy E = y + Q^2/(2 g A^2) and specific force M = Q^2/(g A) + A zbar
// (Chow 1959, Open-Channel Hydraulics, ch. 3 and 4).
#include "rimline/hydraulics/depth.hpp"

#include <cmath>
#include <string>

#include "hydraulics/kernels.hpp"
#include "hydraulics/solve_1d.hpp"
#include "rimline/error.hpp"
#include "rimline/units.hpp"

namespace rimline::hydraulics {

namespace {
constexpr double g = units::gravity_m_s2;
constexpr int max_iterations = 200;

double depth_tolerance(const Section& s) { return 1e-10 * rise_m(s); }

void require_flow(double q) {
  if (!std::isfinite(q) || q < 0.0)
    throw Error(ErrorKind::bad_argument, "flow must be zero or positive and finite, got " + std::to_string(q) + " m3/s");
}

void require_depth(double y) {
  if (!std::isfinite(y) || y <= 0.0)
    throw Error(ErrorKind::bad_argument, "flow depth must be positive and finite, got " + std::to_string(y) + " m");
}

double flow_at(const Roughness& r, const Section& s, double y, double slope) {
  const Geometry geo = detail::free_surface_geometry(s, y);
  return detail::uniform_flow_of(r, geo.area_m2, geo.hydraulic_radius_m, slope);
}

// For Manning and Hazen-Williams the discharge peak of a circle (and of the egg, a shape of fixed
// proportions) sits at a fixed y/rise whatever the size, roughness and slope (Q ~ A^a / P^b), so it
// is found once per law and shape.
double peak_fraction(const Roughness& r, Shape shape) {
  auto fraction = [](const Roughness& law, Shape sh) {
    Section unit;
    unit.shape = sh;
    unit.diameter_m = 1.0;
    unit.height_m = 1.0;
    unit.width_m = 1.0 / egg_height_over_width;
    return detail::golden_max([&](double y) { return flow_at(law, unit, y, 1e-3); }, 0.5, 1.0, 1e-12).first;
  };
  static const double manning = fraction(Roughness{}, Shape::circular);
  static const double hazen = fraction(Roughness{FrictionLaw::hazen_williams}, Shape::circular);
  static const double manning_egg = fraction(Roughness{}, Shape::egg);
  static const double hazen_egg = fraction(Roughness{FrictionLaw::hazen_williams}, Shape::egg);
  if (shape == Shape::egg) return r.law == FrictionLaw::manning ? manning_egg : hazen_egg;
  return r.law == FrictionLaw::manning ? manning : hazen;
}

// A table section may carry its largest partly-full discharge anywhere: a scan of the depths, then
// a golden-section refinement about the best.
double table_peak_depth(const Roughness& r, const Section& s, double slope) {
  const double rise = rise_m(s);
  constexpr int n = 64;
  int best = n;
  double q_best = -1.0;
  for (int i = 1; i <= n; ++i) {
    const double q = flow_at(r, s, rise * i / n, slope);
    if (q > q_best) q_best = q, best = i;
  }
  if (best == n) return rise;  // rising to the soffit (a flat soffit opens the section up to it)
  return detail::golden_max([&](double y) { return flow_at(r, s, y, slope); }, rise * (best - 1) / n,
                            rise * (best + 1) / n, 1e-9 * rise)
      .first;
}
}  // namespace

double detail::peak_depth(const Roughness& r, const Section& s, double slope) {
  if (s.shape == Shape::box) return s.height_m;  // Q rises with y up to the soffit
  if (s.shape == Shape::table) return table_peak_depth(r, s, slope);
  const double rise = rise_m(s);
  if (r.law != FrictionLaw::darcy_weisbach) return peak_fraction(r, s.shape) * rise;
  // Darcy-Weisbach: the peak moves a little with the Reynolds number but stays near 0.93-0.95 of the
  // rise; Q is flat there, so locating it to 1e-7 of the rise gives the peak discharge to ~1e-14.
  return golden_max([&](double y) { return flow_at(r, s, y, slope); }, 0.8 * rise, rise, 1e-7 * rise).first;
}

PeakFlow peak_partly_full_flow(const Roughness& r, const Section& s, double slope) {
  validate(s);
  validate(r);
  if (!std::isfinite(slope) || slope <= 0.0)
    throw Error(ErrorKind::bad_argument, "slope must be positive for a partly-full peak discharge, got " + std::to_string(slope));
  const double y = detail::peak_depth(r, s, slope);
  return {flow_at(r, s, y, slope), y};
}

DepthSolve normal_depth(const Roughness& r, const Section& s, double flow_m3_s, double slope) {
  validate(s);
  validate(r);
  require_flow(flow_m3_s);
  if (std::isnan(slope)) throw Error(ErrorKind::bad_argument, "slope is NaN");
  DepthSolve out;
  if (slope <= 0.0) {
    out.depth_m = rise_m(s);
    out.note = "no normal depth on a horizontal or adverse slope";
    return out;
  }
  if (flow_m3_s == 0.0) {
    out.exists = out.converged = true;
    return out;
  }
  const double y_peak = detail::peak_depth(r, s, slope);
  const double q_peak = flow_at(r, s, y_peak, slope);
  if (flow_m3_s > q_peak) {
    out.depth_m = rise_m(s);
    out.note = "flow " + std::to_string(flow_m3_s) + " m3/s exceeds the largest partly-full discharge " +
               std::to_string(q_peak) + " m3/s at this slope: no normal depth, the conduit surcharges";
    return out;
  }
  auto excess = [&](double y) { return flow_at(r, s, y, slope) - flow_m3_s; };
  const double lo = 1e-12 * rise_m(s);
  const auto res = detail::brent_root(excess, lo, y_peak, excess(lo), q_peak - flow_m3_s, depth_tolerance(s), max_iterations);
  out.exists = true;
  out.depth_m = res.x;
  out.iterations = res.iterations;
  out.converged = res.converged;
  if (!res.converged) out.note = "normal depth did not converge in " + std::to_string(max_iterations) + " iterations";
  return out;
}

DepthSolve critical_depth(const Section& s, double flow_m3_s) {
  validate(s);
  require_flow(flow_m3_s);
  DepthSolve out;
  if (flow_m3_s == 0.0) {
    out.exists = out.converged = true;
    return out;
  }
  const double rise = rise_m(s), tol = depth_tolerance(s);
  // Solve log(A^3 / T) = log(Q^2 / g): A^3/T grows monotonically with y in both shapes, and the
  // logarithm keeps the function tame both for tiny depths and as T -> 0 near a circle's crown.
  const double target = std::log(flow_m3_s * flow_m3_s / g);
  auto excess = [&](double y) {
    const Geometry geo = detail::free_surface_geometry(s, y);
    return 3.0 * std::log(geo.area_m2) - std::log(geo.top_width_m) - target;
  };
  const double hi = closes_at_soffit(s) ? rise - tol : rise;
  const double f_hi = excess(hi);
  if (f_hi < 0.0) {
    out.depth_m = rise;
    out.converged = true;
    out.note = "critical depth would lie above the rise: the flow is too large for a free surface at critical depth";
    return out;
  }
  const double lo = 1e-12 * rise;
  const auto res = detail::brent_root(excess, lo, hi, excess(lo), f_hi, tol, max_iterations);
  out.exists = true;
  out.depth_m = res.x;
  out.iterations = res.iterations;
  out.converged = res.converged;
  if (!res.converged) out.note = "critical depth did not converge in " + std::to_string(max_iterations) + " iterations";
  return out;
}

double froude_number(const Section& s, double flow_m3_s, double depth_m) {
  validate(s);
  require_flow(flow_m3_s);
  require_depth(depth_m);
  if (depth_m >= rise_m(s)) return 0.0;
  const Geometry geo = detail::free_surface_geometry(s, depth_m);
  return flow_m3_s / geo.area_m2 / std::sqrt(g * geo.hydraulic_depth_m);
}

double specific_energy_m(const Section& s, double flow_m3_s, double depth_m) {
  validate(s);
  require_flow(flow_m3_s);
  require_depth(depth_m);
  const Geometry geo = detail::any_geometry(s, depth_m);
  const double v = flow_m3_s / geo.area_m2;
  return depth_m + v * v / (2.0 * g);
}

// For a full section, depth_m is the pressure head above the invert: the pressure above the
// crown acts on the whole area, so M = Q^2/(g A) + A (h - D/2).
double specific_force_m3(const Section& s, double flow_m3_s, double depth_m) {
  validate(s);
  require_flow(flow_m3_s);
  require_depth(depth_m);
  const double rise = rise_m(s);
  const Geometry geo = detail::any_geometry(s, depth_m);
  const double moment = depth_m >= rise ? geo.area_m2 * (depth_m - 0.5 * rise) : area_moment_m3(s, depth_m);
  return flow_m3_s * flow_m3_s / (g * geo.area_m2) + moment;
}

}  // namespace rimline::hydraulics
