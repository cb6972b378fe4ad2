#include "run/network_run.hpp"

#include <algorithm>
#include <cmath>
#include <unordered_set>

#include "rimline/topology/finding_text.hpp"
#include "rimline/topology/orient.hpp"

namespace rimline::run {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();
// A solved flow of this size or less counts as no flow for directions [m3/s] (0.001 L/s).
constexpr double flow_epsilon_m3_s = 1.0e-6;
// Design flows and solved flows agree when no pipe differs by more than the larger of these.
constexpr double settle_absolute_m3_s = 1.0e-4;  // 0.1 L/s
constexpr double settle_relative = 1.0e-3;       // 0.1 % of the largest flow
// A component lists at most this many structures where continuity did not close.
constexpr std::size_t failures_listed = 20;

std::string split_name(config::SplitRule r) {
  switch (r) {
    case config::SplitRule::hydraulic: return "hydraulic";
    case config::SplitRule::capacity: return "capacity";
    case config::SplitRule::field: return "field";
    case config::SplitRule::fixed: return "fixed";
  }
  return "hydraulic";
}

}  // namespace

NetworkRun::NetworkRun(const config::Project& project, CheckRun& run) : project_(project), run_(run) {
  auto& summary = run_.network;
  summary.split = split_name(project.split_rule);
  summary.all_components = project.network_solve.all_components;
  const auto& net = run_.read.network;
  summary.solved_conduit.assign(net.conduits.size(), 0);
  summary.against_source.assign(net.conduits.size(), 0);
  const bool hydraulic = project.split_rule == config::SplitRule::hydraulic;
  if (!hydraulic && !project.network_solve.all_components) return;
  // Typed as in report_outfalls (project_checks.cpp): a structure layer with a type field names its outfalls.
  const bool typed = !project.structures.source.empty() && !project.structure_fields.type.empty();
  components_ = topology::gravity_components(net, run_.topology, typed);
  inputs_.outlet.assign(net.structures.size(), false);
  inputs_.wet_well.assign(net.structures.size(), false);
  for (std::size_t k = 0; k < components_.list.size(); ++k) {
    const auto& c = components_.list[k];
    if (c.outlets.empty()) continue;  // no outlet at all: the march's loop cut stands
    const bool tree = c.simple_tree();
    if (tree ? !project.network_solve.all_components : !hydraulic) continue;
    solved_.push_back(k);
    problem_.push_back({c.structures, c.conduits});
    for (std::size_t s : c.outlets) {
      inputs_.outlet[s] = true;
      inputs_.wet_well[s] = topology::wet_well(net, run_.topology, s);
    }
    summary.components += 1;
    summary.structures += c.structures.size();
    summary.conduits += c.conduits.size();
    summary.loops += c.loops;
    summary.diversions += c.diversions;
    for (std::size_t ci : c.conduits) summary.solved_conduit[ci] = 1;
  }
  options_.max_iterations = project.network_solve.max_iterations;
  options_.threads = run_.march_options.threads;
}

std::vector<double> NetworkRun::net_inflow(const std::vector<double>& flow, const std::vector<double>& own) const {
  const auto& net = run_.read.network;
  const auto& topo = run_.topology;
  std::vector<double> q(net.structures.size(), 0.0);
  auto value = [&flow](std::size_t ci) { return ci < flow.size() && std::isfinite(flow[ci]) ? flow[ci] : 0.0; };
  for (std::size_t k : solved_) {
    for (std::size_t s : components_.list[k].structures) {
      double out = 0.0, in_gravity = 0.0, in_pumped = 0.0;
      bool leaves = false;
      for (std::size_t ci : topo.nodes[s].outflows) {
        if (net.conduits[ci].from != s || net.conduits[ci].force_main) continue;
        leaves = true;
        out += value(ci);
      }
      for (std::size_t ci : topo.nodes[s].inflows) {
        if (net.conduits[ci].to != s) continue;
        (net.conduits[ci].force_main ? in_pumped : in_gravity) += value(ci);
      }
      // Where a pipe leaves: what leaves minus what arrives by gravity (own inflow, pumped flow,
      // and the change of a Rational or sanitary flow there); else its own flow and the pumped one.
      q[s] = leaves ? out - in_gravity : (s < own.size() ? own[s] : 0.0) + in_pumped;
    }
  }
  return q;
}

