// The march on several threads gives the same results as on one, and thinning the step points of
// undrawn pipes keeps what the checks read. Networks built from literals; figures compared
// between runs of this program, not against a source (an implementation property).
#include <catch2/catch.hpp>
#include <algorithm>
#include <cmath>

#include "rimline/solve/march.hpp"

using namespace rimline;

namespace {

// `trees` independent chains of `length` pipes (enough in all for the threaded path), with a
// diameter change and a steep pipe in each so that profiles differ along a chain.
struct Forest {
  model::Network net;
  topology::Topology topo;
  std::vector<double> flow;
};

Forest forest(std::size_t trees, std::size_t length) {
  Forest f;
  for (std::size_t t = 0; t < trees; ++t) {
    const std::size_t base = f.net.structures.size();
    for (std::size_t k = 0; k <= length; ++k) {
      model::Structure s;
      s.id = "S" + std::to_string(t) + "-" + std::to_string(k);
      s.kind = k == 0 ? model::StructureKind::outfall : model::StructureKind::manhole;
      s.invert_m = 10.0 + 0.3 * static_cast<double>(k);
      s.rim_m = *s.invert_m + 2.5;
      f.net.structures.push_back(s);
    }
    for (std::size_t k = 1; k <= length; ++k) {
      model::Conduit c;
      c.id = "P" + std::to_string(t) + "-" + std::to_string(k);
      c.from = base + k;
      c.to = base + k - 1;
      c.section.diameter_m = k % 7 == 0 ? 0.3 : 0.6;  // an undersized pipe now and then: surcharge
      c.roughness.manning_n = 0.013;
      c.invert_up_m = 10.0 + 0.3 * static_cast<double>(k) - (k % 5 == 0 ? 0.0 : 0.05);
      c.invert_down_m = 10.0 + 0.3 * static_cast<double>(k - 1) + 0.02;
      c.length_m = 60.0;
      if (k % 11 == 0) c.invert_up_m.reset();  // estimated from the structure: a march finding
      f.net.conduits.push_back(c);
      f.flow.push_back(0.05 + 0.01 * static_cast<double>(t % 9) + 0.002 * static_cast<double>(length - k));
    }
  }
  f.topo.nodes.resize(f.net.structures.size());
  for (std::size_t ci = 0; ci < f.net.conduits.size(); ++ci) {
    f.topo.nodes[f.net.conduits[ci].to].inflows.push_back(ci);
    f.topo.nodes[f.net.conduits[ci].from].outflows.push_back(ci);
  }
  f.topo.deflection_deg.assign(f.net.conduits.size(), 0.0);
  return f;
}

}  // namespace

TEST_CASE("march on several threads equals the march on one thread", "[threads]") {
  const auto f = forest(60, 80);  // 4800 pipes: above the single-thread threshold
  solve::MarchOptions one;
  one.threads = 1;
  solve::MarchOptions four;
  four.threads = 4;
  REQUIRE(solve::march_threads(four, f.net.conduits.size()) == 4);
  const auto a = solve::march(f.net, f.topo, f.flow, one);
  const auto b = solve::march(f.net, f.topo, f.flow, four);
  std::size_t solved = 0;
  for (std::size_t ci = 0; ci < f.net.conduits.size(); ++ci) {
    REQUIRE(a.conduits[ci].solved == b.conduits[ci].solved);
    solved += a.conduits[ci].solved ? 1 : 0;
    REQUIRE(a.conduits[ci].profile.points.size() == b.conduits[ci].profile.points.size());
    REQUIRE(a.conduits[ci].profile.inlet().hgl_m == b.conduits[ci].profile.inlet().hgl_m);  // bitwise: same operations
  }
  for (std::size_t s = 0; s < f.net.structures.size(); ++s) REQUIRE(a.structures[s].hgl_m == b.structures[s].hgl_m);
  CHECK(solved == f.net.conduits.size());
  // The same findings; their order is per worker (the run sorts all findings afterwards).
  auto keys = [](const Findings& list) {
    std::vector<std::string> k;
    for (const auto& x : list) k.push_back(x.code + " " + x.feature_id + " " + x.message);
    std::sort(k.begin(), k.end());
    return k;
  };
  CHECK(a.findings.size() > 100);
  CHECK(keys(a.findings) == keys(b.findings));
}

TEST_CASE("small networks march on one thread", "[threads]") {
  solve::MarchOptions o;
  o.threads = 8;
  CHECK(solve::march_threads(o, 100) == 1);
}

TEST_CASE("undrawn pipes keep outlet, inlet and a faster point between; drawn pipes keep every point") {
  const auto f = forest(2, 40);
  solve::MarchOptions all;
  solve::MarchOptions thin;
  thin.keep_step_points.assign(f.net.conduits.size(), false);
  thin.keep_step_points[3] = true;
  const auto a = solve::march(f.net, f.topo, f.flow, all);
  const auto b = solve::march(f.net, f.topo, f.flow, thin);
  std::size_t thinned = 0;
  for (std::size_t ci = 0; ci < f.net.conduits.size(); ++ci) {
    const auto& pa = a.conduits[ci].profile;
    const auto& pb = b.conduits[ci].profile;
    REQUIRE(a.conduits[ci].solved);
    if (ci == 3 || pa.points.size() <= 2) {
      CHECK(pb.points.size() == pa.points.size());
      continue;
    }
    ++thinned;
    // The point between is kept only where it is faster than both ends.
    double ends = std::max(pa.outlet().velocity_m_s, pa.inlet().velocity_m_s);
    bool faster_between = false;
    for (std::size_t k = 1; k + 1 < pa.points.size(); ++k) faster_between |= pa.points[k].velocity_m_s > ends;
    REQUIRE(pb.points.size() == (faster_between ? 3u : 2u));
    CHECK(pb.inlet().hgl_m == pa.inlet().hgl_m);
    CHECK(pb.outlet().egl_m == pa.outlet().egl_m);
    double vmax = 0.0;
    for (const auto& p : pa.points) vmax = std::max(vmax, p.velocity_m_s);
    double vmax_b = 0.0;
    for (const auto& p : pb.points) vmax_b = std::max(vmax_b, p.velocity_m_s);
    CHECK(vmax_b == vmax);
  }
  CHECK(thinned > 10);
  for (std::size_t s = 0; s < f.net.structures.size(); ++s) CHECK(a.structures[s].hgl_m == b.structures[s].hgl_m);
}
