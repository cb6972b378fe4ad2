// Catchment layer -> model::Catchment: area from the polygon in the run CRS, C from a field, the
// land-use composite or the default, inlet time from a field or the default.
#include "gis/read_catchments.hpp"

#include <algorithm>
#include <cmath>
#include <memory>

#include "gis/duplicate_ids.hpp"
#include "gis/read_layers.hpp"
#include "gis/value_checks.hpp"

namespace rimline::gis::detail {
namespace {

using units::Dimension;

struct LandUsePolygon {
  std::unique_ptr<OGRGeometry> geometry;  // in the run CRS, as stored (not scaled)
  OGREnvelope envelope;
  double runoff_c;
};

// Exterior rings and holes scaled to metres, and the area-weighted centroid of the exterior rings.
// The polygons of a repaired geometry as one multipolygon (make-valid may return a collection
// holding the lines and points a ring collapsed to); null when no polygon is left.
OGRGeometryUniquePtr polygons_only(OGRGeometryUniquePtr g) {
  if (!g) return nullptr;
  auto out = std::make_unique<OGRMultiPolygon>();
  auto take = [&out](const OGRGeometry& part) {
    const auto t = wkbFlatten(part.getGeometryType());
    if (t == wkbPolygon) out->addGeometry(&part);
    if (t == wkbMultiPolygon)
      for (const auto* poly : *part.toMultiPolygon()) out->addGeometry(poly);
  };
  const auto t = wkbFlatten(g->getGeometryType());
  if (t == wkbGeometryCollection)
    for (const auto* part : *g->toGeometryCollection()) take(*part);
  else
    take(*g);
  if (out->IsEmpty() || !(out->get_Area() > 0.0)) return nullptr;
  return OGRGeometryUniquePtr(out.release());
}

void rings_of(const OGRGeometry& g, double scale, model::Catchment& k) {
  double sx = 0.0, sy = 0.0, sa = 0.0;
  auto take = [&](const OGRPolygon& poly) {
    const OGRLinearRing* r = poly.getExteriorRing();
    if (!r) return;
    std::vector<model::Point2> ring;
    for (int i = 0; i < r->getNumPoints(); ++i) ring.push_back({r->getX(i) * scale, r->getY(i) * scale});
    for (std::size_t i = 0, j = ring.size() - 1; i < ring.size(); j = i++) {  // shoelace centroid
      const double cross = ring[j].x * ring[i].y - ring[i].x * ring[j].y;
      sa += cross;
      sx += (ring[j].x + ring[i].x) * cross;
      sy += (ring[j].y + ring[i].y) * cross;
    }
    k.rings.push_back(std::move(ring));
    for (int h = 0; h < poly.getNumInteriorRings(); ++h) {
      const OGRLinearRing* hole = poly.getInteriorRing(h);
      std::vector<model::Point2> pts;
      for (int i = 0; i < hole->getNumPoints(); ++i) pts.push_back({hole->getX(i) * scale, hole->getY(i) * scale});
      k.holes.push_back(std::move(pts));
    }
  };
  const auto type = wkbFlatten(g.getGeometryType());
  if (type == wkbPolygon) take(*g.toPolygon());
  if (type == wkbMultiPolygon)
    for (const auto* part : *g.toMultiPolygon()) take(*part);
  if (sa != 0.0) k.centroid = {sx / (3.0 * sa), sy / (3.0 * sa)};
}

std::vector<LandUsePolygon> read_land_use(const Project& p, const PolygonLayer& lu, Findings& findings) {
  std::vector<LandUsePolygon> out;
  const int col_c = field_index(lu.source, p.catchments.land_use_runoff_c, "land_use.runoff_c");
  OGRLayer& layer = *lu.source.layer;
  layer.ResetReading();
  for (;;) {
    OGRFeatureUniquePtr f(layer.GetNextFeature());
    if (!f) break;
    const std::string id = "land use fid " + std::to_string(f->GetFID());
    const FeatureRef who{LayerRole::catchments, id, findings};
    OGRGeometry* g = f->GetGeometryRef();
    const auto type = g ? wkbFlatten(g->getGeometryType()) : wkbUnknown;
    if (!g || g->IsEmpty() || (type != wkbPolygon && type != wkbMultiPolygon) ||
        (lu.placement.to_run && g->transform(lu.placement.to_run) != OGRERR_NONE)) {
      who.add("DATA_GEOMETRY", Severity::warning, "", "The land-use feature has no usable polygon; it is left out.");
      continue;
    }
    const RawNumber raw = read_number(*f, col_c);
    const auto c = checked_number(raw, p.catchments.land_use_runoff_c, "the land-use feature is left out", who);
    if (!c || !(*c >= 0.0 && *c <= 1.0)) {
      if (c || raw.state == RawNumber::State::null)
        who.add("DATA_IMPLAUSIBLE", Severity::warning, p.catchments.land_use_runoff_c,
                p.catchments.land_use_runoff_c + " is empty or outside 0 to 1; the land-use feature is left out.");
      continue;
    }
    LandUsePolygon l{std::unique_ptr<OGRGeometry>(g->clone()), {}, *c};
    l.geometry->getEnvelope(&l.envelope);
    out.push_back(std::move(l));
  }
  return out;
}

class CatchmentReader {
 public:
  CatchmentReader(const Project& p, PolygonLayer& layer, Findings& findings)
      : p_(p), f_(p.catchments.fields), layer_(layer), findings_(findings) {
    auto idx = [&](const std::string& name, const char* key) {
      return field_index(layer.source, name, std::string("catchments.fields.") + key);
    };
    id_ = idx(f_.id, "id");
    structure_ = idx(f_.structure, "structure");
    c_ = idx(f_.runoff_c, "runoff_c");
    population_ = idx(f_.population, "population");
    inlet_ = idx(f_.inlet_time.field, "inlet_time");
  }

