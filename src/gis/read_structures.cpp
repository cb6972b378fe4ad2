// Structure layer -> model::Structure. A structure without a usable point is left out; every
// other problem keeps the structure with the value unknown or defaulted, as its finding says.

#include "gis/duplicate_ids.hpp"
#include "gis/read_layers.hpp"
#include "gis/value_checks.hpp"

namespace rimline::gis::detail {
namespace {

using units::Dimension;

// Access holes and chambers: 0.3 m (a cleanout riser) to 30 m (a large junction chamber);
// common practice, no source.
constexpr double structure_diameter_min_m = 0.3, structure_diameter_max_m = 30.0;
// A structure loss coefficient above 10 velocity heads is a data error (common practice, no source).
constexpr double loss_k_max = 10.0;

struct Columns {
  int id, type, loss_k, rim, invert, diameter, inflow, tailwater, population, outfall;
};

Columns resolve(const Project& p, const OpenLayer& l) {
  const StructureFields& f = p.structure_fields;
  auto idx = [&l](const std::string& name, const char* key) {
    return field_index(l, name, std::string("structures.fields.") + key);
  };
  return {idx(f.id, "id"),
          idx(f.type, "type"),
          idx(f.loss_k, "loss_k"),
          idx(f.rim.field, "rim"),
          idx(f.invert.field, "invert"),
          idx(f.diameter.field, "diameter"),
          idx(f.inflow.field, "inflow"),
          idx(f.tailwater.field, "tailwater"),
          idx(f.population, "population"),
          field_index(l, p.outfalls.field, "outfalls.field")};
}

bool find_in(const std::vector<std::string>& values, const std::string& v) {
  for (const auto& x : values)
    if (same_ignoring_case(x, v)) return true;
  return false;
}

std::optional<model::StructureKind> kind_of(const std::string& name) {
  using K = model::StructureKind;
  for (K k : {K::manhole, K::inlet, K::junction, K::outfall, K::pump_station})
    if (model::structure_kind_name(k) == name) return k;
  return std::nullopt;
}

class StructureReader {
 public:
  explicit StructureReader(LayerRead& in)
      : in_(in), p_(in.project), f_(in.project.structure_fields), col_(resolve(in.project, in.source)) {
    size_limits_ = p_.plausibility;
    size_limits_.diameter_min_m = structure_diameter_min_m;
    size_limits_.diameter_max_m = structure_diameter_max_m;
  }

  // False when the structure is left out (no usable point).
  bool read(OGRFeature& feature, model::Structure& s) {
    s.fid = feature.GetFID();
    const IdText id_read = gis::detail::read_id(feature, col_.id);
    auto id = id_read.id;
    s.id = id ? std::move(*id) : "fid " + std::to_string(s.fid);
    const FeatureRef who{LayerRole::structures, s.id, in_.findings};
    report_inexact_id(id_read, f_.id, who);
    if (col_.id >= 0 && !id)
      who.add("DATA_MISSING", Severity::warning, f_.id,
              f_.id + " is empty; the structure is reported as \"" + s.id + "\".");
    if (!read_location(feature, s, who)) return false;
    read_kind(feature, s, who);
    if (col_.outfall >= 0)  // [outfalls] field / values: an outfall the type field does not say
      if (const auto v = read_text(feature, col_.outfall); v && find_in(p_.outfalls.values, *v)) s.kind = model::StructureKind::outfall;
    if (col_.rim >= 0) s.rim_m = checked_level(read_number(feature, col_.rim), f_.rim, "rim", p_.plausibility, who);
    if (col_.invert >= 0)
      s.invert_m = checked_level(read_number(feature, col_.invert), f_.invert, "invert", p_.plausibility, who);
    if (s.rim_m && s.invert_m && *s.invert_m > *s.rim_m) {  // one of them is wrong; a flood there would be false
      who.add("DATA_IMPLAUSIBLE", Severity::warning, f_.rim.field,
              f_.rim.field + " " + q(*s.rim_m, Dimension::length) + " is below the invert " + f_.invert.field + " " +
                  q(*s.invert_m, Dimension::length) + "; the rim is unknown.",
              *s.rim_m, *s.invert_m, Dimension::length);
      s.rim_m.reset();
    }
    if (col_.tailwater >= 0) {  // a tailwater of exactly 0 is a real level at a sea outfall
      const RawNumber raw = read_number(feature, col_.tailwater);
      if (raw.state != RawNumber::State::null)
        s.tailwater_m = checked_level(raw, f_.tailwater, "tailwater level", p_.plausibility, who, false);
    }
    read_diameter(feature, s, who);
    read_loss_and_inflow(feature, s, who);
    read_population(feature, s, who);
    return true;
  }

