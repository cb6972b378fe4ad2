#include "rimline/mapping/inspect.hpp"

#include <catch2/catch.hpp>

#include <algorithm>

#include "unit/gis/layer_fixture.hpp"
#include "rimline/error.hpp"
#include "rimline/gis/read_network.hpp"
#include "test_paths.hpp"

using namespace rimline;
using rimline::test::FieldSpec;

namespace {

const mapping::FieldSummary& field(const mapping::LayerSummary& l, const std::string& name) {
  const auto it =
      std::find_if(l.fields.begin(), l.fields.end(), [&](const mapping::FieldSummary& f) { return f.name == name; });
  REQUIRE(it != l.fields.end());
  return *it;
}

std::string melbourne_geojson() {
  return std::string(test::shared_data_dir) +
         "/real/melbourne-water-sewer-mains/Sewerage_Network_Main_Pipelines.geojson";
}

}  // namespace

TEST_CASE("inspecting the Melbourne export summarises its one layer", "[io][inspect]") {
  const mapping::SourceSummary s = mapping::inspect_source(melbourne_geojson());
  CHECK(s.driver == "GeoJSON");
  REQUIRE(s.layers.size() == 1);
  const mapping::LayerSummary& l = s.layers[0];
  // README.txt of the data set: 2,252 features, 2,250 LineString and 2 MultiLineString, CRS84,
  // extent lon 144.647..145.271, lat -38.440..-37.709.
  CHECK(l.feature_count == 2252);
  CHECK(l.geometry_counts == std::map<std::string, std::size_t>{{"LINESTRING", 2250}, {"MULTILINESTRING", 2}});
  CHECK(l.lines());
  CHECK(l.crs_id == "EPSG:4326");
  CHECK(l.crs_geographic);
  CHECK(*l.min_x == Approx(144.647).margin(5e-4));
  CHECK(*l.max_y == Approx(-37.709).margin(5e-4));
  CHECK(l.fields.size() == 34);  // README lists 34 field names
  const auto& height = field(l, "PIPE_HEIGHT");
  CHECK(height.type == "Integer");
  CHECK(*height.min == 0.0);
  CHECK(*height.max == 3400.0);
  CHECK(*height.zero_fraction == Approx(1.0 - 412.0 / 2252.0).epsilon(1e-12));  // README: 412 non-circular
  CHECK(field(l, "MATERIAL").null_count == 4);                                  // measured (ogrinfo -sql agrees)
  CHECK(field(l, "MXUNITID").unique == true);
  CHECK(field(l, "UNITID").unique == false);
  CHECK(field(l, "UPSTREAM_IL").max == 999.5);                                         // README: sentinel 999.5
  CHECK(field(l, "SERVICE_STATUS").samples == std::vector<std::string>{"IN", "WIP"});  // README: IN 2250, WIP 2
  CHECK_FALSE(field(l, "MXUNITID").numeric());
  // README: geometry length / PIPE_LENGTH has a median of 0.997; measured here against an
  // equirectangular length, good to ~0.5 %.
  CHECK(*field(l, "PIPE_LENGTH").median_ratio_to_line_length == Approx(1.0).margin(0.01));
}

