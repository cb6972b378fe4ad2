// Point losses and structure-loss methods. The HEC-22 factors are checked against the
// 2nd ed. (2001) formulas as recalled (from memory; see src/hydraulics/structure_loss.cpp).
#include <catch2/catch.hpp>

#include <cmath>
#include <limits>
#include <numbers>

#include "rimline/error.hpp"
#include "rimline/hydraulics/losses.hpp"
#include "rimline/units.hpp"

using namespace rimline::hydraulics;

namespace {
constexpr double g = rimline::units::gravity_m_s2;

double term(const StructureLoss& s, const char* name) {
  for (const auto& t : s.terms)
    if (t.name == name) return t.value;
  FAIL("no term " << name);
  return 0.0;
}

StructureLossInputs straight_through() {
  StructureLossInputs in;
  in.outflow_velocity_m_s = 2.0;
  in.outflow_flow_m3_s = 0.5;
  in.outflow_diameter_m = 0.6;
  in.outflow_depth_m = 0.6;
  in.structure_diameter_m = 1.2;
  in.structure_invert_m = 10.0;
  in.water_level_m = 12.5;  // d_aho / D_o = 4.17: deep, no depth correction
  in.inflows = {{0.5, 2.0, 0.6, 10.02, 0.0}};
  return in;
}
}  // namespace

TEST_CASE("velocity head, Borda-Carnot expansion and exit losses", "[losses]") {
  CHECK(velocity_head_m(3.0) == Approx(9.0 / (2 * g)));
  CHECK(expansion_loss_m(3.0, 1.0) == Approx(4.0 / (2 * g)));
  CHECK(expansion_loss_m(1.0, 3.0) == 0.0);  // an acceleration is no expansion
  CHECK(exit_loss_m(2.5) == Approx(velocity_head_m(2.5)));  // K = 1 into still water
  CHECK(exit_loss_m(2.5, 0.5) == Approx(velocity_head_m(2.0)));
}

TEST_CASE("contraction and entrance coefficients", "[losses]") {
  CHECK(contraction_k(1.0) == 0.0);
  CHECK(contraction_k(1e-6) == Approx(0.5).margin(1e-6));
  CHECK(contraction_k(0.5) == Approx(0.25));
  CHECK(entrance_k(Entrance::square_edged) == 0.5);
  CHECK(entrance_k(Entrance::projecting) > entrance_k(Entrance::square_edged));
  CHECK(entrance_k(Entrance::bell_mouth) < entrance_k(Entrance::rounded));
}

TEST_CASE("bend K by deflection: HEC-22 (2001) Table 7-5 access-hole values (from memory)", "[losses]") {
  CHECK(bend_k(0.0) == Approx(0.15));
  CHECK(bend_k(22.5) == Approx(0.45));
  CHECK(bend_k(45.0) == Approx(0.75));
  CHECK(bend_k(60.0) == Approx(0.85));
  CHECK(bend_k(90.0) == Approx(1.00));
  CHECK(bend_k(135.0) == Approx(1.00));
  CHECK(bend_k(30.0) == Approx(0.45 + 0.30 * 7.5 / 22.5));
  CHECK(structure_type_k(StructureKind::inlet, 0.0) == Approx(0.50));
  CHECK(structure_type_k(StructureKind::inlet, 90.0) == Approx(1.50));
  double last = 0.0;
  for (double a = 0.0; a <= 180.0; a += 5.0) {
    CHECK(bend_k(a) >= last);
    last = bend_k(a);
  }
}

TEST_CASE("constant K and bend methods apply K on the outflow velocity head", "[losses]") {
  StructureLossInputs in = straight_through();
  in.k_constant = 0.5;
  const StructureLoss c = structure_loss(StructureLossMethod::constant_k, in);
  CHECK(c.loss_m == Approx(0.5 * 4.0 / (2 * g)));
  CHECK(c.k_effective == 0.5);
  in.k_constant = 0.15;
  in.inflows.front().deflection_deg = 90.0;
  const StructureLoss b = structure_loss(StructureLossMethod::bend, in);
  CHECK(b.k_effective == Approx(1.0));
  CHECK(b.loss_m == Approx(velocity_head_m(2.0)));
}

