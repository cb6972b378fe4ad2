// The demo's pump station end to end: WW-1 lifts through the 150 mm force main FM-1 (vertex Z, over
// a ridge 400 m out) into T-12 of the trunk. Pinned figures confirmed by hand from the formulas.
#include <catch2/catch.hpp>

#include <gdal_priv.h>
#include <gdal_utils.h>
#include <ogrsf_frmts.h>

#include <cmath>
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

constexpr double g = units::gravity_m_s2;

std::string demo(const char* variant) {
  return std::string(test::source_dir) + "/data/demo/" + variant + "/project.toml";
}

// Hazen-Williams, SI head-loss form (see tests/reference/hydraulics/force_main_reference_test.cpp).
double hw_loss(double q, double length, double c, double d) {
  return 10.67 * length * std::pow(q, 1.852) / (std::pow(c, 1.852) * std::pow(d, 4.87));
}

const Finding* find(const run::CheckRun& r, const std::string& code, const std::string& id) {
  for (const auto& f : r.findings)
    if (f.code == code && f.feature_id == id) return &f;
  return nullptr;
}

}  // namespace

TEST_CASE("demo pump station WW-1: operating points and the sub-atmospheric ridge by hand", "[force_main][e2e]") {
  const auto r = run::run_check(config::load_project(demo("metric")), {});
  REQUIRE(r.pump_stations.size() == 1);
  const auto& st = r.pump_stations[0];
  REQUIRE(st.layout.ok);
  const auto& net = r.read.network;
  CHECK(net.structures[st.layout.discharge].id == "T-12");
  CHECK(st.layout.sources.front() == model::ProfileSource::vertex_z);
  REQUIRE(st.layout.points.size() == 7);
  // T-12's water level stays below the outlet centreline (invert 6.60 + 0.075 m): a free outlet.
  CHECK(st.discharge_level_m == Approx(6.675).margin(1e-9));
  CHECK(st.discharge_basis.rfind("free outlet", 0) == 0);
  REQUIRE(st.cases.size() == 4);
  const double area = M_PI * 0.15 * 0.15 / 4.0, c_hw = 130.0, k_fittings = 4 * 0.5 + 2 * 0.3 + 0.4;
  const hydraulics::PumpCurve pump(r.project.pump_stations[0].curve);
  for (const auto& c : st.cases) {
    INFO(c.label);
    REQUIRE(c.exists);
    const double q = c.flow_m3_s, v = q / area;
    // Pump side: n pumps at Q/n on the curve; system side by hand: lift + HW friction + (K + exit 1) V^2/2g.
    CHECK(c.head_m == Approx(pump.head_m(q / c.pumps)).epsilon(1e-9));
    CHECK(c.head_m == Approx(6.675 - c.wet_well_m + hw_loss(q, 620.0, c_hw, 0.15) + (k_fittings + 1.0) * v * v / (2 * g))
                          .epsilon(0.005));
  }
  // The largest flow (both pumps, wet well high) enters T-12 and runs down the trunk.
  CHECK(st.cases[st.design_case].label == "wet well high (pump on), 2 pumps");
  std::size_t fm = 0;
  while (net.conduits[fm].id != "FM-1") ++fm;
  CHECK(r.flows.flow_m3_s[fm] == Approx(st.design_flow_m3_s));
  // The first gravity march leaves T-12 below the outlet, so the free-outlet solve stands: one round.
  CHECK(r.pump_iterations == 1);
  // One pump, wet well low: the HGL at station 450 m (170 m from the outlet) is 6.675 m plus the
  // friction of those 170 m, below the pipe centreline there (invert 7.95 + 0.075 m).
  const auto& one = st.cases[0];
  REQUIRE(one.label == "wet well low (pump off), 1 pump");
  const double hgl_450 = 6.675 + hw_loss(one.flow_m3_s, 170.0, c_hw, 0.15);
  const Finding* sub = find(r, "FM_SUBATMOSPHERIC", "FM-1");
  REQUIRE(sub != nullptr);
  CHECK(sub->value == Approx(hgl_450 - 8.025).epsilon(0.01));
  CHECK(sub->value < 0.0);
  CHECK(render_message(sub->message, units::System::si).find("air-release valve candidate at the high point, station 0+400.0") !=
        std::string::npos);
  // Both pumps lift the HGL over the ridge: no sub-atmospheric point in the two-pump cases.
  for (const auto& c : {st.cases[1], st.cases[3]})
    for (double p : c.pressure_head_m) CHECK(p > -1e-3);
  CHECK(find(r, "FM_PRESSURE_RATING", "FM-1") == nullptr);   // PN10: about 102 m of head
  CHECK(find(r, "FM_VELOCITY_LOW", "FM-1") == nullptr);      // 0.83 .. 1.28 m/s within 0.6 .. 2.5 m/s
  CHECK(find(r, "PUMP_CAPACITY", "WW-1") == nullptr);        // 15 L/s in, about 21 L/s out at the low level
}

