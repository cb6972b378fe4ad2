// Pump curve interpolation, system curve and operating point.
#include <catch2/catch.hpp>

#include <cmath>
#include <limits>
#include <numbers>

#include "rimline/error.hpp"
#include "rimline/hydraulics/losses.hpp"
#include "rimline/hydraulics/pump.hpp"

using namespace rimline::hydraulics;

namespace {
// An invented pump curve, used only to exercise the interpolation and the intersection.
PumpCurve pump() { return PumpCurve({{0.0, 30.0}, {0.05, 28.5}, {0.10, 24.0}, {0.15, 16.0}, {0.18, 9.0}}); }

SystemCurve main_line() {
  SystemCurve s;
  s.static_lift_m = 8.0;
  s.section = {Shape::circular, 0.3, 0.0, 0.0, {}};
  s.roughness.law = FrictionLaw::hazen_williams;
  s.roughness.hazen_c = 120.0;
  s.length_m = 800.0;
  s.minor_k_total = 5.0;
  return s;
}
}  // namespace

TEST_CASE("pump curve passes through its points and is monotone between them", "[pump]") {
  const PumpCurve p = pump();
  CHECK(p.head_m(0.0) == Approx(30.0));
  CHECK(p.head_m(0.10) == Approx(24.0));
  CHECK(p.head_m(0.18) == Approx(9.0));
  CHECK(p.shutoff_head_m() == 30.0);
  CHECK(p.max_flow_m3_s() == 0.18);
  double last = 1e9;
  for (double q = 0.0; q <= 0.18; q += 0.0005) {
    const double h = p.head_m(q);
    CHECK(h <= last + 1e-12);
    CHECK(h <= 30.0);
    CHECK(h >= 9.0);
    last = h;
  }
  // Two points: the monotone cubic with end tangents equal to the secant is the straight line.
  const PumpCurve line({{0.0, 10.0}, {1.0, 0.0}});
  CHECK(line.head_m(0.25) == Approx(7.5));
}

TEST_CASE("system curve: static lift + friction + minor losses", "[pump]") {
  const SystemCurve s = main_line();
  const double q = 0.08, v = q / (std::numbers::pi * 0.0225);
  const double expected = 8.0 + full_friction_slope(s.roughness, s.section, q) * 800.0 + 5.0 * velocity_head_m(v);
  CHECK(s.head_m(q) == Approx(expected).epsilon(1e-12));
  CHECK(s.head_m(0.0) == Approx(8.0));
}

TEST_CASE("operating point lies on both curves; parallel pumps give more flow, less than n times", "[pump]") {
  const PumpCurve p = pump();
  const SystemCurve s = main_line();
  const OperatingPoint one = operating_point(p, 1, s);
  REQUIRE(one.exists);
  CHECK(one.head_m == Approx(p.head_m(one.flow_m3_s)).epsilon(1e-9));
  CHECK(one.head_m == Approx(s.head_m(one.flow_m3_s)).epsilon(1e-12));
  const OperatingPoint two = operating_point(p, 2, s);
  REQUIRE(two.exists);
  CHECK(two.head_m == Approx(p.head_m(two.flow_m3_s / 2)).epsilon(1e-9));
  CHECK(two.flow_m3_s > one.flow_m3_s);
  CHECK(two.flow_m3_s < 2 * one.flow_m3_s);  // the system curve rises with flow
  SystemCurve high = s;
  high.static_lift_m = 35.0;
  CHECK_FALSE(operating_point(p, 1, high).exists);  // above shut-off head
}

TEST_CASE("bad pump arguments are rimline::Error(bad_argument)", "[pump][bad]") {
  CHECK_THROWS_AS(PumpCurve({{0.0, 10.0}}), rimline::Error);
  CHECK_THROWS_AS(PumpCurve({{0.0, 10.0}, {0.1, 12.0}}), rimline::Error);  // rising head
  CHECK_THROWS_AS(PumpCurve({{0.1, 10.0}, {0.1, 8.0}}), rimline::Error);   // repeated flow
  CHECK_THROWS_AS(PumpCurve({{0.0, std::nan("")}, {0.1, 8.0}}), rimline::Error);
  CHECK_THROWS_AS(pump().head_m(0.5), rimline::Error);  // no extrapolation
  CHECK_THROWS_AS(operating_point(pump(), 0, main_line()), rimline::Error);
  SystemCurve s = main_line();
  s.length_m = -1.0;
  CHECK_THROWS_AS(s.head_m(0.1), rimline::Error);
  try {
    PumpCurve({{0.0, 10.0}, {0.1, 12.0}});
  } catch (const rimline::Error& e) {
    CHECK(e.kind() == rimline::ErrorKind::bad_argument);
  }
}
