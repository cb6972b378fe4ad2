#pragma once
// The full results of report.html: every structure and every pipe (not only the exceptions) with
// its envelope figures (feature_values.hpp), each row linked to the feature on the plan map and on
// its profile. A small inline script sorts a table by a clicked heading and filters its rows by a
// typed text; without script the tables read as they are (structures and pipes in the network's
// order, the worst status first when a city's tables are cut to their first rows).
#include <string>

#include "report/feature_links.hpp"

namespace rimline::report {

// At most this many rows per table (the worst status first); results.gpkg holds every feature.
// Common practice, no source: a page of a few thousand rows stays responsive.
inline constexpr std::size_t max_result_rows = 5000;

std::string results_tables_section(const run::CheckRun& run, const FeatureLinks& links);

// The script that sorts and filters every table.sortable of the page (no '<' or '&' in it: the page
// is also well-formed XML).
extern const char* const sortable_script;

}  // namespace rimline::report
