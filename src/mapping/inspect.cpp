// Reading a source once to summarise its layers and fields (the `fields` command).
#include "rimline/mapping/inspect.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <limits>
#include <memory>
#include <unordered_map>
#include <unordered_set>

#include "gis/gdal_source.hpp"
#include "gis/value_checks.hpp"

namespace rimline::mapping {
// The readers' value checks and GDAL handles are shared with the gis stage.
namespace detail = gis::detail;
namespace {

using detail::format_number;

constexpr std::size_t sample_limit = 10000;    // values kept per field for the median
constexpr std::size_t unique_limit = 2000000;  // distinct values remembered per id-like field
// Metres per degree for the plan-length hint on geographic layers: equirectangular, spherical
// Earth of radius 6371 km (a hint at the unit of a length field, good to ~0.5 %).
constexpr double metres_per_degree = 6371000.0 * 3.14159265358979323846 / 180.0;

bool id_like(const std::string& name) {
  std::string up = name;
  for (char& c : up) c = static_cast<char>(std::toupper(static_cast<unsigned char>(c)));
  return up.find("ID") != std::string::npos || up.find("KEY") != std::string::npos;
}

struct Accumulator {
  FieldSummary s;
  bool numeric_type = false;
  bool text_all_numeric = true;
  std::size_t numeric_values = 0;
  std::size_t zeros = 0;
  std::vector<double> sample;
  std::vector<double> positive;
  std::vector<double> ratios;
  bool track_unique = false;
  std::unordered_set<std::string> seen;
};

double line_length_m(const OGRGeometry* g, bool geographic, double metres_per_unit) {
  if (!g) return 0.0;
  const auto type = wkbFlatten(g->getGeometryType());
  auto simple = [&](const OGRLineString& l) {
    double total = 0.0;
    for (int i = 1; i < l.getNumPoints(); ++i) {
      double dx = l.getX(i) - l.getX(i - 1), dy = l.getY(i) - l.getY(i - 1);
      if (geographic) {
        dx *= metres_per_degree * std::cos(0.5 * (l.getY(i) + l.getY(i - 1)) * 3.14159265358979323846 / 180.0);
        dy *= metres_per_degree;
      } else {
        dx *= metres_per_unit;
        dy *= metres_per_unit;
      }
      total += std::hypot(dx, dy);
    }
    return total;
  };
  if (type == wkbLineString) return simple(*g->toLineString());
  if (type == wkbMultiLineString) {
    double total = 0.0;
    for (const OGRLineString* part : *g->toMultiLineString()) total += simple(*part);
    return total;
  }
  return 0.0;
}

// First and last vertex of a line, or the point, into the rows (in degrees when `to_lonlat`).
void keep_ends(const OGRGeometry* g, OGRCoordinateTransformation* to_lonlat, LayerRows& rows) {
  double x[2] = {std::numeric_limits<double>::quiet_NaN(), std::numeric_limits<double>::quiet_NaN()};
  double y[2] = {x[0], x[1]};
  if (g && !g->IsEmpty()) {
    const auto type = wkbFlatten(g->getGeometryType());
    const OGRLineString* first = nullptr;
    const OGRLineString* last = nullptr;
    if (type == wkbLineString) first = last = g->toLineString();
    if (type == wkbMultiLineString && g->toMultiLineString()->getNumGeometries() > 0) {
      first = g->toMultiLineString()->getGeometryRef(0);
      last = g->toMultiLineString()->getGeometryRef(g->toMultiLineString()->getNumGeometries() - 1);
    }
    if (first && first->getNumPoints() > 0 && last->getNumPoints() > 0) {
      x[0] = first->getX(0), y[0] = first->getY(0);
      x[1] = last->getX(last->getNumPoints() - 1), y[1] = last->getY(last->getNumPoints() - 1);
    } else if (type == wkbPoint) {
      x[0] = x[1] = g->toPoint()->getX();
      y[0] = y[1] = g->toPoint()->getY();
    } else if (type == wkbMultiPoint && g->toMultiPoint()->getNumGeometries() > 0) {
      x[0] = x[1] = g->toMultiPoint()->getGeometryRef(0)->getX();
      y[0] = y[1] = g->toMultiPoint()->getGeometryRef(0)->getY();
    }
    if (to_lonlat && std::isfinite(x[0]) && !to_lonlat->Transform(2, x, y)) x[0] = x[1] = y[0] = y[1] = std::nan("");
  }
  rows.x0.push_back(x[0]);
  rows.y0.push_back(y[0]);
  rows.x1.push_back(x[1]);
  rows.y1.push_back(y[1]);
}

double median_of(std::vector<double>& v) {
  const auto mid = v.begin() + static_cast<std::ptrdiff_t>(v.size() / 2);
  std::nth_element(v.begin(), mid, v.end());
  return *mid;
}

// Keeps row `row` of a field for the inference (numbers and distinct texts).
void keep_value(FieldColumn& col, std::unordered_map<std::string, std::int32_t>& index, OGRFeature& f, int idx) {
  double number = std::numeric_limits<double>::quiet_NaN();
  std::int32_t text = -1;
  if (f.IsFieldSetAndNotNull(idx)) {
    const detail::RawNumber raw = detail::read_number(f, idx);
    if (raw.state == detail::RawNumber::State::number) number = raw.value;
    if (raw.state != detail::RawNumber::State::null) {
      std::string t = f.GetFieldAsString(idx);
      const auto [it, fresh] = index.try_emplace(t, static_cast<std::int32_t>(col.values.size()));
      if (fresh) col.values.push_back(std::move(t));
      text = it->second;
    }
  }
  col.number.push_back(number);
  col.text.push_back(text);
}

void add_value(Accumulator& a, OGRFeature& f, int idx, double line_m) {
  if (!f.IsFieldSetAndNotNull(idx)) {
    ++a.s.null_count;
    return;
  }
  const detail::RawNumber raw = detail::read_number(f, idx);
  if (raw.state == detail::RawNumber::State::null) {  // blank text
    ++a.s.null_count;
    return;
  }
  ++a.s.value_count;
  const bool want_sample = a.s.samples.size() < 3;
  const bool want_unique = a.track_unique && a.s.unique.value_or(true) && a.seen.size() < unique_limit;
  if (want_sample || want_unique) {  // formatting numbers as text is the costly part; skip it when not needed
    const char* text = f.GetFieldAsString(idx);
    if (want_sample && std::find(a.s.samples.begin(), a.s.samples.end(), text) == a.s.samples.end())
      a.s.samples.emplace_back(text);
    if (want_unique && !a.seen.emplace(text).second) a.s.unique = false;
  }
  if (raw.state == detail::RawNumber::State::not_finite) return;  // NaN / inf: no place in min, max, median
  if (raw.state != detail::RawNumber::State::number) {
    a.text_all_numeric = false;
    return;
  }
  const double v = raw.value;
  ++a.numeric_values;
  a.s.min = a.s.min ? std::min(*a.s.min, v) : v;
  a.s.max = a.s.max ? std::max(*a.s.max, v) : v;
  if (v == 0.0) ++a.zeros;
  if (a.sample.size() < sample_limit) a.sample.push_back(v);
  if (v > 0.0 && a.positive.size() < sample_limit) a.positive.push_back(v);
  if (line_m > 0.0 && a.ratios.size() < sample_limit) a.ratios.push_back(v / line_m);
}

LayerSummary summarise(OGRLayer& layer) {
  LayerSummary out;
  out.name = layer.GetName();
  out.declared_geometry = OGRGeometryTypeToName(layer.GetGeomType());
  if (const OGRSpatialReference* srs = layer.GetSpatialRef()) {
    out.crs_name = srs->GetName() ? srs->GetName() : "";
    if (srs->GetAuthorityName(nullptr) && srs->GetAuthorityCode(nullptr))
      out.crs_id = std::string(srs->GetAuthorityName(nullptr)) + ":" + srs->GetAuthorityCode(nullptr);
    out.crs_geographic = srs->IsGeographic();
    if (srs->IsProjected()) {
      const char* unit = nullptr;
      out.crs_metres_per_unit = srs->GetLinearUnits(&unit);
      out.crs_linear_unit = unit ? unit : "";
    }
  }
  OGRFeatureDefn* defn = layer.GetLayerDefn();
  std::vector<Accumulator> acc(static_cast<std::size_t>(defn->GetFieldCount()));
  for (int i = 0; i < defn->GetFieldCount(); ++i) {
    Accumulator& a = acc[static_cast<std::size_t>(i)];
    const OGRFieldDefn* fd = defn->GetFieldDefn(i);
    a.s.name = fd->GetNameRef();
    a.s.type = OGRFieldDefn::GetFieldTypeName(fd->GetType());
    a.numeric_type = fd->GetType() == OFTInteger || fd->GetType() == OFTInteger64 || fd->GetType() == OFTReal;
    a.track_unique = id_like(a.s.name);
    if (a.track_unique) a.s.unique = true;
  }
  LayerRows& rows = out.rows;
  rows.columns.resize(acc.size());
  std::vector<std::unordered_map<std::string, std::int32_t>> text_index(acc.size());
  std::unique_ptr<OGRCoordinateTransformation> to_lonlat;
  if (const OGRSpatialReference* srs = layer.GetSpatialRef()) {
    OGRSpatialReference src(*srs), wgs84;
    src.SetAxisMappingStrategy(OAMS_TRADITIONAL_GIS_ORDER);
    wgs84.importFromEPSG(4326);
    wgs84.SetAxisMappingStrategy(OAMS_TRADITIONAL_GIS_ORDER);
    to_lonlat.reset(OGRCreateCoordinateTransformation(&src, &wgs84));
    rows.lonlat = to_lonlat != nullptr;
  }
  layer.ResetReading();
  for (;;) {
    OGRFeatureUniquePtr f(layer.GetNextFeature());
    if (!f) break;
    ++out.feature_count;
    const OGRGeometry* g = f->GetGeometryRef();
    ++out.geometry_counts[g && !g->IsEmpty() ? g->getGeometryName() : "(none)"];
    const double line_m = line_length_m(g, out.crs_geographic, out.crs_metres_per_unit);
    for (int i = 0; i < defn->GetFieldCount(); ++i) add_value(acc[static_cast<std::size_t>(i)], *f, i, line_m);
    if (rows.count < LayerRows::max_rows) {
      ++rows.count;
      for (int i = 0; i < defn->GetFieldCount(); ++i)
        keep_value(rows.columns[static_cast<std::size_t>(i)], text_index[static_cast<std::size_t>(i)], *f, i);
      keep_ends(g, to_lonlat.get(), rows);
      rows.length_m.push_back(line_m);
    }
  }
  OGREnvelope env;
  if (out.feature_count > 0 && layer.GetExtent(&env, TRUE) == OGRERR_NONE) {
    out.min_x = env.MinX;
    out.min_y = env.MinY;
    out.max_x = env.MaxX;
    out.max_y = env.MaxY;
  }
  for (Accumulator& a : acc) {
    const bool numeric = a.numeric_values > 0 && (a.numeric_type || a.text_all_numeric);
    if (!numeric) {
      a.s.min.reset();
      a.s.max.reset();
    } else {
      a.s.median = median_of(a.sample);
      if (!a.positive.empty()) a.s.median_positive = median_of(a.positive);
      a.s.zero_fraction = static_cast<double>(a.zeros) / static_cast<double>(a.numeric_values);
      if (!a.ratios.empty()) a.s.median_ratio_to_line_length = median_of(a.ratios);
    }
    if (a.track_unique && a.seen.size() >= unique_limit && a.s.unique.value_or(false)) a.s.unique.reset();
    out.fields.push_back(std::move(a.s));
  }
  return out;
}

std::size_t count_of(const LayerSummary& l, std::initializer_list<const char*> names) {
  std::size_t n = 0;
  for (const char* name : names) {
    const auto it = l.geometry_counts.find(name);
    if (it != l.geometry_counts.end()) n += it->second;
  }
  return n;
}

}  // namespace

bool LayerSummary::lines() const {
  return feature_count > 0 &&
         2 * count_of(*this, {"LINESTRING", "MULTILINESTRING"}) > static_cast<std::size_t>(feature_count);
}

bool LayerSummary::points() const {
  return feature_count > 0 && 2 * count_of(*this, {"POINT", "MULTIPOINT"}) > static_cast<std::size_t>(feature_count);
}

SourceSummary inspect_source(const std::string& source, const std::vector<std::string>& open_options) {
  SourceSummary out;
  out.source = detail::printable_source(source);
  const detail::OpenedSource opened = detail::open_dataset(config::LayerSource{source, "", open_options, "", ""}, "inspected");
  const GDALDatasetUniquePtr& ds = opened.dataset;
  detail::GdalErrorCapture quiet;  // read warnings are not the point of an inspection
  if (GDALDriver* d = ds->GetDriver()) out.driver = d->GetDescription();
  for (int i = 0; i < ds->GetLayerCount(); ++i) out.layers.push_back(summarise(*ds->GetLayer(i)));
  return out;
}

}  // namespace rimline::mapping