TEST_CASE("demo pump station: results.gpkg layers, and the US variant shows the same ridge", "[force_main][e2e]") {
  const auto r = run::run_check(config::load_project(demo("metric")), {});
  const fs::path out = fs::path(test::binary_dir) / "e2e-force-main";
  fs::remove_all(out);
  report::write_outputs(r, out.string());
  GDALAllRegister();
  GDALDatasetUniquePtr ds(GDALDataset::Open((out / "results.gpkg").string().c_str(), GDAL_OF_VECTOR | GDAL_OF_READONLY));
  REQUIRE(ds);
  for (const auto& [name, count] : {std::pair{"force_mains", 1}, {"force_main_points", 7}, {"pump_cases", 4}}) {
    OGRLayer* l = ds->GetLayerByName(name);
    REQUIRE(l != nullptr);
    CHECK(l->GetFeatureCount() == count);
  }
  // The force-main drawing: one HGL per case, the envelope, and one red mark per profile point and
  // case below the 0 m limit (counted from the cases' pressure heads).
  std::ifstream svg_in(out / "profiles" / "WW-1-force-main.svg");
  std::stringstream svg;
  svg << svg_in.rdbuf();
  const std::string text = svg.str();
  auto count = [&text](const std::string& what) {
    std::size_t n = 0;
    for (auto at = text.find(what); at != std::string::npos; at = text.find(what, at + 1)) ++n;
    return n;
  };
  CHECK(count("<g class=\"hgl-case\">") == 4);
  CHECK(count("<g class=\"pressure-envelope\">") == 1);
  std::size_t below = 0;
  for (const auto& c : r.pump_stations[0].cases)
    for (double p : c.pressure_head_m) below += p < -1e-3 ? 1 : 0;
  CHECK(below >= 2);
  CHECK(count("<g class=\"subatmospheric\">") == below);
  CHECK(count("nan") == 0);
  CHECK(text.find("Results are for review by a licensed professional engineer") != std::string::npos);

  const auto us = run::run_check(config::load_project(demo("us")), {});
  REQUIRE(us.pump_stations.size() == 1);
  CHECK(find(us, "FM_SUBATMOSPHERIC", "FM-1") != nullptr);
  // 6 in (152.4 mm) instead of 150 mm: the design flow is within a few percent of the metric one.
  CHECK(us.pump_stations[0].design_flow_m3_s == Approx(r.pump_stations[0].design_flow_m3_s).epsilon(0.05));
}

