#include "rimline/connections/added_flow.hpp"

#include <cmath>
#include <limits>
#include <map>
#include <queue>

#include "rimline/solve/march.hpp"

namespace rimline::connections {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();

}  // namespace

std::vector<FlowShare> added_flow_path(const model::Network& network, const topology::Topology& topo,
                                       const flows::SplitRule& split, const std::vector<std::size_t>& rank, std::size_t structure) {
  std::vector<FlowShare> out;
  // Upstream structures have the higher rank: take the highest first, so a structure passes its
  // share on only once every share reaching it has arrived.
  std::map<std::size_t, double, std::greater<>> arriving;  // rank -> share (ranks are unique)
  std::map<std::size_t, std::size_t> structure_of;          // rank -> structure
  arriving[rank[structure]] = 1.0;
  structure_of[rank[structure]] = structure;
  while (!arriving.empty()) {
    const auto [r, share] = *arriving.begin();
    arriving.erase(arriving.begin());
    const std::size_t s = structure_of[r];
    const auto& outs = topo.nodes[s].outflows;
    bool pumped = false;
    for (std::size_t ci : outs) pumped = pumped || network.conduits[ci].force_main;
    if (outs.empty() || pumped) continue;
    const auto shares = flows::diversion_shares(network, outs, split);
    for (std::size_t k = 0; k < outs.size(); ++k) {
      const auto& c = network.conduits[outs[k]];
      if (!model::marched(c) || c.from != s || !(shares[k] > 0.0)) continue;
      out.push_back({outs[k], share * shares[k]});
      arriving[rank[c.to]] += share * shares[k];
      structure_of[rank[c.to]] = c.to;
    }
  }
  return out;
}

void add_inflows(const std::vector<config::AddedInflow>& inflows, const model::Network& network,
                 const topology::Topology& topo, const flows::SplitRule& split, std::vector<double>& flow_m3_s,
                 Findings& findings) {
  if (inflows.empty()) return;
  const auto rank = solve::march_rank(network, topo);
  for (const auto& in : inflows) {
    const std::size_t s = model::find_structure(network, in.structure);
    if (s == model::no_index) {
      findings.push_back({"UNKNOWN_ID", Severity::warning, LayerRole::structures, in.structure, "", nan, nan,
                          units::Dimension::dimensionless,
                          "the proposal adds an inflow at structure " + in.structure +
                              ", which the network lacks; it is left out."});
      continue;
    }
    const auto path = added_flow_path(network, topo, split, rank, s);
    if (path.empty()) {
      findings.push_back({"PROPOSAL_NOT_APPLIED", Severity::warning, LayerRole::structures, in.structure, "",
                          in.flow_m3_s, nan, units::Dimension::flow,
                          "the proposal adds " + q(in.flow_m3_s, units::Dimension::flow) + " at structure " +
                              in.structure + ", which no checked pipe leaves; it is left out."});
      findings.back().fid = network.structures[s].fid;
      continue;
    }
    for (const auto& p : path)
      if (std::isfinite(flow_m3_s[p.conduit])) flow_m3_s[p.conduit] += in.flow_m3_s * p.share;
  }
}

void apply_pipe_changes(const std::vector<config::PipeChange>& changes, model::Network& network, Findings& findings) {
  for (const auto& ch : changes) {
    model::Conduit* c = nullptr;
    for (auto& candidate : network.conduits)
      if (candidate.id == ch.id) {
        c = &candidate;
        break;
      }
    if (!c) {
      findings.push_back({"UNKNOWN_ID", Severity::warning, LayerRole::conduits, ch.id, "", nan, nan,
                          units::Dimension::dimensionless,
                          "the proposal changes pipe " + ch.id + ", which the network lacks; the change is left out."});
      continue;
    }
    std::string what;
    auto said = [&what](const std::string& s) { what += (what.empty() ? "" : ", ") + s; };
    if (ch.diameter_m) {
      c->section.shape = hydraulics::Shape::circular;
      c->section.diameter_m = *ch.diameter_m;
      said("diameter " + q(*ch.diameter_m, units::Dimension::length));
    }
    if (ch.width_m && ch.height_m) {
      c->section.shape = hydraulics::Shape::box;
      c->section.width_m = *ch.width_m;
      c->section.height_m = *ch.height_m;
      said("box " + q(*ch.width_m, units::Dimension::length) + " x " + q(*ch.height_m, units::Dimension::length));
    }
    if (ch.manning_n) {
      c->roughness.law = hydraulics::FrictionLaw::manning;
      c->roughness.manning_n = *ch.manning_n;
      said("Manning's n " + q(*ch.manning_n, units::Dimension::dimensionless));
    }
    if (ch.invert_up_m) {
      c->invert_up_m = ch.invert_up_m;
      said("upstream invert " + q(*ch.invert_up_m, units::Dimension::length));
    }
    if (ch.invert_down_m) {
      c->invert_down_m = ch.invert_down_m;
      said("downstream invert " + q(*ch.invert_down_m, units::Dimension::length));
    }
    findings.push_back({"PROPOSAL_CHANGE", Severity::info, LayerRole::conduits, ch.id, "", nan, nan,
                        units::Dimension::dimensionless, "the proposal changes pipe " + ch.id + ": " + what + "."});
    findings.back().fid = c->fid;
  }
}

}  // namespace rimline::connections
