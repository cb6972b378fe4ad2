// Issue 17: `fields --write-project` on a real export renamed the way another city names things, in
// other units and another CRS. The Melbourne Water export (../shared/data/real/melbourne-water-sewer-mains,
// README.txt) is copied through GDAL into a shapefile reprojected to GDA94 / MGA zone 55 (EPSG:28355)
// with: MXUNITID -> PIPE_NO (pipe number), UNITID / UNITID2 -> US_NODE / DS_NODE (node ids),
// UPSTREAM_IL / DOWNSTREAM_IL in metres -> US_INV_FT / DS_INV_FT in feet, PIPE_WIDTH / PIPE_HEIGHT in mm
// -> DIA_IN / HT_IN in inches, PIPE_LENGTH -> LENGTH in feet (no unit in the name). Conversion factors:
// NIST SP 811 (2008), B.8 (ft = 0.3048 m, in = 25.4 mm, exact). Every role must be proposed with the
// right unit, and the starter must run with at most the flows and the tailwater edited.
#include <gdal_priv.h>
#include <ogr_spatialref.h>
#include <ogrsf_frmts.h>

#include <catch2/catch.hpp>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <map>

#include "rimline/config/project.hpp"
#include "rimline/mapping/inspect.hpp"
#include "rimline/run/check_run.hpp"
#include "test_paths.hpp"

using namespace rimline;
namespace fs = std::filesystem;

namespace {

std::string melbourne() {
  return std::string(test::shared_data_dir) + "/real/melbourne-water-sewer-mains/Sewerage_Network_Main_Pipelines.geojson";
}

// The renamed copy; returns its path.
std::string renamed_copy(const fs::path& dir) {
  GDALAllRegister();
  std::unique_ptr<GDALDataset> src(GDALDataset::Open(melbourne().c_str(), GDAL_OF_VECTOR | GDAL_OF_READONLY));
  REQUIRE(src);
  OGRLayer* in = src->GetLayer(0);
  GDALDriver* drv = GetGDALDriverManager()->GetDriverByName("ESRI Shapefile");
  const std::string out_path = (dir / "mains.shp").string();
  std::unique_ptr<GDALDataset> dst(drv->Create(out_path.c_str(), 0, 0, 0, GDT_Unknown, nullptr));
  REQUIRE(dst);
  OGRSpatialReference mga;
  mga.importFromEPSG(28355);
  mga.SetAxisMappingStrategy(OAMS_TRADITIONAL_GIS_ORDER);
  OGRLayer* o = dst->CreateLayer("mains", &mga, wkbLineString, nullptr);
  REQUIRE(o);
  struct Copy {
    const char* from;
    const char* to;
    OGRFieldType type;
    double scale;  // value / scale (0: copied as it is)
  };
  const Copy copies[] = {{"MXUNITID", "PIPE_NO", OFTString, 0},   {"UNITID", "US_NODE", OFTString, 0},
                         {"UNITID2", "DS_NODE", OFTString, 0},    {"OBJECTID", "OBJECTID", OFTInteger, 0},
                         {"COMPKEY", "COMPKEY", OFTInteger, 0},   {"UNITTYPE", "UNITTYPE", OFTString, 0},
                         {"UNITTYPE_DESC", "UTYPE_DESC", OFTString, 0}, {"SEWER_NAME", "SEWER_NAME", OFTString, 0},
                         {"MATERIAL", "MATERIAL", OFTString, 0},  {"UPSTREAM_IL", "US_INV_FT", OFTReal, 0.3048},
                         {"DOWNSTREAM_IL", "DS_INV_FT", OFTReal, 0.3048}, {"PIPE_LENGTH", "LENGTH", OFTReal, 0.3048},
                         {"PIPE_WIDTH", "DIA_IN", OFTReal, 25.4}, {"PIPE_HEIGHT", "HT_IN", OFTReal, 25.4},
                         {"GRADE", "GRADE", OFTReal, 0},          {"MI_PRINX", "MI_PRINX", OFTInteger, 0}};
  for (const auto& c : copies) {
    OGRFieldDefn d(c.to, c.type);
    if (c.type == OFTReal) d.SetWidth(16), d.SetPrecision(4);
    REQUIRE(o->CreateField(&d) == OGRERR_NONE);
  }
  std::unique_ptr<OGRCoordinateTransformation> ct(OGRCreateCoordinateTransformation(in->GetSpatialRef(), &mga));
  REQUIRE(ct);
  for (auto& f : *in) {
    std::unique_ptr<OGRFeature> nf(OGRFeature::CreateFeature(o->GetLayerDefn()));
    for (const auto& c : copies) {
      const int from = f->GetFieldIndex(c.from);
      if (!f->IsFieldSetAndNotNull(from)) continue;
      if (c.scale > 0) nf->SetField(c.to, std::round(f->GetFieldAsDouble(from) / c.scale * 1e4) / 1e4);
      else nf->SetField(c.to, f->GetFieldAsString(from));
    }
    if (const OGRGeometry* g = f->GetGeometryRef()) {
      std::unique_ptr<OGRGeometry> line(OGRGeometryFactory::forceToLineString(g->clone()));
      REQUIRE(line->transform(ct.get()) == OGRERR_NONE);
      nf->SetGeometry(line.get());
    }
    REQUIRE(o->CreateFeature(nf.get()) == OGRERR_NONE);
  }
  return out_path;
}

std::string role(const mapping::MappingProposal& m, const char* r) {
  const auto* f = m.find(r);
  if (!f) return "<none>";
  return f->field + (f->unit ? ":" + std::string(units::unit_symbol(*f->unit)) : "");
}

}  // namespace

