// Bad-input catalogue, connections and hydraulics: unsnapped ends, ambiguous snaps, loops,
// parallel pipes, no outfall, adverse slopes, a flow beyond any section. Expected codes from
// include/rimline/topology/build.hpp and include/rimline/checks/checks.hpp; inputs invented.
#include "e2e/badinput/fixture.hpp"
#include "rimline/topology/summary.hpp"

using namespace rimline;
using namespace rimline::badinput;

TEST_CASE("badinput topology: a pipe end with no structure within the snap tolerance") {
  Case c("unconnected");
  auto pipes = base_pipes();
  pipes.push_back(pipe("PU", ox - 100, oy - 60, ox - 100, oy - 2, 300, 2.8, 2.55));  // stops 2 m short of M2
  c.write_network(pipes, base_structures());
  const auto r = c.run();
  INFO(dump(r));
  const Finding* f = find(r, "TOPOLOGY_UNCONNECTED", "PU");
  REQUIRE(f != nullptr);
  CHECK(
      message(f) ==
      R"(pipe PU: its first end (as digitised) at (452200.00, 5385140.00) is more than 0.500 m from every structure; derived structure derived-1 placed there)");
  check_solved(r, {"OF", "M1", "M2", "M3", "M4"});
}

TEST_CASE("badinput topology: two structures within the snap tolerance of a pipe end") {
  Case c("ambiguous");
  auto s = base_structures();
  s.push_back(structure("M2B", "MH", ox - 100.3, oy, 5.2, 2.5));  // 0.3 m from M2
  c.write_network(base_pipes(), s);
  const auto r = c.run();
  INFO(dump(r));
  const Finding* f = nullptr;
  for (const char* id : {"P2", "P3"})
    if (!f) f = find(r, "TOPOLOGY_AMBIGUOUS", id);
  REQUIRE(f != nullptr);
  CHECK(
      message(f) ==
      R"(pipe P2: 2 structures lie within 0.500 m of its first end (as digitised); snapped to the nearest, M2 (0.000 m), not M2B (0.300 m))");
  check_solved(r, {"OF", "M1", "M2", "M3", "M4"});
}

TEST_CASE("badinput topology: a directed loop is cut and reported, the rest is marched") {
  Case c("loop");
  auto pipes = base_pipes();
  auto s = base_structures();
  // M5 and M6 north of M2: M2 -> M5 -> M6 -> M2 would be a ring; from/to ids force the direction.
  s.push_back(structure("M5", "MH", ox - 100, oy + 50, 5.3, 2.7));
  s.push_back(structure("M6", "MH", ox - 150, oy + 50, 5.3, 2.7));
  pipes.push_back(pipe("L1", ox - 100, oy + 50, ox - 100, oy, 300, 2.7, 2.6, R"("FROM":"M5","TO":"M2")"));
  pipes.push_back(pipe("L2", ox - 150, oy + 50, ox - 100, oy + 50, 300, 2.7, 2.7, R"("FROM":"M6","TO":"M5")"));
  pipes.push_back(pipe("L3", ox - 100, oy + 50, ox - 150, oy + 50, 300, 2.7, 2.7, R"("FROM":"M5","TO":"M6")"));
  c.write_network(pipes, s,
                  replace(base_project(), R"(id = "PIPE_ID")", "id = \"PIPE_ID\"\nfrom = \"FROM\"\nto = \"TO\""));
  const auto r = c.run();
  INFO(dump(r));
  const Finding* f = nullptr;
  for (const char* id : {"L2", "L3"})
    if (!f) f = find(r, "TOPOLOGY_LOOP", id);
  REQUIRE(f != nullptr);
  CHECK(
      message(f) ==
      R"(pipe L2 (M6 to M5) closes a loop of 2 pipe(s) that flows back to M5; it is cut (left out of the march) so the march ends)");
  check_solved(r, {"OF", "M1", "M2", "M3", "M4", "M5", "M6"});
}

TEST_CASE("badinput topology: parallel pipes between the same structures are both kept") {
  Case c("parallel");
  auto pipes = base_pipes();
  pipes.push_back(pipe("P2B", ox - 100, oy, ox - 50, oy, 300, 2.5, 2.25));
  c.write_network(pipes, base_structures());
  const auto r = c.run();
  INFO(dump(r));
  // One finding, on the later pipe, naming the earlier one.
  const Finding* f = find(r, "PARALLEL", "P2B");
  REQUIRE(f != nullptr);
  CHECK(message(f) == R"(pipe P2B runs parallel to pipe P2 from M2 to M1; both are kept and share the flow)");
  CHECK(r.cases.back().march.conduits[conduit_index(r, "P2B")].solved);
  check_solved(r, {"OF", "M1", "M2", "M3", "M4"});
}

