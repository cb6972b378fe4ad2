// Travel time through a pipe for the Rational Method's time of concentration.
#include <cmath>

#include "rimline/flows/catchment_flows.hpp"
#include "rimline/hydraulics/depth.hpp"
#include "rimline/hydraulics/friction.hpp"
#include "rimline/hydraulics/section.hpp"

namespace rimline::flows {
namespace {

void note(Findings& findings, const model::Conduit& c, const std::string& why) {
  findings.push_back({"TRAVEL_VELOCITY", Severity::info, LayerRole::conduits, c.id, "",
                      std::numeric_limits<double>::quiet_NaN(), std::numeric_limits<double>::quiet_NaN(),
                      units::Dimension::dimensionless, "pipe " + c.id + ": " + why});
  findings.back().fid = c.fid;
}

}  // namespace

TravelTimeFn velocity_travel_time(const model::Network& network, TravelVelocity velocity, Findings& findings) {
  return [&network, velocity, &findings](std::size_t ci, double flow_m3_s, PipeDesign& p) -> double {
    const auto& c = network.conduits[ci];
    if (!(c.invert_up_m && c.invert_down_m && c.length_m > 0.0)) {
      note(findings, c,
           "no slope without both inverts; its travel time is taken as 0 (a shorter Tc, a higher intensity).");
      return 0.0;
    }
    const double slope = (*c.invert_up_m - *c.invert_down_m) / c.length_m;
    if (!(slope > 0.0)) {
      note(findings, c, "the slope is not positive, so no gravity velocity; its travel time is taken as 0.");
      return 0.0;
    }
    double v = std::numeric_limits<double>::quiet_NaN();
    try {
      if (velocity == TravelVelocity::normal_depth && flow_m3_s > 0.0) {
        const auto y = hydraulics::normal_depth(c.roughness, c.section, flow_m3_s, slope);
        if (y.exists && y.converged) {
          v = flow_m3_s / hydraulics::geometry_at(c.section, y.depth_m).area_m2;
        } else {
          note(findings, c,
               "no normal depth for " + q(flow_m3_s, units::Dimension::flow) +
                   " (above the partly-full peak); the full-flow velocity gives its travel time.");
        }
      }
      if (!(v > 0.0)) v = hydraulics::full_velocity_m_s(c.roughness, c.section, slope);
    } catch (const std::exception&) {
      v = std::numeric_limits<double>::quiet_NaN();
    }
    if (!(std::isfinite(v) && v > 0.0)) {
      note(findings, c, "no velocity from its section and roughness; its travel time is taken as 0.");
      return 0.0;
    }
    p.travel_velocity_m_s = v;
    return c.length_m / v;
  };
}

}  // namespace rimline::flows
