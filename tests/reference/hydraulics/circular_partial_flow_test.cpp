// Hydraulic elements of a partly full circular section, against published tables and charts.
#include <catch2/catch.hpp>

#include <array>
#include <cmath>

#include "rimline/hydraulics/depth.hpp"

using namespace rimline::hydraulics;

namespace {
const Section unit_circle{Shape::circular, 1.0, 0.0, 0.0, {}};

struct ElementsRow {
  double y_over_d, area_over_d2, radius_over_d;
};
}  // namespace

// Source: Chow, V.T. (1959) Open-Channel Hydraulics, McGraw-Hill, Appendix A, table of geometric
// elements of circular sections, A/D^2 and R/D at y/D (values from memory). The table is given to
// four decimals, so the tolerance is half a unit in the last place plus rounding: 1e-4.
TEST_CASE("circular geometric elements: Chow (1959) Appendix A (from memory), 1e-4", "[reference][section]") {
  constexpr std::array<ElementsRow, 9> table{{
      {0.10, 0.0409, 0.0635},
      {0.20, 0.1118, 0.1206},
      {0.30, 0.1982, 0.1709},
      {0.40, 0.2934, 0.2142},
      {0.50, 0.3927, 0.2500},
      {0.60, 0.4920, 0.2776},
      {0.70, 0.5872, 0.2962},
      {0.80, 0.6736, 0.3042},
      {0.90, 0.7445, 0.2980},
  }};
  for (const auto& row : table) {
    INFO("y/D = " << row.y_over_d);
    const Geometry g = geometry_at(unit_circle, row.y_over_d);
    CHECK(g.area_m2 == Approx(row.area_over_d2).margin(1e-4));
    CHECK(g.hydraulic_radius_m == Approx(row.radius_over_d).margin(1e-4));
  }
}

// Source: the partial-flow "hydraulic elements" chart for circular sections with constant n, as
// printed in ASCE Manual of Practice No. 37 (1969) "Design and Construction of Sanitary and Storm
// Sewers" and reproduced widely (values from memory): Q/Qfull peaks at about 1.076 at y/D ~ 0.938,
// V/Vfull peaks at about 1.140 at y/D ~ 0.81; at y/D = 0.5, Q/Qfull = 0.5 and V/Vfull = 1 exactly
// (R is D/4 at half and at full depth). Chart read-off precision: 0.005 in the ratios and in y/D.
TEST_CASE("partial-flow hydraulic elements of a circle, constant n (ASCE MOP 37 chart, from memory)", "[reference][section]") {
  const Roughness manning;
  const double slope = 0.002;
  const double q_full = full_capacity_m3_s(manning, unit_circle, slope);
  const double v_full = q_full / full_geometry(unit_circle).area_m2;
  auto q_ratio = [&](double y) { return uniform_flow_m3_s(manning, unit_circle, y, slope) / q_full; };
  auto v_ratio = [&](double y) { return q_ratio(y) * q_full / geometry_at(unit_circle, y).area_m2 / v_full; };

  CHECK(q_ratio(0.5) == Approx(0.5).epsilon(1e-12));
  CHECK(v_ratio(0.5) == Approx(1.0).epsilon(1e-12));

  const PeakFlow peak = peak_partly_full_flow(manning, unit_circle, slope);
  CHECK(peak.depth_m == Approx(0.938).margin(0.005));
  CHECK(peak.flow_m3_s / q_full == Approx(1.076).margin(0.005));

  double best_y = 0.0, best_v = 0.0;
  for (double y = 0.5; y < 1.0; y += 1e-4) {
    if (v_ratio(y) > best_v) {
      best_v = v_ratio(y);
      best_y = y;
    }
  }
  CHECK(best_y == Approx(0.81).margin(0.005));
  CHECK(best_v == Approx(1.140).margin(0.005));

  // Chart points (from memory, +-0.01): Q/Qfull ~ 0.98 at y/D = 0.8, ~ 0.137 at y/D = 0.25.
  CHECK(q_ratio(0.8) == Approx(0.98).margin(0.01));
  CHECK(q_ratio(0.25) == Approx(0.137).margin(0.01));
}

// Above the peak the partly-full section cannot carry the flow: no normal depth (the numerical
// behaviour the chart implies; no further source).
TEST_CASE("no normal depth above the 1.076 Qfull peak", "[reference][depth]") {
  const Roughness manning;
  const double q_full = full_capacity_m3_s(manning, unit_circle, 0.002);
  CHECK(normal_depth(manning, unit_circle, 1.07 * q_full, 0.002).exists);
  CHECK_FALSE(normal_depth(manning, unit_circle, 1.08 * q_full, 0.002).exists);
}