solve::NetworkSolution NetworkRun::solve_case(const solve::MarchOptions& options,
                                              const solve::NetworkSolution* warm) const {
  solve::NetworkInputs in = inputs_;
  if (warm) {
    in.level_m = warm->level_m;
    in.flow_m3_s = warm->flow_m3_s;
  }
  return solve::solve_network(run_.read.network, run_.topology, problem_, in, options, options_);
}

std::vector<double> NetworkRun::orient(model::Network& net, topology::Topology& topo,
                                       const solve::NetworkSolution& sol) const {
  std::vector<double> along(net.conduits.size(), nan);
  for (std::size_t k : solved_) {
    for (std::size_t ci : components_.list[k].conduits) {
      const double q = sol.flow_m3_s[ci];
      if (!std::isfinite(q)) continue;
      auto& c = net.conduits[ci];
      const double ha = sol.level_m[c.from], hb = sol.level_m[c.to];
      // A pipe runs the way it flows. Without flow, from the higher level to the lower (ties by
      // index): one strict order of the structures, so the turned network has no directed loop
      // (a flowing pipe always has the higher level at the end it leaves).
      bool turn = q < 0.0;
      if (std::fabs(q) <= flow_epsilon_m3_s && std::isfinite(ha) && std::isfinite(hb))
        turn = ha < hb || (ha == hb && c.from < c.to);
      if (turn) {
        topology::turn_conduit(c);
        std::swap(c.from, c.to);
        std::swap(c.from_id, c.to_id);
        c.reversed = !c.reversed;
      }
      along[ci] = std::fabs(q) <= flow_epsilon_m3_s ? 0.0 : std::fabs(q);
      if (ci < topo.status.size() && topo.status[ci] == topology::MarchStatus::loop_cut) c.usable = true;
    }
  }
  topology::rebuild_march_order(net, topo);
  return along;
}

flows::DesignFlows NetworkRun::settle(const DesignFlowsFn& design, const std::vector<double>& own,
                                      const solve::MarchOptions& first) {
  auto& summary = run_.network;
  flows::SplitRule rule(flows::Split::hydraulic);
  rule.share = share_;
  flows::DesignFlows d = design(rule);
  const bool given = project_.flow_mode == config::FlowMode::pipe_field;
  const int max_rounds = project_.network_solve.design_flow_iterations;
  std::vector<double> along;
  summary.design_flows_converged = true;
  for (int round = 1;; ++round) {
    if (round == 1 || !given) inputs_.net_inflow_m3_s = net_inflow(d.flow_m3_s, own);
    first_ = solve_case(first, first_.level_m.empty() ? nullptr : &first_);
    if (round == 1) fall_back(first_);
    bool solved = true;
    for (const auto& r : first_.components) solved = solved && r.converged;
    if (!active()) break;
    along = orient(run_.read.network, run_.topology, first_);
    // Each pipe's share of what leaves its upstream structure, for the next accumulation.
    const auto& net = run_.read.network;
    std::vector<double> leaving(net.structures.size(), 0.0);
    for (std::size_t ci = 0; ci < along.size(); ++ci)
      if (std::isfinite(along[ci])) leaving[net.conduits[ci].from] += along[ci];
    share_.assign(net.conduits.size(), nan);
    for (std::size_t ci = 0; ci < along.size(); ++ci)
      if (std::isfinite(along[ci]) && leaving[net.conduits[ci].from] > 0.0)
        share_[ci] = along[ci] / leaving[net.conduits[ci].from];
    // The solution's flows are signed along the pipes as they were; now they run along them.
    for (std::size_t ci = 0; ci < along.size(); ++ci)
      if (std::isfinite(along[ci])) first_.flow_m3_s[ci] = along[ci];
    summary.design_flow_rounds = round;
    if (given || !solved) break;  // a solve that did not converge is reported; more rounds would not help
    rule.share = share_;
    d = design(rule);
    double change = 0.0, largest = 0.0;
    for (std::size_t ci = 0; ci < along.size(); ++ci) {
      if (!summary.solved_conduit[ci] || !std::isfinite(along[ci])) continue;
      const double dq = std::isfinite(d.flow_m3_s[ci]) ? d.flow_m3_s[ci] : 0.0;
      change = std::max(change, std::fabs(dq - along[ci]));
      largest = std::max(largest, along[ci]);
    }
    summary.design_flow_change_m3_s = change;
    if (change <= std::max(settle_absolute_m3_s, settle_relative * largest)) break;
    if (round >= max_rounds) {
      summary.design_flows_converged = false;
      break;
    }
  }
  // The march takes the solved flows, which close continuity exactly.
  for (std::size_t ci = 0; ci < along.size(); ++ci)
    if (summary.solved_conduit[ci]) d.flow_m3_s[ci] = along[ci];
  return d;
}

