// [[pump_stations]] and [force_mains] -> model::PumpStation / ForceMainSettings (SI).
#include "config/project_force_mains.hpp"

#include <cmath>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "rimline/error.hpp"

namespace rimline::config::detail {
namespace {

using units::Dimension;

// A pressure head may be given as a length of water ("0 m", "2 ft") or a pressure ("20 kPa").
double head_quantity(const std::string& text, const std::string& where) {
  try {
    return parse_quantity(text, Dimension::length, where);
  } catch (const Error&) {
    return parse_quantity(text, Dimension::pressure_head, where);
  }
}

std::string resolve(const std::string& source, const std::string& directory) {
  const auto colon = source.find(':');
  if (source.rfind("/vsi", 0) == 0 || (colon != std::string::npos && colon >= 2 && source.find('/') > colon))
    return source;  // a GDAL connection string ("PG:...") or virtual file system path
  const std::filesystem::path path(source);
  if (path.is_absolute()) return path.lexically_normal().string();
  return (std::filesystem::path(directory) / path).lexically_normal().string();
}

units::Unit unit_of(TomlSection& s, std::string_view key, Dimension d) {
  const auto text = s.string(key);
  if (!text) s.fail(key, "the unit is missing");
  const auto u = units::parse_unit(*text);
  if (!u || (units::dimension_of(*u) != d && !(d == Dimension::pressure_head && units::dimension_of(*u) == Dimension::length)))
    s.fail(key, "\"" + *text + "\" is not a unit of " + (d == Dimension::flow ? "flow" : "head"));
  return *u;
}

// Two numeric columns flow,head per line; a first line that is not numeric is a header.
std::vector<hydraulics::CurvePoint> read_curve_table(TomlSection t, const std::string& directory) {
  const auto source = t.string("source");
  if (!source || source->empty()) t.fail("source", "the pump-curve table file is missing");
  const units::Unit qu = unit_of(t, "flow_unit", Dimension::flow);
  const units::Unit hu = unit_of(t, "head_unit", Dimension::pressure_head);
  t.finish();
  const std::string path = resolve(*source, directory);
  std::ifstream in(path);
  if (!in) throw Error(ErrorKind::bad_config, ErrorContext{path, "", "", ""}, "cannot open the pump-curve table");
  std::vector<hydraulics::CurvePoint> out;
  std::string line;
  for (int n = 1; std::getline(in, line); ++n) {
    if (line.find_first_not_of(" \t\r") == std::string::npos) continue;
    std::istringstream row(line);
    std::string a, b;
    std::getline(row, a, ',');
    std::getline(row, b, ',');
    char* end_a = nullptr;
    char* end_b = nullptr;
    const double flow = std::strtod(a.c_str(), &end_a), head = std::strtod(b.c_str(), &end_b);
    const bool numeric = end_a != a.c_str() && end_b != b.c_str() && std::isfinite(flow) && std::isfinite(head);
    if (!numeric && n == 1 && out.empty()) continue;  // header
    if (!numeric)
      throw Error(ErrorKind::bad_config, ErrorContext{path, "", "", ""},
                  "line " + std::to_string(n) + ": expected two numbers \"flow,head\", found \"" + line + "\"");
    out.push_back({units::to_si(flow, qu), units::to_si(head, hu)});
  }
  return out;
}

std::vector<hydraulics::CurvePoint> read_curve_points(TomlSection& s, const toml::node* node,
                                                     std::string_view key = "curve") {
  const toml::array* points = node->as_array();
  if (!points) s.fail_at(node, key, "expected [[\"<flow>\", \"<head>\"], ...]");
  std::vector<hydraulics::CurvePoint> out;
  for (const toml::node& item : *points) {
    const toml::array* pair = item.as_array();
    if (!pair || pair->size() != 2 || !(*pair)[0].is_string() || !(*pair)[1].is_string())
      s.fail_at(&item, key, "each point must be a pair of quantity strings [\"<flow>\", \"<head>\"]");
    const std::string where = s.file() + ": " + s.where(&item, key);
    out.push_back({parse_quantity(std::string((*pair)[0].as_string()->get()), Dimension::flow, where),
                   head_quantity(std::string((*pair)[1].as_string()->get()), where)});
  }
  return out;
}

double read_fittings(TomlSection& s) {
  const toml::node* node = s.node("fittings");
  const auto k_total = s.number("k_total");
  if (node && k_total) s.fail("k_total", "give either fittings or k_total, not both");
  if (k_total) {
    if (!(*k_total >= 0.0)) s.fail("k_total", "must not be negative");
    return *k_total;
  }
  if (!node) return 0.0;
  const toml::array* list = node->as_array();
  if (!list) s.fail_at(node, "fittings", "expected [{ k = 0.5, count = 2 }, ...]");
  double total = 0.0;
  for (const toml::node& item : *list) {
    if (!item.is_table()) s.fail_at(&item, "fittings", "each fitting must be a table { k = 0.5, count = 2 }");
    TomlSection f(item.as_table(), s.name() + ".fittings", s.file(), s.pattern() + ".fittings[]");
    const auto k = f.number("k");
    if (!k || !(*k >= 0.0)) f.fail("k", "a fitting needs a loss coefficient k >= 0");
    const double count = f.number("count").value_or(1.0);
    if (!(count >= 0.0) || count != std::floor(count)) f.fail("count", "must be a whole number >= 0");
    f.finish();
    total += *k * count;
  }
  return total;
}

model::PumpStation read_station(TomlSection s, const Project& p) {
  model::PumpStation st;
  st.where = s.file() + ": " + s.where("id");
  const auto id = s.string("id");
  if (!id || id->empty()) s.fail("id", "the wet-well structure id is missing");
  st.id = *id;
  const auto on = s.quantity("pump_on", Dimension::length), off = s.quantity("pump_off", Dimension::length);
  if (!on) s.fail("pump_on", "the pump-on (high) wet-well level is missing");
  if (!off) s.fail("pump_off", "the pump-off (low) wet-well level is missing");
  if (!(*on > *off)) s.fail("pump_on", "must be above pump_off");
  st.pump_on_m = *on;
  st.pump_off_m = *off;
  const double duty = s.number("duty_pumps").value_or(1.0);
  if (!(duty >= 1.0 && duty <= 20.0) || duty != std::floor(duty)) s.fail("duty_pumps", "must be a whole number from 1 to 20");
  st.duty_pumps = static_cast<int>(duty);
  const toml::node* curve = s.node("curve");
  TomlSection table = s.table("curve_table");
  if (curve && table.present()) s.fail("curve_table", "give either curve or curve_table, not both");
  if (!curve && !table.present()) s.fail("curve", "the pump curve is missing (curve = [[\"0 L/s\", \"30 m\"], ...])");
  if (curve && curve->is_string()) {  // the name of a [pump_curves] entry
    const std::string name(curve->as_string()->get());
    const auto it = p.pump_curves.find(name);
    if (it == p.pump_curves.end()) s.fail("curve", "\"" + name + "\" is not a [pump_curves] entry");
    st.curve = it->second;
  } else {
    st.curve = curve ? read_curve_points(s, curve) : read_curve_table(table, p.directory);
  }
  try {
    hydraulics::PumpCurve check(st.curve);
  } catch (const Error& e) {
    s.fail(curve ? "curve" : "curve_table", e.what());
  }
  st.discharge_id = s.string("discharge").value_or("");
  if (const auto level = s.string("discharge_level"))
    st.discharge_level_m = parse_quantity(*level, Dimension::length, s.file() + ": " + s.where("discharge_level"));
  st.fittings_k = read_fittings(s);
  s.finish();
  return st;
}

}  // namespace

void read_force_main_settings(TomlSection s, Project& p) {
  model::ForceMainSettings& f = p.force_mains;
  if (const auto source = s.string("source")) {
    if (source->empty()) s.fail("source", "is empty");
    p.force_main_layer.source = resolve(*source, p.directory);
    p.force_main_layer.layer = s.string("layer").value_or("");
    p.force_main_layer.open_options = s.strings("open_options");
    p.force_main_layer.where = s.string("where").value_or("");
  }
  if (const auto dem = s.string("dem")) f.dem_source = resolve(*dem, p.directory);
  if (const auto u = s.string("dem_unit")) {
    const auto unit = units::parse_unit(*u);
    if (!unit || units::dimension_of(*unit) != Dimension::length) s.fail("dem_unit", "\"" + *u + "\" is not a unit of length");
    f.dem_metres_per_unit = units::to_si(1.0, *unit);
  }
  f.cover_m = s.quantity("cover", Dimension::length).value_or(f.cover_m);
  if (!(f.cover_m >= 0.0)) s.fail("cover", "must not be negative");
  f.spacing_m = s.quantity("spacing", Dimension::length).value_or(f.spacing_m);
  if (!(f.spacing_m > 0.0)) s.fail("spacing", "must be greater than 0");
  if (const auto t = s.string("pressure_min")) f.pressure_min_m = head_quantity(*t, p.file + ": " + s.where("pressure_min"));
  f.velocity_min_m_s = s.quantity("velocity_min", Dimension::velocity).value_or(f.velocity_min_m_s);
  f.velocity_max_m_s = s.quantity("velocity_max", Dimension::velocity).value_or(f.velocity_max_m_s);
  if (!(f.velocity_min_m_s < f.velocity_max_m_s)) s.fail("velocity_max", "must be greater than velocity_min");
  using hydraulics::FrictionLaw;
  f.friction = s.choice<FrictionLaw>("friction", {{"hazen_williams", FrictionLaw::hazen_williams},
                                                  {"darcy_weisbach", FrictionLaw::darcy_weisbach}})
                   .value_or(f.friction);
  f.hazen_c = s.number("hazen_c").value_or(f.hazen_c);
  if (!(f.hazen_c >= 40.0 && f.hazen_c <= 160.0)) s.fail("hazen_c", "must be between 40 and 160");
  s.finish();
}

void read_pump_curves(TomlSection s, Project& p) {
  for (const auto& [name, node] : s.entries()) {
    auto points = read_curve_points(s, node, name);
    try {
      hydraulics::PumpCurve check(points);
    } catch (const Error& e) {
      s.fail_at(node, name, e.what());
    }
    p.pump_curves[name] = std::move(points);
  }
}

void read_pump_station_points(TomlSection s, Project& p) {
  if (!s.present()) return;
  const auto source = s.string("source");
  if (!source || source->empty()) s.fail("source", "the point layer's source is missing");
  p.pump_station_points.source = resolve(*source, p.directory);
  p.pump_station_points.layer = s.string("layer").value_or("");
  p.pump_station_points.open_options = s.strings("open_options");
  p.pump_station_points.where = s.string("where").value_or("");
  TomlSection f = s.table("fields");
  PumpStationFields& pf = p.pump_station_fields;
  for (auto [key, dst] : {std::pair<std::string_view, std::string*>{"id", &pf.id},
                          {"duty_pumps", &pf.duty_pumps},
                          {"discharge", &pf.discharge},
                          {"curve", &pf.curve},
                          {"fittings_k", &pf.fittings_k}})
    *dst = f.string(key).value_or("");
  pf.pump_on = f.field_ref("pump_on", Dimension::length);
  pf.pump_off = f.field_ref("pump_off", Dimension::length);
  for (auto [key, mapped] : {std::pair<std::string_view, bool>{"id", !pf.id.empty()},
                             {"curve", !pf.curve.empty()},
                             {"pump_on", pf.pump_on.mapped()},
                             {"pump_off", pf.pump_off.mapped()}})
    if (!mapped) f.fail(key, "must be mapped (a pump station needs it)");
  f.finish();
  s.finish();
}

void read_pump_stations(const toml::node* array, Project& p) {
  if (!array) return;
  const toml::array* list = array->as_array();
  TomlSection root(nullptr, "", p.file);
  if (!list) root.fail_at(array, "pump_stations", "expected [[pump_stations]] tables");
  std::size_t n = 0;
  for (const toml::node& item : *list) {
    ++n;
    if (!item.is_table()) root.fail_at(&item, "pump_stations", "expected [[pump_stations]] tables");
    p.pump_stations.push_back(
        read_station(TomlSection(item.as_table(), "pump_stations[" + std::to_string(n) + "]", p.file, "pump_stations[]"),
                     p));
    for (std::size_t k = 0; k + 1 < p.pump_stations.size(); ++k)
      if (p.pump_stations[k].id == p.pump_stations.back().id)
        root.fail_at(&item, "pump_stations", "pump station \"" + p.pump_stations.back().id + "\" is given twice");
  }
}

}  // namespace rimline::config::detail