 private:
  bool read_location(OGRFeature& feature, model::Structure& s, const FeatureRef& who) {
    std::string type;
    switch (read_point(feature.GetGeometryRef(), in_.placement, s.location, type)) {
      case PointStatus::ok:
        return true;
      case PointStatus::missing:
        who.add("DATA_GEOMETRY", Severity::error, "", "The structure has no geometry; it is left out.");
        return false;
      case PointStatus::wrong_type:
        who.add("DATA_GEOMETRY", Severity::error, "",
                "The geometry is a " + type + ", not a point; the structure is left out.");
        return false;
      case PointStatus::transform_failed:
        who.add("DATA_GEOMETRY", Severity::error, "",
                "The geometry could not be transformed into the run CRS; the structure is left out.");
        return false;
    }
    return false;
  }

  void read_kind(OGRFeature& feature, model::Structure& s, const FeatureRef& who) {
    s.kind = model::StructureKind::manhole;
    if (col_.type < 0) {
      in_.defaults.add(LayerRole::structures, "type", "unmapped", s.id,
                       [] { return std::string("kind manhole (no structures.fields.type mapped)"); });
      return;
    }
    auto text = read_text(feature, col_.type);
    if (!text) {
      who.add("DATA_MISSING", Severity::info, f_.type, f_.type + " is empty; the structure is taken as a manhole.");
      return;
    }
    s.type_text = *text;
    const auto it = find_value(p_.structure_type_values, *text);
    if (it == p_.structure_type_values.end()) {
      who.add("DATA_IMPLAUSIBLE", Severity::warning, f_.type,
              f_.type + " \"" + *text + "\" is not listed in [structures.types]; the structure is taken as a manhole.");
      return;
    }
    s.kind = kind_of(it->second).value_or(model::StructureKind::manhole);
  }

  void read_diameter(OGRFeature& feature, model::Structure& s, const FeatureRef& who) {
    const double fallback = p_.structure_defaults.diameter_m;
    auto use_default = [fallback] { return "the default diameter " + q(fallback, Dimension::length) + " is used"; };
    std::optional<double> d;
    if (col_.diameter >= 0) {
      const RawNumber raw = read_number(feature, col_.diameter);
      if (raw.state == RawNumber::State::null)
        who.add("DATA_MISSING", Severity::info, f_.diameter.field,
                f_.diameter.field + " is empty; " + use_default() + ".");
      else if (const double si = units::to_si(raw.value, f_.diameter.unit); raw.state == RawNumber::State::number &&
                                                                            si >= size_limits_.diameter_min_m &&
                                                                            si <= size_limits_.diameter_max_m)
        d = si;  // the common case, without building the message
      else
        d = checked_size(raw, f_.diameter, size_limits_, use_default(), Severity::warning, who);
    }
    if (!d)
      in_.defaults.add(LayerRole::structures, "diameter", "default", s.id, [&] {
        return "diameter " + format_si(fallback, Dimension::length) + " from [structures.defaults] diameter";
      });
    s.diameter_m = d.value_or(fallback);
  }

