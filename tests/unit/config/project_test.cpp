#include "rimline/config/project.hpp"

#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>

#include "rimline/error.hpp"

using namespace rimline;
using rimline::config::parse_project;

namespace {

// Message of the Error thrown by parsing `text`, or "" if it parsed.
std::string error_of(const std::string& text) {
  try {
    parse_project(text, "/proj/run.toml");
  } catch (const Error& e) {
    CHECK(e.kind() == ErrorKind::bad_config);
    return e.what();
  }
  return "";
}

const char* good_project = R"(
[project]
name = "Test"
units = "us"

[pipes]
source = "data/pipes.gpkg"
layer = "mains"
snap_tolerance = "2 ft"
[pipes.fields]
id = "PIPE_ID"
from = "US_NODE"
to = "DS_NODE"
material = "MAT"
diameter = { field = "DIA_IN", unit = "in" }
invert_up = { field = "US_IL", unit = "us_ft" }
invert_down = { field = "DS_IL", unit = "ft" }
length = { field = "LEN", unit = "ft" }
flow = { field = "Q", unit = "cfs" }
[pipes.defaults]
manning_n = 0.013
ks = "1.5 mm"
diameter = "300 mm"
[pipes.defaults.manning_n_by_material]
RC = 0.013
PVC = 0.011
[pipes.shapes]
circular = ["CIRC", "C"]
box = "BOX"

[structures]
source = "PG:dbname=city"
layer = "manholes"
[structures.fields]
id = "MH_ID"
type = "KIND"
rim = { field = "RIM", unit = "ft" }
[structures.types]
outfall = ["OF"]
manhole = ["MH", "SMH"]
[structures.defaults]
diameter = "48 in"
loss_k = 0.5

[tailwater]
mode = "fixed"
levels = ["12.4 m", "13 m"]

[methods]
friction = "darcy_weisbach"
water_temperature = "59 F"
[methods.k_by_type]
junction = 0.6

[criteria]
freeboard = "1 ft"
velocity_min = "2 ft/s"
velocity_max = "off"
capacity_ratio_max = 1
)";

}  // namespace

TEST_CASE("a complete project file parses into SI values", "[io][project]") {
  const config::Project p = parse_project(good_project, "/proj/run.toml");
  CHECK(p.name == "Test");
  CHECK(p.report_units == units::System::us);
  CHECK(p.directory == "/proj");
  // Relative paths resolve against the project directory; connection strings are kept.
  CHECK(p.pipes.source == "/proj/data/pipes.gpkg");
  CHECK(p.pipes.layer == "mains");
  CHECK(p.structures.source == "PG:dbname=city");
  // 2 ft = 0.6096 m exactly (NIST SP 811, 2008 ed., B.8: 1 ft = 0.3048 m).
  CHECK(p.snap_tolerance_m == Approx(0.6096).epsilon(1e-15));
  CHECK(p.pipe_fields.id == "PIPE_ID");
  CHECK(p.pipe_fields.diameter.field == "DIA_IN");
  CHECK(p.pipe_fields.diameter.unit == units::Unit::in);
  CHECK(p.pipe_fields.invert_up.unit == units::Unit::us_ft);
  CHECK(p.pipe_fields.flow.unit == units::Unit::cfs);
  CHECK_FALSE(p.pipe_fields.width.mapped());
  CHECK(*p.pipe_defaults.ks_m == Approx(0.0015));
  CHECK(*p.pipe_defaults.diameter_m == Approx(0.3));
  CHECK(p.pipe_defaults.manning_n_by_material.at("PVC") == 0.011);
  CHECK(p.shape_values.at("C") == hydraulics::Shape::circular);
  CHECK(p.shape_values.at("BOX") == hydraulics::Shape::box);
  CHECK(p.structure_type_values.at("SMH") == "manhole");
  // 48 in = 1.2192 m exactly (NIST SP 811, 2008 ed., B.8: 1 in = 0.0254 m).
  CHECK(p.structure_defaults.diameter_m == Approx(1.2192).epsilon(1e-15));
  CHECK(p.tailwater_mode == config::TailwaterMode::fixed);
  REQUIRE(p.tailwater_levels_m.size() == 2);
  CHECK(p.tailwater_levels_m[1] == 13.0);
  CHECK(p.methods.friction == hydraulics::FrictionLaw::darcy_weisbach);
  // 59 F = 15 C (NIST SP 811, 2008 ed., 4.2.1.1: t/C = (t/F - 32)/1.8).
  CHECK(p.methods.water_temperature_c == Approx(15.0).epsilon(1e-12));
  CHECK(p.methods.k_by_type.at("junction") == 0.6);
  CHECK(p.criteria.freeboard_m == Approx(0.3048));
  CHECK(p.criteria.velocity_min_m_s == Approx(0.6096));
  CHECK_FALSE(p.criteria.velocity_max_m_s.has_value());
  CHECK(p.criteria.capacity_ratio_max == 1.0);
}

