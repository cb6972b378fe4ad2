// Independent cross-check of the step method: the gradually-varied-flow equation
//     dy/dx = (Sf - S0) / (1 - Fr^2)      (x increasing upstream; Chow 1959 eq. 9-8 with x reversed)
// integrated here with a classical fourth-order Runge-Kutta at a fixed 1 cm step, using only the
// public friction-slope and Froude-number functions. The step method must agree to 1 mm over 100 m.
#include <catch2/catch.hpp>

#include <cmath>

#include "rimline/hydraulics/gvf.hpp"

using namespace rimline::hydraulics;

namespace {

struct Rk4 {
  Section section;
  Roughness roughness;
  double flow, slope;

  double slope_of_surface(double y) const {
    const double fr = froude_number(section, flow, y);
    return (friction_slope(roughness, section, flow, y) - slope) / (1.0 - fr * fr);
  }
  // Integrates from (x0, y0) to x1 with steps no longer than h.
  double integrate(double x0, double y0, double x1, double h = 0.01) const {
    const int n = std::max(1, static_cast<int>(std::ceil((x1 - x0) / h)));
    const double dx = (x1 - x0) / n;
    double y = y0;
    for (int i = 0; i < n; ++i) {
      const double k1 = slope_of_surface(y);
      const double k2 = slope_of_surface(y + 0.5 * dx * k1);
      const double k3 = slope_of_surface(y + 0.5 * dx * k2);
      const double k4 = slope_of_surface(y + dx * k3);
      y += dx / 6.0 * (k1 + 2 * k2 + 2 * k3 + k4);
    }
    return y;
  }
};

void cross_check(const Section& s, double slope, double flow, double outlet_depth, const char* expected_class) {
  ConduitReach r;
  r.section = s;
  r.length_m = 100.0;
  r.invert_down_m = 50.0;
  r.invert_up_m = 50.0 + slope * 100.0;
  r.flow_m3_s = flow;
  const ConduitProfile p = compute_profile(r, 50.0 + outlet_depth);
  REQUIRE(p.profile_class == expected_class);
  const Rk4 rk{s, r.roughness, flow, slope};
  double x = 0.0, y = outlet_depth;
  double worst = 0.0;
  for (const ProfilePoint& q : p.points) {
    y = rk.integrate(x, y, q.station_m);
    x = q.station_m;
    worst = std::max(worst, std::fabs(q.depth_m - y));
    CHECK(q.depth_m == Approx(y).margin(1e-3));
  }
  // The profile must actually vary, or the check proves nothing.
  CHECK(std::fabs(p.inlet().depth_m - p.outlet().depth_m) > 0.02);
  INFO("largest difference " << worst << " m");
  CHECK(worst < 1e-3);
}
}  // namespace

TEST_CASE("step method vs RK4: M1 backwater in a 1000 mm pipe", "[gvf][rk]") {
  cross_check(Section{Shape::circular, 1.0, 0, 0, {}}, 0.001, 0.5, 0.90, "M1");
}

TEST_CASE("step method vs RK4: strong M1 in a 600 mm pipe at 0.3 %", "[gvf][rk]") {
  cross_check(Section{Shape::circular, 0.6, 0, 0, {}}, 0.003, 0.12, 0.55, "M1");
}

TEST_CASE("step method vs RK4: M2 drawdown in a 1000 mm pipe", "[gvf][rk]") {
  cross_check(Section{Shape::circular, 1.0, 0, 0, {}}, 0.001, 0.5, 0.45, "M2");
}

TEST_CASE("step method vs RK4: M2 drawdown in a 1.8 m x 1.2 m box", "[gvf][rk]") {
  cross_check(Section{Shape::box, 0, 1.8, 1.2, {}}, 0.0015, 1.5, 0.47, "M2");
}
