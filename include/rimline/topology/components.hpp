#pragma once
// Connected components of the gravity network, and whether each is a simple tree the march can
// take as it is, or needs the network solve (solve/network_solve.hpp).
//
// A gravity link is a pipe that is marched or was cut from a directed loop (both ends at different
// structures, usable, not a force main: a force main's flow is set by its pump station). Components
// are those of the undirected graph of gravity links. A component is a simple tree when it has one
// pipe fewer than structures (no loop, parallel pipes included), no structure with more than one
// outflow and exactly one outlet, that outlet being the structure its pipes drain to.
//
// Outlets (the structures that hold a level of their own in the solve): the pump wet wells (only
// force mains leave them) and, where the export types its structures (`typed`), those of kind
// outfall or pump_station; elsewhere, or in a typed component that has none of those, the
// structures no pipe leaves by the orientation rule (dead ends; a structure that only a pipe cut
// from a loop leaves is no outlet, unless nothing else is). In a typed component with typed
// outlets, a dead end that is not one of them is a low point: the solve takes it, like a cut end,
// as an ordinary structure (its water leaves through whichever pipes the levels say).
#include <cstddef>
#include <string>
#include <vector>

#include "rimline/model/network.hpp"
#include "rimline/topology/build.hpp"

namespace rimline::topology {

// Marched or cut from a loop, and not a force main.
bool gravity_link(const model::Network& network, const Topology& topology, std::size_t conduit);

// A pump wet well: a structure that force mains leave and no marched gravity pipe does.
bool wet_well(const model::Network& network, const Topology& topology, std::size_t structure);

struct Component {
  std::vector<std::size_t> structures;  // ascending
  std::vector<std::size_t> conduits;    // gravity links, ascending
  std::vector<std::size_t> outlets;     // by the rule above
  std::vector<std::size_t> low_points;  // no outflow, not an outlet (only where outlets are typed)
  std::size_t loops = 0;                // independent loops: pipes - structures + 1
  std::size_t diversions = 0;           // structures with more than one gravity outflow
  bool simple_tree() const;
  std::string why_not_tree() const;     // "2 loops, 1 diversion", "3 outlets" ...
};

struct Components {
  std::vector<Component> list;
  std::vector<std::size_t> of_structure;  // component index, or model::no_index (no gravity link)
  std::vector<std::size_t> of_conduit;    // component index, or model::no_index (not a gravity link)
};

Components gravity_components(const model::Network& network, const Topology& topology, bool typed);

}  // namespace rimline::topology
