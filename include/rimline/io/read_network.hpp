#pragma once
// Reads the pipe and structure layers named in the project through GDAL/OGR into a Network
// (SI, one projected CRS), converting every value once. Per-feature data problems become
// Findings (code, the source's feature id, the field) and the feature is kept or left out
// as stated in the finding; the whole read fails only when a source cannot be used at all.
#include "rimline/finding.hpp"
#include "rimline/io/project.hpp"
#include "rimline/model/network.hpp"

namespace rimline::io {

struct ReadResult {
  model::Network network;
  Findings findings;
  std::vector<std::string> input_files;  // every file read, for hashing in the summary
  std::string source_crs_wkt;            // CRS of the pipe layer as read (outputs go back to it)
};

ReadResult read_network(const Project& project);

}  // namespace rimline::io
