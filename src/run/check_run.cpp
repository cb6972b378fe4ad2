#include "rimline/run/check_run.hpp"

#include <algorithm>
#include <cmath>
#include <iterator>
#include <string_view>
#include <unordered_map>
#include <unordered_set>

#include "run/catchment_run.hpp"
#include "run/ground_rims.hpp"
#include "run/level_checks.hpp"
#include "run/project_checks.hpp"
#include "run/input_hashes.hpp"
#include "run/pump_run.hpp"

namespace rimline::run {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();

solve::MarchOptions march_options_from(const config::Project& p) {
  solve::MarchOptions m;
  switch (p.tailwater_mode) {
    case config::TailwaterMode::fixed: m.tailwater_mode = solve::TailwaterMode::fixed; break;
    case config::TailwaterMode::free: m.tailwater_mode = solve::TailwaterMode::free; break;
    case config::TailwaterMode::higher: m.tailwater_mode = solve::TailwaterMode::higher; break;
  }
  m.loss_method = p.methods.structure_loss;
  m.benching = p.methods.benching;
  m.k_by_type = p.methods.k_by_type;
  if (p.structure_defaults.loss_k) m.default_k = *p.structure_defaults.loss_k;
  m.default_structure_diameter_m = p.structure_defaults.diameter_m;
  return m;
}

checks::Criteria criteria_from(const config::Project& p) {
  checks::Criteria c;
  c.freeboard_m = p.criteria.freeboard_m;
  c.velocity_min_m_s = p.criteria.velocity_min_m_s;
  c.velocity_max_m_s = p.criteria.velocity_max_m_s;
  c.capacity_ratio_max = p.criteria.capacity_ratio_max;
  c.cover_min_m = p.criteria.cover_min_m;
  return c;
}

checks::CriteriaOverrides overrides_from(const config::Project& p) {
  checks::CriteriaOverrides out;
  auto convert = [](const config::CriteriaOverride& o) {
    return checks::Override{o.freeboard_m, o.velocity_min_m_s, o.velocity_max_m_s, o.capacity_ratio_max, o.cover_min_m};
  };
  for (const auto& [id, o] : p.structure_criteria) out.structures[id] = convert(o);
  for (const auto& [id, o] : p.conduit_criteria) out.conduits[id] = convert(o);
  return out;
}

// Whether the drawings can show a criteria finding: those of the pipes that keep every step point
// (the drawn ones) and of the structures at their ends, and any of another layer (force mains).
// With no pipe singled out (an empty keep list) every pipe is drawn.
class DrawnFeatures {
 public:
  DrawnFeatures(const model::Network& net, const std::vector<bool>& keep) : all_(keep.empty()) {
    for (std::size_t ci = 0; ci < keep.size() && ci < net.conduits.size(); ++ci) {
      if (!keep[ci]) continue;
      const auto& c = net.conduits[ci];
      conduits_.insert(c.id);
      for (std::size_t s : {c.from, c.to})
        if (s != model::no_index) structures_.insert(net.structures[s].id);
    }
  }
  bool operator()(const Finding& f) const {
    if (all_) return true;
    switch (f.layer) {
      case LayerRole::conduits: return conduits_.count(f.feature_id) > 0;
      case LayerRole::structures: return structures_.count(f.feature_id) > 0;
      default: return true;
    }
  }

