// `rimline check PROJECT --out DIR`: the main job.
#include <unistd.h>

#include <chrono>
#include <iostream>
#include <map>

#include "cli/commands.hpp"
#include "cli/connection_options.hpp"
#include "rimline/error.hpp"
#include "rimline/config/project.hpp"
#include "rimline/report/outputs.hpp"
#include "rimline/run/check_run.hpp"
#include "rimline/topology/summary.hpp"

namespace rimline::cli {
namespace {

struct CheckArgs {
  std::string project;
  std::string out;
  std::string fail_on = "warning";
  std::string units;
  std::vector<std::string> tailwater;
  bool dry_run = false;
  bool no_drawings = false;
  std::string profile_from;
  std::string profile_trunks;
  std::vector<std::string> where;  // --where TABLE=SQL, over the project file's where
  ConnectionArgs connections;  // --proposal, --headroom, --headroom-at
};

Severity parse_severity(const std::string& s) {
  if (s == "info") return Severity::info;
  if (s == "warning") return Severity::warning;
  if (s == "error") return Severity::error;
  throw Error(ErrorKind::bad_config, "--fail-on must be info, warning or error, not '" + s + "'");
}

void print_summary(const run::CheckRun& run, std::ostream& os) {
  const auto s = topology::summarize(run.read.network, run.topology);
  os << "network: " << s.structures << " structures, " << s.conduits << " conduits (" << s.usable_conduits
     << " usable), " << s.outfalls << " outfalls"
     << (s.outfalls_assumed ? " (" + std::to_string(s.outfalls_assumed) + " assumed: nothing names them)" : "")
     << ", " << s.trees << " trees, " << s.diversions << " diversions, "
     << render_message(q_distance(s.total_length_m), run.report_units) << " of pipe\n";
  if (!run.read.network.crs_note.empty()) os << "crs: " << run.read.network.crs_note << "\n";
}

void print_findings(const Findings& findings, units::System sys, bool all, std::ostream& os) {
  std::map<std::string, int> counts;
  for (const auto& f : findings) ++counts[std::string(severity_name(f.severity)) + " " + f.code];
  for (const auto& [k, n] : counts) os << "  " << n << " x " << k << "\n";
  if (!all) return;
  for (const auto& f : findings)
    os << severity_name(f.severity) << ": " << f.code << ": " << layer_role_name(f.layer) << ":" << f.feature_id
       << (f.field.empty() ? "" : ":field " + f.field) << ": " << render_message(f.message, sys) << "\n";
}

// A one-line progress display on stderr, only when stderr is a terminal and only once a run has
// taken more than a second (short runs stay quiet; logs and pipes get no control characters).
class Progress {
 public:
  explicit Progress(bool enabled) : enabled_(enabled && ::isatty(STDERR_FILENO)) {}
  ~Progress() { done(); }
  // Clears the line before anything else is printed.
  void done() {
    if (shown_) std::cerr << "\r\033[K" << std::flush;
    shown_ = false;
  }
  void operator()(const std::string& stage) {
    if (!enabled_) return;
    if (std::chrono::steady_clock::now() - start_ < std::chrono::seconds(1)) return;
    shown_ = true;
    std::cerr << "\r\033[Krimline: " << stage << " ..." << std::flush;
  }

