// Issue 17: rims from a ground model. data/demo/metric/ground.tif is invented (scripts/make_ground.py):
// it passes through the demo's recorded rims, lacks B-05's (no rim recorded: seeded defect) and has a
// 1.2 m mound of fill around C-04. The checks are invariants of that construction, not check values.
#include <catch2/catch.hpp>
#include <cmath>
#include <filesystem>

#include "rimline/config/project.hpp"
#include "rimline/run/check_run.hpp"
#include "test_paths.hpp"

using namespace rimline;

namespace {

std::string demo(const std::string& file) { return std::string(test::source_dir) + "/data/demo/metric/" + file; }

const Finding* find(const run::CheckRun& r, const std::string& code, const std::string& id) {
  for (const auto& f : r.findings)
    if (f.code == code && f.feature_id == id) return &f;
  return nullptr;
}

std::size_t structure(const run::CheckRun& r, const std::string& id) {
  for (std::size_t i = 0; i < r.read.network.structures.size(); ++i)
    if (r.read.network.structures[i].id == id) return i;
  FAIL("no structure " << id);
  return 0;
}

}  // namespace

TEST_CASE("ground demo: B-05's missing rim comes from the raster, C-04's recorded rim is below the ground",
          "[e2e][ground]") {
  const auto r = run::run_check(config::load_project(demo("project-ground.toml")), {});
  const Finding* fill = find(r, "RIM_FROM_GROUND", "B-05");
  REQUIRE(fill != nullptr);
  CHECK(fill->severity == Severity::info);
  const auto& b05 = r.read.network.structures[structure(r, "B-05")];
  REQUIRE(b05.rim_m);
  CHECK(*b05.rim_m == fill->value);
  // Between its neighbours' rims, as an interpolation of them must be (B-04 downstream, B-06 upstream).
  const double b04 = *r.read.network.structures[structure(r, "B-04")].rim_m;
  const double b06 = *r.read.network.structures[structure(r, "B-06")].rim_m;
  CHECK(*b05.rim_m > std::min(b04, b06) - 0.5);
  CHECK(*b05.rim_m < std::max(b04, b06) + 0.5);
  CHECK(find(r, "RIM_UNKNOWN", "B-05") == nullptr);  // its freeboard is now checked
  const Finding* mismatch = find(r, "RIM_GROUND_MISMATCH", "C-04");
  REQUIRE(mismatch != nullptr);
  CHECK(mismatch->limit - mismatch->value == Approx(1.2).margin(0.1));  // the mound's height at its centre
  std::size_t mismatches = 0;
  for (const auto& f : r.findings) mismatches += f.code == "RIM_GROUND_MISMATCH";
  CHECK(mismatches == 1);  // every other recorded rim lies within 0.3 m of the ground through them
  // The raster is an input, hashed.
  bool listed = false;
  for (const auto& in : r.inputs) listed = listed || (in.path == demo("ground.tif") && in.sha256.size() == 64);
  CHECK(listed);
}

TEST_CASE("ground demo: a pipes-only export gets rims from the ground, so freeboard is checked", "[e2e][ground]") {
  const auto dir = std::filesystem::path(test::binary_dir) / "ground-pipes-only";
  std::filesystem::create_directories(dir);
  const std::string toml = "[pipes]\nsource = \"" + demo("pipes.geojson") +
                           "\"\nforce_main_values = [\"FM\"]\n[pipes.fields]\nid = \"PIPE_ID\"\nforce_main = \"KIND\"\n"
                           "diameter = { field = \"SIZE\", unit = \"mm\" }\ninvert_up = { field = \"US_INV\", unit = \"m\" }\n"
                           "invert_down = { field = \"DS_INV\", unit = \"m\" }\n[pipes.defaults]\nmanning_n = 0.013\n"
                           "[ground]\nsource = \"" + demo("ground.tif") + "\"\nunit = \"m\"\n"
                           "[flows]\nmode = \"structure_inflows\"\ndefault_inflow = \"50 L/s\"\n"
                           "[tailwater]\nmode = \"higher\"\nlevels = [\"3.9 m\"]\n"
                           // The conservative bookkeeping: with 50 L/s at every structure the low spot is
                           // within the freeboard only when arriving velocity heads are spent in the pool.
                           "[methods]\nstructure_energy = \"still_pool\"\n";
  const auto r = run::run_check(config::parse_project(toml, (dir / "project.toml").string()), {});
  std::size_t filled = 0, unknown = 0, freeboard = 0;
  for (const auto& f : r.findings) {
    filled += f.code == "RIM_FROM_GROUND";
    unknown += f.code == "RIM_UNKNOWN";
    freeboard += f.code == "FREEBOARD" || f.code == "FLOODED";
  }
  CHECK(filled == r.read.network.structures.size());  // every derived structure lies on the raster
  CHECK(unknown == 0);
  CHECK(freeboard > 0);  // the demo's low spot at T-04..T-06 shows without any structure layer
}
