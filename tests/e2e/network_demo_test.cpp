// The network solve end to end on the demo: the relief-sewer variant (data/demo/*/project-relief.toml,
// two loops) and the tree demo forced through the solve. Invented data: invariants and agreement
// between the two engines, not check values.
#include <catch2/catch.hpp>
#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "rimline/config/project.hpp"
#include "rimline/report/outputs.hpp"
#include "rimline/run/check_run.hpp"
#include "test_paths.hpp"

using namespace rimline;
namespace fs = std::filesystem;

namespace {

std::string demo_dir(const char* variant) { return std::string(test::source_dir) + "/data/demo/" + variant + "/"; }

std::string read_text(const std::string& path) {
  std::ifstream in(path);
  std::stringstream s;
  s << in.rdbuf();
  return s.str();
}

std::size_t structure_index(const run::CheckRun& r, const std::string& id) {
  for (std::size_t i = 0; i < r.read.network.structures.size(); ++i)
    if (r.read.network.structures[i].id == id) return i;
  FAIL("no structure " << id);
  return 0;
}

std::size_t conduit_index(const run::CheckRun& r, const std::string& id) {
  for (std::size_t i = 0; i < r.read.network.conduits.size(); ++i)
    if (r.read.network.conduits[i].id == id) return i;
  FAIL("no conduit " << id);
  return 0;
}

const Finding* find(const run::CheckRun& r, const std::string& code, const std::string& id) {
  for (const auto& f : r.findings)
    if (f.code == code && f.feature_id == id) return &f;
  return nullptr;
}

}  // namespace

TEST_CASE("relief demo (metric): the looped network converges, closes continuity, and the march agrees") {
  const auto r = run::run_check(config::load_project(demo_dir("metric") + "project-relief.toml"), {});
  const auto& n = r.network;
  REQUIRE(n.components == 1);
  CHECK(n.loops == 2);
  CHECK(n.split == "hydraulic");
  REQUIRE(n.cases.size() == 2);
  for (const auto& c : n.cases) {
    INFO(c.label);
    CHECK(c.converged);
    CHECK(c.max_continuity_error_m3_s < 1e-4);  // 0.1 L/s
  }
  CHECK(find(r, "NETWORK_SOLVED", "OF-1") != nullptr);
  CHECK(find(r, "TOPOLOGY_LOOP", "R-04") == nullptr);
  const auto& net = r.read.network;
  for (std::size_t k = 0; k < r.cases.size(); ++k) {
    const auto& m = r.cases[k].march;
    // Continuity at every structure of the march's result (pipes the other way in this case are left
    // out of its conduit results, so they are skipped with their ends).
    std::vector<double> balance(net.structures.size(), 0.0);
    std::vector<char> skip(net.structures.size(), 0);
    for (std::size_t s = 0; s < net.structures.size(); ++s) balance[s] = net.structures[s].inflow_m3_s.value_or(0.0);
    for (std::size_t ci = 0; ci < net.conduits.size(); ++ci) {
      const auto& c = net.conduits[ci];
      if (!model::marched(c)) continue;
      if (!m.conduits[ci].solved) {
        skip[c.from] = skip[c.to] = 1;
        continue;
      }
      balance[c.from] -= m.conduits[ci].flow_m3_s;
      balance[c.to] += m.conduits[ci].flow_m3_s;
    }
    for (std::size_t s = 0; s < net.structures.size(); ++s) {
      const auto& st = net.structures[s];
      if (skip[s] || st.kind == model::StructureKind::outfall || st.kind == model::StructureKind::pump_station ||
          !n.solved_conduit.empty() == false)
        continue;
      if (st.id == "T-12") continue;  // receives the pumped flow of FM-1
      INFO("case " << k << " structure " << st.id);
      CHECK(std::fabs(balance[s]) < 1e-4);
    }
  }
  // The march of the solved flows reproduces the solve's own levels (first case) to 1 mm.
  const auto& m0 = r.cases[0].march;
  for (std::size_t s = 0; s < net.structures.size(); ++s) {
    if (!std::isfinite(n.level_m[s]) || net.structures[s].kind == model::StructureKind::outfall) continue;
    INFO("structure " << net.structures[s].id);
    REQUIRE(m0.structures[s].solved);
    CHECK(std::fabs(m0.structures[s].hgl_m - n.level_m[s]) < 1e-3);
  }
  // The relief carries water, and it lowers the highest HGL over the tailwater cases at the low spot
  // T-04..T-06 below that of the tree demo (the same network without the relief): by 3.3, 4.5 and
  // 5.9 cm under the whole-loss bookkeeping (invented data: an invariant, not a check value).
  CHECK(r.cases[1].march.conduits[conduit_index(r, "R-01")].flow_m3_s > 0.05);
  const auto tree = run::run_check(config::load_project(demo_dir("metric") + "project.toml"), {});
  auto highest = [](const run::CheckRun& run, std::size_t s) {
    double h = -1e9;
    for (const auto& c : run.cases)
      if (c.march.structures[s].solved) h = std::max(h, c.march.structures[s].hgl_m);
    return h;
  };
  for (const char* id : {"T-04", "T-05", "T-06"}) {
    INFO(id);
    CHECK(highest(r, structure_index(r, id)) < highest(tree, structure_index(tree, id)) - 0.02);
  }
  const fs::path out = fs::path(test::binary_dir) / "e2e-relief-metric";
  fs::remove_all(out);
  report::write_outputs(r, out.string());
  const std::string cmd = std::string("/usr/bin/python3 ") + test::source_dir + "/../shared/tools/check-outputs " +
                          out.string() + " > " + (out / "check-outputs.txt").string() + " 2>&1";
  CHECK(std::system(cmd.c_str()) == 0);
  INFO(read_text((out / "check-outputs.txt").string()));
}

TEST_CASE("demo forced through the network solve agrees with the march to 1 mm (both unit systems)") {
  for (const char* variant : {"metric", "us"}) {
    const std::string dir = demo_dir(variant);
    const auto marched = run::run_check(config::load_project(dir + "project.toml"), {});
    const std::string text = read_text(dir + "project.toml") + "\n[network_solve]\ncomponents = \"all\"\n";
    const auto solved = run::run_check(config::parse_project(text, dir + "project-all.toml"), {});
    REQUIRE(solved.network.components >= 1);
    CHECK(solved.network.fallback_components == 0);
    REQUIRE(solved.cases.size() == marched.cases.size());
    for (std::size_t k = 0; k < solved.cases.size(); ++k)
      for (std::size_t s = 0; s < solved.read.network.structures.size(); ++s) {
        const auto& a = solved.cases[k].march.structures[s];
        const auto& b = marched.cases[k].march.structures[s];
        INFO(variant << " case " << k << " structure " << solved.read.network.structures[s].id);
        REQUIRE(a.solved == b.solved);
        if (a.solved) CHECK(std::fabs(a.hgl_m - b.hgl_m) < 1e-3);
      }
    // And the solve's own levels (the first case) agree with the march too.
    for (std::size_t s = 0; s < solved.read.network.structures.size(); ++s) {
      const double level = solved.network.level_m[s];
      if (!std::isfinite(level) || solved.read.network.structures[s].kind == model::StructureKind::outfall) continue;
      INFO(variant << " structure " << solved.read.network.structures[s].id);
      CHECK(std::fabs(level - marched.cases[0].march.structures[s].hgl_m) < 1e-3);
    }
  }
}
