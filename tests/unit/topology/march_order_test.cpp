// Nodes, outfalls, diversions, loops, parallels and the march order of the trees, on literal
// networks linked by id. Expected values follow from the construction and from the graph
// definitions in build.hpp; no outside data.
#include <catch2/catch.hpp>

#include <map>
#include <string>

#include "rimline/topology/build.hpp"
#include "rimline/topology/plan_geometry.hpp"

using namespace rimline;
using model::no_index;
using model::Point2;
using topology::MarchStatus;

namespace {

// Structures at the given points; pipes as straight lines between them, linked by id.
struct Net {
  model::Network n;
  std::map<std::string, Point2> at;
  Net& node(const std::string& id, double x, double y) {
    model::Structure s;
    s.id = id;
    s.location = {x, y};
    n.structures.push_back(s);
    at[id] = {x, y};
    return *this;
  }
  Net& link(const std::string& id, const std::string& from, const std::string& to, double diameter_m = 0.3) {
    model::Conduit c;
    c.id = id;
    c.from_id = from;
    c.to_id = to;
    c.section.diameter_m = diameter_m;
    topology::set_plan_geometry(c, {at[from], at[to]});
    n.conduits.push_back(c);
    return *this;
  }
  std::size_t s(const std::string& id) const { return model::find_structure(n, id); }
  std::size_t c(const std::string& id) const {
    for (std::size_t i = 0; i < n.conduits.size(); ++i)
      if (n.conduits[i].id == id) return i;
    return no_index;
  }
};

std::vector<const Finding*> with_code(const Findings& fs, const std::string& code) {
  std::vector<const Finding*> out;
  for (const Finding& f : fs)
    if (f.code == code) out.push_back(&f);
  return out;
}

// The march-order property of build.hpp, checked for every tree of t.
void check_march_order(const model::Network& n, const topology::Topology& t) {
  for (std::size_t k = 0; k < t.trees.size(); ++k) {
    const topology::Tree& tree = t.trees[k];
    REQUIRE(!tree.structures.empty());
    CHECK(tree.structures.front() == tree.outfall);
    std::map<std::size_t, std::size_t> s_pos, c_pos;
    for (std::size_t i = 0; i < tree.structures.size(); ++i) s_pos[tree.structures[i]] = i;
    for (std::size_t i = 0; i < tree.conduits.size(); ++i) c_pos[tree.conduits[i]] = i;
    // Each structure after every structure of the same tree its outflows drain into.
    for (std::size_t s : tree.structures)
      for (std::size_t out : t.nodes[s].outflows)
        if (s_pos.count(n.conduits[out].to)) CHECK(s_pos[n.conduits[out].to] < s_pos[s]);
    std::size_t last_down = 0;
    for (std::size_t c : tree.conduits) {
      const std::size_t d = n.conduits[c].to;
      REQUIRE(s_pos.count(d) == 1);      // the downstream structure is in this tree
      CHECK(s_pos[d] >= last_down);      // conduits grouped in structure order
      last_down = s_pos[d];
      for (std::size_t out : t.nodes[d].outflows)  // after every conduit it drains into
        if (c_pos.count(out)) CHECK(c_pos[out] < c_pos[c]);
      CHECK(t.conduit_tree[c] == k);
    }
  }
}

}  // namespace

TEST_CASE("a diversion keeps both outflows; its structure joins the tree of the larger one") {
  Net g;
  g.node("S1", 0, 0).node("S2", 10, 0).node("S3", 0, 10).node("O1", 20, 0).node("O2", 0, 20);
  g.link("Pmain", "S1", "S2", 0.6).link("Pside", "S1", "S3", 0.3).link("P2", "S2", "O1").link("P3", "S3", "O2");
  Findings fs;
  const auto t = topology::build_topology(g.n, {}, fs);
  const auto& s1 = t.nodes[g.s("S1")];
  CHECK(s1.diversion);
  CHECK(s1.outflows.size() == 2);
  CHECK(s1.main_outflow == g.c("Pmain"));
  const auto div = with_code(fs, "DIVERSION");
  REQUIRE(div.size() == 1);
  CHECK(div[0]->layer == LayerRole::structures);
  CHECK(div[0]->feature_id == "S1");
  CHECK(div[0]->severity == Severity::info);
  CHECK(div[0]->message == "structure S1 has 2 outflow pipes; the largest, Pmain, is its main outflow");
  REQUIRE(t.trees.size() == 2);
  CHECK(t.nodes[g.s("O1")].outfall);
  CHECK(t.nodes[g.s("O2")].outfall);
  CHECK(s1.tree == t.nodes[g.s("O1")].tree);
  CHECK(t.conduit_tree[g.c("Pside")] == t.nodes[g.s("O2")].tree);
  check_march_order(g.n, t);
}

