// Connection headroom against brute force: for each structure the search's headroom h is checked
// by re-running the whole check (read, connect, flows, march, checks) with h - tol added there (no
// new or worsened exception) and with h + tol (one), tol being the precision the search promises.
// These are consistency checks between the trial re-solve and the whole check, on invented data.
// One case checks physics: a pipe governed by its capacity ratio takes Q_full - Q, Q_full from
// Manning's equation (Manning 1891; Chow, Open-Channel Hydraulics, 1959, eq. 5-7).
#include <cmath>

#include "connections_fixture.hpp"
#include "rimline/connections/headroom.hpp"
#include "rimline/solve/march.hpp"

using namespace rimline;
using namespace rimline::connections_test;

namespace {

double promised(const config::HeadroomSettings& s, double h) { return std::max(s.precision_m3_s, s.relative_precision * h); }

// The headroom at every structure searched, each checked by two whole re-runs.
void check_against_brute_force(const config::Project& project, const std::vector<std::string>& ids) {
  const run::CheckRun base = run_with(project, {});
  std::vector<std::size_t> at;
  for (const auto& id : ids) at.push_back(model::find_structure(base.read.network, id));
  const auto found = connections::connection_headroom(base, project.connections, at);
  REQUIRE(found.size() == ids.size());
  for (const auto& h : found) {
    INFO("structure " << h.id << ": headroom " << h.headroom_m3_s << " m3/s, " << h.criterion << " " << h.change
                      << " at " << h.governing_id << " (" << h.case_label << "), " << h.trials << " trials");
    REQUIRE(std::isfinite(h.headroom_m3_s));
    REQUIRE_FALSE(h.at_limit);
    CHECK(h.trials < 40);
    const double tol = promised(project.connections.headroom, h.headroom_m3_s);
    if (h.headroom_m3_s - tol > 0.0) {
      const auto below = run_with(project, {{h.id, h.headroom_m3_s - tol}});
      const auto cmp = connections::compare_runs(base, below, project.connections.comparison, "below");
      INFO("below: " << cmp.verdict);
      CHECK(cmp.acceptable);
    }
    const auto above = run_with(project, {{h.id, h.headroom_m3_s + tol}});
    const auto cmp = connections::compare_runs(base, above, project.connections.comparison, "above");
    INFO("above: " << cmp.verdict);
    CHECK_FALSE(cmp.acceptable);
  }
}

}  // namespace

TEST_CASE("headroom along a chain agrees with whole re-runs (consistency)", "[connections][headroom]") {
  // M3 -> M2 -> M1 -> OF, the fixture's network without its side branch.
  auto pipes = base_pipes();
  pipes.pop_back();
  auto structures = base_structures();
  structures.pop_back();
  const auto project = config::load_project(write_network("chain", pipes, structures, base_project()));
  check_against_brute_force(project, {"M1", "M2", "M3"});
}

namespace {

// The fixture with M2 also spilling through P5 to a second outfall OF2 (a diversion, two outlets).
std::string diversion_network(const std::string& name, const std::string& project_text) {
  auto pipes = base_pipes();
  pipes.push_back(pipe("P5", ox - 100, oy, ox - 100, oy - 60, 225, 2.6, 2.3));
  auto structures = base_structures();
  structures.push_back(structure("OF2", "OUTFALL", ox - 100, oy - 60, 3.5, 2.3, 0.0));
  return write_network(name, pipes, structures, project_text);
}

}  // namespace

TEST_CASE("headroom with a diversion agrees with whole re-runs (consistency)", "[connections][headroom]") {
  // Split by capacity ([flows] split), so the march takes the diversion: an added flow upstream of
  // M2 splits there by capacity, and the headroom of M3 depends on both outfalls' pipes.
  const auto text = replace(base_project(), "mode = \"structure_inflows\"\n", "mode = \"structure_inflows\"\nsplit = \"capacity\"\n");
  const auto project = config::load_project(diversion_network("diversion", text));
  check_against_brute_force(project, {"M3", "M2", "M4", "M1"});
}

