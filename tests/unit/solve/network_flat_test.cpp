// Invariants of the network solve on invented networks (not check values): a flat looped grid
// draining to one pumped outlet, with a third of its pipes digitised against the way they flow,
// and generated trees that must agree with the march.
#include <catch2/catch.hpp>
#include <cmath>
#include <cstdint>

#include "network_fixture.hpp"
#include "rimline/hydraulics/gvf.hpp"
#include "rimline/hydraulics/losses.hpp"
#include "rimline/topology/orient.hpp"

using namespace rimline;

namespace {

// A small deterministic generator (the standard distributions differ between libraries).
struct Lcg {
  std::uint64_t s;
  double next() {
    s = s * 6364136223846793005ULL + 1442695040888963407ULL;
    return static_cast<double>(s >> 11) / 9007199254740992.0;
  }
  double in(double a, double b) { return a + (b - a) * next(); }
};

// The level the upstream structure needs to pass q through pipe ci into level h_down: the same
// relation the march uses (inlet EGL + K V^2/2g), recomputed here from the hydraulics alone.
// `energy`: the receiving structure keeps the whole loss across it (the default bookkeeping, README
// "How the march works"): the pipe's outlet EGL is its level; into the wet well, its water level.
double needed_level(const model::Conduit& c, double z_up, double z_down, double q, double h_down, double k,
                    bool energy) {
  const hydraulics::ConduitReach reach{c.section, c.roughness, c.length_m, z_up, z_down, q};
  const auto p = energy ? hydraulics::compute_profile_to_energy(reach, h_down) : hydraulics::compute_profile(reach, h_down);
  return p.inlet().egl_m + k * hydraulics::velocity_head_m(p.inlet().velocity_m_s);
}

}  // namespace

TEST_CASE("network solve: a flat looped grid to one pumped outlet converges, closes continuity, levels fit the flows") {
  // 6 x 5 manholes 80 m apart, inverts 2.00 m +- 5 cm, every neighbour joined; a wet well at one
  // corner lifts everything through a force main. Pipes are digitised towards the wet well by
  // their grid distance, except every third, digitised away from it.
  test::Net t;
  Lcg rng{7};
  const int nx = 6, ny = 5;
  for (int j = 0; j < ny; ++j)
    for (int i = 0; i < nx; ++i) {
      const auto s = t.structure("M" + std::to_string(i) + "-" + std::to_string(j), 2.0 + rng.in(-0.05, 0.05), 4.5,
                                 model::StructureKind::manhole, {80.0 * i, 80.0 * j});
      t.inflow[s] = rng.in(0.005, 0.020);
    }
  const auto ww = t.structure("WW", 1.2, 4.5, model::StructureKind::pump_station, {-60.0, 0.0});
  const auto rising = t.structure("RISE", 6.0, 7.0, model::StructureKind::manhole, {-500.0, 0.0});
  auto id = [nx](int i, int j) { return static_cast<std::size_t>(j * nx + i); };
  auto distance = [](int i, int j) { return i + j; };
  int count = 0;
  auto join = [&](int i1, int j1, int i2, int j2) {
    std::size_t a = id(i1, j1), b = id(i2, j2);
    if (distance(i1, j1) < distance(i2, j2)) std::swap(a, b);  // a farther from the wet well
    if (count++ % 3 == 0) std::swap(a, b);                       // every third against
    const double d = rng.next() < 0.5 ? 0.45 : 0.6;
    t.pipe("P" + std::to_string(count), a, b, d, *t.net.structures[a].invert_m, *t.net.structures[b].invert_m, 80.0);
  };
  for (int j = 0; j < ny; ++j)
    for (int i = 0; i < nx; ++i) {
      if (i + 1 < nx) join(i, j, i + 1, j);
      if (j + 1 < ny) join(i, j, i, j + 1);
    }
  t.pipe("P-WW", id(0, 0), ww, 0.9, 1.95, 1.9, 60.0);
  const auto fm = t.pipe("FM", ww, rising, 0.3, 1.2, 6.0, 440.0);
  t.net.conduits[fm].force_main = true;
  t.build();
  solve::MarchOptions m;
  m.default_k = 0.5;
  m.wet_well_level_m[ww] = 2.6;  // pump-on level: every pipe near the wet well runs drowned
  solve::NetworkInputs in;
  const auto comps = t.components(in);
  REQUIRE(comps.size() == 1);
  REQUIRE(in.outlet[ww]);
  solve::NetworkSolveOptions o;
  o.all_levels = true;
  const auto s = solve::solve_network(t.net, t.topo, comps, in, m, o);
  const auto& rep = s.components[0];
  INFO("Newton steps " << rep.iterations << ", largest continuity error " << rep.max_continuity_error_m3_s
                       << " m3/s, profiles " << rep.evaluations);
  CHECK(rep.converged);
  CHECK(rep.newton_pieces == 1);
  // Continuity at every structure to 0.1 L/s.
  std::vector<double> balance = t.inflow;
  for (std::size_t ci = 0; ci < t.net.conduits.size(); ++ci) {
    const auto& c = t.net.conduits[ci];
    if (c.force_main) continue;
    balance[c.from] -= s.flow_m3_s[ci];
    balance[c.to] += s.flow_m3_s[ci];
  }
  double total = 0.0;
  for (std::size_t k = 0; k < balance.size(); ++k) {
    if (k == ww || k == rising) continue;
    CHECK(std::fabs(balance[k]) < 1e-4);
    total += t.inflow[k];
  }
  CHECK(std::fabs(balance[ww] - total) < 1e-4);  // all of it reaches the wet well
  // Every pipe: the water runs from the higher level to the lower, and the upstream level is the one
  // its flow needs (1 mm); a third or so of the pipes flow against their digitised direction.
  int against = 0, pipes = 0;
  for (std::size_t ci = 0; ci < t.net.conduits.size(); ++ci) {
    const auto& c = t.net.conduits[ci];
    if (c.force_main) continue;
    ++pipes;
    const double q = s.flow_m3_s[ci];
    const bool forward = q >= 0.0;
    const std::size_t up = forward ? c.from : c.to, down = forward ? c.to : c.from;
    const double z_up = forward ? *c.invert_up_m : *c.invert_down_m, z_down = forward ? *c.invert_down_m : *c.invert_up_m;
    INFO("pipe " << c.id << " q " << q);
    if (std::fabs(q) < 1e-6) {
      CHECK(s.level_m[up] <= std::max({s.level_m[down], z_up, z_down}) + 1e-3);
      continue;
    }
    against += forward ? 0 : 1;
    CHECK(s.level_m[up] > s.level_m[down]);
    const double k = up == ww ? 0.0 : 0.5;
    CHECK(std::fabs(needed_level(c, z_up, z_down, std::fabs(q), s.level_m[down], k, down != ww) - s.level_m[up]) < 1e-3);
  }
  CHECK(against * 4 >= pipes);      // at least a quarter ...
  CHECK(against * 2 <= pipes);      // ... and at most half flow against their digitised direction
}

