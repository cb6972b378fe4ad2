// Structure-energy bookkeeping worked by hand (closed form) on chains of manholes.
//
// Sources of the formulas the hand calculations use:
//   - Manning's equation, SI form, full flow: Sf = (n V / R^(2/3))^2 with R = D/4 (Manning 1891; any
//     hydraulics text, e.g. Chow, Open-Channel Hydraulics, 1959, eq. 5-7);
//   - a structure's K multiplies the outflow pipe's velocity head and gives the whole energy loss
//     across the structure (the definition of the tabulated manhole / junction K values, e.g. FHWA
//     HEC-22, 2nd ed. 2001, Table 7-5 - from memory);
//   - EGL = HGL + V^2/2g; the circular-segment area A = D^2/8 (t - sin t), t = 2 acos(1 - 2y/D).
// The networks are invented (inverts, flows, K): only the formulas are checks, no value is taken
// from the networks themselves.
#include <catch2/catch.hpp>
#include <cmath>
#include <string>
#include <vector>

#include "rimline/solve/march.hpp"
#include "rimline/units.hpp"

using namespace rimline;

namespace {

constexpr double g = units::gravity_m_s2;
constexpr double n = 0.013;
constexpr double k = 0.5;

// OF (0) <- MH-1 (1) <- MH-2 (2) <- ... <- MH-m (m): one pipe per link, pipe i from MH-(i+1) to i.
struct Chain {
  model::Network net;
  topology::Topology topo;
  std::vector<double> flow;
};

Chain chain(const std::vector<double>& dia, const std::vector<double>& q, double slope, double length,
            double drop_at_structures) {
  Chain c;
  const std::size_t m = dia.size();
  double invert = 10.0;
  c.net.structures.resize(m + 1);
  c.topo.nodes.resize(m + 1);
  for (std::size_t s = 0; s <= m; ++s) {
    auto& st = c.net.structures[s];
    st.id = s == 0 ? "OF" : "MH-" + std::to_string(s);
    st.kind = s == 0 ? model::StructureKind::outfall : model::StructureKind::manhole;
  }
  c.net.structures[0].invert_m = invert;
  for (std::size_t i = 0; i < m; ++i) {
    model::Conduit p;
    p.id = "P" + std::to_string(i + 1);
    p.from = i + 1;
    p.to = i;
    p.section.diameter_m = dia[i];
    p.roughness.manning_n = n;
    p.invert_down_m = invert;
    p.invert_up_m = invert + slope * length;
    p.length_m = length;
    invert = *p.invert_up_m + drop_at_structures;
    c.net.structures[i + 1].invert_m = *p.invert_up_m;
    c.net.conduits.push_back(p);
    c.topo.nodes[i].inflows = {i};
    c.topo.nodes[i + 1].outflows = {i};
  }
  c.topo.nodes[0].outfall = true;
  c.topo.deflection_deg.assign(m, 0.0);
  c.flow = q;
  return c;
}

solve::MarchOptions options(hydraulics::StructureEnergy e, double tailwater) {
  solve::MarchOptions o;
  o.tailwater_mode = solve::TailwaterMode::fixed;
  o.tailwater_m = tailwater;
  o.default_k = k;
  o.structure_energy = e;
  return o;
}

double full_velocity(double d, double q) { return q / (M_PI * d * d / 4.0); }
double full_friction_slope(double d, double q) {
  return std::pow(n * full_velocity(d, q) / std::pow(d / 4.0, 2.0 / 3.0), 2.0);
}

// Circular segment, and Manning's normal depth by bisection (independent of rimline's solvers).
double segment_area(double d, double y) {
  const double t = 2.0 * std::acos(1.0 - 2.0 * y / d);
  return d * d / 8.0 * (t - std::sin(t));
}
double normal_depth(double d, double q, double s) {
  double lo = 1e-9, hi = 0.93 * d;
  for (int i = 0; i < 200; ++i) {
    const double y = 0.5 * (lo + hi);
    const double a = segment_area(d, y);
    const double p = d * std::acos(1.0 - 2.0 * y / d);
    (a * std::pow(a / p, 2.0 / 3.0) * std::sqrt(s) / n < q ? lo : hi) = y;
  }
  return 0.5 * (lo + hi);
}

// A four-manhole surcharged chain: 750/600/600/450 mm, flows 0.50/0.40/0.30/0.20 m3/s, 80 m
// pipes at 0.2 %, a tailwater of 13.0 m, well above every crown, so each pipe runs full end to end.
Chain surcharged() { return chain({0.75, 0.6, 0.6, 0.45}, {0.5, 0.4, 0.3, 0.2}, 0.002, 80.0, 0.0); }

}  // namespace

