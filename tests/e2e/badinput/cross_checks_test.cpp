// Bad-input catalogue, issue 17: mapping and unit mistakes that used to pass silently, each with the
// finding (or the error) it must produce. Every input is invented for the test (fixture.hpp); the
// values only need to be wrong in the way each case names.
#include "e2e/badinput/fixture.hpp"
#include "rimline/topology/summary.hpp"

using namespace rimline;
using namespace rimline::badinput;

namespace {

std::string with_base(const std::string& from, const std::string& to) { return replace(base_project(), from, to); }

std::vector<std::string> pipes_with(std::size_t i, const std::string& from, const std::string& to) {
  auto p = base_pipes();
  p[i] = replace(p[i], from, to);
  return p;
}

}  // namespace

TEST_CASE("badinput cross-checks: inverts declared in mm but in metres are UNIT_SUSPECT naming the likely unit") {
  Case c("unit_suspect");
  c.write_network(base_pipes(), base_structures(),
                  replace(with_base(R"(invert_up = { field = "US_INV", unit = "m" })", R"(invert_up = { field = "US_INV", unit = "mm" })"),
                          R"(invert_down = { field = "DS_INV", unit = "m" })", R"(invert_down = { field = "DS_INV", unit = "mm" })"));
  const auto r = c.run();
  INFO(dump(r));
  const Finding* f = find(r, "UNIT_SUSPECT", "pipe inverts");
  REQUIRE(f != nullptr);
  CHECK(f->severity == Severity::error);
  // Four pipes are too few for the slope test (five): the structures' inverts tell it here.
  CHECK(message(f) ==
        "looks like the pipe inverts US_INV and DS_INV are in m: declared mm. Read as mm, pipe inverts lie a median "
        "2.498 m from the inverts of the structures they meet and 100 % of pipe inverts lie below the rims they meet; "
        "read as m, pipe inverts lie a median 0.000 m from the inverts of the structures they meet and 100 % of pipe "
        "inverts lie below the rims they meet. Every level, slope and freeboard rests on this unit: check it.");
  // One finding says it for the whole layer: no per-pipe flood of level findings.
  CHECK(find(r, "INVERT_BELOW_STRUCTURE", "P1") == nullptr);
}

TEST_CASE("badinput cross-checks: a declared unit contradicting the field name is UNIT_NAME_CONFLICT") {
  Case c("unit_name");
  std::vector<std::string> p;
  for (auto s : base_pipes()) p.push_back(replace(s, R"("US_INV":)", R"("US_INV_FT":)"));
  c.write_network(p, base_structures(),
                  with_base(R"(invert_up = { field = "US_INV", unit = "m" })", R"(invert_up = { field = "US_INV_FT", unit = "m" })"));
  const auto r = c.run();
  INFO(dump(r));
  CHECK(message(find(r, "UNIT_NAME_CONFLICT", "pipes.fields.invert_up", "US_INV_FT")) ==
        "the name of US_INV_FT (pipes.fields.invert_up) says ft, but the project declares m; if the name is right, "
        "every value of it is off by a factor of 0.3048");
}

TEST_CASE("badinput cross-checks: a pipe invert below its structure's invert is INVERT_BELOW_STRUCTURE") {
  Case c("invert_below");
  c.write_network(pipes_with(1, R"("DS_INV":2.25)", R"("DS_INV":1.9)"), base_structures());
  const auto r = c.run();
  INFO(dump(r));
  CHECK(message(find(r, "INVERT_BELOW_STRUCTURE", "P2", "DS_INV")) ==
        "the downstream invert DS_INV of pipe P2 (1.900 m) lies 0.350 m below the invert SUMP of structure M1 (2.250 m) "
        "that it meets; a pipe cannot lie below the structure's floor, so one of the two is wrong");
}

