#pragma once
// The figures of one structure or pipe as a reviewer reads them (the envelope over the tailwater
// cases, each figure from the case that governs it), in the run's units and rounded to what the
// data supports. One source for the results tables of report.html and the plan map's feature panel,
// so both say the same.
#include <string>
#include <vector>

#include "rimline/run/check_run.hpp"

namespace rimline::report {

struct ValueColumn {
  std::string heading;  // "HGL (m)"
  bool number = true;   // sorts as a number
};

std::vector<ValueColumn> structure_columns(units::System system);
std::vector<std::string> structure_values(const run::CheckRun& run, std::size_t structure);  // plain text

std::vector<ValueColumn> conduit_columns(units::System system);
std::vector<std::string> conduit_values(const run::CheckRun& run, std::size_t conduit);  // plain text

// "surcharged", "ok" or "not_checked" (status_palette.hpp's conduit_palette), in the envelope case;
// force mains are "force_main".
std::string conduit_status(const run::CheckRun& run, std::size_t conduit);
// The structure's status in the envelope case ("flooded", "freeboard", "ok", "unknown_rim", "not_checked").
std::string structure_status(const run::CheckRun& run, std::size_t structure);

}  // namespace rimline::report
