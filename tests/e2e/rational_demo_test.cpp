// The demo network with design flows from its catchments (Rational Method), both unit systems:
// outputs contract and energy invariants (../shared/tools/check-outputs), the seeded catchment
// defects, and a head pipe's figures by hand from the formulas.
#include <gdal_priv.h>
#include <ogrsf_frmts.h>

#include <catch2/catch.hpp>
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

std::string project_file(const char* variant) {
  return std::string(test::source_dir) + "/data/demo/" + variant + "/project-rational.toml";
}

std::size_t conduit(const run::CheckRun& r, const std::string& id) {
  for (std::size_t i = 0; i < r.read.network.conduits.size(); ++i)
    if (r.read.network.conduits[i].id == id) return i;
  FAIL("no conduit " << id);
  return 0;
}

bool has(const run::CheckRun& r, const std::string& code, const std::string& id) {
  for (const auto& f : r.findings)
    if (f.code == code && f.feature_id == id) return true;
  return false;
}

void contract_holds(const run::CheckRun& r, const char* name, bool us) {
  const fs::path out = fs::path(test::binary_dir) / name;
  fs::remove_all(out);
  report::write_outputs(r, out.string());
  const std::string cmd = std::string("/usr/bin/python3 ") + test::source_dir + "/../shared/tools/check-outputs " +
                          out.string() + (us ? " --us" : "") + " > " + (out / "check-outputs.txt").string() + " 2>&1";
  const int rc = std::system(cmd.c_str());
  std::ifstream log(out / "check-outputs.txt");
  std::stringstream ss;
  ss << log.rdbuf();
  INFO(ss.str());
  CHECK(rc == 0);
  std::ifstream html(out / "report.html");
  std::stringstream page;
  page << html.rdbuf();
  CHECK(page.str().find("id=\"design-flows\"") != std::string::npos);
  // The catchments layer: every catchment read, with its outlet; the conduits carry Tc.
  GDALAllRegister();
  GDALDatasetUniquePtr ds(
      GDALDataset::Open((out / "results.gpkg").string().c_str(), GDAL_OF_VECTOR | GDAL_OF_READONLY));
  REQUIRE(ds);
  OGRLayer* k = ds->GetLayerByName("catchments");
  REQUIRE(k != nullptr);
  CHECK(k->GetFeatureCount() == static_cast<GIntBig>(r.catchments.size()));
  OGRLayer* c = ds->GetLayerByName("conduits");
  REQUIRE(c != nullptr);
  CHECK(c->GetLayerDefn()->GetFieldIndex("tc") >= 0);
}

}  // namespace

// B-08 heads branch B: its catchment K-B-08 is a 56 m x 64 m rectangle (3584 m^2 = 0.3584 ha),
// RUNOFF_C 0.65 and INLET_MIN 12, outside the land-use polygons; no pipe upstream, so Tc = 12 min.
//   metric IDF i = 1650 / (12 + 12)^0.85 mm/h: 24^0.85 = 14.8998, i = 110.7400 mm/h;
//   Q = C i A = 0.65 x 110.7400 / 3.6e6 m/s x 3584 m^2 = 0.0716611 m3/s.
// Tolerance 1e-4 relative on area and Q: the demo's coordinates are rounded to 1 mm (240 m of
// perimeter x 0.5 mm ~ 0.12 m^2, 3e-5 of the area).
TEST_CASE("Rational demo (metric): contract holds and a head pipe checks by hand", "[e2e][rational]") {
  const auto r = run::run_check(config::load_project(project_file("metric")), {});
  REQUIRE(r.catchment_flows);
  const auto& p = r.catchment_flows->pipes[conduit(r, "B-08")];
  CHECK(p.area_m2 == Approx(3584.0).epsilon(1e-4));
  CHECK(p.ca_m2 / p.area_m2 == Approx(0.65).epsilon(1e-9));
  CHECK(p.tc_s == Approx(720.0));
  CHECK(p.intensity_m_s * 3.6e6 == Approx(110.7400).epsilon(1e-6));
  CHECK(p.flow_m3_s == Approx(0.0716611).epsilon(1e-4));
  // At the outfall pipe Q = i(Tc) x sum(C A) over all 28 catchments plus the pump station's design
  // flow (WW-1 lifts through FM-1 into T-12, upstream of P-T01; a constant inflow from there on),
  // and Tc is at least the upland catchment's 20 min inlet time plus the trunk's travel time from T-20.
  const auto& out = r.catchment_flows->pipes[conduit(r, "P-T01")];
  REQUIRE(r.pump_stations.size() == 1);
  const double pumped = r.pump_stations[0].design_flow_m3_s;
  CHECK(pumped > 0.02);
  CHECK(r.catchment_flows->pipes[conduit(r, "FM-1")].flow_m3_s == pumped);
  CHECK(out.flow_m3_s == Approx(out.intensity_m_s * out.ca_m2 + pumped).epsilon(1e-12));
  CHECK(out.tc_s > 20.0 * 60.0);
  double ca = 0.0;
  for (const auto& k : r.catchments) ca += k.runoff_c * k.area_m2;
  CHECK(out.ca_m2 == Approx(ca).epsilon(1e-9));
  CHECK(r.catchments.size() == 28);
  // Seeded: K-C-03 is drawn 28 m off its inlet; K-D-01 also covers trunk inlet T-15.
  CHECK(has(r, "CATCHMENT_NEAREST", "K-C-03"));
  CHECK(has(r, "CATCHMENT_AMBIGUOUS", "K-D-01"));
  contract_holds(r, "e2e-rational-metric", false);
}

// US variant: the same catchment, the IDF as a table in in/h; Tc 12 min lies between the 10 and
// 15 min rows (4.69 and 3.94 in/h): slope ln(3.94/4.69)/ln(1.5) = -0.429758,
// i = 4.69 x 1.2^-0.429758 = 4.33655 in/h; A = 0.88563 acre; Q = 0.65 x 4.33655 in/h x 3584 m^2 = 2.51717 cfs.
TEST_CASE("Rational demo (US customary): table IDF, contract holds in feet", "[e2e][rational]") {
  const auto r = run::run_check(config::load_project(project_file("us")), {});
  REQUIRE(r.catchment_flows);
  const auto& p = r.catchment_flows->pipes[conduit(r, "B-08")];
  CHECK(units::from_si(p.area_m2, units::Unit::acre) == Approx(0.88563).epsilon(1e-4));
  CHECK(units::from_si(p.intensity_m_s, units::Unit::in_h) == Approx(4.33655).epsilon(1e-5));
  CHECK(units::from_si(p.flow_m3_s, units::Unit::cfs) == Approx(2.51717).epsilon(1e-4));
  contract_holds(r, "e2e-rational-us", true);
}
