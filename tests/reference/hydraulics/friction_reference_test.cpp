// Friction laws against published explicit formulas, limits and forms.
#include <catch2/catch.hpp>

#include <cmath>

#include "rimline/hydraulics/friction.hpp"

using namespace rimline::hydraulics;

// Source: Swamee, P.K. & Jain, A.K. (1976) "Explicit equations for pipe-flow problems",
// J. Hydraulics Div. ASCE 102(HY5) 657-664: f = 0.25 / log10(e/3.7 + 5.74/Re^0.9)^2 for
// 1e-6 <= e/D <= 1e-2 and 5e3 <= Re <= 1e8, quoted as within about 1 % of Colebrook-White over
// most of that range and a few percent at its corners (from memory). Checked at 3 % everywhere.
TEST_CASE("Colebrook-White vs Swamee-Jain (1976), from memory, 3 %", "[reference][friction]") {
  for (double rel : {1e-6, 1e-5, 1e-4, 1e-3, 1e-2}) {
    for (double re : {5e3, 2e4, 1e5, 1e6, 1e7, 1e8}) {
      const double sj = 0.25 / std::pow(std::log10(rel / 3.7 + 5.74 / std::pow(re, 0.9)), 2);
      INFO("Re = " << re << ", e/D = " << rel);
      CHECK(darcy_friction_factor(re, rel) == Approx(sj).epsilon(0.03));
    }
  }
}

// Source: Haaland, S.E. (1983) "Simple and explicit formulas for the friction factor in turbulent
// pipe flow", J. Fluids Eng. 105(1) 89-90: 1/sqrt f = -1.8 log10((e/3.7)^1.11 + 6.9/Re), stated
// within about 1.5 % of Colebrook-White (from memory). Checked at 2 %.
TEST_CASE("Colebrook-White vs Haaland (1983), from memory, 2 %", "[reference][friction]") {
  for (double rel : {1e-6, 1e-5, 1e-4, 1e-3, 1e-2, 5e-2}) {
    for (double re : {4e3, 1e4, 1e5, 1e6, 1e7, 1e8}) {
      const double x = -1.8 * std::log10(std::pow(rel / 3.7, 1.11) + 6.9 / re);
      INFO("Re = " << re << ", e/D = " << rel);
      CHECK(darcy_friction_factor(re, rel) == Approx(1.0 / (x * x)).epsilon(0.02));
    }
  }
}

// Source: von Karman's fully rough law 1/sqrt f = -2 log10(e / 3.7 D) (the Re -> infinity limit of
// Colebrook-White, Colebrook 1939) and the Prandtl-von Karman smooth-pipe law
// 1/sqrt f = 2 log10(Re sqrt f) - 0.8 (from memory). The smooth law's constant 0.8 vs 2 log10 2.51
// = 0.7993 bounds the difference at 0.1 %; checked at 0.2 %.
TEST_CASE("Colebrook-White limits: fully rough and smooth-pipe laws", "[reference][friction]") {
  for (double rel : {1e-4, 1e-3, 1e-2, 5e-2}) {
    const double x = -2.0 * std::log10(rel / 3.7);
    CHECK(darcy_friction_factor(1e13, rel) == Approx(1.0 / (x * x)).epsilon(1e-5));
  }
  for (double re : {1e4, 1e5, 1e6, 1e7}) {
    const double f = darcy_friction_factor(re, 0.0);
    CHECK(1.0 / std::sqrt(f) == Approx(2.0 * std::log10(re * std::sqrt(f)) - 0.8).epsilon(0.002));
  }
}

// Source: Moody, L.F. (1944) "Friction factors for pipe flow", Trans. ASME 66, 671-684, the Moody
// diagram; values read off the chart (from memory): smooth pipe at Re = 1e5 f ~ 0.018; e/D = 1e-3 at
// Re = 1e5 f ~ 0.022; e/D = 1e-4 at Re = 1e6 f ~ 0.0134. Chart reading: 3 %.
TEST_CASE("Colebrook-White vs Moody diagram read-offs (from memory), 3 %", "[reference][friction]") {
  CHECK(darcy_friction_factor(1e5, 0.0) == Approx(0.018).epsilon(0.03));
  CHECK(darcy_friction_factor(1e5, 1e-3) == Approx(0.022).epsilon(0.03));
  CHECK(darcy_friction_factor(1e6, 1e-4) == Approx(0.0134).epsilon(0.03));
}

// Source: the US customary Hazen-Williams form V = 1.318 C R^0.63 S^0.54 (V ft/s, R ft), e.g. as in
// AWWA Manual M11 (from memory); in SI it becomes 1.318 x 0.3048^0.37 = 0.849. Checked to 0.05 %,
// the rounding of the two published coefficients.
TEST_CASE("Hazen-Williams SI form matches the US customary form 1.318 C R^0.63 S^0.54", "[reference][friction]") {
  Roughness hw;
  hw.law = FrictionLaw::hazen_williams;
  hw.hazen_c = 110.0;
  const Section main{Shape::circular, 0.45, 0, 0, {}};
  const double r_ft = 0.45 / 4.0 / 0.3048;
  const double v_us = 1.318 * 110.0 * std::pow(r_ft, 0.63) * std::pow(0.004, 0.54);
  const double v_si = full_capacity_m3_s(hw, main, 0.004) / full_geometry(main).area_m2;
  CHECK(v_si == Approx(v_us * 0.3048).epsilon(5e-4));
}

// Source: kinematic viscosity of water as tabulated in standard fluid-mechanics references
// (e.g. the water-properties table of White, Fluid Mechanics; values from memory):
// 10 degC 1.307e-6, 20 degC 1.004e-6, 30 degC 0.801e-6, 50 degC 0.553e-6, 80 degC 0.365e-6 m^2/s.
// The implemented fit is stated to about 1 %; checked at 2 %.
TEST_CASE("water kinematic viscosity vs tabulated values (from memory), 2 %", "[reference][friction]") {
  CHECK(water_kinematic_viscosity_m2_s(10.0) == Approx(1.307e-6).epsilon(0.02));
  CHECK(water_kinematic_viscosity_m2_s(20.0) == Approx(1.004e-6).epsilon(0.02));
  CHECK(water_kinematic_viscosity_m2_s(30.0) == Approx(0.801e-6).epsilon(0.02));
  CHECK(water_kinematic_viscosity_m2_s(50.0) == Approx(0.553e-6).epsilon(0.02));
  CHECK(water_kinematic_viscosity_m2_s(80.0) == Approx(0.365e-6).epsilon(0.02));
}
