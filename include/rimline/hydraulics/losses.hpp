#pragma once
// Point (minor) losses as K V^2/2g, and the structure-loss methods applied at junctions.
#include <string>
#include <string_view>
#include <vector>

namespace rimline::hydraulics {

double velocity_head_m(double velocity_m_s);  // V^2 / 2g

// Borda-Carnot sudden expansion loss (V1 - V2)^2 / 2g.
double expansion_loss_m(double velocity_up_m_s, double velocity_down_m_s);
// Sudden contraction K (on the downstream velocity) for area ratio A2/A1 in (0, 1].
double contraction_k(double area_ratio);
// Bend K by deflection angle [deg] at a structure (0 = straight through). Table cited in the .cpp.
double bend_k(double deflection_deg);

// Entrance from a structure or reservoir into a conduit, K on the conduit velocity.
enum class Entrance { square_edged, projecting, rounded, bell_mouth };
double entrance_k(Entrance e);
// Exit into a structure or reservoir: the velocity head above the receiving velocity is lost (K = 1).
double exit_loss_m(double velocity_m_s, double receiving_velocity_m_s = 0.0);

// Approximate constant K by structure type and deflection (0 = straight run), applied on the
// outflow velocity head; table cited in the .cpp.
enum class StructureKind { access_hole, inlet };
double structure_type_k(StructureKind kind, double deflection_deg);

enum class StructureLossMethod { constant_k, bend, hec22 };
std::string_view structure_loss_method_name(StructureLossMethod m);

// How a structure's loss is booked against the pipes arriving there (the structure's water level is
// its energy level either way: the velocity in a structure is taken as negligible).
//   whole_loss: h = K V_o^2/2g is the whole loss of energy across the structure, as the published
//               manhole and junction K values are defined: the EGL at each arriving pipe's outlet is
//               the EGL at the outflow pipe's inlet plus h, and the pipe keeps its velocity head.
//   still_pool: the structure is a still pool at the outflow pipe's inlet EGL plus h, and that is
//               each arriving pipe's HGL at its outlet: its velocity head is lost in the pool as well
//               (conservative; some agencies ask for it).
enum class StructureEnergy { whole_loss, still_pool };
std::string_view structure_energy_name(StructureEnergy e);  // "whole_loss" | "still_pool"

enum class Benching { flat, half, full };

struct StructureInflow {
  double flow_m3_s = 0.0;
  double velocity_m_s = 0.0;
  double diameter_m = 0.0;       // rise of the inflow pipe
  double outlet_invert_m = 0.0;  // inflow pipe invert where it enters the structure
  double deflection_deg = 0.0;   // angle between this inflow and the outflow direction (0 = straight)
};

struct StructureLossInputs {
  double k_constant = 0.0;              // constant_k method, and the base K of the bend method
  double outflow_velocity_m_s = 0.0;    // at the outflow pipe's inlet
  double outflow_flow_m3_s = 0.0;
  double outflow_diameter_m = 0.0;
  double outflow_depth_m = 0.0;         // depth at the outflow pipe's inlet (HEC-22 depth correction)
  double structure_diameter_m = 1.2;    // access-hole inside diameter b
  double structure_invert_m = 0.0;      // invert of the outflow pipe at the structure
  double water_level_m = 0.0;           // first estimate of the structure water level (plunging check;
                                        // HEC-22 d_aho = water_level_m - structure_invert_m when above it)
  Benching benching = Benching::flat;
  std::vector<StructureInflow> inflows; // the main (largest flow) inflow first
};

struct LossTerm {
  std::string_view name;  // "K_o", "C_Q", ...: a literal of structure_loss (no copy per structure)
  double value = 0.0;
};

struct StructureLoss {
  double loss_m = 0.0;       // head loss applied on the outflow velocity head
  double k_effective = 0.0;  // loss_m / (V_o^2 / 2g)
  std::vector<LossTerm> terms;
};

// Head loss at the structure for the chosen method, applied between the outflow pipe's
// inlet EGL and the structure water level. Throws rimline::Error(bad_argument) for bad inputs.
StructureLoss structure_loss(StructureLossMethod method, const StructureLossInputs& in);

}  // namespace rimline::hydraulics
