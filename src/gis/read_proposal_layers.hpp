#pragma once
// A proposal's new pipes and structures (Project::proposal_pipes / proposal_structures): read
// with the project's own field mapping, as a developer's drawing made to the utility's schema,
// and appended to the network before it is connected, each marked `proposed`. Private to src/gis.
//   PROPOSAL_ID_TAKEN (error)  a new feature's id is already the id of an existing pipe or
//                              structure (or of an earlier new one): the feature is left out.
// Every finding of these layers says in its message which proposal file and layer it comes from.
#include "gis/default_tally.hpp"
#include "gis/run_crs.hpp"
#include "rimline/gis/read_network.hpp"

namespace rimline::gis::detail {

void read_proposal_layers(const Project& project, const RunCrs& crs, DefaultTally& defaults, ReadResult& result);

}  // namespace rimline::gis::detail
