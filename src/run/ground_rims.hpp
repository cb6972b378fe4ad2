#pragma once
// [ground]: rims from a ground raster where the export has none, and the recorded rims compared
// with the ground. Runs once the network is connected (derived structures included), before the
// level checks and the march. Private to src/run.
//
//   RIM_FROM_GROUND      info     structures  no rim: the ground level at the structure stands in (raster,
//                                             band, unit and offset named)
//   GROUND_NOT_COVERED   info     structures  no rim and the raster does not cover the structure (outside,
//                                             or no-data): the rim stays unknown
//   RIM_GROUND_MISMATCH  warning  structures  a recorded rim differs from the ground by more than
//                                             ground.rim_tolerance
#include "rimline/run/check_run.hpp"

namespace rimline::run {

// Adds the raster to `input_files` (hashed with the other inputs).
void apply_ground(const config::Project& project, model::Network& network, std::vector<std::string>& input_files,
                  Findings& findings);

}  // namespace rimline::run
