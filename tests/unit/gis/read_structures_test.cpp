#include <catch2/catch.hpp>

#include <fstream>
#include <map>

#include "layer_fixture.hpp"
#include "rimline/gis/read_network.hpp"

using namespace rimline;
using rimline::test::FieldSpec;
using rimline::test::Row;

TEST_CASE("structure values are converted and their problems become findings", "[io][read][structures]") {
  const auto dir = test::fresh_dir("structures");
  test::write_layer(dir / "p.gpkg", "GPKG", "p", 32755, wkbLineString, {{"ID", OFTString}},
                    {{"LINESTRING (0 0,100 0)", {"a"}}});
  const std::vector<FieldSpec> fields{{"MH", OFTString},   {"KIND", OFTString},    {"RIM_FT", OFTReal},
                                      {"INV_FT", OFTReal}, {"DIA_MM", OFTInteger}, {"K", OFTReal},
                                      {"Q", OFTReal},      {"TW", OFTReal}};
  auto row = [](std::string id, std::map<int, std::optional<std::string>> change = {},
                std::string wkt = "POINT (0 0)") {
    Row r{std::move(wkt), {id, "MH", "100", "90", "1200", "0.5", "10", std::nullopt}};
    for (auto& [i, v] : change) r.values[static_cast<std::size_t>(i)] = v;
    return r;
  };
  test::write_layer(dir / "s.gpkg", "GPKG", "s", 32755, wkbUnknown, fields,
                    {row("MH1"), row("OF1", {{1, "OF"}, {2, std::nullopt}, {7, "0"}}, "POINT (100 0)"),
                     row("odd", {{1, "ZZ"}}), row("sentinel", {{2, "9999"}}), row("wide", {{4, "50000"}}),
                     row("negative_k", {{5, "-1"}}), row("outflow", {{6, "-5"}}), row("no_geom", {}, ""),
                     row("line", {}, "LINESTRING (0 0,1 1)"), row("MH1"), row("no_k", {{5, std::nullopt}})});
  const config::Project project = config::parse_project(R"(
[pipes]
source = "p.gpkg"
[pipes.defaults]
diameter = "300 mm"
manning_n = 0.013
[structures]
source = "s.gpkg"
[structures.fields]
id = "MH"
type = "KIND"
loss_k = "K"
rim = { field = "RIM_FT", unit = "ft" }
invert = { field = "INV_FT", unit = "ft" }
diameter = { field = "DIA_MM", unit = "mm" }
inflow = { field = "Q", unit = "L/s" }
tailwater = { field = "TW", unit = "m" }
[structures.types]
manhole = ["MH"]
outfall = ["OF"]
[structures.defaults]
diameter = "1.2 m"
loss_k = 0.5
)",
                                                (dir / "run.toml").string());
  const gis::ReadResult r = gis::read_network(project);
  const auto& s = r.network.structures;
  REQUIRE(s.size() == 9);  // no_geom and line are left out
  // 100 ft = 30.48 m, 90 ft = 27.432 m (NIST SP 811, 2008 ed., B.8: 1 ft = 0.3048 m exactly).
  CHECK(*s[0].rim_m == Approx(30.48).epsilon(1e-15));
  CHECK(*s[0].invert_m == Approx(27.432).epsilon(1e-15));
  CHECK(*s[0].diameter_m == Approx(1.2).epsilon(1e-15));
  CHECK(*s[0].loss_k == 0.5);
  CHECK(*s[0].inflow_m3_s == Approx(0.01).epsilon(1e-15));
  CHECK(s[0].kind == model::StructureKind::manhole);
  CHECK(s[0].fid == 1);
  CHECK(s[1].kind == model::StructureKind::outfall);
  CHECK(s[1].type_text == "OF");
  CHECK(s[1].location.x == 100.0);
  CHECK(*s[1].tailwater_m == 0.0);  // a tailwater of 0 is a real level, not a missing one
  CHECK(*s[4].diameter_m == 1.2);
  CHECK(*s[5].loss_k == 0.5);
  CHECK_FALSE(s[6].inflow_m3_s.has_value());

  std::map<std::string, std::vector<std::string>> f;
  for (const auto& x : r.findings) {
    CHECK(x.layer == LayerRole::structures);
    f[x.feature_id].push_back(x.code + " " + render_message(x.message, units::System::si));
  }
  using V = std::vector<std::string>;
  CHECK(f.at("OF1") == V{"DATA_MISSING RIM_FT is empty; the rim is unknown."});
  CHECK(f.at("odd") ==
        V{"DATA_IMPLAUSIBLE KIND \"ZZ\" is not listed in [structures.types]; the structure is taken as a manhole."});
  CHECK(f.at("sentinel") ==
        V{"DATA_IMPLAUSIBLE RIM_FT 9999 ft is at or above 2952.755906 ft, a no-data sentinel; the rim is unknown."});
  CHECK(f.at("wide") == V{"DATA_IMPLAUSIBLE DIA_MM 50000 mm is larger than the plausible 30000 mm; the default "
                          "diameter 1.200 m is used."});
  CHECK(f.at("negative_k") == V{"DATA_IMPLAUSIBLE K -1 is outside the plausible 0 to 10; the default K 0.5 is used."});
  CHECK(f.at("outflow") == V{"DATA_IMPLAUSIBLE Q -5 L/s is negative; the structure has no local inflow."});
  CHECK(f.at("no_geom") == V{"DATA_GEOMETRY The structure has no geometry; it is left out."});
  CHECK(f.at("line") == V{"DATA_GEOMETRY The geometry is a LINESTRING, not a point; the structure is left out."});
  CHECK(f.at("MH1") == V{"DATA_DUPLICATE_ID The id \"MH1\" is also used by fid 1; both structures are kept and told apart by their fid, so pipes "
                         "that name this id are ambiguous."});
  CHECK(f.at("no_k") == V{"DATA_MISSING K is empty; the default K 0.5 is used."});
  CHECK(r.findings.size() == 10);
  // Defaults are counted: the diameter once (wide), K twice (negative_k, no_k).
  std::map<std::string, std::size_t> notes;
  for (const auto& d : r.defaults_used)
    if (d.layer == LayerRole::structures) notes[render_message(d.text, units::System::si)] = d.count;
  CHECK(notes == std::map<std::string, std::size_t>{{"diameter 1.200 m from [structures.defaults] diameter", 1},
                                                    {"K 0.5 from [structures.defaults] loss_k", 2}});
}

