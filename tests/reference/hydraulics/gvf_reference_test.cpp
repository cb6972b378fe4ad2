// Water-surface profiles against closed-form results of open-channel hydraulics.
#include <catch2/catch.hpp>

#include <cmath>

#include "rimline/hydraulics/gvf.hpp"
#include "rimline/units.hpp"

using namespace rimline::hydraulics;

namespace {
constexpr double g = rimline::units::gravity_m_s2;

// Distance upstream from depth y0 to depth y on a horizontal, very wide rectangular channel with
// Manning friction (R = y): integrating dx/dy = (y^(10/3) - yc^3 y^(1/3)) / (n^2 q^2) gives
//   x(y) = [3/13 y^(13/3) - 3/4 yc^3 y^(4/3)] / (n^2 q^2).
// Source: direct integration of the varied-flow equation for a horizontal channel (Chow 1959,
// Open-Channel Hydraulics, ch. 10, hydraulic exponents N = 10/3, M = 3; from memory).
double horizontal_wide_x(double y, double yc, double n, double q) {
  return (3.0 / 13.0 * std::pow(y, 13.0 / 3.0) - 0.75 * yc * yc * yc * std::pow(y, 4.0 / 3.0)) / (n * n * q * q);
}

double depth_at_distance(double x, double y0, double yc, double n, double q) {
  const double x0 = horizontal_wide_x(y0, yc, n, q);
  double lo = y0, hi = 3.0;  // H2: depth rises upstream
  for (int i = 0; i < 200; ++i) {
    const double mid = 0.5 * (lo + hi);
    (horizontal_wide_x(mid, yc, n, q) - x0 < x ? lo : hi) = mid;
  }
  return 0.5 * (lo + hi);
}
}  // namespace

// A 10 km wide box stands in for the wide channel: R = b y/(b + 2 y) differs from y by 2y/b ~ 1e-4,
// which moves the depths by well under 0.1 mm here; the tolerance, 1 mm, is the RK cross-check's.
TEST_CASE("H2 profile on a horizontal wide channel vs the closed-form integral (Chow 1959 ch. 10, from memory), 1 mm", "[reference][gvf]") {
  const double width = 1.0e4, q = 1.0, n = 0.013;
  ConduitReach r;
  r.section = {Shape::box, 0.0, width, 3.0, {}};
  r.roughness.manning_n = n;
  r.length_m = 400.0;
  r.invert_up_m = r.invert_down_m = 0.0;
  r.flow_m3_s = q * width;
  const double yc = std::cbrt(q * q / g);
  for (double outlet_level : {0.7, -1.0}) {  // backwater from a tailwater; free outlet at critical depth
    const ConduitProfile p = compute_profile(r, outlet_level);
    REQUIRE(p.profile_class == "H2");
    const double y0 = p.outlet().depth_m;
    CHECK(y0 == Approx(outlet_level > 0 ? 0.7 : yc).margin(1e-6));
    for (const ProfilePoint& pt : p.points) {
      INFO("station " << pt.station_m);
      CHECK(pt.depth_m == Approx(depth_at_distance(pt.station_m, y0, yc, n, q)).margin(1e-3));
    }
    CHECK(p.inlet().depth_m - y0 > 0.1);  // a real profile, not a flat line
  }
}

// Source: the Belanger equation for conjugate depths of a hydraulic jump in a rectangular channel,
// y2/y1 = (sqrt(1 + 8 Fr1^2) - 1)/2 (Chow 1959, Open-Channel Hydraulics, ch. 15; from memory).
// It is the momentum balance the profile uses to place the jump; tolerance 1e-4 relative (the jump
// station is solved to 1e-6 of the length).
TEST_CASE("jump in a box conduit: conjugate depths obey the Belanger equation (Chow 1959 ch. 15)", "[reference][gvf]") {
  ConduitReach r;
  r.section = {Shape::box, 0.0, 2.0, 1.5, {}};
  r.length_m = 80.0;
  r.invert_down_m = 20.0;
  r.invert_up_m = 20.0 + 0.02 * 80.0;
  r.flow_m3_s = 3.0;
  const ConduitProfile p = compute_profile(r, 20.0 + 1.2);
  REQUIRE(p.jump_station_m.has_value());
  std::size_t k = 0;
  while (p.points[k].station_m != *p.jump_station_m) ++k;
  const double y2 = p.points[k].depth_m, y1 = p.points[k + 1].depth_m;
  const double fr1 = p.points[k + 1].velocity_m_s / std::sqrt(g * y1);
  CHECK(y2 / y1 == Approx(0.5 * (std::sqrt(1.0 + 8.0 * fr1 * fr1) - 1.0)).epsilon(1e-4));
  // The jump's energy loss (y2 - y1)^3 / (4 y1 y2), same source.
  CHECK(p.jump_loss_m == Approx(std::pow(y2 - y1, 3) / (4.0 * y1 * y2)).epsilon(1e-4));
}
