#pragma once
// The outputs contract of `rimline check --out DIR`:
//   DIR/exceptions.csv  one row per finding: code,severity,layer,feature_id,field,value,limit,unit,message
//   DIR/results.gpkg    layers structures, conduits (input CRS; values in the run's unit system),
//                       and, for a tailwater sweep, the table structure_cases (one row per structure and level)
//   DIR/summary.json    run metadata, inputs with SHA-256, units, criteria, methods, counts, worst freeboard
//   DIR/profiles/*.svg  one profile drawing per path and tailwater level; DIR/profiles.pdf all of them
//   DIR/report.html     the self-contained review report
// Every file is written under a temporary name in DIR and renamed into place, so an interrupted
// run leaves the previous file or the new one, never a partial one.
#include <functional>
#include <iosfwd>
#include <utility>
#include <vector>
#include <string>

#include "rimline/report/profile_path.hpp"
#include "rimline/run/check_run.hpp"

namespace rimline::report {

// The caution printed on every output.
inline constexpr const char* caution =
    "Results are for review by a licensed professional engineer. Local codes, standards and the "
    "approving authority govern; rimline does not replace engineering judgement.";

struct OutputOptions {
  bool drawings = true;        // profiles and report.html
  DrawingOptions profiles;     // which paths are drawn
  // Written with the outputs by a later stage (src/connections: a proposal's comparison, connection
  // headroom), so they are staged and renamed with the rest: more files in DIR (name, text), more
  // layers in results.gpkg (called with its staged path once its own layers are written); the
  // report's extra sections go in profiles.more_sections.
  std::vector<std::pair<std::string, std::string>> more_files;
  std::function<void(const std::string& staged_gpkg)> more_layers;
};

void write_outputs(const run::CheckRun& run, const std::string& out_dir, const OutputOptions& options = {});

// Pieces, for tests and for other writers.
std::string exceptions_csv(const run::CheckRun& run);
void write_exceptions_csv(const run::CheckRun& run, std::ostream& out);  // the same, row by row
std::string summary_json(const run::CheckRun& run);
void write_results_gpkg(const run::CheckRun& run, const std::string& path);

// A value in the run's report units: SI -> display unit of the dimension.
double to_report(double si_value, units::Dimension d, units::System s);

}  // namespace rimline::report
