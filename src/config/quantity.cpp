// "<number> <unit>" strings of the project file -> SI.
#include <charconv>
#include <cmath>
#include <string>

#include "rimline/error.hpp"
#include "rimline/config/project.hpp"

namespace rimline::config {
namespace {

std::string_view trim(std::string_view s) {
  while (!s.empty() && (s.front() == ' ' || s.front() == '\t')) s.remove_prefix(1);
  while (!s.empty() && (s.back() == ' ' || s.back() == '\t')) s.remove_suffix(1);
  return s;
}

std::string_view dimension_noun(units::Dimension d) {
  switch (d) {
    case units::Dimension::length:
      return "a length";
    case units::Dimension::flow:
      return "a flow";
    case units::Dimension::velocity:
      return "a velocity";
    case units::Dimension::area:
      return "an area";
    case units::Dimension::dimensionless:
      return "a plain number";
    case units::Dimension::slope:
      return "a slope";
    case units::Dimension::temperature:
      return "a temperature";
    case units::Dimension::pressure_head:
      return "a pressure head";
    case units::Dimension::time:
      return "a time";
    case units::Dimension::intensity:
      return "a rainfall intensity";
    case units::Dimension::flow_per_length:
      return "a flow per length";
    case units::Dimension::flow_per_area:
      return "a flow per area";
  }
  return "a quantity";
}

// Spellings offered in "did you mean"; parse_unit accepts more.
const std::vector<std::string>& unit_suggestions() {
  static const std::vector<std::string> names{"m",   "mm",  "cm",   "ft", "us_ft", "in",  "m3/s", "L/s", "cfs", "MGD",
                                              "gpm", "m/s", "ft/s", "m2", "ha",    "ft2", "acre", "%",   "C",   "F",
                                              "s",   "min", "h",    "mm/h", "in/h", "L/d", "gpd", "L/s/km",
                                              "gpd/mi", "L/s/ha", "gpd/acre",
                                              "kPa", "psi", "bar", "m_head", "ft_head"};
  return names;
}

}  // namespace

double parse_quantity(const std::string& text, units::Dimension expected, const std::string& where) {
  const std::string_view s = trim(text);
  double value = 0.0;
  const auto [end, ec] = std::from_chars(s.data(), s.data() + s.size(), value);
  if (ec != std::errc() || !std::isfinite(value))
    throw Error(ErrorKind::bad_config, where + ": \"" + text + "\" is not a quantity \"<number> <unit>\"");
  const std::string_view unit_text = trim(std::string_view(end, static_cast<std::size_t>(s.data() + s.size() - end)));
  const auto unit = units::parse_unit(unit_text);
  if (!unit) {
    std::string msg = where + ": unknown unit \"" + std::string(unit_text) + "\" in \"" + text + "\"";
    const std::string near = closest_name(std::string(unit_text), unit_suggestions());
    if (!near.empty()) msg += "; did you mean \"" + near + "\"?";
    if (expected != units::Dimension::dimensionless)
      msg += " (" + std::string(dimension_noun(expected)) + " takes " + units::unit_symbols(expected) + ")";
    throw Error(ErrorKind::bad_config, msg);
  }
  const units::Dimension got = units::dimension_of(*unit);
  if (got != expected) {
    if (unit_text.empty())
      throw Error(ErrorKind::bad_config,
                  where + ": \"" + text + "\" has no unit; expected " + std::string(dimension_noun(expected)));
    throw Error(ErrorKind::bad_config, where + ": \"" + text + "\" is " + std::string(dimension_noun(got)) +
                                           ", expected " + std::string(dimension_noun(expected)));
  }
  const double si = units::to_si(value, *unit);
  if (!std::isfinite(si))  // e.g. "1e308 ha": finite as written, beyond a double in SI
    throw Error(ErrorKind::bad_config, where + ": \"" + text + "\" is out of range");
  return si;
}

}  // namespace rimline::config
