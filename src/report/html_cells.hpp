#pragma once
// Table cells shared by the report's sections (report_html, pump stations, design flows).
#include <cmath>
#include <cstdio>
#include <initializer_list>
#include <string>

#include "rimline/finding.hpp"
#include "rimline/report/outputs.hpp"
#include "rimline/units.hpp"

namespace rimline::report::html {

inline std::string row(std::initializer_list<std::string> cells, const char* tag = "td") {
  std::string r = "<tr>";
  for (const auto& c : cells) r += std::string("<") + tag + ">" + c + "</" + tag + ">";
  return r + "</tr>\n";
}

// A value in the report's units, rounded to what the data supports (rimline::display_decimals);
// empty when unknown.
inline std::string value(double si, units::Dimension d, units::System sys) {
  if (!std::isfinite(si)) return "";
  return display_number(si, d, sys);
}

// The same with an explicit printf format, for figures that are counts or coefficients.
inline std::string value(double si, units::Dimension d, units::System sys, const char* format) {
  if (!std::isfinite(si)) return "";
  char buf[48];
  std::snprintf(buf, sizeof buf, format, to_report(si, d, sys));
  return buf;
}

// A distance (pipe length, length along a profile): 0.1 m or 1 ft; empty when unknown.
inline std::string distance(double si_m, units::System sys) {
  if (!std::isfinite(si_m)) return "";
  return distance_number(si_m, sys);
}

// A pipe size as the trade gives it: millimetres or inches, whole ("1200 mm", "48 in").
inline std::string size(double si_m, units::System sys) {
  if (!std::isfinite(si_m)) return "";
  const auto u = sys == units::System::us ? units::Unit::in : units::Unit::mm;
  char buf[48];
  std::snprintf(buf, sizeof buf, "%.0f %s", units::from_si(si_m, u), std::string(units::unit_symbol(u)).c_str());
  return buf;
}

// The unit symbol of a dimension in the report's units; empty for a pure number.
inline std::string unit(units::Dimension d, units::System sys) {
  return d == units::Dimension::dimensionless ? "" : std::string(units::unit_symbol(units::display_unit(d, sys)));
}

}  // namespace rimline::report::html
