#pragma once
// The design criteria applied to a march result; every violation becomes a Finding.
//   FLOODED          error    structure HGL above the rim
//   FREEBOARD        error    structure HGL within the required freeboard below the rim
//   RIM_UNKNOWN      info     no rim level: freeboard and flooding could not be checked
//   SURCHARGED       warning  pipe HGL above the crown over part or all of its length
//   VELOCITY_LOW     warning  self-cleansing velocity below the minimum: the design flow at normal depth
//                             (default) or the pipe flowing full at its slope, per run or per pipe; the
//                             message names the basis (tailwater and surcharge play no part)
//   VELOCITY_HIGH    warning  the highest velocity anywhere in the pipe (supercritical reaches
//                             included) above the maximum (scour, erosion protection)
//   CAPACITY         warning  design flow above the allowed share of full-flow capacity
//   COVER            warning  rim minus pipe crown below the minimum cover
#include <limits>
#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "rimline/finding.hpp"
#include "rimline/model/network.hpp"
#include "rimline/solve/march.hpp"

namespace rimline::checks {

// What the minimum-velocity rule compares: the design flow at normal depth in the pipe itself, or
// the pipe flowing full at its slope (agencies' self-cleansing rules use one or the other).
enum class VelocityBasis { normal_depth, full_flow };

struct Criteria {
  double freeboard_m = 0.3;                      // common practice, no source
  double velocity_min_m_s = 0.9;                 // TxDOT Hydraulic Design Manual (2016 rev.): 3 ft/s
  std::optional<double> velocity_max_m_s = 4.6;  // ~15 ft/s, Ten States Standards (from memory)
  double capacity_ratio_max = 1.0;               // common practice, no source
  std::optional<double> cover_min_m;             // off unless set
  VelocityBasis velocity_basis = VelocityBasis::normal_depth;
};

// Limits of one feature that differ from the run's; unset members keep the run's value.
struct Override {
  std::optional<double> freeboard_m;
  std::optional<double> velocity_min_m_s;
  std::optional<double> velocity_max_m_s;
  std::optional<double> capacity_ratio_max;
  std::optional<double> cover_min_m;
  std::optional<VelocityBasis> velocity_basis;
};

// Per-structure and per-conduit overrides (e.g. a stricter freeboard at one inlet), by id.
struct CriteriaOverrides {
  std::map<std::string, Override> structures;
  std::map<std::string, Override> conduits;
};

// The criteria that apply to one feature.
Criteria criteria_for(const Criteria& run, const std::map<std::string, Override>& overrides, const std::string& id);

Findings run_checks(const model::Network& network, const solve::MarchResult& result, const Criteria& criteria,
                    const CriteriaOverrides& overrides = {});

// The velocity the minimum-velocity rule compared for a solved pipe, and how it was found:
//   "normal_depth"         Q / A(y_n) for the design flow at normal depth
//   "full_flow"            the full-flow velocity at the pipe's slope (capacity / full area)
//   "full_at_design_flow"  normal-depth basis, but the design flow exceeds the partly-full peak: Q / A_full
//   "marched"              no normal depth or full-flow velocity on a flat or adverse slope: the
//                          lower of the march's end velocities
struct SelfCleansingVelocity {
  double velocity_m_s = std::numeric_limits<double>::quiet_NaN();
  std::string_view basis;
};
SelfCleansingVelocity self_cleansing_velocity(const model::Conduit& conduit, const solve::ConduitResult& result,
                                              VelocityBasis basis);
// Whether a solved pipe runs surcharged (HGL above the crown over part of it or at an end), and
// how far its HGL stands above the crown at the higher end (negative: below). SURCHARGED and the
// sweep envelope of the pipe's levels both use it, so they name the same case.
struct Surcharge {
  bool surcharged = false;
  double crown_excess_m = std::numeric_limits<double>::quiet_NaN();
};
Surcharge surcharge_of(const model::Conduit& conduit, const solve::ConduitResult& result);

// The highest velocity anywhere along a solved pipe's profile (what VELOCITY_HIGH compares).
double highest_velocity_m_s(const solve::ConduitResult& result);
std::string_view velocity_basis_name(VelocityBasis b);  // "normal_depth" | "full_flow"
// The findings of the listed features only (structures, then conduits, in the order given): for the
// part of a network that a change reached (solve::remarch).
Findings check_features(const model::Network& network, const solve::MarchResult& result, const Criteria& criteria,
                        const CriteriaOverrides& overrides, const std::vector<std::size_t>& structures,
                        const std::vector<std::size_t>& conduits);

// Status word of a structure for the result layer: "flooded", "freeboard", "ok", "unknown_rim", "not_checked".
std::string structure_status(const model::Structure& s, const solve::StructureResult& r, double freeboard_m);

}  // namespace rimline::checks