  void read_loss_and_inflow(OGRFeature& feature, model::Structure& s, const FeatureRef& who) {
    const auto fallback = p_.structure_defaults.loss_k;
    auto use_default = [&fallback] {
      return fallback ? "the default K " + format_number(*fallback) + " is used"
                      : std::string("the method's K is used");
    };
    if (col_.loss_k >= 0) {
      const RawNumber raw = read_number(feature, col_.loss_k);
      if (raw.state == RawNumber::State::null)
        who.add("DATA_MISSING", Severity::info, f_.loss_k, f_.loss_k + " is empty; " + use_default() + ".");
      else if (const auto k = checked_number_lazy(raw, f_.loss_k, use_default, who)) {
        if (*k >= 0.0 && *k <= loss_k_max)
          s.loss_k = *k;
        else
          who.add("DATA_IMPLAUSIBLE", Severity::warning, f_.loss_k,
                  f_.loss_k + " " + format_number(*k) + " is outside the plausible 0 to " + format_number(loss_k_max) +
                      "; " + use_default() + ".",
                  *k, *k < 0.0 ? 0.0 : loss_k_max);
      }
    }
    if (!s.loss_k && fallback) {
      s.loss_k = fallback;
      in_.defaults.add(LayerRole::structures, "loss_k", "default", s.id,
                       [&] { return "K " + format_number(*fallback) + " from [structures.defaults] loss_k"; });
    }
    if (col_.inflow >= 0) {
      const RawNumber raw = read_number(feature, col_.inflow);
      const char* none = "the structure has no local inflow";
      if (const auto q = checked_number(raw, f_.inflow.field, none, who))
        if (const auto si = checked_flow(*q, f_.inflow, none, who)) s.inflow_m3_s = *si;
    }
  }

  // Persons served at the structure (sanitary flows); a negative or textual value is left out.
  void read_population(OGRFeature& feature, model::Structure& s, const FeatureRef& who) {
    if (col_.population < 0) return;
    const char* none = "the structure adds no population";
    const auto v = checked_number(read_number(feature, col_.population), f_.population, none, who);
    if (v && *v < 0.0)
      who.add("DATA_IMPLAUSIBLE", Severity::warning, f_.population,
              f_.population + " " + format_number(*v) + " is negative; " + none + ".", *v, 0.0);
    else if (v)
      s.population = *v;
  }

  LayerRead& in_;
  const Project& p_;
  const StructureFields& f_;
  Columns col_;
  Plausibility size_limits_;
};

}  // namespace

void check_structure_mapping(const Project& project, const OpenLayer& source) { resolve(project, source); }

void read_structures(LayerRead& in, std::vector<model::Structure>& out) {
  OGRLayer& layer = *in.source.layer;
  const GIntBig count = layer.GetFeatureCount(FALSE);
  const std::size_t expected = count > 0 ? static_cast<std::size_t>(count) : 0;
  out.reserve(out.size() + expected);
  StructureReader reader(in);
  const std::size_t first = out.size();
  GdalErrorCapture capture;
  GdalMessageSink gdal(LayerRole::structures, in.findings);
  layer.ResetReading();
  for (;;) {
    OGRFeatureUniquePtr feature(layer.GetNextFeature());
    if (!feature) break;
    model::Structure& s = out.emplace_back();
    const std::size_t first_finding = in.findings.size();
    const bool kept = reader.read(*feature, s);
    gdal.take(capture, s.id);
    stamp_fid(in.findings, first_finding, feature->GetFID());
    if (!kept) out.pop_back();
  }
  gdal.finish(capture);
  std::vector<IdRef> ids;
  ids.reserve(out.size() - first);
  for (std::size_t i = first; i < out.size(); ++i) ids.push_back({out[i].id, out[i].fid});
  report_duplicate_ids(ids, LayerRole::structures, in.project.structure_fields.id, "structures",
                       "so pipes that name this id are ambiguous", in.findings,
                       [&](std::int64_t fid) { return raw_text_by_fid(layer, in.project.structure_fields.id, fid); });
}

}  // namespace rimline::gis::detail