TEST_CASE("demo pump station under a high tailwater: the pumped flow and T-12's level settle together",
          "[force_main][e2e]") {
  run::RunOptions opt;
  opt.tailwater_levels_m = {7.5};  // drowns T-12 above the force main's outlet (6.675 m)
  const auto r = run::run_check(config::load_project(demo("metric")), opt);
  const auto& st = r.pump_stations[0];
  const auto& t12 = r.cases[0].march.structures[st.layout.discharge];
  REQUIRE(t12.solved);
  CHECK(t12.hgl_m > 7.5);
  CHECK(st.discharge_basis == "water level in T-12 (gravity march)");
  CHECK(r.pump_iterations >= 2);
  CHECK(r.pump_iterations < 10);
  // The last march ran with the flow of the round before; both agree within the 0.5 % stop rule, so
  // the discharge level is T-12's HGL within what 0.5 % of the pumped flow moves it.
  CHECK(st.discharge_level_m == Approx(t12.hgl_m).margin(0.01));
  std::size_t fm = 0;
  while (r.read.network.conduits[fm].id != "FM-1") ++fm;
  CHECK(r.flows.flow_m3_s[fm] == Approx(st.design_flow_m3_s).epsilon(0.005));
  bool not_converged = false;
  for (const auto& f : r.findings) not_converged |= f.code == "FM_NOT_CONVERGED";
  CHECK_FALSE(not_converged);
  // A higher discharge level than the free outlet's lowers the flow.
  const auto free = run::run_check(config::load_project(demo("metric")), {});
  CHECK(st.design_flow_m3_s < free.pump_stations[0].design_flow_m3_s);
}

namespace {

// Copies the features of `src` matching `where` (OGR SQL) into a new GeoJSON file.
void copy_where(const fs::path& src, const fs::path& dst, const std::string& where) {
  GDALAllRegister();
  GDALDatasetH in = GDALOpenEx(src.string().c_str(), GDAL_OF_VECTOR | GDAL_OF_READONLY, nullptr, nullptr, nullptr);
  REQUIRE(in != nullptr);
  const char* args[] = {"-f", "GeoJSON", "-where", where.c_str(), nullptr};
  GDALVectorTranslateOptions* opt = GDALVectorTranslateOptionsNew(const_cast<char**>(args), nullptr);
  int bad = 0;
  GDALDatasetH out = GDALVectorTranslate(dst.string().c_str(), nullptr, 1, &in, opt, &bad);
  GDALVectorTranslateOptionsFree(opt);
  REQUIRE(out != nullptr);
  GDALClose(out);
  GDALClose(in);
}

}  // namespace

TEST_CASE("force mains from their own line layer give the same station as when flagged in the pipe layer",
          "[force_main][e2e]") {
  const fs::path dir = fs::path(test::binary_dir) / "e2e-force-main-layer";
  fs::remove_all(dir);
  fs::create_directories(dir);
  const fs::path demo_dir = fs::path(test::source_dir) / "data/demo/metric";
  copy_where(demo_dir / "pipes.geojson", dir / "pipes.geojson", "PIPE_ID <> 'FM-1'");
  copy_where(demo_dir / "pipes.geojson", dir / "force_mains.geojson", "PIPE_ID = 'FM-1'");
  fs::copy_file(demo_dir / "structures.geojson", dir / "structures.geojson");
  std::ifstream in(demo_dir / "project.toml");
  std::stringstream text;
  text << in.rdbuf();
  std::string project = text.str();
  const std::string table = "[force_mains]\n";
  const auto at = project.find(table);
  REQUIRE(at != std::string::npos);
  project.insert(at + table.size(), "source = \"force_mains.geojson\"\n");
  {
    std::ofstream out(dir / "project.toml");
    out << project;
  }
  const auto split = run::run_check(config::load_project((dir / "project.toml").string()), {});
  const auto one = run::run_check(config::load_project(demo("metric")), {});
  REQUIRE(split.pump_stations.size() == 1);
  REQUIRE(split.pump_stations[0].layout.ok);
  CHECK(split.read.network.conduits.back().id == "FM-1");
  CHECK(split.read.network.conduits.back().force_main);
  CHECK(split.pump_stations[0].design_flow_m3_s == Approx(one.pump_stations[0].design_flow_m3_s).epsilon(1e-12));
  CHECK(split.pump_stations[0].layout.points.size() == 7);
}

