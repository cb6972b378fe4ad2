#pragma once
// The command table of the rimline executable: one row per subcommand, one cmd_<verb>.cpp each.
#include <CLI/CLI.hpp>
#include <functional>

namespace rimline::cli {

// Exit codes (documented in README).
enum Exit : int {
  exit_ok = 0,            // no finding at or above --fail-on
  exit_findings = 1,      // findings at or above --fail-on
  exit_usage = 2,         // bad command line or project file
  exit_input = 3,         // an input cannot be read
  exit_internal = 4,      // a rimline defect
  exit_nothing_checked = 5  // the run solved no pipe: nothing was checked (NOTHING_CHECKED)
};

struct GlobalOptions {
  bool quiet = false;
  bool verbose = false;
};

struct Command {
  const char* name;
  const char* description;
  // Adds the subcommand's options and returns the function that runs it.
  std::function<std::function<int()>(CLI::App&, const GlobalOptions&)> setup;
};

std::function<int()> setup_check(CLI::App& app, const GlobalOptions& global);
std::function<int()> setup_fields(CLI::App& app, const GlobalOptions& global);
std::function<int()> setup_methods(CLI::App& app, const GlobalOptions& global);

}  // namespace rimline::cli