TEST_CASE("a diversion the network solve settles gets no headroom figure, and says why", "[connections][headroom]") {
  // The hydraulic split (default) sends the diversion's component to the network solve (issue 21);
  // a trial re-solve is a tree march, so no structure there gets a number from it.
  const auto project = config::load_project(diversion_network("diversion-solved", base_project()));
  const auto base = run_with(project, {});
  REQUIRE(base.network.components == 1);
  const auto found = connections::connection_headroom(base, project.connections);
  REQUIRE(found.size() == base.read.network.structures.size());
  for (const auto& h : found) {
    INFO(h.id << ": " << h.headroom_m3_s << " " << h.note);
    CHECK_FALSE(std::isfinite(h.headroom_m3_s));
    CHECK_FALSE(h.note.empty());
    if (h.id.rfind("OF", 0) != 0) CHECK(h.note.find("network solve") != std::string::npos);
  }
}

TEST_CASE("headroom under a tailwater sweep agrees with whole re-runs (consistency)", "[connections][headroom]") {
  // Two tailwater levels; the higher drowns the outfall pipe, so the governing case may differ by structure.
  const auto text = replace(base_project(), R"(levels = ["2.2 m"])", R"(levels = ["2.2 m", "3.3 m"])");
  const auto project = config::load_project(write_network("sweep", base_pipes(), base_structures(), text));
  check_against_brute_force(project, {"M1", "M2", "M3", "M4"});
  const auto run = run_with(project, {});
  REQUIRE(run.cases.size() == 2);
}

TEST_CASE("existing = none: an exception where the flow goes leaves no headroom", "[connections][headroom]") {
  // The high tailwater surcharges P1; with existing = "none" nothing may be added upstream of it.
  auto text = replace(base_project(), R"(levels = ["2.2 m"])", R"(levels = ["3.3 m"])");
  text += "\n[headroom]\nexisting = \"none\"\n";
  const auto project = config::load_project(write_network("none", base_pipes(), base_structures(), text));
  const auto base = run_with(project, {});
  const auto ex = connections::exceptions_of(base, project.connections.comparison);
  REQUIRE(ex.count("conduits\tP1\tSURCHARGED") == 1);
  const auto found = connections::connection_headroom(base, project.connections);
  for (const auto& h : found) {
    if (h.id == "OF") continue;
    INFO(h.id);
    CHECK(h.headroom_m3_s == 0.0);
    CHECK(h.change == "stands");
  }
}

TEST_CASE("a pipe governed by its capacity ratio takes Q_full - Q (Manning's equation)", "[connections][headroom]") {
  // One 300 mm pipe, n = 0.013, 50 m at 0.5 % into a free outfall, 20 L/s from M1; deep manholes, no
  // velocity limit and surcharge left out ([comparison] ignore_codes: the march reports a crown
  // touched within 0.5 mm a few tenths of a L/s below Q_full), so the capacity ratio (Q / Q_full <= 1) fails first.
  // Manning (SI): Q_full = (1/n) A R^(2/3) S^(1/2), A = pi D^2 / 4, R = D / 4 (Chow 1959, eq. 5-7).
  const std::vector<std::string> pipes{pipe("P1", ox - 50, oy, ox, oy, 300, 2.25, 2.0)};
  const std::vector<std::string> structures{structure("OF", "OUTFALL", ox, oy, 6.0, 2.0, 0.0),
                                            structure("M1", "MH", ox - 50, oy, 9.0, 2.25, 20.0)};
  auto text = replace(base_project(), "mode = \"higher\"\nlevels = [\"2.2 m\"]", "mode = \"free\"");
  text += "\n[criteria]\nvelocity_max = \"off\"\nvelocity_min = \"0 m/s\"\n[comparison]\nignore_codes = [\"SURCHARGED\"]\n";
  const auto project = config::load_project(write_network("capacity", pipes, structures, text));
  const auto base = run_with(project, {});
  const auto found = connections::connection_headroom(base, project.connections, {model::find_structure(base.read.network, "M1")});
  REQUIRE(found.size() == 1);
  const double d = 0.3, n = 0.013, slope = 0.25 / 50.0, pi = std::acos(-1.0);
  const double q_full = (1.0 / n) * (pi * d * d / 4.0) * std::pow(d / 4.0, 2.0 / 3.0) * std::sqrt(slope);
  INFO("headroom " << found[0].headroom_m3_s << " q_full " << q_full << " value " << found[0].value);
  CHECK(found[0].criterion == "CAPACITY");
  CHECK(found[0].governing_id == "P1");
  // Within the search's precision (0.1 L/s or 1 %), from below.
  const double expected = q_full - 0.020;
  CHECK(found[0].headroom_m3_s <= expected + 1e-9);
  CHECK(found[0].headroom_m3_s >= expected - promised(project.connections.headroom, expected));
}

