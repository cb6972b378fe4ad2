#pragma once
// `rimline check` options for development connections: --proposal FILE (the proposed network run
// beside the existing one, compared) and --headroom / --headroom-at ID (connection headroom).
#include <CLI/CLI.hpp>
#include <iosfwd>
#include <optional>
#include <string>
#include <vector>

#include "rimline/config/proposal.hpp"
#include "rimline/connections/compare.hpp"
#include "rimline/connections/headroom.hpp"
#include "rimline/report/outputs.hpp"
#include "rimline/run/check_run.hpp"

namespace rimline::cli {

struct ConnectionArgs {
  std::string proposal;
  bool headroom = false;
  std::vector<std::string> headroom_at;
};

void add_connection_options(CLI::App& app, ConnectionArgs& args);

// What the options ask for around one check.
class ConnectionJob {
 public:
  ConnectionJob(const ConnectionArgs& args, const config::Project& project);
  // The project and options of the main run: the proposed network when there is a proposal.
  config::Project project_to_run() const;
  void amend(run::RunOptions& options) const;
  // After the main run: the existing network's run (with a proposal), the comparison, the headroom
  // search; their files, layers and report sections go into `out`. Prints the verdict and the
  // lowest headroom to `log` when given.
  void finish(const run::CheckRun& result, const run::RunOptions& options, report::OutputOptions& out,
              std::ostream* log);

 private:
  ConnectionArgs args_;
  config::Project project_;
  std::optional<config::Proposal> proposal_;
  std::optional<run::CheckRun> base_;
  std::optional<connections::Comparison> comparison_;
  std::vector<connections::Headroom> headroom_;
  const run::CheckRun* result_ = nullptr;
};

}  // namespace rimline::cli
