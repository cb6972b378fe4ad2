#pragma once
// All profiles of a run as one PDF, one ISO A3 landscape sheet (420 x 297 mm, ISO 216) per
// profile, each with a border and a title block: project, drawing, tailwater case, flow case,
// units, scales, date, sheet number and the caution.
#include <string>
#include <vector>

#include "rimline/report/profile_path.hpp"
#include "rimline/run/check_run.hpp"

namespace rimline::report {

class FindingIndex;

inline constexpr double sheet_width_mm = 420.0;   // ISO 216 A3, landscape
inline constexpr double sheet_height_mm = 297.0;

// False when rimline was built without cairo; write_profiles_pdf then throws.
bool pdf_supported();

// Writes `sheets` to `path`. `date` is printed in the title block. `index`, when given, is the
// findings index the caller built for the same sheets (shared with the SVG pass). Throws
// rimline::Error(bad_input) when the file cannot be written.
void write_profiles_pdf(const run::CheckRun& run, const std::vector<ProfileSheet>& sheets, const std::string& date,
                        const std::string& path, const FindingIndex* index = nullptr);

}  // namespace rimline::report
