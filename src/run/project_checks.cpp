#include "run/project_checks.hpp"

#include <cmath>
#include <unordered_set>

#include "rimline/error.hpp"
#include "rimline/topology/finding_text.hpp"

namespace rimline::run {
namespace {

using units::Dimension;

Finding project_finding(std::string code, Severity severity, std::string id, std::string message) {
  Finding f;
  f.code = std::move(code);
  f.severity = severity;
  f.layer = LayerRole::project;
  f.feature_id = std::move(id);
  f.message = std::move(message);
  return f;
}

}  // namespace

void require_flow_source(const config::Project& p) {
  const ErrorContext where{p.file, "", "", ""};
  switch (p.flow_mode) {
    case config::FlowMode::pipe_field:
      if (!p.pipe_fields.flow.mapped())
        throw Error(ErrorKind::bad_config, where,
                    "no flow source: [flows] mode is \"pipe_field\" (the default) but pipes.fields.flow is not mapped. "
                    "Map the design-flow field, or set mode = \"structure_inflows\" with structures.fields.inflow or "
                    "flows.default_inflow, or \"rational\" / \"sanitary\" with [catchments]");
      return;
    case config::FlowMode::structure_inflows:
      if (!p.structure_fields.inflow.mapped() && !p.default_inflow_m3_s)
        throw Error(ErrorKind::bad_config, where,
                    "no flow source: [flows] mode is \"structure_inflows\" but neither structures.fields.inflow nor "
                    "flows.default_inflow is set");
      return;
    case config::FlowMode::rational:
    case config::FlowMode::sanitary:
      return;  // the parser has made sure their catchments / populations are given
  }
}

void report_unknown_ids(const config::Project& p, const model::Network& net, Findings& findings) {
  std::vector<std::string> structures, conduits;
  for (const auto& s : net.structures) structures.push_back(s.id);
  for (const auto& c : net.conduits) conduits.push_back(c.id);
  const std::unordered_set<std::string> s_set(structures.begin(), structures.end()),
      c_set(conduits.begin(), conduits.end());
  auto check = [&](const std::string& id, bool structure, const std::string& key) {
    if ((structure ? s_set : c_set).count(id)) return;
    std::string msg = key + " names " + std::string(structure ? "structure" : "pipe") + " \"" + id +
                      "\", which the network does not have; it has no effect";
    const std::string near = closest_name(id, structure ? structures : conduits);
    if (!near.empty()) msg += "; did you mean \"" + near + "\"?";
    findings.push_back(project_finding("UNKNOWN_ID", Severity::warning, id, msg));
  };
  for (const auto& [id, o] : p.structure_criteria) check(id, true, "[criteria.structures.\"" + id + "\"]");
  for (const auto& [id, o] : p.conduit_criteria) check(id, false, "[criteria.conduits.\"" + id + "\"]");
  for (const auto& [id, e] : p.methods.structure_energy_by_id) check(id, true, "[methods.structures.\"" + id + "\"]");
  for (const auto& id : p.outfalls.ids) check(id, true, "outfalls.ids");
  for (const auto& [id, level] : p.outfalls.tailwater_m) check(id, true, "[outfalls.tailwater]");
}

void report_outfalls(const config::Project& p, const model::Network& net, const topology::Topology& topo,
                     Findings& findings) {
  using K = model::StructureKind;
  bool any_outfall = false;
  for (const auto& s : net.structures) any_outfall = any_outfall || s.kind == K::outfall;
  if (!any_outfall) {
    for (const auto& tree : topo.trees) {
      const auto& st = net.structures[tree.outfall];
      Finding f = topology::structure_finding(
          st, "OUTFALL_ASSUMED", Severity::warning,
          "no structure is typed or named an outfall, so structure " + st.id +
              " is taken as one because no marched pipe leaves it; its tree is marched from its tailwater. Name the "
              "real outfalls ([structures.types] outfall, or [outfalls] ids) so that a loop cut or a missing pipe "
              "does not pass for an outfall");
      findings.push_back(std::move(f));
    }
    return;
  }
  // Some structures are outfalls: a tree ending elsewhere names no outfall there (a missing outfall, a
  // pipe missing downstream, a cut loop). Untyped layers without named outfalls are left out above.
  const bool typed = !p.structures.source.empty() && !p.structure_fields.type.empty();
  const bool named = !p.outfalls.ids.empty() || !p.outfalls.field.empty();
  if (!typed && !named) return;
  for (const auto& tree : topo.trees) {
    const auto& st = net.structures[tree.outfall];
    if (st.kind != K::manhole && st.kind != K::inlet && st.kind != K::junction && st.kind != K::derived) continue;
    findings.push_back(topology::structure_finding(
        st, "TOPOLOGY_NO_OUTFALL", Severity::warning,
        "structure " + st.id + " is a " + std::string(model::structure_kind_name(st.kind)) +
            ", not an outfall, but no marched pipe leaves it; its tree is marched from it as if it were the outfall"));
  }
}

void require_catchments_used(const config::Project& p, const CheckRun& run) {
  if (p.catchments.allow_left_out) return;
  std::vector<std::string> left_out;
  for (const auto& f : run.data_findings) {
    const bool dropped = f.layer == LayerRole::catchments && f.severity == Severity::error &&
                         f.feature_id.rfind("land use", 0) != 0;
    if (dropped || f.code == "CATCHMENT_NO_OUTLET") left_out.push_back(f.feature_id + " (" + render_message(f.message, run.report_units) + ")");
  }
  if (left_out.empty()) return;
  std::string list;
  for (std::size_t i = 0; i < left_out.size() && i < 5; ++i) list += "\n  " + left_out[i];
  if (left_out.size() > 5) list += "\n  ... and " + std::to_string(left_out.size() - 5) + " more";
  throw Error(ErrorKind::bad_input, ErrorContext{p.catchments.source.source, "catchments", "", ""},
              std::to_string(left_out.size()) +
                  " catchment(s) would contribute no flow, so the design flows would be too low:" + list +
                  "\nFix them, or set [catchments] allow_left_out = true to run without them (each stays a finding)");
}

void report_tailwater_below_outfalls(const CheckRun& run, Findings& findings) {
  const auto& net = run.read.network;
  const double tol = run.project.plausibility.level_tolerance_m;
  for (std::size_t s = 0; s < net.structures.size(); ++s) {
    const auto& st = net.structures[s];
    // The outfall's floor: its invert, else the lowest outlet of the pipes arriving.
    std::optional<double> floor = st.invert_m;
    if (!floor && s < run.topology.nodes.size())
      for (std::size_t ci : run.topology.nodes[s].inflows)
        if (const auto v = net.conduits[ci].invert_down_m; v && (!floor || *v < *floor)) floor = v;
    if (!floor) continue;
    double lowest = std::numeric_limits<double>::infinity();
    for (const auto& c : run.cases) {
      const auto& r = c.march.structures[s];
      if (r.outfall && std::isfinite(r.tailwater_m)) lowest = std::min(lowest, r.tailwater_m);
    }
    if (!std::isfinite(lowest) || lowest >= *floor - tol) continue;
    Finding f = topology::structure_finding(
        st, "TAILWATER_BELOW_OUTFALL", Severity::warning,
        "the tailwater " + q(lowest, Dimension::length) + " lies " + q(*floor - lowest, Dimension::length) +
            " below the invert of outfall " + st.id + " (" + q(*floor, Dimension::length) +
            "), so the outfall runs free at that level; check the tailwater's datum and unit");
    f.value = lowest;
    f.limit = *floor;
    f.dimension = Dimension::length;
    findings.push_back(std::move(f));
  }
}

bool checked_nothing(const CheckRun& run) {
  for (const auto& c : run.cases)
    for (const auto& r : c.march.conduits)
      if (r.solved) return false;
  for (const auto& st : run.pump_stations)
    if (st.layout.ok) return false;
  return true;
}

void report_nothing_checked(const CheckRun& run, Findings& findings) {
  if (!checked_nothing(run)) return;
  const auto& pf = run.project.pipe_fields;
  std::string why;
  if (!pf.invert_up.mapped() && !pf.invert_down.mapped() && !run.project.structure_fields.invert.mapped())
    why = "no invert is mapped (pipes.fields.invert_up / invert_down, structures.fields.invert)";
  else
    why = "every pipe lacks inverts, a flow or a level downstream (see the NOT_CHECKED findings)";
  findings.push_back(project_finding("NOTHING_CHECKED", Severity::error, "run",
                                     "THIS RUN CHECKED NOTHING: no pipe could be solved because " + why +
                                         ". No freeboard, surcharge or velocity figure exists; an empty exception "
                                         "list here means nothing."));
}

}  // namespace rimline::run
