#include "config/project_catchments.hpp"

#include <cmath>

#include "rimline/error.hpp"

namespace rimline::config::detail {
namespace {

using units::Dimension;

double runoff_c_value(TomlSection& s, std::string_view key) {
  const auto c = s.number(key);
  if (c && !(*c >= 0.0 && *c <= 1.0)) s.fail(key, "a runoff coefficient must lie between 0 and 1");
  return c.value_or(-1.0);
}

void read_catchments(TomlSection s, Project& p, LayerSource (*read_source)(TomlSection&, const std::string&)) {
  if (!s.present()) return;
  CatchmentSettings& k = p.catchments;
  k.source = read_source(s, p.directory);
  if (const auto d = s.quantity("outlet_search", Dimension::length)) {
    if (!(*d >= 0.0)) s.fail("outlet_search", "must not be negative");
    k.outlet_search_m = *d;
  }
  k.allow_left_out = s.boolean("allow_left_out").value_or(false);
  TomlSection f = s.table("fields");
  for (auto [key, dst] : {std::pair<std::string_view, std::string*>{"id", &k.fields.id},
                          {"structure", &k.fields.structure},
                          {"runoff_c", &k.fields.runoff_c},
                          {"population", &k.fields.population}})
    *dst = f.string(key).value_or("");
  k.fields.inlet_time = f.field_ref("inlet_time", Dimension::time);
  f.finish();
  TomlSection d = s.table("defaults");
  if (const double c = runoff_c_value(d, "runoff_c"); c >= 0.0) k.default_runoff_c = c;
  if (const auto t = d.quantity("inlet_time", Dimension::time)) {
    if (!(*t >= 0.0)) d.fail("inlet_time", "must not be negative");
    k.default_inlet_time_s = *t;
  }
  d.finish();
  s.finish();
}

void read_land_use(TomlSection s, Project& p, LayerSource (*read_source)(TomlSection&, const std::string&)) {
  if (!s.present()) return;
  p.catchments.land_use = read_source(s, p.directory);
  const auto field = s.string("runoff_c");
  if (!field || field->empty()) s.fail("runoff_c", "the land-use layer's runoff coefficient field is missing");
  p.catchments.land_use_runoff_c = *field;
  s.finish();
}

model::IdfCurve read_idf(TomlSection s, const std::string& label, const std::string& file) {
  model::IdfCurve idf;
  idf.label = label;
  const auto a = s.number("a");
  const auto b = s.quantity("b", Dimension::time);
  const auto c = s.number("c");
  const auto unit_text = s.string("intensity_unit");
  const auto durations = s.strings("durations");
  const auto intensities = s.strings("intensities");
  s.finish();
  const bool formula = a || b || c || unit_text;
  const bool table = !durations.empty() || !intensities.empty();
  if (formula == table)
    s.fail(formula ? "durations" : "a",
           "give either the formula (a, b, c, intensity_unit) or the table (durations, intensities), not " +
               std::string(formula ? "both" : "neither"));
  if (formula) {
    idf.kind = model::IdfCurve::Kind::formula;
    if (!a || !(*a > 0.0)) s.fail("a", "must be a number greater than 0");
    idf.a = *a;
    if (b && !(*b >= 0.0)) s.fail("b", "must not be negative");
    idf.b_min = b.value_or(0.0) / units::seconds_per_minute;
    if (c && !(*c > 0.0 && *c <= 5.0)) s.fail("c", "must lie between 0 and 5");
    idf.c = c.value_or(1.0);
    if (!unit_text) s.fail("intensity_unit", "the unit of i (\"mm/h\", \"in/h\") is missing");
    const auto unit = units::parse_unit(*unit_text);
    if (!unit || units::dimension_of(*unit) != Dimension::intensity)
      s.fail("intensity_unit", "\"" + *unit_text + "\" is not a rainfall intensity unit (\"mm/h\", \"in/h\")");
    idf.intensity_si_per_unit = units::to_si(1.0, *unit);
    idf.intensity_unit = std::string(units::unit_symbol(*unit));
    return idf;
  }
  idf.kind = model::IdfCurve::Kind::table;
  if (durations.size() != intensities.size() || durations.size() < 2)
    s.fail("intensities", "needs as many intensities as durations, at least two");
  for (std::size_t i = 0; i < durations.size(); ++i) {
    const double t = parse_quantity(durations[i], Dimension::time, file + ": " + s.where("durations"));
    const double v = parse_quantity(intensities[i], Dimension::intensity, file + ": " + s.where("intensities"));
    if (!(t > 0.0) || (i > 0 && !(t > idf.durations_s.back())))
      s.fail("durations", "must be greater than 0 and increasing");
    if (!(v > 0.0)) s.fail("intensities", "must be greater than 0");
    idf.durations_s.push_back(t);
    idf.intensities_m_s.push_back(v);
  }
  return idf;
}

void read_rational(TomlSection s, Project& p) {
  const bool needed = p.flow_mode == FlowMode::rational;
  const auto period = s.string("return_period");
  p.rational.full_flow_velocity =
      s.choice<bool>("travel_velocity", {{"normal_depth", false}, {"full_flow", true}}).value_or(false);
  TomlSection curves = s.table("idf");
  std::vector<std::string> labels;
  const toml::node* chosen = nullptr;
  std::string chosen_label;
  for (const auto& [label, node] : curves.entries()) {
    labels.push_back(label);
    if (!node->is_table()) curves.fail_at(node, label, "must be a table (formula a, b, c or a duration table)");
    if ((period && label == *period) || (!period && labels.size() == 1)) chosen = node, chosen_label = label;
  }
  s.finish();
  if (!s.present() && !needed) return;
  if (labels.empty()) {
    if (needed)
      s.fail("idf", "mode \"rational\" needs an IDF relation, e.g. [rational.idf.10yr] a, b, c, intensity_unit");
    return;
  }
  if (!period && labels.size() > 1)
    s.fail("return_period", "several IDF relations are given; name the one to use (" + labels.front() + ", ...)");
  if (!chosen) {
    std::string msg = "\"" + *period + "\" is not a key of [rational.idf]";
    const std::string near = closest_name(*period, labels);
    if (!near.empty()) msg += "; did you mean \"" + near + "\"?";
    s.fail("return_period", msg);
  }
  TomlSection curve(chosen->as_table(), curves.name() + "." + chosen_label, p.file, curves.pattern() + ".*");
  p.rational.idf = read_idf(curve, chosen_label, p.file);
  for (const auto& [label, node] : curves.entries())  // the others are checked too: a typo is an error either way
    if (label != chosen_label)
      read_idf(TomlSection(node->as_table(), curves.name() + "." + label, p.file, curves.pattern() + ".*"), label,
               p.file);
}

void read_sanitary(TomlSection s, Project& p) {
  SanitarySettings& z = p.sanitary;
  const auto q = s.quantity("per_capita", Dimension::flow);
  if (q && !(*q > 0.0)) s.fail("per_capita", "must be greater than 0");
  z.per_capita_m3_s = q.value_or(0.0);
  const auto peaking = s.string("peaking");
  if (peaking && *peaking != "harmon")
    s.fail("peaking", "\"" + *peaking + "\" is not \"harmon\" (or give peaking_factor = <number>)");
  z.peaking_constant = s.number("peaking_factor");
  if (z.peaking_constant && peaking) s.fail("peaking_factor", "cannot be used together with peaking = \"harmon\"");
  if (z.peaking_constant && !(*z.peaking_constant >= 1.0)) s.fail("peaking_factor", "must be at least 1");
  z.infiltration_per_length_m3_s_m = s.quantity("infiltration_per_length", Dimension::flow_per_length);
  z.infiltration_per_area_m3_s_m2 = s.quantity("infiltration_per_area", Dimension::flow_per_area);
  for (auto [key, v] :
       {std::pair<std::string_view, std::optional<double>>{"infiltration_per_length", z.infiltration_per_length_m3_s_m},
        {"infiltration_per_area", z.infiltration_per_area_m3_s_m2}})
    if (v && !(*v >= 0.0)) s.fail(key, "must not be negative");
  s.finish();
  if (p.flow_mode == FlowMode::sanitary && !q)
    s.fail("per_capita", "mode \"sanitary\" needs the average flow per person");
}

}  // namespace

void read_catchment_sections(CatchmentSections s, Project& p,
                             LayerSource (*read_source)(TomlSection&, const std::string&)) {
  read_catchments(s.catchments, p, read_source);
  read_land_use(s.land_use, p, read_source);
  read_rational(s.rational, p);
  read_sanitary(s.sanitary, p);
  // Sanitary flows may come from structure populations alone; the Rational Method needs catchments.
  const bool needs =
      p.flow_mode == FlowMode::rational || (p.flow_mode == FlowMode::sanitary && p.structure_fields.population.empty());
  if (needs && p.catchments.source.source.empty())
    s.catchments.fail("source", "flows mode \"" +
                                    std::string(p.flow_mode == FlowMode::rational ? "rational" : "sanitary") +
                                    "\" needs a [catchments] table with the catchment polygons' source");
  if (p.flow_mode == FlowMode::sanitary && p.catchments.fields.population.empty() &&
      p.structure_fields.population.empty())
    s.catchments.fail("fields", "mode \"sanitary\" needs catchments.fields.population or structures.fields.population");
  if (!p.catchments.land_use.source.empty() && p.catchments.source.source.empty())
    s.land_use.fail("source", "needs a [catchments] layer to intersect with");
}

}  // namespace rimline::config::detail
