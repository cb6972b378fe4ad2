// The model's own helpers: structure lookup by id and the kind names used in outputs.
#include <catch2/catch.hpp>

#include "rimline/model/network.hpp"

using namespace rimline::model;

TEST_CASE("find_structure returns the first structure with the id, or no_index") {
  Network n;
  for (const char* id : {"A", "B", "A"}) {
    Structure s;
    s.id = id;
    n.structures.push_back(s);
  }
  CHECK(find_structure(n, "A") == 0);
  CHECK(find_structure(n, "B") == 1);
  CHECK(find_structure(n, "C") == no_index);
}

TEST_CASE("structure kind names") {
  CHECK(structure_kind_name(StructureKind::manhole) == "manhole");
  CHECK(structure_kind_name(StructureKind::outfall) == "outfall");
  CHECK(structure_kind_name(StructureKind::derived) == "derived");
  CHECK(structure_kind_name(StructureKind::pump_station) == "pump_station");
}
