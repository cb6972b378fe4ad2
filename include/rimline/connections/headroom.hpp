#pragma once
// Connection headroom: at each structure, the largest inflow that can be added there before any
// criterion anywhere in the network fails, under every tailwater case of the run, and the
// structure or pipe, criterion and case that would fail first.
//
// "Fails" ([headroom] existing, default "no_worse"): a trial with the added flow has an exception
// the run without it lacks (a new one), or one that is worse by more than the [comparison]
// tolerance of its quantity (3 mm of level, 0.01 m/s, 0.01 of the capacity ratio) than the worst
// of that exception over the cases without it, or a pipe that was solved can no longer be. With
// existing = "none" any exception on the part the added flow reaches fails (an existing one
// there leaves no headroom). Codes in [comparison] ignore_codes do not count. The pump stations
// keep their operating points (an added flow stops at a wet well: see added_flow.hpp).
//
// Search: the added flow grows by a factor 4 from 10 x the precision (or the flow leaving the
// structure, if more) until a trial fails or the ceiling ([headroom] limit) is reached, then the
// bracket is halved (geometrically while its ends differ by more than 2 x) until it is narrower
// than max(precision, relative_precision x headroom): 0.1 L/s or 1 % by default. The reported
// headroom is the lower end: a trial there passed, one at most the precision above it failed.
// That assumes the failures grow with the flow (more flow, higher levels); a criterion that could
// pass again at a larger flow (a low velocity in a pipe drowned by backwater) is not looked for
// beyond the first failure.
//
// Parts the network solve settles (issue 21: loops, diversions split by the levels, several
// outlets; run.network.solved_conduit) are not searched: a structure there, or one whose added flow
// or whose trials' level changes reach such a part, gets no figure and a note saying so, since a
// trial re-solve is a tree march and its number would not be the solve's.
//
// Structures searched together go from the outfalls upstream: a structure S whose whole flow goes
// through one pipe to structure D (searched before it) fails, at D's failing flow, what D failed,
// since the same flow added at S raises every level at least as much (with constant-K structure
// losses D's level does not depend on what flows into it) and the flows of the same pipes and one
// more. Not so for that pipe itself: it carries S's flow but only D's backwater, and a velocity
// lowered by backwater rises. So S takes as its upper end, without a trial of its own, the failing
// flow and failure of the nearest structure down its single-outflow chain whose failure is not on
// a pipe between (the value reported is then the one of that structure's trial), and first tries
// D's passing flow. With another loss method, D's failing flow is tried first. Where several
// criteria fail within the precision of each other (a surcharged stretch crossing the 3 mm
// tolerance at once), which one is named depends on the order of the trials.
//
// Speed: a trial changes the flows only on the path from the structure to its outfall(s) and the
// levels only upstream of that path, so each trial re-solves that part (solve::remarch) and checks
// it as it goes, downstream first, stopping at the first failure. The walk leaves a branch as it
// is where the level at its lower end cannot rise by more than the smallest margin over the branch
// (safe_rise_upstream in headroom.cpp), and, at or below D's passing flow, every branch of the path
// below S (it sees at most what D's passing trial saw). Each worker keeps its trials' marches on a
// stack instead of restoring the run's after each trial: S's first trial starts from D's last
// passing one and re-solves only the pipe from S and what lies upstream of it. The trees of
// structures are shared out over the cores (a waiting core takes a subtree from a busy one).
#include <cstddef>
#include <cstdint>
#include <limits>
#include <string>
#include <vector>

#include "rimline/config/connection_settings.hpp"
#include "rimline/run/check_run.hpp"

namespace rimline::connections {

struct Headroom {
  std::size_t structure = model::no_index;
  std::string id;
  std::int64_t fid = -1;  // its fid in the structure layer
  double headroom_m3_s = std::numeric_limits<double>::quiet_NaN();  // NaN: not searched (see note)
  bool at_limit = false;         // no failure up to the ceiling: the headroom is at least this
  std::string note;              // why not searched: "outfall", "no checked pipe leaves it", ...
  bool network_part = false;     // not searched: its flow or level change reaches a part the network solve settles
  // What fails first just above the headroom:
  LayerRole governing_layer = LayerRole::structures;
  std::string governing_id;
  std::int64_t governing_fid = -1;  // its fid in its layer
  std::string criterion;         // FREEBOARD, FLOODED, SURCHARGED, ..., NOT_CHECKED
  std::string change;            // "new", "worsened", "stands" (existing = "none"), "not solved"
  std::string case_label;
  double value = std::numeric_limits<double>::quiet_NaN();  // the criterion's value in that trial (SI)
  units::Dimension dimension = units::Dimension::dimensionless;
  int trials = 0;
};

struct HeadroomOptions {
  unsigned threads = 0;          // 0: one per core
  double still_m = 1.0e-6;       // a level that moves less ends the re-solve upstream
};

// How the added flow is split at a diversion the march takes (a part the network solve settles is
// not searched, see connection_headroom): by field, by capacity (the hydraulic rule's components
// that fell back to the march too), or as the run's design flows split it ([flows.shares]).
flows::SplitRule headroom_split(const run::CheckRun& run);

// How many of `headroom` were not searched because they reach a part the network solve settles.
std::size_t not_searched_for_the_solve(const std::vector<Headroom>& headroom);

// The search ceiling the run uses: [headroom] limit, else 10 x the largest design flow (>= 0.1 m3/s).
double headroom_limit_m3_s(const run::CheckRun& run, const config::HeadroomSettings& settings);

// `structures`: indices to search; empty: [headroom] structures by id, or else every structure.
// One result per structure searched, in the order given (ids the network lacks throw bad_config).
std::vector<Headroom> connection_headroom(const run::CheckRun& run, const config::ConnectionSettings& settings,
                                          std::vector<std::size_t> structures = {},
                                          const HeadroomOptions& options = {});

}  // namespace rimline::connections
