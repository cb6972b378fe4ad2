#pragma once
// A proposal against the existing network: the exceptions that are new, worsened, unchanged,
// improved or resolved (each with its value before and after), the HGL and freeboard change at
// every structure, and the verdict sentence.
//
// An exception is one question at one feature: FREEBOARD (FLOODED is the same question asked at
// the rim), SURCHARGED, VELOCITY_LOW, VELOCITY_HIGH, CAPACITY, COVER. Each run's exceptions are
// the worst of each over its tailwater cases (recomputed from the cases' marches with the run's
// criteria). A change smaller than the tolerance of its quantity ([comparison]: levels 3 mm,
// velocities 0.01 m/s, capacity ratio 0.01; common practice, no source) counts as none.
// Codes in [comparison] ignore_codes are left out.
#include <cstddef>
#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "rimline/config/connection_settings.hpp"
#include "rimline/run/check_run.hpp"

namespace rimline::connections {

enum class Change { new_exception, worsened, unchanged, improved, resolved };
std::string_view change_name(Change c);  // "new", "worsened", "unchanged", "improved", "resolved"

// The criteria codes compared ("FREEBOARD" stands for FLOODED too).
bool compared_code(const std::string& code);
std::string question_of(const std::string& code);  // FLOODED -> FREEBOARD, others unchanged

// One exception of one run: the worst over its cases.
struct Exception {
  Finding finding;
  std::string case_label;
};

// Key: layer name + '\t' + feature id + '\t' + question.
using ExceptionSet = std::map<std::string, Exception>;
ExceptionSet exceptions_of(const run::CheckRun& run, const config::ComparisonSettings& settings);

// The tolerance of a finding's quantity.
double tolerance_of(const Finding& f, const config::ComparisonSettings& settings);

struct ExceptionChange {
  Change change = Change::unchanged;
  LayerRole layer = LayerRole::structures;
  std::string feature_id;
  std::string question;                  // FREEBOARD, SURCHARGED, ...
  std::optional<Exception> before, after;
};

struct StructureChange {
  std::string id;
  std::size_t structure = model::no_index;  // in the proposed run
  std::int64_t fid = -1;                     // its fid in the structure layer (the proposal's layer when added)
  bool added = false;                        // the proposal adds it (no "before" figures)
  double hgl_before_m = std::numeric_limits<double>::quiet_NaN();  // envelope over the cases
  double hgl_after_m = std::numeric_limits<double>::quiet_NaN();
  double freeboard_before_m = std::numeric_limits<double>::quiet_NaN();
  double freeboard_after_m = std::numeric_limits<double>::quiet_NaN();
  double hgl_change_m() const { return hgl_after_m - hgl_before_m; }
};

struct Comparison {
  std::string proposal_name;
  config::ComparisonSettings settings;
  std::vector<ExceptionChange> exceptions;   // worst change first, then by layer and id
  std::vector<StructureChange> structures;   // in the proposed network's order
  std::map<Change, std::size_t> counts;
  // Features the proposal adds (its new_pipes / new_structures layers), in the proposed network's
  // order; their exceptions are "new", as a new pipe must meet the criteria like any other.
  std::vector<std::string> added_pipes, added_structures;
  double largest_rise_m = 0.0;               // HGL, 0 when nothing rose
  std::string largest_rise_at;
  // "no new or worsened exception; largest HGL rise 0.012 m at T-07", with q() tokens.
  std::string verdict;
  bool acceptable = true;                    // no new or worsened exception
};

Comparison compare_runs(const run::CheckRun& base, const run::CheckRun& proposed,
                        const config::ComparisonSettings& settings, const std::string& proposal_name);

}  // namespace rimline::connections
