#pragma once
// Cross-checks of the levels the project maps, once the network is connected: do the pipe inverts,
// the structures' inverts and rims agree with each other in the declared units? Private to src/run.
//
//   UNIT_SUSPECT           error    project     a mapped level field agrees with the rest of the data
//                                               only in another unit ("looks like US_INV is in m:
//                                               declared mm"): the slopes it gives, or its distance to
//                                               the other layer's levels, are off by a unit's factor
//   UNIT_NAME_CONFLICT     warning  project     the unit the project declares for a field contradicts
//                                               the unit its name states ("US_INV_FT" declared m)
//   INVERT_BELOW_STRUCTURE warning  conduits    a pipe end's invert more than plausibility.level_tolerance
//                                               below the invert (sump) of the structure it meets
//   INVERT_ABOVE_RIM       warning  conduits    a pipe end's invert above the rim of the structure it meets
//   INVERT_STEP            warning  structures  an arriving pipe's outlet and the main outflow's inlet
//                                               differ by more than plausibility.invert_step_max
// The per-feature checks of a field already UNIT_SUSPECT are left out: one finding says it for all.
#include "rimline/run/check_run.hpp"

namespace rimline::run {

void check_levels(const config::Project& project, const model::Network& network, const topology::Topology& topology,
                  Findings& findings);

// UNIT_NAME_CONFLICT for every mapped field of the project whose name states a unit of the same kind
// as, but other than, the one declared.
void check_declared_units(const config::Project& project, Findings& findings);

}  // namespace rimline::run
