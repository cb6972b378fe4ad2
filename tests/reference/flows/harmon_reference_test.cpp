// The Harmon peaking factor against the published formula.
#include <catch2/catch.hpp>
#include <cmath>

#include "rimline/flows/peaking.hpp"

using rimline::flows::harmon_peaking_factor;

// Recommended Standards for Wastewater Facilities (Ten States Standards), ratio of peak hourly to
// average daily flow (18 + sqrt(P)) / (4 + sqrt(P)), P in thousands (Harmon; section and edition from
// memory). The values are the formula evaluated by hand, exact in decimal where the root is whole;
// tolerance 1e-12 relative (double rounding only).
TEST_CASE("Harmon peaking factor at a few populations", "[reference][sanitary]") {
  CHECK(harmon_peaking_factor(1000.0) == Approx(19.0 / 5.0).epsilon(1e-12));     // sqrt 1 = 1:  3.8
  CHECK(harmon_peaking_factor(4000.0) == Approx(20.0 / 6.0).epsilon(1e-12));     // sqrt 4 = 2:  3.333
  CHECK(harmon_peaking_factor(16000.0) == Approx(22.0 / 8.0).epsilon(1e-12));    // sqrt 16 = 4: 2.75
  CHECK(harmon_peaking_factor(100000.0) == Approx(28.0 / 14.0).epsilon(1e-12));  // sqrt 100 = 10: 2.0
  CHECK(harmon_peaking_factor(0.0) == Approx(4.5).epsilon(1e-12));               // 18 / 4
  // A population that is not a perfect square: (18 + sqrt 2.5) / (4 + sqrt 2.5).
  CHECK(harmon_peaking_factor(2500.0) == Approx((18.0 + std::sqrt(2.5)) / (4.0 + std::sqrt(2.5))).epsilon(1e-12));
}
