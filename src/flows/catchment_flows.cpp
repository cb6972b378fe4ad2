#include "rimline/flows/catchment_flows.hpp"

#include <algorithm>
#include <cmath>

#include "rimline/flows/idf.hpp"
#include "rimline/flows/peaking.hpp"

namespace rimline::flows {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();

// What has reached a structure from upstream, before its own catchments are added.
struct Arriving {
  double area_m2 = 0.0, ca_m2 = 0.0, population = 0.0, length_m = 0.0, inflow_m3_s = 0.0;
  double tc_s = nan;  // longest time for flow to get here; NaN: nothing with a time arrives
};

double longest(double a, double b) {
  if (std::isnan(a)) return b;
  if (std::isnan(b)) return a;
  return std::max(a, b);
}

// Walks the trees upstream first, giving each pipe its share of what reaches its upstream
// structure; `pipe_flow` sets the pipe's design flow (and its travel time) from that share.
template <typename PipeFlow>
CatchmentFlows along_tree(const model::Network& net, const topology::Topology& topo,
                          const std::vector<LocalInflow>& local, const SplitRule& split, const FixedFlows& fixed,
                          PipeFlow&& pipe_flow) {
  const std::size_t nc = net.conduits.size();
  CatchmentFlows out;
  out.flows.flow_m3_s.assign(nc, nan);
  out.flows.filled.assign(nc, false);
  out.pipes.assign(nc, PipeDesign{});
  std::vector<Arriving> at(net.structures.size());
  for (std::size_t ci : upstream_first_order(net, topo)) {
    const auto& c = net.conduits[ci];
    if (const auto f = fixed.find(ci); f != fixed.end()) {
      out.pipes[ci].flow_m3_s = out.flows.flow_m3_s[ci] = f->second;
      at[c.to].inflow_m3_s += f->second;
      continue;
    }
    const std::size_t s = c.from;
    const auto& outs = topo.nodes[s].outflows;
    const auto shares = diversion_shares(net, outs, split);
    double share = 0.0;
    for (std::size_t k = 0; k < outs.size(); ++k)
      if (outs[k] == ci) share = shares[k];
    const LocalInflow here = s < local.size() ? local[s] : LocalInflow{};
    PipeDesign& p = out.pipes[ci];
    p.area_m2 = (at[s].area_m2 + here.area_m2) * share;
    p.ca_m2 = (at[s].ca_m2 + here.ca_m2) * share;
    p.population = (at[s].population + here.population) * share;
    p.tc_s = longest(at[s].tc_s, here.inlet_time_s);
    const double length_m = (at[s].length_m * share) + c.length_m;  // the pipe's own length infiltrates too
    const double inflow = (at[s].inflow_m3_s + here.inflow_m3_s) * share;
    pipe_flow(ci, p, length_m, inflow);
    out.flows.flow_m3_s[ci] = p.flow_m3_s;
    Arriving& down = at[c.to];
    down.area_m2 += p.area_m2;
    down.ca_m2 += p.ca_m2;
    down.population += p.population;
    down.length_m += length_m;
    down.inflow_m3_s += inflow;
    if (!std::isnan(p.tc_s)) down.tc_s = longest(down.tc_s, p.tc_s + p.travel_time_s);
  }
  return out;
}

}  // namespace

std::vector<LocalInflow> local_inflows(const model::Network& network, const std::vector<model::Catchment>& catchments) {
  std::vector<LocalInflow> local(network.structures.size());
  for (std::size_t s = 0; s < network.structures.size(); ++s) {
    local[s].inflow_m3_s = network.structures[s].inflow_m3_s.value_or(0.0);
    local[s].population = network.structures[s].population.value_or(0.0);
  }
  for (const auto& k : catchments) {
    if (k.structure >= local.size()) continue;
    LocalInflow& l = local[k.structure];
    l.area_m2 += k.area_m2;
    l.ca_m2 += k.runoff_c * k.area_m2;
    l.inlet_time_s = longest(l.inlet_time_s, k.inlet_time_s);
    l.population += k.population.value_or(0.0);
  }
  return local;
}

CatchmentFlows storm_along_tree(const model::Network& network, const topology::Topology& topo,
                                const std::vector<LocalInflow>& local, const model::IdfCurve& idf,
                                const TravelTimeFn& travel, const SplitRule& split, Findings& findings,
                                const FixedFlows& fixed) {
  auto out = along_tree(network, topo, local, split, fixed, [&](std::size_t ci, PipeDesign& p, double, double inflow) {
    p.flow_m3_s = inflow;
    if (!std::isnan(p.tc_s)) {
      const IdfValue i = idf_intensity(idf, p.tc_s);
      p.intensity_m_s = i.intensity_m_s;
      p.flow_m3_s += i.intensity_m_s * p.ca_m2;  // Q = C i A, SI
      if (i.extrapolated) {
        const auto& c = network.conduits[ci];
        findings.push_back({"IDF_EXTRAPOLATED", Severity::warning, LayerRole::conduits, c.id, "", p.tc_s, nan,
                            units::Dimension::time,
                            "pipe " + c.id + ": the time of concentration " + q(p.tc_s, units::Dimension::time) +
                                " lies outside the IDF table; its end segment was extended (log-log) to give " +
                                q(i.intensity_m_s, units::Dimension::intensity) + "."});
        findings.back().fid = c.fid;
      }
    }
    p.travel_time_s = travel(ci, p.flow_m3_s, p);
  });
  out.mode = CatchmentMode::storm;
  return out;
}

CatchmentFlows sanitary_along_tree(const model::Network& network, const topology::Topology& topo,
                                   const std::vector<LocalInflow>& local, const SanitaryOptions& o, const SplitRule& split,
                                   const FixedFlows& fixed) {
  auto out = along_tree(network, topo, local, split, fixed, [&](std::size_t, PipeDesign& p, double length_m, double inflow) {
    p.peaking_factor = o.peaking == Peaking::harmon ? harmon_peaking_factor(p.population) : o.peaking_constant;
    p.infiltration_m3_s = o.infiltration_per_length_m3_s_m.value_or(0.0) * length_m +
                          o.infiltration_per_area_m3_s_m2.value_or(0.0) * p.area_m2;
    p.flow_m3_s = p.peaking_factor * o.per_capita_m3_s * p.population + p.infiltration_m3_s + inflow;
  });
  out.mode = CatchmentMode::sanitary;
  return out;
}

}  // namespace rimline::flows
