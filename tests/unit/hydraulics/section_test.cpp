// Section geometry: closed forms of the circular segment and the rectangle.
#include <catch2/catch.hpp>

#include <cmath>
#include <limits>
#include <numbers>

#include "rimline/error.hpp"
#include "rimline/hydraulics/section.hpp"

using namespace rimline::hydraulics;
using Catch::Matchers::Contains;

namespace {
const Section circle{Shape::circular, 0.9, 0.0, 0.0, {}};
const Section box{Shape::box, 0.0, 2.0, 1.5, {}};

template <class F>
void expect_bad_argument(F&& f) {
  try {
    f();
    FAIL("expected rimline::Error");
  } catch (const rimline::Error& e) {
    CHECK(e.kind() == rimline::ErrorKind::bad_argument);
  }
}
}  // namespace

TEST_CASE("circle at half depth: A = pi D^2/8, P = pi D/2, T = D, R = D/4 (circle geometry)", "[section]") {
  const Geometry g = geometry_at(circle, 0.45);
  CHECK(g.area_m2 == Approx(std::numbers::pi * 0.81 / 8.0).epsilon(1e-13));
  CHECK(g.wetted_perimeter_m == Approx(std::numbers::pi * 0.45).epsilon(1e-13));
  CHECK(g.top_width_m == Approx(0.9).epsilon(1e-13));
  CHECK(g.hydraulic_radius_m == Approx(0.225).epsilon(1e-13));
  CHECK(g.hydraulic_depth_m == Approx(g.area_m2 / 0.9).epsilon(1e-13));
}

TEST_CASE("circle geometry is symmetric: A(y) + A(D - y) = full area", "[section]") {
  const double full = full_geometry(circle).area_m2;
  for (double f : {1e-6, 0.01, 0.2, 0.37, 0.49}) {
    const double a = geometry_at(circle, f * 0.9).area_m2 + geometry_at(circle, (1.0 - f) * 0.9).area_m2;
    CHECK(a == Approx(full).epsilon(1e-12));
    CHECK(geometry_at(circle, f * 0.9).top_width_m == Approx(geometry_at(circle, (1.0 - f) * 0.9).top_width_m).epsilon(1e-9));
  }
}

TEST_CASE("near-full circle: top width -> 0 accurately, area and perimeter tend to the full values", "[section]") {
  const Geometry full = full_geometry(circle);
  CHECK(full.top_width_m == 0.0);
  CHECK(std::isinf(full.hydraulic_depth_m));
  CHECK(full.hydraulic_radius_m == Approx(0.225).epsilon(1e-14));
  for (double gap : {1e-4, 1e-7, 1e-10}) {
    const Geometry g = geometry_at(circle, 0.9 - gap);
    // T = 2 sqrt(y (D - y)) with D - y known exactly; no cancellation.
    CHECK(g.top_width_m == Approx(2.0 * std::sqrt((0.9 - gap) * gap)).epsilon(1e-6));
    CHECK(g.area_m2 < full.area_m2);
    CHECK(g.area_m2 == Approx(full.area_m2).epsilon(10.0 * std::sqrt(gap)));
    CHECK(g.wetted_perimeter_m == Approx(full.wetted_perimeter_m).epsilon(10.0 * std::sqrt(gap)));
  }
  CHECK(geometry_at(circle, 5.0).area_m2 == full.area_m2);  // above the crown: full section
}

TEST_CASE("box: A = b y, P = b + 2y partly full; P = 2(b + h) full", "[section]") {
  const Geometry g = geometry_at(box, 0.6);
  CHECK(g.area_m2 == Approx(1.2));
  CHECK(g.wetted_perimeter_m == Approx(3.2));
  CHECK(g.top_width_m == Approx(2.0));
  CHECK(g.hydraulic_depth_m == Approx(0.6));
  const Geometry f = full_geometry(box);
  CHECK(f.area_m2 == Approx(3.0));
  CHECK(f.wetted_perimeter_m == Approx(7.0));
  CHECK(f.top_width_m == 0.0);
  CHECK(rise_m(box) == 1.5);
  CHECK(rise_m(circle) == 0.9);
}

TEST_CASE("area moment about the surface: box b y^2/2, semicircle 2 r^3/3, full circle A r", "[section]") {
  CHECK(area_moment_m3(box, 0.6) == Approx(0.36));
  CHECK(area_moment_m3(circle, 0.45) == Approx(2.0 / 3.0 * std::pow(0.45, 3)).epsilon(1e-12));
  CHECK(area_moment_m3(circle, 0.9) == Approx(full_geometry(circle).area_m2 * 0.45).epsilon(1e-12));
  // Continuity at the crown.
  CHECK(area_moment_m3(circle, 0.9 - 1e-9) == Approx(area_moment_m3(circle, 0.9)).epsilon(1e-8));
}

TEST_CASE("bad section arguments are rimline::Error(bad_argument)", "[section][bad]") {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  expect_bad_argument([] { geometry_at(Section{Shape::circular, -0.3, 0, 0, {}}, 0.1); });
  expect_bad_argument([] { full_geometry(Section{Shape::circular, 0.0, 0, 0, {}}); });
  expect_bad_argument([&] { geometry_at(Section{Shape::circular, nan, 0, 0, {}}, 0.1); });
  expect_bad_argument([] { geometry_at(Section{Shape::box, 0.0, 1.0, -1.0, {}}, 0.1); });
  expect_bad_argument([] { geometry_at(circle, 0.0); });
  expect_bad_argument([] { geometry_at(circle, -0.1); });
  expect_bad_argument([&] { geometry_at(circle, nan); });
  CHECK_THROWS_WITH(geometry_at(Section{Shape::circular, -0.3, 0, 0, {}}, 0.1), Contains("diameter"));
}
