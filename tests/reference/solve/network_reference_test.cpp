// The network solve against outside references.
//  - Two parallel pipes running full between the same structures: equal head loss. With Manning
//    (Manning 1891, Proc. Instn Civ. Engrs Ireland 20; the form V = (1/n) R^(2/3) S^(1/2), citation
//    from memory) and equal length and n, friction alone gives Q1/Q2 = (A1/A2)(R1/R2)^(2/3) =
//    (D1/D2)^(8/3); with the exit velocity head (still-pool bookkeeping) the closed form is
//    Q1/Q2 = sqrt(r2/r1), r = n^2 L / (A^2 R^(4/3)) + 1 / (2 g A^2).
//  - The same pipes part full, long, to a free outfall: each reaches normal depth (Manning on the
//    circular segment, Chow, Open-Channel Hydraulics, 1959, Table 2-1 geometry - from memory: A =
//    D^2 (t - sin t)/8, P = D t / 2), and both inlets share the structure's energy level.
//  - A looped pressure network (every pipe full under a high tailwater): the flows of Hardy
//    Cross's loop-correction method (Cross, "Analysis of flow in networks of conduits or
//    conductors", Univ. of Illinois Engineering Experiment Station Bulletin 286, 1936 - citation from
//    memory), run independently here on the closed-form pipe law above. No textbook worked
//    example was at hand: its figures transcribed from memory would not be a check value, so the
//    published method itself is the reference. Layout and demands are invented.
#include <catch2/catch.hpp>
#include <cmath>
#include <numbers>

#include "../../unit/solve/network_fixture.hpp"
#include "rimline/units.hpp"

using namespace rimline;

namespace {

constexpr double g = units::gravity_m_s2;
constexpr double n_manning = 0.013;

// Head lost between the two structure levels by a full circular pipe carrying q (K = 0).
double full_pipe_r(double d, double length) {
  const double a = std::numbers::pi * d * d / 4.0, r = d / 4.0;
  return n_manning * n_manning * length / (a * a * std::pow(r, 4.0 / 3.0)) + 1.0 / (2.0 * g * a * a);
}

solve::MarchOptions no_structure_loss(double tailwater_m) {
  solve::MarchOptions m;
  m.tailwater_mode = solve::TailwaterMode::fixed;
  m.tailwater_m = tailwater_m;
  m.default_k = 0.0;
  // Each pipe loses its exit velocity head where it arrives (the textbook pipe-network form, r
  // including 1/(2gA^2)): still-pool bookkeeping at every structure.
  m.structure_energy = hydraulics::StructureEnergy::still_pool;
  return m;
}

solve::NetworkSolveOptions tight() {
  solve::NetworkSolveOptions o;
  o.continuity_tolerance_m3_s = 1e-7;
  o.all_levels = true;
  return o;
}

// Part-full circle, depth y: area and hydraulic radius (t: the angle the water surface subtends).
void segment(double d, double y, double& area, double& radius) {
  const double t = 2.0 * std::acos(1.0 - 2.0 * y / d);
  area = d * d * (t - std::sin(t)) / 8.0;
  radius = area / (d * t / 2.0);
}

}  // namespace

TEST_CASE("reference: parallel pipes running full share the flow by equal head loss (Manning)") {
  test::Net t;
  const auto up = t.structure("UP", 10.0, 20.0);
  const auto of = t.structure("OF", 9.0, 20.0, model::StructureKind::outfall);
  const double d1 = 0.6, d2 = 0.4, length = 2000.0;
  t.pipe("P1", up, of, d1, 10.0, 9.0, length);
  t.pipe("P2", up, of, d2, 10.0, 9.0, length);
  t.inflow[up] = 0.25;
  t.build();
  const auto s = t.solve(no_structure_loss(14.0), tight());  // 4 m above every crown
  REQUIRE(s.components.size() == 1);
  CHECK(s.components[0].converged);
  const double q1 = s.flow_m3_s[0], q2 = s.flow_m3_s[1];
  CHECK(q1 + q2 == Approx(0.25).epsilon(1e-6));
  // Closed form with the exit velocity heads: 1e-6 (the root solves' level tolerance, 0.1 um).
  CHECK(q1 / q2 == Approx(std::sqrt(full_pipe_r(d2, length) / full_pipe_r(d1, length))).epsilon(1e-6));
  // Friction alone, (D1/D2)^(8/3): the velocity heads are 0.7 % of the loss in the smaller pipe here,
  // so the ratio agrees within 1 %.
  CHECK(q1 / q2 == Approx(std::pow(d1 / d2, 8.0 / 3.0)).epsilon(0.01));
  // The common level upstream: tailwater + r Q^2 in either pipe.
  CHECK(s.level_m[up] == Approx(14.0 + full_pipe_r(d1, length) * q1 * q1).margin(1e-4));
}

