#pragma once
// A finding: one thing a reviewer must see, from a data problem to a freeboard violation.
// Findings are data aligned with the network; the run always completes.
#include <cmath>
#include <cstdint>
#include <limits>
#include <string>
#include <vector>

#include "rimline/units.hpp"

namespace rimline {

enum class Severity { info = 0, warning = 1, error = 2 };
std::string_view severity_name(Severity s);  // "info" | "warning" | "error"

// Which layer a finding belongs to, so the exception list names the source layer.
enum class LayerRole { conduits, structures, force_mains, catchments, project, pump_stations };
std::string_view layer_role_name(LayerRole r);

struct Finding {
  std::string code;  // stable, documented in README (FREEBOARD, SURCHARGED, DATA_MISSING, ...)
  Severity severity = Severity::warning;
  LayerRole layer = LayerRole::conduits;
  std::string feature_id;  // the feature's own id from the source layer
  std::string field;       // source field concerned, if any
  double value = std::numeric_limits<double>::quiet_NaN();  // SI, in `dimension`
  double limit = std::numeric_limits<double>::quiet_NaN();  // SI
  units::Dimension dimension = units::Dimension::dimensionless;
  std::string message;  // one sentence a reviewer understands; quantities as q() tokens
  // The feature's fid in its source layer (-1: none, a derived structure or the project): where
  // ids repeat, it tells the features apart (exceptions.csv column fid, the report).
  std::int64_t fid = -1;
};

using Findings = std::vector<Finding>;

// Messages carry quantities as tokens so each report renders them in its own unit system:
// q(2.5, length) -> "{{2.5|L}}", rendered "2.500 m" (SI) or "8.202 ft" (US).
std::string q(double si_value, units::Dimension d);
std::string render_message(const std::string& message, units::System system);

// The findings from index `from` on are about the feature `fid` of its source layer (where ids
// repeat, the fid tells the features apart).
inline void stamp_fid(Findings& findings, std::size_t from, std::int64_t fid) {
  for (std::size_t k = from; k < findings.size(); ++k) findings[k].fid = fid;
}

// Stable order for outputs: by severity (worst first), code, layer, feature id.
void sort_findings(Findings& findings);
bool finding_before(const Finding& a, const Finding& b);  // the order of sort_findings

}  // namespace rimline
