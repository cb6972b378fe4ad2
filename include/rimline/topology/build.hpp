#pragma once
// Connects pipes to structures, orients them with the flow, finds outfalls and their
// upstream trees, and reports what does not fit (loops, parallels, unsnapped ends ...).
//
// Connection. A pipe end with a mapped from_id / to_id is linked to the structure of that id.
// Other ends snap to the nearest structure within snap_tolerance_m (GEOS STRtree). Ends that
// find no structure are clustered (ends within the tolerance of each other share one) into
// structures of kind `derived` with unknown rim. When the network has no structure layer
// (structures empty on entry), every id becomes a derived structure placed where the pipe
// ends meeting at it agree.
//
// Orientation rule (flow runs from `from` to `to`; the march needs it right):
//  1. Ids given: from_id is upstream, to_id downstream (e.g. Melbourne UNITID / UNITID2). A line
//     digitised the other way is turned (points, directions, vertices); the inverts stay with
//     the ends the source named them for. Inverts rising along the flow: ADVERSE_SLOPE. With
//     direction_from_inverts the ids only connect: a gravity pipe whose inverts rise from its
//     from- to its to-structure is turned (REVERSED).
//  2. Snapped ends (inverts taken to belong to the line's first / last vertex):
//     a. network: an end at a structure of kind outfall is the downstream end;
//     b. otherwise the inverts: the lower end is downstream (they must differ by more than
//        invert_tolerance_m);
//     c. otherwise the digitised direction stands.
//     d. network over inverts: a pipe that (b) would turn is kept as digitised when, so, it
//        carries on its neighbours' flow at both ends (after a-c another pipe flows into its
//        first structure and another flows out of its last one); turning it would make a
//        false outfall. (Two adverse pipes in a row are not recognised: each lacks the
//        confirming neighbour on one side, so both are turned.)
//     A pipe turned by (a) or (b) is REVERSED (the inverts turn with it). A pipe whose inverts
//     rise along the direction fixed by (a) or (d) is ADVERSE_SLOPE and is not turned.
//  Force mains may rise (pumped): rule (b) does not turn them and they get no ADVERSE_SLOPE.
//
// Trees. A conduit is marched when usable, connected at both ends to different structures
// and not cut from a loop. A directed loop is cut at the pipe that closes it in a depth-first
// walk downstream from the structures in index order. Each structure's main outflow is its
// marched outflow with the largest cross-section area (ties: lowest index). An outfall is a
// structure with inflows and no marched outflow. A structure belongs to the tree of the outfall
// its chain of main outflows reaches; a conduit belongs to the tree of its downstream
// structure. So a diversion's secondary outflow may lie in another tree than its upstream
// structure; the march computes that conduit from its own downstream structure and reaches a
// structure whose level the other tree sets.
//  Tree::structures: each structure after every structure its outflows drain into (a
//  topological order upstream), the outfall first. Tree::conduits: grouped by downstream
//  structure in that order, so each conduit comes after its downstream structure and after
//  every conduit leaving that structure.
//
// Finding codes (code, severity, layer: meaning):
//  TOPOLOGY                    warning  conduits    a mapped from/to id matches no structure; the end
//                                                   is snapped by geometry instead
//  TOPOLOGY_DUPLICATE_ID       warning  both        an id used by more than one feature; features stay
//                                                   distinct by position, ids link to the first
//  TOPOLOGY_AMBIGUOUS          warning  conduits    two or more structures within the snap tolerance of
//                                                   a pipe end; the nearest is taken
//  TOPOLOGY_UNCONNECTED        warning  conduits    a pipe end is farther than the snap tolerance from
//                                                   every structure; a derived structure is placed there
//                                                   (or the end has no coordinates: left unconnected,
//                                                   the pipe is not marched)
//  TOPOLOGY_REVERSED_GEOMETRY  info     conduits    line digitised against its from/to ids; geometry turned
//  REVERSED                    info     conduits    snapped pipe digitised against the flow; turned
//  ADVERSE_SLOPE               warning  conduits    inverts rise along the flow direction (gravity pipe)
//  TOPOLOGY_ZERO_LENGTH        warning  conduits    plan length (nearly) zero
//  TOPOLOGY_SELF_LOOP          warning  conduits    both ends at the same structure; left out of the march
//  TOPOLOGY_LOOP               warning  conduits    the pipe closes a directed loop; cut (left out of the march)
//  PARALLEL                    info     conduits    another pipe joins the same two structures; both kept
//  DIVERSION                   info     structures  more than one outflow; the largest is the main outflow
//  TOPOLOGY_OUTFALL_HAS_OUTFLOW warning structures  a structure of kind outfall has an outflow pipe; it is
//                                                   marched as an ordinary structure
//  TOPOLOGY_ISOLATED           info     structures  a structure no marched pipe touches; in no tree
#include <cstddef>
#include <string>
#include <vector>

