#pragma once
// A small run built from literals for the report tests: two outfall trees.
//
//   tree 0:  S4 --C3 (30 m)--> S2 --C1 (80 m)--> S1 --C0 (100 m)--> S0 (outfall, tailwater 3.000 m)
//                                    S3 --C2 (120 m)--^
//   tree 1:  S6 --C4 (60 m)--> S5 (outfall)
//
// Path lengths by plan length: S4 210 m (three pipes), S3 220 m (two pipes), so "longest" and
// "most pipes" differ. The march results are set by hand so that every level is the sum of the
// tailwater and the losses below it (the identity loss_budget relies on).
#include <string>

#include "rimline/run/check_run.hpp"
#include "rimline/sha256.hpp"

namespace rimline::test {

inline hydraulics::ProfilePoint point(double station, double invert, double hgl, double egl, bool full = false) {
  hydraulics::ProfilePoint p;
  p.station_m = station;
  p.invert_m = invert;
  p.hgl_m = hgl;
  p.egl_m = egl;
  p.depth_m = hgl - invert;
  p.velocity_m_s = 1.0;
  p.full = full;
  return p;
}

inline run::CheckRun fixture_run(const std::string& project_file = "") {
  run::CheckRun run;
  run.project.name = "Fixture network";
  run.project.file = project_file;
  if (!project_file.empty()) run.inputs.push_back({project_file, sha256_file_hex(project_file)});  // as run_check hashes it
  auto& net = run.read.network;
  auto structure = [&](const char* id, double x, double y, double rim, double invert, model::StructureKind k) {
    model::Structure s;
    s.id = id;
    s.kind = k;
    s.location = {x, y};
    s.rim_m = rim;
    s.invert_m = invert;
    net.structures.push_back(s);
  };
  using K = model::StructureKind;
  structure("S0", 0, 0, 5.0, 2.0, K::outfall);
  structure("S1", 100, 0, 5.5, 2.3, K::manhole);
  structure("S2", 180, 0, 4.2, 2.5, K::manhole);
  structure("S3", 100, 120, 6.0, 2.9, K::inlet);
  structure("S4", 210, 0, 6.2, 2.7, K::inlet);
  structure("S5", 500, 0, 4.0, 1.0, K::outfall);
  structure("S6", 560, 0, 4.5, 1.3, K::manhole);
  auto conduit = [&](const char* id, std::size_t from, std::size_t to, double length, double dia, double up,
                     double down) {
    model::Conduit c;
    c.id = id;
    c.from = from;
    c.to = to;
    c.from_id = net.structures[from].id;
    c.to_id = net.structures[to].id;
    c.length_m = length;
    c.geometry_length_m = length;
    c.section.diameter_m = dia;
    c.invert_up_m = up;
    c.invert_down_m = down;
    net.conduits.push_back(c);
  };
  conduit("C0", 1, 0, 100.0, 1.2, 2.3, 2.0);
  conduit("C1", 2, 1, 80.0, 0.9, 2.5, 2.3);
  conduit("C2", 3, 1, 120.0, 0.6, 2.9, 2.4);
  conduit("C3", 4, 2, 30.0, 0.45, 2.7, 2.55);
  conduit("C4", 6, 5, 60.0, 0.6, 1.3, 1.0);

  auto& topo = run.topology;
  topo.nodes.resize(7);
  auto link = [&](std::size_t c) {
    topo.nodes[net.conduits[c].from].outflows.push_back(c);
    topo.nodes[net.conduits[c].from].main_outflow = c;
    topo.nodes[net.conduits[c].to].inflows.push_back(c);
  };
  for (std::size_t c = 0; c < 5; ++c) link(c);
  for (std::size_t s = 0; s < 5; ++s) topo.nodes[s].tree = 0;
  for (std::size_t s = 5; s < 7; ++s) topo.nodes[s].tree = 1;
  topo.nodes[0].outfall = topo.nodes[5].outfall = true;
  topo.trees.push_back({0, {0, 1, 2, 3, 4}, {0, 1, 2, 3}});
  topo.trees.push_back({5, {5, 6}, {4}});
  topo.status.assign(5, topology::MarchStatus::marched);
  topo.conduit_tree = {0, 0, 0, 0, 1};

  run.criteria.freeboard_m = 0.3;
  run::Case c;
  c.tailwater_m = 3.0;
  c.label = "tailwater " + q(3.0, units::Dimension::length);
  auto& m = c.march;
  m.structures.resize(7);
  m.conduits.resize(5);
  auto pool = [&](std::size_t s, double level, std::size_t governing, double loss) {
    auto& r = m.structures[s];
    r.solved = true;
    r.hgl_m = r.egl_m = level;
    r.governing_outflow = governing;
    r.loss_m = loss;
    r.outfall = governing == model::no_index;
  };
  auto pipe = [&](std::size_t ci, std::vector<hydraulics::ProfilePoint> pts) {
    auto& r = m.conduits[ci];
    r.solved = true;
    r.invert_up_m = *net.conduits[ci].invert_up_m;
    r.invert_down_m = *net.conduits[ci].invert_down_m;
    r.profile.points = std::move(pts);
  };
  pool(0, 3.0, model::no_index, 0.0);
  pipe(0, {point(0, 2.0, 3.0, 3.05), point(50, 2.15, 3.1, 3.15), point(100, 2.3, 3.2, 3.25)});
  pool(1, 3.30, 0, 0.05);
  pipe(1, {point(0, 2.3, 3.30, 3.35, true), point(40, 2.4, 3.40, 3.45, true), point(80, 2.5, 3.50, 3.55, true)});
  pool(2, 4.05, 1, 0.50);
  pipe(2, {point(0, 2.4, 3.30, 3.32), point(120, 2.9, 3.40, 3.42)});
  pool(3, 3.50, 2, 0.08);
  pipe(3, {point(0, 2.55, 4.05, 4.06), point(30, 2.7, 4.06, 4.07)});
  pool(4, 4.10, 3, 0.03);
  pool(5, 1.5, model::no_index, 0.0);
  pipe(4, {point(0, 1.0, 1.5, 1.52), point(60, 1.3, 1.6, 1.62)});
  pool(6, 1.65, 4, 0.03);
  c.findings.push_back({"FREEBOARD", Severity::warning, LayerRole::structures, "S2", "", 0.15, 0.3,
                        units::Dimension::length,
                        "HGL " + q(4.05, units::Dimension::length) + " leaves " + q(0.15, units::Dimension::length) +
                            " below the rim"});
  c.findings.push_back({"SURCHARGED", Severity::warning, LayerRole::conduits, "C1", "", 80.0, 0.0,
                        units::Dimension::length, "pipe full over " + q(80.0, units::Dimension::length)});
  c.findings.push_back({"SURCHARGED", Severity::warning, LayerRole::conduits, "C4-not-here", "", 1.0, 0.0,
                        units::Dimension::length, "a pipe on no path"});
  run.data_findings.push_back({"DATA_MISSING", Severity::info, LayerRole::structures, "S1", "RIM", NAN, NAN,
                               units::Dimension::dimensionless, "cover level <taken> from the \"survey\" & drawings"});
  c.criteria_count = c.findings.size();
  run.cases.push_back(c);
  run.envelope_structure_case.assign(7, 0);
  run.envelope_conduit_case.assign(5, 0);
  run.findings = run.data_findings;
  for (const auto& f : c.findings) run.findings.push_back(f);
  sort_findings(run.findings);
  return run;
}

}  // namespace rimline::test
