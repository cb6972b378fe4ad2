// Pipe layer -> model::Conduit, one feature at a time. Message formats are part of the
// interface (tests pin them); see read_network.hpp for the codes.
#include <algorithm>
#include <cmath>
#include <map>

#include "io/duplicate_ids.hpp"
#include "io/read_layers.hpp"
#include "io/value_checks.hpp"
#include "rimline/error.hpp"

namespace rimline::io::detail {
namespace {

using hydraulics::Shape;
using units::Dimension;

constexpr const char* left_out = "the pipe is left out of the analysis";
// Manning n outside this range is a data error: smooth plastics ~0.009, rough brick / corrugated
// metal ~0.025-0.03 (Chow, Open-Channel Hydraulics, 1959, Table 5-6, from memory); 0.05 leaves room.
constexpr double manning_n_min = 0.008, manning_n_max = 0.05;
// Equivalent sand roughness above 0.1 m is beyond any pipe wall (common practice, no source).
constexpr double ks_max_m = 0.1;
// A line shorter than 1 mm has no usable direction or slope (common practice, no source).
constexpr double zero_length_m = 1e-3;

struct Columns {
  int id, from, to, shape, material, manning_n, split, force_main;
  int diameter, width, height, ks, invert_up, invert_down, length, flow;
};

Columns resolve(const PipeFields& f, const OpenLayer& l) {
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
          idx(f.flow.field, "flow")};
}

// The field that gives a circular pipe its diameter (width doubles as diameter with shape_from_height).
const FieldRef& diameter_ref(const Project& p) {
  if (!p.pipe_fields.diameter.mapped() && p.shape_from_height) return p.pipe_fields.width;
  return p.pipe_fields.diameter;
}

class PipeReader {
 public:
  explicit PipeReader(LayerRead& in)
      : in_(in), p_(in.project), f_(in.project.pipe_fields), col_(resolve(f_, in.source)) {}

  void read(OGRFeature& feature, model::Conduit& c) {
    c.fid = feature.GetFID();
    read_id(feature, c);
    const FeatureRef who{LayerRole::conduits, c.id, in_.findings};
    read_geometry(feature, c, who);
    read_length(feature, c, who);
    read_section(feature, c, who);
    read_roughness(feature, c, who);
    if (col_.invert_up >= 0)
      c.invert_up_m =
          checked_level(read_number(feature, col_.invert_up), f_.invert_up, "upstream invert", p_.plausibility, who);
    if (col_.invert_down >= 0)
      c.invert_down_m = checked_level(read_number(feature, col_.invert_down), f_.invert_down, "downstream invert",
                                      p_.plausibility, who);
    read_links(feature, c, who);
    read_flow(feature, c, who);
  }

 private:
  void read_id(OGRFeature& feature, model::Conduit& c) {
    auto id = read_text(feature, col_.id);
    c.id = id ? std::move(*id) : "fid " + std::to_string(c.fid);
    const FeatureRef who{LayerRole::conduits, c.id, in_.findings};
    if (col_.id >= 0 && !id)
      who.add("DATA_MISSING", Severity::warning, f_.id, f_.id + " is empty; the pipe is reported as \"" + c.id + "\".");
  }

  void read_geometry(OGRFeature& feature, model::Conduit& c, const FeatureRef& who) {
    const LineOutcome g =
        read_line(feature.GetGeometryRef(), in_.placement, p_.snap_tolerance_m, c.vertices, c.vertex_z_m);
    const auto L = Dimension::length;
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
  }