TEST_CASE("fields on the renamed Melbourne export: every role with its unit, and the starter runs", "[e2e][fields]") {
  if (!fs::exists(melbourne())) {
    WARN("../shared/data is not beside the project; skipped");
    return;
  }
  const fs::path dir = fs::path(test::binary_dir) / "fields-melbourne-renamed";
  fs::remove_all(dir);
  fs::create_directories(dir);
  const std::string shp = renamed_copy(dir);
  const auto source = mapping::inspect_source(shp);
  REQUIRE(source.layers.size() == 1);
  const auto& layer = source.layers[0];
  const auto p = mapping::propose_network(&layer, nullptr).pipes;
  std::string all;
  for (const auto& f : p.fields) all += f.role + " = " + f.field + " (" + f.reason + ")\n";
  INFO(all);
  CHECK(role(p, "id") == "PIPE_NO");
  CHECK(role(p, "from") == "US_NODE");
  CHECK(role(p, "to") == "DS_NODE");
  CHECK(role(p, "invert_up") == "US_INV_FT:ft");
  CHECK(role(p, "invert_down") == "DS_INV_FT:ft");
  CHECK(role(p, "width") == "DIA_IN:in");
  CHECK(role(p, "height") == "HT_IN:in");
  CHECK(p.shape_from_height);  // README: PIPE_HEIGHT 0 for circular pipes, > 0 for 412 others
  CHECK(role(p, "length") == "LENGTH:ft");
  CHECK(role(p, "material") == "MATERIAL");
  CHECK(role(p, "force_main") == "UNITTYPE");
  std::vector<std::string> pressure;
  for (const auto& v : p.force_main_values) pressure.push_back(v.value);
  std::sort(pressure.begin(), pressure.end());
  CHECK(pressure == std::vector<std::string>{"EO-RM", "RM"});  // README: RM = RISING MAIN; EO-RM its outlets
  for (const auto& f : p.fields) CHECK(f.confidence >= 0.5);

  // The starter, written beside the shapefile, edited only in its flows (a uniform 5 L/s, invented,
  // as tests/data/e2e/melbourne_march.toml does) and run as written otherwise.
  std::string toml = mapping::starter_project_toml({"mains.shp", &layer});
  const std::string placeholder = "default_inflow = \"0.035 cfs\"";
  const auto at = toml.find(placeholder);
  REQUIRE(at != std::string::npos);
  toml.replace(at, placeholder.size(), "default_inflow = \"5 L/s\"");
  std::ofstream(dir / "project.toml") << toml;
  const config::Project project = config::load_project((dir / "project.toml").string());
  const auto r = run::run_check(project, {});
  std::map<std::string, int> codes;
  for (const auto& f : r.findings) ++codes[f.code];
  CHECK(codes["NOTHING_CHECKED"] == 0);
  CHECK(codes["UNIT_SUSPECT"] == 0);
  CHECK(codes["UNIT_NAME_CONFLICT"] == 0);
  CHECK(codes["OUTFALL_ASSUMED"] > 0);  // nothing types an outfall: each network end says so
  CHECK_FALSE(run::checked_nothing(r));
  const auto& net = r.read.network;
  CHECK(net.conduits.size() == 2252);
  std::size_t solved = 0, boxes = 0, mains = 0;
  for (const auto& c : r.cases[0].march.conduits) solved += c.solved;
  for (const auto& c : net.conduits) boxes += c.section.shape == hydraulics::Shape::box, mains += c.force_main;
  CHECK(boxes == 412);  // README
  CHECK(mains == 108);  // 81 RM + 27 EO-RM (README)
  CHECK(solved >= 1900);  // the hand-written mapping solves 1988 (tests/e2e/melbourne_test.cpp)
  // The sample feature of the README: MRM062-MRM061, UPSTREAM_IL 8.347 m, PIPE_WIDTH 760 mm, back
  // from feet and inches to within the 1e-4 rounding of the copy.
  bool seen = false;
  for (const auto& c : net.conduits)
    if (c.id == "MRM062-MRM061") {
      seen = true;
      CHECK(*c.invert_up_m == Approx(8.347).margin(1e-4 * 0.3048));
      CHECK(c.section.diameter_m == Approx(0.760).margin(1e-4 * 0.0254));
      CHECK(c.length_m == Approx(105.69).margin(1e-4 * 0.3048 + 1e-9));
    }
  CHECK(seen);
}