  bool read(OGRFeature& feature, const std::vector<LandUsePolygon>& land_use, model::Catchment& k) {
    k.fid = feature.GetFID();
    const IdText read_as = read_id(feature, id_);
    auto id = read_as.id;
    k.id = id ? std::move(*id) : "fid " + std::to_string(k.fid);
    const FeatureRef who{LayerRole::catchments, k.id, findings_};
    report_inexact_id(read_as, p_.catchments.fields.id, who);
    OGRGeometry* g = feature.GetGeometryRef();
    const double scale = layer_.placement.metres_per_unit;
    if (!g || g->IsEmpty()) {
      who.add("DATA_GEOMETRY", Severity::error, "", "The catchment has no geometry; it is left out.");
      return false;
    }
    const auto type = wkbFlatten(g->getGeometryType());
    if (type != wkbPolygon && type != wkbMultiPolygon) {
      who.add("DATA_GEOMETRY", Severity::error, "",
              "The geometry is a " + std::string(g->getGeometryName()) + ", not a polygon; the catchment is left out.");
      return false;
    }
    if (layer_.placement.to_run && g->transform(layer_.placement.to_run) != OGRERR_NONE) {
      who.add("DATA_GEOMETRY", Severity::error, "",
              "The geometry could not be transformed into the run CRS; the catchment is left out.");
      return false;
    }
    // A self-intersecting ring (a bow-tie) has a signed area that cancels part of itself: one whose
    // true area is 333 m2 read as 200 m2 (issue 18, defect 5). Invalid polygons are repaired with
    // GEOS make-valid (OGC Simple Features validity, ISO 19125-1 6.1.11) and the repair's area is used.
    OGRGeometryUniquePtr repaired;
    bool valid = true;
    {
      GdalErrorCapture quiet;  // GEOS's "Self-intersection at or near point ..." is said by the finding below
      valid = g->IsValid();
    }
    if (!valid) {
      const double drawn = (type == wkbPolygon ? g->toPolygon()->get_Area() : g->toMultiPolygon()->get_Area()) * scale * scale;
      repaired = polygons_only(OGRGeometryUniquePtr(g->MakeValid()));
      if (!repaired) {
        who.add("DATA_GEOMETRY", Severity::error, "", "The polygon has no area; the catchment is left out.");
        return false;
      }
      g = repaired.get();
      const double used = g->toMultiPolygon()->get_Area() * scale * scale;
      who.add("DATA_GEOMETRY", Severity::warning, "",
              "The polygon is invalid (its rings cross or touch themselves); it was repaired (GEOS make-valid) and "
              "its area " + q(used, Dimension::area) + " is used (the rings as drawn give " + q(drawn, Dimension::area) +
                  ").",
              used, std::numeric_limits<double>::quiet_NaN(), Dimension::area);
    }
    const auto kind = wkbFlatten(g->getGeometryType());
    const double area_units = kind == wkbPolygon ? g->toPolygon()->get_Area() : g->toMultiPolygon()->get_Area();
    k.area_m2 = area_units * scale * scale;
    if (!(k.area_m2 > 0.0)) {
      who.add("DATA_GEOMETRY", Severity::error, "", "The polygon has no area; the catchment is left out.");
      return false;
    }
    rings_of(*g, scale, k);
    if (auto s = read_text(feature, structure_)) k.structure_id = std::move(*s);
    // Each flows mode reads only its own inputs: a sanitary run needs no runoff coefficient, a storm
    // run no population.
    if (p_.flow_mode == FlowMode::rational) {
      if (!read_runoff_c(feature, who, k)) return false;
      if (!land_use.empty()) composite_c(*g, land_use, who, k);
      read_inlet_time(feature, who, k);
    } else {
      read_population(feature, who, k);
    }
    return true;
  }

