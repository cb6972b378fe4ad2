// Drawing scales, ticks and station labels.
// Scale series: ISO 5455:1979 Technical drawings - Scales (recommended reductions 1:2, 1:5,
// 1:10 ... 1:10 000), from memory; 2.5 x 10^k is common practice, no source.
// Chainage / station notation (km+m, 100 ft stations): common practice, no source.
// Feet: 0.3048 m exactly (NIST SP 811, 2008 ed., B.8).
#include <catch2/catch.hpp>

#include "report/drawing_scale.hpp"

using namespace rimline;
using namespace rimline::report;

TEST_CASE("preferred reductions round up within the 1-2-2.5-5 series", "[report][scale]") {
  CHECK(preferred_reduction(1234.0) == Approx(2000.0));
  CHECK(preferred_reduction(2000.0) == Approx(2000.0));
  CHECK(preferred_reduction(2001.0) == Approx(2500.0));
  CHECK(preferred_reduction(3000.0) == Approx(5000.0));
  CHECK(preferred_reduction(5001.0) == Approx(10000.0));
  CHECK(preferred_reduction(0.7) == Approx(1.0));
}

TEST_CASE("vertical exaggeration rounds down within 1-2-5", "[report][scale]") {
  CHECK(preferred_exaggeration(13.7) == Approx(10.0));
  CHECK(preferred_exaggeration(49.9) == Approx(20.0));
  CHECK(preferred_exaggeration(50.0) == Approx(50.0));
  CHECK(preferred_exaggeration(1.0) == Approx(1.0));
  CHECK(preferred_exaggeration(0.4) == Approx(1.0));
}

TEST_CASE("tick steps and positions", "[report][scale]") {
  CHECK(nice_step(10.0, 5) == Approx(2.0));
  CHECK(nice_step(1234.0, 5) == Approx(500.0));
  CHECK(nice_step(0.37, 4) == Approx(0.1));
  const auto t = ticks(-0.3, 1.05, 0.5);
  REQUIRE(t.size() == 3);
  CHECK(t[0] == Approx(0.0).margin(1e-12));
  CHECK(t[2] == Approx(1.0));
  CHECK(ticks(0.0, 1.0, 0.25).size() == 5);  // both ends included
  CHECK(decimals_for(0.2) == 1);
  CHECK(decimals_for(0.05) == 2);
  CHECK(decimals_for(5.0) == 0);
}

TEST_CASE("station labels in chainage notation", "[report][scale]") {
  CHECK(station_label(1250.0, units::System::si) == "1+250");
  CHECK(station_label(0.0, units::System::si) == "0+000");
  CHECK(station_label(12.5, units::System::si, 1) == "0+012.5");
  CHECK(station_label(1250.0, units::System::us) == "12+50");
  CHECK(station_label(5.0, units::System::us) == "0+05");
}

TEST_CASE("a frame at preferred scales fits the data", "[report][scale]") {
  // 1000 m over at most 400 mm: 1:2500 exactly fills 400 mm. 10 m over 100 mm would allow
  // V 1:100, i.e. an exaggeration of 25, rounded down to 20: V 1:125, 8 mm per metre.
  const auto f = fit_frame(0.0, 1000.0, 2.0, 12.0, 1.0, 20.0, 10.0, 400.0, 100.0);
  CHECK(f.horizontal_n == Approx(2500.0));
  CHECK(f.exaggeration == Approx(20.0));
  CHECK(f.vertical_n == Approx(125.0));
  CHECK(f.width_mm == Approx(400.0));
  CHECK(f.y1 - f.y0 == Approx(12.5));
  CHECK(f.px(0.0) == Approx(20.0));
  CHECK(f.py(7.0) == Approx(60.0));  // data centred in the box
  // The same 1000 m in international feet gives the same paper scale.
  const auto us = fit_frame(0.0, 1000.0 / 0.3048, 2.0 / 0.3048, 12.0 / 0.3048, 0.3048, 20.0, 10.0, 400.0, 100.0);
  CHECK(us.horizontal_n == Approx(2500.0));
  CHECK(us.vertical_n == Approx(125.0));
  CHECK(us.width_mm == Approx(400.0));
}

TEST_CASE("label thinning keeps priority labels and spaces the rest", "[report][scale]") {
  // Positions in mm; gap 2.6 mm. Priority: the first and the last.
  const std::vector<double> x{0.0, 1.0, 2.0, 3.0, 4.0, 5.0, 10.0};
  const auto drawn = thin_labels(x, {true, false, false, false, false, false, true}, 2.6);
  CHECK(drawn == std::vector<bool>{true, false, false, true, false, false, true});
  // A priority label wins over an earlier ordinary one next to it.
  const auto d2 = thin_labels({0.0, 1.0}, {false, true}, 2.6);
  CHECK(d2 == std::vector<bool>{false, true});
  // Far apart: all drawn.
  CHECK(thin_labels({0.0, 5.0, 10.0}, {}, 2.6) == std::vector<bool>{true, true, true});
}
