// Structure (junction) losses on the outflow velocity head: constant K, bend, and the HEC-22
// access-hole energy-loss method.
//
// HEC-22 method as given in FHWA HEC-22 Urban Drainage Design Manual, 2nd ed. (2001), sec. 7.1.6,
// implemented FROM MEMORY, not from the document at hand:
//   K   = K_o C_D C_d C_Q C_p C_B,   h = K V_o^2 / 2g
//   K_o = 0.1 (b/D_o)(1 - sin t) + 1.4 (b/D_o)^0.15 sin t   t: angle between main inflow and outflow
//                                                            (180 deg = straight through)
//   C_D = (D_o / D_i)^3                                      D_i: main inflow pipe diameter
//   C_d = 0.5 (d_aho / D_o)^0.6 for d_aho / D_o < 3.2, else 1 (d_aho: water depth in the access hole
//                                                            above the outflow invert)
//   C_Q = (1 - 2 sin t)(1 - Q_i/Q_o)^0.75 + 1 with three or more pipes, else 1
//   C_p = 1 + 0.2 (h/D_o)((h - d_aho)/D_o) for a plunging inflow (h > d_aho), else 1; h: height
//         of the highest plunging inflow's invert above the outflow pipe's centre line
//   C_B from the benching table (submerged d_aho/D_o > 3.2 | unsubmerged d_aho/D_o < 1.0,
//         linear in between): flat 1.00 | 1.00, half bench 0.95 | 0.15, full bench 0.75 | 0.07.
#include <algorithm>
#include <cmath>
#include <numbers>
#include <string>

#include "rimline/error.hpp"
#include "rimline/hydraulics/losses.hpp"

namespace rimline::hydraulics {

namespace {
void require_non_negative(double v, const std::string& what) {
  if (!std::isfinite(v) || v < 0.0) throw Error(ErrorKind::bad_argument, what + " must be zero or positive and finite, got " + std::to_string(v));
}
void require_positive(double v, const std::string& what) {
  if (!std::isfinite(v) || v <= 0.0) throw Error(ErrorKind::bad_argument, what + " must be positive and finite, got " + std::to_string(v));
}

double benching_factor(Benching b, double relative_depth) {
  double submerged = 1.0, unsubmerged = 1.0;
  if (b == Benching::half) {
    submerged = 0.95;
    unsubmerged = 0.15;
  } else if (b == Benching::full) {
    submerged = 0.75;
    unsubmerged = 0.07;
  }
  const double w = std::clamp((relative_depth - 1.0) / (3.2 - 1.0), 0.0, 1.0);
  return unsubmerged + w * (submerged - unsubmerged);
}

StructureLoss hec22(const StructureLossInputs& in) {
  require_positive(in.outflow_diameter_m, "outflow pipe diameter");
  require_positive(in.structure_diameter_m, "access-hole diameter");
  require_positive(in.outflow_flow_m3_s, "outflow discharge");
  require_non_negative(in.outflow_depth_m, "outflow depth");
  if (!std::isfinite(in.water_level_m) || !std::isfinite(in.structure_invert_m))
    throw Error(ErrorKind::bad_argument, "structure water level and invert must be finite");
  const double d_o = in.outflow_diameter_m, b = in.structure_diameter_m;
  const double d_aho = in.water_level_m > in.structure_invert_m ? in.water_level_m - in.structure_invert_m : in.outflow_depth_m;
  const double rel = d_aho / d_o;

  double theta_rad = std::numbers::pi;  // no inflow pipe: treated as straight through (rimline's choice)
  double c_diameter = 1.0, c_flow = 1.0, c_plunge = 1.0;
  if (!in.inflows.empty()) {
    const StructureInflow& main = in.inflows.front();
    require_positive(main.diameter_m, "main inflow pipe diameter");
    if (!std::isfinite(main.deflection_deg) || main.deflection_deg < 0.0 || main.deflection_deg > 180.0)
      throw Error(ErrorKind::bad_argument, "inflow deflection must be within 0..180 degrees, got " + std::to_string(main.deflection_deg));
    theta_rad = (180.0 - main.deflection_deg) * std::numbers::pi / 180.0;
    c_diameter = std::pow(d_o / main.diameter_m, 3.0);
    if (in.inflows.size() >= 2) {
      require_non_negative(main.flow_m3_s, "main inflow discharge");
      const double share = std::clamp(main.flow_m3_s / in.outflow_flow_m3_s, 0.0, 1.0);
      c_flow = (1.0 - 2.0 * std::sin(theta_rad)) * std::pow(1.0 - share, 0.75) + 1.0;
    }
    double h_plunge = -1.0;
    for (const StructureInflow& inflow : in.inflows) {
      if (!std::isfinite(inflow.outlet_invert_m)) throw Error(ErrorKind::bad_argument, "inflow invert must be finite");
      h_plunge = std::max(h_plunge, inflow.outlet_invert_m - (in.structure_invert_m + 0.5 * d_o));
    }
    if (h_plunge > d_aho) c_plunge = 1.0 + 0.2 * (h_plunge / d_o) * ((h_plunge - d_aho) / d_o);
  }
  const double sin_t = std::sin(theta_rad);
  const double k_o = 0.1 * (b / d_o) * (1.0 - sin_t) + 1.4 * std::pow(b / d_o, 0.15) * sin_t;
  const double c_depth = rel < 3.2 ? 0.5 * std::pow(rel, 0.6) : 1.0;
  const double c_bench = benching_factor(in.benching, rel);

  StructureLoss out;
  out.k_effective = k_o * c_diameter * c_depth * c_flow * c_plunge * c_bench;
  out.loss_m = out.k_effective * velocity_head_m(in.outflow_velocity_m_s);
  out.terms = {{"K_o", k_o}, {"C_D", c_diameter}, {"C_d", c_depth}, {"C_Q", c_flow}, {"C_p", c_plunge}, {"C_B", c_bench}};
  return out;
}
}  // namespace

StructureLoss structure_loss(StructureLossMethod method, const StructureLossInputs& in) {
  require_non_negative(in.outflow_velocity_m_s, "outflow velocity");
  StructureLoss out;
  switch (method) {
    case StructureLossMethod::constant_k:
      require_non_negative(in.k_constant, "structure loss coefficient K");
      out.k_effective = in.k_constant;
      out.terms = {{"K", in.k_constant}};
      break;
    case StructureLossMethod::bend: {
      // The base K of a straight-through structure plus the extra loss of the main inflow's
      // deflection (bend_k above its straight-run value).
      require_non_negative(in.k_constant, "structure loss coefficient K");
      const double deflection = in.inflows.empty() ? 0.0 : in.inflows.front().deflection_deg;
      const double extra = bend_k(deflection) - bend_k(0.0);
      out.k_effective = in.k_constant + extra;
      out.terms = {{"K_base", in.k_constant}, {"K_bend", extra}};
      break;
    }
    case StructureLossMethod::hec22: return hec22(in);
  }
  out.loss_m = out.k_effective * velocity_head_m(in.outflow_velocity_m_s);
  return out;
}

}  // namespace rimline::hydraulics