 private:
  bool all_;
  std::unordered_set<std::string_view> conduits_, structures_;
};

// The worst criteria finding per feature and question over the cases, moved out of the cases'
// lists; those the drawings can show are copied instead, and the cases keep only those (a city's
// run has ~10^6 findings: held twice they were ~0.3 GB).
Findings worst_per_feature(std::vector<Case>& cases, const DrawnFeatures& drawn) {
  struct Key {
    std::string_view code, id;
    LayerRole layer;
    bool operator==(const Key&) const = default;
  };
  struct KeyHash {
    std::size_t operator()(const Key& k) const {
      std::size_t h = std::hash<std::string_view>{}(k.id);
      for (std::size_t v : {std::hash<std::string_view>{}(k.code), static_cast<std::size_t>(k.layer)})
        h ^= v + 0x9e3779b97f4a7c15ULL + (h << 6) + (h >> 2);  // the usual hash combine
      return h;
    }
  };
  struct Winner {
    std::size_t case_index, finding;
    double badness;
  };
  std::size_t total = 0;
  for (const auto& c : cases) total += c.findings.size();
  std::unordered_map<Key, std::size_t, KeyHash> slot;  // key -> index into winners
  slot.reserve(total);
  std::vector<Winner> winners;
  winners.reserve(total);
  for (std::size_t k = 0; k < cases.size(); ++k) {
    const auto& list = cases[k].findings;
    for (std::size_t i = 0; i < list.size(); ++i) {
      const Finding& f = list[i];
      // FLOODED and FREEBOARD are one question at one structure: keep the worse of the two.
      const std::string_view key_code = f.code == "FLOODED" ? std::string_view("FREEBOARD") : std::string_view(f.code);
      const double b = badness(f);
      const auto [it, fresh] = slot.try_emplace(Key{key_code, f.feature_id, f.layer}, winners.size());
      if (fresh) winners.push_back({k, i, b});
      else if (b > winners[it->second].badness) winners[it->second] = {k, i, b};
    }
  }
  // What each case keeps, decided before any finding moves.
  std::vector<std::vector<bool>> shown(cases.size());
  for (std::size_t k = 0; k < cases.size(); ++k)
    for (const auto& f : cases[k].findings) shown[k].push_back(drawn(f));
  slot = {};  // its keys view the findings' strings
  Findings out;
  out.reserve(winners.size());
  for (const auto& w : winners) {
    Finding& f = cases[w.case_index].findings[w.finding];
    if (shown[w.case_index][w.finding]) out.push_back(f);
    else out.push_back(std::move(f));  // the case drops it below
    if (cases.size() > 1) out.back().message += " (" + cases[w.case_index].label + ")";
  }
  for (std::size_t k = 0; k < cases.size(); ++k) {
    auto& list = cases[k].findings;
    cases[k].criteria_count = list.size();
    std::size_t kept = 0;
    for (std::size_t i = 0; i < list.size(); ++i)
      if (shown[k][i]) {
        if (kept != i) list[kept] = std::move(list[i]);
        ++kept;
      }
    list.erase(list.begin() + static_cast<std::ptrdiff_t>(kept), list.end());
    list.shrink_to_fit();
  }
  return out;
}

// run.findings: the data findings and the criteria findings in output order, each marked by origin
// (sorted through an index, so each finding is copied or moved once, straight to its place).
void merge_findings(CheckRun& run, Findings criteria) {
  const std::size_t nd = run.data_findings.size();
  auto at = [&](std::size_t k) -> const Finding& { return k < nd ? run.data_findings[k] : criteria[k - nd]; };
  std::vector<std::size_t> order(nd + criteria.size());
  for (std::size_t k = 0; k < order.size(); ++k) order[k] = k;
  std::stable_sort(order.begin(), order.end(), [&at](std::size_t a, std::size_t b) { return finding_before(at(a), at(b)); });
  run.findings.clear();
  run.findings.reserve(order.size());
  run.data_finding.assign(order.size(), false);
  for (std::size_t k = 0; k < order.size(); ++k) {
    const std::size_t from = order[k];
    if (from < nd) run.findings.push_back(run.data_findings[from]);
    else run.findings.push_back(std::move(criteria[from - nd]));
    run.data_finding[k] = from < nd;
  }
}

std::string case_label(double tw) {
  if (!std::isfinite(tw)) return "free outfall";
  return "tailwater " + q(tw, units::Dimension::length);
}

}  // namespace

double badness(const Finding& f) {
  if (f.code == "FREEBOARD" || f.code == "FLOODED" || f.code == "VELOCITY_LOW" || f.code == "COVER") return -f.value;
  return std::isfinite(f.value) ? f.value : 0.0;
}

