#pragma once
// Scales and axis ticks for the profile drawings, in paper millimetres.
// Drawing scales are reductions 1:N with N from the 1-2-5 series of ISO 5455 (Technical
// drawings - Scales, 1979; from memory) plus 2.5 (1:250, 1:2500: common practice, no source),
// so a printed sheet can be measured with an ordinary scale rule.
#include <vector>

#include "rimline/units.hpp"

namespace rimline::report {

// Smallest N of the series {1, 2, 2.5, 5} x 10^k with N >= at_least (at_least > 0).
double preferred_reduction(double at_least);
// Largest vertical exaggeration of the series {1, 2, 5} x 10^k not above at_most; 1 when at_most < 1.
double preferred_exaggeration(double at_most);

// Tick step from the 1-2-5 series giving about `target` intervals over `range` (> 0).
double nice_step(double range, int target);
// Multiples of step within [lo, hi] (inclusive, within 1e-9 of a step), ascending.
std::vector<double> ticks(double lo, double hi, double step);
// Decimals needed to print multiples of step exactly (0 for steps >= 1).
int decimals_for(double step);

// Station text in the trade's chainage form: "1+250" (SI: km + m) or "12+50" (US: 100 ft
// stations). Whole units only below the plus; fractional values keep `decimals`.
std::string station_label(double station, units::System system, int decimals = 0);

// Which labels to draw along an axis so that no two drawn labels are closer than gap_mm:
// priority labels first (in order), then the others left to right where they fit.
std::vector<bool> thin_labels(const std::vector<double>& positions_mm, const std::vector<bool>& priority,
                              double gap_mm);

// A plot box on paper and the world window it shows (world = report length units, x the
// station, y the elevation). Paper y grows downwards.
struct PlotFrame {
  double left_mm = 0.0, top_mm = 0.0, width_mm = 0.0, height_mm = 0.0;
  double x0 = 0.0, x1 = 1.0, y0 = 0.0, y1 = 1.0;
  double horizontal_n = 1.0;  // horizontal scale 1:N
  double vertical_n = 1.0;    // vertical scale 1:N
  double exaggeration = 1.0;  // horizontal_n / vertical_n

  double px(double x) const { return left_mm + (x - x0) / (x1 - x0) * width_mm; }
  double py(double y) const { return top_mm + (y1 - y) / (y1 - y0) * height_mm; }
};

// Fits [x_lo, x_hi] x [y_lo, y_hi] (world units of `metres_per_unit`) into a box of at most
// max_width_mm x height_mm at preferred scales. The box narrows to the station range at the
// chosen horizontal scale; the elevation window is centred on the data and fills the height.
PlotFrame fit_frame(double x_lo, double x_hi, double y_lo, double y_hi, double metres_per_unit, double left_mm,
                    double top_mm, double max_width_mm, double height_mm);

}  // namespace rimline::report
