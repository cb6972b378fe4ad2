#pragma once
// The outputs contract of `rimline check --out DIR`:
//   DIR/exceptions.csv  one row per finding: code,severity,layer,feature_id,fid,field,value,limit,shortfall,unit,case,x,y,message
//                       (fid: the feature's fid in its source layer, telling apart features that share an id;
//                       shortfall: value - limit with its sign; case: the tailwater case the row comes from,
//                       "every tailwater case", or empty when the finding does not depend on the case;
//                       x, y: where the feature is, run CRS in its own unit: a structure's point, the middle
//                       of a pipe, a catchment's centroid, a pump station's wet well; empty for the project)
//   DIR/results.gpkg    layers structures, conduits (input CRS; values in the run's unit system),
//                       and, for a tailwater sweep, the table structure_cases (one row per structure and level)
//   DIR/summary.json    run metadata, inputs with SHA-256, units, criteria, methods, counts, worst freeboard
//   DIR/profiles/*.svg  one profile drawing per path and tailwater level; DIR/profiles.pdf all of them
//   DIR/report.html     the self-contained review report (a budget shows its 12 terms nearest the structure)
//   DIR/budgets.csv     with the report: every term of the energy budget of each structure with a warning or
//                       error, written once where budgets share their route (bounded by the network's size)
// The set is written into a new sibling folder and swapped into DIR's place in one rename
// (staged_files.hpp): an interrupted or failed run leaves the previous set whole, or the new set
// whole, never a mix (a proposal's and headroom's files and layers included); the user's other
// files in DIR are kept. An output that would replace an input of the run is refused before
// anything is written.
#include <functional>
#include <iosfwd>
#include <string>
#include <utility>
#include <vector>

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

// The names in DIR that belong to the output set: replaced as a whole by every run (an earlier
// run's report.html goes when this one writes no drawings); anything else in DIR is kept.
const std::vector<std::string>& output_names();

// Throws rimline::Error (bad_config) for an output folder that cannot take the set, or an output
// that would replace one of `inputs` (by device and inode); call it before a long run to fail early.
void check_output_folder(const std::string& out_dir, const std::vector<std::string>& inputs);

// Writes the set. An error names the file and says which state DIR was left in.
void write_outputs(const run::CheckRun& run, const std::string& out_dir, const OutputOptions& options = {});

// Pieces, for tests and for other writers. `more`: findings of the writing itself (a drawing not
// written), merged into the list in its order.
std::string exceptions_csv(const run::CheckRun& run);
void write_exceptions_csv(const run::CheckRun& run, std::ostream& out, const Findings& more = {});  // row by row
std::string summary_json(const run::CheckRun& run, const Findings& more = {});
void write_results_gpkg(const run::CheckRun& run, const std::string& path);

// A value in the run's report units: SI -> display unit of the dimension.
double to_report(double si_value, units::Dimension d, units::System s);

}  // namespace rimline::report
