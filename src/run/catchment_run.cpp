#include "run/catchment_run.hpp"

#include <cmath>
#include <cstdio>

#include "rimline/flows/catchment_outlets.hpp"
#include "rimline/flows/idf.hpp"
#include "rimline/flows/peaking.hpp"

namespace rimline::run {
namespace {

std::string constant_text(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.4g", v);
  return buf;
}

}  // namespace

void assign_catchment_outlets(const config::Project& project, CheckRun& run) {
  run.catchments = run.read.catchments;
  flows::assign_outlets(run.read.network, run.topology, run.catchments, project.catchments.outlet_search_m,
                        run.data_findings);
}

flows::DesignFlows catchment_design_flows(const config::Project& project, const flows::SplitRule& split,
                                          const flows::FixedFlows& fixed, CheckRun& run, Findings& findings) {
  const auto& net = run.read.network;
  const auto local = flows::local_inflows(net, run.catchments);
  flows::CatchmentFlows cf;
  if (project.flow_mode == config::FlowMode::rational) {
    const auto velocity =
        project.rational.full_flow_velocity ? flows::TravelVelocity::full_flow : flows::TravelVelocity::normal_depth;
    cf = flows::storm_along_tree(net, run.topology, local, project.rational.idf,
                                 flows::velocity_travel_time(net, velocity, findings), split, findings, fixed);
    cf.method = "Rational Method Q = C i A along the network; IDF " + flows::idf_description(project.rational.idf) +
                "; pipe travel time from the " +
                (velocity == flows::TravelVelocity::full_flow ? "full-flow velocity"
                                                              : "velocity at normal depth for the pipe's design flow");
  } else {
    flows::SanitaryOptions o;
    o.per_capita_m3_s = project.sanitary.per_capita_m3_s;
    o.peaking = project.sanitary.peaking_constant ? flows::Peaking::constant : flows::Peaking::harmon;
    o.peaking_constant = project.sanitary.peaking_constant.value_or(1.0);
    o.infiltration_per_length_m3_s_m = project.sanitary.infiltration_per_length_m3_s_m;
    o.infiltration_per_area_m3_s_m2 = project.sanitary.infiltration_per_area_m3_s_m2;
    cf = flows::sanitary_along_tree(net, run.topology, local, o, split, fixed);
    char per_capita[64];
    std::snprintf(per_capita, sizeof per_capita, "%.4g L/d (%.4g gpd)",
                  units::from_si(o.per_capita_m3_s, units::Unit::l_d),
                  units::from_si(o.per_capita_m3_s, units::Unit::gpd));
    cf.method = "Sanitary peak flow Q = PF q P + infiltration; q = " + std::string(per_capita) + " per person; PF " +
                (o.peaking == flows::Peaking::harmon ? std::string("Harmon 1 + 14/(4 + sqrt(P/1000))")
                                                     : "constant " + constant_text(o.peaking_constant));
  }
  run.catchment_flows = cf;
  return cf.flows;
}

std::vector<double> own_catchment_flows(const config::Project& project, const CheckRun& run) {
  const auto local = flows::local_inflows(run.read.network, run.catchments);
  std::vector<double> out(local.size(), 0.0);
  for (std::size_t s = 0; s < local.size(); ++s) {
    const auto& l = local[s];
    double q = l.inflow_m3_s;
    if (project.flow_mode == config::FlowMode::rational) {
      if (!std::isnan(l.inlet_time_s)) q += flows::idf_intensity(project.rational.idf, l.inlet_time_s).intensity_m_s * l.ca_m2;
    } else {
      const auto& sp = project.sanitary;
      const double pf = sp.peaking_constant ? *sp.peaking_constant : flows::harmon_peaking_factor(l.population);
      q += pf * sp.per_capita_m3_s * l.population + sp.infiltration_per_area_m3_s_m2.value_or(0.0) * l.area_m2;
    }
    out[s] = q;
  }
  return out;
}

}  // namespace rimline::run