TEST_CASE("pump stations from a point layer: the demo's station read from points, bad features left out",
          "[force_main][e2e]") {
  const fs::path dir = fs::path(test::binary_dir) / "e2e-pump-station-points";
  fs::remove_all(dir);
  fs::create_directories(dir);
  const fs::path demo_dir = fs::path(test::source_dir) / "data/demo/metric";
  for (const char* f : {"pipes.geojson", "structures.geojson"}) fs::copy_file(demo_dir / f, dir / f);
  std::ifstream in(demo_dir / "project.toml");
  std::stringstream text;
  text << in.rdbuf();
  std::string project = text.str();
  // The [[pump_stations]] table gives way to a named curve and a point layer with the same values.
  const auto from = project.find("[[pump_stations]]"), to = project.find("[force_mains]");
  REQUIRE(from != std::string::npos);
  REQUIRE(to != std::string::npos);
  const std::string station = project.substr(from, to - from);
  const auto curve_at = station.find("curve = ");
  const std::string curve = station.substr(curve_at + 8, station.find('\n', curve_at) - curve_at - 8);
  project.replace(from, to - from,
                  "[pump_curves]\nDEMO = " + curve +
                      "\n\n[pump_station_points]\nsource = \"stations.geojson\"\n[pump_station_points.fields]\n"
                      "id = \"WW\"\ncurve = \"CURVE\"\nduty_pumps = \"DUTY\"\nfittings_k = \"K\"\n"
                      "pump_on = { field = \"ON\", unit = \"m\" }\npump_off = { field = \"OFF\", unit = \"m\" }\n\n");
  {
    std::ofstream out(dir / "project.toml");
    out << project;
  }
  {
    std::ofstream out(dir / "stations.geojson");
    out << R"({"type":"FeatureCollection","crs":{"type":"name","properties":{"name":"urn:ogc:def:crs:EPSG::32631"}},
"features":[
{"type":"Feature","properties":{"WW":"WW-1","CURVE":"DEMO","DUTY":2,"K":3.0,"ON":3.0,"OFF":1.8},"geometry":{"type":"Point","coordinates":[451386,5384741]}},
{"type":"Feature","properties":{"WW":"WW-2","CURVE":"DEMO","DUTY":1,"K":1.0,"ON":null,"OFF":1.8},"geometry":{"type":"Point","coordinates":[451300,5384700]}},
{"type":"Feature","properties":{"WW":"WW-3","CURVE":"DEM0","DUTY":1,"K":1.0,"ON":3.0,"OFF":1.8},"geometry":{"type":"Point","coordinates":[451300,5384600]}}
]})";
  }
  const auto points = run::run_check(config::load_project((dir / "project.toml").string()), {});
  const auto table = run::run_check(config::load_project(demo("metric")), {});
  REQUIRE(points.pump_stations.size() == 1);
  CHECK(points.project.pump_stations[0].id == "WW-1");
  CHECK(points.pump_stations[0].design_flow_m3_s == Approx(table.pump_stations[0].design_flow_m3_s).epsilon(1e-12));
  const Finding* no_level = find(points, "DATA_MISSING", "WW-2");
  REQUIRE(no_level != nullptr);
  CHECK(no_level->layer == LayerRole::pump_stations);
  CHECK(no_level->field == "ON");
  CHECK(no_level->message == "ON is empty: no pump-on level; the pump station is left out.");
  const Finding* no_curve = find(points, "DATA_IMPLAUSIBLE", "WW-3");
  REQUIRE(no_curve != nullptr);
  CHECK(no_curve->message ==
        "CURVE \"DEM0\" names no [pump_curves] entry (did you mean \"DEMO\"?); the pump station is left out.");
}