TEST_CASE("HEC-22 straight through, equal pipes, deep water: K = K_o = 0.1 b/D_o", "[losses][hec22]") {
  const StructureLoss s = structure_loss(StructureLossMethod::hec22, straight_through());
  CHECK(term(s, "K_o") == Approx(0.1 * 1.2 / 0.6));
  CHECK(term(s, "C_D") == Approx(1.0));
  CHECK(term(s, "C_d") == 1.0);
  CHECK(term(s, "C_Q") == 1.0);
  CHECK(term(s, "C_p") == 1.0);
  CHECK(term(s, "C_B") == 1.0);
  CHECK(s.k_effective == Approx(0.2));
  CHECK(s.loss_m == Approx(0.2 * 4.0 / (2 * g)));
}

TEST_CASE("HEC-22 corrections: angle, diameter, depth, relative flow, plunging, benching", "[losses][hec22]") {
  StructureLossInputs in = straight_through();
  in.inflows.front().deflection_deg = 90.0;     // theta = 90 deg
  in.inflows.front().diameter_m = 0.45;         // C_D = (0.6/0.45)^3
  in.inflows.front().flow_m3_s = 0.3;           // Q_i / Q_o = 0.6
  in.inflows.push_back({0.2, 1.5, 0.3, 11.5, 90.0});  // a lateral plunging in 1.5 m up
  in.water_level_m = 10.0 + 1.2;                // d_aho = 1.2 m, d_aho / D_o = 2
  in.benching = Benching::half;
  const StructureLoss s = structure_loss(StructureLossMethod::hec22, in);
  CHECK(term(s, "K_o") == Approx(1.4 * std::pow(2.0, 0.15)));
  CHECK(term(s, "C_D") == Approx(std::pow(0.6 / 0.45, 3)));
  CHECK(term(s, "C_d") == Approx(0.5 * std::pow(2.0, 0.6)));
  CHECK(term(s, "C_Q") == Approx((1 - 2 * 1.0) * std::pow(0.4, 0.75) + 1));
  const double h = 11.5 - 10.3;  // plunge height to the outflow centre line
  CHECK(term(s, "C_p") == Approx(1 + 0.2 * (h / 0.6) * ((h - 1.2) / 0.6)));
  CHECK(term(s, "C_p") == Approx(1.0));  // h = 1.2 = d_aho: on the limit, no plunging correction
  CHECK(term(s, "C_B") == Approx(0.15 + (2.0 - 1.0) / 2.2 * (0.95 - 0.15)));
  double product = 1.0;
  for (const auto& t : s.terms) product *= t.value;
  CHECK(s.k_effective == Approx(product));
  // A truly plunging inflow in shallow water.
  in.water_level_m = 10.4;
  const StructureLoss p = structure_loss(StructureLossMethod::hec22, in);
  CHECK(term(p, "C_p") == Approx(1 + 0.2 * (1.2 / 0.6) * ((1.2 - 0.4) / 0.6)));
  CHECK(term(p, "C_B") == Approx(0.15));
}

TEST_CASE("bad loss arguments are rimline::Error(bad_argument)", "[losses][bad]") {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  auto bad = [](auto&& f) {
    try {
      f();
    } catch (const rimline::Error& e) {
      return e.kind() == rimline::ErrorKind::bad_argument;
    }
    return false;
  };
  CHECK(bad([&] { velocity_head_m(nan); }));
  CHECK(bad([] { contraction_k(0.0); }));
  CHECK(bad([] { contraction_k(1.5); }));
  CHECK(bad([] { bend_k(-10.0); }));
  CHECK(bad([] { bend_k(200.0); }));
  StructureLossInputs in = straight_through();
  in.k_constant = -0.1;
  CHECK(bad([&] { structure_loss(StructureLossMethod::constant_k, in); }));
  in = straight_through();
  in.outflow_diameter_m = 0.0;
  CHECK(bad([&] { structure_loss(StructureLossMethod::hec22, in); }));
  in = straight_through();
  in.outflow_velocity_m_s = nan;
  CHECK(bad([&] { structure_loss(StructureLossMethod::hec22, in); }));
}