void NetworkRun::fall_back(solve::NetworkSolution& sol) {
  auto& summary = run_.network;
  std::size_t kept = 0;
  for (std::size_t k = 0; k < solved_.size(); ++k) {
    if (!sol.components[k].converged) {
      const auto& comp = components_.list[solved_[k]];
      fallbacks_.push_back({solved_[k], sol.components[k]});
      summary.components -= 1;
      summary.structures -= comp.structures.size();
      summary.conduits -= comp.conduits.size();
      summary.loops -= comp.loops;
      summary.diversions -= comp.diversions;
      for (std::size_t ci : comp.conduits) summary.solved_conduit[ci] = 0;
      for (std::size_t s : comp.outlets) inputs_.outlet[s] = false;
      continue;
    }
    if (kept != k) {  // (a vector moved onto itself is left empty)
      solved_[kept] = solved_[k];
      problem_[kept] = std::move(problem_[k]);
      sol.components[kept] = std::move(sol.components[k]);
    }
    ++kept;
  }
  solved_.resize(kept);
  problem_.resize(kept);
  sol.components.resize(kept);
  summary.fallback_components = fallbacks_.size();
}

NetworkSolveCase NetworkRun::case_figures(const solve::NetworkSolution& sol, const std::string& label) const {
  NetworkSolveCase c;
  c.label = label;
  for (const auto& r : sol.components) {
    c.iterations = std::max(c.iterations, r.iterations);
    c.evaluations += r.evaluations;
    c.max_continuity_error_m3_s = std::max(c.max_continuity_error_m3_s, r.max_continuity_error_m3_s);
    c.max_level_change_m = std::max(c.max_level_change_m, r.max_level_change_m);
    c.converged = c.converged && r.converged;
  }
  return c;
}

solve::MarchResult NetworkRun::march_case(std::size_t case_index, const solve::MarchOptions& options,
                                          const std::string& label) {
  auto& summary = run_.network;
  const auto& net = run_.read.network;
  if (case_index == 0) {
    summary.cases.assign(1, case_figures(first_, label));
    summary.level_m = first_.level_m;
    return solve::march(net, run_.topology, run_.flows.flow_m3_s, options);
  }
  const solve::NetworkSolution sol = solve_case(options, &first_);
  NetworkSolveCase figures = case_figures(sol, label);
  std::vector<double> flow = run_.flows.flow_m3_s;
  std::vector<std::size_t> flipped;
  for (std::size_t ci = 0; ci < flow.size(); ++ci) {
    if (!summary.solved_conduit[ci]) continue;
    const double q = sol.flow_m3_s[ci];
    if (q < -flow_epsilon_m3_s) flipped.push_back(ci);
    flow[ci] = std::isfinite(q) ? std::max(q, 0.0) : nan;
  }
  figures.flipped = flipped.size();
  summary.cases.push_back(figures);
  if (flipped.empty()) return solve::march(net, run_.topology, flow, options);
  // Some pipes flow the other way in this case: the case is marched on a copy turned its own way,
  // and those pipes' figures (drawn and listed the first case's way) are left out of this case.
  model::Network turned = net;
  topology::Topology topo = run_.topology;
  const auto along = orient(turned, topo, sol);
  for (std::size_t ci = 0; ci < flow.size(); ++ci)
    if (summary.solved_conduit[ci]) flow[ci] = along[ci];
  solve::MarchResult r = solve::march(turned, topo, flow, options);
  for (std::size_t ci : flipped) {
    auto& cr = r.conduits[ci];
    cr = solve::ConduitResult{};
    cr.flow_m3_s = along[ci];
    cr.note = "flows the other way in this case (" + label + "): from " + net.structures[net.conduits[ci].to].id +
              " to " + net.structures[net.conduits[ci].from].id;
    const auto& c = net.conduits[ci];
    Finding f = topology::conduit_finding(c, "FLOW_DIRECTION_CASES", Severity::warning,
                                          "pipe " + c.id + " flows from " + net.structures[c.from].id + " to " +
                                              net.structures[c.to].id + " in the first tailwater case but the other way (" +
                                              q(along[ci], units::Dimension::flow) + ") under " + label +
                                              "; its figures for that case are left out of the result layers");
    f.value = along[ci];
    f.dimension = units::Dimension::flow;
    case_findings_.push_back(std::move(f));
  }
  return r;
}