TEST_CASE("badinput topology: a network whose every pipe is in a ring has no outfall") {
  Case c("no_outfall");
  // Three manholes in a ring, ids forcing A -> B -> C -> A; no outfall anywhere.
  std::vector<std::string> s = {structure("A", "MH", ox, oy, 5.0, 2.0), structure("B", "MH", ox - 50, oy, 5.0, 2.0),
                                structure("C", "MH", ox - 50, oy + 50, 5.0, 2.0)};
  std::vector<std::string> p = {pipe("R1", ox, oy, ox - 50, oy, 300, 2.0, 2.0, R"("FROM":"A","TO":"B")"),
                                pipe("R2", ox - 50, oy, ox - 50, oy + 50, 300, 2.0, 2.0, R"("FROM":"B","TO":"C")"),
                                pipe("R3", ox - 50, oy + 50, ox, oy, 300, 2.0, 2.0, R"("FROM":"C","TO":"A")")};
  c.write_network(p, s, replace(base_project(), R"(id = "PIPE_ID")", "id = \"PIPE_ID\"\nfrom = \"FROM\"\nto = \"TO\""));
  const auto r = c.run();
  INFO(dump(r));
  CHECK(find(r, "TOPOLOGY_LOOP", "R3") != nullptr);
  // Nothing is typed an outfall: the end the loop cut leaves is an assumed outfall, said so and counted.
  const Finding* f = find(r, "OUTFALL_ASSUMED", "C");
  REQUIRE(f != nullptr);
  CHECK(
      message(f) ==
      R"(no structure is typed or named an outfall, so structure C is taken as one because no marched pipe leaves it; its tree is marched from its tailwater. Name the real outfalls ([structures.types] outfall, or [outfalls] ids) so that a loop cut or a missing pipe does not pass for an outfall)");
  CHECK(topology::summarize(r.read.network, r.topology).outfalls_assumed == 1);
}

TEST_CASE("badinput topology: inverts rising along the flow are ADVERSE_SLOPE, still marched") {
  Case c("adverse");
  // ids fix the direction so the rising inverts cannot turn the pipe
  auto p2 = base_pipes();
  p2[0] = replace(p2[0], R"("SIZE":450)", R"("SIZE":450,"FROM":"M1","TO":"OF")");
  p2[1] = replace(replace(replace(p2[1], R"("US_INV":2.5)", R"("US_INV":2.2)"), R"("DS_INV":2.25)", R"("DS_INV":2.3)"),
                  R"("SIZE":375)", R"("SIZE":375,"FROM":"M2","TO":"M1")");
  p2[2] = replace(p2[2], R"("SIZE":300)", R"("SIZE":300,"FROM":"M3","TO":"M2")");
  p2[3] = replace(p2[3], R"("SIZE":300)", R"("SIZE":300,"FROM":"M4","TO":"M1")");
  c.write_network(p2, base_structures(),
                  replace(base_project(), R"(id = "PIPE_ID")", "id = \"PIPE_ID\"\nfrom = \"FROM\"\nto = \"TO\""));
  const auto r = c.run();
  INFO(dump(r));
  const Finding* f = find(r, "ADVERSE_SLOPE", "P2");
  REQUIRE(f != nullptr);
  CHECK(
      message(f) ==
      R"(pipe P2: inverts rise 0.100 m along the flow from M2 (2.200 m) to M1 (2.300 m) that its from/to ids fix; kept in that direction)");
  CHECK(r.cases.back().march.conduits[conduit_index(r, "P2")].solved);
  check_solved(r, {"OF", "M1", "M2", "M3", "M4"});
}

TEST_CASE("badinput topology: a flow larger than any section can carry floods, the march completes") {
  Case c("huge_flow");
  auto s = base_structures();
  s[3] = replace(s[3], R"("Q_LOCAL":20)", R"("Q_LOCAL":50000)");  // 50 m3/s into a 300 mm pipe
  c.write_network(base_pipes(), s);
  const auto r = c.run();
  INFO(dump(r));
  CHECK(find(r, "CAPACITY", "P3") != nullptr);
  CHECK(find(r, "SURCHARGED", "P3") != nullptr);
  const Finding* f = find(r, "FLOODED", "M3");
  REQUIRE(f != nullptr);
  // The level itself is whatever the march computes for 50 m3/s in 300 mm; only the verdict is pinned.
  CHECK_THAT(message(f), Catch::StartsWith("structure M3: the HGL (") &&
                             Catch::EndsWith(" above the rim (5.400 m); water leaves the system here."));
  check_solved(r, {"OF", "M1", "M2", "M3", "M4"});
}
