#pragma once
// Which pipes a profile drawing follows, and the stationing along them.
//
// A path runs from an upstream structure down its chain of main outflows (topology::Node::
// main_outflow, the governing route of the march) to the tree's outfall. Stationing follows
// the sign convention of the profiles: station 0 at the outfall, increasing upstream, each
// pipe adding its plan length (model::Conduit::length_m, the length the march stepped along).
#include <cstddef>
#include <string>
#include <vector>

#include "rimline/model/network.hpp"
#include "rimline/topology/build.hpp"
#include "rimline/units.hpp"

namespace rimline::report {

struct ProfilePath {
  std::size_t tree = model::no_index;
  std::size_t outfall = model::no_index;
  // Structures from the outfall (front) up to the head of the path (back).
  std::vector<std::size_t> structures;
  // conduits[i] joins structures[i + 1] (upstream end) to structures[i] (downstream end).
  std::vector<std::size_t> conduits;
  // Station of each structure [m], aligned with `structures`; station_m.front() == 0.
  std::vector<double> station_m;

  double length_m() const { return station_m.empty() ? 0.0 : station_m.back(); }
};

// The path from `structure` down to its outfall. A structure in no tree gives a path with
// that structure alone and no conduits.
ProfilePath path_from(const model::Network& network, const topology::Topology& topo, std::size_t structure);

// Per tree (in tree order), the path whose head is farthest from the outfall by plan length.
// Ties go to the lowest structure index, so the choice is deterministic. Trees with no
// conduit are skipped.
std::vector<ProfilePath> longest_paths(const model::Network& network, const topology::Topology& topo);

// Every trunk of conduits at least `min_rise_m` high: one path per structure where such a
// trunk begins (its main outflow is that large and no inflow is), down to the outfall.
// Per tree, longest first; trees in tree order.
std::vector<ProfilePath> trunk_paths(const model::Network& network, const topology::Topology& topo,
                                     double min_rise_m);

// Plan distance of each structure to its outfall along main outflows [m], aligned with
// structures; NaN for structures in no tree.
std::vector<double> distance_to_outfall_m(const model::Network& network, const topology::Topology& topo);

// Which profiles to draw.
enum class PathSelection {
  longest,         // the longest path of each tree (the default)
  from_structure,  // the path from one structure down to its outfall
  trunks           // every trunk of pipes at least min_rise_m high
};

struct DrawingOptions {
  PathSelection selection = PathSelection::longest;
  std::string from_structure_id;  // for from_structure
  double min_rise_m = 0.0;        // for trunks
  std::string more_sections;      // report.html sections placed after the summary (src/connections)
};

// One sentence saying which paths are drawn, for the report.
std::string selection_text(const DrawingOptions& options, units::System system);

// One drawn profile: a path in one tailwater case, named <outfall-id>-<number>.
struct ProfileSheet {
  ProfilePath path;
  std::size_t case_index = 0;
  int number = 1;  // 1.. per outfall, over the paths (outer) and cases (inner)
};

// The sheets for `case_count` cases. Throws rimline::Error(bad_config) naming the structure
// (with a did-you-mean suggestion) when from_structure_id is not in the network.
std::vector<ProfileSheet> plan_sheets(const model::Network& network, const topology::Topology& topo,
                                      std::size_t case_count, const DrawingOptions& options);

// Which conduits the drawings of `options` follow (aligned with network.conduits), so the march
// can keep every step point of those pipes and only the ends of the others.
std::vector<bool> drawn_conduits(const model::Network& network, const topology::Topology& topo,
                                 const DrawingOptions& options);

}  // namespace rimline::report
