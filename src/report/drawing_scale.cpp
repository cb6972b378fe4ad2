#include "report/drawing_scale.hpp"

#include "rimline/finding.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <string>

namespace rimline::report {
namespace {

double decade(double v) { return std::pow(10.0, std::floor(std::log10(v))); }

}  // namespace

double preferred_reduction(double at_least) {
  if (!(at_least > 0.0)) return 1.0;
  const double d = decade(at_least);
  for (double m : {1.0, 2.0, 2.5, 5.0, 10.0})
    if (m * d >= at_least * (1.0 - 1e-12)) return m * d;
  return 10.0 * d;
}

double preferred_exaggeration(double at_most) {
  if (!(at_most >= 1.0)) return 1.0;
  const double d = decade(at_most);
  double best = d;
  for (double m : {1.0, 2.0, 5.0})
    if (m * d <= at_most * (1.0 + 1e-12)) best = m * d;
  return best;
}

double nice_step(double range, int target) {
  if (!(range > 0.0) || target < 1) return 1.0;
  const double raw = range / target;
  const double d = decade(raw);
  for (double m : {1.0, 2.0, 5.0})
    if (m * d >= raw * (1.0 - 1e-12)) return m * d;
  return 10.0 * d;
}

std::vector<double> ticks(double lo, double hi, double step) {
  std::vector<double> out;
  if (!(step > 0.0) || !(hi >= lo)) return out;
  const double first = std::ceil(lo / step - 1e-9);
  const double last = std::floor(hi / step + 1e-9);
  for (double k = first; k <= last && out.size() < 1000; k += 1.0) out.push_back(k * step);
  return out;
}

int decimals_for(double step) {
  if (!(step > 0.0) || step >= 1.0 - 1e-9) return 0;
  return std::clamp(static_cast<int>(std::ceil(-std::log10(step) - 1e-9)), 0, 6);
}

std::string station_label(double station, units::System system, int decimals) {
  return station_notation(station, system, decimals);
}

std::vector<bool> thin_labels(const std::vector<double>& positions_mm, const std::vector<bool>& priority,
                              double gap_mm) {
  const std::size_t n = positions_mm.size();
  std::vector<bool> drawn(n, false);
  std::vector<double> placed;
  auto fits = [&](double x) {
    return std::all_of(placed.begin(), placed.end(), [&](double p) { return std::fabs(p - x) >= gap_mm - 1e-9; });
  };
  for (int pass = 0; pass < 2; ++pass) {
    for (std::size_t i = 0; i < n; ++i) {
      const bool first = i < priority.size() && priority[i];
      if (drawn[i] || first != (pass == 0) || !fits(positions_mm[i])) continue;
      drawn[i] = true;
      placed.push_back(positions_mm[i]);
    }
  }
  return drawn;
}

PlotFrame fit_frame(double x_lo, double x_hi, double y_lo, double y_hi, double metres_per_unit, double left_mm,
                    double top_mm, double max_width_mm, double height_mm) {
  PlotFrame f;
  f.left_mm = left_mm;
  f.top_mm = top_mm;
  f.height_mm = height_mm;
  const double xr = std::max(x_hi - x_lo, 1e-6);
  const double yr = std::max(y_hi - y_lo, 1e-6);
  // Paper mm shown per world unit at 1:N is metres_per_unit * 1000 / N.
  f.horizontal_n = preferred_reduction(xr * metres_per_unit * 1000.0 / max_width_mm);
  const double vertical_fit_n = yr * metres_per_unit * 1000.0 / height_mm;
  f.exaggeration = preferred_exaggeration(f.horizontal_n / vertical_fit_n);
  f.vertical_n = f.horizontal_n / f.exaggeration;
  const double mm_per_x = metres_per_unit * 1000.0 / f.horizontal_n;
  const double mm_per_y = metres_per_unit * 1000.0 / f.vertical_n;
  f.width_mm = xr * mm_per_x;
  f.x0 = x_lo;
  f.x1 = x_hi;
  const double window = height_mm / mm_per_y;
  const double mid = 0.5 * (y_lo + y_hi);
  f.y0 = mid - 0.5 * window;
  f.y1 = mid + 0.5 * window;
  return f;
}

}  // namespace rimline::report