TEST_CASE("badinput cross-checks: a pipe invert in feet among metres: INVERT_BELOW_STRUCTURE names the likely unit") {
  Case c("invert_feet");
  // P4's upstream invert 2.5 m entered as 8.202 (feet) at M4 (sump 2.5 m, rim 5.2 m): above the rim.
  c.write_network(pipes_with(3, R"("US_INV":2.5)", R"("US_INV":8.202)"), base_structures());
  const auto r = c.run();
  INFO(dump(r));
  CHECK(message(find(r, "INVERT_ABOVE_RIM", "P4", "US_INV")) ==
        "the upstream invert US_INV of pipe P4 (8.202 m) lies 3.002 m above the rim of structure M4 (5.200 m); a buried "
        "pipe lies below the ground, so one of the two is wrong");
}

TEST_CASE("badinput cross-checks: an implausible invert step at a structure is INVERT_STEP with the likely cause") {
  Case c("invert_step");
  // P3 arrives at M2 with its outlet 26 m below where P2 leaves: a 26 m step, as in a real export.
  auto p = base_pipes();
  p[1] = replace(p[1], R"("US_INV":2.5)", R"("US_INV":28.5)");
  auto s = base_structures();
  s[2] = replace(s[2], R"("RIM":5.2)", R"("RIM":31.2)");
  c.write_network(p, s);
  const auto r = c.run();
  INFO(dump(r));
  CHECK(message(find(r, "INVERT_STEP", "M2")) ==
        "at structure M2, pipe P3 arrives with its outlet invert at 2.500 m, 26.000 m below the inlet invert of pipe P2 "
        "that leaves it (28.500 m), more than the plausible 3.000 m (plausibility.invert_step_max); the water would "
        "have to climb it to leave, which surcharges everything upstream; one of the two inverts is likely wrong; a "
        "difference this large is a typing error, a no-data value or another datum");
}

TEST_CASE("badinput cross-checks: a rim below the structure's invert is DATA_IMPLAUSIBLE (rim unknown)") {
  Case c("rim_below");
  auto s = base_structures();
  s[1] = replace(s[1], R"("RIM":5)", R"("RIM":1.5)");
  c.write_network(base_pipes(), s);
  const auto r = c.run();
  INFO(dump(r));
  CHECK(message(find(r, "DATA_IMPLAUSIBLE", "M1", "RIM")) == "RIM 1.500 m is below the invert SUMP 2.250 m; the rim is unknown.");
}

TEST_CASE("badinput cross-checks: a tailwater below the outfall invert is TAILWATER_BELOW_OUTFALL") {
  Case c("tailwater_low");
  c.write_network(base_pipes(), base_structures(), with_base(R"(levels = ["2.2 m"])", R"(levels = ["1.2 m"])"));
  const auto r = c.run();
  INFO(dump(r));
  CHECK(message(find(r, "TAILWATER_BELOW_OUTFALL", "OF")) ==
        "the tailwater 1.200 m lies 0.800 m below the invert of outfall OF (2.000 m), so the outfall runs free at that "
        "level; check the tailwater's datum and unit");
}

TEST_CASE("badinput cross-checks: criteria for an id the network lacks are UNKNOWN_ID with a did-you-mean") {
  Case c("unknown_id");
  c.write_network(base_pipes(), base_structures(),
                  base_project() + "\n[criteria.structures.\"M-3\"]\nfreeboard = \"0.5 m\"\n"
                                   "[criteria.conduits.\"P9\"]\nvelocity_min = \"0.5 m/s\"\n");
  const auto r = c.run();
  INFO(dump(r));
  CHECK(message(find(r, "UNKNOWN_ID", "M-3")) ==
        R"([criteria.structures."M-3"] names structure "M-3", which the network does not have; it has no effect; did you mean "M3"?)");
  CHECK(find(r, "UNKNOWN_ID", "P9") != nullptr);
}

