// The catchment sections of the project file parse to SI (schema in include/rimline/config/project.hpp).
// Conversions by the unit definitions (NIST SP 811, 2008 ed., B.8: inch 0.0254 m, US gallon 231 in^3).
#include <catch2/catch.hpp>

#include "rimline/config/project.hpp"

using namespace rimline;

namespace {

const std::string base = R"(
[pipes]
source = "pipes.gpkg"
[pipes.fields]
id = "ID"
)";

}  // namespace

TEST_CASE("project: rational sections parse to SI", "[project][rational]") {
  const auto p = config::parse_project(base + R"(
[flows]
mode = "rational"
[catchments]
source = "sub.gpkg"
layer = "basins"
outlet_search = "100 ft"
[catchments.fields]
id = "BASIN"
inlet_time = { field = "TI", unit = "min" }
[catchments.defaults]
runoff_c = 0.45
inlet_time = "0.25 h"
[rational]
return_period = "25yr"
travel_velocity = "full_flow"
[rational.idf.10yr]
a = 60
b = "10 min"
c = 0.75
intensity_unit = "in/h"
[rational.idf.25yr]
durations = ["5 min", "1 h"]
intensities = ["7 in/h", "2.5 in/h"]
)",
                                   "/proj/run.toml");
  CHECK(p.flow_mode == config::FlowMode::rational);
  CHECK(p.catchments.source.source == "/proj/sub.gpkg");
  CHECK(p.catchments.source.layer == "basins");
  CHECK(p.catchments.outlet_search_m == Approx(30.48));
  CHECK(p.catchments.fields.inlet_time.unit == units::Unit::min);
  CHECK(*p.catchments.default_runoff_c == 0.45);
  CHECK(p.catchments.default_inlet_time_s == Approx(900.0));
  CHECK(p.rational.full_flow_velocity);
  const auto& idf = p.rational.idf;
  CHECK(idf.label == "25yr");
  CHECK(idf.kind == model::IdfCurve::Kind::table);
  REQUIRE(idf.durations_s.size() == 2);
  CHECK(idf.durations_s[1] == Approx(3600.0));
  CHECK(idf.intensities_m_s[0] == Approx(7.0 * 0.0254 / 3600.0).epsilon(1e-12));
}

TEST_CASE("project: a single IDF needs no return period; the formula keeps its unit", "[project][rational]") {
  const auto p = config::parse_project(base + R"(
[flows]
mode = "rational"
[catchments]
source = "sub.gpkg"
[rational.idf."10 yr"]
a = 1650
b = "12 min"
c = 0.85
intensity_unit = "mm/h"
)",
                                   "/proj/run.toml");
  CHECK(p.rational.idf.label == "10 yr");
  CHECK(p.rational.idf.kind == model::IdfCurve::Kind::formula);
  CHECK(p.rational.idf.b_min == Approx(12.0));
  CHECK(p.rational.idf.intensity_si_per_unit == Approx(1.0e-3 / 3600.0).epsilon(1e-12));
  CHECK_FALSE(p.rational.full_flow_velocity);
}

TEST_CASE("project: sanitary section parses to SI", "[project][sanitary]") {
  const auto p = config::parse_project(base + R"(
[structures]
source = "mh.gpkg"
[structures.fields]
population = "POP"
[flows]
mode = "sanitary"
[sanitary]
per_capita = "100 gpcd"
peaking_factor = 2.5
infiltration_per_area = "0.2 L/s/ha"
)",
                                   "/proj/run.toml");
  CHECK(p.flow_mode == config::FlowMode::sanitary);
  CHECK(p.structure_fields.population == "POP");
  CHECK(p.sanitary.per_capita_m3_s == Approx(100.0 * 231.0 * 0.0254 * 0.0254 * 0.0254 / 86400.0).epsilon(1e-12));
  CHECK(*p.sanitary.peaking_constant == 2.5);
  CHECK(*p.sanitary.infiltration_per_area_m3_s_m2 == Approx(0.2e-3 / 1.0e4).epsilon(1e-12));
  CHECK_FALSE(p.sanitary.infiltration_per_length_m3_s_m);
}
