#pragma once
// What the project asks of the run, checked against the network and the results. Private to src/run.
//
//   UNKNOWN_ID        warning  project     a per-feature criteria override, an [outfalls] id or an outfall
//                                          tailwater names an id the network lacks (did you mean ...?)
//   OUTFALL_ASSUMED   warning  structures  no structure is typed or named an outfall; this one is taken as
//                                          an outfall because no marched pipe leaves it (counted in the summary)
//   TAILWATER_BELOW_OUTFALL warning structures  a tailwater level lies below the outfall's invert: the outfall
//                                          runs free at that level (a datum or unit mix-up is likely)
//   NOTHING_CHECKED   error    project     no pipe could be solved: the run checked nothing (exit code 5)
#include "rimline/run/check_run.hpp"

namespace rimline::run {

// Stops the run (Error bad_config naming the project file) when the flow mode has no flow source:
// a run without one would fill every pipe with zero and report thousands of false findings.
void require_flow_source(const config::Project& project);

void report_unknown_ids(const config::Project& project, const model::Network& network, Findings& findings);

// OUTFALL_ASSUMED where nothing is an outfall; TOPOLOGY_NO_OUTFALL (see check_run.hpp) for a tree that
// ends elsewhere when some structure is an outfall and the layer types its structures or the project
// names outfalls.
void report_outfalls(const config::Project& project, const model::Network& network, const topology::Topology& topo,
                     Findings& findings);

// Stops the run (Error bad_input) when a design-flow mode leaves out a catchment (an error finding on
// the catchments layer, or no outlet) and the project does not allow it.
void require_catchments_used(const config::Project& project, const CheckRun& run);

void report_tailwater_below_outfalls(const CheckRun& run, Findings& findings);

// NOTHING_CHECKED when no gravity pipe was solved in any case and no pump station was laid out.
void report_nothing_checked(const CheckRun& run, Findings& findings);

}  // namespace rimline::run