 private:
  bool enabled_;
  bool shown_ = false;
  std::chrono::steady_clock::time_point start_ = std::chrono::steady_clock::now();
};

int run_check_command(const CheckArgs& a, const GlobalOptions& g) {
  const Severity fail_on = parse_severity(a.fail_on);
  config::Project base_project = config::load_project(a.project);
  config::apply_where_overrides(base_project, a.where);
  ConnectionJob connections(a.connections, base_project);
  const config::Project project = connections.project_to_run();
  run::RunOptions opt;
  opt.dry_run = a.dry_run;
  if (a.units == "si") opt.report_units = units::System::si;
  else if (a.units == "us") opt.report_units = units::System::us;
  else if (!a.units.empty()) throw Error(ErrorKind::bad_config, "--units must be si or us, not '" + a.units + "'");
  for (const auto& t : a.tailwater)
    opt.tailwater_levels_m.push_back(config::parse_quantity(t, units::Dimension::length, "--tailwater"));
  if (!a.dry_run && a.out.empty()) throw Error(ErrorKind::bad_config, "check needs --out DIR (or --dry-run)");
  if (!a.dry_run) {  // fail before the run, not after it: an output over an input named in the project
    std::vector<std::string> named = {project.file};
    for (const auto* src : {&project.pipes, &project.structures, &project.force_main_layer, &project.catchments.source,
                            &project.catchments.land_use, &project.pump_station_points})
      if (!src->source.empty()) named.push_back(src->source);
    if (!project.ground.source.empty()) named.push_back(project.ground.source);
    report::check_output_folder(a.out, named);
  }

  report::OutputOptions out_opt;
  out_opt.drawings = !a.no_drawings;
  if (!a.profile_from.empty()) {
    out_opt.profiles.selection = report::PathSelection::from_structure;
    out_opt.profiles.from_structure_id = a.profile_from;
  } else if (!a.profile_trunks.empty()) {
    out_opt.profiles.selection = report::PathSelection::trunks;
    out_opt.profiles.min_rise_m = config::parse_quantity(a.profile_trunks, units::Dimension::length, "--profile-trunks");
  }
  opt.detailed_conduits = [&out_opt](const model::Network& net, const topology::Topology& topo) {
    return out_opt.drawings ? report::drawn_conduits(net, topo, out_opt.profiles)
                            : std::vector<bool>(net.conduits.size(), false);
  };

  connections.amend(opt);
  Progress progress(!g.quiet);
  opt.progress = [&progress](const std::string& stage) { progress(stage); };
  // The run stays allocated until the process ends: freeing a city's millions of small blocks one
  // by one took ~0.7 s at 10^6 pipes, after every output was written (the way compilers skip
  // freeing at exit). It stays reachable, so leak checkers do not count it; a later call frees it.
  static const run::CheckRun* kept_until_exit = nullptr;
  delete kept_until_exit;
  kept_until_exit = nullptr;
  kept_until_exit = new run::CheckRun(run::run_check(project, opt));
  const run::CheckRun& result = *kept_until_exit;
  progress.done();
  if (!g.quiet) {
    print_summary(result, std::cout);
    std::cout << (a.dry_run ? "data findings:\n" : "findings:\n");
    print_findings(result.findings, result.report_units, a.dry_run || g.verbose, std::cout);
  }
  if (!a.dry_run) connections.finish(result, opt, out_opt, g.quiet ? nullptr : &std::cout);
  progress.done();
  if (!a.dry_run) {
    progress("writing the outputs");
    report::write_outputs(result, a.out, out_opt);
    progress.done();
    if (!g.quiet) {
      std::cout << "wrote " << a.out << "/exceptions.csv, results.gpkg, summary.json"
                << (a.no_drawings ? "" : ", profiles.pdf, profiles/, report.html, budgets.csv");
      for (const auto& f : out_opt.more_files) std::cout << ", " << f.first;
      std::cout << "\n" << report::caution << "\n";
    }
  }
  if (!a.dry_run && run::checked_nothing(result)) {
    // Loud, and on stderr even with --quiet: an empty exception list from such a run means nothing.
    std::cerr << "rimline: THIS RUN CHECKED NOTHING: no pipe could be solved (see NOTHING_CHECKED); exit "
              << exit_nothing_checked << "\n";
    return exit_nothing_checked;
  }
  for (const auto& f : result.findings)
    if (f.severity >= fail_on) return exit_findings;
  return exit_ok;
}

}  // namespace

std::function<int()> setup_check(CLI::App& app, const GlobalOptions& global) {
  auto a = std::make_shared<CheckArgs>();
  app.add_option("project", a->project, "Project file (TOML) naming the layers, field mapping and criteria")->required();
  app.add_option("-o,--out", a->out, "Output directory for exceptions.csv, results.gpkg, summary.json");
  app.add_option("--fail-on", a->fail_on, "Exit 1 when a finding has this severity or worse: info, warning, error")
      ->capture_default_str();
  app.add_option("--units", a->units, "Report units: si or us (default: the project's)");
  app.add_option("--tailwater", a->tailwater, "Tailwater level(s), e.g. \"12.4 m\"; several run as a sweep");
  app.add_flag("--dry-run", a->dry_run, "Read and connect the network, print its summary and data findings, stop");
  app.add_option("--profile-from", a->profile_from, "Draw the profile from this structure down to its outfall");
  app.add_option("--profile-trunks", a->profile_trunks, "Draw every trunk of pipes at least this size, e.g. \"900 mm\"");
  app.add_flag("--no-drawings", a->no_drawings, "Write the exception list, layers and summary only");
  app.add_option("--where", a->where,
                 "Read only the features this filter selects: TABLE=SQL (pipes, structures, catchments, land_use, "
                 "force_mains, pump_station_points), over the project's where; repeatable, \"TABLE=\" removes it")
      ->allow_extra_args(false);
  add_connection_options(app, a->connections);
  app.footer("Every key of the project file (unit, default, example, the findings it can raise): docs/project-file.md\n"
             "Exit 5 when the run checked nothing (no pipe could be solved).\n\nExample:\n  rimline check data/demo/metric/project.toml --out out/demo\n"
             "  rimline check project.toml --tailwater \"12.4 m\" --tailwater \"13.1 m\" --out out/sweep\n"
             "  rimline check project.toml --out out/b8 --profile-from B-08\n"
             "  rimline check project.toml --proposal subdivision.toml --headroom --out out/proposal\n"
             "  rimline check project.toml --out out/part-0 \\\n"
             "    --where \"pipes=ogc_fid IN (SELECT fid FROM rimline_parts WHERE layer = 'pipes' AND part = 0)\" \\\n"
             "    --where \"structures=ogc_fid IN (SELECT fid FROM rimline_parts WHERE layer = 'structures' AND part = 0)\"\n"
             "  (rimline_parts: scripts/parts.sql; README, \"Past one machine\")");
  return [a, &global] { return run_check_command(*a, global); };
}

}  // namespace rimline::cli