TEST_CASE("badinput cross-checks: no flow source stops the run as a project error") {
  Case c("no_flow");
  c.write_network(base_pipes(), base_structures(),
                  replace(with_base("inflow = { field = \"Q_LOCAL\", unit = \"L/s\" }\n", ""), R"(mode = "structure_inflows")",
                          R"(mode = "structure_inflows")"));
  const auto e = error_of([&] { c.run(); });
  CHECK(e == c.path("project.toml") +
                 ": no flow source: [flows] mode is \"structure_inflows\" but neither structures.fields.inflow nor "
                 "flows.default_inflow is set");
  c.write("project.toml", replace(base_project(), "[flows]\nmode = \"structure_inflows\"\n", ""));
  CHECK(error_of([&] { c.run(); }).find(": no flow source: [flows] mode is \"pipe_field\" (the default)") != std::string::npos);
}

TEST_CASE("badinput cross-checks: a run with no inverts checks nothing and says so loudly") {
  Case c("nothing_checked");
  std::string project = with_base("invert_up = { field = \"US_INV\", unit = \"m\" }\n", "");
  project = replace(project, "invert_down = { field = \"DS_INV\", unit = \"m\" }\n", "");
  project = replace(project, "invert = { field = \"SUMP\", unit = \"m\" }\n", "");
  c.write_network(base_pipes(), base_structures(), project);
  const auto r = c.run();
  INFO(dump(r));
  CHECK(run::checked_nothing(r));
  const Finding* f = find(r, "NOTHING_CHECKED", "run");
  REQUIRE(f != nullptr);
  CHECK(f->severity == Severity::error);
  CHECK(message(f) ==
        "THIS RUN CHECKED NOTHING: no pipe could be solved because no invert is mapped (pipes.fields.invert_up / "
        "invert_down, structures.fields.invert). No freeboard, surcharge or velocity figure exists; an empty "
        "exception list here means nothing.");
}

TEST_CASE("badinput cross-checks: untyped outfalls are OUTFALL_ASSUMED and counted; named ones are not") {
  Case c("outfall_assumed");
  c.write_network(base_pipes(), base_structures(), with_base("type = \"NODE_TYPE\"\n", ""));
  const auto r = c.run();
  INFO(dump(r));
  CHECK(find(r, "OUTFALL_ASSUMED", "OF") != nullptr);
  CHECK(topology::summarize(r.read.network, r.topology).outfalls_assumed == 1);
  // Named in the project, with a level of its own: no longer assumed, and its level is used.
  c.write("project.toml", with_base("type = \"NODE_TYPE\"\n", "") +
                              "\n[outfalls]\nids = [\"OF\"]\n\n[outfalls.tailwater]\n\"OF\" = \"2.6 m\"\n");
  const auto named = c.run();
  INFO(dump(named));
  CHECK(find(named, "OUTFALL_ASSUMED", "OF") == nullptr);
  CHECK(topology::summarize(named.read.network, named.topology).outfalls_assumed == 0);
  CHECK(named.cases[0].march.structures[structure_index(named, "OF")].tailwater_m == 2.6);
  c.write("project.toml", with_base("type = \"NODE_TYPE\"\n", "") + "\n[outfalls]\nids = [\"OF-1\"]\n");
  CHECK(message(find(c.run(), "UNKNOWN_ID", "OF-1")) ==
        R"(outfalls.ids names structure "OF-1", which the network does not have; it has no effect; did you mean "OF"?)");
}

