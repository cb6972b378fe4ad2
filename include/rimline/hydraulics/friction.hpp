#pragma once
// Friction laws for full and partly full flow. SI throughout.
//   Manning:            V = (1/n) R^(2/3) S^(1/2)                       (SI form; US form uses 1.486)
//   Darcy-Weisbach:     S = f/(4R) V^2/(2g), f from Colebrook-White with D_h = 4R
//   Hazen-Williams:     V = 0.849 C R^0.63 S^0.54                         (SI form; pressure mains)
#include "rimline/hydraulics/section.hpp"

namespace rimline::hydraulics {

enum class FrictionLaw { manning, darcy_weisbach, hazen_williams };
std::string_view friction_law_name(FrictionLaw f);

struct Roughness {
  FrictionLaw law = FrictionLaw::manning;
  double manning_n = 0.013;               // s/m^(1/3)
  double ks_m = 0.6e-3;                   // equivalent sand roughness [m] (Darcy-Weisbach)
  double hazen_c = 120.0;                 // Hazen-Williams C
  double kinematic_viscosity_m2_s = 1.004e-6;  // water at 20 degC
};

// Throws rimline::Error(bad_argument) for non-positive / non-finite parameters of the chosen law.
void validate(const Roughness& r);

// Kinematic viscosity of water [m^2/s] at temperature [degC], 0..100 degC (source cited in the .cpp).
double water_kinematic_viscosity_m2_s(double temperature_c);

// Darcy friction factor: laminar 64/Re below Re = 2000; Colebrook-White above (iterated to
// |delta f| < 1e-10 relative, at most 50 iterations; transition zone 2000..4000 interpolated).
double darcy_friction_factor(double reynolds, double relative_roughness);

// Friction slope Sf [m/m] for flow Q at depth y in the section (y >= rise: full section).
double friction_slope(const Roughness& r, const Section& s, double flow_m3_s, double depth_m);
double full_friction_slope(const Roughness& r, const Section& s, double flow_m3_s);

// Full-flow capacity [m^3/s] at slope S (> 0) and full-flow velocity [m/s].
double full_capacity_m3_s(const Roughness& r, const Section& s, double slope);
double full_velocity_m_s(const Roughness& r, const Section& s, double slope);
// Discharge at depth y and slope S under uniform flow (conveyance * sqrt(S)).
double uniform_flow_m3_s(const Roughness& r, const Section& s, double depth_m, double slope);

// Manning's equation alone. The US customary form carries 1.486 ~ (1 m / 0.3048 m)^(1/3), so one n
// serves both unit systems (R in ft, V in ft/s there).
inline constexpr double manning_us_factor = 1.486;
double manning_velocity_m_s(double manning_n, double hydraulic_radius_m, double slope);
double manning_velocity_us_ft_s(double manning_n, double hydraulic_radius_ft, double slope);

}  // namespace rimline::hydraulics
