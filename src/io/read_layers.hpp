#pragma once
// The two feature readers behind read_network: one pass over a layer, each feature converted
// to SI once, its problems recorded as findings. Private to src/io.
#include "io/default_tally.hpp"
#include "io/gdal_source.hpp"
#include "io/line_geometry.hpp"
#include "rimline/finding.hpp"
#include "rimline/io/project.hpp"
#include "rimline/model/network.hpp"

namespace rimline::io::detail {

struct LayerRead {
  const Project& project;
  OpenLayer& source;
  Placement placement;
  Findings& findings;
  DefaultTally& defaults;
};

// Checks that every mapped pipe field exists and that the project can give each pipe a section
// and the roughness its friction law needs; throws Error(bad_config) otherwise.
void check_pipe_mapping(const Project& project, const OpenLayer& source);
void read_pipes(LayerRead& in, std::vector<model::Conduit>& out);

void check_structure_mapping(const Project& project, const OpenLayer& source);
void read_structures(LayerRead& in, std::vector<model::Structure>& out);

// GDAL's warnings while reading one feature -> DATA_SOURCE findings (at most `cap` per layer).
void report_gdal_messages(GdalErrorCapture& capture, LayerRole layer, const std::string& feature_id, Findings& findings,
                          std::size_t& reported, std::size_t cap = 100);

}  // namespace rimline::io::detail
