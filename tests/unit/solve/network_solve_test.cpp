// The network solve on small networks from literals: agreement with the march on trees, loops,
// continuity, and levels consistent with the flows (invariants; invented data, not check values).
#include <catch2/catch.hpp>
#include <cmath>

#include "network_fixture.hpp"
#include "rimline/hydraulics/gvf.hpp"

using namespace rimline;

namespace {

solve::MarchOptions free_outfall() {
  solve::MarchOptions m;
  m.tailwater_mode = solve::TailwaterMode::fixed;
  m.default_k = 0.5;
  return m;
}

// OF <- A <- B <- C, with a branch D -> B.
test::Net small_tree() {
  test::Net t;
  const auto of = t.structure("OF", 10.0, 13.0, model::StructureKind::outfall);
  const auto a = t.structure("A", 10.2, 13.0);
  const auto b = t.structure("B", 10.5, 13.5);
  const auto c = t.structure("C", 10.9, 14.0);
  const auto d = t.structure("D", 10.8, 14.0);
  t.pipe("P1", a, of, 0.6, 10.2, 10.0, 80.0);
  t.pipe("P2", b, a, 0.45, 10.5, 10.25, 90.0);
  t.pipe("P3", c, b, 0.3, 10.9, 10.6, 70.0);
  t.pipe("P4", d, b, 0.3, 10.8, 10.6, 60.0);
  t.inflow = {0.0, 0.05, 0.04, 0.03, 0.02};
  t.build();
  return t;
}

}  // namespace

TEST_CASE("network solve: a tree agrees with the march to 1 mm, through Newton and through known flows") {
  auto t = small_tree();
  for (double tw : {10.3, 11.2}) {  // partly full with a free-ish outlet; drowned (surcharged lower pipes)
    auto m = free_outfall();
    m.tailwater_m = tw;
    const auto marched = solve::march(t.net, t.topo, t.accumulated(), m);
    for (bool reduce : {true, false}) {
      solve::NetworkSolveOptions o;
      o.reduce_bridges = reduce;
      o.all_levels = true;
      const auto s = t.solve(m, o);
      REQUIRE(s.components.size() == 1);
      CHECK(s.components[0].converged);
      for (std::size_t k = 0; k < t.net.structures.size(); ++k) {
        INFO("tw " << tw << " reduce " << reduce << " structure " << t.net.structures[k].id);
        if (t.net.structures[k].kind == model::StructureKind::outfall) continue;
        CHECK(std::fabs(s.level_m[k] - marched.structures[k].hgl_m) < 1e-3);
      }
      const auto q = t.accumulated();
      for (std::size_t ci = 0; ci < q.size(); ++ci) CHECK(std::fabs(s.flow_m3_s[ci] - q[ci]) < 1e-5);
    }
  }
}

TEST_CASE("network solve: a loop splits the flow so that both ways lose the same head") {
  // OF <- A, and B reaches A two ways: directly (P2) and through C (P3, P4).
  test::Net t;
  const auto of = t.structure("OF", 10.0, 14.0, model::StructureKind::outfall);
  const auto a = t.structure("A", 10.2, 14.0);
  const auto b = t.structure("B", 10.6, 14.0);
  const auto c = t.structure("C", 10.4, 14.0);
  t.pipe("P1", a, of, 0.6, 10.2, 10.0, 80.0);
  t.pipe("P2", b, a, 0.3, 10.6, 10.25, 100.0);
  t.pipe("P3", b, c, 0.3, 10.6, 10.45, 60.0);
  t.pipe("P4", c, a, 0.3, 10.4, 10.25, 60.0);
  t.inflow = {0.0, 0.0, 0.12, 0.0};
  t.build();
  auto m = free_outfall();
  m.tailwater_m = 11.5;  // every pipe drowned
  const auto s = t.solve(m);
  REQUIRE(s.components.size() == 1);
  const auto& r = s.components[0];
  CHECK(r.converged);
  CHECK(r.newton_pieces == 1);
  CHECK(r.max_continuity_error_m3_s < 1e-5);
  // Continuity at B, C, A.
  CHECK(std::fabs(s.flow_m3_s[1] + s.flow_m3_s[2] - 0.12) < 1e-5);
  CHECK(std::fabs(s.flow_m3_s[2] - s.flow_m3_s[3]) < 1e-5);
  CHECK(std::fabs(s.flow_m3_s[0] - 0.12) < 1e-5);
  // The shorter direct path takes more.
  CHECK(s.flow_m3_s[1] > s.flow_m3_s[2]);
  CHECK(s.level_m[b] > s.level_m[c]);
  CHECK(s.level_m[c] > s.level_m[a]);
}
