#include "rimline/gis/read_network.hpp"

#include <algorithm>
#include <exception>
#include <iterator>
#include <thread>

#include "gis/read_catchments.hpp"
#include "gis/read_layers.hpp"
#include "gis/read_proposal_layers.hpp"
#include "gis/run_crs.hpp"

namespace rimline::gis {
namespace detail {

void GdalMessageSink::take(GdalErrorCapture& capture, const std::string& feature_id) {
  for (const auto& m : capture.messages()) {
    if (++seen_ > cap_) continue;
    Finding f;
    f.code = "DATA_SOURCE";
    f.severity = Severity::warning;
    f.layer = layer_;
    f.feature_id = feature_id;
    f.message = "GDAL reported: " + m.text;
    findings_.push_back(std::move(f));
  }
  capture.clear();
}

void GdalMessageSink::finish(GdalErrorCapture& capture) {
  take(capture, "");
  if (seen_ <= cap_) return;
  Finding f;
  f.code = "DATA_SOURCE";
  f.severity = Severity::warning;
  f.layer = layer_;
  f.message = "GDAL reported " + std::to_string(seen_ - cap_) + " more messages for this layer; they are not listed.";
  findings_.push_back(std::move(f));
}

// A separate line layer of force mains, read with the pipe mapping: every feature is a force main,
// and its data findings name the force_mains layer.
void read_force_main_layer(const Project& project, const RunCrs& crs, DefaultTally& defaults, ReadResult& result) {
  OpenLayer mains = open_layer(project.force_main_layer, "force_mains");
  require_geometry_and_features(mains, "force_mains");
  check_pipe_mapping(project, mains);
  const TransformPtr to_run = transform_into_run(mains, crs, project.crs_override);
  const std::size_t first_finding = result.findings.size();
  std::vector<model::Conduit> read;
  LayerRead main_read{project, mains, Placement{to_run.get(), crs.metres_per_unit, crs.z_metres_per_unit},
                      result.findings, defaults};
  read_pipes(main_read, read);
  for (std::size_t k = first_finding; k < result.findings.size(); ++k)
    if (result.findings[k].layer == LayerRole::conduits) result.findings[k].layer = LayerRole::force_mains;
  for (auto& c : read) {
    c.force_main = true;
    result.network.conduits.push_back(std::move(c));
  }
  add_input_files(result.input_files, result.read_hashes, mains);
}

}  // namespace detail

ReadResult read_network(const Project& project) {
  using namespace detail;
  ReadResult result;
  DefaultTally defaults;

  OpenLayer pipes = open_layer(project.pipes, "pipes");
  require_geometry_and_features(pipes, "pipes");
  check_pipe_mapping(project, pipes);
  RunCrs crs = plan_run_crs(pipes, project.crs_override);
  add_input_files(result.input_files, result.read_hashes, pipes);
  result.source_crs_wkt = crs.source_wkt;
  result.network.crs_description = crs.description;
  result.network.crs_wkt = crs.run_wkt;
  result.network.crs_note = crs.note;
  result.network.crs_metres_per_unit = crs.metres_per_unit;

  // The structures layer is read on its own thread beside the pipes (a city's export: a million
  // features each), with its own dataset handle, findings and tally, appended after the pipes'
  // so the result is the same as reading one after the other.
  Findings structure_findings;
  DefaultTally structure_defaults;
  std::vector<std::string> structure_files;  // added after the pipes' files, in the serial order
  std::vector<std::pair<std::string, std::string>> structure_hashes;
  std::exception_ptr structures_failed;
  std::thread structure_reader;
  if (!project.structures.source.empty())
    structure_reader = std::thread([&] {
      try {
        OpenLayer structures = open_layer(project.structures, "structures");
        require_geometry_and_features(structures, "structures");
        check_structure_mapping(project, structures);
        const TransformPtr to_run = transform_into_run(structures, crs, project.crs_override);
        LayerRead structure_read{project, structures, Placement{to_run.get(), crs.metres_per_unit, crs.z_metres_per_unit},
                                 structure_findings, structure_defaults};
        read_structures(structure_read, result.network.structures);
        add_input_files(structure_files, structure_hashes, structures);
      } catch (...) {
        structures_failed = std::current_exception();
      }
    });
  try {
    LayerRead pipe_read{project, pipes, Placement{crs.to_run.get(), crs.metres_per_unit, crs.z_metres_per_unit},
                        result.findings, defaults};
    read_pipes(pipe_read, result.network.conduits);
    if (!project.force_main_layer.source.empty()) read_force_main_layer(project, crs, defaults, result);
  } catch (...) {
    if (structure_reader.joinable()) structure_reader.join();
    throw;  // a problem with the pipes is reported first, as when the layers were read in turn
  }
  if (structure_reader.joinable()) structure_reader.join();
  if (structures_failed) std::rethrow_exception(structures_failed);
  result.findings.insert(result.findings.end(), std::make_move_iterator(structure_findings.begin()),
                         std::make_move_iterator(structure_findings.end()));
  add_input_files(result.input_files, structure_files);  // both layers may live in one file
  result.read_hashes.insert(result.read_hashes.end(), structure_hashes.begin(), structure_hashes.end());
  read_proposal_layers(project, crs, defaults, result);  // a proposal's new pipes and structures, if any
  read_catchment_layers(project, crs, result);
  result.defaults_used = defaults.take();
  for (auto& n : structure_defaults.take()) result.defaults_used.push_back(std::move(n));
  return result;
}

}  // namespace rimline::gis
