#pragma once
// The inputs a reviewer needs to redo the check, beyond the files and their hashes: the vertical
// datum, the structure loss K by structure type and every structure's own K, the tailwater mode
// and where each level came from (project file, command line, an outfall's field), and the pump
// curves. Appended to the Inputs section of report.html.
#include <string>

#include "rimline/run/check_run.hpp"

namespace rimline::report {

// "QH local survey datum (invented)", or a sentence saying no datum was stated.
std::string vertical_datum_text(const run::CheckRun& run);

std::string inputs_detail(const run::CheckRun& run);

}  // namespace rimline::report
