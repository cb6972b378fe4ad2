#include "rimline/run/check_run.hpp"

#include <algorithm>
#include <cmath>
#include <iterator>
#include <string_view>
#include <unordered_map>
#include <unordered_set>

#include "rimline/hydraulics/friction.hpp"
#include "run/catchment_run.hpp"
#include "run/ground_rims.hpp"
#include "run/level_checks.hpp"
#include "run/project_checks.hpp"
#include "run/input_hashes.hpp"
#include "run/network_run.hpp"
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
  m.structure_energy = p.methods.structure_energy;
  return m;
}

checks::VelocityBasis basis_of(config::VelocityMinBasis b) {
  return b == config::VelocityMinBasis::full_flow ? checks::VelocityBasis::full_flow : checks::VelocityBasis::normal_depth;
}

checks::Criteria criteria_from(const config::Project& p) {
  checks::Criteria c;
  c.freeboard_m = p.criteria.freeboard_m;
  c.velocity_min_m_s = p.criteria.velocity_min_m_s;
  c.velocity_max_m_s = p.criteria.velocity_max_m_s;
  c.capacity_ratio_max = p.criteria.capacity_ratio_max;
  c.cover_min_m = p.criteria.cover_min_m;
  c.velocity_basis = basis_of(p.criteria.velocity_min_basis);
  return c;
}

