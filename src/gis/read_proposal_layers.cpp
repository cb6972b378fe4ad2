#include "gis/read_proposal_layers.hpp"

#include <limits>
#include <unordered_set>

#include "gis/gdal_source.hpp"
#include "gis/read_layers.hpp"

namespace rimline::gis::detail {
namespace {

// "the proposal's new_pipes layer new-pipes.geojson (layer \"x\", from proposal.toml)"
std::string where_from(const Project& project, const LayerSource& src, const char* key) {
  std::string s = "the proposal's " + std::string(key) + " layer " + src.source;
  if (!src.layer.empty()) s += " (layer \"" + src.layer + "\")";
  if (!project.proposal_file.empty()) s += ", named in " + project.proposal_file;
  return s;
}

// The findings from `first` on come from that layer: their messages say so.
void name_the_layer(Findings& findings, std::size_t first, const std::string& from) {
  for (std::size_t k = first; k < findings.size(); ++k) findings[k].message = "In " + from + ": " + findings[k].message;
}

// Features whose id the network already has are left out with an error naming the feature.
template <typename Feature>
void append_new(std::vector<Feature>& read, std::vector<Feature>& into, std::unordered_set<std::string>& ids,
                LayerRole layer, const char* what, const std::string& from, Findings& findings) {
  constexpr double nan = std::numeric_limits<double>::quiet_NaN();
  for (auto& f : read) {
    if (!f.id.empty() && !ids.insert(f.id).second) {
      Finding bad{"PROPOSAL_ID_TAKEN", Severity::error, layer, f.id, "", nan, nan, units::Dimension::dimensionless,
                  "In " + from + ": the new " + what + " " + f.id + " has the id of a " + what +
                      " the network already has; it is left out (give it an id of its own)."};
      bad.fid = f.fid;
      findings.push_back(std::move(bad));
      continue;
    }
    f.proposed = true;
    into.push_back(std::move(f));
  }
}

// One of the proposal's layers, read with `check` and `read` (the export's own pipe or structure
// reader and mapping check) and appended to `into`.
template <typename Feature, typename Check, typename Read>
void read_new_layer(const Project& project, const LayerSource& src, const char* key, const RunCrs& crs,
                    DefaultTally& defaults, ReadResult& result, Check check, Read read, std::vector<Feature>& into,
                    LayerRole layer_role, const char* what) {
  const std::string from = where_from(project, src, key);
  const std::string role = std::string("proposal.") + key;
  OpenLayer layer = open_layer(src, role);
  require_geometry_and_features(layer, role);
  check(project, layer);
  const TransformPtr to_run = transform_into_run(layer, crs, project.crs_override);
  const std::size_t first = result.findings.size();
  std::vector<Feature> features;
  LayerRead in{project, layer, Placement{to_run.get(), crs.metres_per_unit, crs.z_metres_per_unit}, result.findings,
               defaults};
  read(in, features);
  name_the_layer(result.findings, first, from);
  std::unordered_set<std::string> ids;
  for (const auto& f : into) ids.insert(f.id);
  append_new(features, into, ids, layer_role, what, from, result.findings);
  add_input_files(result.input_files, result.read_hashes, layer);
}

}  // namespace

void read_proposal_layers(const Project& project, const RunCrs& crs, DefaultTally& defaults, ReadResult& result) {
  if (!project.proposal_structures.source.empty())
    read_new_layer(project, project.proposal_structures, "new_structures", crs, defaults, result,
                   check_structure_mapping, read_structures, result.network.structures, LayerRole::structures,
                   "structure");
  if (!project.proposal_pipes.source.empty())
    read_new_layer(project, project.proposal_pipes, "new_pipes", crs, defaults, result, check_pipe_mapping,
                   read_pipes, result.network.conduits, LayerRole::conduits, "pipe");
}

}  // namespace rimline::gis::detail
