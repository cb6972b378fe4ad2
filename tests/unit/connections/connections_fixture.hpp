#pragma once
// Small networks written as GeoJSON + TOML for the connection tests (the bad-input fixture's
// network, tests/e2e/badinput/fixture.hpp), and a whole check run on them with added inflows:
// the brute-force re-run the headroom search is compared with. Invented data: the comparisons
// are consistency checks, not check values.
#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>
#include <string>
#include <vector>

#include "e2e/badinput/fixture.hpp"
#include "rimline/config/proposal.hpp"
#include "rimline/connections/added_flow.hpp"
#include "rimline/connections/compare.hpp"
#include "rimline/run/check_run.hpp"
#include "test_paths.hpp"

namespace rimline::connections_test {

namespace fs = std::filesystem;
using namespace rimline::badinput;

// Writes the network into build/connections/<name>/ and returns the project file's path.
inline std::string write_network(const std::string& name, const std::vector<std::string>& pipes,
                                 const std::vector<std::string>& structures, const std::string& project) {
  const fs::path dir = fs::path(test::binary_dir) / "connections" / name;
  fs::create_directories(dir);
  std::ofstream(dir / "pipes.geojson") << collection(pipes);
  std::ofstream(dir / "structures.geojson") << collection(structures);
  std::ofstream(dir / "project.toml") << project;
  return (dir / "project.toml").string();
}

// A whole check of the project with `inflows` added (empty: the existing network).
inline run::CheckRun run_with(const config::Project& project, const std::vector<config::AddedInflow>& inflows) {
  run::RunOptions opt;
  if (!inflows.empty())
    opt.amend_flows = [&inflows](const model::Network& net, const topology::Topology& topo,
                                 const flows::SplitRule& split, std::vector<double>& flow, Findings& findings) {
      connections::add_inflows(inflows, net, topo, split, flow, findings);
    };
  return run::run_check(project, opt);
}

}  // namespace rimline::connections_test
