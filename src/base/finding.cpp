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

int decimals_for(units::Dimension d) {
  switch (d) {
    case units::Dimension::length:
    case units::Dimension::pressure_head:
    case units::Dimension::flow: return 3;
    default: return 2;
  }
}

}  // namespace

std::string q(double si_value, units::Dimension d) {
  std::string s = "{{";
  append_general(s, si_value, 9);
  s += '|';
  s += dimension_letter(d);
  s += "}}";
  return s;
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
    const auto dim = dimension_from_letter(message[bar + 1]);
    const auto unit = units::display_unit(dim, system);
    append_fixed(out, units::from_si(si, unit), decimals_for(dim));
    if (dim != units::Dimension::dimensionless && dim != units::Dimension::slope) {
      out += ' ';
      out += units::unit_symbol(unit);
    }
    i = close + 2;
  }
  return out;
}

}  // namespace rimline