TEST_CASE("a loop is reported at the pipe that closes it and cut so the march ends") {
  Net g;
  g.node("A", 0, 0).node("B", 10, 0).node("C", 10, 10);
  g.link("AB", "A", "B").link("BC", "B", "C").link("CA", "C", "A");
  Findings fs;
  const auto t = topology::build_topology(g.n, {}, fs);
  const auto loop = with_code(fs, "TOPOLOGY_LOOP");
  REQUIRE(loop.size() == 1);
  CHECK(loop[0]->feature_id == "CA");
  CHECK(loop[0]->value == 3.0);
  CHECK(loop[0]->message ==
        "pipe CA (C to A) closes a loop of 3 pipe(s) that flows back to A; it is cut (left out of the march) so the "
        "march ends");
  CHECK(t.status[g.c("CA")] == MarchStatus::loop_cut);
  CHECK(t.conduit_tree[g.c("CA")] == no_index);
  CHECK_FALSE(g.n.conduits[g.c("CA")].usable);  // later stages filter on usable
  CHECK(g.n.conduits[g.c("AB")].usable);
  REQUIRE(t.trees.size() == 1);  // a piece without an outfall gets one where the loop is cut
  CHECK(t.trees[0].outfall == g.s("C"));
  CHECK(t.trees[0].structures == std::vector<std::size_t>{g.s("C"), g.s("B"), g.s("A")});
  check_march_order(g.n, t);
}

TEST_CASE("a loop with an outlet is cut once and every structure still reaches the outfall") {
  Net g;
  g.node("A", 0, 0).node("B", 10, 0).node("C", 10, 10).node("D", 0, 10).node("O", 20, 10);
  g.link("AB", "A", "B").link("BC", "B", "C").link("CD", "C", "D").link("DA", "D", "A").link("CO", "C", "O");
  Findings fs;
  const auto t = topology::build_topology(g.n, {}, fs);
  const auto loop = with_code(fs, "TOPOLOGY_LOOP");
  REQUIRE(loop.size() == 1);
  CHECK(loop[0]->feature_id == "DA");
  REQUIRE(t.trees.size() == 2);  // O, and D whose only outflow was cut
  std::size_t placed = 0;
  for (const auto& tree : t.trees) placed += tree.structures.size();
  CHECK(placed == 5);
  check_march_order(g.n, t);
}

TEST_CASE("a pipe pair looping between two structures is a loop, cut at the second pipe") {
  Net g;
  g.node("A", 0, 0).node("B", 10, 0).node("O", 20, 0);
  g.link("AB", "A", "B").link("BA", "B", "A").link("BO", "B", "O");
  Findings fs;
  const auto t = topology::build_topology(g.n, {}, fs);
  REQUIRE(with_code(fs, "TOPOLOGY_LOOP").size() == 1);
  CHECK(with_code(fs, "TOPOLOGY_LOOP")[0]->feature_id == "BA");
  CHECK(with_code(fs, "PARALLEL").empty());
  CHECK(t.status[g.c("AB")] == MarchStatus::marched);
  CHECK(!t.nodes[g.s("B")].diversion);
}

TEST_CASE("parallel pipes between the same structures are reported and both kept") {
  Net g;
  g.node("S1", 0, 0).node("S2", 10, 0);
  g.link("P1", "S1", "S2", 0.6).link("P2", "S1", "S2", 0.45);
  Findings fs;
  const auto t = topology::build_topology(g.n, {}, fs);
  const auto par = with_code(fs, "PARALLEL");
  REQUIRE(par.size() == 1);
  CHECK(par[0]->feature_id == "P2");
  CHECK(par[0]->message == "pipe P2 runs parallel to pipe P1 from S1 to S2; both are kept and share the flow");
  REQUIRE(t.trees.size() == 1);
  CHECK(t.trees[0].conduits.size() == 2);
  CHECK(t.nodes[0].main_outflow == 0);
  CHECK(t.nodes[0].diversion);
}

