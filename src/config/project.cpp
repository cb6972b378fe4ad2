// The project file: TOML -> Project (SI). Schema in include/rimline/config/project.hpp.
#include "rimline/config/project.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <functional>
#include <sstream>
#include <tuple>

#include "config/project_catchments.hpp"
#include "config/project_connections.hpp"
#include "config/project_force_mains.hpp"
#include "config/source_path.hpp"
#include "config/toml_guard.hpp"
#include "config/toml_plain.hpp"
#include "config/toml_section.hpp"
#include "rimline/error.hpp"
#include "rimline/file_kind.hpp"

namespace rimline::config {
namespace detail {

// "PG:dbname=x", "ODBC:...", "/vsizip/...", "https://..." are GDAL connection strings, not paths.
// A single letter before ':' is a Windows drive, so it stays a path.
bool is_connection_string(const std::string& s) {
  if (s.rfind("/vsi", 0) == 0) return true;
  const auto colon = s.find(':');
  if (colon == std::string::npos || colon < 2) return false;
  for (std::size_t i = 0; i < colon; ++i) {
    const char c = s[i];
    if (!(std::isalnum(static_cast<unsigned char>(c)) || c == '_' || c == '-')) return false;
  }
  return true;
}

std::string resolve_source(const std::string& source, const std::string& directory) {
  if (source.empty() || is_connection_string(source)) return source;
  const std::filesystem::path p(source);
  if (p.is_absolute()) return p.lexically_normal().string();
  return (std::filesystem::path(directory) / p).lexically_normal().string();
}

LayerSource read_layer_source(TomlSection& s, const std::string& directory) {
  LayerSource src;
  const auto source = s.string("source");
  if (!source || source->empty()) s.fail("source", "the layer source (a file or a GDAL connection string) is missing");
  src.source = resolve_source(*source, directory);
  src.layer = s.string("layer").value_or("");
  src.open_options = s.strings("open_options");
  src.where = s.string("where").value_or("");
  return src;
}

}  // namespace detail

namespace {

using detail::read_layer_source;
using detail::resolve_source;
using detail::TomlSection;
using units::Dimension;

double positive_number(TomlSection& s, std::string_view key, double fallback) {
  const auto v = s.number(key);
  if (!v) return fallback;
  if (!(*v > 0.0)) s.fail(key, "must be greater than 0");
  return *v;
}


hydraulics::Shape shape_choice(TomlSection& s, std::string_view key, hydraulics::Shape fallback) {
  return s.choice<hydraulics::Shape>(key, {{"circular", hydraulics::Shape::circular},
                                           {"box", hydraulics::Shape::box},
                                           {"egg", hydraulics::Shape::egg}})
      .value_or(fallback);
}

// An array of plain numbers (integers allowed), e.g. a section table's depths.
std::vector<double> number_array(TomlSection& s, std::string_view key) {
  std::vector<double> out;
  const toml::node* node = s.node(key);
  if (!node) return out;
  const toml::array* arr = node->as_array();
  if (!arr) s.fail_at(node, key, "expected an array of numbers");
  for (const toml::node& el : *arr) {
    const auto v = el.value<double>();
    if (!v) s.fail_at(node, key, "expected an array of numbers");
    out.push_back(*v);
  }
  return out;
}

// [pipes.section_tables.NAME]: a closed section by its width at each depth; the shape values in
// `codes` map to it.
void read_section_tables(TomlSection tables, Project& p) {
  for (const auto& [name, node] : tables.entries()) {
    if (!node->is_table()) tables.fail_at(node, name, "must be a table (codes, depth, width)");
    TomlSection one(node->as_table(), tables.name() + "." + name, p.file, tables.pattern() + ".*");
    auto t = std::make_shared<hydraulics::SectionTable>();
    t->name = name;
    t->depth = number_array(one, "depth");
    t->width = number_array(one, "width");
    if (const auto why = hydraulics::table_problem(*t); !why.empty()) one.fail("depth", why);
    const auto codes = one.strings("codes");
    if (codes.empty()) one.fail("codes", "lists the pipes' shape values that use this section; none given");
    for (const auto& code : codes) {
      if (p.shape_values.count(code)) one.fail("codes", "\"" + code + "\" already names another shape");
      p.shape_values[code] = hydraulics::Shape::table;
      p.shape_tables[code] = t;
    }
    one.finish();
  }
  tables.finish();
}

// A plausible range for a project value, named by the [plausibility] keys that set it.
struct Range {
  double lo, hi;
  const char* keys;
  bool holds(double v) const { return v >= lo && v <= hi; }
  std::string text(const std::function<std::string(double)>& show) const {
    return "outside the plausible " + show(lo) + " to " + show(hi) + " (" + keys + ")";
  }
};

std::string plain(double v) {
  std::ostringstream o;
  o << v;
  return o.str();
}
std::string metres(double v) { return plain(v) + " m"; }

std::map<std::string, double> number_table(TomlSection s, const Range* range = nullptr) {
  std::map<std::string, double> out;
  for (const auto& [key, node] : s.entries()) {
    double v = 0.0;
    if (node->is_floating_point())
      v = node->as_floating_point()->get();
    else if (node->is_integer())
      v = static_cast<double>(node->as_integer()->get());
    else
      s.fail_at(node, key, "expected a number");
    if (range && !range->holds(v)) s.fail_at(node, key, plain(v) + " is " + range->text(plain));
    out[key] = v;
  }
  return out;
}

std::map<std::string, double> quantity_table(TomlSection s, Dimension d, const std::string& file,
                                             const Range* range = nullptr) {
  std::map<std::string, double> out;
  for (const auto& [key, node] : s.entries()) {
    if (!node->is_string()) s.fail_at(node, key, "expected a quantity string \"<number> <unit>\"");
    const double v = parse_quantity(std::string(node->as_string()->get()), d, file + ": " + s.where(node, key));
    if (range && !range->holds(v)) s.fail_at(node, key, metres(v) + " is " + range->text(metres));
    out[key] = v;
  }
  return out;
}

void read_pipes(TomlSection s, Project& p) {
  if (!s.present()) s.fail("source", "missing; the project needs a [pipes] table with the pipe layer's source");
  p.pipes = read_layer_source(s, p.directory);
  if (const auto tol = s.quantity("snap_tolerance", Dimension::length)) {
    if (!(*tol >= 0.0)) s.fail("snap_tolerance", "must not be negative");
    p.snap_tolerance_m = *tol;
  }
  p.shape_from_height = s.boolean("shape_from_height").value_or(false);
  p.force_main_values = s.strings("force_main_values");
  p.flow_direction = s.choice<FlowDirection>("flow_direction", {{"from_to", FlowDirection::from_to},
                                                                {"inverts", FlowDirection::inverts}})
                         .value_or(FlowDirection::from_to);

  TomlSection f = s.table("fields");
  PipeFields& pf = p.pipe_fields;
  for (auto [key, dst] : {std::pair<std::string_view, std::string*>{"id", &pf.id},
                          {"from", &pf.from},
                          {"to", &pf.to},
                          {"shape", &pf.shape},
                          {"material", &pf.material},
                          {"manning_n", &pf.manning_n},
                          {"split", &pf.split},
                          {"force_main", &pf.force_main}})
    *dst = f.string(key).value_or("");
  for (auto [key, dst] : {std::pair<std::string_view, FieldRef*>{"diameter", &pf.diameter},
                          {"width", &pf.width},
                          {"height", &pf.height},
                          {"ks", &pf.ks},
                          {"invert_up", &pf.invert_up},
                          {"invert_down", &pf.invert_down},
                          {"invert_up_fallback", &pf.invert_up_fallback},
                          {"invert_down_fallback", &pf.invert_down_fallback},
                          {"length", &pf.length}})
    *dst = f.field_ref(key, Dimension::length);
  pf.flow = f.field_ref("flow", Dimension::flow);
  pf.rated_pressure = f.field_ref("rated_pressure", Dimension::pressure_head);
  f.finish();
  if (p.shape_from_height && !pf.shape.empty())
    s.fail("shape_from_height", "cannot be used together with pipes.fields.shape; choose one way to give the shape");
  if (p.shape_from_height && !pf.height.mapped()) s.fail("shape_from_height", "needs pipes.fields.height to be mapped");
  if (!p.force_main_values.empty() && pf.force_main.empty())
    s.fail("force_main_values", "needs pipes.fields.force_main to be mapped");
  for (auto [key, fallback, main] : {std::tuple<std::string_view, const FieldRef*, const FieldRef*>{
                                         "invert_up_fallback", &pf.invert_up_fallback, &pf.invert_up},
                                     {"invert_down_fallback", &pf.invert_down_fallback, &pf.invert_down}})
    if (fallback->mapped() && !main->mapped())
      f.fail(key, "needs pipes.fields." + std::string(key.substr(0, key.find("_fallback"))) + " to be mapped first");
  if (p.flow_direction == FlowDirection::inverts && (pf.from.empty() || pf.to.empty()))
    s.fail("flow_direction", "\"inverts\" needs pipes.fields.from and pipes.fields.to (without them the inverts decide anyway)");

  TomlSection d = s.table("defaults");
  PipeDefaults& pd = p.pipe_defaults;
  pd.shape = shape_choice(d, "shape", pd.shape);
  const Plausibility& q = p.plausibility;
  const Range n_range{q.manning_n_min, q.manning_n_max, "[plausibility] manning_n_min, manning_n_max"};
  const Range ks_range{0.0, q.ks_max_m, "[plausibility] ks_max"};
  pd.manning_n = d.number("manning_n");
  if (pd.manning_n && !n_range.holds(*pd.manning_n))
    d.fail("manning_n", plain(*pd.manning_n) + " is " + n_range.text(plain));
  pd.ks_m = d.quantity("ks", Dimension::length);
  if (pd.ks_m && !ks_range.holds(*pd.ks_m)) d.fail("ks", metres(*pd.ks_m) + " is " + ks_range.text(metres));
  pd.diameter_m = d.quantity("diameter", Dimension::length);
  pd.manning_n_by_material = number_table(d.table("manning_n_by_material"), &n_range);
  pd.ks_m_by_material = quantity_table(d.table("ks_by_material"), Dimension::length, p.file, &ks_range);
  d.finish();

  TomlSection shapes = s.table("shapes");
  for (auto [name, shape] : {std::pair<std::string_view, hydraulics::Shape>{"circular", hydraulics::Shape::circular},
                             {"box", hydraulics::Shape::box},
                             {"egg", hydraulics::Shape::egg}})
    for (const auto& value : shapes.strings(name)) p.shape_values[value] = shape;
  shapes.finish();
  read_section_tables(s.table("section_tables"), p);
  p.unknown_shape_as_circle = s.choice<bool>("unknown_shape", {{"leave_out", false}, {"equal_area_circle", true}})
                                  .value_or(false);
  if (p.unknown_shape_as_circle && pf.shape.empty())
    s.fail("unknown_shape", "needs pipes.fields.shape to be mapped (it is about the shape field's values)");
  s.finish();
}

void read_structures(TomlSection s, Project& p) {
  if (!s.present()) return;
  p.structures = read_layer_source(s, p.directory);
  TomlSection f = s.table("fields");
  StructureFields& sf = p.structure_fields;
  sf.id = f.string("id").value_or("");
  sf.type = f.string("type").value_or("");
  sf.loss_k = f.string("loss_k").value_or("");
  sf.population = f.string("population").value_or("");
  for (auto [key, dst] : {std::pair<std::string_view, FieldRef*>{"rim", &sf.rim},
                          {"invert", &sf.invert},
                          {"diameter", &sf.diameter},
                          {"tailwater", &sf.tailwater}})
    *dst = f.field_ref(key, Dimension::length);
  sf.inflow = f.field_ref("inflow", Dimension::flow);
  f.finish();

  TomlSection types = s.table("types");
  for (std::string_view kind : {"manhole", "inlet", "junction", "outfall", "pump_station"})
    for (const auto& value : types.strings(kind)) p.structure_type_values[value] = std::string(kind);
  types.finish();

  TomlSection d = s.table("defaults");
  if (const auto dia = d.quantity("diameter", Dimension::length)) {
    if (!(*dia > 0.0)) d.fail("diameter", "must be greater than 0");
    p.structure_defaults.diameter_m = *dia;
  }
  p.structure_defaults.loss_k = d.number("loss_k");
  d.finish();
  s.finish();
}

void read_outfalls(TomlSection s, Project& p) {
  OutfallSettings& o = p.outfalls;
  o.ids = s.strings("ids");
  o.field = s.string("field").value_or("");
  o.values = s.strings("values");
  if (!o.field.empty() && o.values.empty()) s.fail("values", "outfalls.field needs the values that mark an outfall");
  if (o.field.empty() && !o.values.empty()) s.fail("field", "outfalls.values needs the structures field they are values of");
  if (!o.field.empty() && p.structures.source.empty())
    s.fail("field", "needs a [structures] layer (a pipes-only export names its outfalls with outfalls.ids)");
  for (const auto& [id, level] : quantity_table(s.table("tailwater"), Dimension::length, p.file)) o.tailwater_m[id] = level;
  s.finish();
}

void read_ground(TomlSection s, Project& p) {
  if (!s.present()) return;
  GroundSettings& g = p.ground;
  const auto source = s.string("source");
  if (!source || source->empty()) s.fail("source", "the ground raster (a file GDAL reads, e.g. a GeoTIFF) is missing");
  g.source = resolve_source(*source, p.directory);
  const double band = s.number("band").value_or(1.0);
  if (!(band >= 1.0 && band <= 1000.0) || band != std::floor(band)) s.fail("band", "must be a whole number from 1");
  g.band = static_cast<int>(band);
  const auto unit_text = s.string("unit");
  if (!unit_text) s.fail("unit", "the raster's vertical unit is missing (\"m\", \"ft\", \"us_ft\", ...): rimline does not guess it");
  const auto unit = units::parse_unit(*unit_text);
  if (!unit || units::dimension_of(*unit) != Dimension::length)
    s.fail("unit", "unknown unit of length \"" + *unit_text + "\"; accepted: " + units::unit_symbols(Dimension::length));
  g.metres_per_unit = units::to_si(1.0, *unit);
  g.offset_m = s.quantity("offset", Dimension::length).value_or(0.0);
  g.fill_rims = s.boolean("fill_rims").value_or(true);
  g.compare_rims = s.boolean("compare_rims").value_or(true);
  if (const auto t = s.quantity("rim_tolerance", Dimension::length)) {
    if (!(*t > 0.0)) s.fail("rim_tolerance", "must be greater than 0");
    g.rim_tolerance_m = *t;
  }
  s.finish();
}

void read_methods(TomlSection s, Project& p) {
  Methods& m = p.methods;
  using hydraulics::FrictionLaw;
  using hydraulics::StructureLossMethod;
  m.friction = s.choice<FrictionLaw>(
                    "friction", {{"manning", FrictionLaw::manning}, {"darcy_weisbach", FrictionLaw::darcy_weisbach}})
                   .value_or(m.friction);
  m.structure_loss = s.choice<StructureLossMethod>("structure_loss", {{"constant_k", StructureLossMethod::constant_k},
                                                                      {"bend", StructureLossMethod::bend},
                                                                      {"hec22", StructureLossMethod::hec22}})
                         .value_or(m.structure_loss);
  m.benching = s.choice<hydraulics::Benching>("benching", {{"flat", hydraulics::Benching::flat},
                                                           {"half", hydraulics::Benching::half},
                                                           {"full", hydraulics::Benching::full}})
                   .value_or(m.benching);
  if (const auto t = s.quantity("water_temperature", Dimension::temperature)) {
    if (*t < 0.0 || *t > 100.0) s.fail("water_temperature", "must be between 0 and 100 C (liquid water)");
    m.water_temperature_c = *t;
  }
  auto energy_choice = [](TomlSection& t) {
    return t.choice<hydraulics::StructureEnergy>("structure_energy",
                                                {{"whole_loss", hydraulics::StructureEnergy::whole_loss},
                                                 {"still_pool", hydraulics::StructureEnergy::still_pool}});
  };
  const bool hec22 = m.structure_loss == StructureLossMethod::hec22;
  // HEC-22 defines its own bookkeeping (the access-hole loss is the whole loss across the hole).
  const char* hec22_own = "the hec22 structure loss has its own bookkeeping (its loss is the whole loss across "
                          "the access hole); still_pool applies to constant_k and bend";
  if (const auto e = energy_choice(s)) {
    if (hec22 && *e == hydraulics::StructureEnergy::still_pool) s.fail("structure_energy", hec22_own);
    m.structure_energy = *e;
  }
  TomlSection by_id = s.table("structures");
  for (const auto& [id, node] : by_id.entries()) {
    if (!node->is_table()) by_id.fail_at(node, id, "must be a table of methods for structure \"" + id + "\"");
    TomlSection one(node->as_table(), by_id.name() + "." + id, p.file, by_id.pattern() + ".*");
    if (const auto e = energy_choice(one)) {
      if (hec22 && *e == hydraulics::StructureEnergy::still_pool) one.fail("structure_energy", hec22_own);
      m.structure_energy_by_id[id] = *e;
    }
    one.finish();
  }
  TomlSection k = s.table("k_by_type");
  const std::vector<std::string> kinds{"manhole", "inlet", "junction", "outfall", "pump_station"};
  for (const auto& [kind, value] : number_table(k)) {
    if (std::find(kinds.begin(), kinds.end(), kind) == kinds.end()) {
      std::string msg = "unknown structure kind";
      const std::string near = closest_name(kind, kinds);
      if (!near.empty()) msg += "; did you mean \"" + near + "\"?";
      k.fail(kind, msg);
    }
    if (value < 0.0) k.fail(kind, "a loss coefficient must not be negative");
    m.k_by_type[kind] = value;
  }
  s.finish();
}

// A quantity that may be switched off with "off".
std::optional<double> optional_quantity(TomlSection& s, std::string_view key, Dimension d,
                                        std::optional<double> fallback, const std::string& file) {
  const auto text = s.string(key);
  if (!text) return fallback;
  if (*text == "off") return std::nullopt;
  return parse_quantity(*text, d, file + ": " + s.where(key));
}

void read_criteria(TomlSection s, Project& p) {
  Criteria& c = p.criteria;
  c.freeboard_m = s.quantity("freeboard", Dimension::length).value_or(c.freeboard_m);
  c.velocity_min_m_s = s.quantity("velocity_min", Dimension::velocity).value_or(c.velocity_min_m_s);
  auto basis_choice = [](TomlSection& t) {
    return t.choice<VelocityMinBasis>("velocity_min_basis", {{"normal_depth", VelocityMinBasis::normal_depth},
                                                             {"full_flow", VelocityMinBasis::full_flow}});
  };
  c.velocity_min_basis = basis_choice(s).value_or(c.velocity_min_basis);
  c.velocity_max_m_s = optional_quantity(s, "velocity_max", Dimension::velocity, c.velocity_max_m_s, p.file);
  c.capacity_ratio_max = positive_number(s, "capacity_ratio_max", c.capacity_ratio_max);
  c.cover_min_m = optional_quantity(s, "cover_min", Dimension::length, c.cover_min_m, p.file);
  auto per_feature = [&](std::string_view key, bool structures) {
    TomlSection group = s.table(key);
    for (const auto& [id, node] : group.entries()) {
      if (!node->is_table()) group.fail_at(node, id, "must be a table of limits for feature \"" + id + "\"");
      TomlSection f(node->as_table(), group.name() + "." + id, p.file, group.pattern() + ".*");
      CriteriaOverride o;
      if (structures) {
        o.freeboard_m = f.quantity("freeboard", Dimension::length);
      } else {
        o.velocity_min_m_s = f.quantity("velocity_min", Dimension::velocity);
        o.velocity_min_basis = basis_choice(f);
        o.velocity_max_m_s = f.quantity("velocity_max", Dimension::velocity);
        o.capacity_ratio_max = f.number("capacity_ratio_max");
        o.cover_min_m = f.quantity("cover_min", Dimension::length);
      }
      f.finish();
      (structures ? p.structure_criteria : p.conduit_criteria)[id] = o;
    }
  };
  per_feature("structures", true);
  per_feature("conduits", false);
  s.finish();
}

void read_plausibility(TomlSection s, Project& p) {
  Plausibility& q = p.plausibility;
  q.invert_min_m = s.quantity("invert_min", Dimension::length).value_or(q.invert_min_m);
  q.invert_max_m = s.quantity("invert_max", Dimension::length).value_or(q.invert_max_m);
  if (!(q.invert_min_m < q.invert_max_m)) s.fail("invert_max", "must be greater than invert_min");
  q.diameter_min_m = s.quantity("diameter_min", Dimension::length).value_or(q.diameter_min_m);
  q.diameter_max_m = s.quantity("diameter_max", Dimension::length).value_or(q.diameter_max_m);
  if (!(q.diameter_min_m > 0.0 && q.diameter_min_m < q.diameter_max_m))
    s.fail("diameter_max", "needs 0 < diameter_min < diameter_max");
  q.length_tolerance = positive_number(s, "length_tolerance", q.length_tolerance);
  q.manning_n_min = positive_number(s, "manning_n_min", q.manning_n_min);
  q.manning_n_max = positive_number(s, "manning_n_max", q.manning_n_max);
  if (!(q.manning_n_min < q.manning_n_max)) s.fail("manning_n_max", "must be greater than manning_n_min");
  q.ks_max_m = s.quantity("ks_max", Dimension::length).value_or(q.ks_max_m);
  if (!(q.ks_max_m > 0.0)) s.fail("ks_max", "must be greater than 0");
  q.level_tolerance_m = s.quantity("level_tolerance", Dimension::length).value_or(q.level_tolerance_m);
  if (!(q.level_tolerance_m >= 0.0)) s.fail("level_tolerance", "must not be negative");
  q.invert_step_max_m = s.quantity("invert_step_max", Dimension::length).value_or(q.invert_step_max_m);
  if (!(q.invert_step_max_m > 0.0)) s.fail("invert_step_max", "must be greater than 0");
  s.finish();
}

void read_network_solve(TomlSection s, Project& p) {
  auto& n = p.network_solve;
  n.all_components = s.choice<bool>("components", {{"non_tree", false}, {"all", true}}).value_or(n.all_components);
  auto count = [&s](std::string_view key, int fallback) {
    const auto v = s.number(key);
    if (!v) return fallback;
    if (!(*v >= 1.0 && *v <= 1000.0) || *v != std::floor(*v)) s.fail(key, "must be a whole number from 1 to 1000");
    return static_cast<int>(*v);
  };
  n.max_iterations = count("max_iterations", n.max_iterations);
  n.design_flow_iterations = count("design_flow_iterations", n.design_flow_iterations);
  s.finish();
}

void read_flows_and_tailwater(TomlSection flows, TomlSection tw, Project& p) {
  p.flow_mode = flows
                    .choice<FlowMode>("mode", {{"pipe_field", FlowMode::pipe_field},
                                               {"structure_inflows", FlowMode::structure_inflows},
                                               {"rational", FlowMode::rational},
                                               {"sanitary", FlowMode::sanitary}})
                    .value_or(p.flow_mode);
  p.split_rule = flows
                     .choice<SplitRule>("split", {{"hydraulic", SplitRule::hydraulic},
                                                  {"capacity", SplitRule::capacity},
                                                  {"field", SplitRule::field},
                                                  {"fixed", SplitRule::fixed}})
                     .value_or(p.split_rule);
  p.default_inflow_m3_s = flows.quantity("default_inflow", Dimension::flow);
  TomlSection shares = flows.table("shares");
  for (const auto& [id, node] : shares.entries()) {
    const auto v = node->value<double>();
    if (!v || !(*v >= 0.0 && *v <= 1.0)) shares.fail_at(node, id, "a share must be a number from 0 to 1");
    p.split_shares[id] = *v;
  }
  flows.finish();
  if (p.split_rule == SplitRule::field && p.pipe_fields.split.empty())
    flows.fail("split", "\"field\" needs pipes.fields.split to be mapped");
  if (p.split_rule == SplitRule::fixed && p.split_shares.empty())
    flows.fail("split", "\"fixed\" needs the shares in [flows.shares] (\"PIPE-ID\" = 0.3)");
  p.tailwater_mode =
      tw.choice<TailwaterMode>(
            "mode", {{"fixed", TailwaterMode::fixed}, {"free", TailwaterMode::free}, {"higher", TailwaterMode::higher}})
          .value_or(p.tailwater_mode);
  for (const auto& level : tw.strings("levels"))
    p.tailwater_levels_m.push_back(parse_quantity(level, Dimension::length, p.file + ": " + tw.where("levels")));
  tw.finish();
  if (p.tailwater_mode == TailwaterMode::fixed && p.tailwater_levels_m.empty())
    tw.fail("levels", "mode \"fixed\" needs at least one level");
}

// A folder given as the project file read as an empty file ("pipes.source missing"), a FIFO
// blocked the reading forever: both are named instead. A missing file is left to the open below.
void require_regular_project_file(const std::string& path) {
  const FileKind kind = file_kind(path);
  if (kind == FileKind::missing || kind == FileKind::regular) return;
  std::string msg = "is " + std::string(file_kind_text(kind)) + ", not a project file";
  if (kind == FileKind::directory) {
    msg += "; give the path of the .toml file";
    const std::string inside = (std::filesystem::path(path) / "project.toml").string();
    if (file_kind(inside) == FileKind::regular) msg += " (did you mean " + inside + "?)";
  } else {
    msg += "; rimline reads the project file only from a regular file";
  }
  throw Error(ErrorKind::bad_config, ErrorContext{path, "", "", ""}, msg);
}

}  // namespace

Project parse_project(const std::string& toml_text, const std::string& path_for_messages) {
  Project p;
  p.file = path_for_messages;
  const std::filesystem::path dir = std::filesystem::path(path_for_messages).parent_path();
  p.directory = dir.empty() ? std::string(".") : dir.string();

  toml::table root;
  const std::string text(detail::without_utf8_bom(toml_text, p.file));
  detail::reject_unsafe_toml(text, p.file);
  try {
    root = toml::parse(text, path_for_messages);
  } catch (const toml::parse_error& e) {
    throw Error(ErrorKind::bad_config, ErrorContext{p.file, "", "", ""},
                "line " + std::to_string(e.source().begin.line) + ": " + detail::plain_toml_error(e.description()));
  }
  TomlSection top(&root, "", p.file);

  TomlSection proj = top.table("project");
  TomlSection pipes = top.table("pipes"), structures = top.table("structures"), flows = top.table("flows"),
              tailwater = top.table("tailwater"), methods = top.table("methods"),
              plausibility = top.table("plausibility"), criteria = top.table("criteria"),
              force_mains = top.table("force_mains"), pump_curves = top.table("pump_curves"),
              pump_points = top.table("pump_station_points"), outfalls = top.table("outfalls"),
              ground = top.table("ground"), network_solve = top.table("network_solve"),
              comparison = top.table("comparison"), headroom = top.table("headroom");
  const toml::node* pump_stations = top.node("pump_stations");
  detail::CatchmentSections catchment_sections{top.table("catchments"), top.table("land_use"), top.table("rational"),
                                               top.table("sanitary")};
  top.finish();  // a misspelt table name first: it explains a "missing" error that would follow
  p.name = proj.string("name").value_or("");
  p.report_units = proj.choice<units::System>("units", {{"si", units::System::si}, {"us", units::System::us}})
                       .value_or(units::System::si);
  p.crs_override = proj.string("crs").value_or("");
  p.vertical_datum = proj.string("vertical_datum").value_or("");
  proj.finish();

  read_plausibility(plausibility, p);  // first: the pipe defaults are checked against it
  read_pipes(pipes, p);
  read_structures(structures, p);
  read_outfalls(outfalls, p);
  read_ground(ground, p);
  read_flows_and_tailwater(flows, tailwater, p);
  read_network_solve(network_solve, p);
  detail::read_catchment_sections(catchment_sections, p, &read_layer_source);
  read_methods(methods, p);
  read_criteria(criteria, p);
  detail::read_force_main_settings(force_mains, p);
  detail::read_pump_curves(pump_curves, p);
  detail::read_pump_stations(pump_stations, p);
  detail::read_pump_station_points(pump_points, p);
  detail::read_connection_settings(comparison, headroom, p);
  for (auto& [table, src] : layer_sources(p))
    if (!src->where.empty()) src->where_origin = p.file;
  return p;
}

Project load_project(const std::string& path) {
  std::error_code ec;
  if (!std::filesystem::exists(path, ec))
    throw Error(ErrorKind::bad_config, ErrorContext{path, "", "", ""},
                "the project file does not exist (check the path; `rimline fields SOURCE --write-project " + path +
                    "` writes a starter)");
  require_regular_project_file(path);  // a folder reads as an empty file, a FIFO blocks
  std::ifstream in(path, std::ios::binary);
  if (!in) throw Error(ErrorKind::bad_config, ErrorContext{path, "", "", ""}, "cannot open the project file");
  std::ostringstream text;
  text << in.rdbuf();
  return parse_project(text.str(), path);
}

}  // namespace rimline::config
