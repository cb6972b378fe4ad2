#include "rimline/solve/structure_level.hpp"

#include <algorithm>
#include <cmath>

#include "rimline/error.hpp"
#include "rimline/hydraulics/section.hpp"
#include "rimline/solve/march.hpp"

namespace rimline::solve {

double outlet_level_m(const model::Structure& s, std::size_t index, bool wet_well, const MarchOptions& options,
                      double* tailwater_m) {
  if (wet_well) {
    // At its pump-on level the wet well backs water up into the incoming sewers; without one the
    // inflows discharge freely into it.
    const auto level = options.wet_well_level_m.find(index);
    return level != options.wet_well_level_m.end() ? level->second : free_outlet_level_m;
  }
  const double tw = s.tailwater_m ? *s.tailwater_m : options.tailwater_m;
  if (tailwater_m) *tailwater_m = tw;
  const bool use_tw = std::isfinite(tw) && options.tailwater_mode != TailwaterMode::free;
  return use_tw ? tw : free_outlet_level_m;
}

double structure_k(const model::Structure& s, const MarchOptions& options) {
  if (s.loss_k) return *s.loss_k;
  const auto it = options.k_by_type.find(std::string(model::structure_kind_name(s.kind)));
  return it != options.k_by_type.end() ? it->second : options.default_k;
}

hydraulics::StructureEnergy structure_energy_at(const MarchOptions& options, std::size_t index) {
  if (options.loss_method == hydraulics::StructureLossMethod::hec22) return hydraulics::StructureEnergy::whole_loss;
  const auto it = options.structure_energy_at.find(index);
  return it != options.structure_energy_at.end() ? it->second : options.structure_energy;
}

hydraulics::StructureInflow structure_inflow(const model::Conduit& c, double flow_m3_s, double deflection_deg,
                                             double structure_invert_m) {
  hydraulics::StructureInflow f;
  f.flow_m3_s = std::isfinite(flow_m3_s) ? flow_m3_s : 0.0;
  f.diameter_m = hydraulics::rise_m(c.section);
  f.outlet_invert_m = c.invert_down_m.value_or(structure_invert_m);
  f.deflection_deg = std::isfinite(deflection_deg) ? deflection_deg : 0.0;
  if (c.section.diameter_m > 0.0 || c.section.width_m > 0.0) {
    const auto full = hydraulics::full_geometry(c.section);
    f.velocity_m_s = f.flow_m3_s / full.area_m2;
  }
  return f;
}

hydraulics::StructureLossInputs structure_loss_inputs(const model::Network& network, const MarchOptions& options,
                                                      std::size_t structure, std::size_t outflow,
                                                      double outflow_flow_m3_s,
                                                      const hydraulics::ProfilePoint& inlet,
                                                      std::vector<hydraulics::StructureInflow> inflows) {
  const auto& st = network.structures[structure];
  const auto& oc = network.conduits[outflow];
  hydraulics::StructureLossInputs in;
  in.k_constant = structure_k(st, options);
  in.outflow_velocity_m_s = inlet.velocity_m_s;
  in.outflow_flow_m3_s = outflow_flow_m3_s;
  in.outflow_diameter_m = hydraulics::rise_m(oc.section);
  in.outflow_depth_m = inlet.depth_m;
  in.structure_diameter_m = st.diameter_m.value_or(options.default_structure_diameter_m);
  in.structure_invert_m = st.invert_m.value_or(inlet.invert_m);
  in.water_level_m = inlet.egl_m;
  in.benching = options.benching;
  in.inflows = std::move(inflows);
  std::stable_sort(in.inflows.begin(), in.inflows.end(),
                   [](const auto& a, const auto& b) { return a.flow_m3_s > b.flow_m3_s; });
  return in;
}

hydraulics::StructureLoss structure_loss_for(const MarchOptions& options, const hydraulics::StructureLossInputs& in,
                                             std::string* fallback_reason) {
  if (in.outflow_velocity_m_s <= 0.0) return {};
  try {
    return hydraulics::structure_loss(options.loss_method, in);
  } catch (const Error& e) {
    // The chosen method cannot be applied here (e.g. no inflow for HEC-22): fall back to K.
    if (fallback_reason) *fallback_reason = e.what();
    return hydraulics::structure_loss(hydraulics::StructureLossMethod::constant_k, in);
  }
}

}  // namespace rimline::solve
