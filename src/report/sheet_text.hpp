#pragma once
// Words shared by the sheets and the HTML report: flow case, unit system, date.
#include <string>
#include <vector>

#include "rimline/run/check_run.hpp"

namespace rimline::report {

// "design flows from the pipe layer" / "local inflows at structures, accumulated downstream"
std::string flow_case_text(const run::CheckRun& run);
// "SI: m, m3/s, m/s" / "US customary: ft, cfs, ft/s"
std::string units_text(units::System system);
// The run date (UTC) as YYYY-MM-DD; SOURCE_DATE_EPOCH, when set, fixes it for reproducible builds
// (reproducible-builds.org specification, from memory).
std::string report_date();
// Greedy word wrap at `chars` characters per line.
std::vector<std::string> wrap_words(const std::string& text, std::size_t chars);

}  // namespace rimline::report