TEST_CASE("defaults apply when optional tables are absent", "[io][project]") {
  const config::Project p = parse_project("[pipes]\nsource = \"/abs/p.geojson\"\n", "run.toml");
  CHECK(p.directory == ".");
  CHECK(p.pipes.source == "/abs/p.geojson");
  CHECK(p.structures.source.empty());
  CHECK(p.snap_tolerance_m == 0.5);
  CHECK(p.criteria.velocity_max_m_s.value() == 4.6);
  CHECK(p.plausibility.invert_max_m == 900.0);
  CHECK(p.methods.friction == hydraulics::FrictionLaw::manning);
}

TEST_CASE("unknown keys are errors with a suggestion", "[io][project]") {
  CHECK(error_of("[pipes]\nsource = \"p.shp\"\n[pipes.feilds]\nid = \"X\"\n") ==
        "/proj/run.toml: line 3: key pipes.feilds: unknown key; did you mean \"fields\"?");
  CHECK(error_of("[pipes]\nsource = \"p.shp\"\n[pipes.fields]\ndiamter = { field = \"D\", unit = \"mm\" }\n") ==
        "/proj/run.toml: line 4: key pipes.fields.diamter: unknown key; did you mean \"diameter\"?");
  CHECK(error_of("[pipes]\nsource = \"p.shp\"\nzzz = 1\n") == "/proj/run.toml: line 3: key pipes.zzz: unknown key");
  CHECK(error_of("[pipe]\nsource = \"p.shp\"\n") ==
        "/proj/run.toml: line 1: key pipe: unknown key; did you mean \"pipes\"?");
}

TEST_CASE("values of the wrong type are errors", "[io][project]") {
  CHECK(error_of("[pipes]\nsource = 3\n") ==
        "/proj/run.toml: line 2: key pipes.source: expected a string, found an integer");
  CHECK(error_of("[pipes]\nsource = \"p.shp\"\nsnap_tolerance = 0.5\n") ==
        "/proj/run.toml: line 3: key pipes.snap_tolerance: expected a quantity string \"<number> <unit>\" (a length), "
        "found a number");
  // A length field without its unit is refused rather than guessed.
  CHECK(error_of("[pipes]\nsource = \"p.shp\"\n[pipes.fields]\ndiameter = \"DIA\"\n") ==
        "/proj/run.toml: line 4: key pipes.fields.diameter: expected { field = \"NAME\", unit = \"...\" } "
        "(a length needs its unit), found a string");
  CHECK(error_of("[pipes]\nsource = \"p.shp\"\n[methods]\nfriction = \"maning\"\n") ==
        "/proj/run.toml: line 4: key methods.friction: \"maning\" is not one of \"manning\", \"darcy_weisbach\"; "
        "did you mean \"manning\"?");
  CHECK(error_of("[project]\nname = \"x\"\n") ==
        "/proj/run.toml: key pipes.source: missing; the project needs a [pipes] table with the pipe layer's source");
  CHECK(error_of("[pipes\n").rfind("/proj/run.toml: line 1: ", 0) == 0);
}

TEST_CASE("bad units and wrong dimensions are errors", "[io][project]") {
  CHECK(error_of("[pipes]\nsource = \"p.shp\"\nsnap_tolerance = \"0.5 mtr\"\n") ==
        "/proj/run.toml: line 3: key pipes.snap_tolerance: unknown unit \"mtr\" in \"0.5 mtr\"; did you mean \"m\"? (a length takes m, mm, cm, ft, us_ft, in)");
  CHECK(error_of("[pipes]\nsource = \"p.shp\"\n[criteria]\nfreeboard = \"0.3 m/s\"\n") ==
        "/proj/run.toml: line 4: key criteria.freeboard: \"0.3 m/s\" is a velocity, expected a length");
  CHECK(error_of("[pipes]\nsource = \"p.shp\"\n[criteria]\nfreeboard = \"0.3\"\n") ==
        "/proj/run.toml: line 4: key criteria.freeboard: \"0.3\" has no unit; expected a length");
  CHECK(error_of("[pipes]\nsource = \"p.shp\"\n[pipes.fields]\nflow = { field = \"Q\", unit = \"m\" }\n") ==
        "/proj/run.toml: line 4: key pipes.fields.flow.unit: \"m\" is not a unit of flow");
  CHECK(error_of("[pipes]\nsource = \"p.shp\"\n[pipes.fields]\nflow = { field = \"Q\", unti = \"cfs\" }\n") ==
        "/proj/run.toml: line 4: key pipes.fields.flow.unit: the unit is missing");
}

