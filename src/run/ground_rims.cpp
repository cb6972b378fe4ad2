#include "run/ground_rims.hpp"

#include <algorithm>
#include <cmath>
#include <filesystem>

#include "rimline/gis/force_main_profile.hpp"
#include "rimline/topology/finding_text.hpp"

namespace rimline::run {

void apply_ground(const config::Project& project, model::Network& network, std::vector<std::string>& input_files,
                  Findings& findings) {
  const config::GroundSettings& g = project.ground;
  if (g.source.empty() || (!g.fill_rims && !g.compare_rims)) return;
  std::vector<model::Point2> at;
  at.reserve(network.structures.size());
  for (const auto& s : network.structures) at.push_back(s.location);
  const std::vector<double> ground = gis::sample_dem(g.source, g.metres_per_unit, network, at, g.band);
  if (std::find(input_files.begin(), input_files.end(), g.source) == input_files.end()) input_files.push_back(g.source);
  const std::string raster = std::filesystem::path(g.source).filename().string();
  const std::string how = raster + " (band " + std::to_string(g.band) + ", unit " +
                          topology::fixed(g.metres_per_unit, 4) + " m per raster unit, offset " +
                          q(g.offset_m, units::Dimension::length) + ")";
  const auto L = units::Dimension::length;
  for (std::size_t i = 0; i < network.structures.size(); ++i) {
    auto& s = network.structures[i];
    const double level = std::isfinite(ground[i]) ? ground[i] + g.offset_m : ground[i];
    if (!s.rim_m) {
      if (!g.fill_rims) continue;
      if (std::isfinite(level)) {
        s.rim_m = level;
        Finding f = topology::structure_finding(s, "RIM_FROM_GROUND", Severity::info,
                                                "structure " + s.id + " has no rim; the ground level " + q(level, L) +
                                                    " there from " + how + " stands in for it");
        f.value = level;
        f.dimension = L;
        findings.push_back(std::move(f));
      } else {
        findings.push_back(topology::structure_finding(
            s, "GROUND_NOT_COVERED", Severity::info,
            "structure " + s.id + " has no rim and the ground raster " + raster +
                " does not cover it (outside the raster, or no-data there); its rim stays unknown"));
      }
      continue;
    }
    if (!g.compare_rims || !std::isfinite(level)) continue;
    const double diff = *s.rim_m - level;
    if (std::abs(diff) <= g.rim_tolerance_m) continue;
    std::string cause;
    if (*s.rim_m > 0.5 && level > 0.5 && std::abs(*s.rim_m / level / units::from_si(1.0, units::Unit::ft) - 1.0) < 0.02)
      cause = "; the rim looks like it is in ft";
    else if (*s.rim_m > 0.5 && level > 0.5 && std::abs(level / *s.rim_m / units::from_si(1.0, units::Unit::ft) - 1.0) < 0.02)
      cause = "; the raster looks like it is in ft (ground.unit)";
    Finding f = topology::structure_finding(
        s, "RIM_GROUND_MISMATCH", Severity::warning,
        "the rim of structure " + s.id + " (" + q(*s.rim_m, L) + ") lies " + q(std::abs(diff), L) +
            (diff > 0.0 ? " above" : " below") + " the ground level " + q(level, L) + " from " + how +
            ", more than ground.rim_tolerance " + q(g.rim_tolerance_m, L) +
            ": a wrong rim, another datum (ground.offset) or a raster that misses the structure" + cause);
    f.field = project.structure_fields.rim.field;
    f.value = *s.rim_m;
    f.limit = level;
    f.dimension = L;
    findings.push_back(std::move(f));
  }
}

}  // namespace rimline::run
