// The bundled demo end to end, in both unit systems: outputs contract and energy invariants
// (../shared/tools/check-outputs), the seeded defects, and hand calculations of pinned figures.
#include <catch2/catch.hpp>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "rimline/hydraulics/section.hpp"
#include "rimline/config/project.hpp"
#include "rimline/report/outputs.hpp"
#include "rimline/run/check_run.hpp"
#include "rimline/sha256.hpp"
#include "test_paths.hpp"

using namespace rimline;
namespace fs = std::filesystem;

namespace {

constexpr double g = units::gravity_m_s2;

std::string demo(const char* variant) {
  return std::string(test::source_dir) + "/data/demo/" + variant + "/project.toml";
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

int check_outputs(const fs::path& dir, bool us) {
  const std::string cmd = std::string("/usr/bin/python3 ") + test::source_dir + "/../shared/tools/check-outputs " + dir.string() +
                          (us ? " --us" : "") + " > " + (dir / "check-outputs.txt").string() + " 2>&1";
  return std::system(cmd.c_str());
}

}  // namespace

TEST_CASE("demo (metric): outputs contract and energy invariants hold") {
  const auto project = config::load_project(demo("metric"));
  const auto r = run::run_check(project, {});
  const fs::path out = fs::path(test::binary_dir) / "e2e-demo-metric";
  fs::remove_all(out);
  report::write_outputs(r, out.string());
  for (const char* f : {"exceptions.csv", "results.gpkg", "summary.json"}) CHECK(fs::exists(out / f));
  const int rc = check_outputs(out, false);
  std::ifstream log(out / "check-outputs.txt");
  std::stringstream ss;
  ss << log.rdbuf();
  INFO(ss.str());
  CHECK(rc == 0);
  // No temporary file is left behind.
  for (const auto& e : fs::directory_iterator(out)) CHECK(e.path().filename().string().rfind(".", 0) != 0);
  // Every input is listed once with the SHA-256 of its bytes (FIPS 180-4, rimline::sha256_file_hex),
  // the project file first and the pipe layer's file among them.
  REQUIRE(r.inputs.size() >= 2);
  CHECK(r.inputs.front().path == project.file);
  bool network = false;
  for (const auto& f : r.inputs) {
    CHECK(f.sha256 == sha256_file_hex(f.path));
    network = network || fs::path(f.path).filename() == "pipes.geojson";
  }
  CHECK(network);
}

TEST_CASE("demo (US customary): outputs contract and energy invariants hold in feet") {
  const auto project = config::load_project(demo("us"));
  const auto r = run::run_check(project, {});
  const fs::path out = fs::path(test::binary_dir) / "e2e-demo-us";
  fs::remove_all(out);
  report::write_outputs(r, out.string());
  const int rc = check_outputs(out, true);
  std::ifstream log(out / "check-outputs.txt");
  std::stringstream ss;
  ss << log.rdbuf();
  INFO(ss.str());
  CHECK(rc == 0);
}

TEST_CASE("demo (metric): seeded defects are found and the rest is still checked") {
  const auto r = run::run_check(config::load_project(demo("metric")), {});
  // C-02 was digitised against the flow: it is turned, reported, and solved.
  const auto c02 = conduit_index(r, "C-02");
  CHECK(r.read.network.conduits[c02].reversed);
  CHECK(r.cases.back().march.conduits[c02].solved);
  // B-05 has no rim: freeboard cannot be checked there, and the structures above it still are.
  CHECK(find(r, "RIM_UNKNOWN", "B-05") != nullptr);
  CHECK(r.cases.back().march.structures[structure_index(r, "B-08")].solved);
  for (const auto& c : r.cases)
    for (const auto& s : c.march.structures) CHECK(s.solved);
}

TEST_CASE("demo (metric): pinned figures confirmed by hand from the formulas") {
  const auto r = run::run_check(config::load_project(demo("metric")), {});
  REQUIRE(r.cases.size() == 2);
  const auto& high = r.cases[1];  // tailwater 3.90 m
  REQUIRE(high.tailwater_m == Approx(3.9));
  const auto& net = r.read.network;
  const auto p1 = conduit_index(r, "P-T01");
  const auto& pr = high.march.conduits[p1];
  REQUIRE(pr.solved);

  // Design flow of the outfall pipe = the sum of every local inflow (structure inflows mode), the
  // wet well WW-1's replaced by what its pumps deliver into T-12 (its design case).
  REQUIRE(r.pump_stations.size() == 1);
  double total = r.pump_stations[0].design_flow_m3_s;
  for (const auto& s : net.structures)
    if (s.id != "WW-1") total += s.inflow_m3_s.value_or(0.0);
  CHECK(pr.flow_m3_s == Approx(total).epsilon(1e-12));

  // P-T01 (1500 mm, n 0.013) is drowned by the 3.90 m tailwater (crown 2.00 + 1.50 = 3.50 m):
  // SURCHARGED with the HGL 3.900 - 3.500 = 0.400 m above the outlet crown.
  const Finding* sur = find(r, "SURCHARGED", "P-T01");
  REQUIRE(sur != nullptr);
  CHECK(sur->value == Approx(0.4).margin(0.001));

  // It runs full end to end (its inlet crown, about 3.7 m, is below 3.9 m), so by Manning (SI)
  // hf = L (n V / R^(2/3))^2 with A = pi D^2/4, R = D/4, V = Q/A, and the pool at T-01 stands at
  // TW + hf + V^2/2g (inlet velocity head) + K V^2/2g (K = 0.5 for a manhole, project file).
  const double d = 1.5, n = 0.013, k = 0.5;
  const double area = M_PI * d * d / 4.0;
  const double v = total / area;
  const double hf = net.conduits[p1].length_m * std::pow(n * v / std::pow(d / 4.0, 2.0 / 3.0), 2.0);
  const double hand = 3.9 + hf + (1.0 + k) * v * v / (2.0 * g);
  const auto t01 = structure_index(r, "T-01");
  CHECK(high.march.structures[t01].hgl_m == Approx(hand).margin(0.001));
  CHECK(pr.profile.surcharged_length_m == Approx(net.conduits[p1].length_m).margin(0.001));
}

TEST_CASE("demo (metric): the drowned trunk by hand under both structure bookkeepings, side by side") {
  // Under the 3.90 m tailwater the lower trunk runs full, so each structure's level follows from the
  // one below by Manning full-flow friction, L (n V / R^(2/3))^2, and K V^2/2g at the structure
  // (K = 0.5 for manholes and inlets, project file); P-T01 discharges into the brook (its outlet
  // HGL is the tailwater, its velocity head spent there). still_pool: each arriving pipe's outlet
  // HGL is the structure's level, so it loses its velocity head as well: (1 + K) V^2/2g per
  // structure. whole_loss: its outlet EGL is the structure's level: K V^2/2g per structure.
  auto project = config::load_project(demo("metric"));
  REQUIRE(project.methods.structure_energy == hydraulics::StructureEnergy::whole_loss);  // the default
  const auto whole = run::run_check(project, {});
  project.methods.structure_energy = hydraulics::StructureEnergy::still_pool;
  const auto pool = run::run_check(project, {});
  const double n = 0.013, k = 0.5;
  auto hand = [&](const run::CheckRun& r, const std::vector<const char*>& pipes, bool still) {
    const auto& high = r.cases[1];  // tailwater 3.90 m
    REQUIRE(high.tailwater_m == Approx(3.9));
    double level = 3.9;
    for (std::size_t i = 0; i < pipes.size(); ++i) {
      const auto ci = conduit_index(r, pipes[i]);
      const auto& cr = high.march.conduits[ci];
      REQUIRE(cr.profile.surcharged_length_m == Approx(r.read.network.conduits[ci].length_m).margin(0.001));
      const double d = hydraulics::rise_m(r.read.network.conduits[ci].section);
      const double v = cr.flow_m3_s / (M_PI * d * d / 4.0);
      const double exit = (still || i == 0) ? v * v / (2.0 * g) : 0.0;
      level += exit + r.read.network.conduits[ci].length_m * std::pow(n * v / std::pow(d / 4.0, 2.0 / 3.0), 2.0) +
               k * v * v / (2.0 * g);
    }
    return level;
  };
  const auto& net = whole.read.network;
  // still_pool: P-T01..P-T04 full, T-04 by hand.
  const auto t04 = structure_index(pool, "T-04");
  const double pool_t04 = hand(pool, {"P-T01", "P-T02", "P-T03", "P-T04"}, true);
  CHECK(pool.cases[1].march.structures[t04].hgl_m == Approx(pool_t04).margin(0.001));
  // whole_loss: P-T01..P-T03 full (P-T04 only partly), T-03 by hand.
  const auto t03 = structure_index(whole, "T-03");
  CHECK(whole.cases[1].march.structures[t03].hgl_m ==
        Approx(hand(whole, {"P-T01", "P-T02", "P-T03"}, false)).margin(0.001));
  // The FREEBOARD finding at T-04 under each; pinned figures (README, "How the march works"):
  // worst freeboard 0.035 m (still_pool) and 0.288 m (whole_loss), both at T-04 under 3.90 m.
  const Finding* fb_pool = find(pool, "FREEBOARD", "T-04");
  const Finding* fb_whole = find(whole, "FREEBOARD", "T-04");
  REQUIRE(fb_pool != nullptr);
  REQUIRE(fb_whole != nullptr);
  CHECK(fb_pool->value == Approx(*net.structures[t04].rim_m - pool_t04).margin(0.001));
  CHECK(fb_pool->value == Approx(0.035).margin(0.0005));
  CHECK(fb_whole->value == Approx(0.288).margin(0.0005));
  CHECK(fb_pool->limit == Approx(0.3));
  // Along the drowned trunk the still pool stands higher by the arriving velocity heads. (Not at
  // every structure: where a steep outflow's inlet is drowned a little deeper, K multiplies a
  // smaller inlet velocity head, so T-12 and T-15 stand a few mm lower under still_pool.)
  for (const char* id : {"T-02", "T-03", "T-04", "T-05", "T-06"}) {
    const auto s = structure_index(whole, id);
    CHECK(pool.cases[1].march.structures[s].hgl_m > whole.cases[1].march.structures[s].hgl_m + 0.05);
  }
}

TEST_CASE("demo (metric): the VELOCITY_HIGH finding at C-05 is the steep pipe's supercritical velocity") {
  const auto r = run::run_check(config::load_project(demo("metric")), {});
  const Finding* f = find(r, "VELOCITY_HIGH", "C-05");
  REQUIRE(f != nullptr);
  const auto ci = conduit_index(r, "C-05");
  const auto& net = r.read.network;
  const auto& c = net.conduits[ci];
  // Hand check: the highest velocity a 450 mm pipe at its slope can reach at this flow is at normal
  // depth (an S2 curve falls from critical toward it). Normal depth by bisection on Manning
  // Q = (1/n) A R^(2/3) S^(1/2) with the circular-segment area and perimeter (theta = 2 acos(1 - 2y/D)).
  const double d = hydraulics::rise_m(c.section), n = 0.013;
  const double s = (*c.invert_up_m - *c.invert_down_m) / c.length_m;
  double q = 0.0;
  for (const auto& cs : r.cases) q = std::max(q, cs.march.conduits[ci].flow_m3_s);
  auto area = [d](double y) { const double t = 2.0 * std::acos(1.0 - 2.0 * y / d); return d * d / 8.0 * (t - std::sin(t)); };
  auto perimeter = [d](double y) { return d * std::acos(1.0 - 2.0 * y / d); };
  double lo = 1e-6, hi = 0.9 * d;
  for (int i = 0; i < 200; ++i) {
    const double y = 0.5 * (lo + hi);
    const double qy = area(y) * std::pow(area(y) / perimeter(y), 2.0 / 3.0) * std::sqrt(s) / n;
    (qy < q ? lo : hi) = y;
  }
  const double v_normal = q / area(lo);
  // The step profile approaches normal depth from above, so its top velocity is just below V_normal
  // (within 2 %, the accuracy of a 76 m S2 approach), and above the 4.6 m/s limit.
  CHECK(f->value <= v_normal * 1.0001);
  CHECK(f->value >= v_normal * 0.98);
  CHECK(f->value > 4.6);
}

TEST_CASE("demo (metric): the cases keep only the drawn pipes' criteria findings, the run's list is unchanged") {
  // Plumbing, no outside source: the criteria findings are held once (the run's list), the cases
  // keep those the drawings can show; what is reported must not depend on what is drawn.
  const auto project = config::load_project(demo("metric"));
  const auto all = run::run_check(project, {});
  REQUIRE(!all.cases.empty());
  REQUIRE(all.cases.front().findings.size() == all.cases.front().criteria_count);
  // Draw one pipe: the first with a criteria finding of its own.
  std::string pipe;
  for (const auto& f : all.cases.front().findings)
    if (f.layer == LayerRole::conduits) { pipe = f.feature_id; break; }
  REQUIRE(!pipe.empty());
  const std::size_t ci = conduit_index(all, pipe);
  run::RunOptions opt;
  opt.detailed_conduits = [ci](const model::Network& net, const topology::Topology&) {
    std::vector<bool> keep(net.conduits.size(), false);
    keep[ci] = true;
    return keep;
  };
  const auto some = run::run_check(project, opt);

  REQUIRE(some.findings.size() == all.findings.size());
  for (std::size_t k = 0; k < all.findings.size(); ++k) {
    CHECK(some.findings[k].code == all.findings[k].code);
    CHECK(some.findings[k].feature_id == all.findings[k].feature_id);
    CHECK(some.findings[k].message == all.findings[k].message);
    CHECK(some.data_finding[k] == all.data_finding[k]);
  }
  const auto& c = some.read.network.conduits[ci];
  const std::string up = some.read.network.structures[c.from].id, down = some.read.network.structures[c.to].id;
  auto shown = [&](const Finding& f) {
    return f.layer == LayerRole::conduits ? f.feature_id == pipe
           : f.layer == LayerRole::structures ? (f.feature_id == up || f.feature_id == down)
                                               : true;
  };
  REQUIRE(some.cases.size() == all.cases.size());
  for (std::size_t k = 0; k < all.cases.size(); ++k) {
    CHECK(some.cases[k].criteria_count == all.cases[k].criteria_count);
    std::vector<std::string> expected, kept;
    for (const auto& f : all.cases[k].findings)
      if (shown(f)) expected.push_back(f.code + " " + f.feature_id + " " + f.message);
    for (const auto& f : some.cases[k].findings) kept.push_back(f.code + " " + f.feature_id + " " + f.message);
    CHECK(kept == expected);
    CHECK(!kept.empty());
    CHECK(kept.size() < all.cases[k].findings.size());
  }
}