TEST_CASE("the trial re-solve equals a whole march with the new flows", "[connections][remarch]") {
  // Consistency of solve::remarch (still_m = 0) with solve::march on the sweep network, both cases.
  const auto text = replace(base_project(), R"(levels = ["2.2 m"])", R"(levels = ["2.2 m", "3.3 m"])");
  const auto project = config::load_project(write_network("remarch", base_pipes(), base_structures(), text));
  const auto base = run_with(project, {});
  const auto& net = base.read.network;
  const auto rank = solve::march_rank(net, base.topology);
  const std::size_t m3 = model::find_structure(net, "M3");
  const auto path = connections::added_flow_path(net, base.topology, flows::Split::capacity, rank, m3);
  REQUIRE(path.size() == 3);
  for (const auto& c : base.cases) {
    auto flow = base.flows.flow_m3_s;
    std::vector<std::size_t> changed;
    for (const auto& p : path) flow[p.conduit] += 0.05 * p.share, changed.push_back(p.conduit);
    auto opt = base.march_options;
    opt.tailwater_m = c.tailwater_m;
    const auto whole = solve::march(net, base.topology, flow, opt);
    auto part = c.march;
    solve::Remarched touched;
    solve::RemarchScratch scratch;
    Findings junk;
    solve::remarch(net, base.topology, flow, opt, rank, changed, 0.0, part, touched, scratch, junk);
    for (std::size_t s = 0; s < net.structures.size(); ++s) {
      INFO(net.structures[s].id << " " << c.label);
      CHECK(part.structures[s].solved == whole.structures[s].solved);
      CHECK(part.structures[s].hgl_m == Approx(whole.structures[s].hgl_m).margin(1e-12));
    }
    for (std::size_t ci = 0; ci < net.conduits.size(); ++ci) {
      INFO(net.conduits[ci].id);
      CHECK(part.conduits[ci].flow_m3_s == Approx(whole.conduits[ci].flow_m3_s).margin(1e-15));
      CHECK(part.conduits[ci].profile.inlet().hgl_m == Approx(whole.conduits[ci].profile.inlet().hgl_m).margin(1e-12));
    }
  }
}
TEST_CASE("every structure searched at once agrees with each searched alone (consistency)", "[connections][headroom]") {
  // Searched together, a structure starts from the bracket and the trial march of the one its flow
  // goes to; alone, from the run's march. Both must land within the promised precision of each
  // other, in the sweep (two tailwater cases) and on the diversion network; alone takes more trials.
  const auto sweep = replace(base_project(), R"(levels = ["2.2 m"])", R"(levels = ["2.2 m", "3.3 m"])");
  auto div_pipes = base_pipes();
  div_pipes.push_back(pipe("P5", ox - 100, oy, ox - 100, oy - 60, 225, 2.6, 2.3));
  auto div_structures = base_structures();
  div_structures.push_back(structure("OF2", "OUTFALL", ox - 100, oy - 60, 3.5, 2.3, 0.0));
  for (const auto& project :
       {config::load_project(write_network("together-sweep", base_pipes(), base_structures(), sweep)),
        // Split by capacity, so that the march (not the network solve) takes the diversion.
        config::load_project(write_network("together-diversion", div_pipes, div_structures,
                                           replace(base_project(), "mode = \"structure_inflows\"\n",
                                                   "mode = \"structure_inflows\"\nsplit = \"capacity\"\n")))}) {
    const auto base = run_with(project, {});
    const auto together = connections::connection_headroom(base, project.connections);
    int trials_together = 0, trials_alone = 0;
    for (const auto& h : together) {
      const auto alone = connections::connection_headroom(base, project.connections, {h.structure});
      REQUIRE(alone.size() == 1);
      INFO(h.id << ": together " << h.headroom_m3_s << " (" << h.trials << " trials), alone " << alone[0].headroom_m3_s
                << " (" << alone[0].trials << " trials)");
      CHECK(std::isfinite(h.headroom_m3_s) == std::isfinite(alone[0].headroom_m3_s));
      if (!std::isfinite(h.headroom_m3_s)) continue;
      CHECK(std::abs(h.headroom_m3_s - alone[0].headroom_m3_s) <=
            promised(project.connections.headroom, std::max(h.headroom_m3_s, alone[0].headroom_m3_s)) + 1e-12);
      trials_together += h.trials;
      trials_alone += alone[0].trials;
    }
    CHECK(trials_together < trials_alone);
  }
}

