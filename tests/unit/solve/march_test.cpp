// The march over small networks built from literals: hand calculations from the formulas
// (Manning, K V^2/2g) shown in the comments, and the energy invariants.
#include <catch2/catch.hpp>
#include <cmath>

#include "rimline/checks/checks.hpp"
#include "rimline/flows/design_flows.hpp"
#include "rimline/hydraulics/friction.hpp"
#include "rimline/solve/march.hpp"
#include "rimline/units.hpp"

using namespace rimline;

namespace {

constexpr double g = units::gravity_m_s2;

model::Structure structure(const std::string& id, model::StructureKind kind, double invert, double rim) {
  model::Structure s;
  s.id = id;
  s.kind = kind;
  s.invert_m = invert;
  s.rim_m = rim;
  return s;
}

model::Conduit pipe(const std::string& id, std::size_t from, std::size_t to, double dia, double inv_up,
                    double inv_down, double length, double q) {
  model::Conduit c;
  c.id = id;
  c.from = from;
  c.to = to;
  c.section.diameter_m = dia;
  c.roughness.manning_n = 0.013;
  c.invert_up_m = inv_up;
  c.invert_down_m = inv_down;
  c.length_m = length;
  c.flow_m3_s = q;
  return c;
}

// Outfall (0) <- MH-1 (1) <- MH-2 (2), a straight line.
struct Chain {
  model::Network net;
  topology::Topology topo;
};

Chain chain(double q) {
  Chain c;
  c.net.structures = {structure("OF", model::StructureKind::outfall, 10.0, 13.0),
                      structure("MH-1", model::StructureKind::manhole, 10.2, 12.0),
                      structure("MH-2", model::StructureKind::manhole, 10.5, 13.5)};
  c.net.conduits = {pipe("P1", 1, 0, 0.6, 10.2, 10.0, 100.0, q), pipe("P2", 2, 1, 0.6, 10.5, 10.25, 100.0, q)};
  c.topo.nodes.resize(3);
  c.topo.nodes[0].inflows = {0};
  c.topo.nodes[0].outfall = true;
  c.topo.nodes[1].inflows = {1};
  c.topo.nodes[1].outflows = {0};
  c.topo.nodes[2].outflows = {1};
  c.topo.deflection_deg = {NAN, 0.0};
  return c;
}

}  // namespace

TEST_CASE("march: a drowned pipe runs full; HGL by Manning full-flow slope, structure by K V^2/2g") {
  auto c = chain(0.5);
  solve::MarchOptions opt;
  opt.tailwater_mode = solve::TailwaterMode::fixed;
  opt.tailwater_m = 11.5;  // 0.9 m above the outlet crown (10.6): P1 is full end to end
  opt.default_k = 0.5;
  const std::vector<double> q{0.5, 0.5};
  const auto r = solve::march(c.net, c.topo, q, opt);
  REQUIRE(r.conduits[0].solved);
  // Hand calculation (Manning, SI): A = pi 0.6^2/4 = 0.282743 m2, R = D/4 = 0.15 m,
  // V = Q/A = 1.768388 m/s, Sf = (n V / R^(2/3))^2 = (0.013 * 1.768388 / 0.282311)^2 = 0.0066311,
  // hf = 100 Sf = 0.66311 m -> HGL at the inlet = 11.5 + 0.66311 = 12.16311 m.
  const double area = M_PI * 0.36 / 4.0;
  const double v = 0.5 / area;
  const double sf = std::pow(0.013 * v / std::pow(0.15, 2.0 / 3.0), 2.0);
  CHECK(r.conduits[0].profile.outlet().hgl_m == Approx(11.5).margin(0.001));
  CHECK(r.conduits[0].profile.inlet().hgl_m == Approx(11.5 + 100.0 * sf).margin(0.001));
  CHECK(r.conduits[0].profile.inlet().hgl_m == Approx(12.1631).margin(0.001));
  // MH-1 is a still pool at the inlet EGL plus K V^2/2g: 12.16311 + 1.5 * 0.159441 = 12.40227 m.
  const double vh = v * v / (2.0 * g);
  CHECK(r.structures[1].hgl_m == Approx(11.5 + 100.0 * sf + vh + 0.5 * vh).margin(0.001));
  CHECK(r.structures[1].hgl_m == Approx(12.4023).margin(0.001));

  // MH-1's rim is 12.0 m: the HGL stands above it -> FLOODED at MH-1.
  checks::Criteria crit;
  const auto findings = checks::run_checks(c.net, r, crit);
  bool flooded = false, surcharged = false;
  for (const auto& f : findings) {
    if (f.code == "FLOODED" && f.feature_id == "MH-1") {
      flooded = true;
      CHECK(f.value == Approx(12.0 - r.structures[1].hgl_m));
    }
    if (f.code == "SURCHARGED" && f.feature_id == "P1") surcharged = true;
  }
  CHECK(flooded);
  CHECK(surcharged);
}