void NetworkRun::finish(Findings& findings) {
  const auto& net0 = run_.read.network;
  for (const auto& fb : fallbacks_) {
    const auto& comp = components_.list[fb.component];
    const auto& outlet = net0.structures[comp.outlets.front()];
    Finding f = topology::structure_finding(
        outlet, "NETWORK_NOT_CONVERGED", Severity::warning,
        "the network solve of the " + std::to_string(comp.structures.size()) + " structures and " +
            std::to_string(comp.conduits.size()) + " pipes draining to " + outlet.id + " (" + comp.why_not_tree() +
            ") did not converge (largest continuity error " + q(fb.report.max_continuity_error_m3_s, units::Dimension::flow) +
            " after " + std::to_string(fb.report.iterations) +
            " Newton steps); that network was marched instead with its diversions split by capacity and its loops cut");
    f.value = fb.report.max_continuity_error_m3_s;
    f.limit = options_.continuity_tolerance_m3_s;
    f.dimension = units::Dimension::flow;
    findings.push_back(std::move(f));
    for (std::size_t j = 0; j < fb.report.failed_structures.size() && j < failures_listed; ++j) {
      const auto& st = net0.structures[fb.report.failed_structures[j]];
      Finding nf = topology::structure_finding(st, "NETWORK_NOT_CONVERGED", Severity::warning,
                                               "the network solve did not close continuity at structure " + st.id + " (" +
                                                   q(std::fabs(fb.report.failed_error_m3_s[j]), units::Dimension::flow) +
                                                   " unaccounted for); its network was marched with the capacity split instead");
      nf.value = std::fabs(fb.report.failed_error_m3_s[j]);
      nf.limit = options_.continuity_tolerance_m3_s;
      nf.dimension = units::Dimension::flow;
      findings.push_back(std::move(nf));
    }
  }
  fallbacks_.clear();
  // Against the source: every pipe the march takes as the topology turned it, every solved pipe
  // that carries flow as the solve turned it (FLOW_AGAINST_SOURCE below).
  auto& summary0 = run_.network;
  const auto& topo0 = run_.topology;
  summary0.against_source_count = 0;
  for (std::size_t ci = 0; ci < net0.conduits.size(); ++ci) {
    const auto& c = net0.conduits[ci];
    const std::size_t src = ci < topo0.source_upstream.size() ? topo0.source_upstream[ci] : model::no_index;
    const bool flows = !summary0.solved_conduit[ci] || run_.flows.flow_m3_s[ci] > 0.0;
    summary0.against_source[ci] = model::marched(c) && src != model::no_index && src != c.from && flows;
    summary0.against_source_count += summary0.against_source[ci];
  }
  if (!active()) return;
  auto& summary = run_.network;
  const auto& net = run_.read.network;
  const auto& topo = run_.topology;
  // Topology findings that the solve's results replace in the solved components: the direction
  // (REVERSED, ADVERSE_SLOPE by the digitised or invert direction), the loop cuts, the diversions'
  // main outflows and the untyped dead ends. Ids shared with a pipe outside stay.
  std::unordered_set<std::string> conduit_ids, structure_ids, keep_conduits, keep_structures;
  std::vector<char> in_solved(net.structures.size(), 0);
  for (std::size_t k : solved_)
    for (std::size_t s : components_.list[k].structures) in_solved[s] = 1;
  auto in_solved_structure = [&in_solved](std::size_t s) { return in_solved[s] != 0; };
  std::vector<char> low_point(net.structures.size(), 0);
  for (std::size_t k : solved_) {
    for (std::size_t ci : components_.list[k].conduits) conduit_ids.insert(net.conduits[ci].id);
    for (std::size_t s : components_.list[k].structures) structure_ids.insert(net.structures[s].id);
    for (std::size_t s : components_.list[k].low_points) low_point[s] = 1;
  }
  for (std::size_t ci = 0; ci < net.conduits.size(); ++ci)
    if (!summary.solved_conduit[ci]) keep_conduits.insert(net.conduits[ci].id);

  for (std::size_t s = 0; s < net.structures.size(); ++s)
    if (!in_solved[s]) keep_structures.insert(net.structures[s].id);
  std::unordered_set<std::string> low_point_ids;  // in a solved component but no outlet of it
  for (std::size_t s = 0; s < net.structures.size(); ++s)
    if (in_solved_structure(s) && !inputs_.outlet[s]) low_point_ids.insert(net.structures[s].id);
  auto replaced = [&](const Finding& f) {
    if (f.layer == LayerRole::conduits && (f.code == "REVERSED" || f.code == "ADVERSE_SLOPE" || f.code == "TOPOLOGY_LOOP"))
      return conduit_ids.count(f.feature_id) > 0 && keep_conduits.count(f.feature_id) == 0;
    if (f.layer == LayerRole::structures && f.code == "DIVERSION")
      return structure_ids.count(f.feature_id) > 0 && keep_structures.count(f.feature_id) == 0;
    // An untyped dead end that stays an outlet of the solve keeps its finding.
    if (f.layer == LayerRole::structures && (f.code == "TOPOLOGY_NO_OUTFALL" || f.code == "OUTFALL_ASSUMED"))
      return low_point_ids.count(f.feature_id) > 0 && keep_structures.count(f.feature_id) == 0;
    return false;
  };
  findings.erase(std::remove_if(findings.begin(), findings.end(), replaced), findings.end());

  const auto& first_flow = run_.flows.flow_m3_s;
  for (std::size_t k = 0; k < solved_.size(); ++k) {
    const auto& comp = components_.list[solved_[k]];
    const auto& rep = first_.components[k];
    summary.unknowns += rep.unknowns;
    summary.newton_pieces += rep.newton_pieces;
    const auto& outlet = net.structures[comp.outlets.front()];
    Finding f = topology::structure_finding(
        outlet, "NETWORK_SOLVED", Severity::info,
        "the network of " + std::to_string(comp.structures.size()) + " structures and " +
            std::to_string(comp.conduits.size()) + " pipes draining to " + outlet.id +
            (comp.outlets.size() > 1 ? " and " + std::to_string(comp.outlets.size() - 1) + " other outlet(s)" : "") +
            " (" + comp.why_not_tree() + ") was solved for its levels: " + std::to_string(rep.iterations) +
            " Newton step(s), largest continuity error " + q(rep.max_continuity_error_m3_s, units::Dimension::flow) +
            ", last level change " + q(rep.max_level_change_m, units::Dimension::length));
    f.value = rep.max_continuity_error_m3_s;
    f.dimension = units::Dimension::flow;
    findings.push_back(std::move(f));
    if (rep.no_outlet)
      findings.push_back(topology::structure_finding(
          outlet, "NETWORK_NO_OUTLET", Severity::warning,
          "part of the network draining to " + outlet.id +
              " reaches no outfall or wet well through pipes that can be solved; its pipes were not checked"));
    for (std::size_t j = 0; j < rep.failed_structures.size() && j < failures_listed; ++j) {
      const auto& st = net.structures[rep.failed_structures[j]];
      Finding nf = topology::structure_finding(
          st, "NETWORK_NOT_CONVERGED", Severity::warning,
          "the network solve did not close continuity at structure " + st.id + " (" +
              q(std::fabs(rep.failed_error_m3_s[j]), units::Dimension::flow) + " unaccounted for after " +
              std::to_string(rep.iterations) + " Newton steps); the levels and flows of its network are approximate");
      nf.value = std::fabs(rep.failed_error_m3_s[j]);
      nf.limit = options_.continuity_tolerance_m3_s;
      nf.dimension = units::Dimension::flow;
      findings.push_back(std::move(nf));
    }
    for (std::size_t s : comp.low_points)
      findings.push_back(topology::structure_finding(
          net.structures[s], "NETWORK_LOW_POINT", Severity::info,
          "structure " + net.structures[s].id +
              " has no outflow by its pipes' digitised or invert direction and is not an outfall or wet well; the "
              "network solve takes it as an ordinary structure, its water leaving by whichever pipes the levels say"));
  }
  for (std::size_t s = 0; s < net.structures.size(); ++s) {
    if (!in_solved[s]) continue;
    std::vector<std::size_t> out;
    for (std::size_t ci : topo.nodes[s].outflows)
      if (!net.conduits[ci].force_main && net.conduits[ci].from == s && first_flow[ci] > 0.0) out.push_back(ci);
    if (out.size() < 2) continue;
    std::string parts;
    for (std::size_t ci : out)
      parts += (parts.empty() ? "" : ", ") + net.conduits[ci].id + " " + q(first_flow[ci], units::Dimension::flow);
    Finding f = topology::structure_finding(net.structures[s], "DIVERSION", Severity::info,
                                            "structure " + net.structures[s].id + " has " + std::to_string(out.size()) +
                                                " outflow pipes carrying flow; the network solve splits it by the levels: " +
                                                parts);
    f.value = static_cast<double>(out.size());
    findings.push_back(std::move(f));
  }
  for (std::size_t ci = 0; ci < net.conduits.size(); ++ci) {
    if (!summary.solved_conduit[ci]) continue;
    const auto& c = net.conduits[ci];
    if (summary.against_source[ci]) {
      const bool ids = ci < topo.source_from_ids.size() && topo.source_from_ids[ci];
      findings.push_back(topology::conduit_finding(
          c, "FLOW_AGAINST_SOURCE", Severity::info,
          "pipe " + c.id + " flows from " + net.structures[c.from].id + " to " + net.structures[c.to].id +
              " in the network solve, against its " + (ids ? "from/to ids" : "digitised direction") + " (" +
              net.structures[c.to].id + " to " + net.structures[c.from].id + ")"));
    }
    if (first_flow[ci] > 0.0 && c.invert_up_m && c.invert_down_m && *c.invert_up_m < *c.invert_down_m - 0.001) {
      const double rise = *c.invert_down_m - *c.invert_up_m;
      Finding f = topology::conduit_finding(
          c, "ADVERSE_SLOPE", Severity::warning,
          "pipe " + c.id + ": inverts rise " + q(rise, units::Dimension::length) + " along the flow the network solve finds, from " +
              net.structures[c.from].id + " (" + q(*c.invert_up_m, units::Dimension::length) + ") to " +
              net.structures[c.to].id + " (" + q(*c.invert_down_m, units::Dimension::length) + ")");
      if (c.length_m > 0.0) {
        f.value = -rise / c.length_m;
        f.limit = 0.0;
        f.dimension = units::Dimension::slope;
      }
      findings.push_back(std::move(f));
    }
  }
  if (!summary.design_flows_converged)
    findings.push_back({"FLOW_SPLIT_NOT_CONVERGED", Severity::warning, LayerRole::project, "network_solve", "",
                        summary.design_flow_change_m3_s, nan, units::Dimension::flow,
                        "the design flows accumulated by the solved split and the solved flows still differed by " +
                            q(summary.design_flow_change_m3_s, units::Dimension::flow) + " after " +
                            std::to_string(summary.design_flow_rounds) +
                            " rounds; the design flows of the solved networks are approximate"});
  for (auto& f : case_findings_) findings.push_back(std::move(f));
  case_findings_.clear();
}

}  // namespace rimline::run
