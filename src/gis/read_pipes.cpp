// Pipe layer -> model::Conduit, one feature at a time: ids, geometry, lengths, links and flows
// here, sections and roughness in pipe_section.cpp. Message formats are part of the interface
// (tests pin them); see read_network.hpp for the codes.
#include <algorithm>
#include <cmath>
#include <limits>

#include "gis/duplicate_ids.hpp"
#include "gis/pipe_reader.hpp"
#include "rimline/error.hpp"

namespace rimline::gis::detail {

using hydraulics::Shape;
using units::Dimension;

PipeColumns resolve_pipe_columns(const PipeFields& f, const OpenLayer& l) {
  auto idx = [&l](const std::string& name, const char* key) {
    return field_index(l, name, std::string("pipes.fields.") + key);
  };
  return {idx(f.id, "id"),
          idx(f.from, "from"),
          idx(f.to, "to"),
          idx(f.shape, "shape"),
          idx(f.material, "material"),
          idx(f.manning_n, "manning_n"),
          idx(f.split, "split"),
          idx(f.force_main, "force_main"),
          idx(f.diameter.field, "diameter"),
          idx(f.width.field, "width"),
          idx(f.height.field, "height"),
          idx(f.ks.field, "ks"),
          idx(f.invert_up.field, "invert_up"),
          idx(f.invert_down.field, "invert_down"),
          idx(f.length.field, "length"),
          idx(f.flow.field, "flow"),
          // Only force mains carry a pipe class: a gravity layer without the field is fine.
          f.rated_pressure.mapped() ? l.layer->GetLayerDefn()->GetFieldIndex(f.rated_pressure.field.c_str()) : -1,
          idx(f.invert_up_fallback.field, "invert_up_fallback"),
          idx(f.invert_down_fallback.field, "invert_down_fallback")};
}

const FieldRef& diameter_ref(const Project& p) {
  if (!p.pipe_fields.diameter.mapped() && p.shape_from_height) return p.pipe_fields.width;
  return p.pipe_fields.diameter;
}

void PipeReader::read(OGRFeature& feature, model::Conduit& c) {
  c.fid = feature.GetFID();
  read_id(feature, c);
  const FeatureRef who{LayerRole::conduits, c.id, in_.findings};
  read_geometry(feature, c, who);
  read_length(feature, c, who);
  read_section(feature, c, who);
  read_roughness(feature, c, who);
  c.invert_up_m = read_invert(feature, col_.invert_up, f_.invert_up, col_.invert_up_fallback, f_.invert_up_fallback,
                              "upstream invert", who);
  c.invert_down_m = read_invert(feature, col_.invert_down, f_.invert_down, col_.invert_down_fallback,
                                f_.invert_down_fallback, "downstream invert", who);
  read_links(feature, c, who);
  read_flow(feature, c, who);
}

std::optional<double> PipeReader::read_invert(OGRFeature& feature, int col, const FieldRef& ref, int fallback_col,
                                              const FieldRef& fallback, std::string_view what, const FeatureRef& who) {
  if (col < 0) return std::nullopt;
  const RawNumber raw = read_number(feature, col);
  if (fallback_col < 0) return checked_level(raw, ref, what, p_.plausibility, who);
  // With a fallback, an empty main value is no finding of its own: the fallback's use says it.
  if (raw.state != RawNumber::State::null)
    if (const auto v = checked_level(raw, ref, what, p_.plausibility, who)) return v;
  const RawNumber second = read_number(feature, fallback_col);
  if (second.state == RawNumber::State::null) {
    who.add("DATA_MISSING", Severity::warning, ref.field,
            ref.field + " and its fallback " + fallback.field + " are empty; the " + std::string(what) +
                " is unknown.");
    return std::nullopt;
  }
  const auto v = checked_level(second, fallback, what, p_.plausibility, who);
  if (v)
    who.add("INVERT_FALLBACK", Severity::info, fallback.field,
            ref.field + (raw.state == RawNumber::State::null ? " is empty" : " is unusable") + "; the " +
                std::string(what) + " " + q(*v, Dimension::length) + " is taken from " + fallback.field + ".",
            *v, std::numeric_limits<double>::quiet_NaN(), Dimension::length);
  return v;
}

void PipeReader::read_id(OGRFeature& feature, model::Conduit& c) {
  const IdText id_read = gis::detail::read_id(feature, col_.id);
  auto id = id_read.id;
  c.id = id ? std::move(*id) : "fid " + std::to_string(c.fid);
  const FeatureRef who{LayerRole::conduits, c.id, in_.findings};
  report_inexact_id(id_read, f_.id, who);
  if (col_.id >= 0 && !id)
    who.add("DATA_MISSING", Severity::warning, f_.id, f_.id + " is empty; the pipe is reported as \"" + c.id + "\".");
}

void PipeReader::read_geometry(OGRFeature& feature, model::Conduit& c, const FeatureRef& who) {
  const LineOutcome g =
      read_line(feature.GetGeometryRef(), in_.placement, p_.snap_tolerance_m, c.vertices, c.vertex_z_m);
  const auto L = Dimension::length;
  // Ends stay without coordinates until a line gives them: topology leaves such a pipe unconnected
  // rather than snapping an end that defaulted to (0, 0).
  c.up_point = c.down_point = {std::numeric_limits<double>::quiet_NaN(), std::numeric_limits<double>::quiet_NaN()};
  switch (g.status) {
    case LineStatus::missing:
      who.add("DATA_GEOMETRY", Severity::error, "", "The pipe has no geometry; it is left out of the analysis.");
      c.usable = false;
      return;
    case LineStatus::wrong_type:
      who.add("DATA_GEOMETRY", Severity::error, "",
              "The geometry is a " + g.type_name + ", not a line; the pipe is left out of the analysis.");
      c.usable = false;
      return;
    case LineStatus::transform_failed:
      who.add("DATA_GEOMETRY", Severity::error, "",
              "The geometry could not be transformed into the run CRS; the pipe is left out of the analysis.");
      c.usable = false;
      return;
    case LineStatus::gap:
      who.add("DATA_GEOMETRY", Severity::error, "",
              "The " + g.type_name + " has " + std::to_string(g.parts) +
                  " parts that do not join end to end within the snap tolerance of " + q(p_.snap_tolerance_m, L) +
                  " (gap " + q(g.gap_m, L) + "); the pipe is left out of the analysis.",
              g.gap_m, p_.snap_tolerance_m, L);
      c.usable = false;
      break;
    case LineStatus::merged:
      who.add("DATA_GEOMETRY", Severity::info, "",
              "The " + g.type_name + "'s " + std::to_string(g.parts) +
                  " parts join end to end and were merged into one line.");
      break;
    case LineStatus::ok:
      break;
  }
  c.geometry_length_m = plan_length_m(c.vertices);
  c.up_point = c.vertices.front();
  c.down_point = c.vertices.back();
  c.up_direction = start_direction(c.vertices);
  c.down_direction = end_direction(c.vertices);
  if (c.usable && c.geometry_length_m < zero_length_m) {
    who.add("DATA_GEOMETRY", Severity::error, "", "The line has zero length; the pipe is left out of the analysis.",
            c.geometry_length_m, zero_length_m, L);
    c.usable = false;
  }
  // A line that crosses or runs back over itself (a digitising slip) overstates the plan length.
  const OGRGeometry* geometry = feature.GetGeometryRef();
  if (c.usable && geometry && OGRGeometryFactory::haveGEOS() && !geometry->IsSimple())
    who.add("DATA_GEOMETRY", Severity::warning, "",
            "The line crosses or runs back over itself; its plan length " + q(c.geometry_length_m, L) +
                " may be overstated.",
            c.geometry_length_m, std::numeric_limits<double>::quiet_NaN(), L);
}

void PipeReader::read_length(OGRFeature& feature, model::Conduit& c, const FeatureRef& who) {
  c.length_m = c.geometry_length_m;
  if (col_.length < 0) return;
  auto use_geometry = [&c] { return "the geometry length " + q_distance(c.geometry_length_m) + " is used"; };
  const RawNumber raw = read_number(feature, col_.length);
  if (raw.state == RawNumber::State::null) {
    who.add("DATA_MISSING", Severity::info, f_.length.field, f_.length.field + " is empty; " + use_geometry() + ".");
    return;
  }
  const auto v = checked_number_lazy(raw, f_.length.field, use_geometry, who);
  if (!v) return;
  const double si = units::to_si(*v, f_.length.unit);
  auto shown = [&] { return f_.length.field + " " + format_value(*v, f_.length.unit); };
  if (!(si > 0.0)) {
    who.add("DATA_IMPLAUSIBLE", Severity::warning, f_.length.field,
            shown() + " is not positive; " + use_geometry() + ".", si, 0.0, Dimension::length);
    return;
  }
  if (c.geometry_length_m <= 0.0) {  // no usable geometry: the mapped length is all there is
    c.length_m = si;
    return;
  }
  const double tol = p_.plausibility.length_tolerance;
  if (std::abs(si / c.geometry_length_m - 1.0) > tol) {
    who.add("DATA_IMPLAUSIBLE", Severity::warning, f_.length.field,
            shown() + " differs from the geometry length " + q_distance(c.geometry_length_m) +
                " by more than " + format_fixed(tol * 100.0, 1) + " %; the geometry length is used.",
            si, c.geometry_length_m, Dimension::length);
    return;
  }
  c.length_m = si;
}

void PipeReader::read_links(OGRFeature& feature, model::Conduit& c, const FeatureRef& who) {
  auto link = [&](int col, const std::string& field, const char* end, std::string& dst) {
    if (col < 0) return;
    auto v = read_text(feature, col);
    if (v)
      dst = std::move(*v);
    else
      who.add("DATA_MISSING", Severity::info, field, field + " is empty; the " + end + " structure id is unknown.");
  };
  link(col_.from, f_.from, "upstream", c.from_id);
  link(col_.to, f_.to, "downstream", c.to_id);
  if (col_.force_main >= 0)
    if (const auto v = read_text(feature, col_.force_main))
      c.force_main = std::any_of(p_.force_main_values.begin(), p_.force_main_values.end(),
                                 [&v](const std::string& x) { return same_ignoring_case(x, *v); });
}

void PipeReader::read_flow(OGRFeature& feature, model::Conduit& c, const FeatureRef& who) {
  if (col_.flow >= 0) {
    const RawNumber raw = read_number(feature, col_.flow);
    const char* none = "the pipe has no design flow";
    if (raw.state == RawNumber::State::null) {
      who.add("DATA_MISSING", Severity::warning, f_.flow.field,
              f_.flow.field + " is empty; " + std::string(none) + ".");
    } else if (const auto v = checked_number(raw, f_.flow.field, none, who)) {
      if (const auto si = checked_flow(*v, f_.flow, none, who)) c.flow_m3_s = *si;
    }
  }
  if (col_.rated_pressure >= 0) {
    const RawNumber raw = read_number(feature, col_.rated_pressure);
    const char* none = "its peak pressure is not checked against a rating";
    if (raw.state != RawNumber::State::null) {
      if (const auto v = checked_number(raw, f_.rated_pressure.field, none, who)) {
        const double si = units::to_si(*v, f_.rated_pressure.unit);
        if (!(si > 0.0))
          who.add("DATA_IMPLAUSIBLE", Severity::warning, f_.rated_pressure.field,
                  f_.rated_pressure.field + " " + format_value(*v, f_.rated_pressure.unit) + " is not positive; " +
                      std::string(none) + ".",
                  si, 0.0, Dimension::pressure_head);
        else
          c.rated_pressure_head_m = si;
      }
    }
  }
  if (col_.split >= 0) {
    const RawNumber raw = read_number(feature, col_.split);
    const char* none = "the pipe has no split fraction";
    if (raw.state == RawNumber::State::null) {
      if (p_.split_rule == SplitRule::field)
        who.add("DATA_MISSING", Severity::info, f_.split, f_.split + " is empty; " + std::string(none) + ".");
    } else if (const auto v = checked_number(raw, f_.split, none, who)) {
      if (*v < 0.0 || *v > 1.0)
        who.add("DATA_IMPLAUSIBLE", Severity::warning, f_.split,
                f_.split + " " + format_number(*v) + " is outside 0 to 1; " + std::string(none) + ".", *v,
                *v < 0.0 ? 0.0 : 1.0);
      else
        c.split_fraction = *v;
    }
  }
}

namespace {

// Box, egg, table and equal-area sections are given by width x height.
bool box_possible(const Project& p) {
  if (!p.pipe_fields.shape.empty()) {
    if (p.unknown_shape_as_circle) return true;
    for (const auto& [value, shape] : p.shape_values)
      if (shape != Shape::circular) return true;
    return p.pipe_defaults.shape != Shape::circular;
  }
  return p.shape_from_height || p.pipe_defaults.shape != Shape::circular;
}

bool circular_possible(const Project& p) {
  if (!p.pipe_fields.shape.empty() || p.shape_from_height) return true;
  return p.pipe_defaults.shape == Shape::circular;
}

}  // namespace

void check_pipe_mapping(const Project& p, const OpenLayer& l) {
  resolve_pipe_columns(p.pipe_fields, l);  // throws for a mapped field the layer lacks
  const ErrorContext where{p.file, "", "", ""};
  if (circular_possible(p) && !diameter_ref(p).mapped() && !p.pipe_defaults.diameter_m)
    throw Error(ErrorKind::bad_config, where,
                "circular pipes need a diameter: map pipes.fields.diameter or set pipes.defaults.diameter");
  if (box_possible(p) && !(p.pipe_fields.width.mapped() && p.pipe_fields.height.mapped()))
    throw Error(ErrorKind::bad_config, where, "box, egg and table sections (and unknown_shape = \"equal_area_circle\") need pipes.fields.width and "
                "pipes.fields.height");
  const auto& d = p.pipe_defaults;
  if ((!d.manning_n_by_material.empty() || !d.ks_m_by_material.empty()) && p.pipe_fields.material.empty())
    throw Error(ErrorKind::bad_config, where,
                "a roughness table by material is set but pipes.fields.material is not mapped");
  if (p.methods.friction == hydraulics::FrictionLaw::manning && p.pipe_fields.manning_n.empty() && !d.manning_n &&
      d.manning_n_by_material.empty())
    throw Error(ErrorKind::bad_config, where,
                "methods.friction is \"manning\" but no Manning n is given: map pipes.fields.manning_n or set "
                "pipes.defaults.manning_n or [pipes.defaults.manning_n_by_material]");
  if (p.methods.friction == hydraulics::FrictionLaw::darcy_weisbach && !p.pipe_fields.ks.mapped() && !d.ks_m &&
      d.ks_m_by_material.empty())
    throw Error(ErrorKind::bad_config, where,
                "methods.friction is \"darcy_weisbach\" but no roughness ks is given: map pipes.fields.ks or set "
                "pipes.defaults.ks or [pipes.defaults.ks_by_material]");
}

void read_pipes(LayerRead& in, std::vector<model::Conduit>& out) {
  OGRLayer& layer = *in.source.layer;
  const GIntBig count = layer.GetFeatureCount(FALSE);
  const std::size_t expected = count > 0 ? static_cast<std::size_t>(count) : 0;
  out.reserve(out.size() + expected);
  PipeReader reader(in);
  const std::size_t first = out.size();
  GdalErrorCapture capture;
  GdalMessageSink gdal(LayerRole::conduits, in.findings);
  layer.ResetReading();
  for (;;) {
    OGRFeatureUniquePtr feature(layer.GetNextFeature());
    if (!feature) break;
    model::Conduit& c = out.emplace_back();
    const std::size_t first_finding = in.findings.size();
    reader.read(*feature, c);
    gdal.take(capture, c.id);
    stamp_fid(in.findings, first_finding, feature->GetFID());
  }
  gdal.finish(capture);
  std::vector<IdRef> ids;
  ids.reserve(out.size() - first);
  for (std::size_t i = first; i < out.size(); ++i) ids.push_back({out[i].id, out[i].fid});
  report_duplicate_ids(ids, LayerRole::conduits, in.project.pipe_fields.id, "pipes",
                       "so results under this id are ambiguous", in.findings,
                       [&](std::int64_t fid) { return raw_text_by_fid(layer, in.project.pipe_fields.id, fid); });
}

}  // namespace rimline::gis::detail
