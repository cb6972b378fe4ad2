#pragma once
// A proposal file (TOML, docs/project-file.md "Proposal files"): changes to the existing network
// that a development connection would make, checked against the project it is run with without
// editing the project or its layers. SI inside, converted here once.
//   [proposal]            name = "Quillfen Rise subdivision"
//   [[proposal.inflows]]  structure = "T-07", flow = "42 L/s"        (added at that structure)
//   [[proposal.pipes]]    id = "D-05", diameter = "600 mm" | width, height (box), manning_n = 0.013,
//                         invert_up = "4.10 m", invert_down = "3.95 m"   (resized / re-laid)
//   [proposal.new_pipes]       source = "new-pipes.geojson", layer, open_options, where
//   [proposal.new_structures]  source = "new-structures.geojson", ...   (added; read with the
//                         project's [pipes.fields] / [structures.fields]; sources relative to this file)
//   [proposal.tailwater]  mode = "fixed" | "free" | "higher", levels = ["3.9 m"]   (replaces the project's)
#include <optional>
#include <string>
#include <vector>

#include "rimline/config/project.hpp"

namespace rimline::config {

struct AddedInflow {
  std::string structure;  // structure id
  double flow_m3_s = 0.0;
};

// A pipe resized or re-laid; unset members keep the existing value. Inverts are named for the
// flow direction (up: where the pipe leaves its upstream structure).
struct PipeChange {
  std::string id;
  std::optional<double> diameter_m;             // circular
  std::optional<double> width_m, height_m;      // box (both)
  std::optional<double> manning_n;
  std::optional<double> invert_up_m, invert_down_m;
};

struct Proposal {
  std::string file;
  std::string name;
  std::vector<AddedInflow> inflows;
  std::vector<PipeChange> pipes;
  LayerSource new_pipes, new_structures;  // source empty: none
  std::optional<TailwaterMode> tailwater_mode;
  std::vector<double> tailwater_levels_m;  // empty: the project's
};

// Throws rimline::Error(bad_config) naming the file, the key and, for unknown keys, the closest known one.
Proposal load_proposal(const std::string& path);
Proposal parse_proposal(const std::string& toml_text, const std::string& path_for_messages);

// The project as the proposal changes it (the tailwater); the network changes are applied by
// connections::apply_pipe_changes and the inflows by connections::added_flows.
Project proposed_project(const Project& base, const Proposal& proposal);

}  // namespace rimline::config
