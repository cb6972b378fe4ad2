#pragma once
// The "Shown" cell of an exception row: links to the feature's place on the plan map and to its
// finding marker on the profile of the case the finding comes from (by the marker's number).
#include <string>

#include "report/feature_links.hpp"

namespace rimline::report {

std::string finding_links(const run::CheckRun& run, const FeatureLinks& links, std::size_t finding);

}  // namespace rimline::report
