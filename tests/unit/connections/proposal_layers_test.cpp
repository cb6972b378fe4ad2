// A proposal's new pipes and structures, read from GIS layers ([proposal.new_pipes] /
// [proposal.new_structures]). The main check is an equivalence: the existing network plus the
// proposal's layers must be checked exactly as one export that holds them all (same flows, same
// HGL at every structure). The flow check is continuity: a new pipe carries the local inflows of
// the structures above it (conservation of mass; the accumulation every flow mode rests on).
// Invented networks: these are consistency checks, not check values.
#include <cmath>

#include "connections_fixture.hpp"
#include "rimline/connections/outputs.hpp"
#include "rimline/error.hpp"

using namespace rimline;
using namespace rimline::connections_test;

namespace {

// The fixture's network without the side branch M4 -> P4 -> M1, and a proposal that adds them
// back from two layers beside the proposal file, in a sub-folder (sources are relative to it).
struct SideBranch {
  std::string project_path, proposal_path, whole_path;
};

SideBranch side_branch(const std::string& name, const std::vector<std::string>& new_pipes,
                       const std::vector<std::string>& new_structures, const std::string& project_text = base_project()) {
  auto pipes = base_pipes();
  auto structures = base_structures();
  SideBranch c;
  c.whole_path = write_network(name + "-whole", pipes, structures, project_text);
  pipes.pop_back();
  structures.pop_back();
  c.project_path = write_network(name, pipes, structures, project_text);
  const fs::path dir = fs::path(c.project_path).parent_path() / "proposal";
  fs::create_directories(dir);
  std::ofstream(dir / "branch-pipes.geojson") << collection(new_pipes);
  std::ofstream(dir / "branch-structures.geojson") << collection(new_structures);
  c.proposal_path = (dir / "branch.toml").string();
  std::ofstream(c.proposal_path) << "[proposal]\nname = \"side branch\"\n\n[proposal.new_pipes]\nsource = "
                                    "\"branch-pipes.geojson\"\n\n[proposal.new_structures]\nsource = "
                                    "\"branch-structures.geojson\"\n";
  return c;
}

run::CheckRun proposed_run(const SideBranch& c) {
  const auto base = config::load_project(c.project_path);
  const auto proposal = config::load_proposal(c.proposal_path);
  return run::run_check(config::proposed_project(base, proposal), {});
}

}  // namespace

TEST_CASE("new pipes and structures from a proposal's layers are checked as if the export held them",
          "[connections][proposal]") {
  const auto c = side_branch("proposal-layers", {base_pipes().back()}, {base_structures().back()});
  const run::CheckRun proposed = proposed_run(c);
  const run::CheckRun whole = run::run_check(config::load_project(c.whole_path), {});
  INFO(dump(proposed));
  REQUIRE(proposed.read.network.structures.size() == whole.read.network.structures.size());
  REQUIRE(proposed.read.network.conduits.size() == whole.read.network.conduits.size());
  CHECK(proposed.read.network.structures[structure_index(proposed, "M4")].proposed);
  CHECK(proposed.read.network.conduits[conduit_index(proposed, "P4")].proposed);
  CHECK_FALSE(proposed.read.network.structures[structure_index(proposed, "M1")].proposed);
  for (const char* id : {"P1", "P2", "P3", "P4"}) {
    INFO("pipe " << id);
    CHECK(proposed.flows.flow_m3_s[conduit_index(proposed, id)] ==
          Approx(whole.flows.flow_m3_s[conduit_index(whole, id)]).margin(1e-12));
  }
  // Continuity: P4 carries M4's own 20 L/s; P1 below the junction carries all four structures'.
  CHECK(proposed.flows.flow_m3_s[conduit_index(proposed, "P4")] == Approx(0.020).margin(1e-12));
  CHECK(proposed.flows.flow_m3_s[conduit_index(proposed, "P1")] == Approx(0.080).margin(1e-12));
  for (const char* id : {"OF", "M1", "M2", "M3", "M4"}) {
    INFO("structure " << id);
    const double a = proposed.cases[0].march.structures[structure_index(proposed, id)].hgl_m;
    const double b = whole.cases[0].march.structures[structure_index(whole, id)].hgl_m;
    REQUIRE(std::isfinite(a));
    CHECK(a == Approx(b).margin(1e-9));
  }
  // The comparison knows what is new: M4 and P4 have no "before", the other HGLs rise.
  const auto project = config::load_project(c.project_path);
  const run::CheckRun existing = run::run_check(project, {});
  const auto cmp = connections::compare_runs(existing, proposed, project.connections.comparison, "side branch");
  CHECK(cmp.added_pipes == std::vector<std::string>{"P4"});
  CHECK(cmp.added_structures == std::vector<std::string>{"M4"});
  for (const auto& s : cmp.structures) {
    INFO("structure " << s.id);
    CHECK(s.added == (s.id == "M4"));
    CHECK(std::isfinite(s.hgl_before_m) == !s.added);
  }
  const auto csv = connections::structure_changes_csv(cmp, units::System::si);
  CHECK(csv.find("\nM4,0,added,,") != std::string::npos);
  CHECK(csv.find("\nM1,1,existing,") != std::string::npos);
}

