#pragma once
// Table cells shared by the report's sections (report_html, pump stations, design flows).
#include <cmath>
#include <cstdio>
#include <initializer_list>
#include <string>

#include "rimline/report/outputs.hpp"
#include "rimline/units.hpp"

namespace rimline::report::html {

inline std::string row(std::initializer_list<std::string> cells, const char* tag = "td") {
  std::string r = "<tr>";
  for (const auto& c : cells) r += std::string("<") + tag + ">" + c + "</" + tag + ">";
  return r + "</tr>\n";
}

// A value in the report's units; empty when unknown.
inline std::string value(double si, units::Dimension d, units::System sys, const char* format = "%.3f") {
  if (!std::isfinite(si)) return "";
  char buf[48];
  std::snprintf(buf, sizeof buf, format, to_report(si, d, sys));
  return buf;
}

// The unit symbol of a dimension in the report's units; empty for a pure number.
inline std::string unit(units::Dimension d, units::System sys) {
  return d == units::Dimension::dimensionless ? "" : std::string(units::unit_symbol(units::display_unit(d, sys)));
}

}  // namespace rimline::report::html
