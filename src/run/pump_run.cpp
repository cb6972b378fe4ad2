#include "run/pump_run.hpp"

#include <cmath>
#include <limits>

#include "rimline/gis/force_main_profile.hpp"
#include "rimline/gis/read_pump_stations.hpp"

namespace rimline::run {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();

}  // namespace

std::vector<solve::StationLayout> lay_out_pump_stations(const config::Project& project, CheckRun& run) {
  // Stations of a point layer join the project file's; run.project holds them all from here on.
  for (auto& st : gis::read_pump_station_points(project, project.pump_stations, run.data_findings,
                                                   run.read.input_files))
    run.project.pump_stations.push_back(std::move(st));
  const auto& net = run.read.network;
  std::vector<solve::StationLayout> layouts;
  if (!run.project.pump_stations.empty()) {
    run.force_main_profiles = gis::force_main_profiles(net, project.force_mains, run.data_findings);
    layouts = solve::lay_out_stations(net, run.topology, run.project.pump_stations, run.force_main_profiles,
                                      run.data_findings);
  }
  // A force main that no station reaches is left unchecked by both the gravity march and the station solve.
  std::vector<bool> in_station(net.conduits.size(), false);
  for (const auto& l : layouts)
    for (std::size_t ci : l.chain) in_station[ci] = true;
  for (std::size_t ci = 0; ci < net.conduits.size(); ++ci) {
    const auto& c = net.conduits[ci];
    if (!c.force_main || !model::marched(c) || in_station[ci]) continue;
    run.data_findings.push_back({"FM_NOT_CHECKED", Severity::info, LayerRole::force_mains, c.id, "", nan, nan,
                                 units::Dimension::dimensionless,
                                 "force main " + c.id + " belongs to no [[pump_stations]] entry, so its pressure flow "
                                 "is not checked; the gravity march leaves force mains to their pump station."});
  }
  return layouts;
}

void solve_pump_stations(const config::Project& project, const std::vector<solve::StationLayout>& layouts,
                         const std::vector<double>& receiving_level_m, CheckRun& run) {
  run.pump_stations.clear();
  for (std::size_t i = 0; i < layouts.size(); ++i)
    run.pump_stations.push_back(solve::solve_station(run.read.network, run.project.pump_stations[i], layouts[i],
                                                     project.force_mains, receiving_level_m[i]));
}

std::vector<double> receiving_levels(const std::vector<solve::StationLayout>& layouts, const CheckRun& run) {
  std::vector<double> level(layouts.size(), nan);
  for (std::size_t i = 0; i < layouts.size(); ++i) {
    if (!layouts[i].ok) continue;
    for (const auto& c : run.cases) {
      const auto& r = c.march.structures[layouts[i].discharge];
      if (r.solved && std::isfinite(r.hgl_m) && !(level[i] >= r.hgl_m)) level[i] = r.hgl_m;
    }
  }
  return level;
}

std::vector<double> wet_well_inflows(const std::vector<solve::StationLayout>& layouts,
                                     const flows::FlowOptions& flow_opt, const CheckRun& run) {
  const auto& net = run.read.network;
  std::vector<double> inflow(layouts.size(), 0.0);
  for (std::size_t i = 0; i < layouts.size(); ++i) {
    if (!layouts[i].ok) continue;
    const std::size_t ww = layouts[i].wet_well;
    for (std::size_t ci : run.topology.nodes[ww].inflows) {
      const auto& c = net.conduits[ci];
      if (model::marched(c) && !c.force_main && c.to == ww && std::isfinite(run.flows.flow_m3_s[ci]))
        inflow[i] += run.flows.flow_m3_s[ci];
    }
    if (flow_opt.mode == flows::Mode::structure_inflows)
      inflow[i] += net.structures[ww].inflow_m3_s.value_or(flow_opt.default_inflow_m3_s);
  }
  return inflow;
}

}  // namespace rimline::run
