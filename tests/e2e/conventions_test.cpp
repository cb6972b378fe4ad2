// Outputs that agree with each other and say which convention produced them, on the demo:
// the case of every finding and envelope figure, the force main's row, the tailwater from an
// outfall's own field, the water viscosity applied, and quantities in the run's units.
// Plumbing and consistency (invented demo data), except where a source is named.
#include <gdal_priv.h>
#include <ogrsf_frmts.h>

#include <catch2/catch.hpp>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <regex>
#include <set>
#include <sstream>

#include "rimline/config/project.hpp"
#include "rimline/hydraulics/friction.hpp"
#include "rimline/report/outputs.hpp"
#include "rimline/report/report_html.hpp"
#include "rimline/run/check_run.hpp"
#include "test_paths.hpp"
#include "written_outputs.hpp"

using namespace rimline;
namespace fs = std::filesystem;

namespace {

fs::path demo_dir(const char* variant) { return fs::path(test::source_dir) / "data/demo" / variant; }

std::string read_text(const fs::path& p) {
  std::ifstream in(p);
  std::stringstream s;
  s << in.rdbuf();
  return s.str();
}

std::size_t index_of(const std::vector<model::Conduit>& list, const std::string& id) {
  for (std::size_t i = 0; i < list.size(); ++i)
    if (list[i].id == id) return i;
  FAIL("no conduit " << id);
  return 0;
}

std::size_t index_of(const std::vector<model::Structure>& list, const std::string& id) {
  for (std::size_t i = 0; i < list.size(); ++i)
    if (list[i].id == id) return i;
  FAIL("no structure " << id);
  return 0;
}

}  // namespace

TEST_CASE("sweep: every finding names its case, and the envelope figures come from that same case") {
  const auto r = run::run_check(config::load_project((demo_dir("metric") / "project.toml").string()), {});
  REQUIRE(r.cases.size() == 2);
  REQUIRE(r.finding_case.size() == r.findings.size());
  const auto& net = r.read.network;
  int checked = 0;
  for (std::size_t k = 0; k < r.findings.size(); ++k) {
    const auto& f = r.findings[k];
    INFO(f.code << " " << f.feature_id << " case " << r.finding_case[k]);
    if (r.data_finding[k]) continue;
    CHECK(!r.finding_case[k].empty());
    if (f.code == "SURCHARGED") {
      const auto ci = index_of(net.conduits, f.feature_id);
      const auto env = run::conduit_envelope(r, ci);
      CHECK(r.finding_case[k] == run::envelope_label(r, env.index, env.every));
      // The surcharged length the layer carries is the one the finding states.
      const double len = r.cases[env.index].march.conduits[ci].profile.surcharged_length_m;
      CHECK(render_message(f.message, units::System::si).find("over " + render_message(q_distance(len), units::System::si)) !=
            std::string::npos);
      ++checked;
    } else if (f.code == "FREEBOARD" || f.code == "FLOODED") {
      const auto env = run::structure_envelope(r, index_of(net.structures, f.feature_id));
      CHECK(r.finding_case[k] == run::envelope_label(r, env.index, env.every));
      ++checked;
    } else if (f.code == "VELOCITY_HIGH") {
      const auto e = r.envelope_velocity_high[index_of(net.conduits, f.feature_id)];
      CHECK(r.finding_case[k] == run::envelope_label(r, e.index, e.every));
      ++checked;
    }
  }
  CHECK(checked >= 10);
  // exceptions.csv carries the case in its own column, before the message.
  const std::string csv = report::exceptions_csv(r);
  CHECK(csv.rfind("code,severity,layer,feature_id,fid,field,value,limit,shortfall,unit,case,x,y,message\n", 0) == 0);
  // T-04: freeboard 0.288 m against 0.300 m, shortfall 0.288 - 0.300 = -0.012 m, at the structure's point.
  const auto& t04 = r.read.network.structures[index_of(r.read.network.structures, "T-04")].location;
  char xy[80];
  std::snprintf(xy, sizeof xy, "%.3f,%.3f", t04.x, t04.y);
  CHECK(csv.find("FREEBOARD,error,structures,T-04," + std::to_string(r.read.network.structures[index_of(r.read.network.structures, "T-04")].fid) + ",,0.288,0.300,-0.012,m,tailwater 3.900 m," + std::string(xy) +
                 ",\"structure T-04: the HGL") != std::string::npos);
  CHECK(csv.find("REVERSED,info,conduits,C-02,29,,,,,,,") != std::string::npos);  // not a case's finding
  // CAPACITY: which number is the flow and which the capacity.
  CHECK(csv.find("pipe D-05: the design flow 0.0600 m3/s is 121% of its full-flow capacity 0.0497 m3/s") != std::string::npos);
}

