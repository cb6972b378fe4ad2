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
  }
  return "project";
}

void sort_findings(Findings& findings) {
  std::stable_sort(findings.begin(), findings.end(), [](const Finding& a, const Finding& b) {
    return std::make_tuple(-static_cast<int>(a.severity), a.code, static_cast<int>(a.layer), a.feature_id) <
           std::make_tuple(-static_cast<int>(b.severity), b.code, static_cast<int>(b.layer), b.feature_id);
  });
}

}  // namespace rimline
