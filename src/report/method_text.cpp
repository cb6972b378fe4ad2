#include "report/method_text.hpp"

namespace rimline::report {

std::string structure_energy_id(const run::CheckRun& run) {
  if (run.march_options.loss_method == hydraulics::StructureLossMethod::hec22) return "hec22";
  return std::string(hydraulics::structure_energy_name(run.march_options.structure_energy));
}

std::string structure_energy_text(const run::CheckRun& run) {
  const std::string k =
      "K multiplies the velocity head V_o^2/2g at the inlet of the pipe leaving the structure (partly full or "
      "full, from its profile); the water level in a structure is its energy level E = EGL at that inlet + K "
      "V_o^2/2g (the velocity in a structure is taken as negligible). ";
  const std::string id = structure_energy_id(run);
  if (id == "hec22")
    return k + "HEC-22 (2nd ed. 2001, from memory) by its own definitions: K = K_o C_D C_d C_Q C_p C_B and "
               "H = K V_o^2/2g is the whole loss across the access hole, so each inflow pipe's EGL at its outlet is "
               "the access-hole energy level E and its HGL there E - V_i^2/2g.";
  if (id == "still_pool")
    return k + "Bookkeeping still_pool: the structure is a still pool; E is each arriving pipe's HGL at its outlet, "
               "so the arriving velocity head is lost in the pool as well ((1 + K) velocity heads across a "
               "straight-through structure).";
  return k + "Bookkeeping whole_loss: K V_o^2/2g is the whole energy loss across the structure, as tabulated K "
             "values are defined; each arriving pipe's EGL at its outlet is E, so its HGL there is E - V^2/2g "
             "(critical depth where E is below its critical energy: it falls freely into the structure).";
}

std::vector<std::pair<std::string, std::string>> structure_energy_exceptions(const run::CheckRun& run) {
  std::vector<std::pair<std::string, std::string>> out;
  if (run.march_options.loss_method == hydraulics::StructureLossMethod::hec22) return out;
  for (const auto& [s, e] : run.march_options.structure_energy_at)
    if (e != run.march_options.structure_energy)
      out.emplace_back(run.read.network.structures[s].id, std::string(hydraulics::structure_energy_name(e)));
  return out;
}

std::string velocity_rules_text(const run::CheckRun& run) {
  const bool full = run.criteria.velocity_basis == checks::VelocityBasis::full_flow;
  return std::string("VELOCITY_LOW compares ") +
         (full ? "the pipe's full-flow velocity at its slope (velocity_min_basis full_flow)"
               : "the velocity of the pipe's own design flow at normal depth (velocity_min_basis normal_depth; "
                 "a design flow above the partly-full peak fills the pipe: Q / A_full)") +
         " with the minimum; tailwater and surcharge play no part (a flat or adverse pipe, which has neither, "
         "takes the lower end velocity of the march). VELOCITY_HIGH compares the highest velocity anywhere along "
         "the pipe's profile, supercritical reaches included.";
}

std::vector<std::pair<std::string, std::string>> velocity_basis_exceptions(const run::CheckRun& run) {
  std::vector<std::pair<std::string, std::string>> out;
  for (const auto& [id, o] : run.overrides.conduits)
    if (o.velocity_basis && *o.velocity_basis != run.criteria.velocity_basis)
      out.emplace_back(id, std::string(checks::velocity_basis_name(*o.velocity_basis)));
  return out;
}

}  // namespace rimline::report
