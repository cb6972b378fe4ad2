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
};

// The page shows the first profiles inline; the others are linked to their SVG files (and need
// no `svg` text here).
inline constexpr std::size_t inline_profiles = 40;

// `selection` says which paths the profiles follow (selection_text). The page is written to `out`
// a section at a time; report_html returns it as one string (for tests and small runs).
// `more_sections`: HTML sections placed after the summary (a proposal's comparison, connection headroom).
void write_report_html(std::ostream& out, const run::CheckRun& run, const std::vector<RenderedProfile>& profiles,
                       const std::string& date, bool pdf_written, const std::string& selection = "",
                       const std::string& more_sections = "");
std::string report_html(const run::CheckRun& run, const std::vector<RenderedProfile>& profiles,
                        const std::string& date, bool pdf_written, const std::string& selection = "");

// Stages DIR/profiles/<outfall-id>-<n>.svg, DIR/profiles.pdf (when built with cairo and there
// is a profile) and DIR/report.html in `files`; the caller commits. Profile SVGs left in
// DIR/profiles by an earlier run that this run does not draw are removed.
void write_drawings(const run::CheckRun& run, StagedFiles& files, const DrawingOptions& options = {});

}  // namespace rimline::report
