#pragma once
// The level a structure holds for water to leave it through one outflow pipe: the one relation
// between a structure and its pipes that the march and the network solve share, so that the two
// engines cannot disagree about it.
//
// Still-pool bookkeeping (the march's, see march.hpp): the structure's water level (HGL = EGL in
// the structure) is the EGL at the outflow pipe's inlet plus the structure loss on the outflow
// velocity head; that level is the downstream water level of every pipe discharging into it.
#include <cstddef>
#include <string>
#include <vector>

#include "rimline/hydraulics/gvf.hpp"
#include "rimline/hydraulics/losses.hpp"
#include "rimline/model/network.hpp"

namespace rimline::solve {

struct MarchOptions;

// A level far below any invert: pipes discharging into it fall freely (free outfall, a wet well
// without a pump-on level).
inline constexpr double free_outlet_level_m = -1.0e6;

// The water level at an outlet of the gravity network that the pipes discharge into: a pump wet
// well's pump-on level, an outfall's tailwater (its own field, else the run's) unless the
// tailwater mode is free; free_outlet_level_m where neither applies. `tailwater_m` (optional)
// receives the outfall's tailwater as read (NaN: none).
double outlet_level_m(const model::Structure& structure, std::size_t index, bool wet_well, const MarchOptions& options,
                      double* tailwater_m = nullptr);

// A structure's constant K: its own (field), else the one for its kind, else the default.
double structure_k(const model::Structure& structure, const MarchOptions& options);

// One pipe arriving at a structure, as the loss methods see it.
hydraulics::StructureInflow structure_inflow(const model::Conduit& conduit, double flow_m3_s, double deflection_deg,
                                             double structure_invert_m);

// The inputs of the structure loss at `structure` for the outflow `outflow` (its inlet point from
// the outflow's profile at flow `outflow_flow_m3_s`); `inflows` are the pipes arriving, any order
// (the largest flow is put first, as the methods expect).
hydraulics::StructureLossInputs structure_loss_inputs(const model::Network& network, const MarchOptions& options,
                                                      std::size_t structure, std::size_t outflow,
                                                      double outflow_flow_m3_s,
                                                      const hydraulics::ProfilePoint& outflow_inlet,
                                                      std::vector<hydraulics::StructureInflow> inflows);

// The structure loss for those inputs by the run's method; `fallback_reason` is set (and the
// constant K used) when the method cannot be applied there. No loss without outflow velocity.
hydraulics::StructureLoss structure_loss_for(const MarchOptions& options, const hydraulics::StructureLossInputs& in,
                                             std::string* fallback_reason);

// How the energy at structure `index` is kept (the run's choice, per structure where given; HEC-22
// takes the whole loss across the structure).
hydraulics::StructureEnergy structure_energy_at(const MarchOptions& options, std::size_t index);

// Still pool: the structure level for one outflow is its inlet EGL plus the loss.
inline double structure_level_for_outflow(const hydraulics::ProfilePoint& outflow_inlet,
                                          const hydraulics::StructureLoss& loss) {
  return outflow_inlet.egl_m + loss.loss_m;
}

// The water level a pipe discharging into a structure at level `structure_level_m` sees at its
// outlet (still pool: the structure level itself; its velocity head is spent in the pool).
inline double downstream_level_of_inflow(double structure_level_m) { return structure_level_m; }

}  // namespace rimline::solve
