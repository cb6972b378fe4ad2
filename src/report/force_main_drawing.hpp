#pragma once
// The profile of a pump station's force main, drawn on the same Canvas as the gravity profiles:
// pipe centreline, the HGL of each operating case, the band between the lowest and highest HGL
// (the pressure envelope over the cases) and the sub-atmospheric stretches. Private to src/report.
#include <string>

#include "report/canvas.hpp"
#include "report/profile_draw.hpp"
#include "rimline/run/check_run.hpp"

namespace rimline::report {

// A standalone <svg> element (millimetre units) for run.pump_stations[station]; "" when the
// station was not laid out.
std::string force_main_svg(const run::CheckRun& run, std::size_t station);

// The plot (axes, pipe, HGL per case, envelope, legend) inside `panel`, for SVG and PDF alike;
// returns the scales it was drawn at ("H 1:2631   V 1:83   vertical exaggeration 32:1 (fitted to the sheet)").
std::string draw_force_main(const run::CheckRun& run, std::size_t station, const Panel& panel, Canvas& c);

// "Force main of pump station WW-1 to T-12 (discharge: ...)".
std::string force_main_title(const run::CheckRun& run, std::size_t station);

}  // namespace rimline::report