 private:
  bool read_runoff_c(OGRFeature& feature, const FeatureRef& who, model::Catchment& k) {
    const auto fallback = p_.catchments.default_runoff_c;
    const std::string use = fallback ? "the default C " + format_number(*fallback) + " is used"
                                     : std::string("no default C is set, so the catchment is left out");
    std::optional<double> c;
    if (c_ >= 0) {
      const RawNumber raw = read_number(feature, c_);
      if (raw.state == RawNumber::State::null)
        who.add("DATA_MISSING", fallback ? Severity::info : Severity::error, f_.runoff_c,
                f_.runoff_c + " is empty; " + use + ".");
      else if (const auto v = checked_number(raw, f_.runoff_c, use, who); v && !(*v >= 0.0 && *v <= 1.0))
        who.add("DATA_IMPLAUSIBLE", fallback ? Severity::warning : Severity::error, f_.runoff_c,
                f_.runoff_c + " " + format_number(*v) + " is outside 0 to 1; " + use + ".", *v, *v < 0.0 ? 0.0 : 1.0);
      else
        c = v;
    } else if (!fallback && p_.catchments.land_use.source.empty()) {
      who.add("DATA_MISSING", Severity::error, "",
              "No runoff coefficient: map catchments.fields.runoff_c or set "
              "[catchments.defaults] runoff_c; the catchment is left out.");
    }
    if (!c) c = fallback;
    if (!c && p_.catchments.land_use.source.empty()) return false;
    k.runoff_c = c.value_or(0.0);
    own_c_known_ = c.has_value();
    return true;
  }

  // C = (sum C_lu A_overlap + C_own A_uncovered) / A, the overlaps by polygon intersection.
  void composite_c(const OGRGeometry& g, const std::vector<LandUsePolygon>& land_use, const FeatureRef& who,
                   model::Catchment& k) {
    const double scale2 = layer_.placement.metres_per_unit * layer_.placement.metres_per_unit;
    OGREnvelope env;
    g.getEnvelope(&env);
    double covered = 0.0, ca = 0.0;
    for (const auto& l : land_use) {
      if (!env.Intersects(l.envelope)) continue;
      std::unique_ptr<OGRGeometry> overlap(g.Intersection(l.geometry.get()));
      if (!overlap || overlap->IsEmpty()) continue;
      const auto t = wkbFlatten(overlap->getGeometryType());
      double a = 0.0;
      if (t == wkbPolygon)
        a = overlap->toPolygon()->get_Area();
      else if (t == wkbMultiPolygon)
        a = overlap->toMultiPolygon()->get_Area();
      else if (t == wkbGeometryCollection)
        a = overlap->toGeometryCollection()->get_Area();
      covered += a * scale2;
      ca += l.runoff_c * a * scale2;
    }
    if (covered > k.area_m2 * 1.001) {
      who.add("DATA_IMPLAUSIBLE", Severity::warning, "",
              "land-use polygons overlap inside the catchment (" + q(covered, Dimension::area) + " over " +
                  q(k.area_m2, Dimension::area) + "); their composite C is scaled to the catchment area.");
      ca *= k.area_m2 / covered;
      covered = k.area_m2;
    }
    const double uncovered = std::max(k.area_m2 - covered, 0.0);
    if (covered > 0.0 && uncovered > 0.01 * k.area_m2) {  // partly covered: say what the rest took
      if (!own_c_known_) {
        who.add("DATA_MISSING", Severity::warning, "",
                q(uncovered, Dimension::area) +
                    " of the catchment lies outside every land-use polygon and it has no C "
                    "of its own; that part is taken as C 0.");
      } else {
        who.add("DATA_MISSING", Severity::info, "",
                q(uncovered, Dimension::area) +
                    " of the catchment lies outside every land-use polygon; that part takes C " +
                    format_number(k.runoff_c) + ".");
      }
    }
    k.runoff_c = (ca + k.runoff_c * uncovered) / k.area_m2;
  }

