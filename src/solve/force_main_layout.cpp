// Where each pump station's force main runs: wet well -> chain of force-main conduits -> the
// receiving structure, with the profile points of each conduit strung along the chain.
#include <algorithm>
#include <limits>

#include "rimline/solve/force_main.hpp"

namespace rimline::solve {
namespace {

void not_checked(const model::PumpStation& spec, const std::string& why, Findings& findings) {
  findings.push_back({"FM_NOT_CHECKED", Severity::error, LayerRole::project, spec.id, "id",
                      std::numeric_limits<double>::quiet_NaN(), std::numeric_limits<double>::quiet_NaN(),
                      units::Dimension::dimensionless,
                      spec.where + ": pump station " + spec.id + ": " + why + "; the station is not checked."});
}

std::size_t force_main_leaving(const model::Network& n, const topology::Topology& topo, std::size_t s) {
  if (s >= topo.nodes.size()) return model::no_index;
  for (std::size_t ci : topo.nodes[s].outflows) {
    const auto& c = n.conduits[ci];
    if (c.force_main && model::marched(c) && c.from == s) return ci;
  }
  return model::no_index;
}

}  // namespace

std::vector<StationLayout> lay_out_stations(const model::Network& network, const topology::Topology& topo,
                                            const std::vector<model::PumpStation>& specs,
                                            const std::vector<model::ForceMainProfile>& profiles, Findings& findings) {
  std::vector<StationLayout> out;
  for (const auto& spec : specs) {
    StationLayout l;
    auto fail = [&](const std::string& why) {
      l.note = why;
      not_checked(spec, why, findings);
      out.push_back(l);
    };
    l.wet_well = model::find_structure(network, spec.id);
    if (l.wet_well == model::no_index) {
      fail("no structure has the id " + spec.id + " (the wet well)");
      continue;
    }
    std::vector<bool> seen(network.structures.size(), false);
    std::size_t at = l.wet_well;
    while (!seen[at]) {
      seen[at] = true;
      if (!spec.discharge_id.empty() && network.structures[at].id == spec.discharge_id) break;
      const std::size_t ci = force_main_leaving(network, topo, at);
      if (ci == model::no_index) break;
      l.chain.push_back(ci);
      at = network.conduits[ci].to;
    }
    if (l.chain.empty()) {
      fail("no connected force main leaves structure " + spec.id);
      continue;
    }
    l.discharge = at;
    if (!spec.discharge_id.empty() && network.structures[at].id != spec.discharge_id) {
      fail("its force main ends at structure " + network.structures[at].id + ", not at the discharge structure " +
           spec.discharge_id);
      continue;
    }
    double offset = 0.0;
    std::string missing;
    for (std::size_t ci : l.chain) {
      const auto it = std::find_if(profiles.begin(), profiles.end(),
                                   [ci](const model::ForceMainProfile& p) { return p.conduit == ci; });
      if (it == profiles.end() || it->station_m.size() < 2) {
        missing = "force main " + network.conduits[ci].id + " has no vertical profile (" +
                  (it == profiles.end() ? std::string("no usable line") : it->note) + ")";
        break;
      }
      for (std::size_t k = 0; k < it->station_m.size(); ++k)
        l.points.push_back({ci, offset + it->station_m[k], it->centreline_m[k], it->xy[k]});
      l.sources.push_back(it->source);
      offset += it->station_m.back();
    }
    if (!missing.empty()) {
      fail(missing);
      continue;
    }
    l.ok = true;
    out.push_back(std::move(l));
  }
  return out;
}

}  // namespace rimline::solve
