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
// q(2.5, length) -> "{{2.5|L}}", rendered "2.500 m" (SI) or "8.20 ft" (US).
std::string q(double si_value, units::Dimension d);
// A distance along a pipe or the network (pipe lengths, surcharged lengths): "72.0 m" / "236 ft".
std::string q_distance(double si_m);
// A station along a profile in the trade's notation, without a unit: "0+450.0" / "14+76.38".
std::string q_station(double si_m);
// A wall roughness ks (an equivalent sand grain), three significant figures: "1.5 mm" / "0.0591 in".
std::string q_roughness(double si_m);
std::string render_message(const std::string& message, units::System system);

// The findings from index `from` on are about the feature `fid` of its source layer (where ids
// repeat, the fid tells the features apart).
inline void stamp_fid(Findings& findings, std::size_t from, std::int64_t fid) {
  for (std::size_t k = from; k < findings.size(); ++k) findings[k].fid = fid;
}
// What the data supports, as shown to people (messages, the report, exceptions.csv; results.gpkg
// keeps the computed values): levels, depths and heads to the millimetre or 0.01 ft; velocities to
// 0.01 m/s or ft/s; flows (and infiltration allowances) to three significant figures; areas to
// 0.01 ha or acre; times to 0.1 min; intensities 0.1 mm/h or 0.01 in/h; slopes to 0.0001;
// temperatures to 0.1 degree; pure numbers to 0.01. `display_value` is the value in the display
// unit (only flows look at it).
int display_decimals(units::Dimension d, units::System s, double display_value);
// The number in the system's display unit, rounded as above (no unit).
std::string display_number(double si_value, units::Dimension d, units::System s);
// Distances: 0.1 m or 1 ft (a pipe length is measured on the plan to about that).
std::string distance_number(double si_m, units::System s);
// Stations: metric km + metres to 0.1 m ("1+312.3"), US 100-ft stations to 0.01 ft ("13+12.34"),
// as the trade writes chainage and stationing.
std::string station_text(double si_m, units::System s);
// The notation for a value already in the display unit (m or ft) with the given decimals.
std::string station_notation(double display_value, units::System s, int decimals);

// Stable order for outputs: by severity (worst first), code, layer, feature id.
void sort_findings(Findings& findings);
bool finding_before(const Finding& a, const Finding& b);  // the order of sort_findings

}  // namespace rimline
