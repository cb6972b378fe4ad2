#include "rimline/units.hpp"

#include <algorithm>
#include <array>
#include <cctype>
#include <utility>

namespace rimline::units {
namespace {

struct Row {
  Unit unit;
  Dimension dimension;
  double si_per_unit;  // offset-free units only; temperature handled apart
  std::string_view symbol;
};

constexpr double hectare_m2 = 1.0e4;
// Acre = 43,560 ft^2 (NIST SP 811, 2008 ed., B.8).
constexpr double acre_m2 = 43560.0 * metres_per_foot * metres_per_foot;

// Pressure is held as head of water [m]: the conventional metre of water, 9.80665 kPa (NIST SP 811,
// 2008 ed., B.8, "meter of water, conventional"); psi = 6.894757 kPa (same table); bar = 100 kPa exactly.
constexpr double pa_per_m_head = 9806.65;

constexpr std::array<Row, 37> rows{{
    {Unit::m, Dimension::length, 1.0, "m"},
    {Unit::mm, Dimension::length, 1.0e-3, "mm"},
    {Unit::cm, Dimension::length, 1.0e-2, "cm"},
    {Unit::ft, Dimension::length, metres_per_foot, "ft"},
    {Unit::us_ft, Dimension::length, metres_per_us_survey_foot, "us_ft"},
    {Unit::in, Dimension::length, metres_per_inch, "in"},
    {Unit::m3_s, Dimension::flow, 1.0, "m3/s"},
    {Unit::l_s, Dimension::flow, 1.0e-3, "L/s"},
    {Unit::cfs, Dimension::flow, cubic_metres_per_cubic_foot, "cfs"},
    {Unit::mgd, Dimension::flow, 1.0e6 * cubic_metres_per_us_gallon / seconds_per_day, "MGD"},
    {Unit::gpm, Dimension::flow, cubic_metres_per_us_gallon / 60.0, "gpm"},
    {Unit::m_s, Dimension::velocity, 1.0, "m/s"},
    {Unit::ft_s, Dimension::velocity, metres_per_foot, "ft/s"},
    {Unit::m2, Dimension::area, 1.0, "m2"},
    {Unit::ha, Dimension::area, hectare_m2, "ha"},
    {Unit::ft2, Dimension::area, metres_per_foot * metres_per_foot, "ft2"},
    {Unit::acre, Dimension::area, acre_m2, "acre"},
    {Unit::one, Dimension::dimensionless, 1.0, "1"},
    {Unit::percent, Dimension::slope, 0.01, "%"},
    {Unit::deg_c, Dimension::temperature, 1.0, "C"},
    {Unit::deg_f, Dimension::temperature, 5.0 / 9.0, "F"},
    {Unit::s, Dimension::time, 1.0, "s"},
    {Unit::min, Dimension::time, seconds_per_minute, "min"},
    {Unit::h, Dimension::time, seconds_per_hour, "h"},
    {Unit::mm_h, Dimension::intensity, 1.0e-3 / seconds_per_hour, "mm/h"},
    {Unit::in_h, Dimension::intensity, metres_per_inch / seconds_per_hour, "in/h"},
    {Unit::l_d, Dimension::flow, 1.0e-3 / seconds_per_day, "L/d"},
    {Unit::gpd, Dimension::flow, cubic_metres_per_us_gallon / seconds_per_day, "gpd"},
    {Unit::l_s_km, Dimension::flow_per_length, 1.0e-3 / 1.0e3, "L/s/km"},
    {Unit::gpd_mi, Dimension::flow_per_length, cubic_metres_per_us_gallon / seconds_per_day / metres_per_mile, "gpd/mi"},
    {Unit::l_s_ha, Dimension::flow_per_area, 1.0e-3 / hectare_m2, "L/s/ha"},
    {Unit::gpd_acre, Dimension::flow_per_area, cubic_metres_per_us_gallon / seconds_per_day / acre_m2, "gpd/acre"},
    {Unit::m_head, Dimension::pressure_head, 1.0, "m_head"},
    {Unit::ft_head, Dimension::pressure_head, metres_per_foot, "ft_head"},
    {Unit::kpa, Dimension::pressure_head, 1000.0 / pa_per_m_head, "kPa"},
    {Unit::psi, Dimension::pressure_head, 6894.757 / pa_per_m_head, "psi"},
    {Unit::bar, Dimension::pressure_head, 1.0e5 / pa_per_m_head, "bar"},
}};

const Row& row_of(Unit u) {
  return *std::find_if(rows.begin(), rows.end(), [u](const Row& r) { return r.unit == u; });
}

std::string lower(std::string_view s) {
  std::string out;
  for (char c : s) {
    if (c == ' ') continue;
    out += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  }
  return out;
}

}  // namespace

Dimension dimension_of(Unit u) { return row_of(u).dimension; }
std::string_view unit_symbol(Unit u) { return row_of(u).symbol; }

std::string unit_symbols(Dimension d) {
  std::string out;
  for (const Row& r : rows)
    if (r.dimension == d && r.unit != Unit::one) out += (out.empty() ? "" : ", ") + std::string(r.symbol);
  return out;
}

std::optional<Unit> parse_unit(std::string_view text) {
  static const std::array<std::pair<std::string_view, Unit>, 70> spellings{{
      {"m", Unit::m},          {"metre", Unit::m},       {"meter", Unit::m},     {"metres", Unit::m},
      {"meters", Unit::m},     {"mm", Unit::mm},         {"cm", Unit::cm},       {"ft", Unit::ft},
      {"foot", Unit::ft},      {"feet", Unit::ft},       {"us_ft", Unit::us_ft}, {"ftus", Unit::us_ft},
      {"us-ft", Unit::us_ft},  {"usft", Unit::us_ft},    {"in", Unit::in},       {"inch", Unit::in},
      {"inches", Unit::in},    {"m3/s", Unit::m3_s},     {"cms", Unit::m3_s},    {"l/s", Unit::l_s},
      {"lps", Unit::l_s},      {"cfs", Unit::cfs},       {"ft3/s", Unit::cfs},   {"mgd", Unit::mgd},
      {"gpm", Unit::gpm},      {"m/s", Unit::m_s},       {"ft/s", Unit::ft_s},   {"fps", Unit::ft_s},
      {"m2", Unit::m2},        {"ha", Unit::ha},         {"ft2", Unit::ft2},     {"acre", Unit::acre},
      {"acres", Unit::acre},   {"ac", Unit::acre},       {"1", Unit::one},       {"", Unit::one},
      {"%", Unit::percent},    {"m/m", Unit::one},       {"c", Unit::deg_c},     {"f", Unit::deg_f},
      {"s", Unit::s},          {"sec", Unit::s},         {"min", Unit::min},     {"minutes", Unit::min},
      {"minute", Unit::min},   {"h", Unit::h},           {"hr", Unit::h},        {"hours", Unit::h},
      {"hour", Unit::h},       {"mm/h", Unit::mm_h},     {"mm/hr", Unit::mm_h},  {"in/h", Unit::in_h},
      {"in/hr", Unit::in_h},   {"l/d", Unit::l_d},       {"l/cap/d", Unit::l_d}, {"lpcd", Unit::l_d},
      {"gpd", Unit::gpd},      {"gpcd", Unit::gpd},      {"l/s/km", Unit::l_s_km}, {"gpd/mi", Unit::gpd_mi},
      {"l/s/ha", Unit::l_s_ha}, {"gpd/acre", Unit::gpd_acre}, {"gpd/ac", Unit::gpd_acre},
      {"m_head", Unit::m_head}, {"mh2o", Unit::m_head},  {"ft_head", Unit::ft_head}, {"fth2o", Unit::ft_head},
      {"kpa", Unit::kpa},      {"psi", Unit::psi},       {"bar", Unit::bar},
  }};
  const std::string key = lower(text);
  for (const auto& [name, unit] : spellings)
    if (name == key) return unit;
  return std::nullopt;
}

double to_si(double value, Unit u) {
  if (u == Unit::deg_f) return (value - 32.0) * 5.0 / 9.0;
  return value * row_of(u).si_per_unit;
}

double from_si(double si_value, Unit u) {
  if (u == Unit::deg_f) return si_value * 9.0 / 5.0 + 32.0;
  return si_value / row_of(u).si_per_unit;
}

Unit display_unit(Dimension d, System s) {
  const bool us = s == System::us;
  switch (d) {
    case Dimension::length:
    case Dimension::pressure_head: return us ? Unit::ft : Unit::m;
    case Dimension::flow: return us ? Unit::cfs : Unit::m3_s;
    case Dimension::velocity: return us ? Unit::ft_s : Unit::m_s;
    case Dimension::area: return us ? Unit::acre : Unit::ha;
    case Dimension::temperature: return us ? Unit::deg_f : Unit::deg_c;
    case Dimension::time: return Unit::min;
    case Dimension::intensity: return us ? Unit::in_h : Unit::mm_h;
    case Dimension::flow_per_length: return us ? Unit::gpd_mi : Unit::l_s_km;
    case Dimension::flow_per_area: return us ? Unit::gpd_acre : Unit::l_s_ha;
    case Dimension::slope:
    case Dimension::dimensionless: return Unit::one;
  }
  return Unit::one;
}

}  // namespace rimline::units
