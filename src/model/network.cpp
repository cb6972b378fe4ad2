#include "rimline/model/network.hpp"

namespace rimline::model {

std::string_view structure_kind_name(StructureKind k) {
  switch (k) {
    case StructureKind::manhole: return "manhole";
    case StructureKind::inlet: return "inlet";
    case StructureKind::junction: return "junction";
    case StructureKind::outfall: return "outfall";
    case StructureKind::pump_station: return "pump_station";
    case StructureKind::derived: return "derived";
  }
  return "manhole";
}

std::size_t find_structure(const Network& n, const std::string& id) {
  for (std::size_t i = 0; i < n.structures.size(); ++i)
    if (n.structures[i].id == id) return i;
  return no_index;
}

}  // namespace rimline::model
