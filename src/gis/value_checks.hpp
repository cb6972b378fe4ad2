#pragma once
// Reading one mapped attribute of one feature, converting it to SI once, and turning what is
// wrong with it into a Finding. Shared by the pipe and structure readers. Private to src/gis.
#include <ogr_feature.h>

#include <limits>
#include <optional>
#include <string>
#include <string_view>

#include "rimline/finding.hpp"
#include "rimline/config/project.hpp"

namespace rimline::gis::detail {
// The readers speak the project file's vocabulary (LayerSource, FieldRef, Plausibility, ...).
using namespace rimline::config;

struct RawNumber {
  enum class State { null, number, not_number, not_finite };
  State state = State::null;
  double value = 0.0;  // in the field's own unit
  std::string text;    // the text as read, only when not_number
};

// idx < 0 (not mapped) reads as null.
RawNumber read_number(OGRFeature& f, int idx);
// Trimmed text; nullopt when null, unset or blank.
std::optional<std::string> read_text(OGRFeature& f, int idx);

std::string format_number(double v);                   // up to 10 significant digits, no trailing zeros
std::string format_value(double raw, units::Unit u);   // "760 mm", "0.013"
std::string format_si(double si, units::Dimension d);  // a q() token: "0.760 m" / "2.49 ft" as rendered
std::string format_fixed(double v, int decimals);      // rounded, trailing zeros dropped: "105.7"

// Who a finding is about: the layer role and the feature's own id.
struct FeatureRef {
  LayerRole layer;
  const std::string& id;
  Findings& findings;
  void add(std::string_view code, Severity s, const std::string& field, std::string message,
           double value = std::numeric_limits<double>::quiet_NaN(),
           double limit = std::numeric_limits<double>::quiet_NaN(),
           units::Dimension d = units::Dimension::dimensionless) const;
};

// An id read as text, exactly as the source holds it where its type allows (issue 18: ids beyond
// 2^53 read from a real field as "9.00719925474099e+15", beyond 64 bits clamped by GDAL to
// 9223372036854775807, were false duplicates under ids not in the file). A whole number in a real
// field is written in full ("9007199254740993" where exact). `inexact` says why the id read may not
// be the one in the file (empty when it is exact): the caller reports DATA_ID_INEXACT.
struct IdText {
  std::optional<std::string> id;
  std::string inexact;
};
IdText read_id(OGRFeature& f, int idx);
// DATA_ID_INEXACT for an id read_id could not read exactly.
void report_inexact_id(const IdText& id, const std::string& field, const FeatureRef& who);

// A flow as read (design flow, local inflow): the value in SI when it is at least 0 and at most
// max_flow_m3_s; otherwise DATA_IMPLAUSIBLE ("is negative" / "is beyond any drain") and nullopt.
// An inflow of 1e300 L/s was once taken and read much later as "must be finite, got inf" (issue 18).
// 1,000 m3/s is beyond any urban storm drain or sewer (common practice, no source).
inline constexpr double max_flow_m3_s = 1000.0;
std::optional<double> checked_flow(double raw, const FieldRef& ref, std::string_view consequence, const FeatureRef& who);

// An elevation (invert, rim, tailwater): null -> DATA_MISSING; text, non-finite, exactly 0 (when
// zero_means_missing), or outside [invert_min, invert_max) -> DATA_IMPLAUSIBLE. `what` names it.
std::optional<double> checked_level(const RawNumber& raw, const FieldRef& ref, std::string_view what,
                                    const Plausibility& limits, const FeatureRef& who, bool zero_means_missing = true);

// A section size (diameter, width, height): a non-positive value or one outside the plausible
// range (limits.diameter_min_m..diameter_max_m) -> DATA_IMPLAUSIBLE of `severity`, naming the unit
// the value looks like. Null and absent are left to the caller.
std::optional<double> checked_size(const RawNumber& raw, const FieldRef& ref, const Plausibility& limits,
                                   std::string_view consequence, Severity severity, const FeatureRef& who);

// A non-finite or textual value -> DATA_IMPLAUSIBLE; returns the raw number when it is a number.
std::optional<double> checked_number(const RawNumber& raw, const std::string& field, std::string_view consequence,
                                     const FeatureRef& who, Severity severity = Severity::warning);

// Exports disagree on case ("RC", "rc", "Rc"): an exact match first, then one ignoring case.
bool same_ignoring_case(std::string_view a, std::string_view b);
template <typename Map>
typename Map::const_iterator find_value(const Map& map, const std::string& text) {
  auto it = map.find(text);
  if (it != map.end()) return it;
  for (it = map.begin(); it != map.end(); ++it)
    if (same_ignoring_case(it->first, text)) return it;
  return map.end();
}

// checked_number with the consequence built only when there is something to report, so the
// common case (a good number) allocates nothing.
template <typename MakeConsequence>
std::optional<double> checked_number_lazy(const RawNumber& raw, const std::string& field, MakeConsequence&& make,
                                          const FeatureRef& who, Severity severity = Severity::warning) {
  if (raw.state == RawNumber::State::number) return raw.value;
  if (raw.state == RawNumber::State::null) return std::nullopt;
  return checked_number(raw, field, make(), who, severity);
}

}  // namespace rimline::gis::detail