#include "rimline/finding.hpp"
#include "rimline/model/network.hpp"
#include "rimline/topology/index_list.hpp"

namespace rimline::topology {

struct TopologyOptions {
  double snap_tolerance_m = 0.5;
  // Inverts closer than this are "equal" for orientation and adverse slope (1 mm: survey
  // precision of invert levels; common practice, no source).
  double invert_tolerance_m = 0.001;
  // Plan length below which a pipe is reported as zero length.
  double zero_length_m = 0.001;
  // Structures taken as outfalls ([outfalls] ids), whether of the layer or derived from node ids.
  std::vector<std::string> outfall_ids;
  // [pipes] flow_direction = "inverts": pipes linked by from/to ids still flow the way their inverts
  // fall (rule 1 connects, rule 2b orients); a pipe so turned is REVERSED.
  bool direction_from_inverts = false;
};

struct Node {
  IndexList inflows;   // marched conduit indices arriving here
  IndexList outflows;  // marched conduit indices leaving here
  std::size_t main_outflow = model::no_index;  // largest outflow; no_index at outfalls
  std::size_t tree = model::no_index;          // index into Topology::trees
  bool diversion = false;             // more than one outflow
  bool outfall = false;
};

// One outfall and everything upstream of it, in march order (see the rule above).
struct Tree {
  std::size_t outfall = model::no_index;
  std::vector<std::size_t> structures;  // march order (outfall first)
  std::vector<std::size_t> conduits;    // march order (the outfall's inflows first)
};

enum class MarchStatus { marched, unusable, self_loop, loop_cut };

struct Topology {
  std::vector<Node> nodes;   // aligned with Network::structures
  std::vector<Tree> trees;
  // Deflection [deg] of each conduit's arrival direction against the main outflow of its
  // downstream structure (0 = straight through, 180 = turned back); NaN where undefined
  // (outfalls, zero-length lines). Aligned with conduits.
  std::vector<double> deflection_deg;
  // Drop [m] across the downstream structure: this conduit's outlet invert minus the inlet
  // invert of that structure's main outflow (positive = a step down). NaN where undefined.
  std::vector<double> invert_drop_m;
  std::vector<MarchStatus> status;          // aligned with conduits
  std::vector<std::size_t> conduit_tree;    // tree of each conduit; no_index when not marched
  std::size_t derived_structures = 0;       // structures added by build_topology
  std::size_t turned_conduits = 0;          // REVERSED + TOPOLOGY_REVERSED_GEOMETRY
  // The structure the source names as each conduit's upstream end: its from id where the ids
  // decided, else the structure at its first vertex as digitised (no_index: not connected). A
  // pipe flows against its source when its `from` differs (the network solve reports it).
  std::vector<std::size_t> source_upstream;
  std::vector<char> source_from_ids;  // per conduit: source_upstream comes from the from/to ids
};

// Completes the network in place (from/to indices and ids, orientation, derived structures
// appended to Network::structures; Conduit::usable cleared for self-loops and loop cuts, so
// a stage that filters on usable and from/to leaves out exactly what the trees leave out)
// and returns the topology. Never throws for data problems; they are appended to findings.
Topology build_topology(model::Network& network, const TopologyOptions& options, Findings& findings);

// After conduits were turned (the network solve orients each pipe the way it flows): nodes, trees,
// deflections and invert drops again, without findings. Pipes that are still cut from a loop
// (usable == false, status loop_cut) stay so.
void rebuild_march_order(const model::Network& network, Topology& topology);

}  // namespace rimline::topology
