// Friction laws: internal consistency (forms, inverses, continuity). Handbook values are in
// tests/reference/hydraulics.
#include <catch2/catch.hpp>

#include <cmath>
#include <limits>
#include <numbers>

#include "rimline/error.hpp"
#include "rimline/hydraulics/friction.hpp"
#include "rimline/units.hpp"

using namespace rimline::hydraulics;

namespace {
const Section circle{Shape::circular, 0.6, 0.0, 0.0, {}};
constexpr double g = rimline::units::gravity_m_s2;

Roughness darcy(double ks) {
  Roughness r;
  r.law = FrictionLaw::darcy_weisbach;
  r.ks_m = ks;
  return r;
}
}  // namespace

TEST_CASE("Manning: SI and US forms give the same velocity (1.486 ~ 3.2808^(1/3))", "[friction]") {
  const double v_si = manning_velocity_m_s(0.013, 0.15, 0.004);
  const double v_us = manning_velocity_us_ft_s(0.013, 0.15 / 0.3048, 0.004) * 0.3048;
  // 1.486 vs the exact 1.48592: 5e-5 relative.
  CHECK(v_us == Approx(v_si).epsilon(1e-4));
  CHECK(v_si == Approx(std::pow(0.15, 2.0 / 3.0) * std::sqrt(0.004) / 0.013).epsilon(1e-14));
}

TEST_CASE("Manning friction slope S = (n V)^2 / R^(4/3), full and partly full", "[friction]") {
  const Roughness r;  // n = 0.013
  const double q = 0.3;
  const double a = std::numbers::pi * 0.09, v = q / a;
  CHECK(full_friction_slope(r, circle, q) == Approx(std::pow(0.013 * v, 2) / std::pow(0.15, 4.0 / 3.0)).epsilon(1e-12));
  const Geometry half = geometry_at(circle, 0.3);
  const double vh = q / half.area_m2;
  CHECK(friction_slope(r, circle, q, 0.3) == Approx(std::pow(0.013 * vh, 2) / std::pow(half.hydraulic_radius_m, 4.0 / 3.0)));
  CHECK(friction_slope(r, circle, 0.0, 0.3) == 0.0);
}

TEST_CASE("uniform flow is the inverse of the friction slope, for every law", "[friction]") {
  Roughness hw;
  hw.law = FrictionLaw::hazen_williams;
  for (const Roughness& r : {Roughness{}, darcy(0.6e-3), darcy(0.0), hw}) {
    for (double y : {0.05, 0.3, 0.55, 0.6}) {
      const double q = uniform_flow_m3_s(r, circle, y, 0.003);
      CHECK(friction_slope(r, circle, q, y) == Approx(0.003).epsilon(1e-9));
    }
  }
  CHECK(full_capacity_m3_s(Roughness{}, circle, 0.003) == uniform_flow_m3_s(Roughness{}, circle, 0.6, 0.003));
  // Full-flow velocity: Manning with R = D/4.
  CHECK(full_velocity_m_s(Roughness{}, circle, 0.003) == Approx(std::pow(0.15, 2.0 / 3.0) * std::sqrt(0.003) / 0.013).epsilon(1e-12));
}

TEST_CASE("Darcy-Weisbach: laminar 64/Re, transition continuous, laminar friction slope exact", "[friction]") {
  CHECK(darcy_friction_factor(1000.0, 0.001) == Approx(0.064));
  CHECK(darcy_friction_factor(2000.0, 0.0) == Approx(0.032));
  CHECK(darcy_friction_factor(2000.0 * (1 + 1e-9), 0.0) == Approx(0.032).epsilon(1e-6));
  CHECK(darcy_friction_factor(4000.0 * (1 - 1e-9), 1e-3) == Approx(darcy_friction_factor(4000.0, 1e-3)).epsilon(1e-6));
  // A tiny flow is laminar: S = 32 nu V / (g D^2) (Hagen-Poiseuille).
  const Roughness r = darcy(1e-3);
  const double q = 1e-5, v = q / (std::numbers::pi * 0.09);
  CHECK(full_friction_slope(r, circle, q) == Approx(32.0 * r.kinematic_viscosity_m2_s * v / (g * 0.36)).epsilon(1e-12));
  // Friction slope grows monotonically through the transition zone.
  double last = 0.0;
  for (double re = 1500; re <= 5000; re += 50) {
    const double qq = re * r.kinematic_viscosity_m2_s / 0.6 * std::numbers::pi * 0.09;
    const double s = full_friction_slope(r, circle, qq);
    CHECK(s > last);
    last = s;
  }
}

TEST_CASE("Hazen-Williams SI form V = 0.849 C R^0.63 S^0.54", "[friction]") {
  Roughness hw;
  hw.law = FrictionLaw::hazen_williams;
  hw.hazen_c = 130.0;
  const double v = 0.849 * 130.0 * std::pow(0.15, 0.63) * std::pow(0.002, 0.54);
  CHECK(full_capacity_m3_s(hw, circle, 0.002) == Approx(v * std::numbers::pi * 0.09).epsilon(1e-12));
}

TEST_CASE("water viscosity falls with temperature", "[friction]") {
  double last = 1.0;
  for (double t = 0.0; t <= 100.0; t += 5.0) {
    const double nu = water_kinematic_viscosity_m2_s(t);
    CHECK(nu < last);
    last = nu;
  }
}

TEST_CASE("bad friction arguments are rimline::Error(bad_argument)", "[friction][bad]") {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  Roughness bad_n;
  bad_n.manning_n = 0.0;
  CHECK_THROWS_AS(friction_slope(bad_n, circle, 0.1, 0.3), rimline::Error);
  CHECK_THROWS_AS(full_capacity_m3_s(Roughness{}, circle, 0.0), rimline::Error);
  CHECK_THROWS_AS(full_capacity_m3_s(Roughness{}, circle, -0.01), rimline::Error);
  CHECK_THROWS_AS(full_capacity_m3_s(Roughness{}, circle, nan), rimline::Error);
  CHECK_THROWS_AS(friction_slope(Roughness{}, circle, -1.0, 0.3), rimline::Error);
  CHECK_THROWS_AS(friction_slope(Roughness{}, circle, nan, 0.3), rimline::Error);
  CHECK_THROWS_AS(friction_slope(darcy(-1e-3), circle, 0.1, 0.3), rimline::Error);
  CHECK_THROWS_AS(darcy_friction_factor(nan, 0.001), rimline::Error);
  CHECK_THROWS_AS(water_kinematic_viscosity_m2_s(120.0), rimline::Error);
  try {
    full_capacity_m3_s(Roughness{}, circle, 0.0);
  } catch (const rimline::Error& e) {
    CHECK(e.kind() == rimline::ErrorKind::bad_argument);
    CHECK(std::string(e.what()).find("slope") != std::string::npos);
  }
}