TEST_CASE("bookkeeping whole_loss: a surcharged chain of four manholes by hand") {
  auto c = surcharged();
  const auto r = solve::march(c.net, c.topo, c.flow, options(hydraulics::StructureEnergy::whole_loss, 13.0));
  // By hand: EGL at P1's outlet = TW + V1^2/2g (it discharges into the outfall's water); along
  // each pipe the EGL rises by Sf L; at each manhole by K V^2/2g of the pipe leaving it; the pipe
  // arriving there has its EGL at its outlet equal to the manhole's level (the whole loss is in K).
  double egl = 13.0;
  for (std::size_t i = 0; i < 4; ++i) {
    const double d = c.net.conduits[i].section.diameter_m, q = c.flow[i];
    const double hv = std::pow(full_velocity(d, q), 2.0) / (2.0 * g);
    const auto& pr = r.conduits[i].profile;
    REQUIRE(r.conduits[i].solved);
    REQUIRE(pr.surcharged_length_m == Approx(80.0).margin(1e-6));
    if (i == 0) egl += hv;  // the exit into the receiving water
    CHECK(pr.outlet().egl_m == Approx(egl).margin(1e-6));
    CHECK(pr.outlet().hgl_m == Approx(egl - hv).margin(1e-6));
    egl += full_friction_slope(d, q) * 80.0;
    CHECK(pr.inlet().egl_m == Approx(egl).margin(1e-6));
    egl += k * hv;
    const auto& mh = r.structures[i + 1];
    CHECK(mh.egl_m == Approx(egl).margin(1e-6));
    CHECK(mh.hgl_m == Approx(egl).margin(1e-6));  // still water in the manhole: its level is its energy
    CHECK(mh.loss_m == Approx(k * hv).margin(1e-9));
    CHECK(mh.outflow_velocity_m_s == Approx(full_velocity(d, q)).epsilon(1e-9));
  }
  // The budget of MH-4 adds the terms up to its level, and no exit head is booked at a manhole.
  double sum = 0.0;
  for (const auto& item : solve::loss_budget(c.net, r, 4)) {
    sum += item.head_m;
    if (item.kind == "exit" && item.feature_id != "P1") CHECK(item.head_m == Approx(0.0).margin(1e-9));
  }
  CHECK(sum == Approx(r.structures[4].hgl_m).margin(1e-9));
}

TEST_CASE("bookkeeping still_pool: the same chain loses every arriving velocity head as well") {
  auto c = surcharged();
  const auto whole = solve::march(c.net, c.topo, c.flow, options(hydraulics::StructureEnergy::whole_loss, 13.0));
  const auto pool = solve::march(c.net, c.topo, c.flow, options(hydraulics::StructureEnergy::still_pool, 13.0));
  // By hand: each manhole's level is the arriving pipe's outlet HGL, so level_k = level_(k-1) +
  // V_k^2/2g + Sf_k L + K V_k^2/2g (the level_0 = TW): (1 + K) velocity heads per structure.
  double level = 13.0, extra = 0.0;
  for (std::size_t i = 0; i < 4; ++i) {
    const double d = c.net.conduits[i].section.diameter_m, q = c.flow[i];
    const double hv = std::pow(full_velocity(d, q), 2.0) / (2.0 * g);
    CHECK(pool.conduits[i].profile.outlet().hgl_m == Approx(level).margin(1e-6));
    level += hv + full_friction_slope(d, q) * 80.0 + k * hv;
    CHECK(pool.structures[i + 1].hgl_m == Approx(level).margin(1e-6));
    // The difference from whole_loss is the sum of the arriving velocity heads above the outfall pipe.
    if (i > 0) extra += hv;
    CHECK(pool.structures[i + 1].hgl_m - whole.structures[i + 1].hgl_m == Approx(extra).margin(1e-6));
  }
  double sum = 0.0;
  for (const auto& item : solve::loss_budget(c.net, pool, 4)) sum += item.head_m;
  CHECK(sum == Approx(pool.structures[4].hgl_m).margin(1e-9));
}

