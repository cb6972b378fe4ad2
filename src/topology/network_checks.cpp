#include "rimline/topology/network_checks.hpp"

#include <algorithm>
#include <cmath>
#include <string>
#include <unordered_map>

#include "rimline/topology/finding_text.hpp"

namespace rimline::topology {

using model::Conduit;

void report_duplicate_conduit_ids(const model::Network& network, Findings& findings) {
  std::unordered_map<std::string, std::size_t> first;
  first.reserve(network.conduits.size() * 2);
  for (std::size_t i = 0; i < network.conduits.size(); ++i) {
    const Conduit& c = network.conduits[i];
    if (c.id.empty()) continue;
    auto [it, fresh] = first.emplace(c.id, i);
    if (fresh) continue;
    const Conduit& earlier = network.conduits[it->second];
    findings.push_back(conduit_finding(c, "TOPOLOGY_DUPLICATE_ID", Severity::warning,
                                       "pipe id '" + c.id + "' is used again by feature fid " + std::to_string(c.fid) +
                                           " (first by fid " + std::to_string(earlier.fid) +
                                           "); both are kept as distinct pipes"));
  }
}

double plan_length_m(const Conduit& c) {
  if (c.geometry_length_m > 0.0) return c.geometry_length_m;
  if (c.vertices.size() < 2) return std::hypot(c.down_point.x - c.up_point.x, c.down_point.y - c.up_point.y);
  double length = 0.0;
  for (std::size_t k = 1; k < c.vertices.size(); ++k)
    length += std::hypot(c.vertices[k].x - c.vertices[k - 1].x, c.vertices[k].y - c.vertices[k - 1].y);
  return length;
}

void report_zero_length(const model::Network& network, const TopologyOptions& options, Findings& findings) {
  for (std::size_t i = 0; i < network.conduits.size(); ++i) {
    const Conduit& c = network.conduits[i];
    const double length = plan_length_m(c);
    if (length >= options.zero_length_m) continue;
    Finding f = conduit_finding(c, "TOPOLOGY_ZERO_LENGTH", Severity::warning,
                                "pipe " + label(c, i) + " has a plan length of " + q(length, units::Dimension::length) +
                                    "; its direction and deflection are undefined");
    f.value = length;
    f.limit = options.zero_length_m;
    f.dimension = units::Dimension::length;
    findings.push_back(std::move(f));
  }
}

void report_parallels(const model::Network& network, const Topology& topology, Findings& findings) {
  std::vector<std::size_t> order;
  for (std::size_t i = 0; i < network.conduits.size(); ++i)
    if (topology.status[i] == MarchStatus::marched) order.push_back(i);
  auto key = [&](std::size_t i) { return std::make_pair(network.conduits[i].from, network.conduits[i].to); };
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return key(a) < key(b); });
  std::size_t j = 0;  // first pipe of the current group of equal (from, to)
  for (std::size_t k = 1; k < order.size(); ++k) {
    if (key(order[k]) != key(order[j])) {
      j = k;
      continue;
    }
    const Conduit& c = network.conduits[order[k]];
    const Conduit& first = network.conduits[order[j]];
    Finding f = conduit_finding(c, "PARALLEL", Severity::info,
                                "pipe " + label(c, order[k]) + " runs parallel to pipe " + label(first, order[j]) +
                                    " from " + label(network.structures[c.from], c.from) + " to " +
                                    label(network.structures[c.to], c.to) + "; both are kept and share the flow");
    findings.push_back(std::move(f));
  }
}

}  // namespace rimline::topology
