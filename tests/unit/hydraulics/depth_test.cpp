// Normal and critical depth, Froude number, specific energy and force: definitions and round trips.
#include <catch2/catch.hpp>

#include <cmath>
#include <limits>
#include <numbers>

#include "rimline/error.hpp"
#include "rimline/hydraulics/depth.hpp"
#include "rimline/units.hpp"

using namespace rimline::hydraulics;

namespace {
const Section circle{Shape::circular, 0.75, 0.0, 0.0, {}};
const Section box{Shape::box, 0.0, 1.8, 1.2, {}};
constexpr double g = rimline::units::gravity_m_s2;
}  // namespace

TEST_CASE("normal depth reproduces the discharge, for circle and box and every law", "[depth]") {
  Roughness darcy;
  darcy.law = FrictionLaw::darcy_weisbach;
  for (const Roughness& r : {Roughness{}, darcy}) {
    for (const Section& s : {circle, box}) {
      for (double frac : {0.001, 0.1, 0.5, 0.9, 1.0}) {
        const double q = frac * full_capacity_m3_s(r, s, 0.004);
        const DepthSolve yn = normal_depth(r, s, q, 0.004);
        REQUIRE(yn.exists);
        CHECK(yn.converged);
        // The root is within the documented 1e-7 m of the true depth: Q(yn -/+ 2e-7) brackets q.
        if (q > 0.01 * full_capacity_m3_s(r, s, 0.004))
          CHECK(uniform_flow_m3_s(r, s, yn.depth_m, 0.004) == Approx(q).epsilon(1e-5));
        CHECK(uniform_flow_m3_s(r, s, yn.depth_m - 2e-7, 0.004) <= q);
        CHECK(uniform_flow_m3_s(r, s, yn.depth_m + 2e-7, 0.004) >= q);
        CHECK(yn.depth_m < rise_m(s));
      }
    }
  }
}

TEST_CASE("normal depth: none above the partly-full peak, none on flat or adverse slopes", "[depth]") {
  const Roughness r;
  const PeakFlow peak = peak_partly_full_flow(r, circle, 0.004);
  CHECK(peak.depth_m / 0.75 == Approx(0.938).margin(0.001));
  const DepthSolve over = normal_depth(r, circle, 1.001 * peak.flow_m3_s, 0.004);
  CHECK_FALSE(over.exists);
  CHECK(over.depth_m == 0.75);
  CHECK(over.note.find("exceeds") != std::string::npos);
  // Between full capacity and the peak the rising-limb depth is returned (above 0.8 D).
  const DepthSolve between = normal_depth(r, circle, 1.05 * full_capacity_m3_s(r, circle, 0.004), 0.004);
  REQUIRE(between.exists);
  CHECK(between.depth_m > 0.8 * 0.75);
  CHECK(between.depth_m < peak.depth_m);
  CHECK_FALSE(normal_depth(r, circle, 0.1, 0.0).exists);
  CHECK_FALSE(normal_depth(r, circle, 0.1, -0.01).exists);
  CHECK(normal_depth(r, circle, 0.0, 0.01).depth_m == 0.0);
}

TEST_CASE("critical depth satisfies Q^2 T = g A^3, Fr = 1, and minimises E and M", "[depth]") {
  for (const Section& s : {circle, box}) {
    for (double q : {0.001, 0.05, 0.4, 1.2}) {
      const DepthSolve yc = critical_depth(s, q);
      REQUIRE(yc.exists);
      CHECK(froude_number(s, q, yc.depth_m) == Approx(1.0).epsilon(1e-6));
      const double d = 1e-3 * yc.depth_m;
      CHECK(specific_energy_m(s, q, yc.depth_m) < specific_energy_m(s, q, yc.depth_m + d));
      CHECK(specific_energy_m(s, q, yc.depth_m) < specific_energy_m(s, q, yc.depth_m - d));
      CHECK(specific_force_m3(s, q, yc.depth_m) < specific_force_m3(s, q, yc.depth_m + d));
      CHECK(specific_force_m3(s, q, yc.depth_m) < specific_force_m3(s, q, yc.depth_m - d));
    }
  }
}

TEST_CASE("critical depth near a circle's crown is found and stays below the rise", "[depth]") {
  for (double frac : {0.95, 0.99, 0.999, 0.99999}) {
    const double y = frac * 0.75;
    const Geometry geo = geometry_at(circle, y);
    const double q = std::sqrt(g * std::pow(geo.area_m2, 3) / geo.top_width_m);
    const DepthSolve yc = critical_depth(circle, q);
    REQUIRE(yc.exists);
    CHECK(yc.depth_m == Approx(y).margin(2e-7));
  }
  // A box cannot carry critical flow above its soffit.
  const DepthSolve none = critical_depth(box, std::sqrt(g * std::pow(1.8, 2) * std::pow(1.2, 3)) * 1.01);
  CHECK_FALSE(none.exists);
  CHECK(none.depth_m == 1.2);
}

TEST_CASE("specific energy and force by definition; full sections use the pressure head", "[depth]") {
  const Geometry geo = geometry_at(box, 0.5);
  CHECK(specific_energy_m(box, 0.9, 0.5) == Approx(0.5 + std::pow(0.9 / geo.area_m2, 2) / (2 * g)));
  CHECK(specific_force_m3(box, 0.9, 0.5) == Approx(0.81 / (g * 0.9) + 1.8 * 0.125));
  const double af = std::numbers::pi * 0.75 * 0.75 / 4;
  CHECK(specific_force_m3(circle, 0.9, 2.0) == Approx(0.81 / (g * af) + af * (2.0 - 0.375)));
  CHECK(specific_force_m3(circle, 0.9, 0.75) == Approx(specific_force_m3(circle, 0.9, 0.75 * (1 - 1e-10))).epsilon(1e-6));
  CHECK(froude_number(circle, 0.9, 0.75) == 0.0);
}

TEST_CASE("bad depth arguments are rimline::Error(bad_argument)", "[depth][bad]") {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  auto is_bad = [](auto&& f) {
    try {
      f();
    } catch (const rimline::Error& e) {
      return e.kind() == rimline::ErrorKind::bad_argument;
    }
    return false;
  };
  CHECK(is_bad([&] { normal_depth(Roughness{}, circle, nan, 0.01); }));
  CHECK(is_bad([&] { normal_depth(Roughness{}, circle, 0.1, nan); }));
  CHECK(is_bad([&] { normal_depth(Roughness{}, Section{Shape::circular, -1, 0, 0, {}}, 0.1, 0.01); }));
  CHECK(is_bad([&] { critical_depth(circle, -0.1); }));
  CHECK(is_bad([&] { peak_partly_full_flow(Roughness{}, circle, 0.0); }));
  CHECK(is_bad([&] { froude_number(circle, 0.1, 0.0); }));
  CHECK(is_bad([&] { specific_force_m3(circle, 0.1, nan); }));
}