  void read_inlet_time(OGRFeature& feature, const FeatureRef& who, model::Catchment& k) {
    const double fallback = p_.catchments.default_inlet_time_s;
    k.inlet_time_s = fallback;
    if (inlet_ < 0) return;
    const std::string use = "the default inlet time " + q(fallback, Dimension::time) + " is used";
    const RawNumber raw = read_number(feature, inlet_);
    if (raw.state == RawNumber::State::null) {
      who.add("DATA_MISSING", Severity::info, f_.inlet_time.field, f_.inlet_time.field + " is empty; " + use + ".");
      return;
    }
    const auto v = checked_number(raw, f_.inlet_time.field, use, who);
    if (!v) return;
    const double si = units::to_si(*v, f_.inlet_time.unit);
    if (si < 0.0) {
      who.add("DATA_IMPLAUSIBLE", Severity::warning, f_.inlet_time.field,
              f_.inlet_time.field + " " + format_value(*v, f_.inlet_time.unit) + " is negative; " + use + ".", si, 0.0,
              Dimension::time);
      return;
    }
    k.inlet_time_s = si;
  }

  void read_population(OGRFeature& feature, const FeatureRef& who, model::Catchment& k) {
    if (population_ < 0) return;
    const RawNumber raw = read_number(feature, population_);
    const char* none = "the catchment adds no population";
    if (raw.state == RawNumber::State::null) {
      who.add("DATA_MISSING", Severity::info, f_.population, f_.population + " is empty; " + none + ".");
      return;
    }
    const auto v = checked_number(raw, f_.population, none, who);
    if (v && *v < 0.0) {
      who.add("DATA_IMPLAUSIBLE", Severity::warning, f_.population,
              f_.population + " " + format_number(*v) + " is negative; " + none + ".", *v, 0.0);
      return;
    }
    if (v) k.population = *v;
  }

  const Project& p_;
  const CatchmentFields& f_;
  PolygonLayer& layer_;
  Findings& findings_;
  int id_, structure_, c_, population_, inlet_;
  bool own_c_known_ = false;
};

}  // namespace

void read_catchments(const Project& project, PolygonLayer catchments, const PolygonLayer* land_use,
                     std::vector<model::Catchment>& out, Findings& findings) {
  CatchmentReader reader(project, catchments, findings);
  const std::vector<LandUsePolygon> polygons =
      land_use ? read_land_use(project, *land_use, findings) : std::vector<LandUsePolygon>{};
  OGRLayer& layer = *catchments.source.layer;
  GdalErrorCapture capture;
  GdalMessageSink gdal(LayerRole::catchments, findings);
  layer.ResetReading();
  for (;;) {
    OGRFeatureUniquePtr feature(layer.GetNextFeature());
    if (!feature) break;
    model::Catchment& k = out.emplace_back();
    const std::size_t first_finding = findings.size();
    const bool kept = reader.read(*feature, polygons, k);
    gdal.take(capture, k.id);
    stamp_fid(findings, first_finding, feature->GetFID());
    if (!kept) out.pop_back();
  }
  gdal.finish(capture);
  std::vector<IdRef> ids;
  for (const auto& k : out) ids.push_back({k.id, k.fid});
  report_duplicate_ids(ids, LayerRole::catchments, project.catchments.fields.id, "catchments",
                       "so findings that name it are ambiguous", findings,
                       [&](std::int64_t fid) { return raw_text_by_fid(layer, project.catchments.fields.id, fid); });
}

void read_catchment_layers(const Project& project, const RunCrs& crs, ReadResult& result) {
  // Only the flows modes that use them read the polygons: a broken catchment file must not stop a
  // run whose flows come from elsewhere.
  const bool used = project.flow_mode == FlowMode::rational || project.flow_mode == FlowMode::sanitary;
  if (project.catchments.source.source.empty() || !used) return;
  auto add_files = [&result](const OpenLayer& l) { add_input_files(result.input_files, result.read_hashes, l); };
  OpenLayer k = open_layer(project.catchments.source, "catchments");
  require_geometry_and_features(k, "catchments");
  const TransformPtr k_to_run = transform_into_run(k, crs, project.crs_override);
  PolygonLayer catchments{k, Placement{k_to_run.get(), crs.metres_per_unit, crs.z_metres_per_unit}};
  add_files(k);
  if (project.catchments.land_use.source.empty()) {
    read_catchments(project, catchments, nullptr, result.catchments, result.findings);
    return;
  }
  OpenLayer lu = open_layer(project.catchments.land_use, "land_use");
  require_geometry_and_features(lu, "land_use");
  const TransformPtr lu_to_run = transform_into_run(lu, crs, project.crs_override);
  const PolygonLayer land_use{lu, Placement{lu_to_run.get(), crs.metres_per_unit, crs.z_metres_per_unit}};
  add_files(lu);
  read_catchments(project, catchments, &land_use, result.catchments, result.findings);
}

}  // namespace rimline::gis::detail
