#pragma once
// The plan map as the first sheet of profiles.pdf: the network from above at a stated scale
// (the 1-1.25-2-2.5-5 series of metric drawing scales, rounded up from the fit to the panel;
// common practice, no source), pipes and structures coloured by
// result as in report.html's map (status_palette.hpp), rings at the features with a warning or an
// error, outfalls (squares) and pump stations (diamonds) labelled, a scale bar, a grid-north arrow
// and a legend. A city-sized export is drawn grouped into 1.5 mm cells (plan_map.hpp), and the
// sheet says so.
#include <string>

#include "report/canvas.hpp"
#include "report/profile_draw.hpp"
#include "rimline/run/check_run.hpp"

namespace rimline::report {

// Draws the plan in `panel`; returns its scale text ("1:2500").
std::string draw_plan_sheet(const run::CheckRun& run, const Panel& panel, Canvas& c);

// The smallest of 1, 1.25, 2, 2.5 and 5 x 10^k at least `n` (a drawing scale 1:N a reviewer can measure with).
double round_scale_up(double n);

}  // namespace rimline::report
