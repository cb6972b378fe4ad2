#pragma once
// Water-surface profile along one closed conduit: gradually varied flow by a step method
// (step count set by accuracy), surcharged (pressure) reaches, free outlets, hydraulic jumps.
#include <limits>
#include <optional>
#include <string>
#include <vector>

#include "rimline/optional_double.hpp"

#include "rimline/hydraulics/depth.hpp"

namespace rimline::hydraulics {

struct ConduitReach {
  Section section;
  Roughness roughness;
  double length_m = 0.0;       // plan length along the pipe (> 0)
  double invert_up_m = 0.0;    // inlet invert elevation
  double invert_down_m = 0.0;  // outlet invert elevation (may be above invert_up: adverse)
  double flow_m3_s = 0.0;      // >= 0; 0 gives a still (level-pool or dry) pipe
};

enum class Regime { dry, subcritical, supercritical, mixed, pressurized, partly_pressurized };
std::string_view regime_name(Regime r);

// What set the water level at the conduit's upstream end.
enum class Governs {
  outlet_water_level,   // backwater from the downstream structure / tailwater (subcritical)
  critical_depth_outlet,  // free outlet or drop: critical depth at the outlet, M2 upstream
  normal_depth,         // long enough that uniform flow is reached upstream
  inlet_control,        // steep: critical depth at the inlet, supercritical downstream
  surcharge,            // full (pressure) flow reaching the inlet
  still_water           // no flow
};
std::string_view governs_name(Governs g);

struct ProfilePoint {
  double station_m = 0.0;  // distance from the outlet end, increasing upstream (0 = outlet)
  double invert_m = 0.0;
  double depth_m = 0.0;    // capped at the rise when full
  double hgl_m = 0.0;      // water surface, or pressure head + elevation when full
  double egl_m = 0.0;      // hgl + V^2/2g
  double velocity_m_s = 0.0;
  double froude = 0.0;     // 0 when full or still
  // The two small members last: 64 bytes a point instead of 72 (a city's run keeps ~3.5 M points).
  bool full = false;
  Regime regime = Regime::subcritical;  // per point: dry, subcritical (Fr <= 1), supercritical, pressurized
};

struct GvfOptions {
  // Accuracy target per step [m]: the estimated local depth error of the standard step (Milne's
  // device on an Adams-Bashforth predictor of the energy head) must stay below this. The energy
  // equation itself is closed to ~1e-10 of the depth, so EGL = HGL + V^2/2g and the friction
  // balance hold to round-off. With the defaults, profiles agree with a fine RK4 integration to
  // better than 0.3 mm over 100 m (tests/unit/hydraulics/gvf_rk_crosscheck_test.cpp).
  double depth_tolerance_m = 1.0e-4;
  double max_depth_change_m = 0.0;    // 0: auto (2% of the rise) - limits step size for accuracy
  int max_steps = 4000;
  // Optional supercritical control at the inlet (flow arriving from a steep pipe or under a gate):
  // a depth below critical starts an M3/S3/H3/A3 (or S2) curve downstream. NaN: none, the inlet
  // is a free entrance (critical depth governs there on steep slopes).
  double inlet_supercritical_depth_m = std::numeric_limits<double>::quiet_NaN();
};

struct ConduitProfile {
  std::vector<ProfilePoint> points;  // outlet (station 0) first, inlet (station = length) last
  Regime regime = Regime::subcritical;
  Governs governs = Governs::outlet_water_level;
  std::string profile_class;         // e.g. "M1", "M2", "S2", "S2-jump-S1", "full", "M1-full": reaches
                                     // in flow order (inlet first); "uniform" at normal depth, "still", "dry"
  double normal_depth_m = 0.0;       // NaN when none (adverse/horizontal, or Q above peak)
  double critical_depth_m = 0.0;     // rise when above the rise
  double surcharged_length_m = 0.0;
  OptionalDouble jump_station_m;
  double jump_loss_m = 0.0;          // energy lost in the jump (EGL step at jump_station_m)
  int steps = 0;                     // accepted step-method steps
  bool free_outlet = false;          // downstream level below outlet invert + critical depth
  bool converged = true;
  std::string note;                  // non-convergence or other caveat, one sentence

  const ProfilePoint& outlet() const { return points.front(); }
  const ProfilePoint& inlet() const { return points.back(); }
};

// downstream_level_m: water level (HGL) in the structure or tailwater the conduit discharges into.
// Controls: the subcritical branch is marched upstream from the outlet (the tailwater, critical
// depth when the tailwater is below it, or pressure flow from a tailwater above the crown); on a
// steep conduit the supercritical branch is marched downstream from critical depth at the inlet
// (or from GvfOptions::inlet_supercritical_depth_m), and a jump joins them where the specific
// forces balance. Flow above the full-flow capacity at the bed slope runs surcharged throughout.
// On a near-critical slope (normal depth within 1 % of critical) the supercritical reach is taken
// at normal depth and the note says so; the friction balance then holds only approximately.
// Throws rimline::Error(bad_argument) for invalid reach data (non-positive length, bad section...).
ConduitProfile compute_profile(const ConduitReach& reach, double downstream_level_m, const GvfOptions& options = {});

// The same with the outlet's energy level (EGL) given instead of the water level it discharges
// into: used where a structure loss is the whole loss of energy across the structure, so the pipe
// keeps its velocity head to the outlet. The outlet depth is the subcritical root of
// y + V(y)^2/2g = E - invert; at or above the full-pipe energy the outlet runs full with
// HGL = E - V_full^2/2g; below the critical energy critical depth governs there (free_outlet: the
// pipe falls freely into the structure and the outlet EGL stands above the given one).
ConduitProfile compute_profile_to_energy(const ConduitReach& reach, double downstream_energy_m,
                                         const GvfOptions& options = {});

}  // namespace rimline::hydraulics