TEST_CASE("badinput cross-checks: from/to in digitising order, flow direction from the inverts") {
  Case c("direction_inverts");
  // P2's ids say M1 -> M2, against its inverts (2.5 m at M2, 2.25 m at M1).
  auto p = base_pipes();
  p[0] = replace(p[0], R"("SIZE":450)", R"("SIZE":450,"FROM":"M1","TO":"OF")");
  p[1] = replace(p[1], R"("SIZE":375)", R"("SIZE":375,"FROM":"M1","TO":"M2")");
  p[1] = replace(replace(p[1], R"("US_INV":2.5)", R"("US_INV":2.25X)"), R"("DS_INV":2.25)", R"("DS_INV":2.5)");
  p[1] = replace(p[1], "2.25X", "2.25");
  p[2] = replace(p[2], R"("SIZE":300)", R"("SIZE":300,"FROM":"M3","TO":"M2")");
  p[3] = replace(p[3], R"("SIZE":300)", R"("SIZE":300,"FROM":"M4","TO":"M1")");
  const std::string ids = with_base(R"(id = "PIPE_ID")", "id = \"PIPE_ID\"\nfrom = \"FROM\"\nto = \"TO\"");
  c.write_network(p, base_structures(), ids);
  CHECK(find(c.run(), "ADVERSE_SLOPE", "P2") != nullptr);  // the ids decide: a pipe rising against the flow
  c.write("project.toml", replace(ids, "snap_tolerance = \"0.5 m\"\n", "snap_tolerance = \"0.5 m\"\nflow_direction = \"inverts\"\n"));
  const auto r = c.run();
  INFO(dump(r));
  CHECK(find(r, "ADVERSE_SLOPE", "P2") == nullptr);
  CHECK(message(find(r, "REVERSED", "P2")) ==
        "pipe P2 names M1 as its from-structure and M2 as its to-structure, but its inverts fall from 2.500 m at M2 to "
        "2.250 m at M1 (flow_direction = \"inverts\"); it runs from M2 to M1");
  check_solved(r, {"OF", "M1", "M2", "M3", "M4"});
}

TEST_CASE("badinput cross-checks: an empty measured invert falls back to the design one with a finding") {
  Case c("invert_fallback");
  auto p = base_pipes();
  for (auto& s : p) s = replace(s, R"("US_INV":)", R"("US_DESIGN":)") ;
  // Measured upstream inverts: only P1 has one; the others fall back to the design value.
  p[0] = replace(p[0], R"("US_DESIGN":2.25)", R"("US_DESIGN":2.25,"US_INV":2.26)");
  for (std::size_t i = 1; i < p.size(); ++i) p[i] = replace(p[i], R"("SIZE":)", R"("US_INV":null,"SIZE":)");
  c.write_network(p, base_structures(),
                  with_base(R"(invert_up = { field = "US_INV", unit = "m" })",
                            "invert_up = { field = \"US_INV\", unit = \"m\" }\ninvert_up_fallback = { field = \"US_DESIGN\", unit = \"m\" }"));
  const auto r = c.run();
  INFO(dump(r));
  CHECK(*r.read.network.conduits[conduit_index(r, "P1")].invert_up_m == 2.26);
  CHECK(message(find(r, "INVERT_FALLBACK", "P2", "US_DESIGN")) ==
        "US_INV is empty; the upstream invert 2.500 m is taken from US_DESIGN.");
  check_solved(r, {"OF", "M1", "M2", "M3", "M4"});
}

TEST_CASE("badinput cross-checks: structure inverts in feet declared m are UNIT_SUSPECT on the structures' field") {
  Case c("unit_suspect_sump");
  std::vector<std::string> s;
  for (auto x : base_structures()) {
    // SUMP in feet (2.25 m -> 7.382 ft), the rims stay in metres.
    for (const char* v : {"2", "2.25", "2.5", "2.75"}) {
      const std::string from = std::string(R"("SUMP":)") + v + ",";
      if (x.find(from) != std::string::npos) x = replace(x, from, R"("SUMP":)" + num(std::stod(v) / 0.3048) + ",");
    }
    s.push_back(x);
  }
  c.write_network(base_pipes(), s);
  const auto r = c.run();
  INFO(dump(r));
  const Finding* f = find(r, "UNIT_SUSPECT", "structure inverts", "SUMP");
  REQUIRE(f != nullptr);
  CHECK(message(f).rfind("looks like the structure inverts SUMP are in ft: declared m.", 0) == 0);
  CHECK(find(r, "INVERT_BELOW_STRUCTURE", "P1") == nullptr);  // said once for the field, not per pipe
}
