#pragma once
// Writes small vector layers with GDAL into a temporary directory, so the reading tests build
// their inputs from literals next to the checks instead of depending on files in the tree.
#include <gdal_priv.h>
#include <ogrsf_frmts.h>

#include <catch2/catch.hpp>

#include <filesystem>
#include <optional>
#include <string>
#include <vector>

namespace rimline::test {

struct FieldSpec {
  std::string name;
  OGRFieldType type = OFTString;
};

struct Row {
  std::string wkt;                                 // "" for a feature without geometry
  std::vector<std::optional<std::string>> values;  // one per field, nullopt = null
};

inline std::filesystem::path fresh_dir(const std::string& name) {
  const auto dir = std::filesystem::temp_directory_path() / ("rimline_io_" + name);
  std::filesystem::remove_all(dir);
  std::filesystem::create_directories(dir);
  return dir;
}

// epsg 0 = no CRS. Returns the path written.
inline std::string write_layer(const std::filesystem::path& path, const char* driver_name,
                               const std::string& layer_name, int epsg, OGRwkbGeometryType type,
                               const std::vector<FieldSpec>& fields, const std::vector<Row>& rows) {
  GDALAllRegister();
  GDALDriver* driver = GetGDALDriverManager()->GetDriverByName(driver_name);
  REQUIRE(driver != nullptr);
  GDALDatasetUniquePtr ds(driver->Create(path.string().c_str(), 0, 0, 0, GDT_Unknown, nullptr));
  REQUIRE(ds != nullptr);
  OGRSpatialReference srs;
  if (epsg) {
    srs.importFromEPSG(epsg);
    srs.SetAxisMappingStrategy(OAMS_TRADITIONAL_GIS_ORDER);
  }
  OGRLayer* layer = ds->CreateLayer(layer_name.c_str(), epsg ? &srs : nullptr, type, nullptr);
  REQUIRE(layer != nullptr);
  for (const auto& f : fields) {
    OGRFieldDefn defn(f.name.c_str(), f.type);
    REQUIRE(layer->CreateField(&defn) == OGRERR_NONE);
  }
  for (const auto& r : rows) {
    OGRFeatureUniquePtr feature(OGRFeature::CreateFeature(layer->GetLayerDefn()));
    for (std::size_t i = 0; i < fields.size() && i < r.values.size(); ++i) {
      if (r.values[i])
        feature->SetField(static_cast<int>(i), r.values[i]->c_str());
      else
        feature->SetFieldNull(static_cast<int>(i));
    }
    if (!r.wkt.empty()) {
      OGRGeometry* g = nullptr;
      REQUIRE(OGRGeometryFactory::createFromWkt(r.wkt.c_str(), epsg ? &srs : nullptr, &g) == OGRERR_NONE);
      feature->SetGeometryDirectly(g);
    }
    REQUIRE(layer->CreateFeature(feature.get()) == OGRERR_NONE);
  }
  return path.string();
}

}  // namespace rimline::test
