#include "rimline/units.hpp"

#include <catch2/catch.hpp>

using namespace rimline::units;

// Exact factors from NIST SP 811 (2008 ed.), Appendix B.8 unless noted. The checks use the
// printed values, not the constants in units.hpp, so a mistyped constant fails here.
TEST_CASE("length factors are the exact NIST SP 811 values", "[base][units]") {
  CHECK(to_si(1.0, Unit::ft) == 0.3048);                               // foot (international) = 3.048 E-01 m, exact
  CHECK(to_si(1.0, Unit::in) == 0.0254);                               // inch = 2.54 E-02 m, exact
  CHECK(to_si(3937.0, Unit::us_ft) == Approx(1200.0).epsilon(1e-15));  // B.6 note: 1 ft (US survey) = 1200/3937 m
  CHECK(to_si(1.0, Unit::us_ft) == Approx(3.048006e-1).epsilon(0).margin(1e-7));  // B.8: 3.048 006 E-01 m
  CHECK(to_si(1500.0, Unit::mm) == Approx(1.5).epsilon(1e-15));
  CHECK(to_si(12.0, Unit::cm) == Approx(0.12).epsilon(1e-15));
}

TEST_CASE("flow, area and velocity factors match NIST SP 811", "[base][units]") {
  CHECK(to_si(1.0, Unit::cfs) ==
        Approx(2.831685e-2).epsilon(0).margin(1e-8));  // cubic foot per second = 2.831 685 E-02 m3/s
  CHECK(to_si(1.0, Unit::gpm) ==
        Approx(6.309020e-5).epsilon(0).margin(1e-11));  // gallon (U.S.) per minute = 6.309 020 E-05 m3/s
  CHECK(to_si(1.0, Unit::mgd) ==
        Approx(4.381264e-2).epsilon(0).margin(1e-8));  // 1e6 gal/day: gallon = 3.785 412 E-03 m3
  // acre = 43 560 ft2. With the international foot (the US definition since 2023, Federal Register
  // 85 FR 62698, from memory) that is 4046.856 422 4 m2 exactly; NIST SP 811 (2008) B.8 prints 4.046 873 E+03 because
  // it used the US survey foot then. rimline uses the international foot.
  CHECK(to_si(1.0, Unit::acre) == Approx(4046.8564224).epsilon(1e-14));
  CHECK(to_si(1.0, Unit::ha) == 1.0e4);                           // hectare = 1.0 E+04 m2, exact
  CHECK(to_si(1.0, Unit::ft_s) == 0.3048);                        // foot per second = 3.048 E-01 m/s, exact
  CHECK(to_si(1.0, Unit::l_s) == Approx(1.0e-3).epsilon(1e-15));  // litre = 1.0 E-03 m3, exact
}

TEST_CASE("temperature and round trips", "[base][units]") {
  CHECK(to_si(212.0, Unit::deg_f) == Approx(100.0).epsilon(1e-15));  // NIST SP 811 4.2.1.1: t/C = (t/F - 32)/1.8
  CHECK(from_si(15.0, Unit::deg_f) == Approx(59.0).epsilon(1e-15));
  for (Unit u : {Unit::ft, Unit::us_ft, Unit::in, Unit::cfs, Unit::mgd, Unit::gpm, Unit::acre})
    CHECK(from_si(to_si(123.456, u), u) == Approx(123.456).epsilon(1e-14));
}

TEST_CASE("unit spellings parse and map to their dimension", "[base][units]") {
  CHECK(parse_unit("ftUS") == Unit::us_ft);
  CHECK(parse_unit("US_FT") == Unit::us_ft);
  CHECK(parse_unit("L/s") == Unit::l_s);
  CHECK(parse_unit("m3/s") == Unit::m3_s);
  CHECK(parse_unit("%") == Unit::percent);
  CHECK_FALSE(parse_unit("furlong").has_value());
  CHECK(dimension_of(Unit::mgd) == Dimension::flow);
  CHECK(dimension_of(Unit::in) == Dimension::length);
  CHECK(unit_symbol(Unit::cfs) == "cfs");
  CHECK(display_unit(Dimension::flow, System::us) == Unit::cfs);
  CHECK(display_unit(Dimension::length, System::si) == Unit::m);
}

TEST_CASE("the unit a field's name states, in its last word", "[units]") {
  CHECK(unit_named_in("US_INV_FT") == Unit::ft);
  CHECK(unit_named_in("DIA_IN") == Unit::in);
  CHECK(unit_named_in("DIA_MM") == Unit::mm);
  CHECK(unit_named_in("depthM") == Unit::m);
  CHECK(unit_named_in("Q_L_S") == Unit::l_s);
  CHECK(unit_named_in("Q_CFS") == Unit::cfs);
  CHECK(unit_named_in("RIM_ELEV") == std::nullopt);
  CHECK(unit_named_in("M") == std::nullopt);      // a name that is only a unit states nothing
  CHECK(unit_named_in("US_MH") == std::nullopt);  // a manhole, not metres of head
  CHECK(unit_symbols(Dimension::length) == "m, mm, cm, ft, us_ft, in");
}