TEST_CASE("the proposed Melbourne mapping and starter project match the hand-written one", "[io][inspect]") {
  const mapping::SourceSummary s = mapping::inspect_source(melbourne_geojson());
  const mapping::MappingProposal m = mapping::propose_mapping(s.layers[0]);
  CHECK(m.kind == mapping::LayerKind::pipes);
  CHECK(m.shape_from_height);
  std::vector<std::string> got;
  for (const auto& f : m.fields)
    got.push_back(f.role + "=" + f.field + (f.unit ? ":" + std::string(units::unit_symbol(*f.unit)) : ""));
  std::sort(got.begin(), got.end());
  // The hand-written mapping's roles, and the pressure-main flag it also gives (force_main_values).
  CHECK(got == std::vector<std::string>{"force_main=UNITTYPE", "from=UNITID", "height=PIPE_HEIGHT:mm", "id=MXUNITID",
                                        "invert_down=DOWNSTREAM_IL:m", "invert_up=UPSTREAM_IL:m",
                                        "length=PIPE_LENGTH:m", "material=MATERIAL", "to=UNITID2",
                                        "width=PIPE_WIDTH:mm"});
  std::vector<std::string> pressure;
  for (const auto& v : m.force_main_values) pressure.push_back(v.value);
  std::sort(pressure.begin(), pressure.end());
  CHECK(pressure == std::vector<std::string>{"EO-RM", "RM"});  // README: RM = RISING MAIN, EO-RM
  // The starter project parses and reads the same sections as tests/data/gis/melbourne.toml.
  const std::string toml = mapping::starter_project_toml({melbourne_geojson(), &s.layers[0]});
  const config::Project p = config::parse_project(toml, "/tmp/starter.toml");
  CHECK(p.pipe_fields.width.unit == units::Unit::mm);
  const gis::ReadResult r = gis::read_network(p);
  CHECK(std::count_if(r.network.conduits.begin(), r.network.conduits.end(),
                      [](const model::Conduit& c) { return c.section.shape == hydraulics::Shape::box; }) == 412);
  CHECK(std::count_if(r.network.conduits.begin(), r.network.conduits.end(),
                      [](const model::Conduit& c) { return !c.usable; }) == 3);
}