TEST_CASE("a proposal's new feature with an existing id is left out, and its layer's findings name the proposal",
          "[connections][proposal]") {
  // M4 and P4 as before, plus a structure whose id M2 is taken and a pipe whose size is text.
  auto bad_pipe = pipe("P9", ox - 150, oy + 50, ox - 150, oy, 300, 2.9, 2.75);
  bad_pipe = replace(bad_pipe, "\"SIZE\":300", "\"SIZE\":\"three hundred\"");
  const auto c = side_branch("proposal-layers-bad", {base_pipes().back(), bad_pipe},
                             {base_structures().back(), structure("M2", "MH", ox - 100, oy + 50, 5.2, 2.6)});
  const run::CheckRun proposed = proposed_run(c);
  INFO(dump(proposed));
  const Finding* taken = find(proposed, "PROPOSAL_ID_TAKEN", "M2");
  REQUIRE(taken);
  CHECK(taken->severity == Severity::error);
  CHECK(taken->layer == LayerRole::structures);
  CHECK(taken->fid == 1);  // the second feature of the proposal's layer
  CHECK(message(taken).find("branch-structures.geojson") != std::string::npos);
  CHECK(message(taken).find("branch.toml") != std::string::npos);
  // The existing M2 stands, in its place.
  CHECK(proposed.read.network.structures[structure_index(proposed, "M2")].location.y == Approx(oy));
  CHECK_FALSE(proposed.read.network.structures[structure_index(proposed, "M2")].proposed);
  // The bad size is reported against the proposal's pipe layer, field named; the rest is checked.
  const Finding* size = find(proposed, "DATA_IMPLAUSIBLE", "P9", "SIZE");
  REQUIRE(size);
  CHECK(message(size).find("branch-pipes.geojson") != std::string::npos);
  check_solved(proposed, {"M1", "M2", "M3", "M4"});
}

TEST_CASE("proposal layers: what a proposal file cannot ask", "[connections][proposal]") {
  SECTION("new structures in a project whose structures are the pipe ends: no mapping to read them with") {
    config::Project base;
    base.file = "project.toml";
    config::Proposal p;
    p.file = "proposal.toml";
    p.new_structures.source = "manholes.geojson";
    CHECK_THROWS_AS(config::proposed_project(base, p), Error);
  }
  SECTION("a new layer without a source") {
    CHECK_THROWS_AS(config::parse_proposal("[proposal]\n[proposal.new_pipes]\nlayer = \"x\"\n", "p.toml"), Error);
  }
  SECTION("an unknown key of a new layer is named") {
    try {
      (void)config::parse_proposal("[proposal]\n[proposal.new_pipes]\nsource = \"a.gpkg\"\nlayr = \"x\"\n", "p.toml");
      FAIL("no error");
    } catch (const Error& e) {
      CHECK(std::string(e.what()).find("layr") != std::string::npos);
    }
  }
  SECTION("a relative source is read beside the proposal file; a connection string stays as written") {
    const auto p = config::parse_proposal(
        "[proposal]\n[proposal.new_pipes]\nsource = \"new/pipes.gpkg\"\n[proposal.new_structures]\nsource = "
        "\"PG:dbname=city\"\n",
        "/data/dev/proposal.toml");
    CHECK(p.new_pipes.source == "/data/dev/new/pipes.gpkg");
    CHECK(p.new_structures.source == "PG:dbname=city");
  }
}
