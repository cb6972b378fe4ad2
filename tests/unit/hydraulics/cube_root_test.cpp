// The friction kernels' cube root against the C library's (ISO C 7.12.7.1 cbrt, through <cmath>):
// the reference is a general-purpose library, the tolerance a few units in the last place.
#include <catch2/catch.hpp>

#include <cmath>
#include <limits>
#include <random>

#include "hydraulics/cube_root.hpp"

using rimline::hydraulics::detail::cube_root;

namespace {
double ulps_apart(double a, double b) { return std::fabs(a - b) / (std::numeric_limits<double>::epsilon() * std::fabs(b)); }
}  // namespace

TEST_CASE("cube_root agrees with std::cbrt within 4 ulp over the hydraulic radii and far beyond", "[friction]") {
  std::mt19937_64 rng(20261202);
  std::uniform_real_distribution<double> log2x(-990.0, 990.0);
  double worst = 0.0;
  for (int i = 0; i < 200000; ++i) {
    const double x = std::exp2(log2x(rng));
    worst = std::max(worst, ulps_apart(cube_root(x), std::cbrt(x)));
  }
  // Radii and their squares as the Manning kernels see them: 1 um to 10 m, densely.
  for (double x = 1e-6; x < 100.0; x *= 1.0001) worst = std::max(worst, ulps_apart(cube_root(x), std::cbrt(x)));
  CHECK(worst <= 4.0);
}

TEST_CASE("cube_root: exact cubes, and the edges handed to std::cbrt", "[friction]") {
  for (double r : {0.125, 0.5, 1.0, 2.0, 3.0, 10.0, 0.1}) CHECK(ulps_apart(cube_root(r * r * r), r) <= 4.0);
  CHECK(cube_root(0.0) == 0.0);
  CHECK(cube_root(-8.0) == -2.0);
  CHECK(cube_root(std::numeric_limits<double>::denorm_min()) == std::cbrt(std::numeric_limits<double>::denorm_min()));
  CHECK(std::isinf(cube_root(std::numeric_limits<double>::infinity())));
  CHECK(std::isnan(cube_root(std::numeric_limits<double>::quiet_NaN())));
}