TEST_CASE("results.gpkg: a checked force main has its row in force_mains only; the velocity rules' figures") {
  const auto r = run::run_check(config::load_project((demo_dir("metric") / "project.toml").string()), {});
  GDALDatasetUniquePtr ds = test::write_and_open_results(r, "e2e-conventions");
  REQUIRE(ds);
  // The default styles a desktop GIS reads: one per result layer, the default, with QML and SLD.
  OGRLayer* styles = ds->GetLayerByName("layer_styles");
  REQUIRE(styles);
  std::set<std::string> styled;
  for (auto& f : *styles) {
    styled.insert(f->GetFieldAsString("f_table_name"));
    CHECK(f->GetFieldAsInteger("useAsDefault") == 1);
    CHECK(std::string(f->GetFieldAsString("f_geometry_column")) == "geom");
    CHECK(std::string(f->GetFieldAsString("styleQML")).find("renderer-v2") != std::string::npos);
    CHECK(std::string(f->GetFieldAsString("styleSLD")).find("StyledLayerDescriptor") != std::string::npos);
  }
  CHECK(styled == std::set<std::string>{"conduits", "conduits_not_checked", "force_main_points", "force_mains", "structures"});
  auto ids = [&](const char* layer) {
    std::vector<std::string> v;
    for (auto& f : *ds->GetLayerByName(layer)) v.push_back(f->GetFieldAsString("id"));
    return v;
  };
  const auto unchecked = ids("conduits_not_checked");
  CHECK(std::find(unchecked.begin(), unchecked.end(), "FM-1") == unchecked.end());
  const auto mains = ids("force_mains");
  CHECK(std::find(mains.begin(), mains.end(), "FM-1") != mains.end());
  // C-05: its highest velocity (the VELOCITY_HIGH figure) and the self-cleansing velocity at normal depth.
  bool seen = false;
  for (auto& f : *ds->GetLayerByName("conduits")) {
    if (std::string(f->GetFieldAsString("id")) != "C-05") continue;
    seen = true;
    const auto ci = index_of(r.read.network.conduits, "C-05");
    const auto e = r.envelope_velocity_high[ci];
    CHECK(f->GetFieldAsDouble("velocity_highest") ==
          Approx(checks::highest_velocity_m_s(r.cases[e.index].march.conduits[ci])).epsilon(1e-12));
    CHECK(f->GetFieldAsDouble("velocity_highest") > 4.6);
    CHECK(std::string(f->GetFieldAsString("velocity_selfclean_basis")) == "normal_depth");
    CHECK(std::string(f->GetFieldAsString("velocity_selfclean_case")) == run::every_case);
  }
  CHECK(seen);
}

TEST_CASE("tailwater from an outfall's own field: the case and the summary say so") {
  const fs::path dir = fs::path(test::binary_dir) / "e2e-tailwater-field";
  fs::remove_all(dir);
  fs::create_directories(dir);
  fs::copy_file(demo_dir("metric") / "pipes.geojson", dir / "pipes.geojson");
  std::string structures = read_text(demo_dir("metric") / "structures.geojson");
  const std::string at = "\"NODE_ID\": \"OF-1\",";
  REQUIRE(structures.find(at) != std::string::npos);
  structures.replace(structures.find(at), at.size(), at + " \"TW\": 3.5,");
  std::ofstream(dir / "structures.geojson") << structures;
  std::string project = read_text(demo_dir("metric") / "project.toml");
  project = std::regex_replace(project, std::regex("levels = \\[[^\\]]*\\]\n"), "");
  project = std::regex_replace(project, std::regex("\\[structures.fields\\]\n"),
                               "[structures.fields]\ntailwater = { field = \"TW\", unit = \"m\" }\n");
  std::ofstream(dir / "project.toml") << project;

  const auto r = run::run_check(config::load_project((dir / "project.toml").string()), {});
  REQUIRE(r.cases.size() == 1);
  CHECK(r.cases[0].label == "outfall tailwater fields");
  const auto of = index_of(r.read.network.structures, "OF-1");
  CHECK(r.cases[0].march.structures[of].tailwater_from_field);
  CHECK(r.cases[0].march.structures[of].hgl_m == Approx(3.5));
  const auto j = nlohmann::json::parse(report::summary_json(r));
  CHECK(j["cases"][0]["tailwater"].get<double>() == Approx(3.5));
  CHECK(j["cases"][0]["outfalls"][0]["source"] == "field");
  CHECK(j["cases"][0]["outfalls"][0]["governed_by"] == "tailwater");
  CHECK(j["cases"][0]["outfalls_by_source"]["field"] == 1);
}