TEST_CASE("parse_quantity converts to SI and checks the dimension", "[io][project]") {
  // Factors: NIST SP 811, 2008 ed., Appendix B.8 (ft, in, gallon exact); B.6 (US survey foot).
  CHECK(config::parse_quantity("10 ft", units::Dimension::length, "x") == Approx(3.048).epsilon(1e-15));
  CHECK(config::parse_quantity(" 3937 us_ft ", units::Dimension::length, "x") == Approx(1200.0).epsilon(1e-15));
  CHECK(config::parse_quantity("1 cfs", units::Dimension::flow, "x") == Approx(0.028316846592).epsilon(1e-12));
  CHECK(config::parse_quantity("250 L/s", units::Dimension::flow, "x") == Approx(0.25));
  CHECK(config::parse_quantity("0.5", units::Dimension::dimensionless, "x") == 0.5);
  CHECK_THROWS_WITH(config::parse_quantity("abc m", units::Dimension::length, "here"),
                    "here: \"abc m\" is not a quantity \"<number> <unit>\"");
}

TEST_CASE("combinations that cannot work are refused", "[io][project]") {
  CHECK(error_of("[pipes]\nsource = \"p.shp\"\nshape_from_height = true\n") ==
        "/proj/run.toml: line 3: key pipes.shape_from_height: needs pipes.fields.height to be mapped");
  CHECK(error_of("[pipes]\nsource = \"p.shp\"\n[tailwater]\nmode = \"fixed\"\n") ==
        "/proj/run.toml: line 3: key tailwater.levels: mode \"fixed\" needs at least one level");
  CHECK(error_of("[pipes]\nsource = \"p.shp\"\n[methods.k_by_type]\nmanhoel = 0.5\n") ==
        "/proj/run.toml: line 4: key methods.k_by_type.manhoel: unknown structure kind; did you mean \"manhole\"?");
}

TEST_CASE("load_project reads a file and names it when missing", "[io][project]") {
  const auto dir = std::filesystem::temp_directory_path() / "rimline_project_test";
  std::filesystem::create_directories(dir);
  const auto file = dir / "p.toml";
  std::ofstream(file) << "[pipes]\nsource = \"../x/pipes.shp\"\n";
  const config::Project p = config::load_project(file.string());
  CHECK(p.pipes.source == (dir.parent_path() / "x" / "pipes.shp").string());
  CHECK_THROWS_WITH(config::load_project((dir / "none.toml").string()),
                    (dir / "none.toml").string() + ": the project file does not exist (check the path; `rimline fields SOURCE "
                        "--write-project " + (dir / "none.toml").string() + "` writes a starter)");
}

TEST_CASE("project roughness values are held to the plausible ranges", "[io][project]") {
  CHECK(error_of("[pipes]\nsource = \"p.shp\"\n[pipes.defaults]\nmanning_n = 0.13\n") ==
        "/proj/run.toml: line 4: key pipes.defaults.manning_n: 0.13 is outside the plausible 0.008 to 0.05 "
        "([plausibility] manning_n_min, manning_n_max)");
  CHECK(error_of("[pipes]\nsource = \"p.shp\"\n[pipes.defaults.ks_by_material]\nRC = \"200 mm\"\n") ==
        "/proj/run.toml: line 4: key pipes.defaults.ks_by_material.RC: 0.2 m is outside the plausible 0 m to 0.1 m "
        "([plausibility] ks_max)");
  // A wider range is the user's explicit choice.
  const config::Project p = parse_project(
      "[plausibility]\nmanning_n_max = 0.07\n[pipes]\nsource = \"p.shp\"\n[pipes.defaults.manning_n_by_material]\n"
      "CMP = 0.06\n",
      "/proj/run.toml");
  CHECK(p.pipe_defaults.manning_n_by_material.at("CMP") == 0.06);
  CHECK(p.plausibility.manning_n_max == 0.07);
}
