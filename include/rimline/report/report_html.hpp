#pragma once
// DIR/report.html: the review report as one self-contained file (inline CSS and SVG; no
// scripts, no network, no external assets). Sections: job summary, inputs with SHA-256,
// methods and criteria with their sources, the exception list by severity with the energy
// budget of each structure finding, the profiles, the data findings, and the caution.
// Everything but the date is a function of the run, so two runs of one input differ only there.
#include <iosfwd>
#include <limits>
#include <string>
#include <vector>

#include "rimline/report/profile_path.hpp"
#include "rimline/report/staged_files.hpp"
#include "rimline/run/check_run.hpp"

namespace rimline::report {

struct RenderedProfile {
  std::string name;     // <outfall-id>-<n>
  std::string caption;  // "T-20 to outfall OF-1, tailwater 3.200 m"
  std::string svg;      // the <svg> element (no XML declaration)
  // For the index of profiles, in report units:
  double length = 0.0;            // plan length of the path
  std::size_t structures = 0;
  double least_freeboard = std::numeric_limits<double>::quiet_NaN();  // rim - HGL, lowest on the path
  std::string least_freeboard_at;  // structure id
  std::size_t findings = 0;        // findings marked on the drawing
  // What the drawing shows, for the links from the plan map and the exception list to it:
  std::size_t case_index = static_cast<std::size_t>(-1);  // the tailwater case drawn (-1: not a case's drawing)
  std::vector<std::string> structure_ids, conduit_ids;   // the features on the path
  struct Marker {
    int number = 0;
    std::string code, feature_id;
  };
  std::vector<Marker> markers;  // the numbered finding markers drawn
};

// The page shows the first profiles inline; the others are linked to their SVG files (and need
// no `svg` text here).
inline constexpr std::size_t inline_profiles = 40;

// `selection` says which paths the profiles follow (selection_text). The page is written to `out`
// a section at a time; report_html returns it as one string (for tests and small runs).
// `output_findings`: findings of the writing itself (a drawing not written), listed with the data findings.
// `more_sections`: HTML sections placed after the summary (a proposal's comparison, connection headroom).
void write_report_html(std::ostream& out, const run::CheckRun& run, const std::vector<RenderedProfile>& profiles,
                       const std::string& date, bool pdf_written, const std::string& selection = "",
                       const Findings* output_findings = nullptr, const std::string& more_sections = "");
std::string report_html(const run::CheckRun& run, const std::vector<RenderedProfile>& profiles,
                        const std::string& date, bool pdf_written, const std::string& selection = "");

// Stages DIR/profiles/<stem>.svg, DIR/profiles.pdf (when built with cairo and there is a
// profile) and DIR/report.html in `files`; the caller commits. A drawing that cannot be written
// is a DRAWING_NOT_WRITTEN finding added to `output_findings` (and shown in the report), not an
// error; the report itself that cannot be written throws rimline::Error.
void write_drawings(const run::CheckRun& run, StagedFiles& files, const DrawingOptions& options = {},
                    Findings* output_findings = nullptr);

// The file name stem of a drawing named after an id: the portable file name set only, at most 80
// bytes (a longer id is cut and keeps 8 hex digits of its SHA-256), never hidden, an option or a
// device name Windows reserves.
std::string file_stem(const std::string& id);

}  // namespace rimline::report
