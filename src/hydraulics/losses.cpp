// Point (minor) losses h = K V^2/2g.
#include "rimline/hydraulics/losses.hpp"

#include <array>
#include <cmath>
#include <string>
#include <utility>

#include "rimline/error.hpp"
#include "rimline/units.hpp"

namespace rimline::hydraulics {

namespace {
void require_finite(double v, const std::string& what) {
  if (!std::isfinite(v)) throw Error(ErrorKind::bad_argument, what + " must be finite, got " + std::to_string(v));
}

void require_angle(double deg) {
  if (!std::isfinite(deg) || deg < 0.0 || deg > 180.0)
    throw Error(ErrorKind::bad_argument, "deflection angle must be within 0..180 degrees, got " + std::to_string(deg));
}

// Linear interpolation in a table of (deflection, K); held at the last value beyond it.
template <std::size_t N>
double interpolate(const std::array<std::pair<double, double>, N>& table, double deg) {
  if (deg >= table.back().first) return table.back().second;
  for (std::size_t i = 1; i < N; ++i) {
    if (deg <= table[i].first) {
      const auto [x0, k0] = table[i - 1];
      const auto [x1, k1] = table[i];
      return k0 + (k1 - k0) * (deg - x0) / (x1 - x0);
    }
  }
  return table.back().second;
}

// HEC-22 (FHWA Urban Drainage Design Manual, 2nd ed. 2001), Table 7-5, approximate head-loss
// coefficients on the outflow velocity head (from memory): access hole straight run 0.15,
// angled through 22.5 / 45 / 60 / 90 degrees 0.45 / 0.75 / 0.85 / 1.00; inlet straight run 0.50,
// angled 0.70 / 1.10 / 1.25 / 1.50. Deflections beyond 90 degrees keep the 90-degree value.
constexpr std::array<std::pair<double, double>, 5> access_hole_k{{{0.0, 0.15}, {22.5, 0.45}, {45.0, 0.75}, {60.0, 0.85}, {90.0, 1.00}}};
constexpr std::array<std::pair<double, double>, 5> inlet_k{{{0.0, 0.50}, {22.5, 0.70}, {45.0, 1.10}, {60.0, 1.25}, {90.0, 1.50}}};
}  // namespace

double velocity_head_m(double velocity_m_s) {
  require_finite(velocity_m_s, "velocity");
  return velocity_m_s * velocity_m_s / (2.0 * units::gravity_m_s2);
}

// Borda-Carnot: momentum balance across a sudden enlargement. A deceleration only; an
// acceleration (V2 > V1) is a contraction and has no Borda-Carnot loss.
double expansion_loss_m(double velocity_up_m_s, double velocity_down_m_s) {
  require_finite(velocity_up_m_s, "upstream velocity");
  require_finite(velocity_down_m_s, "downstream velocity");
  const double dv = std::fabs(velocity_up_m_s) - std::fabs(velocity_down_m_s);
  return dv > 0.0 ? velocity_head_m(dv) : 0.0;
}

// K = 0.5 (1 - A2/A1) on the downstream velocity: 0.5 for a square entrance from a large
// chamber, 0 for no change of area (common practice, no source; a widely quoted approximation).
double contraction_k(double area_ratio) {
  if (!std::isfinite(area_ratio) || area_ratio <= 0.0 || area_ratio > 1.0)
    throw Error(ErrorKind::bad_argument, "contraction area ratio A2/A1 must be within (0, 1], got " + std::to_string(area_ratio));
  return 0.5 * (1.0 - area_ratio);
}

double bend_k(double deflection_deg) {
  require_angle(deflection_deg);
  return interpolate(access_hole_k, deflection_deg);
}

double structure_type_k(StructureKind kind, double deflection_deg) {
  require_angle(deflection_deg);
  return interpolate(kind == StructureKind::inlet ? inlet_k : access_hole_k, deflection_deg);
}

// Entrance coefficients as tabulated in standard fluid-mechanics references (from memory):
// square-edged flush 0.5, projecting (re-entrant) 0.8, rounded 0.2, bell-mouthed 0.04.
double entrance_k(Entrance e) {
  switch (e) {
    case Entrance::square_edged: return 0.5;
    case Entrance::projecting: return 0.8;
    case Entrance::rounded: return 0.2;
    case Entrance::bell_mouth: return 0.04;
  }
  return 0.5;
}

double exit_loss_m(double velocity_m_s, double receiving_velocity_m_s) {
  return expansion_loss_m(velocity_m_s, receiving_velocity_m_s);
}

std::string_view structure_energy_name(StructureEnergy e) {
  return e == StructureEnergy::still_pool ? "still_pool" : "whole_loss";
}

std::string_view structure_loss_method_name(StructureLossMethod m) {
  switch (m) {
    case StructureLossMethod::constant_k: return "constant_k";
    case StructureLossMethod::bend: return "bend";
    case StructureLossMethod::hec22: return "hec22";
  }
  return "constant_k";
}

}  // namespace rimline::hydraulics