TEST_CASE("reference: parallel pipes part full share one upstream level; each at Manning normal depth") {
  test::Net t;
  const auto up = t.structure("UP", 11.0, 20.0);
  const auto of = t.structure("OF", 10.0, 20.0, model::StructureKind::outfall);
  const double d1 = 0.6, d2 = 0.45, length = 1000.0, slope = 0.001, total = 0.15;
  t.pipe("P1", up, of, d1, 11.0, 11.0 - slope * length, length);
  t.pipe("P2", up, of, d2, 11.0, 11.0 - slope * length, length);
  t.inflow[up] = total;
  t.build();
  auto m = no_structure_loss(std::nan(""));
  m.tailwater_mode = solve::TailwaterMode::free;
  const auto s = t.solve(m, tight());
  REQUIRE(s.components[0].converged);
  // Independent: energy E common to both inlets (K = 0), each pipe at its normal depth y_i with
  // y_i + V_i^2/2g = E; E found so that the flows add up.
  auto flow_at_energy = [&](double d, double e) {
    double lo = 1e-4 * d, hi = 0.93 * d;  // below the depth of the largest part-full flow
    for (int k = 0; k < 200; ++k) {
      const double y = 0.5 * (lo + hi);
      double a, r;
      segment(d, y, a, r);
      const double q = a * std::pow(r, 2.0 / 3.0) * std::sqrt(slope) / n_manning;
      (y + q * q / (2.0 * g * a * a) > e ? hi : lo) = y;
    }
    double a, r;
    segment(d, 0.5 * (lo + hi), a, r);
    return a * std::pow(r, 2.0 / 3.0) * std::sqrt(slope) / n_manning;
  };
  double lo = 0.0, hi = 0.5;
  for (int k = 0; k < 200; ++k) {
    const double e = 0.5 * (lo + hi);
    (flow_at_energy(d1, e) + flow_at_energy(d2, e) > total ? hi : lo) = e;
  }
  const double e = 0.5 * (lo + hi);
  // 0.2 %: the profile approaches normal depth from the free outlet's drawdown (M2) and is within
  // a fraction of a millimetre of it after 1000 m; the step method's own tolerance is 0.1 mm.
  CHECK(s.flow_m3_s[0] == Approx(flow_at_energy(d1, e)).epsilon(0.002));
  CHECK(s.flow_m3_s[1] == Approx(flow_at_energy(d2, e)).epsilon(0.002));
  CHECK(s.level_m[up] == Approx(11.0 + e).margin(5e-4));
}

TEST_CASE("reference: a looped pressure network reproduces Hardy Cross's loop corrections") {
  // A --1-- B --2-- C
  // |       |       |
  // 3       4       5        every pipe full: tailwater 16 m at OF, inverts about 10 m
  // |       |       |
  // D --6-- E --7-- F --8-- OF
  test::Net t;
  const char* ids[] = {"A", "B", "C", "D", "E", "F"};
  for (const char* id : ids) t.structure(id, 10.0, 25.0);
  t.structure("OF", 9.5, 25.0, model::StructureKind::outfall);
  struct Spec {
    int from, to;
    double d, length;
  };
  // Digitised in arbitrary directions; the solve finds the way each flows.
  const Spec specs[] = {{0, 1, 0.45, 300}, {2, 1, 0.3, 250}, {0, 3, 0.3, 200}, {4, 1, 0.375, 200},
                        {2, 5, 0.3, 200},  {3, 4, 0.375, 300}, {5, 4, 0.45, 250}, {5, 6, 0.6, 150}};
  for (int k = 0; k < 8; ++k)
    t.pipe("P" + std::to_string(k + 1), static_cast<std::size_t>(specs[k].from), static_cast<std::size_t>(specs[k].to),
           specs[k].d, 10.0, 10.0, specs[k].length);
  t.inflow = {0.10, 0.05, 0.08, 0.04, 0.06, 0.02, 0.0};
  t.build();
  const auto s = t.solve(no_structure_loss(16.0), tight());
  REQUIRE(s.components[0].converged);

  // Hardy Cross, independently: flows satisfying continuity first (a spanning tree), then each
  // loop corrected by dQ = -sum(r Q|Q|) / sum(2 r |Q|) until the corrections vanish.
  // Signs along each pipe's digitised direction.
  double q[8];
  q[0] = 0.10, q[2] = 0.0;  // A's inflow along A -> B
  q[1] = 0.08, q[4] = 0.0;  // C's along C -> B
  q[5] = 0.04;              // D's along D -> E
  q[3] = -0.23;             // B's 0.10 + 0.08 + 0.05 to E, against pipe 4 (E -> B)
  q[6] = -0.33;             // E's 0.04 + 0.23 + 0.06 to F, against pipe 7 (F -> E)
  q[7] = 0.35;              // F -> OF: everything
  double r[8];
  for (int k = 0; k < 8; ++k) r[k] = full_pipe_r(specs[k].d, specs[k].length);
  // Loops as (pipe, sign along the loop): A-B-E-D-A and B-C-F-E-B.
  const std::vector<std::pair<int, int>> loops[2] = {{{0, +1}, {3, -1}, {5, -1}, {2, -1}},
                                                    {{1, -1}, {4, +1}, {6, +1}, {3, +1}}};
  for (int it = 0; it < 200; ++it)
    for (const auto& loop : loops) {
      double num = 0.0, den = 0.0;
      for (auto [k, sg] : loop) {
        num += sg * r[k] * q[k] * std::fabs(q[k]);
        den += 2.0 * r[k] * std::fabs(q[k]);
      }
      const double dq = -num / den;
      for (auto [k, sg] : loop) q[k] += sg * dq;
    }
  for (int k = 0; k < 8; ++k) {
    INFO("pipe P" << k + 1);
    // 0.001 L/s: the solve closes continuity to 1e-7 m3/s here and Hardy Cross converges as far.
    CHECK(s.flow_m3_s[static_cast<std::size_t>(k)] == Approx(q[k]).margin(1e-6));
  }
  // Levels: tailwater + r Q|Q| down the path A -> B -> E -> F -> OF.
  const double h_f = 16.0 + r[7] * q[7] * q[7];
  const double h_e = h_f + r[6] * q[6] * std::fabs(q[6]) * -1.0;
  CHECK(s.level_m[5] == Approx(h_f).margin(1e-3));
  CHECK(s.level_m[4] == Approx(h_e).margin(1e-3));
}