checks::CriteriaOverrides overrides_from(const config::Project& p) {
  checks::CriteriaOverrides out;
  auto convert = [](const config::CriteriaOverride& o) {
    checks::Override c{o.freeboard_m, o.velocity_min_m_s, o.velocity_max_m_s, o.capacity_ratio_max, o.cover_min_m, {}};
    if (o.velocity_min_basis) c.velocity_basis = basis_of(*o.velocity_min_basis);
    return c;
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
Findings worst_per_feature(std::vector<Case>& cases, const DrawnFeatures& drawn, std::vector<std::string>& case_of) {
  // The fid is part of the key: two features sharing an id each keep their own finding (issue 18).
  struct Key {
    std::string_view code, id;
    LayerRole layer;
    std::int64_t fid;
    bool operator==(const Key&) const = default;
  };
  struct KeyHash {
    std::size_t operator()(const Key& k) const {
      std::size_t h = std::hash<std::string_view>{}(k.id);
      for (std::size_t v : {std::hash<std::string_view>{}(k.code), static_cast<std::size_t>(k.layer),
                            static_cast<std::size_t>(k.fid)})
        h ^= v + 0x9e3779b97f4a7c15ULL + (h << 6) + (h >> 2);  // the usual hash combine
      return h;
    }
  };
  struct Winner {
    std::size_t case_index, finding;
    double badness;
    std::size_t first_case, first_finding;  // where the key was met first
    std::size_t seen;                       // in how many cases
    bool same;                              // the same message in every case met so far
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
      const auto [it, fresh] = slot.try_emplace(Key{key_code, f.feature_id, f.layer, f.fid}, winners.size());
      if (fresh) {
        winners.push_back({k, i, b, k, i, 1, true});
        continue;
      }
      Winner& w = winners[it->second];
      w.seen += 1;
      w.same = w.same && f.message == cases[w.first_case].findings[w.first_finding].message;
      if (b > w.badness) w.case_index = k, w.finding = i, w.badness = b;
    }
  }
  // What each case keeps, decided before any finding moves.
  std::vector<std::vector<bool>> shown(cases.size());
  for (std::size_t k = 0; k < cases.size(); ++k)
    for (const auto& f : cases[k].findings) shown[k].push_back(drawn(f));
  slot = {};  // its keys view the findings' strings
  Findings out;
  out.reserve(winners.size());
  case_of.clear();
  case_of.reserve(winners.size());
  for (const auto& w : winners) {
    Finding& f = cases[w.case_index].findings[w.finding];
    if (shown[w.case_index][w.finding]) out.push_back(f);
    else out.push_back(std::move(f));  // the case drops it below
    // The case that governs it, or every case when the finding reads the same in each.
    const bool every = cases.size() > 1 && w.seen == cases.size() && w.same;
    case_of.push_back(every ? std::string(every_case) : cases[w.case_index].label);
    if (cases.size() > 1) out.back().message += " (" + case_of.back() + ")";
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
void merge_findings(CheckRun& run, Findings criteria, const std::vector<std::string>& data_case,
                    const std::vector<std::string>& criteria_case) {
  const std::size_t nd = run.data_findings.size();
  auto at = [&](std::size_t k) -> const Finding& { return k < nd ? run.data_findings[k] : criteria[k - nd]; };
  std::vector<std::size_t> order(nd + criteria.size());
  for (std::size_t k = 0; k < order.size(); ++k) order[k] = k;
  std::stable_sort(order.begin(), order.end(), [&at](std::size_t a, std::size_t b) { return finding_before(at(a), at(b)); });
  run.findings.clear();
  run.findings.reserve(order.size());
  run.data_finding.assign(order.size(), false);
  run.finding_case.assign(order.size(), std::string());
  for (std::size_t k = 0; k < order.size(); ++k) {
    const std::size_t from = order[k];
    if (from < nd) run.findings.push_back(run.data_findings[from]);
    else run.findings.push_back(std::move(criteria[from - nd]));
    run.data_finding[k] = from < nd;
    const auto& labels = from < nd ? data_case : criteria_case;
    const std::size_t pos = from < nd ? from : from - nd;
    if (pos < labels.size()) run.finding_case[k] = labels[pos];
  }
}

// What sets the level at the outfalls in a case: the run's level (outfalls with their own tailwater
// field keep it), the outfalls' fields alone, or free outlets.
std::string case_label(double tw, const config::Project& p, const model::Network& net, const topology::Topology& topo) {
  std::size_t with_field = 0, outfalls = 0;
  for (const auto& tree : topo.trees) {
    ++outfalls;
    with_field += net.structures[tree.outfall].tailwater_m ? 1 : 0;
  }
  if (p.tailwater_mode == config::TailwaterMode::free) return "free outfall";
  if (std::isfinite(tw))
    return "tailwater " + q(tw, units::Dimension::length) + (with_field ? " (outfall fields where given)" : "");
  if (with_field == 0) return "free outfall";
  return with_field == outfalls ? "outfall tailwater fields" : "outfall tailwater fields (free outfall elsewhere)";
}

// The split rule of the design flows: shares from [flows.shares] become the pipes' split fractions.
flows::SplitRule split_rule_of(const config::Project& p, CheckRun& run) {
  switch (p.split_rule) {
    case config::SplitRule::hydraulic: return flows::Split::hydraulic;
    case config::SplitRule::capacity: return flows::Split::capacity;
    case config::SplitRule::field: return flows::Split::field;
    case config::SplitRule::fixed: break;
  }
  auto& net = run.read.network;
  std::unordered_map<std::string, std::size_t> index;
  for (std::size_t ci = 0; ci < net.conduits.size(); ++ci) index.try_emplace(net.conduits[ci].id, ci);
  for (const auto& [id, share] : p.split_shares) {
    const auto it = index.find(id);
    if (it == index.end()) {
      run.data_findings.push_back({"DATA_MISSING", Severity::warning, LayerRole::project, id, "flows.shares", share, nan,
                                   units::Dimension::dimensionless,
                                   "[flows.shares] names pipe " + id + ", which is not in the pipe layer; its share is not used."});
      continue;
    }
    net.conduits[it->second].split_fraction = share;
  }
  return flows::Split::field;
}

// What each structure sends down when nothing reaches it from upstream (network_run.hpp).
std::vector<double> own_flows(const config::Project& p, const flows::FlowOptions& flow_opt, const CheckRun& run) {
  if (p.flow_mode == config::FlowMode::rational || p.flow_mode == config::FlowMode::sanitary)
    return own_catchment_flows(p, run);
  std::vector<double> own(run.read.network.structures.size(), 0.0);
  if (p.flow_mode == config::FlowMode::structure_inflows)
    for (std::size_t s = 0; s < own.size(); ++s)
      own[s] = run.read.network.structures[s].inflow_m3_s.value_or(flow_opt.default_inflow_m3_s);
  return own;
}

// The march problems of every case, each once, labelled with the cases it arose in.
void gather_march_findings(std::vector<Case>& cases, Findings& into, std::vector<std::string>& case_of) {
  std::unordered_map<std::string, std::size_t> seen;  // key -> index into `into`
  std::vector<std::vector<std::size_t>> in_cases;
  const std::size_t base = into.size();
  for (std::size_t k = 0; k < cases.size(); ++k) {
    for (auto& f : cases[k].march.findings) {
      const std::string key = f.code + '\x1f' + std::to_string(static_cast<int>(f.layer)) + '\x1f' + f.feature_id +
                              '\x1f' + std::to_string(f.fid) + '\x1f' + f.message;  // fid: ids may repeat
      const auto [it, fresh] = seen.try_emplace(key, into.size());
      if (fresh) {
        into.push_back(std::move(f));
        in_cases.emplace_back();
      }
      in_cases[it->second - base].push_back(k);
    }
    Findings().swap(cases[k].march.findings);
  }
  case_of.resize(base);
  for (const auto& ks : in_cases) {
    if (cases.size() > 1 && ks.size() == cases.size()) {
      case_of.emplace_back(every_case);
      continue;
    }
    std::string label;
    for (std::size_t k : ks) label += (label.empty() ? "" : "; ") + cases[k].label;
    case_of.push_back(label);
  }
}

bool same_value(double a, double b) { return std::fabs(a - b) <= 1e-9 * std::max(1.0, std::fabs(a)); }

// Each envelope figure from the case that governs it (see CheckRun), ties to the first case.
void compute_envelope(CheckRun& run) {
  const auto& net = run.read.network;
  const std::size_t ns = net.structures.size(), nc = net.conduits.size(), cases = run.cases.size();
  run.envelope_structure_case.assign(ns, 0);
  run.envelope_structure_every.assign(ns, cases > 1);
  for (std::size_t s = 0; s < ns; ++s) {
    for (std::size_t k = 1; k < cases; ++k) {
      const auto& best = run.cases[run.envelope_structure_case[s]].march.structures[s];
      const auto& cand = run.cases[k].march.structures[s];
      if (cand.solved && (!best.solved || cand.hgl_m > best.hgl_m)) run.envelope_structure_case[s] = k;
      const auto& first = run.cases[0].march.structures[s];
      if (!(cand.solved && first.solved && same_value(cand.hgl_m, first.hgl_m))) run.envelope_structure_every[s] = false;
    }
  }
  run.envelope_conduit_case.assign(nc, 0);
  run.envelope_conduit_every.assign(nc, cases > 1);
  run.envelope_velocity_high.assign(nc, {0, cases > 1});
  run.envelope_velocity_low.assign(nc, {0, cases > 1});
  for (std::size_t ci = 0; ci < nc; ++ci) {
    const auto& c = net.conduits[ci];
    const auto basis = checks::criteria_for(run.criteria, run.overrides.conduits, c.id).velocity_basis;
    auto level_key = [&](std::size_t k) {
      const auto s = checks::surcharge_of(c, run.cases[k].march.conduits[ci]);
      return std::pair<bool, double>{s.surcharged, s.surcharged ? std::max(s.crown_excess_m, 0.0) : s.crown_excess_m};
    };
    auto v_high = [&](std::size_t k) { return checks::highest_velocity_m_s(run.cases[k].march.conduits[ci]); };
    auto v_low = [&](std::size_t k) {
      return checks::self_cleansing_velocity(c, run.cases[k].march.conduits[ci], basis).velocity_m_s;
    };
    auto solved = [&](std::size_t k) { return run.cases[k].march.conduits[ci].solved; };
    for (std::size_t k = 1; k < cases; ++k) {
      const bool both = solved(k) && solved(0);
      auto& lv = run.envelope_conduit_case[ci];
      if (solved(k) && (!solved(lv) || level_key(k) > level_key(lv))) lv = k;
      const auto& p0 = run.cases[0].march.conduits[ci].profile;
      const auto& pk = run.cases[k].march.conduits[ci].profile;
      if (!both || !same_value(p0.inlet().hgl_m, pk.inlet().hgl_m) || !same_value(p0.outlet().hgl_m, pk.outlet().hgl_m) ||
          !same_value(p0.surcharged_length_m, pk.surcharged_length_m))
        run.envelope_conduit_every[ci] = false;
      auto& hi = run.envelope_velocity_high[ci];
      if (solved(k) && (!solved(hi.index) || v_high(k) > v_high(hi.index))) hi.index = k;
      if (!both || !same_value(v_high(k), v_high(0))) hi.every = false;
      auto& lo = run.envelope_velocity_low[ci];
      if (solved(k) && (!solved(lo.index) || v_low(k) < v_low(lo.index))) lo.index = k;
      if (!both || !same_value(v_low(k), v_low(0))) lo.every = false;
    }
  }
}

// The fid of findings made without one (force mains, pump stations) whose id names one feature of
// the network; where the id is used twice it stays unknown (-1) rather than guessed.
void fill_unique_fids(const model::Network& net, Findings& findings) {
  // id -> fid per kind of feature: -2 while unseen, -1 when ambiguous.
  std::unordered_map<std::string_view, std::int64_t> wanted[2];  // [0] structures, [1] conduits
  auto kind = [](const Finding& f) {
    if (f.fid >= 0) return -1;
    switch (f.layer) {
      case LayerRole::structures:
      case LayerRole::pump_stations: return 0;
      case LayerRole::conduits:
      case LayerRole::force_mains: return 1;
      default: return -1;
    }
  };
  for (const auto& f : findings)
    if (const int k = kind(f); k >= 0) wanted[k].emplace(f.feature_id, -2);
  if (wanted[0].empty() && wanted[1].empty()) return;
  auto see = [](auto& map, const std::string& id, std::int64_t fid) {
    const auto it = map.find(id);
    if (it != map.end()) it->second = it->second == -2 ? fid : -1;
  };
  for (const auto& s : net.structures) see(wanted[0], s.id, s.fid);
  for (const auto& c : net.conduits) see(wanted[1], c.id, c.fid);
  for (auto& f : findings)
    if (const int k = kind(f); k >= 0)
      if (const auto it = wanted[k].find(f.feature_id); it != wanted[k].end() && it->second >= 0) f.fid = it->second;
}

}  // namespace

EnvelopeCase structure_envelope(const CheckRun& run, std::size_t s) {
  EnvelopeCase e;
  if (s < run.envelope_structure_case.size()) e.index = run.envelope_structure_case[s];
  if (s < run.envelope_structure_every.size()) e.every = run.envelope_structure_every[s];
  return e;
}

EnvelopeCase conduit_envelope(const CheckRun& run, std::size_t ci) {
  EnvelopeCase e;
  if (ci < run.envelope_conduit_case.size()) e.index = run.envelope_conduit_case[ci];
  if (ci < run.envelope_conduit_every.size()) e.every = run.envelope_conduit_every[ci];
  return e;
}

std::string envelope_label(const CheckRun& run, std::size_t case_index, bool every) {
  if (every) return every_case;
  return case_index < run.cases.size() ? run.cases[case_index].label : std::string();
}

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
  InputHashes hashes(files_read(), run.read.read_hashes);
  // Darcy-Weisbach's Reynolds number uses the viscosity of water at the project's temperature
  // (default 15 degC), for the gravity pipes and the force mains alike.
  run.kinematic_viscosity_m2_s = hydraulics::water_kinematic_viscosity_m2_s(project.methods.water_temperature_c);
  for (auto& c : run.read.network.conduits) c.roughness.kinematic_viscosity_m2_s = run.kinematic_viscosity_m2_s;
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
  for (std::size_t s = 0; s < run.read.network.structures.size(); ++s) {
    const auto it = project.methods.structure_energy_by_id.find(run.read.network.structures[s].id);
    if (it != project.methods.structure_energy_by_id.end()) run.march_options.structure_energy_at[s] = it->second;
  }
  const bool from_catchments =
      project.flow_mode == config::FlowMode::rational || project.flow_mode == config::FlowMode::sanitary;
  if (from_catchments) {
    assign_catchment_outlets(project, run);
    require_catchments_used(project, run);
  }
  if (options.dry_run) {
    merge_findings(run, {}, {}, {});
    run.inputs = hashes.finish(files_read());
    return run;
  }

  if (options.detailed_conduits)
    run.march_options.keep_step_points = options.detailed_conduits(run.read.network, run.topology);

  flows::FlowOptions flow_opt;
  flow_opt.mode = project.flow_mode == config::FlowMode::pipe_field ? flows::Mode::pipe_field : flows::Mode::structure_inflows;
  flow_opt.split = split_rule_of(project, run);
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
  // Components with loops, diversions or several outlets: the network solve (network_run.hpp).
  NetworkRun network(project, run);
  for (run.pump_iterations = 1;; ++run.pump_iterations) {
    flow_opt.fixed_conduit_flow_m3_s.clear();
    for (const auto& st : run.pump_stations)
      for (std::size_t ci : st.layout.chain) flow_opt.fixed_conduit_flow_m3_s[ci] = st.design_flow_m3_s;
    stage("design flows");
    // A proposal's added inflows go in every round of design flows, with the split of that round (the
    // network solve's rounds see them as net inflow at the connection structure).
    auto design = [&](const flows::SplitRule& rule) {
      flow_findings.clear();
      auto opt = flow_opt;
      opt.split = rule;
      auto flows = from_catchments
                       ? catchment_design_flows(project, rule, flow_opt.fixed_conduit_flow_m3_s, run, flow_findings)
                       : flows::design_flows(run.read.network, run.topology, opt, flow_findings);
      if (options.amend_flows) options.amend_flows(run.read.network, run.topology, rule, flows.flow_m3_s, flow_findings);
      return flows;
    };
    if (network.active()) {
      stage("network solve");
      auto first = run.march_options;
      first.tailwater_m = levels.front();
      run.flows = network.settle(design, own_flows(project, flow_opt, run), first);
    } else {
      run.flows = design(flow_opt.split);
    }
    run.cases.clear();
    for (double tw : levels) {
      stage("march " + std::to_string(run.cases.size() + 1) + "/" + std::to_string(levels.size()));
      Case c;
      c.tailwater_m = tw;
      c.label = case_label(tw, project, run.read.network, run.topology);
      auto opt = run.march_options;
      opt.tailwater_m = tw;
      c.march = network.active() ? network.march_case(run.cases.size(), opt, c.label)
                                 : solve::march(run.read.network, run.topology, run.flows.flow_m3_s, opt);
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
  network.finish(run.data_findings);
  if (!settled)
    run.data_findings.push_back({"FM_NOT_CONVERGED", Severity::warning, LayerRole::project, "pump_stations", "", nan, nan,
                                 units::Dimension::dimensionless,
                                 "the pumped flows and the receiving structures' levels did not settle within " +
                                     std::to_string(max_pump_iterations) +
                                     " rounds (flow change 0.5 % or more); the pump-station figures are approximate."});
  run.wet_well_inflow_m3_s = wet_well_inflows(layouts, flow_opt, run);
  // March problems (blocked, not converged, estimated inverts...) of every case, each once.
  std::vector<std::string> data_case;
  gather_march_findings(run.cases, run.data_findings, data_case);

  const auto& net = run.read.network;
  compute_envelope(run);
  report_tailwater_below_outfalls(run, run.data_findings);
  report_nothing_checked(run, run.data_findings);
  std::vector<std::string> criteria_case;
  Findings criteria = worst_per_feature(run.cases, DrawnFeatures(net, run.march_options.keep_step_points), criteria_case);
  // Pump stations: solved once against the highest receiving level over the cases.
  for (std::size_t i = 0; i < run.pump_stations.size(); ++i)
    for (auto& f : solve::check_station(net, run.project.pump_stations[i], run.pump_stations[i], project.force_mains,
                                        run.wet_well_inflow_m3_s[i])) {
      criteria.push_back(std::move(f));
      criteria_case.emplace_back(run.cases.size() > 1 ? "highest receiving level over the cases" : run.cases.front().label);
    }
  merge_findings(run, std::move(criteria), data_case, criteria_case);
  fill_unique_fids(net, run.findings);
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
