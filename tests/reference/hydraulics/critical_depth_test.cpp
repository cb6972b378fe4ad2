// Critical depth against closed-form relations and a published approximation.
#include <catch2/catch.hpp>

#include <cmath>

#include "rimline/hydraulics/depth.hpp"
#include "rimline/units.hpp"

using namespace rimline::hydraulics;

namespace {
constexpr double g = rimline::units::gravity_m_s2;
}

// Source: the critical-flow condition Q^2 T / (g A^3) = 1, which for a rectangle gives
// yc = (q^2/g)^(1/3) with q = Q/b (Chow 1959, Open-Channel Hydraulics, ch. 3, from memory).
// Tolerance: the solver's documented 1e-7 m.
TEST_CASE("rectangular critical depth yc = (q^2/g)^(1/3) (Chow 1959 ch. 3, from memory)", "[reference][depth]") {
  const Section box{Shape::box, 0.0, 2.4, 1.8, {}};
  for (double q : {0.01, 0.3, 1.5, 4.0, 8.0}) {
    const double per_width = q / 2.4;
    CHECK(critical_depth(box, q).depth_m == Approx(std::cbrt(per_width * per_width / g)).margin(1e-7));
  }
}

// Source: circle geometry at half depth (A = pi D^2/8, T = D) in the critical-flow condition:
// Q = sqrt(g (pi/8)^3 D^5) gives yc = D/2 exactly. Tolerance 1e-7 m.
TEST_CASE("circular critical depth at half full: exact from the critical-flow condition", "[reference][depth]") {
  for (double d : {0.15, 0.6, 1.0, 3.0}) {
    const double q = std::sqrt(g * std::pow(std::numbers::pi / 8.0, 3) * std::pow(d, 5));
    CHECK(critical_depth(Section{Shape::circular, d, 0, 0, {}}, q).depth_m == Approx(0.5 * d).margin(1e-7));
  }
}

// Source: Straub, W.O. (1978) "A quick and easy way to calculate critical and conjugate depths in
// circular open channels", Civil Engineering 48(12) 70-71: yc = (1.01 / D^0.26) (Q^2/g)^0.25 in SI,
// for 0.02 < yc/D < 0.85 (from memory). An approximation quoted as good to a few percent (its exact
// stated accuracy not at hand): checked at 6 %, which still rejects a wrong relation (the
// rectangular formula with b = D is 20 % off at yc/D = 0.5).
TEST_CASE("circular critical depth vs Straub (1978) approximation (from memory), 6 %", "[reference][depth]") {
  for (double d : {0.3, 1.0, 2.4}) {
    const Section s{Shape::circular, d, 0, 0, {}};
    for (double frac : {0.1, 0.2, 0.35, 0.5, 0.65, 0.8}) {
      const Geometry geo = geometry_at(s, frac * d);
      const double q = std::sqrt(g * std::pow(geo.area_m2, 3) / geo.top_width_m);
      const double straub = 1.01 / std::pow(d, 0.26) * std::pow(q * q / g, 0.25);
      INFO("D = " << d << ", yc/D = " << frac);
      CHECK(critical_depth(s, q).depth_m == Approx(straub).epsilon(0.06));
    }
  }
}
