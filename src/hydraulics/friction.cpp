// Friction laws. SI forms:
//   Manning:        V = (1/n) R^(2/3) S^(1/2)            (US customary: V = (1.486/n) R^(2/3) S^(1/2), R in ft)
//   Darcy-Weisbach: S = f/(4R) V^2/(2g)                  with D_h = 4R for partly full flow
//   Colebrook-White (1939): 1/sqrt f = -2 log10( (ks/D_h)/3.7 + 2.51/(Re sqrt f) )
//   Hazen-Williams: V = 0.849 C R^0.63 S^0.54           (SI form of V = 1.318 C R^0.63 S^0.54 in ft)
#include "rimline/hydraulics/friction.hpp"

#include <cmath>
#include <string>

#include "hydraulics/cube_root.hpp"
#include "hydraulics/kernels.hpp"
#include "hydraulics/solve_1d.hpp"
#include "rimline/error.hpp"
#include "rimline/units.hpp"

namespace rimline::hydraulics {

namespace {
constexpr double g = units::gravity_m_s2;
constexpr double laminar_limit = 2000.0;
constexpr double turbulent_limit = 4000.0;

void require_positive(double v, const std::string& what) {
  if (!std::isfinite(v) || v <= 0.0)
    throw Error(ErrorKind::bad_argument, what + " must be positive and finite, got " + std::to_string(v));
}

void require_flow(double q) {
  if (!std::isfinite(q) || q < 0.0)
    throw Error(ErrorKind::bad_argument, "flow must be zero or positive and finite, got " + std::to_string(q) + " m3/s");
}

double colebrook(double re, double rel) {
  // Newton's method on g(x) = x + 2 log10(a + b x), x = 1/sqrt f, a = rel/3.7, b = 2.51/Re,
  // from the Swamee-Jain (1976) estimate; g is increasing and concave, so Newton converges
  // monotonically, in two or three steps to 1e-12.
  const double a = rel / 3.7, b = 2.51 / re, k = 2.0 / std::log(10.0);
  double x = -2.0 * std::log10(a + 5.74 / std::pow(re, 0.9));
  for (int i = 0; i < 50; ++i) {
    const double inner = a + b * x;
    const double step = (x + 2.0 * std::log10(inner)) / (1.0 + k * b / inner);
    x -= step;
    if (std::fabs(step) <= 1e-12 * x) break;
  }
  return 1.0 / (x * x);
}
}  // namespace

std::string_view friction_law_name(FrictionLaw f) {
  switch (f) {
    case FrictionLaw::manning: return "manning";
    case FrictionLaw::darcy_weisbach: return "darcy_weisbach";
    case FrictionLaw::hazen_williams: return "hazen_williams";
  }
  return "manning";
}

void validate(const Roughness& r) {
  switch (r.law) {
    case FrictionLaw::manning: require_positive(r.manning_n, "Manning's n"); break;
    case FrictionLaw::darcy_weisbach:
      if (!std::isfinite(r.ks_m) || r.ks_m < 0.0)
        throw Error(ErrorKind::bad_argument, "roughness ks must be zero or positive and finite, got " + std::to_string(r.ks_m) + " m");
      require_positive(r.kinematic_viscosity_m2_s, "kinematic viscosity");
      break;
    case FrictionLaw::hazen_williams: require_positive(r.hazen_c, "Hazen-Williams C"); break;
  }
}

// Dynamic viscosity by the Vogel equation mu = A 10^(B/(T - C)), A = 2.414e-5 Pa s, B = 247.8 K,
// C = 140 K, and density by the Thiesen-type formula
// rho = 1000 (1 - (t + 288.9414)/(508929.2 (t + 68.12963)) (t - 3.9863)^2) kg/m3 (both from memory;
// within about 1 % of tabulated water properties over 0-100 degC).
double water_kinematic_viscosity_m2_s(double temperature_c) {
  if (!std::isfinite(temperature_c) || temperature_c < 0.0 || temperature_c > 100.0)
    throw Error(ErrorKind::bad_argument, "water temperature must be within 0..100 degC, got " + std::to_string(temperature_c));
  const double t_k = temperature_c + 273.15;
  const double mu = 2.414e-5 * std::pow(10.0, 247.8 / (t_k - 140.0));
  const double dt = temperature_c - 3.9863;
  const double rho = 1000.0 * (1.0 - (temperature_c + 288.9414) / (508929.2 * (temperature_c + 68.12963)) * dt * dt);
  return mu / rho;
}

double darcy_friction_factor(double reynolds, double relative_roughness) {
  require_positive(reynolds, "Reynolds number");
  if (!std::isfinite(relative_roughness) || relative_roughness < 0.0)
    throw Error(ErrorKind::bad_argument, "relative roughness must be zero or positive, got " + std::to_string(relative_roughness));
  if (reynolds <= laminar_limit) return 64.0 / reynolds;
  if (reynolds >= turbulent_limit) return colebrook(reynolds, relative_roughness);
  // Transition zone: no law holds; interpolate linearly in Re between the two regimes
  // (common practice, no source) so that the friction slope stays continuous.
  const double w = (reynolds - laminar_limit) / (turbulent_limit - laminar_limit);
  return (1.0 - w) * (64.0 / laminar_limit) + w * colebrook(turbulent_limit, relative_roughness);
}

namespace detail {

double friction_slope_of(const Roughness& r, double q, double area, double radius) {
  if (q == 0.0) return 0.0;
  const double v = q / area;
  switch (r.law) {
    case FrictionLaw::manning: {
      const double nv = r.manning_n * v;
      return nv * nv / (radius * cube_root(radius));  // R^(4/3)
    }
    case FrictionLaw::darcy_weisbach: {
      const double dh = 4.0 * radius;
      const double f = darcy_friction_factor(v * dh / r.kinematic_viscosity_m2_s, r.ks_m / dh);
      return f / dh * v * v / (2.0 * g);
    }
    case FrictionLaw::hazen_williams:
      return std::pow(v / (0.849 * r.hazen_c * std::pow(radius, 0.63)), 1.0 / 0.54);
  }
  return 0.0;
}

double uniform_flow_of(const Roughness& r, double area, double radius, double slope) {
  switch (r.law) {
    case FrictionLaw::manning: return area * cube_root(radius * radius) * std::sqrt(slope) / r.manning_n;
    case FrictionLaw::hazen_williams: return area * 0.849 * r.hazen_c * std::pow(radius, 0.63) * std::pow(slope, 0.54);
    case FrictionLaw::darcy_weisbach: {
      const double dh = 4.0 * radius, nu = r.kinematic_viscosity_m2_s;
      // Colebrook-White solved for V at a given slope is explicit (the form used in the
      // Wallingford tables): V = -2 sqrt(2 g D S) log10(ks/(3.7 D) + 2.51 nu / (D sqrt(2 g D S))).
      const double root = std::sqrt(2.0 * g * dh * slope);
      const double v_turb = -2.0 * root * std::log10(r.ks_m / (3.7 * dh) + 2.51 * nu / (dh * root));
      if (v_turb * dh / nu >= turbulent_limit) return v_turb * area;
      const double v_lam = g * slope * dh * dh / (32.0 * nu);
      if (v_lam * dh / nu <= laminar_limit) return v_lam * area;
      // Transition zone: the friction slope is monotone in V, so bracket and solve.
      auto excess = [&](double v) { return friction_slope_of(r, v * area, area, radius) - slope; };
      const double lo = laminar_limit * nu / dh, hi = turbulent_limit * nu / dh;
      const auto res = brent_root(excess, lo, hi, excess(lo), excess(hi), 1e-12 * hi, 100);
      return res.x * area;
    }
  }
  return 0.0;
}

}  // namespace detail

double friction_slope(const Roughness& r, const Section& s, double flow_m3_s, double depth_m) {
  validate(r);
  require_flow(flow_m3_s);
  const Geometry geo = geometry_at(s, depth_m);
  return detail::friction_slope_of(r, flow_m3_s, geo.area_m2, geo.hydraulic_radius_m);
}

double full_friction_slope(const Roughness& r, const Section& s, double flow_m3_s) {
  return friction_slope(r, s, flow_m3_s, rise_m(s));
}

double full_capacity_m3_s(const Roughness& r, const Section& s, double slope) {
  return uniform_flow_m3_s(r, s, rise_m(s), slope);
}

double full_velocity_m_s(const Roughness& r, const Section& s, double slope) {
  return full_capacity_m3_s(r, s, slope) / full_geometry(s).area_m2;
}

double uniform_flow_m3_s(const Roughness& r, const Section& s, double depth_m, double slope) {
  validate(r);
  require_positive(slope, "slope (for a uniform-flow discharge)");
  const Geometry geo = geometry_at(s, depth_m);
  return detail::uniform_flow_of(r, geo.area_m2, geo.hydraulic_radius_m, slope);
}

double manning_velocity_m_s(double manning_n, double hydraulic_radius_m, double slope) {
  require_positive(manning_n, "Manning's n");
  require_positive(hydraulic_radius_m, "hydraulic radius");
  require_positive(slope, "slope");
  return std::pow(hydraulic_radius_m, 2.0 / 3.0) * std::sqrt(slope) / manning_n;
}

double manning_velocity_us_ft_s(double manning_n, double hydraulic_radius_ft, double slope) {
  require_positive(manning_n, "Manning's n");
  require_positive(hydraulic_radius_ft, "hydraulic radius");
  require_positive(slope, "slope");
  return manning_us_factor * std::pow(hydraulic_radius_ft, 2.0 / 3.0) * std::sqrt(slope) / manning_n;
}

}  // namespace rimline::hydraulics