TEST_CASE("bookkeeping per structure: one manhole kept as a still pool") {
  auto c = surcharged();
  auto opt = options(hydraulics::StructureEnergy::whole_loss, 13.0);
  opt.structure_energy_at[2] = hydraulics::StructureEnergy::still_pool;  // MH-2 only
  const auto mixed = solve::march(c.net, c.topo, c.flow, opt);
  const auto whole = solve::march(c.net, c.topo, c.flow, options(hydraulics::StructureEnergy::whole_loss, 13.0));
  // Only P3, arriving at MH-2, loses its velocity head: MH-3 and MH-4 stand higher by V3^2/2g.
  const double hv3 = std::pow(full_velocity(0.6, 0.3), 2.0) / (2.0 * g);
  CHECK(mixed.structures[2].hgl_m == Approx(whole.structures[2].hgl_m).margin(1e-9));
  CHECK(mixed.structures[3].hgl_m - whole.structures[3].hgl_m == Approx(hv3).margin(1e-6));
  CHECK(mixed.structures[4].hgl_m - whole.structures[4].hgl_m == Approx(hv3).margin(1e-6));
  CHECK(mixed.structures[2].energy == hydraulics::StructureEnergy::still_pool);
  CHECK(mixed.structures[3].energy == hydraulics::StructureEnergy::whole_loss);
}

TEST_CASE("bookkeeping: a partly-full chain at normal depth, and an arriving pipe's outlet by specific energy") {
  // Three 0.6 m pipes at 0.2 %, 400 m long, 0.15 m3/s (mild: y_n 0.316 m > y_c 0.249 m), free
  // outfall: each pipe reaches normal depth upstream (an M2 curve from the free outlet, or an M1 from
  // the manhole below), so by hand each manhole's level is the leaving pipe's inlet invert
  // + y_n + (1 + K) V_n^2/2g, whatever the bookkeeping.
  const double d = 0.6, q = 0.15, s = 0.002;
  const double yn = normal_depth(d, q, s);
  const double vn = q / segment_area(d, yn);
  for (auto e : {hydraulics::StructureEnergy::whole_loss, hydraulics::StructureEnergy::still_pool}) {
    auto c = chain({d, d, d}, {q, q, q}, s, 400.0, 0.0);
    auto opt = options(e, NAN);
    opt.tailwater_mode = solve::TailwaterMode::free;
    const auto r = solve::march(c.net, c.topo, c.flow, opt);
    for (std::size_t i = 0; i < 3; ++i) {
      REQUIRE(r.conduits[i].solved);
      const double level = *c.net.conduits[i].invert_up_m + yn + (1.0 + k) * vn * vn / (2.0 * g);
      // The step profile approaches normal depth asymptotically: 1 mm over 400 m.
      CHECK(r.structures[i + 1].hgl_m == Approx(level).margin(0.001));
    }
    // At MH-1 the pipe P2 arrives. whole_loss: its outlet EGL is MH-1's level, so its outlet depth
    // y solves y + Q^2/(2 g A(y)^2) = E - z (specific energy, subcritical root), found here by
    // bisection on the circular segment. still_pool: its outlet HGL is MH-1's level.
    const auto& out = r.conduits[1].profile.outlet();
    const double e_mh1 = r.structures[1].egl_m, z = *c.net.conduits[1].invert_down_m;
    if (e == hydraulics::StructureEnergy::whole_loss) {
      double lo = 0.3, hi = 0.599;  // above normal depth (0.316 m) and below the crown
      for (int it = 0; it < 200; ++it) {
        const double y = 0.5 * (lo + hi), a = segment_area(d, y);
        (y + q * q / (2.0 * g * a * a) < e_mh1 - z ? lo : hi) = y;
      }
      CHECK(out.depth_m == Approx(lo).margin(1e-6));
      CHECK(out.egl_m == Approx(e_mh1).margin(1e-9));
      CHECK(r.conduits[1].outlet_energy_control);
    } else {
      CHECK(out.hgl_m == Approx(e_mh1).margin(1e-9));
      CHECK_FALSE(r.conduits[1].outlet_energy_control);
    }
  }
}

TEST_CASE("bookkeeping whole_loss: below the arriving pipe's critical energy it falls freely into the structure") {
  // A 0.6 m drop at MH-1: P2's outlet invert stands 0.6 m above P1's inlet, so MH-1's energy level
  // lies below P2's outlet invert + critical specific energy: critical depth governs at its outlet,
  // and the fall is an exit item of the budget (outlet EGL above the manhole's level).
  auto c = chain({0.6, 0.6}, {0.15, 0.15}, 0.002, 100.0, 0.6);
  auto opt = options(hydraulics::StructureEnergy::whole_loss, NAN);
  opt.tailwater_mode = solve::TailwaterMode::free;
  const auto r = solve::march(c.net, c.topo, c.flow, opt);
  const auto& pr = r.conduits[1].profile;
  CHECK(pr.free_outlet);
  CHECK(pr.outlet().depth_m == Approx(pr.critical_depth_m).margin(1e-9));
  CHECK(pr.outlet().egl_m > r.structures[1].egl_m);
  double sum = 0.0;
  for (const auto& item : solve::loss_budget(c.net, r, 2)) sum += item.head_m;
  CHECK(sum == Approx(r.structures[2].hgl_m).margin(1e-9));
}
