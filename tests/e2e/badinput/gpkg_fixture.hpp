#pragma once
// GeoPackage and reprojected copies of the fixture's GeoJSON layers, made through GDAL, for the
// CRS and corrupt-file cases.
#include <gdal_priv.h>
#include <ogr_spatialref.h>
#include <ogrsf_frmts.h>

#include <memory>
#include <string>

#include "e2e/badinput/fixture.hpp"

namespace rimline::badinput {

// Copies the single layer of `geojson` into a new GeoPackage `gpkg` (layer `layer`) with the
// given CRS: epsg > 0 assigns (and, when `reproject`, transforms coordinates to) that EPSG code;
// epsg == 0 writes the layer with no CRS at all.
inline void copy_layer(const std::string& geojson, const std::string& out, const std::string& driver,
                       const std::string& layer, int epsg, bool reproject) {
  GDALAllRegister();
  std::unique_ptr<GDALDataset> src(GDALDataset::Open(geojson.c_str(), GDAL_OF_VECTOR));
  REQUIRE(src);
  OGRLayer* in = src->GetLayer(0);
  GDALDriver* drv = GetGDALDriverManager()->GetDriverByName(driver.c_str());
  REQUIRE(drv);
  std::unique_ptr<GDALDataset> dst(drv->Create(out.c_str(), 0, 0, 0, GDT_Unknown, nullptr));
  REQUIRE(dst);
  OGRSpatialReference srs;
  srs.SetAxisMappingStrategy(OAMS_TRADITIONAL_GIS_ORDER);
  if (epsg > 0) REQUIRE(srs.importFromEPSG(epsg) == OGRERR_NONE);
  OGRLayer* o = dst->CreateLayer(layer.c_str(), epsg > 0 ? &srs : nullptr, in->GetGeomType(), nullptr);
  REQUIRE(o);
  OGRFeatureDefn* defn = in->GetLayerDefn();
  for (int i = 0; i < defn->GetFieldCount(); ++i) REQUIRE(o->CreateField(defn->GetFieldDefn(i)) == OGRERR_NONE);
  std::unique_ptr<OGRCoordinateTransformation> ct;
  if (reproject) {
    ct.reset(OGRCreateCoordinateTransformation(in->GetSpatialRef(), &srs));
    REQUIRE(ct);
  }
  for (auto& f : *in) {
    std::unique_ptr<OGRFeature> nf(OGRFeature::CreateFeature(o->GetLayerDefn()));
    REQUIRE(nf->SetFrom(f.get(), TRUE) == OGRERR_NONE);
    if (ct && nf->GetGeometryRef()) REQUIRE(nf->GetGeometryRef()->transform(ct.get()) == OGRERR_NONE);
    REQUIRE(o->CreateFeature(nf.get()) == OGRERR_NONE);
  }
}

}  // namespace rimline::badinput
