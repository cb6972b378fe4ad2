// [[pump_stations]] and [force_mains] in the project file: values in SI, and the exact messages
// for bad input.
#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>

#include "rimline/error.hpp"
#include "rimline/config/project.hpp"

using namespace rimline;

namespace {

const std::string base = R"([pipes]
source = "pipes.gpkg"
[pipes.fields]
rated_pressure = { field = "PN", unit = "psi" }
)";

std::string error_of(const std::string& text) {
  try {
    config::parse_project(text, "/proj/run.toml");
  } catch (const Error& e) {
    return e.what();
  }
  return "";
}

}  // namespace

TEST_CASE("pump stations: levels, curve, fittings and force-main settings in SI", "[project][force_main]") {
  const auto p = config::parse_project(base + R"(
[[pump_stations]]
id = "WW-1"
pump_on = "10 ft"
pump_off = "2 m"
duty_pumps = 2
curve = [["0 gpm", "100 ft"], ["500 gpm", "80 ft"], ["1000 gpm", "40 ft"]]
discharge = "MH-7"
fittings = [{ k = 0.5, count = 4 }, { k = 1.2 }]

[force_mains]
cover = "4 ft"
spacing = "5 m"
pressure_min = "-2 m"
velocity_min = "2 ft/s"
velocity_max = "8 ft/s"
friction = "darcy_weisbach"
hazen_c = 140
)",
                                   "/proj/run.toml");
  REQUIRE(p.pump_stations.size() == 1);
  const auto& s = p.pump_stations[0];
  CHECK(s.id == "WW-1");
  CHECK(s.pump_on_m == Approx(3.048));  // 10 ft x 0.3048 m/ft (exact, NIST SP 811 B.8)
  CHECK(s.pump_off_m == Approx(2.0));
  CHECK(s.duty_pumps == 2);
  REQUIRE(s.curve.size() == 3);
  CHECK(s.curve[1].flow_m3_s == Approx(500.0 * 231.0 * std::pow(0.0254, 3) / 60.0));  // 1 gal = 231 in^3 (NIST SP 811)
  CHECK(s.curve[2].head_m == Approx(12.192));
  CHECK(s.discharge_id == "MH-7");
  CHECK(s.fittings_k == Approx(3.2));
  CHECK(p.force_mains.cover_m == Approx(1.2192));
  CHECK(p.force_mains.pressure_min_m == Approx(-2.0));
  CHECK(p.force_mains.velocity_min_m_s == Approx(0.6096));
  CHECK(p.force_mains.friction == hydraulics::FrictionLaw::darcy_weisbach);
  CHECK(p.pipe_fields.rated_pressure.unit == units::Unit::psi);
  // 1 psi = 6894.757 Pa (NIST SP 811, 2008, B.8); 1 m of water (conventional) = 9806.65 Pa.
  CHECK(units::to_si(150.0, units::Unit::psi) == Approx(150.0 * 6894.757 / 9806.65).epsilon(1e-9));
  CHECK(units::to_si(1000.0, units::Unit::kpa) == Approx(101.97162).epsilon(1e-6));
}

TEST_CASE("pump stations: a pump-curve table file", "[project][force_main]") {
  const auto dir = std::filesystem::temp_directory_path() / "rimline_pump_table_test";
  std::filesystem::create_directories(dir);
  {
    std::ofstream f(dir / "pump.csv");
    f << "flow_lps,head_m\n0,30\n20,27.5\n40,20\n";
  }
  const auto p = config::parse_project(base + R"(
[[pump_stations]]
id = "WW-1"
pump_on = "3 m"
pump_off = "2 m"
curve_table = { source = "pump.csv", flow_unit = "L/s", head_unit = "m" }
)",
                                   (dir / "run.toml").string());
  REQUIRE(p.pump_stations[0].curve.size() == 3);
  CHECK(p.pump_stations[0].curve[1].flow_m3_s == Approx(0.02));
  CHECK(p.pump_stations[0].curve[2].head_m == Approx(20.0));
  {
    std::ofstream f(dir / "pump.csv");
    f << "flow_lps,head_m\n0,30\n20;27.5\n";
  }
  CHECK(error_of(base + R"(
[[pump_stations]]
id = "WW-1"
pump_on = "3 m"
pump_off = "2 m"
curve_table = { source = ")" + (dir / "pump.csv").string() + R"(", flow_unit = "L/s", head_unit = "m" }
)") == (dir / "pump.csv").string() + ": line 3: expected two numbers \"flow,head\", found \"20;27.5\"");
  std::filesystem::remove_all(dir);
}