TEST_CASE("Darcy-Weisbach uses the viscosity of water at the project's temperature (default 15 C)") {
  auto project = config::load_project((demo_dir("metric") / "project.toml").string());
  REQUIRE(project.methods.water_temperature_c == 15.0);
  const auto at15 = run::run_check(project, {});
  // Kinematic viscosity of water at 15 C: 1.139e-6 m2/s (tabulated water properties, e.g. the
  // tables of fluid-mechanics texts - from memory), within the formula's stated 2 %.
  CHECK(at15.kinematic_viscosity_m2_s == Approx(1.139e-6).epsilon(0.02));
  for (const auto& c : at15.read.network.conduits) CHECK(c.roughness.kinematic_viscosity_m2_s == at15.kinematic_viscosity_m2_s);
  project.methods.water_temperature_c = 25.0;
  project.methods.friction = hydraulics::FrictionLaw::darcy_weisbach;
  project.pipe_defaults.ks_m = 0.0015;
  const auto at25 = run::run_check(project, {});
  CHECK(at25.kinematic_viscosity_m2_s == Approx(hydraulics::water_kinematic_viscosity_m2_s(25.0)));
  CHECK(at25.kinematic_viscosity_m2_s < at15.kinematic_viscosity_m2_s);
  const auto j = nlohmann::json::parse(report::summary_json(at25));
  CHECK(j["methods"]["water_temperature"].get<double>() == Approx(25.0));
  CHECK(j["methods"]["kinematic_viscosity"].get<double>() == Approx(at25.kinematic_viscosity_m2_s).epsilon(1e-3));
  CHECK(j["methods"]["structure_energy"] == "whole_loss");
  CHECK(j["methods"]["velocity_min_basis"] == "normal_depth");
}

TEST_CASE("a US run shows every quantity of its messages and report in feet") {
  const auto r = run::run_check(config::load_project((demo_dir("us") / "project.toml").string()), {});
  REQUIRE(r.report_units == units::System::us);
  const std::string csv = report::exceptions_csv(r);
  // No metre quantity in any message: "<number> m" never appears (the REVERSED finding was in metres).
  CHECK_FALSE(std::regex_search(csv, std::regex("[0-9] m[ ,;.)]")));
  CHECK(csv.find("its inverts fall from 18.43 ft at its last vertex to 17.31 ft") != std::string::npos);
  // Stations in 100-ft notation, levels to 0.01 ft, lengths to the foot.
  CHECK(csv.find("station 13+12.34") != std::string::npos);
  CHECK(std::regex_search(csv, std::regex("runs surcharged over [0-9]+ ft of its [0-9]+ ft")));
  // The report outside its methods table (which states each default in both systems).
  std::string html = report::report_html(r, {}, "2026-01-01", false);
  const auto m0 = html.find("<section id=\"methods\">"), m1 = html.find("</section>", m0);
  REQUIRE(m0 != std::string::npos);
  html.erase(m0, m1 - m0);
  // The CRS note states the CRS's own unit in metres ("1 unit = 0.3048006096 m"): a definition, not a result.
  html = std::regex_replace(html, std::regex("1 unit = [0-9.]+ m"), "");
  std::smatch hit;
  const std::string found = std::regex_search(html, hit, std::regex("[\\s\\S]{0,80}[0-9] m[ ,;.)<][\\s\\S]{0,20}")) ? hit.str() : "";
  INFO(found);
  CHECK_FALSE(std::regex_search(html, std::regex("[0-9] m[ ,;.)<]")));
  CHECK(html.find("diameter 3.94 ft from [structures.defaults] diameter") != std::string::npos);
}
