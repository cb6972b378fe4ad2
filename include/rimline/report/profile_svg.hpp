#pragma once
// One profile as a standalone SVG 1.1 document: no scripts, no external fonts or images, sized
// in millimetres so it prints at the scales it states. The same drawing is inlined in report.html.
#include <cstddef>
#include <string>
#include <string_view>

#include "rimline/report/profile_path.hpp"
#include "rimline/run/check_run.hpp"

namespace rimline::report {

// The profile of `path` in run.cases[case_index]; `number` is n of its name <outfall-id>-<n>.
std::string profile_svg(const run::CheckRun& run, const ProfilePath& path, std::size_t case_index, int number);

// Text made safe for XML character data and attribute values (&, <, >, ", ').
std::string xml_escape(std::string_view text);

}  // namespace rimline::report
