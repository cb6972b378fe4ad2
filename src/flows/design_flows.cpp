#include "rimline/flows/design_flows.hpp"

#include <cmath>
#include <limits>

#include "rimline/hydraulics/friction.hpp"

namespace rimline::flows {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();

// The shares the network solve found at a structure, or nothing when they are missing there.
bool solved_shares(const std::vector<std::size_t>& outs, const SplitRule& split, std::vector<double>& share) {
  if (split.split != Split::hydraulic || split.share.empty()) return false;
  double total = 0.0;
  for (std::size_t i = 0; i < outs.size(); ++i) {
    const double s = outs[i] < split.share.size() ? split.share[outs[i]] : nan;
    if (!std::isfinite(s) || s < 0.0) return false;
    share[i] = s;
    total += s;
  }
  if (!(total > 0.0)) return false;
  for (auto& s : share) s /= total;
  return true;
}

// Share of each outflow at a diversion: given fractions, the solved shares, or in proportion to
// full capacity (common practice, no source) when those are missing or the rule says so.
std::vector<double> outflow_shares(const model::Network& net, const std::vector<std::size_t>& outs,
                                   const SplitRule& split) {
  std::vector<double> share(outs.size(), 0.0);
  if (outs.size() == 1) {
    share[0] = 1.0;
    return share;
  }
  if (solved_shares(outs, split, share)) return share;
  double total = 0.0;
  bool all_given = split.split == Split::field;
  for (std::size_t i = 0; i < outs.size() && all_given; ++i)
    all_given = net.conduits[outs[i]].split_fraction.has_value();
  for (std::size_t i = 0; i < outs.size(); ++i) {
    const auto& c = net.conduits[outs[i]];
    double w = 0.0;
    if (all_given) {
      w = *c.split_fraction;
    } else if (c.invert_up_m && c.invert_down_m && c.length_m > 0.0) {
      const double slope = std::max((*c.invert_up_m - *c.invert_down_m) / c.length_m, 1.0e-5);
      try {
        w = hydraulics::full_capacity_m3_s(c.roughness, c.section, slope);
      } catch (const std::exception&) {
        w = 0.0;
      }
    }
    share[i] = std::isfinite(w) && w > 0.0 ? w : 0.0;
    total += share[i];
  }
  for (auto& s : share) s = total > 0.0 ? s / total : 1.0 / static_cast<double>(outs.size());
  return share;
}

}  // namespace

std::vector<std::size_t> upstream_first_order(const model::Network& network, const topology::Topology& topo) {
  // Indegree of a structure = number of usable conduits arriving; a conduit is ready when its
  // upstream structure has all inflows resolved.
  const std::size_t ns = network.structures.size();
  std::vector<std::size_t> pending(ns, 0);
  for (const auto& c : network.conduits)
    if (model::marched(c)) ++pending[c.to];
  std::vector<std::size_t> ready;
  for (std::size_t s = 0; s < ns; ++s)
    if (pending[s] == 0) ready.push_back(s);
  std::vector<std::size_t> order;
  order.reserve(network.conduits.size());
  while (!ready.empty()) {
    const std::size_t s = ready.back();
    ready.pop_back();
    if (s >= topo.nodes.size()) continue;
    for (std::size_t ci : topo.nodes[s].outflows) {
      const auto& c = network.conduits[ci];
      if (!model::marched(c) || c.from != s) continue;
      order.push_back(ci);
      if (--pending[c.to] == 0) ready.push_back(c.to);
    }
  }
  return order;
}

DesignFlows design_flows(const model::Network& network, const topology::Topology& topo, const FlowOptions& options,
                         Findings& findings) {
  const std::size_t nc = network.conduits.size();
  DesignFlows out;
  out.flow_m3_s.assign(nc, nan);
  out.filled.assign(nc, false);
  std::vector<double> arriving(network.structures.size(), 0.0);  // flow reaching each structure

  for (std::size_t ci : upstream_first_order(network, topo)) {
    const auto& c = network.conduits[ci];
    if (const auto fixed = options.fixed_conduit_flow_m3_s.find(ci); fixed != options.fixed_conduit_flow_m3_s.end()) {
      out.flow_m3_s[ci] = fixed->second;
      arriving[c.to] += fixed->second;
      continue;
    }
    const std::size_t s = c.from;
    const auto& node = topo.nodes[s];
    double q = nan;
    if (options.mode == Mode::structure_inflows) {
      const double local = network.structures[s].inflow_m3_s.value_or(options.default_inflow_m3_s);
      const auto shares = outflow_shares(network, node.outflows, options.split);
      for (std::size_t k = 0; k < node.outflows.size(); ++k)
        if (node.outflows[k] == ci) q = (arriving[s] + local) * shares[k];
    } else if (c.flow_m3_s) {
      q = *c.flow_m3_s;
    } else {
      // A missing design flow is never taken as zero: carry what arrives from upstream.
      const auto shares = outflow_shares(network, node.outflows, options.split);
      for (std::size_t k = 0; k < node.outflows.size(); ++k)
        if (node.outflows[k] == ci) q = arriving[s] * shares[k];
      out.filled[ci] = true;
      findings.push_back({"FLOW_FILLED", Severity::warning, LayerRole::conduits, c.id, "flow", q, nan,
                          units::Dimension::flow,
                          "pipe " + c.id + " has no design flow; the flow arriving from upstream (" +
                              rimline::q(q, units::Dimension::flow) + ") was used instead."});
      findings.back().fid = c.fid;
    }
    out.flow_m3_s[ci] = q;
    if (std::isfinite(q)) arriving[c.to] += q;
  }
  return out;
}

std::vector<double> diversion_shares(const model::Network& network, const std::vector<std::size_t>& outs,
                                     const SplitRule& split) {
  return outflow_shares(network, outs, split);
}

}  // namespace rimline::flows