TEST_CASE("pump stations: bad input stops the run with the file, line and key", "[project][force_main][bad]") {
  const std::string station = base + R"(
[[pump_stations]]
id = "WW-1"
pump_on = "3 m"
pump_off = "2 m"
)";
  // A pump curve whose head rises with flow.
  CHECK(error_of(station + R"(curve = [["0 L/s", "20 m"], ["10 L/s", "22 m"]])") ==
        "/proj/run.toml: line 10: key pump_stations[1].curve: pump curve heads must fall strictly with flow (point 2)");
  CHECK(error_of(station + R"(curve = [["0 L/s", "20 m"], ["10 L/s"]])") ==
        "/proj/run.toml: line 10: key pump_stations[1].curve: each point must be a pair of quantity strings "
        "[\"<flow>\", \"<head>\"]");
  CHECK(error_of(station) == "/proj/run.toml: line 6: key pump_stations[1].curve: the pump curve is missing "
                             "(curve = [[\"0 L/s\", \"30 m\"], ...])");
  CHECK(error_of(base + R"(
[[pump_stations]]
pump_on = "3 m"
)") == "/proj/run.toml: line 6: key pump_stations[1].id: the wet-well structure id is missing");
  CHECK(error_of(station + R"(curve = [["0 L/s", "20 m"], ["10 L/s", "12 m"]]
duty_pump = 2)") == "/proj/run.toml: line 11: key pump_stations[1].duty_pump: unknown key; did you mean \"duty_pumps\"?");
  CHECK(error_of(base + R"(
[[pump_stations]]
id = "WW-1"
pump_on = "2 m"
pump_off = "3 m"
curve = [["0 L/s", "20 m"], ["10 L/s", "12 m"]]
)") == "/proj/run.toml: line 8: key pump_stations[1].pump_on: must be above pump_off");
  CHECK(error_of(base + "[force_mains]\nfriction = \"manning\"\n") ==
        "/proj/run.toml: line 6: key force_mains.friction: \"manning\" is not one of \"hazen_williams\", "
        "\"darcy_weisbach\"");
}

TEST_CASE("named pump curves and the pump-station point layer's mapping", "[project][force_main]") {
  const auto p = config::parse_project(base + R"(
[pump_curves]
SMALL = [["0 L/s", "16 m"], ["20 L/s", "2 m"]]

[[pump_stations]]
id = "WW-1"
pump_on = "3 m"
pump_off = "2 m"
curve = "SMALL"

[pump_station_points]
source = "stations.gpkg"
[pump_station_points.fields]
id = "WW"
curve = "CURVE"
pump_on = { field = "ON", unit = "ft" }
pump_off = { field = "OFF", unit = "ft" }
)",
                                   "/proj/run.toml");
  REQUIRE(p.pump_stations.size() == 1);
  CHECK(p.pump_stations[0].curve.size() == 2);
  CHECK(p.pump_stations[0].curve[1].flow_m3_s == Approx(0.02));
  CHECK(p.pump_station_points.source == "/proj/stations.gpkg");
  CHECK(p.pump_station_fields.pump_on.unit == units::Unit::ft);
  CHECK(error_of(base + R"(
[[pump_stations]]
id = "WW-1"
pump_on = "3 m"
pump_off = "2 m"
curve = "BIG"
)") == "/proj/run.toml: line 10: key pump_stations[1].curve: \"BIG\" is not a [pump_curves] entry");
  CHECK(error_of(base + R"(
[pump_curves]
UP = [["0 L/s", "16 m"], ["20 L/s", "18 m"]]
)") == "/proj/run.toml: line 7: key pump_curves.UP: pump curve heads must fall strictly with flow (point 2)");
  CHECK(error_of(base + R"(
[pump_station_points]
source = "s.gpkg"
[pump_station_points.fields]
id = "WW"
curve = "C"
pump_on = { field = "ON", unit = "m" }
)") == "/proj/run.toml: line 8: key pump_station_points.fields.pump_off: must be mapped (a pump station needs it)");
}
