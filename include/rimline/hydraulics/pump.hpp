#pragma once
// Pump curve from points, system curve, and their intersection (operating point).
#include <functional>
#include <vector>

#include "rimline/hydraulics/friction.hpp"

namespace rimline::hydraulics {

struct CurvePoint {
  double flow_m3_s = 0.0;
  double head_m = 0.0;
};

// Head falls with flow; points sorted by flow, head strictly decreasing (throws otherwise).
// Interpolated piecewise-cubic monotone (Fritsch-Carlson), so the fitted curve has no wiggles.
class PumpCurve {
 public:
  explicit PumpCurve(std::vector<CurvePoint> points);
  double head_m(double flow_m3_s) const;     // one pump; extrapolation is not allowed past the last point
  double max_flow_m3_s() const;
  double min_flow_m3_s() const;              // first point (usually 0: shut-off)
  double shutoff_head_m() const;

 private:
  std::vector<CurvePoint> points_;
  std::vector<double> slopes_;
};

struct SystemCurve {
  double static_lift_m = 0.0;     // discharge level - suction level
  Section section;                // force main
  Roughness roughness;
  double length_m = 0.0;
  double minor_k_total = 0.0;     // sum of fitting K on the main's velocity
  double head_m(double flow_m3_s) const;
};

struct OperatingPoint {
  bool exists = false;
  double flow_m3_s = 0.0;   // total through the main
  double head_m = 0.0;
  int iterations = 0;
};

// n identical pumps in parallel: each carries Q/n at the same head. exists = false when the
// static lift exceeds the shut-off head or the system would draw more than the curve covers.
OperatingPoint operating_point(const PumpCurve& pump, int pumps_in_parallel, const SystemCurve& system);
// The same against any rising system curve H(Q) [m] (e.g. a force main of several sections).
OperatingPoint operating_point(const PumpCurve& pump, int pumps_in_parallel,
                               const std::function<double(double flow_m3_s)>& system_head_m);

}  // namespace rimline::hydraulics