TEST_CASE("US-unit names and values are recognised", "[io][inspect]") {
  const auto dir = test::fresh_dir("inspect_us");
  // EPSG:2227 is in US survey feet; LENGTH is in feet (3.28 x the line), DIAMETER in inches.
  const std::vector<FieldSpec> pipe_fields{{"FACILITYID", OFTString}, {"US_NODE", OFTString},  {"DS_NODE", OFTString},
                                           {"DIAMETER", OFTInteger},  {"LENGTH", OFTReal},     {"US_INV", OFTReal},
                                           {"DS_INV", OFTReal},       {"MANNINGS_N", OFTReal}, {"Q_CFS", OFTReal}};
  test::write_layer(dir / "net.gpkg", "GPKG", "mains", 2227, wkbLineString, pipe_fields,
                    {{"LINESTRING (0 0,100 0)", {"P1", "A", "B", "12", "100", "50", "49", "0.013", "2"}},
                     {"LINESTRING (100 0,300 0)", {"P2", "B", "C", "18", "200", "49", "47", "0.013", std::nullopt}},
                     {"LINESTRING (300 0,400 0)", {"P3", "C", "D", "24", "100", "47", "46", "0.012", "4"}}});
  GDALAllRegister();
  {
    GDALDatasetUniquePtr ds(GDALDataset::Open((dir / "net.gpkg").string().c_str(), GDAL_OF_VECTOR | GDAL_OF_UPDATE));
    REQUIRE(ds);
    OGRSpatialReference srs;
    srs.importFromEPSG(2227);
    OGRLayer* l = ds->CreateLayer("manholes", &srs, wkbPoint, nullptr);
    for (const char* name : {"MH_ID", "RIM_ELEV", "INV_ELEV", "STRUCT_TYPE"}) {
      OGRFieldDefn d(name, std::string(name).find("ELEV") != std::string::npos ? OFTReal : OFTString);
      REQUIRE(l->CreateField(&d) == OGRERR_NONE);
    }
    OGRFeatureUniquePtr f(OGRFeature::CreateFeature(l->GetLayerDefn()));
    f->SetField(0, "MH1");
    f->SetField(1, 60.0);
    f->SetField(2, 50.0);
    f->SetField(3, "MH");
    f->SetGeometryDirectly(new OGRPoint(0, 0));
    REQUIRE(l->CreateFeature(f.get()) == OGRERR_NONE);
  }
  const mapping::SourceSummary s = mapping::inspect_source((dir / "net.gpkg").string());
  CHECK(s.driver == "GPKG");
  REQUIRE(s.layers.size() == 2);
  const mapping::LayerSummary& mains = s.layers[0];
  CHECK(mains.crs_linear_unit == "US survey foot");
  CHECK(field(mains, "Q_CFS").null_count == 1);
  CHECK(*field(mains, "DIAMETER").median == 18.0);
  const mapping::MappingProposal pm = mapping::propose_mapping(mains);
  auto unit_of = [](const mapping::MappingProposal& m, const char* role) {
    const auto* f = m.find(role);
    REQUIRE(f != nullptr);
    return f->field + ":" + (f->unit ? std::string(units::unit_symbol(*f->unit)) : "");
  };
  CHECK(unit_of(pm, "id") == "FACILITYID:");
  CHECK(unit_of(pm, "from") == "US_NODE:");
  CHECK(unit_of(pm, "to") == "DS_NODE:");
  CHECK(unit_of(pm, "diameter") == "DIAMETER:in");  // median 18 looks like inches
  CHECK(unit_of(pm, "length") == "LENGTH:us_ft");    // 100 ftUS lines, LENGTH 100: ratio 3.28 to metres, the CRS's foot
  CHECK(unit_of(pm, "invert_up") == "US_INV:us_ft");  // the CRS is in US survey feet
  CHECK(unit_of(pm, "invert_down") == "DS_INV:us_ft");
  CHECK(unit_of(pm, "manning_n") == "MANNINGS_N:");
  CHECK(unit_of(pm, "flow") == "Q_CFS:cfs");
  const mapping::MappingProposal sm = mapping::propose_network(&mains, &s.layers[1]).structures;  // levels against the pipes
  CHECK(sm.kind == mapping::LayerKind::structures);
  CHECK(unit_of(sm, "id") == "MH_ID:");
  CHECK(unit_of(sm, "type") == "STRUCT_TYPE:");
  CHECK(unit_of(sm, "rim") == "RIM_ELEV:us_ft");  // no length field: the CRS's unit
  CHECK(unit_of(sm, "invert") == "INV_ELEV:us_ft");
  // The starter project for both layers parses and reads.
  const std::string toml = mapping::starter_project_toml({"net.gpkg", &mains}, {"net.gpkg", &s.layers[1]});
  const config::Project p = config::parse_project(toml, (dir / "run.toml").string());
  CHECK(p.structures.layer == "manholes");
  const gis::ReadResult r = gis::read_network(p);
  CHECK(r.network.conduits.size() == 3);
  CHECK(r.network.conduits[1].section.diameter_m == Approx(18 * 0.0254).epsilon(1e-15));
  REQUIRE(r.network.structures.size() == 1);
  CHECK(*r.network.structures[0].rim_m == Approx(60.0 * 1200.0 / 3937.0).epsilon(1e-15));
  CHECK(r.input_files == std::vector<std::string>{(dir / "net.gpkg").string()});  // one file, listed once
  // Without a layer name, a source of two layers is ambiguous.
  CHECK_THROWS_WITH(
      gis::read_network(config::parse_project("[pipes]\nsource = \"net.gpkg\"\n[pipes.defaults]\n"
                                         "diameter = \"1 m\"\nmanning_n = 0.013\n",
                                         (dir / "run.toml").string())),
      (dir / "net.gpkg").string() +
          ": the pipes source has 2 layers (\"mains\", \"manholes\"); name one with layer = \"...\" in [pipes]");
}

TEST_CASE("inspecting a source that is not there is an input error", "[io][inspect]") {
  try {
    mapping::inspect_source("/nonexistent/x.gpkg");
    FAIL("no error");
  } catch (const Error& e) {
    CHECK(e.kind() == ErrorKind::bad_input);
    CHECK(std::string(e.what()).rfind("/nonexistent/x.gpkg: cannot open the inspected source: ", 0) == 0);
  }
}
