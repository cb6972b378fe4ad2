// rimline: the command line over the rimline library. Parse, call the library, map errors to exit codes.
#include <iostream>
#include <string_view>

#include "cli/commands.hpp"
#include "cli/heap_pages.hpp"
#include "cli/signal_watch.hpp"
#include "rimline/error.hpp"
#include "rimline/version.hpp"

namespace {

const rimline::cli::Command commands[] = {
    {"check", "March the HGL/EGL from the tailwater through the network and list every exception",
     rimline::cli::setup_check},
    {"fields", "List the layers and fields of a GIS source and propose a project file", rimline::cli::setup_fields},
    {"methods", "List the hydraulic methods and criteria rimline applies, with their sources",
     rimline::cli::setup_methods},
};

int exit_for(rimline::ErrorKind k) {
  switch (k) {
    case rimline::ErrorKind::bad_argument:
    case rimline::ErrorKind::bad_config: return rimline::cli::exit_usage;
    case rimline::ErrorKind::bad_input: return rimline::cli::exit_input;
    case rimline::ErrorKind::internal: return rimline::cli::exit_internal;
  }
  return rimline::cli::exit_internal;
}

// The subcommand: the first argument that is not an option.
std::string_view subcommand(int argc, char** argv) {
  for (int i = 1; i < argc; ++i)
    if (argv[i][0] != '-') return argv[i];
  return {};
}

}  // namespace

int main(int argc, char** argv) {
  // Only a check allocates enough for the restart's ~40 ms to pay.
  if (subcommand(argc, argv) == "check") rimline::cli::restart_with_huge_pages(argv);
  rimline::cli::watch_stop_signals();  // before any thread: they inherit the blocked signals
  CLI::App app{"rimline: hydraulic and energy grade lines through storm and sanitary networks, from GIS exports "
               "to a freeboard exception list.\nResults are for review by a licensed engineer; local codes and the "
               "approving authority govern.\nThe project file, key by key: docs/project-file.md. Exit codes: 0 ok, 1 findings at or "
               "above --fail-on, 2 bad command line or project file, 3 unreadable input, 4 internal error, 5 the run "
               "checked nothing."};
  app.set_version_flag("--version", std::string("rimline ") + rimline::version_string);
  rimline::cli::GlobalOptions global;
  app.add_flag("-q,--quiet", global.quiet, "Print nothing but errors");
  app.add_flag("-v,--verbose", global.verbose, "Print every finding and each stage");
  app.require_subcommand(1);
  std::function<int()> to_run;
  for (const auto& c : commands) {
    CLI::App* sub = app.add_subcommand(c.name, c.description);
    sub->fallthrough();  // --quiet / --verbose also after the subcommand
    auto fn = c.setup(*sub, global);
    sub->callback([&to_run, fn] { to_run = fn; });
  }
  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    const int code = app.exit(e);
    return code == 0 ? rimline::cli::exit_ok : rimline::cli::exit_usage;
  }
  try {
    return to_run ? to_run() : rimline::cli::exit_usage;
  } catch (const rimline::Error& e) {
    std::cerr << "rimline: error: " << e.what() << "\n";
    return exit_for(e.kind());
  } catch (const std::exception& e) {
    std::cerr << "rimline: internal error: " << e.what() << "\n";
    return rimline::cli::exit_internal;
  }
}