  void read_length(OGRFeature& feature, model::Conduit& c, const FeatureRef& who) {
    c.length_m = c.geometry_length_m;
    if (col_.length < 0) return;
    auto use_geometry = [&c] {
      return "the geometry length " + q(c.geometry_length_m, Dimension::length) + " is used";
    };
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
              shown() + " differs from the geometry length " + q(c.geometry_length_m, Dimension::length) +
                  " by more than " + format_fixed(tol * 100.0, 1) + " %; the geometry length is used.",
              si, c.geometry_length_m, Dimension::length);
      return;
    }
    c.length_m = si;
  }

  // Shape from the shape field, from the height (shape_from_height) or the default.
  std::optional<Shape> read_shape(OGRFeature& feature, const FeatureRef& who) {
    if (col_.shape >= 0) {
      const auto text = read_text(feature, col_.shape);
      if (!text) {
        const Shape s = p_.pipe_defaults.shape;
        who.add("DATA_MISSING", Severity::info, f_.shape,
                f_.shape + " is empty; the default shape " + std::string(hydraulics::shape_name(s)) + " is used.");
        tally("shape", "default", who.id,
              [s] { return "shape " + std::string(hydraulics::shape_name(s)) + " from [pipes.defaults] shape"; });
        return s;
      }
      const auto it = p_.shape_values.find(*text);
      if (it != p_.shape_values.end()) return it->second;
      who.add("DATA_IMPLAUSIBLE", Severity::error, f_.shape,
              f_.shape + " \"" + *text + "\" is not listed in [pipes.shapes]; " + left_out + ".");
      return std::nullopt;
    }
    if (p_.shape_from_height) {
      const RawNumber h = read_number(feature, col_.height);
      if (h.state == RawNumber::State::null) {
        who.add("DATA_MISSING", Severity::info, f_.height.field,
                f_.height.field + " is empty; the section is taken as circular.");
        return Shape::circular;
      }
      return (h.state == RawNumber::State::number && h.value == 0.0) ? Shape::circular : Shape::box;
    }
    const Shape s = p_.pipe_defaults.shape;
    tally("shape", "default", who.id, [s] {
      return "shape " + std::string(hydraulics::shape_name(s)) + " from [pipes.defaults] shape (no shape field mapped)";
    });
    return s;
  }

  // A required size: null -> the default (if any) or DATA_MISSING; bad values -> DATA_IMPLAUSIBLE.
  std::optional<double> read_size(OGRFeature& feature, int col, const FieldRef& ref, std::optional<double> fallback,
                                  std::string_view role, const FeatureRef& who) {
    if (col < 0 && !fallback) {
      who.add("DATA_MISSING", Severity::error, "",
              "No " + std::string(role) + " field is mapped and [pipes.defaults] has no " + std::string(role) + "; " +
                  left_out + ".");
      return std::nullopt;
    }
    if (col < 0) {
      tally(role, "default", who.id, [&] {
        return std::string(role) + " " + format_si(*fallback, Dimension::length) + " from [pipes.defaults] " +
               std::string(role) + " (no field mapped)";
      });
      return fallback;
    }
    const RawNumber raw = read_number(feature, col);
    if (raw.state == RawNumber::State::null) {
      if (fallback) {
        who.add("DATA_MISSING", Severity::info, ref.field,
                ref.field + " is empty; the default " + std::string(role) + " " + q(*fallback, Dimension::length) +
                    " is used.");
        tally(role, "default", who.id, [&] {
          return std::string(role) + " " + format_si(*fallback, Dimension::length) + " from [pipes.defaults] " +
                 std::string(role);
        });
        return fallback;
      }
      who.add("DATA_MISSING", Severity::error, ref.field, ref.field + " is empty; " + left_out + ".");
      return std::nullopt;
    }
    return checked_size(raw, ref, p_.plausibility, left_out, Severity::error, who);
  }

  void read_section(OGRFeature& feature, model::Conduit& c, const FeatureRef& who) {
    const auto shape = read_shape(feature, who);
    if (!shape) {
      c.usable = false;
      return;
    }
    c.section.shape = *shape;
    if (*shape == Shape::circular) {
      const FieldRef& ref = diameter_ref(p_);
      const int col = &ref == &f_.width ? col_.width : col_.diameter;
      const auto d = read_size(feature, col, ref, p_.pipe_defaults.diameter_m, "diameter", who);
      if (d)
        c.section.diameter_m = *d;
      else
        c.usable = false;
      return;
    }
    const auto w = read_size(feature, col_.width, f_.width, std::nullopt, "width", who);
    const auto h = read_size(feature, col_.height, f_.height, std::nullopt, "height", who);
    if (w && h) {
      c.section.width_m = *w;
      c.section.height_m = *h;
    } else {
      c.usable = false;
    }
  }

  // A roughness value from its field, else from the material table, else the default.
  // `lo`/`hi` bound the plausible SI value; `name` is "n" or "ks".
  void read_roughness(OGRFeature& feature, model::Conduit& c, const FeatureRef& who) {
    c.material = read_text(feature, col_.material).value_or("");
    c.roughness.law = p_.methods.friction;
    const bool manning = p_.methods.friction == hydraulics::FrictionLaw::manning;
    const FieldRef n_ref{f_.manning_n, units::Unit::one};
    if (auto n =
            roughness(feature, col_.manning_n, n_ref, "manning_n", "n", manning_n_min, manning_n_max,
                      p_.pipe_defaults.manning_n_by_material, p_.pipe_defaults.manning_n, c.material, manning, who))
      c.roughness.manning_n = *n;
    else if (manning)
      c.usable = false;
    if (auto ks = roughness(feature, col_.ks, f_.ks, "ks", "ks", 0.0, ks_max_m, p_.pipe_defaults.ks_m_by_material,
                            p_.pipe_defaults.ks_m, c.material, !manning, who))
      c.roughness.ks_m = *ks;
    else if (!manning)
      c.usable = false;
  }

  std::optional<double> roughness(OGRFeature& feature, int col, const FieldRef& ref, std::string_view role,
                                  std::string_view name, double lo, double hi,
                                  const std::map<std::string, double>& by_material, std::optional<double> fallback,
                                  const std::string& material, bool needed, const FeatureRef& who) {
    const bool is_ks = name == "ks";
    auto shown = [&](double si) { return is_ks ? format_si(si, Dimension::length) : format_number(si); };
    // What the project offers when the field does not.
    std::optional<double> alt;
    bool alt_by_material = false;
    if (const auto it = by_material.find(material); !material.empty() && it != by_material.end()) {
      alt = it->second;
      alt_by_material = true;
    } else if (fallback) {
      alt = fallback;
    }
    auto alt_from = [&] {
      return alt_by_material ? "[pipes.defaults." + std::string(role) + "_by_material] " + material
                             : "[pipes.defaults] " + std::string(role);
    };
    auto use_alt = [&] {
      return alt ? std::string(name) + " = " + shown(*alt) + " from " + alt_from() + " is used"
                 : (needed ? std::string(left_out) : std::string("it is ignored"));
    };
    if (col >= 0) {
      const RawNumber raw = read_number(feature, col);
      if (raw.state != RawNumber::State::null) {
        if (const auto v = checked_number_lazy(raw, ref.field, use_alt, who)) {
          const double si = units::to_si(*v, ref.unit);
          if (si >= lo && si <= hi) return si;
          who.add("DATA_IMPLAUSIBLE", alt || !needed ? Severity::warning : Severity::error, ref.field,
                  ref.field + " " + format_value(*v, ref.unit) + " is outside the plausible " + shown(lo) + " to " +
                      shown(hi) + "; " + use_alt() + ".",
                  si, si < lo ? lo : hi, is_ks ? Dimension::length : Dimension::dimensionless);
        }
      } else if (needed || alt) {
        who.add("DATA_MISSING", alt || !needed ? Severity::info : Severity::error, ref.field,
                ref.field + " is empty; " + use_alt() + ".");
      }
    } else if (needed && !alt) {
      const std::string no_default = "[pipes.defaults] has no " + std::string(role) + "; " + left_out + ".";
      who.add("DATA_MISSING", Severity::error, f_.material,
              material.empty() ? "No " + std::string(name) + ": " + f_.material + " is empty and " + no_default
                               : "No " + std::string(name) + " for material \"" + material + "\" in [pipes.defaults." +
                                     std::string(role) + "_by_material] and " + no_default);
    }
    if (alt && needed)
      tally(role, alt_by_material ? std::string_view(material) : std::string_view("default"), who.id,
            [&] { return std::string(name) + " = " + shown(*alt) + " from " + alt_from(); });
    return alt;
  }

  void read_links(OGRFeature& feature, model::Conduit& c, const FeatureRef& who) {
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
        c.force_main =
            std::find(p_.force_main_values.begin(), p_.force_main_values.end(), *v) != p_.force_main_values.end();
  }

  void read_flow(OGRFeature& feature, model::Conduit& c, const FeatureRef& who) {
    if (col_.flow >= 0) {
      const RawNumber raw = read_number(feature, col_.flow);
      const char* none = "the pipe has no design flow";
      if (raw.state == RawNumber::State::null) {
        who.add("DATA_MISSING", Severity::warning, f_.flow.field,
                f_.flow.field + " is empty; " + std::string(none) + ".");
      } else if (const auto v = checked_number(raw, f_.flow.field, none, who)) {
        const double si = units::to_si(*v, f_.flow.unit);
        if (si < 0.0)
          who.add("DATA_IMPLAUSIBLE", Severity::warning, f_.flow.field,
                  f_.flow.field + " " + format_value(*v, f_.flow.unit) + " is negative; " + std::string(none) + ".", si,
                  0.0, Dimension::flow);
        else
          c.flow_m3_s = si;
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

  template <typename MakeText>
  void tally(std::string_view role, std::string_view key, const std::string& id, MakeText&& make) {
    in_.defaults.add(LayerRole::conduits, role, key, id, std::forward<MakeText>(make));
  }

  LayerRead& in_;
  const Project& p_;
  const PipeFields& f_;
  Columns col_;
};

bool box_possible(const Project& p) {
  if (!p.pipe_fields.shape.empty()) {
    for (const auto& [value, shape] : p.shape_values)
      if (shape == Shape::box) return true;
    return p.pipe_defaults.shape == Shape::box;
  }
  return p.shape_from_height || p.pipe_defaults.shape == Shape::box;
}

bool circular_possible(const Project& p) {
  if (!p.pipe_fields.shape.empty() || p.shape_from_height) return true;
  return p.pipe_defaults.shape == Shape::circular;
}

}  // namespace

void check_pipe_mapping(const Project& p, const OpenLayer& l) {
  resolve(p.pipe_fields, l);  // throws for a mapped field the layer lacks
  const ErrorContext where{p.file, "", "", ""};
  if (circular_possible(p) && !diameter_ref(p).mapped() && !p.pipe_defaults.diameter_m)
    throw Error(ErrorKind::bad_config, where,
                "circular pipes need a diameter: map pipes.fields.diameter or set pipes.defaults.diameter");
  if (box_possible(p) && !(p.pipe_fields.width.mapped() && p.pipe_fields.height.mapped()))
    throw Error(ErrorKind::bad_config, where, "box sections need pipes.fields.width and pipes.fields.height");
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
  std::size_t gdal_reported = 0;
  layer.ResetReading();
  for (;;) {
    OGRFeatureUniquePtr feature(layer.GetNextFeature());
    if (!feature) break;
    model::Conduit& c = out.emplace_back();
    reader.read(*feature, c);
    report_gdal_messages(capture, LayerRole::conduits, c.id, in.findings, gdal_reported);
  }
  report_gdal_messages(capture, LayerRole::conduits, "", in.findings, gdal_reported);
  std::vector<IdRef> ids;
  ids.reserve(out.size() - first);
  for (std::size_t i = first; i < out.size(); ++i) ids.push_back({out[i].id, out[i].fid});
  report_duplicate_ids(ids, LayerRole::conduits, in.project.pipe_fields.id, "pipes",
                       "so results under this id are ambiguous", in.findings);
}

}  // namespace rimline::io::detail
