#pragma once
// The two feature readers behind read_network: one pass over a layer, each feature converted
// to SI once, its problems recorded as findings. Private to src/gis.
#include "gis/default_tally.hpp"
#include "gis/gdal_source.hpp"
#include "gis/line_geometry.hpp"
#include "rimline/finding.hpp"
#include "rimline/config/project.hpp"
#include "rimline/model/network.hpp"

namespace rimline::gis::detail {

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

// GDAL's messages while reading a layer -> DATA_SOURCE findings naming the feature being read;
// after `cap` of them, one closing finding counts the rest.
class GdalMessageSink {
 public:
  GdalMessageSink(LayerRole layer, Findings& findings, std::size_t cap = 100)
      : layer_(layer), findings_(findings), cap_(cap) {}
  void take(GdalErrorCapture& capture, const std::string& feature_id);
  void finish(GdalErrorCapture& capture);

 private:
  LayerRole layer_;
  Findings& findings_;
  std::size_t cap_;
  std::size_t seen_ = 0;
};

}  // namespace rimline::gis::detail