CheckRun run_check(const config::Project& project, const RunOptions& options) {
  CheckRun run;
  run.project = project;
  run.report_units = options.report_units.value_or(project.report_units);
  auto stage = [&options](const std::string& name) {
    if (options.progress) options.progress(name);
  };
  if (!options.dry_run) require_flow_source(project);  // before a city's layers are read
  stage("reading the layers");
  run.read = gis::read_network(project);
  auto files_read = [&run] {
    std::vector<std::string> files = run.read.input_files;
    files.insert(files.begin(), run.project.file);
    return files;
  };
  InputHashes hashes(files_read());
  stage("connecting the network");
  run.data_findings = run.read.findings;
  topology::TopologyOptions topo_opt;
  topo_opt.snap_tolerance_m = project.snap_tolerance_m;
  topo_opt.outfall_ids = project.outfalls.ids;
  topo_opt.direction_from_inverts = project.flow_direction == config::FlowDirection::inverts;
  run.topology = topology::build_topology(run.read.network, topo_opt, run.data_findings);
  if (options.amend_network) options.amend_network(run.read.network, run.data_findings);
  for (auto& s : run.read.network.structures)  // an outfall's own level from the project beats its field
    if (const auto it = project.outfalls.tailwater_m.find(s.id); it != project.outfalls.tailwater_m.end())
      s.tailwater_m = it->second;
  apply_ground(project, run.read.network, run.read.input_files, run.data_findings);
  check_declared_units(project, run.data_findings);
  check_levels(project, run.read.network, run.topology, run.data_findings);
  report_unknown_ids(project, run.read.network, run.data_findings);
  report_outfalls(project, run.read.network, run.topology, run.data_findings);
  run.criteria = criteria_from(project);
  run.overrides = overrides_from(project);
  run.march_options = march_options_from(project);
  const bool from_catchments =
      project.flow_mode == config::FlowMode::rational || project.flow_mode == config::FlowMode::sanitary;
  if (from_catchments) {
    assign_catchment_outlets(project, run);
    require_catchments_used(project, run);
  }
  if (options.dry_run) {
    merge_findings(run, {});
    run.inputs = hashes.finish(files_read());
    return run;
  }

  if (options.detailed_conduits)
    run.march_options.keep_step_points = options.detailed_conduits(run.read.network, run.topology);

  flows::FlowOptions flow_opt;
  flow_opt.mode = project.flow_mode == config::FlowMode::pipe_field ? flows::Mode::pipe_field : flows::Mode::structure_inflows;
  flow_opt.split = project.split_rule == config::SplitRule::field ? flows::Split::field : flows::Split::capacity;
  flow_opt.friction = project.methods.friction;
  flow_opt.default_inflow_m3_s = project.default_inflow_m3_s.value_or(0.0);

  if (!project.pump_stations.empty() || !project.pump_station_points.source.empty()) stage("force-main profiles");
  const auto layouts = lay_out_pump_stations(project, run);
  const auto& stations = run.project.pump_stations;
  solve_pump_stations(project, layouts, std::vector<double>(layouts.size(), nan), run);
  for (std::size_t i = 0; i < layouts.size(); ++i)
    if (layouts[i].ok) run.march_options.wet_well_level_m[layouts[i].wet_well] = stations[i].pump_on_m;

  std::vector<double> levels = options.tailwater_levels_m.empty() ? project.tailwater_levels_m : options.tailwater_levels_m;
  if (levels.empty()) levels.push_back(nan);  // outfall fields or free outfalls decide
  constexpr int max_pump_iterations = 10;
  Findings flow_findings;
  bool settled = layouts.empty();
  for (run.pump_iterations = 1;; ++run.pump_iterations) {
    flow_opt.fixed_conduit_flow_m3_s.clear();
    for (const auto& st : run.pump_stations)
      for (std::size_t ci : st.layout.chain) flow_opt.fixed_conduit_flow_m3_s[ci] = st.design_flow_m3_s;
    stage("design flows");
    flow_findings.clear();
    if (from_catchments)
      run.flows = catchment_design_flows(project, flow_opt.split, flow_opt.fixed_conduit_flow_m3_s, run, flow_findings);
    else
      run.flows = flows::design_flows(run.read.network, run.topology, flow_opt, flow_findings);
    if (options.amend_flows) options.amend_flows(run.read.network, run.topology, run.flows.flow_m3_s, flow_findings);
    run.cases.clear();
    for (double tw : levels) {
      stage("march " + std::to_string(run.cases.size() + 1) + "/" + std::to_string(levels.size()));
      Case c;
      c.tailwater_m = tw;
      c.label = case_label(tw);
      auto opt = run.march_options;
      opt.tailwater_m = tw;
      c.march = solve::march(run.read.network, run.topology, run.flows.flow_m3_s, opt);
      c.findings = checks::run_checks(run.read.network, c.march, run.criteria, run.overrides);
      run.cases.push_back(std::move(c));
    }
    if (layouts.empty() || run.pump_iterations >= max_pump_iterations) break;
    // The receiving structure's level (highest over the cases) is the next discharge level.
    std::vector<double> before;
    for (const auto& st : run.pump_stations) before.push_back(st.design_flow_m3_s);
    solve_pump_stations(project, layouts, receiving_levels(layouts, run), run);
    settled = true;
    for (std::size_t i = 0; i < before.size(); ++i)
      if (std::abs(run.pump_stations[i].design_flow_m3_s - before[i]) > 0.005 * std::max(before[i], 1e-9)) settled = false;
    if (settled) break;
  }
  for (auto& f : flow_findings) run.data_findings.push_back(std::move(f));
  if (!settled)
    run.data_findings.push_back({"FM_NOT_CONVERGED", Severity::warning, LayerRole::project, "pump_stations", "", nan, nan,
                                 units::Dimension::dimensionless,
                                 "the pumped flows and the receiving structures' levels did not settle within " +
                                     std::to_string(max_pump_iterations) +
                                     " rounds (flow change 0.5 % or more); the pump-station figures are approximate."});
  run.wet_well_inflow_m3_s = wet_well_inflows(layouts, flow_opt, run);
  // March problems (blocked, not converged) are the same in every case but the first is kept.
  auto& march_findings = run.cases.front().march.findings;
  run.data_findings.insert(run.data_findings.end(), std::make_move_iterator(march_findings.begin()),
                           std::make_move_iterator(march_findings.end()));
  for (auto& c : run.cases) Findings().swap(c.march.findings);

  const auto& net = run.read.network;
  run.envelope_structure_case.assign(net.structures.size(), 0);
  run.envelope_conduit_case.assign(net.conduits.size(), 0);
  for (std::size_t k = 1; k < run.cases.size(); ++k) {
    for (std::size_t s = 0; s < net.structures.size(); ++s) {
      const auto& best = run.cases[run.envelope_structure_case[s]].march.structures[s];
      const auto& cand = run.cases[k].march.structures[s];
      if (cand.solved && (!best.solved || cand.hgl_m > best.hgl_m)) run.envelope_structure_case[s] = k;
    }
    for (std::size_t ci = 0; ci < net.conduits.size(); ++ci) {
      const auto& best = run.cases[run.envelope_conduit_case[ci]].march.conduits[ci];
      const auto& cand = run.cases[k].march.conduits[ci];
      if (cand.solved && (!best.solved || cand.profile.inlet().hgl_m > best.profile.inlet().hgl_m))
        run.envelope_conduit_case[ci] = k;
    }
  }
  report_tailwater_below_outfalls(run, run.data_findings);
  report_nothing_checked(run, run.data_findings);
  Findings criteria = worst_per_feature(run.cases, DrawnFeatures(net, run.march_options.keep_step_points));
  for (std::size_t i = 0; i < run.pump_stations.size(); ++i)
    for (auto& f : solve::check_station(net, run.project.pump_stations[i], run.pump_stations[i], project.force_mains,
                                        run.wet_well_inflow_m3_s[i]))
      criteria.push_back(std::move(f));
  merge_findings(run, std::move(criteria));
  run.inputs = hashes.finish(files_read());
  return run;
}

double required_freeboard_m(const CheckRun& run, std::size_t structure) {
  return checks::criteria_for(run.criteria, run.overrides.structures, run.read.network.structures[structure].id)
      .freeboard_m;
}

std::string envelope_status(const CheckRun& run, std::size_t structure) {
  if (run.cases.empty()) return "not_checked";
  const auto& c = run.cases[run.envelope_structure_case[structure]];
  return checks::structure_status(run.read.network.structures[structure], c.march.structures[structure],
                                  required_freeboard_m(run, structure));
}

}  // namespace rimline::run