TEST_CASE("network solve: generated trees agree with the march to 1 mm, Newton on every level") {
  for (std::uint64_t seed : {1u, 2u, 3u}) {
    test::Net t;
    Lcg rng{seed};
    const auto of = t.structure("OF", 10.0, 14.0, model::StructureKind::outfall);
    const int n = 40;
    std::vector<double> invert{10.0};
    for (int k = 1; k <= n; ++k) {
      const std::size_t down = k == 1 ? of : static_cast<std::size_t>(1 + static_cast<int>(rng.next() * (k - 1)));
      const double length = rng.in(30.0, 90.0);
      const double slope = rng.in(-0.001, 0.01);  // a few adverse
      const double z_down = invert[down] + (down == of ? 0.0 : 0.03);
      const double z_up = z_down + slope * length;
      const auto s = t.structure("S" + std::to_string(k), z_up, z_up + rng.in(1.5, 3.0));
      invert.push_back(z_up);
      t.inflow[s] = rng.in(0.0, 0.03);
      const double d = 0.3 + 0.15 * std::floor(rng.in(0.0, 4.0));
      t.pipe("P" + std::to_string(k), s, down, d, z_up, z_down, length);
    }
    t.build();
    const auto q = t.accumulated();
    for (double tw : {10.2, 11.5}) {
      solve::MarchOptions m;
      m.tailwater_mode = solve::TailwaterMode::fixed;
      m.tailwater_m = tw;
      const auto marched = solve::march(t.net, t.topo, q, m);
      solve::NetworkSolveOptions o;
      o.reduce_bridges = false;
      o.all_levels = true;
      const auto s = t.solve(m, o);
      CHECK(s.components[0].converged);
      for (std::size_t k = 1; k < t.net.structures.size(); ++k) {
        INFO("seed " << seed << " tailwater " << tw << " structure " << t.net.structures[k].id);
        REQUIRE(marched.structures[k].solved);
        CHECK(std::fabs(s.level_m[k] - marched.structures[k].hgl_m) < 1e-3);
      }
    }
  }
}
