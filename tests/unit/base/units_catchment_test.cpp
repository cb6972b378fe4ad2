// The units the catchment flows added, against their definitions (NIST SP 811, 2008 ed., Appendix B:
// inch 0.0254 m, foot 0.3048 m, US gallon 231 in^3, acre 43,560 ft^2, mile 5280 ft; all exact).
#include <catch2/catch.hpp>

#include "rimline/units.hpp"

using namespace rimline::units;

TEST_CASE("time, intensity and per-capita units convert exactly", "[units]") {
  CHECK(to_si(10.0, *parse_unit("min")) == 600.0);
  CHECK(to_si(1.5, *parse_unit("h")) == 5400.0);
  CHECK(to_si(36.0, *parse_unit("mm/h")) == Approx(1.0e-5).epsilon(1e-15));
  CHECK(to_si(1.0, *parse_unit("in/h")) == Approx(0.0254 / 3600.0).epsilon(1e-15));
  CHECK(to_si(86400.0, *parse_unit("L/d")) == Approx(1.0e-3).epsilon(1e-15));
  // 100 gpd = 100 x 231 x 0.0254^3 m^3 per day
  CHECK(to_si(100.0, *parse_unit("gpcd")) == Approx(100.0 * 231.0 * 0.0254 * 0.0254 * 0.0254 / 86400.0).epsilon(1e-15));
  CHECK(to_si(1.0, *parse_unit("L/s/km")) == Approx(1.0e-6).epsilon(1e-15));
  CHECK(to_si(1.0, *parse_unit("L/s/ha")) == Approx(1.0e-7).epsilon(1e-15));
  CHECK(to_si(1.0, *parse_unit("gpd/mi")) ==
        Approx(231.0 * 0.0254 * 0.0254 * 0.0254 / 86400.0 / (5280.0 * 0.3048)).epsilon(1e-15));
  CHECK(to_si(1.0, *parse_unit("gpd/acre")) ==
        Approx(231.0 * 0.0254 * 0.0254 * 0.0254 / 86400.0 / (43560.0 * 0.3048 * 0.3048)).epsilon(1e-15));
  CHECK(dimension_of(*parse_unit("mm/h")) == Dimension::intensity);
  CHECK(display_unit(Dimension::intensity, System::us) == Unit::in_h);
  CHECK(display_unit(Dimension::time, System::si) == Unit::min);
}

// The Rational Method's unit constants follow from these definitions: C i A with i in mm/h and A in
// ha gives m^3/s x 360 (1e-3/3600 x 1e4 = 1/360); with i in in/h and A in acres it gives cfs / 1.008
// (0.0254/3600 x 4046.856 m^3/s = 0.0285532 m^3/s = 1.00833 cfs). Checked here to 1e-5 (the usual
// "1.008" is rounded).
TEST_CASE("the Rational Method unit constants follow from SI", "[units]") {
  CHECK(to_si(1.0, Unit::mm_h) * to_si(1.0, Unit::ha) == Approx(1.0 / 360.0).epsilon(1e-12));
  CHECK(from_si(to_si(1.0, Unit::in_h) * to_si(1.0, Unit::acre), Unit::cfs) == Approx(1.00833).epsilon(1e-5));
}