TEST_CASE("march: energy invariants along every pipe and across every structure") {
  for (double tw : {9.0, 10.3, 10.8, 11.6}) {
    auto c = chain(0.25);
    solve::MarchOptions opt;
    opt.tailwater_m = tw;
    const auto r = solve::march(c.net, c.topo, {0.25, 0.25}, opt);
    for (std::size_t i = 0; i < c.net.conduits.size(); ++i) {
      const auto& cr = r.conduits[i];
      REQUIRE(cr.solved);
      for (const auto& p : cr.profile.points)
        CHECK(p.egl_m - p.hgl_m == Approx(p.velocity_m_s * p.velocity_m_s / (2.0 * g)).margin(1e-9));
      // EGL never rises downstream: inlet >= outlet >= the pool it discharges into.
      CHECK(cr.profile.inlet().egl_m >= cr.profile.outlet().egl_m - 1e-9);
      CHECK(cr.profile.outlet().egl_m >= r.structures[c.net.conduits[i].to].egl_m - 1e-9);
      CHECK(r.structures[c.net.conduits[i].from].egl_m >= cr.profile.inlet().egl_m - 1e-9);
    }
    // The budget from MH-2 down adds up to its level exactly.
    double sum = 0.0;
    for (const auto& item : solve::loss_budget(c.net, r, 2)) sum += item.head_m;
    CHECK(sum == Approx(r.structures[2].hgl_m).margin(1e-9));
    // The HGL meets the tailwater at the outfall (when the tailwater is above the free-outlet level).
    if (tw > 10.6) CHECK(r.structures[0].hgl_m == Approx(tw).margin(1e-9));
  }
}

TEST_CASE("march: a missing invert is estimated from the structure or the neighbouring pipes, and said so") {
  auto c = chain(0.25);
  c.net.conduits[0].invert_up_m.reset();
  c.net.conduits[0].invert_down_m.reset();
  c.net.structures[1].invert_m.reset();
  solve::MarchOptions opt;
  opt.tailwater_m = 11.0;
  const auto r = solve::march(c.net, c.topo, {0.25, 0.25}, opt);
  REQUIRE(r.conduits[0].solved);
  // Downstream end: the outfall's own invert (10.0); upstream end: P2's outlet invert at MH-1 (10.25).
  CHECK(r.conduits[0].invert_down_m == Approx(10.0));
  CHECK(r.conduits[0].invert_up_m == Approx(10.25));
  CHECK(r.conduits[1].solved);
  int estimated = 0;
  for (const auto& f : r.findings)
    if (f.code == "INVERT_ESTIMATED" && f.feature_id == "P1") ++estimated;
  CHECK(estimated == 2);
}

TEST_CASE("march: a pipe with no invert anywhere near it blocks what lies upstream, and says so") {
  auto c = chain(0.25);
  for (auto& p : c.net.conduits) p.invert_up_m.reset(), p.invert_down_m.reset();
  for (auto& s : c.net.structures) s.invert_m.reset();
  solve::MarchOptions opt;
  opt.tailwater_m = 11.0;
  const auto r = solve::march(c.net, c.topo, {0.25, 0.25}, opt);
  CHECK_FALSE(r.conduits[0].solved);
  CHECK_FALSE(r.structures[1].solved);
  CHECK_FALSE(r.conduits[1].solved);
  bool blocked = false, structure_reported = false;
  for (const auto& f : r.findings) {
    if (f.code == "NOT_CHECKED" && f.feature_id == "P1") blocked = true;
    if (f.code == "NOT_CHECKED" && f.feature_id == "MH-2") structure_reported = true;
  }
  CHECK(blocked);
  CHECK(structure_reported);
}

