#pragma once
// The design criteria applied to a march result; every violation becomes a Finding.
//   FLOODED          error    structure HGL above the rim
//   FREEBOARD        warning  structure HGL within the required freeboard below the rim
//   RIM_UNKNOWN      info     no rim level: freeboard and flooding could not be checked
//   SURCHARGED       warning  pipe HGL above the crown over part or all of its length
//   VELOCITY_LOW     warning  velocity below the minimum (self-cleansing)
//   VELOCITY_HIGH    warning  velocity above the maximum (scour, erosion protection)
//   CAPACITY         warning  design flow above the allowed share of full-flow capacity
//   COVER            warning  rim minus pipe crown below the minimum cover
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "rimline/finding.hpp"
#include "rimline/model/network.hpp"
#include "rimline/solve/march.hpp"

namespace rimline::checks {

enum class VelocityBasis { profile, full_flow };

struct Criteria {
  double freeboard_m = 0.3;                      // common practice, no source
  double velocity_min_m_s = 0.9;                 // TxDOT Hydraulic Design Manual (2016 rev.): 3 ft/s
  std::optional<double> velocity_max_m_s = 4.6;  // ~15 ft/s, Ten States Standards (from memory)
  double capacity_ratio_max = 1.0;               // common practice, no source
  std::optional<double> cover_min_m;             // off unless set
  VelocityBasis velocity_basis = VelocityBasis::profile;
};

// Limits of one feature that differ from the run's; unset members keep the run's value.
struct Override {
  std::optional<double> freeboard_m;
  std::optional<double> velocity_min_m_s;
  std::optional<double> velocity_max_m_s;
  std::optional<double> capacity_ratio_max;
  std::optional<double> cover_min_m;
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

// The findings of the listed features only (structures, then conduits, in the order given): for the
// part of a network that a change reached (solve::remarch).
Findings check_features(const model::Network& network, const solve::MarchResult& result, const Criteria& criteria,
                        const CriteriaOverrides& overrides, const std::vector<std::size_t>& structures,
                        const std::vector<std::size_t>& conduits);

// Status word of a structure for the result layer: "flooded", "freeboard", "ok", "unknown_rim", "not_checked".
std::string structure_status(const model::Structure& s, const solve::StructureResult& r, double freeboard_m);

}  // namespace rimline::checks