TEST_CASE("unusable pipes are connected but left out of the trees") {
  Net g;
  g.node("S1", 0, 0).node("S2", 10, 0).node("S3", 20, 0);
  g.link("P1", "S1", "S2").link("P2", "S2", "S3");
  g.n.conduits[0].usable = false;
  Findings fs;
  const auto t = topology::build_topology(g.n, {}, fs);
  CHECK(g.n.conduits[0].from == 0);
  CHECK(g.n.conduits[0].to == 1);
  CHECK(t.status[0] == MarchStatus::unusable);
  CHECK(t.conduit_tree[0] == no_index);
  REQUIRE(t.trees.size() == 1);
  CHECK(t.trees[0].conduits == std::vector<std::size_t>{1});
  CHECK(t.trees[0].structures == std::vector<std::size_t>{2, 1});
  CHECK(with_code(fs, "TOPOLOGY_ISOLATED").size() == 1);  // S1 touches only the unusable pipe
  CHECK(t.nodes[0].tree == no_index);
}

TEST_CASE("a zero-length pipe between two structures is reported and marched; one at a single structure is not") {
  Net g;
  g.node("S1", 0, 0).node("S2", 0, 0).node("S3", 10, 0);
  g.link("Z", "S1", "S2").link("P", "S2", "S3").link("SELF", "S3", "S3");
  Findings fs;
  const auto t = topology::build_topology(g.n, {}, fs);
  const auto zero = with_code(fs, "TOPOLOGY_ZERO_LENGTH");
  REQUIRE(zero.size() == 2);
  CHECK(zero[0]->feature_id == "Z");
  CHECK(zero[0]->value == 0.0);
  CHECK(t.status[g.c("Z")] == MarchStatus::marched);
  CHECK(t.status[g.c("SELF")] == MarchStatus::self_loop);
  CHECK_FALSE(g.n.conduits[g.c("SELF")].usable);
  REQUIRE(with_code(fs, "TOPOLOGY_SELF_LOOP").size() == 1);
  CHECK(with_code(fs, "TOPOLOGY_SELF_LOOP")[0]->message ==
        "pipe SELF starts and ends at structure S3; it is left out of the march");
  CHECK(std::isnan(t.deflection_deg[g.c("Z")]));  // no direction on a zero-length line
}

TEST_CASE("a structure typed outfall with an outflow pipe is marched as an ordinary structure") {
  Net g;
  g.node("S1", 0, 0).node("O", 10, 0).node("S3", 20, 0);
  g.n.structures[1].kind = model::StructureKind::outfall;
  g.link("P1", "S1", "O").link("P2", "O", "S3");
  Findings fs;
  const auto t = topology::build_topology(g.n, {}, fs);
  REQUIRE(with_code(fs, "TOPOLOGY_OUTFALL_HAS_OUTFLOW").size() == 1);
  CHECK_FALSE(t.nodes[1].outfall);
  CHECK(t.nodes[2].outfall);
  REQUIRE(t.trees.size() == 1);
  CHECK(t.trees[0].conduits.size() == 2);
}

TEST_CASE("march order of a braided network with diversions and rejoins") {
  // Two rows of structures; every upper structure drains down-right and right, some twice.
  Net g;
  for (int i = 0; i < 6; ++i) {
    g.node("U" + std::to_string(i), i * 10.0, 10.0);
    g.node("L" + std::to_string(i), i * 10.0, 0.0);
  }
  g.node("O", 70, 0);
  for (int i = 0; i < 6; ++i) {
    const std::string u = "U" + std::to_string(i), l = "L" + std::to_string(i);
    const std::string next_u = i < 5 ? "U" + std::to_string(i + 1) : "O";
    const std::string next_l = i < 5 ? "L" + std::to_string(i + 1) : "O";
    g.link("u" + std::to_string(i), u, next_u, 0.3 + 0.01 * i);
    g.link("x" + std::to_string(i), u, l, 0.2);
    g.link("l" + std::to_string(i), l, next_l, 0.45);
  }
  Findings fs;
  const auto t = topology::build_topology(g.n, {}, fs);
  CHECK(with_code(fs, "DIVERSION").size() == 6);
  CHECK(with_code(fs, "TOPOLOGY_LOOP").empty());
  REQUIRE(t.trees.size() == 1);
  CHECK(t.trees[0].structures.size() == 13);
  CHECK(t.trees[0].conduits.size() == 18);
  check_march_order(g.n, t);
}