TEST_CASE("flows: structure inflows accumulate downstream and split at a diversion by capacity") {
  // S0 (outfall A) <- S1 -> S2 (outfall B); S3 -> S1. S1 diverts to both outfalls.
  model::Network net;
  net.structures = {structure("A", model::StructureKind::outfall, 9.0, 12.0),
                    structure("S1", model::StructureKind::manhole, 10.0, 13.0),
                    structure("B", model::StructureKind::outfall, 9.0, 12.0),
                    structure("S3", model::StructureKind::manhole, 11.0, 14.0)};
  net.structures[1].inflow_m3_s = 0.1;
  net.structures[3].inflow_m3_s = 0.2;
  net.conduits = {pipe("to-A", 1, 0, 0.6, 10.0, 9.0, 100.0, 0.0), pipe("to-B", 1, 2, 0.3, 10.0, 9.0, 100.0, 0.0),
                  pipe("in", 3, 1, 0.6, 11.0, 10.0, 100.0, 0.0)};
  topology::Topology topo;
  topo.nodes.resize(4);
  topo.nodes[0].inflows = {0};
  topo.nodes[1].inflows = {2};
  topo.nodes[1].outflows = {0, 1};
  topo.nodes[2].inflows = {1};
  topo.nodes[3].outflows = {2};
  Findings findings;
  flows::FlowOptions fo;
  fo.mode = flows::Mode::structure_inflows;
  const auto f = flows::design_flows(net, topo, fo, findings);
  CHECK(f.flow_m3_s[2] == Approx(0.2));
  // Same slope and n: full capacity scales as D^(8/3) (Manning), so the 0.6 m pipe takes
  // 2^(8/3) = 6.3496 times the 0.3 m pipe's share: 0.3 * 6.3496/7.3496 = 0.25918 m3/s.
  CHECK(f.flow_m3_s[0] == Approx(0.3 * std::pow(2.0, 8.0 / 3.0) / (1.0 + std::pow(2.0, 8.0 / 3.0))).epsilon(1e-9));
  CHECK(f.flow_m3_s[0] + f.flow_m3_s[1] == Approx(0.3));
}

// A pump wet well at its pump-on level backs water up into the arriving sewer:
// MH-1 -P1-> WW =FM=> OF. P1 0.3 m, outlet invert 10.0 m; pump-on level 10.5 m, above P1's crown
// (10.3 m), so P1's outlet runs full with its HGL at 10.5 m, and WW reports 10.5 m. Without a
// level the wet well takes P1's free outfall (its outlet level, below the crown).
TEST_CASE("a wet well at its pump-on level sets the arriving pipe's downstream level", "[march][pump]") {
  model::Network net;
  net.structures = {structure("OF", model::StructureKind::outfall, 14.0, 16.0),
                    structure("WW", model::StructureKind::pump_station, 9.0, 14.0),
                    structure("MH-1", model::StructureKind::manhole, 10.4, 14.0)};
  auto p1 = pipe("P1", 2, 1, 0.3, 10.4, 10.0, 80.0, 0.03);
  auto fm = pipe("FM", 1, 0, 0.15, 9.5, 14.0, 300.0, 0.03);
  fm.force_main = true;
  net.conduits = {p1, fm};
  topology::Topology topo;
  topo.nodes.resize(3);
  topo.nodes[0].inflows = {1};
  topo.nodes[0].outfall = true;
  topo.nodes[1].inflows = {0};
  topo.nodes[1].outflows = {1};
  topo.nodes[2].outflows = {0};
  topo.deflection_deg = {0.0, 0.0};
  const std::vector<double> q{0.03, 0.03};

  solve::MarchOptions free_ww;
  const auto a = solve::march(net, topo, q, free_ww);
  REQUIRE(a.structures[1].pumped);
  REQUIRE(a.conduits[0].solved);
  CHECK(a.conduits[0].profile.outlet().hgl_m < 10.3);

  solve::MarchOptions at_level;
  at_level.wet_well_level_m[1] = 10.5;
  const auto b = solve::march(net, topo, q, at_level);
  CHECK(b.structures[1].hgl_m == Approx(10.5));
  CHECK(b.conduits[0].downstream_level_m == Approx(10.5));
  CHECK(b.conduits[0].profile.outlet().hgl_m == Approx(10.5));
  CHECK(b.conduits[0].profile.outlet().full);
  CHECK(b.structures[2].hgl_m > 10.5);  // MH-1 above the backed-up pipe
}
