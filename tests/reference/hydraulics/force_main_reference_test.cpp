// Pressure-main hydraulics against hand solutions and published values: the operating point of a
// pump curve on a system curve solved by hand, Hazen-Williams head loss against a published worked
// example and the published SI form, Darcy-Weisbach head loss against the Swamee-Jain explicit
// head-loss equation.
#include <catch2/catch.hpp>

#include <cmath>

#include "rimline/hydraulics/friction.hpp"
#include "rimline/hydraulics/pump.hpp"
#include "rimline/units.hpp"

using namespace rimline::hydraulics;
namespace units = rimline::units;

// Hand solution (quadratic formula). A pump whose curve is the straight line H = 30 - 200 Q
// (H m, Q m3/s; two points, so the monotone cubic is that line exactly) on the system curve
// H = 10 + 2000 Q^2: 2000 Q^2 + 200 Q - 20 = 0, Q = (-200 + sqrt(200^2 + 4 * 2000 * 20)) / 4000
// = 0.0618034 m3/s, H = 17.63932 m. Two such pumps in parallel deliver Q at H = 30 - 100 Q:
// 2000 Q^2 + 100 Q - 20 = 0, Q = (-100 + sqrt(100^2 + 160000)) / 4000 = 0.0780776 m3/s,
// H = 22.19224 m. The solver's tolerance is 1e-12 relative in Q; checked to 1e-7.
TEST_CASE("operating point of a straight pump curve on a quadratic system curve, solved by hand",
          "[reference][pump]") {
  const PumpCurve pump({{0.0, 30.0}, {0.15, 0.0}});
  auto system = [](double q) { return 10.0 + 2000.0 * q * q; };
  const OperatingPoint one = operating_point(pump, 1, system);
  REQUIRE(one.exists);
  CHECK(one.flow_m3_s == Approx((-200.0 + std::sqrt(200000.0)) / 4000.0).epsilon(1e-7));
  CHECK(one.flow_m3_s == Approx(0.0618034).epsilon(1e-6));
  CHECK(one.head_m == Approx(17.63932).epsilon(1e-6));
  const OperatingPoint two = operating_point(pump, 2, system);
  REQUIRE(two.exists);
  CHECK(two.flow_m3_s == Approx(0.0780776).epsilon(1e-6));
  CHECK(two.head_m == Approx(22.19224).epsilon(1e-6));
  // Static lift above the shut-off head: no operating point (hand: 35 > 30).
  CHECK_FALSE(operating_point(pump, 1, [](double q) { return 35.0 + 2000.0 * q * q; }).exists);
}

// Source: The Engineering ToolBox, "Hazen-Williams Friction Loss Equation" (web page, worked
// example): 200 gal/min of water in a PE pipe of 3.048 in inside diameter, C = 140, loses "9 ft H2O
// per 100 ft" and 2.7 ft over 30 ft. The page rounds to one digit (9 stands for 8.5 .. 9.5), so the
// check is at 5 %.
TEST_CASE("Hazen-Williams head loss vs The Engineering ToolBox worked example (200 gpm, 3.048 in, C 140)",
          "[reference][friction]") {
  Roughness hw;
  hw.law = FrictionLaw::hazen_williams;
  hw.hazen_c = 140.0;
  const Section pipe{Shape::circular, 3.048 * units::metres_per_inch, 0, 0, {}};
  const double q = units::to_si(200.0, units::Unit::gpm);
  const double slope = full_friction_slope(hw, pipe, q);
  CHECK(slope * 100.0 == Approx(9.0).epsilon(0.05));            // ft per 100 ft = m per 100 m
  CHECK(slope * 30.0 == Approx(2.7).epsilon(0.05));                // ft of head over 30 ft of pipe
}

// Source: the SI Hazen-Williams head-loss form hf = 10.67 L Q^1.852 / (C^1.852 D^4.87) (hf, L, D m;
// Q m3/s), as given in water-supply handbooks (from memory). Its rounded constants (10.67, 4.87)
// differ from V = 0.849 C R^0.63 S^0.54 by a few tenths of a percent; checked at 1 % over a range of
// sizes and flows.
TEST_CASE("Hazen-Williams SI head-loss form 10.67 L Q^1.852 / (C^1.852 D^4.87), from memory, 1 %",
          "[reference][friction]") {
  Roughness hw;
  hw.law = FrictionLaw::hazen_williams;
  for (double c : {100.0, 130.0, 150.0}) {
    hw.hazen_c = c;
    for (double d : {0.1, 0.15, 0.3, 0.6}) {
      for (double v : {0.6, 1.2, 2.5}) {
        const double q = v * M_PI * d * d / 4.0;
        const double hf = 10.67 * 1000.0 * std::pow(q, 1.852) / (std::pow(c, 1.852) * std::pow(d, 4.87));
        INFO("C " << c << ", D " << d << " m, V " << v << " m/s");
        CHECK(full_friction_slope(hw, Section{Shape::circular, d, 0, 0, {}}, q) * 1000.0 == Approx(hf).epsilon(0.01));
      }
    }
  }
}

// Source: Swamee, P.K. & Jain, A.K. (1976) "Explicit equations for pipe-flow problems",
// J. Hydraulics Div. ASCE 102(HY5) 657-664, the explicit head-loss equation
// hf = 1.07 Q^2 L / (g D^5) {ln[e/(3.7 D) + 4.62 (nu D / Q)^0.9]}^-2, stated there to be within
// about 2 % of Colebrook-White for 1e-6 <= e/D <= 1e-2 and 3e3 <= Re <= 3e8 (accuracy from memory).
// Checked at 3 % for force-main sizes and velocities.
TEST_CASE("Darcy-Weisbach head loss vs the Swamee-Jain (1976) explicit head-loss equation, 3 %",
          "[reference][friction]") {
  Roughness dw;
  dw.law = FrictionLaw::darcy_weisbach;
  dw.kinematic_viscosity_m2_s = 1.004e-6;
  for (double ks : {0.0015e-3, 0.06e-3, 0.26e-3, 1.5e-3}) {
    dw.ks_m = ks;
    for (double d : {0.1, 0.25, 0.5, 1.0}) {
      for (double v : {0.6, 1.5, 3.0}) {
        const double q = v * M_PI * d * d / 4.0, length = 1000.0;
        const double ln = std::log(ks / (3.7 * d) + 4.62 * std::pow(dw.kinematic_viscosity_m2_s * d / q, 0.9));
        const double hf = 1.07 * q * q * length / (units::gravity_m_s2 * std::pow(d, 5)) / (ln * ln);
        INFO("ks " << ks << " m, D " << d << " m, V " << v << " m/s");
        CHECK(full_friction_slope(dw, Section{Shape::circular, d, 0, 0, {}}, q) * length == Approx(hf).epsilon(0.03));
      }
    }
  }
}
