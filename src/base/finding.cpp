#include "rimline/finding.hpp"

#include <algorithm>
#include <tuple>

namespace rimline {

std::string_view severity_name(Severity s) {
  switch (s) {
    case Severity::info: return "info";
    case Severity::warning: return "warning";
    case Severity::error: return "error";
  }
  return "info";
}

std::string_view layer_role_name(LayerRole r) {
  switch (r) {
    case LayerRole::conduits: return "conduits";
    case LayerRole::structures: return "structures";
    case LayerRole::force_mains: return "force_mains";
    case LayerRole::catchments: return "catchments";
    case LayerRole::project: return "project";
    case LayerRole::pump_stations: return "pump_stations";
  }
  return "project";
}

bool finding_before(const Finding& a, const Finding& b) {
  return std::tie(b.severity, a.code, a.layer, a.feature_id) < std::tie(a.severity, b.code, b.layer, b.feature_id);
}

void sort_findings(Findings& findings) { std::stable_sort(findings.begin(), findings.end(), finding_before); }

}  // namespace rimline

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>

#include "base/number_text.hpp"

namespace rimline {
namespace {

char dimension_letter(units::Dimension d) {
  switch (d) {
    case units::Dimension::length: return 'L';
    case units::Dimension::flow: return 'Q';
    case units::Dimension::velocity: return 'V';
    case units::Dimension::area: return 'A';
    case units::Dimension::pressure_head: return 'P';
    case units::Dimension::temperature: return 'T';
    case units::Dimension::slope: return 'S';
    case units::Dimension::dimensionless: return 'N';
    case units::Dimension::time: return 't';
    case units::Dimension::intensity: return 'I';
    case units::Dimension::flow_per_length: return 'l';
    case units::Dimension::flow_per_area: return 'a';
  }
  return 'N';
}

units::Dimension dimension_from_letter(char c) {
  switch (c) {
    case 'L': return units::Dimension::length;
    case 'Q': return units::Dimension::flow;
    case 'V': return units::Dimension::velocity;
    case 'A': return units::Dimension::area;
    case 'P': return units::Dimension::pressure_head;
    case 'T': return units::Dimension::temperature;
    case 'S': return units::Dimension::slope;
    case 't': return units::Dimension::time;
    case 'I': return units::Dimension::intensity;
    case 'l': return units::Dimension::flow_per_length;
    case 'a': return units::Dimension::flow_per_area;
    default: return units::Dimension::dimensionless;
  }
}

// Token letters beyond the dimensions: a distance and a station, both lengths.
constexpr char distance_letter = 'D';
constexpr char station_letter = 'X';
constexpr char roughness_letter = 'R';

}  // namespace

std::string q(double si_value, units::Dimension d) {
  std::string s = "{{";
  append_general(s, si_value, 9);
  s += '|';
  s += dimension_letter(d);
  s += "}}";
  return s;
}

std::string q_distance(double si_m) {
  std::string s = "{{";
  append_general(s, si_m, 9);
  return s + '|' + distance_letter + "}}";
}

std::string q_station(double si_m) {
  std::string s = "{{";
  append_general(s, si_m, 9);
  return s + '|' + station_letter + "}}";
}

std::string q_roughness(double si_m) {
  std::string s = "{{";
  append_general(s, si_m, 9);
  return s + '|' + roughness_letter + "}}";
}

int display_decimals(units::Dimension d, units::System s, double display_value) {
  const bool us = s == units::System::us;
  switch (d) {
    case units::Dimension::length:
    case units::Dimension::pressure_head: return us ? 2 : 3;
    case units::Dimension::velocity:
    case units::Dimension::area:
    case units::Dimension::dimensionless: return 2;
    case units::Dimension::slope: return 4;
    case units::Dimension::temperature:
    case units::Dimension::time: return 1;
    case units::Dimension::intensity: return us ? 2 : 1;
    case units::Dimension::flow:
    case units::Dimension::flow_per_length:
    case units::Dimension::flow_per_area: {
      // Three significant figures: a design flow rests on areas, coefficients and intensities known
      // to two or three figures.
      const double a = std::fabs(display_value);
      if (!(a > 0.0) || !std::isfinite(a)) return 2;
      const int lead = static_cast<int>(std::floor(std::log10(a)));
      return std::clamp(2 - lead, 0, 6);
    }
  }
  return 2;
}

std::string display_number(double si_value, units::Dimension d, units::System s) {
  const double v = units::from_si(si_value, units::display_unit(d, s));
  std::string out;
  append_fixed(out, v, display_decimals(d, s, v));
  return out;
}

std::string distance_number(double si_m, units::System s) {
  std::string out;
  append_fixed(out, units::from_si(si_m, units::display_unit(units::Dimension::length, s)),
               s == units::System::us ? 0 : 1);
  return out;
}

std::string station_notation(double value, units::System system, int decimals) {
  // Metric chainage in km + metres; US stations of 100 ft.
  const bool us = system == units::System::us;
  const double major = us ? 100.0 : 1000.0;
  const int width = us ? 2 : 3;
  const double scale = std::pow(10.0, decimals);
  const double a = std::round(std::fabs(value) * scale) / scale;
  const double whole = std::floor(a / major + 1e-9);
  const double rest = std::max(0.0, a - whole * major);
  std::string out = value < 0.0 && a > 0.0 ? "-" : "";
  append_fixed(out, whole, 0);
  out += '+';
  std::string tail;
  append_fixed(tail, rest, decimals);
  const std::size_t digits = static_cast<std::size_t>(width + (decimals > 0 ? 1 + decimals : 0));
  if (tail.size() < digits) out.append(digits - tail.size(), '0');
  return out + tail;
}

std::string station_text(double si_m, units::System s) {
  return station_notation(units::from_si(si_m, units::display_unit(units::Dimension::length, s)), s,
                          s == units::System::us ? 2 : 1);
}

std::string render_message(const std::string& message, units::System system) {
  std::string out;
  out.reserve(message.size());
  std::size_t i = 0;
  while (i < message.size()) {
    const std::size_t open = message.find("{{", i);
    const std::size_t close = open == std::string::npos ? std::string::npos : message.find("}}", open);
    const std::size_t bar = close == std::string::npos ? std::string::npos : message.rfind('|', close);
    if (open == std::string::npos || close == std::string::npos || bar == std::string::npos || bar < open) {
      out.append(message, i, std::string::npos);
      break;
    }
    out.append(message, i, open - i);
    double si = 0.0;
    std::from_chars(message.data() + open + 2, message.data() + bar, si);
    const char letter = message[bar + 1];
    i = close + 2;
    if (letter == station_letter) {
      out += station_text(si, system);
      continue;
    }
    if (letter == roughness_letter) {
      const auto u = system == units::System::us ? units::Unit::in : units::Unit::mm;
      append_general(out, units::from_si(si, u), 3);
      out += ' ';
      out += units::unit_symbol(u);
      continue;
    }
    const auto dim = letter == distance_letter ? units::Dimension::length : dimension_from_letter(letter);
    const auto unit = units::display_unit(dim, system);
    out += letter == distance_letter ? distance_number(si, system) : display_number(si, dim, system);
    if (dim != units::Dimension::dimensionless && dim != units::Dimension::slope) {
      out += ' ';
      out += units::unit_symbol(unit);
    }
  }
  return out;
}

}  // namespace rimline