TEST_CASE("structures from a CSV with X/Y columns, placed by the project's crs", "[io][read][structures]") {
  const auto dir = test::fresh_dir("structures_csv");
  test::write_layer(dir / "p.gpkg", "GPKG", "p", 28355, wkbLineString, {{"ID", OFTString}},
                    {{"LINESTRING (320000 5810000,320100 5810000)", {"a"}}});
  {
    std::ofstream csv(dir / "mh.csv");
    csv << "MH,X,Y,RIM\nM1,320000,5810000,12.5\nM2,320100,5810000,\n";
  }
  const std::string text = R"(
[pipes]
source = "p.gpkg"
[pipes.defaults]
diameter = "300 mm"
manning_n = 0.013
[structures]
source = "mh.csv"
open_options = ["X_POSSIBLE_NAMES=X", "Y_POSSIBLE_NAMES=Y"]
[structures.fields]
id = "MH"
rim = { field = "RIM", unit = "m" }
)";
  const auto run = (dir / "run.toml").string();
  const gis::ReadResult r = gis::read_network(config::parse_project("[project]\ncrs = \"EPSG:28355\"\n" + text, run));
  REQUIRE(r.network.structures.size() == 2);
  CHECK(r.network.structures[1].location.x == 320100.0);
  CHECK(*r.network.structures[0].rim_m == 12.5);  // a text column holding a number
  REQUIRE(r.findings.size() == 1);
  CHECK(r.findings[0].message == "RIM is empty; the rim is unknown.");
  CHECK_THROWS_WITH(gis::read_network(config::parse_project("[project]\ncrs = \"EPSG:\"\n" + text, run)),
                    Catch::Matchers::StartsWith((dir / "mh.csv").string() +
                                                ":mh: the project's crs \"EPSG:\" is not a CRS GDAL/PROJ knows: "));
}