TEST_CASE("remarch's undo log restores the march, after a whole walk or one ended early", "[connections][remarch]") {
  // Consistency of the hooks the headroom search uses: whatever the walk changed, the undo log
  // (applied last entry first) gives back the march it started from, bit for bit.
  const auto project = config::load_project(write_network("undo", base_pipes(), base_structures(), base_project()));
  const auto base = run_with(project, {});
  const auto& net = base.read.network;
  const auto rank = solve::march_rank(net, base.topology);
  const auto path = connections::added_flow_path(net, base.topology, flows::Split::capacity, rank,
                                                 model::find_structure(net, "M3"));
  auto flow = base.flows.flow_m3_s;
  std::vector<std::size_t> changed;
  for (const auto& p : path) flow[p.conduit] += 0.05 * p.share, changed.push_back(p.conduit);
  auto opt = base.march_options;
  opt.tailwater_m = base.cases[0].tailwater_m;
  for (const std::size_t stop_after : {std::size_t{2}, std::size_t{1000}}) {
    auto march = base.cases[0].march;
    solve::Remarched touched;
    solve::RemarchScratch scratch;
    solve::RemarchUndo undo;
    Findings junk;
    solve::RemarchHooks hooks;
    hooks.undo = &undo;
    hooks.stop = [stop_after](const solve::Remarched& t) { return t.structures.size() >= stop_after; };
    const bool complete = solve::remarch(net, base.topology, flow, opt, rank, changed, 0.0, march, touched, scratch, junk, hooks);
    CHECK(complete == (stop_after == 1000));
    REQUIRE_FALSE(undo.structures.empty());
    bool moved = false;
    for (const auto& [s, old] : undo.structures) moved = moved || march.structures[s].hgl_m != old.hgl_m;
    CHECK(moved);
    for (auto it = undo.structures.rbegin(); it != undo.structures.rend(); ++it) march.structures[it->first] = it->second;
    for (auto it = undo.conduits.rbegin(); it != undo.conduits.rend(); ++it) march.conduits[it->first] = it->second;
    for (std::size_t s = 0; s < net.structures.size(); ++s) {
      INFO(net.structures[s].id << " stop after " << stop_after);
      CHECK(march.structures[s].hgl_m == base.cases[0].march.structures[s].hgl_m);
    }
    for (std::size_t ci = 0; ci < net.conduits.size(); ++ci) {
      INFO(net.conduits[ci].id << " stop after " << stop_after);
      CHECK(march.conduits[ci].flow_m3_s == base.cases[0].march.conduits[ci].flow_m3_s);
      CHECK(march.conduits[ci].profile.inlet().hgl_m == base.cases[0].march.conduits[ci].profile.inlet().hgl_m);
    }
    // The scratch is left clean: a second walk from the restored march matches a whole march.
    solve::Remarched again;
    solve::remarch(net, base.topology, flow, opt, rank, changed, 0.0, march, again, scratch, junk);
    const auto whole = solve::march(net, base.topology, flow, opt);
    for (std::size_t s = 0; s < net.structures.size(); ++s)
      CHECK(march.structures[s].hgl_m == Approx(whole.structures[s].hgl_m).margin(1e-12));
  }
}
