// Pipe sections (shape, diameter or width x height) and roughness (Manning n, ks) from the
// mapped fields, the material tables and the project defaults.
#include <cmath>

#include "gis/pipe_reader.hpp"

namespace rimline::gis::detail {

using hydraulics::Shape;
using units::Dimension;

// Shape from the shape field, from the height (shape_from_height) or the default.
std::optional<Shape> PipeReader::read_shape(OGRFeature& feature, const FeatureRef& who, std::string& code,
                                            bool& equal_area) {
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
    const auto it = find_value(p_.shape_values, *text);
    if (it != p_.shape_values.end()) {
      code = it->first;
      return it->second;
    }
    if (p_.unknown_shape_as_circle) {
      // The nearest circle of equal area: the area of an unknown closed section of width w and height h
      // taken as the ellipse's pi w h / 4, so D = sqrt(w h) (common practice, no source).
      who.add("DATA_IMPLAUSIBLE", Severity::warning, f_.shape,
              f_.shape + " \"" + *text + "\" is not listed in [pipes.shapes] or [pipes.section_tables]; the pipe is " +
                  "checked as the circle of equal area, diameter sqrt(width x height) ([pipes] unknown_shape).");
      equal_area = true;
      return Shape::circular;
    }
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
std::optional<double> PipeReader::read_size(OGRFeature& feature, int col, const FieldRef& ref,
                                            std::optional<double> fallback, std::string_view role,
                                            const FeatureRef& who) {
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

void PipeReader::read_section(OGRFeature& feature, model::Conduit& c, const FeatureRef& who) {
  std::string code;
  bool equal_area = false;
  const auto shape = read_shape(feature, who, code, equal_area);
  if (!shape) {
    c.usable = false;
    return;
  }
  c.section.shape = *shape;
  if (equal_area) {
    const auto w = read_size(feature, col_.width, f_.width, std::nullopt, "width", who);
    const auto h = read_size(feature, col_.height, f_.height, std::nullopt, "height", who);
    if (w && h)
      c.section.diameter_m = std::sqrt(*w * *h);
    else
      c.usable = false;
    return;
  }
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
  if (!w || !h) {
    c.usable = false;
    return;
  }
  c.section.width_m = *w;
  c.section.height_m = *h;
  if (*shape == Shape::table) {
    c.section.table = p_.shape_tables.at(code);
  } else if (*shape == Shape::egg) {
    // The standard egg's geometry follows its height (the crown decides surcharge and freeboard);
    // a width more than 2 % off height / 1.5 is reported (common practice, no source).
    const double w_egg = *h / hydraulics::egg_height_over_width;
    if (std::abs(*w - w_egg) > 0.02 * w_egg)
      who.add("DATA_IMPLAUSIBLE", Severity::warning, f_.width.field,
              f_.width.field + " " + q(*w, Dimension::length) + " is not the standard egg's " + q(w_egg, Dimension::length) +
                  " (height " + q(*h, Dimension::length) + " / 1.5); the egg is checked by its height.",
              *w, w_egg, Dimension::length);
    c.section.width_m = w_egg;
  }
}

// A roughness value from its field, else from the material table, else the default.
// `lo`/`hi` bound the plausible SI value; `name` is "n" or "ks".
void PipeReader::read_roughness(OGRFeature& feature, model::Conduit& c, const FeatureRef& who) {
  // The material only chooses the roughness here; no later stage reads it, so the pipe does not keep it.
  const std::string material = read_text(feature, col_.material).value_or("");
  c.roughness.law = p_.methods.friction;
  const bool manning = p_.methods.friction == hydraulics::FrictionLaw::manning;
  const FieldRef n_ref{f_.manning_n, units::Unit::one};
  if (auto n = roughness(feature, col_.manning_n, n_ref, "manning_n", "n", p_.plausibility.manning_n_min,
                         p_.plausibility.manning_n_max, p_.pipe_defaults.manning_n_by_material,
                         p_.pipe_defaults.manning_n, material, manning, who))
    c.roughness.manning_n = *n;
  else if (manning)
    c.usable = false;
  if (auto ks = roughness(feature, col_.ks, f_.ks, "ks", "ks", 0.0, p_.plausibility.ks_max_m,
                          p_.pipe_defaults.ks_m_by_material, p_.pipe_defaults.ks_m, material, !manning, who))
    c.roughness.ks_m = *ks;
  else if (!manning)
    c.usable = false;
}

std::optional<double> PipeReader::roughness(OGRFeature& feature, int col, const FieldRef& ref, std::string_view role,
                                            std::string_view name, double lo, double hi,
                                            const std::map<std::string, double>& by_material,
                                            std::optional<double> fallback, const std::string& material, bool needed,
                                            const FeatureRef& who) {
  const bool is_ks = name == "ks";
  auto shown = [&](double si) { return is_ks ? q_roughness(si) : format_number(si); };
  // What the project offers when the field does not.
  std::optional<double> alt;
  const std::string* table_key = nullptr;  // the material table's own spelling of the value
  if (const auto it = find_value(by_material, material); !material.empty() && it != by_material.end()) {
    alt = it->second;
    table_key = &it->first;
  } else if (fallback) {
    alt = fallback;
  }
  auto alt_from = [&] {
    return table_key ? "[pipes.defaults." + std::string(role) + "_by_material] " + *table_key
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
    tally(role, table_key ? std::string_view(*table_key) : std::string_view("default"), who.id,
          [&] { return std::string(name) + " = " + shown(*alt) + " from " + alt_from(); });
  return alt;
}

}  // namespace rimline::gis::detail
