#pragma once
// First stage of build_topology: which structure each pipe end meets (by id, else by
// snapping, else a derived structure). Orientation is decided afterwards (orient.hpp).
#include <cstddef>
#include <cstdint>
#include <vector>

#include "rimline/finding.hpp"
#include "rimline/model/network.hpp"
#include "rimline/topology/build.hpp"

namespace rimline::topology {

// What the ids say about direction, relative to the line as digitised.
enum class IdDirection : std::uint8_t { none, first_vertex_upstream, last_vertex_upstream };

struct Connection {
  std::vector<std::size_t> at_first;  // structure at the line's first vertex (as digitised)
  std::vector<std::size_t> at_last;   // structure at its last vertex
  std::vector<IdDirection> ids;       // none when no end was linked by id
  std::size_t derived_structures = 0; // appended to Network::structures
};

// Appends derived structures to network.structures; reads conduits, changes none of them.
Connection connect_network(model::Network& network, const TopologyOptions& options, Findings& findings);

}  // namespace rimline::topology
