#include "rimline/gis/read_network.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <fstream>
#include <map>

#include "layer_fixture.hpp"
#include "rimline/error.hpp"

using namespace rimline;
using rimline::test::FieldSpec;
using rimline::test::Row;

namespace {

// Messages of the findings (quantities rendered in SI), by feature id, in the order produced.
std::map<std::string, std::vector<std::string>> by_feature(const Findings& findings) {
  std::map<std::string, std::vector<std::string>> out;
  for (const auto& f : findings)
    out[f.feature_id].push_back(f.code + " " + render_message(f.message, units::System::si));
  return out;
}

const model::Conduit& conduit(const model::Network& n, const std::string& id) {
  for (const auto& c : n.conduits)
    if (c.id == id) return c;
  FAIL("no conduit " << id);
  return n.conduits.front();
}

const std::vector<FieldSpec> catalogue_fields{{"ID", OFTString},    {"SHAPE", OFTString}, {"DIA_MM", OFTInteger},
                                              {"W_MM", OFTInteger}, {"H_MM", OFTInteger}, {"US_IL", OFTReal},
                                              {"DS_IL", OFTReal},   {"LEN", OFTReal},     {"N", OFTReal}};

// A good 100 m circular pipe; `change` edits one column (index into catalogue_fields) or the WKT.
Row pipe(const std::string& id, std::map<int, std::optional<std::string>> change = {},
         std::string wkt = "LINESTRING (0 0,100 0)") {
  Row r{std::move(wkt), {id, "CIRC", "300", std::nullopt, std::nullopt, "10", "9.9", "100", "0.013"}};
  for (auto& [i, v] : change) r.values[static_cast<std::size_t>(i)] = v;
  return r;
}

const char* catalogue_project = R"(
[pipes]
source = "pipes.gpkg"
layer = "pipes"
[pipes.fields]
id = "ID"
shape = "SHAPE"
diameter = { field = "DIA_MM", unit = "mm" }
width = { field = "W_MM", unit = "mm" }
height = { field = "H_MM", unit = "mm" }
invert_up = { field = "US_IL", unit = "m" }
invert_down = { field = "DS_IL", unit = "m" }
length = { field = "LEN", unit = "m" }
manning_n = "N"
[pipes.defaults]
manning_n = 0.013
[pipes.shapes]
circular = ["CIRC"]
box = ["BOX"]
)";

}  // namespace

TEST_CASE("each data problem of a pipe becomes one finding with a fixed message", "[io][read]") {
  const auto dir = test::fresh_dir("catalogue");
  const std::vector<Row> rows{
      pipe("ok"),
      pipe("sentinel", {{5, "999.5"}}),
      pipe("zero_invert", {{6, "0"}}),
      pipe("null_invert", {{5, std::nullopt}}),
      pipe("inches", {{2, "12"}}),
      pipe("huge", {{2, "15000"}}),
      pipe("zero_dia", {{2, "0"}}),
      pipe("null_dia", {{2, std::nullopt}}),
      pipe("bad_n", {{8, "0.13"}}),
      pipe("long", {{7, "150"}}),
      pipe("zero_len", {{7, "0"}}),
      pipe("no_geom", {}, ""),
      pipe("point", {}, "POINT (0 0)"),
      pipe("degenerate", {}, "LINESTRING (5 5,5 5)"),
      pipe("ok"),
      pipe("", {{0, std::nullopt}}),
      pipe("box", {{1, "BOX"}, {2, std::nullopt}, {3, "1200"}, {4, "900"}}),
      pipe("egg", {{1, "EGG"}}),
      pipe("merged", {{7, std::nullopt}}, "MULTILINESTRING ((0 0,50 0),(100 0,50 0.2))"),
      pipe("gap", {}, "MULTILINESTRING ((0 0,50 0),(60 0,100 0))"),
      pipe("null_n", {{8, std::nullopt}}),
  };
  test::write_layer(dir / "pipes.gpkg", "GPKG", "pipes", 32755, wkbUnknown, catalogue_fields, rows);
  const config::Project project = config::parse_project(catalogue_project, (dir / "run.toml").string());
  const gis::ReadResult r = gis::read_network(project);
  REQUIRE(r.network.conduits.size() == rows.size());
  const auto f = by_feature(r.findings);

  using V = std::vector<std::string>;
  CHECK(f.count("box") == 0);
  CHECK(f.at("sentinel") ==
        V{"DATA_IMPLAUSIBLE US_IL 999.5 m is at or above 900 m, a no-data sentinel; the upstream invert is unknown."});
  CHECK(f.at("zero_invert") == V{"DATA_IMPLAUSIBLE DS_IL is exactly 0, a common stand-in for a missing level; the "
                                 "downstream invert is unknown."});
  CHECK(f.at("null_invert") == V{"DATA_MISSING US_IL is empty; the upstream invert is unknown."});
  CHECK(f.at("inches") == V{"DATA_IMPLAUSIBLE DIA_MM 12 mm is smaller than the plausible 30 mm (it looks like a value "
                            "in inches); the pipe is left out of the analysis."});
  CHECK(f.at("huge") == V{"DATA_IMPLAUSIBLE DIA_MM 15000 mm is larger than the plausible 10000 mm; the pipe is left "
                          "out of the analysis."});
  CHECK(f.at("zero_dia") ==
        V{"DATA_IMPLAUSIBLE DIA_MM 0 mm is not a positive size; the pipe is left out of the analysis."});
  CHECK(f.at("null_dia") == V{"DATA_MISSING DIA_MM is empty; the pipe is left out of the analysis."});
  CHECK(f.at("bad_n") == V{"DATA_IMPLAUSIBLE N 0.13 is outside the plausible 0.008 to 0.05; n = 0.013 from "
                           "[pipes.defaults] manning_n is used."});
  CHECK(f.at("long") == V{"DATA_IMPLAUSIBLE LEN 150 m differs from the geometry length 100.0 m by more than 20 %; "
                          "the geometry length is used."});
  CHECK(f.at("zero_len") == V{"DATA_IMPLAUSIBLE LEN 0 m is not positive; the geometry length 100.0 m is used."});
  CHECK(f.at("no_geom") == V{"DATA_GEOMETRY The pipe has no geometry; it is left out of the analysis."});
  CHECK(f.at("point") == V{"DATA_GEOMETRY The geometry is a POINT, not a line; the pipe is left out of the analysis."});
  CHECK(f.at("degenerate") == V{"DATA_GEOMETRY The line has zero length; the pipe is left out of the analysis."});
  // The second "ok" (fid 15) repeats the id of fid 1.
  CHECK(f.at("ok") == V{"DATA_DUPLICATE_ID The id \"ok\" is also used by fid 1; both pipes are kept and told apart by their fid, so results under "
                        "this id are ambiguous."});
  CHECK(f.at("fid 16") == V{"DATA_MISSING ID is empty; the pipe is reported as \"fid 16\"."});
  CHECK(f.at("egg") ==
        V{"DATA_IMPLAUSIBLE SHAPE \"EGG\" is not listed in [pipes.shapes]; the pipe is left out of the analysis."});
  CHECK(f.at("merged") ==
        V{"DATA_GEOMETRY The MULTILINESTRING's 2 parts join end to end and were merged into one line.",
          "DATA_MISSING LEN is empty; the geometry length 100.2 m is used."});
  CHECK(f.at("gap") == V{"DATA_GEOMETRY The MULTILINESTRING has 2 parts that do not join end to end within the snap "
                         "tolerance of 0.500 m (gap 10.000 m); the pipe is left out of the analysis."});
  CHECK(f.at("null_n") == V{"DATA_MISSING N is empty; n = 0.013 from [pipes.defaults] manning_n is used."});
  CHECK(r.findings.size() == 20);
  // Computed quantities travel as q() tokens, so a US report shows them in feet.
  const auto long_finding =
      std::find_if(r.findings.begin(), r.findings.end(), [](const Finding& x) { return x.feature_id == "long"; });
  CHECK(long_finding->message ==
        "LEN 150 m differs from the geometry length {{100|D}} by more than 20 %; the geometry length is used.");
  CHECK(render_message(long_finding->message, units::System::us) ==
        "LEN 150 m differs from the geometry length 328 ft by more than 20 %; the geometry length is used.");
  CHECK(long_finding->value == 150.0);
  CHECK(long_finding->limit == 100.0);
  CHECK(long_finding->field == "LEN");
  CHECK(long_finding->severity == Severity::warning);
  CHECK(long_finding->layer == LayerRole::conduits);

  for (const char* out : {"inches", "huge", "zero_dia", "null_dia", "no_geom", "point", "degenerate", "egg", "gap"})
    CHECK_FALSE(conduit(r.network, out).usable);
  for (const char* kept :
       {"ok", "sentinel", "zero_invert", "null_invert", "bad_n", "long", "zero_len", "box", "merged", "null_n"})
    CHECK(conduit(r.network, kept).usable);

  const auto& ok = conduit(r.network, "ok");
  CHECK(ok.section.diameter_m == Approx(0.3).epsilon(1e-15));
  CHECK(*ok.invert_up_m == 10.0);
  CHECK(ok.length_m == 100.0);
  CHECK(ok.up_direction.x == 1.0);
  CHECK(ok.down_point.x == 100.0);
  CHECK_FALSE(conduit(r.network, "sentinel").invert_up_m.has_value());
  CHECK(conduit(r.network, "bad_n").roughness.manning_n == 0.013);
  const auto& box = conduit(r.network, "box");
  CHECK(box.section.shape == hydraulics::Shape::box);
  CHECK(box.section.width_m == Approx(1.2).epsilon(1e-15));
  CHECK(box.section.height_m == Approx(0.9).epsilon(1e-15));
  const auto& merged = conduit(r.network, "merged");
  REQUIRE(merged.vertices.size() == 4);  // second part turned round to continue the first
  CHECK(merged.vertices[2].y == 0.2);
  CHECK(merged.vertices[3].x == 100.0);
  CHECK(merged.geometry_length_m == Approx(50.0 + 0.2 + std::hypot(50.0, 0.2)).epsilon(1e-12));
  CHECK(merged.length_m == merged.geometry_length_m);

  REQUIRE(r.defaults_used.size() == 1);
  CHECK(r.defaults_used[0].text == "n = 0.013 from [pipes.defaults] manning_n");
  CHECK(r.defaults_used[0].count == 2);
  CHECK(r.defaults_used[0].example_ids == std::vector<std::string>{"bad_n", "null_n"});
  CHECK(r.input_files == std::vector<std::string>{(dir / "pipes.gpkg").string()});
}

TEST_CASE("US customary fields are converted to SI once, on reading", "[io][read]") {
  const auto dir = test::fresh_dir("us_units");
  const std::vector<FieldSpec> fields{{"ID", OFTString},   {"DIA_IN", OFTReal}, {"US_FT", OFTReal}, {"DS_FT", OFTReal},
                                      {"LEN_FT", OFTReal}, {"Q_CFS", OFTReal},  {"MAT", OFTString}, {"UP", OFTString},
                                      {"DN", OFTString},   {"KIND", OFTString}};
  // 30.48 m = 100 ft exactly (NIST SP 811, 2008 ed., B.8). "rm" and "pvc" match the project's
  // "RM" and "PVC" ignoring case.
  test::write_layer(
      dir / "p.gpkg", "GPKG", "p", 32755, wkbUnknown, fields,
      {{"LINESTRING Z (0 0 5,30.48 0 4)", {"P1", "12", "100", "99.5", "100", "10", "RC", "MH1", "MH2", "rm"}},
       {"LINESTRING (0 10,30.48 10)",
        {"P2", "18", "100", "99", "100", std::nullopt, "pvc", std::nullopt, "MH3", "G"}}});
  const config::Project project = config::parse_project(R"(
[pipes]
source = "p.gpkg"
force_main_values = ["RM"]
[pipes.fields]
id = "ID"
from = "UP"
to = "DN"
material = "MAT"
force_main = "KIND"
diameter = { field = "DIA_IN", unit = "in" }
invert_up = { field = "US_FT", unit = "ft" }
invert_down = { field = "DS_FT", unit = "ft" }
length = { field = "LEN_FT", unit = "ft" }
flow = { field = "Q_CFS", unit = "cfs" }
[pipes.defaults.manning_n_by_material]
RC = 0.013
PVC = 0.011
)",
                                                (dir / "run.toml").string());
  const gis::ReadResult r = gis::read_network(project);
  REQUIRE(r.network.conduits.size() == 2);
  const auto& p1 = r.network.conduits[0];
  // NIST SP 811 (2008 ed.) B.8: 1 in = 0.0254 m, 1 ft = 0.3048 m, 1 ft3/s = 0.028 316 846 592 m3/s (exact).
  CHECK(p1.section.diameter_m == Approx(0.3048).epsilon(1e-15));
  CHECK(*p1.invert_up_m == Approx(30.48).epsilon(1e-15));
  CHECK(*p1.invert_down_m == Approx(30.3276).epsilon(1e-15));
  CHECK(p1.length_m == Approx(30.48).epsilon(1e-15));
  CHECK(*p1.flow_m3_s == Approx(0.28316846592).epsilon(1e-14));
  CHECK(p1.roughness.manning_n == 0.013);
  CHECK(p1.from_id == "MH1");
  CHECK(p1.to_id == "MH2");
  CHECK(p1.force_main);
  CHECK(p1.vertex_z_m == std::vector<double>{5.0, 4.0});
  const auto& p2 = r.network.conduits[1];
  CHECK(p2.section.diameter_m == Approx(0.4572).epsilon(1e-15));
  CHECK(p2.roughness.manning_n == 0.011);
  CHECK_FALSE(p2.force_main);
  CHECK(p2.vertex_z_m.empty());
  const auto f = by_feature(r.findings);
  CHECK(f.at("P2") == std::vector<std::string>{"DATA_MISSING UP is empty; the upstream structure id is unknown.",
                                               "DATA_MISSING Q_CFS is empty; the pipe has no design flow."});
  REQUIRE(r.defaults_used.size() == 3);
  CHECK(r.defaults_used[0].text == "shape circular from [pipes.defaults] shape (no shape field mapped)");
  CHECK(r.defaults_used[0].count == 2);
  CHECK(r.defaults_used[1].text == "n = 0.013 from [pipes.defaults.manning_n_by_material] RC");
  CHECK(r.defaults_used[2].text == "n = 0.011 from [pipes.defaults.manning_n_by_material] PVC");
  CHECK(r.defaults_used[2].example_ids == std::vector<std::string>{"P2"});
  CHECK(r.network.crs_description == "WGS 84 / UTM zone 55S");
  CHECK(r.network.crs_note.empty());
}

TEST_CASE("a mapped field missing from the layer stops the run with a suggestion", "[io][read]") {
  const auto dir = test::fresh_dir("missing_field");
  test::write_layer(dir / "p.gpkg", "GPKG", "p", 32755, wkbLineString, {{"ID", OFTString}, {"DIAMETER", OFTReal}},
                    {{"LINESTRING (0 0,1 1)", {"a", "300"}}});
  const std::string src = (dir / "p.gpkg").string();
  const config::Project project = config::parse_project(
      "[pipes]\nsource = \"p.gpkg\"\n[pipes.fields]\ndiameter = { field = \"DIAMETR\", unit = \"mm\" }\n"
      "[pipes.defaults]\nmanning_n = 0.013\n",
      (dir / "run.toml").string());
  try {
    gis::read_network(project);
    FAIL("no error");
  } catch (const Error& e) {
    CHECK(e.kind() == ErrorKind::bad_config);
    CHECK(std::string(e.what()) == src +
                                       ":p:field DIAMETR: the field mapped by pipes.fields.diameter is not in the "
                                       "layer; did you mean \"DIAMETER\"?");
  }
  const config::Project wrong_layer = config::parse_project(
      "[pipes]\nsource = \"p.gpkg\"\nlayer = \"q\"\n[pipes.defaults]\nmanning_n = 0.013\ndiameter = \"300 mm\"\n",
      (dir / "run.toml").string());
  CHECK_THROWS_WITH(gis::read_network(wrong_layer),
                    src + ": no layer \"q\" in the pipes source (layers: \"p\"); did you mean \"p\"?");
  const config::Project no_file =
      config::parse_project("[pipes]\nsource = \"none.gpkg\"\n[pipes.defaults]\nmanning_n = 0.013\ndiameter = \"300 mm\"\n",
                        (dir / "run.toml").string());
  try {
    gis::read_network(no_file);
    FAIL("no error");
  } catch (const Error& e) {
    CHECK(e.kind() == ErrorKind::bad_input);
    CHECK(std::string(e.what()).rfind((dir / "none.gpkg").string() + ": cannot open the pipes source: ", 0) == 0);
  }
}

TEST_CASE("a project that cannot size or roughen pipes is refused before reading", "[io][read]") {
  const auto dir = test::fresh_dir("no_defaults");
  test::write_layer(dir / "p.gpkg", "GPKG", "p", 32755, wkbLineString, {{"ID", OFTString}},
                    {{"LINESTRING (0 0,1 1)", {"a"}}});
  const auto run = (dir / "run.toml").string();
  CHECK_THROWS_WITH(
      gis::read_network(config::parse_project("[pipes]\nsource = \"p.gpkg\"\n[pipes.defaults]\nmanning_n = 0.013\n", run)),
      run + ": circular pipes need a diameter: map pipes.fields.diameter or set pipes.defaults.diameter");
  CHECK_THROWS_WITH(
      gis::read_network(config::parse_project("[pipes]\nsource = \"p.gpkg\"\n[pipes.defaults]\ndiameter = \"1 m\"\n", run)),
      run +
          ": methods.friction is \"manning\" but no Manning n is given: map pipes.fields.manning_n or set "
          "pipes.defaults.manning_n or [pipes.defaults.manning_n_by_material]");
}

TEST_CASE("a CSV with WKT geometry, text numbers and no CRS", "[io][read]") {
  const auto dir = test::fresh_dir("csv");
  {
    std::ofstream csv(dir / "pipes.csv");
    csv << "WKT,ID,DIA\n\"LINESTRING (0 0,3 4)\",a,375\n\"LINESTRING (3 4,6 8)\",b,abc\n\"LINESTRING (6 8,9 "
           "12)\",c,inf\n";
  }
  const std::string text =
      "[pipes]\nsource = \"pipes.csv\"\n[pipes.fields]\nid = \"ID\"\n"
      "diameter = { field = \"DIA\", unit = \"mm\" }\n[pipes.defaults]\nmanning_n = 0.013\n";
  const auto run = (dir / "run.toml").string();
  try {
    gis::read_network(config::parse_project(text, run));
    FAIL("no error");
  } catch (const Error& e) {
    CHECK(e.kind() == ErrorKind::bad_input);
    CHECK(std::string(e.what()) ==
          (dir / "pipes.csv").string() +
              ":pipes: the layer has no CRS; set crs = \"EPSG:....\" in [project] to say which one "
              "its coordinates are in");
  }
  const gis::ReadResult r = gis::read_network(config::parse_project("[project]\ncrs = \"EPSG:28355\"\n" + text, run));
  REQUIRE(r.network.conduits.size() == 3);
  CHECK(r.network.conduits[0].geometry_length_m == 5.0);
  CHECK(r.network.conduits[0].section.diameter_m == Approx(0.375).epsilon(1e-15));
  CHECK(r.network.crs_description == "GDA94 / MGA zone 55");
  REQUIRE(r.findings.size() == 2);
  CHECK(r.findings[0].feature_id == "b");
  CHECK(r.findings[0].message == "DIA holds \"abc\", which is not a number; the pipe is left out of the analysis.");
  CHECK(r.findings[0].severity == Severity::error);
  CHECK(r.findings[1].feature_id == "c");
  CHECK(r.findings[1].message == "DIA is not a finite number; the pipe is left out of the analysis.");
  CHECK_FALSE(r.network.conduits[1].usable);
  CHECK_FALSE(r.network.conduits[2].usable);
}

TEST_CASE("GDAL's own complaints while reading become findings, not stderr", "[io][read]") {
  const auto dir = test::fresh_dir("gdal_messages");
  const auto path = test::write_layer(dir / "p.gpkg", "GPKG", "p", 32755, wkbLineString, {{"ID", OFTString}},
                                      {{"LINESTRING (0 0,10 0)", {"a"}}, {"LINESTRING (10 0,20 0)", {"b"}}});
  {  // a geometry blob GDAL cannot decode: the GPKG header and then garbage
    GDALDatasetUniquePtr ds(GDALDataset::Open(path.c_str(), GDAL_OF_VECTOR | GDAL_OF_UPDATE));
    REQUIRE(ds);
    ds->ExecuteSQL("UPDATE p SET geom = X'4750000100000000ffff' WHERE fid = 1", nullptr, nullptr);
  }
  const gis::ReadResult r = gis::read_network(config::parse_project(
      "[pipes]\nsource = \"p.gpkg\"\n[pipes.fields]\nid = \"ID\"\n[pipes.defaults]\ndiameter = \"300 mm\"\n"
      "manning_n = 0.013\n",
      (dir / "run.toml").string()));
  REQUIRE(r.network.conduits.size() == 2);
  const auto f = by_feature(r.findings);
  CHECK(f.at("a") == std::vector<std::string>{"DATA_GEOMETRY The pipe has no geometry; it is left out of the analysis.",
                                              "DATA_SOURCE GDAL reported: Unable to read geometry"});
  CHECK(f.count("b") == 0);
  CHECK(r.network.conduits[1].usable);
}

TEST_CASE("Darcy-Weisbach runs read ks in its unit and fall back by material, then default", "[io][read]") {
  const auto dir = test::fresh_dir("darcy");
  test::write_layer(dir / "p.gpkg", "GPKG", "p", 32755, wkbLineString,
                    {{"ID", OFTString}, {"KS_MM", OFTReal}, {"MAT", OFTString}},
                    {{"LINESTRING (0 0,10 0)", {"a", "0.6", "RC"}},
                     {"LINESTRING (10 0,20 0)", {"b", "200", "RC"}},
                     {"LINESTRING (20 0,30 0)", {"c", std::nullopt, "PVC"}},
                     {"LINESTRING (30 0,40 0)", {"d", std::nullopt, "VC"}}});
  const gis::ReadResult r = gis::read_network(config::parse_project(R"(
[pipes]
source = "p.gpkg"
[pipes.fields]
id = "ID"
material = "MAT"
ks = { field = "KS_MM", unit = "mm" }
[pipes.defaults]
diameter = "300 mm"
ks = "1.5 mm"
[pipes.defaults.ks_by_material]
PVC = "0.0015 mm"
[methods]
friction = "darcy_weisbach"
)",
                                                              (dir / "run.toml").string()));
  REQUIRE(r.network.conduits.size() == 4);
  CHECK(r.network.conduits[0].roughness.law == hydraulics::FrictionLaw::darcy_weisbach);
  CHECK(r.network.conduits[0].roughness.ks_m == Approx(0.0006).epsilon(1e-15));
  CHECK(r.network.conduits[1].roughness.ks_m == Approx(0.0015).epsilon(1e-15));
  CHECK(r.network.conduits[2].roughness.ks_m == Approx(1.5e-6).epsilon(1e-15));
  CHECK(r.network.conduits[3].roughness.ks_m == Approx(0.0015).epsilon(1e-15));
  for (const auto& c : r.network.conduits) CHECK(c.usable);
  const auto f = by_feature(r.findings);
  using V = std::vector<std::string>;
  CHECK(f.at("b") == V{"DATA_IMPLAUSIBLE KS_MM 200 mm is outside the plausible 0 mm to 100 mm; ks = 1.5 mm from "
                       "[pipes.defaults] ks is used."});
  CHECK(f.at("c") ==
        V{"DATA_MISSING KS_MM is empty; ks = 0.0015 mm from [pipes.defaults.ks_by_material] PVC is used."});
  CHECK(f.at("d") == V{"DATA_MISSING KS_MM is empty; ks = 1.5 mm from [pipes.defaults] ks is used."});
  CHECK(r.findings.size() == 3);
}

TEST_CASE("the same layer reads the same through shapefile, FileGDB, GeoJSON and GPKG", "[io][read]") {
  const auto dir = test::fresh_dir("drivers");
  const std::vector<FieldSpec> fields{{"ID", OFTString}, {"DIA", OFTReal}};
  const std::vector<Row> rows{
      {"LINESTRING (320000 5810000,320030 5810040)", {"a", "450"}},
      {"MULTILINESTRING ((320030 5810040,320060 5810040),(320060 5810040,320090 5810080))", {"b", "525"}}};
  const std::string project_tail =
      "\"\n[pipes.fields]\nid = \"ID\"\ndiameter = { field = \"DIA\", unit = \"mm\" }\n[pipes.defaults]\n"
      "manning_n = 0.013\n";
  struct Case {
    const char* driver;
    const char* file;
    std::size_t files;  // files GDAL lists behind the dataset
    OGRwkbGeometryType layer_type;
  };
  for (const Case& k :
       {Case{"ESRI Shapefile", "p.shp", 4, wkbMultiLineString}, Case{"OpenFileGDB", "p.gdb", 0, wkbMultiLineString},
        Case{"GeoJSON", "p.geojson", 1, wkbUnknown}, Case{"GPKG", "p.gpkg", 1, wkbUnknown}}) {
    INFO(k.driver);
    test::write_layer(dir / k.file, k.driver, "p", 28355, k.layer_type, fields, rows);
    const gis::ReadResult r = gis::read_network(
        config::parse_project("[pipes]\nsource = \"" + std::string(k.file) + project_tail, (dir / "run.toml").string()));
    REQUIRE(r.network.conduits.size() == 2);
    CHECK(r.network.conduits[0].id == "a");
    CHECK(r.network.conduits[0].geometry_length_m == Approx(50.0).epsilon(1e-12));  // a 30-40-50 triangle
    CHECK(r.network.conduits[1].geometry_length_m == Approx(80.0).epsilon(1e-12));
    CHECK(r.network.conduits[1].section.diameter_m == Approx(0.525).epsilon(1e-15));
    CHECK(r.network.crs_description == "GDA94 / MGA zone 55");
    if (k.files) CHECK(r.input_files.size() == k.files);
  }
}

TEST_CASE("a layer without geometry or without features stops the run", "[io][read]") {
  const auto dir = test::fresh_dir("no_geometry");
  std::ofstream(dir / "table.csv") << "ID,DIA\na,300\n";
  test::write_layer(dir / "empty.geojson", "GeoJSON", "empty", 4326, wkbLineString, {{"ID", OFTString}}, {});
  const std::string tail = "\"\n[pipes.defaults]\ndiameter = \"300 mm\"\nmanning_n = 0.013\n";
  const auto run = (dir / "run.toml").string();
  CHECK_THROWS_WITH(gis::read_network(config::parse_project("[pipes]\nsource = \"table.csv" + tail, run)),
                    (dir / "table.csv").string() +
                        ":table: the pipes layer has no geometry column (a CSV needs a WKT column, or X/Y columns "
                        "named in open_options)");
  CHECK_THROWS_WITH(gis::read_network(config::parse_project("[pipes]\nsource = \"empty.geojson" + tail, run)),
                    (dir / "empty.geojson").string() + ":empty: the pipes layer has no features");
}

TEST_CASE("shape codes: egg, a section table, an unknown code left out or (by the project) an equal-area circle",
          "[io][read][section]") {
  const auto dir = test::fresh_dir("shape_codes");
  const std::vector<Row> rows{
      pipe("egg", {{1, "OV"}, {2, std::nullopt}, {3, "800"}, {4, "1200"}}),
      pipe("egg_off", {{1, "OV"}, {2, std::nullopt}, {3, "1000"}, {4, "1200"}}),
      pipe("hs", {{1, "HS"}, {2, std::nullopt}, {3, "1500"}, {4, "1400"}}),
      pipe("arch", {{1, "ARCH"}, {2, std::nullopt}, {3, "1600"}, {4, "900"}}),
  };
  test::write_layer(dir / "pipes.gpkg", "GPKG", "pipes", 32755, wkbUnknown, catalogue_fields, rows);
  const std::string tables = R"(egg = ["OV"]
[pipes.section_tables.horseshoe]
codes = ["HS"]
depth = [0, 0.5, 1]
width = [0.6, 1, 0]
)";
  using V = std::vector<std::string>;
  {
    const config::Project project =
        config::parse_project(std::string(catalogue_project) + tables, (dir / "run.toml").string());
    const gis::ReadResult r = gis::read_network(project);
    const auto f = by_feature(r.findings);
    const auto& egg = conduit(r.network, "egg");
    CHECK(egg.usable);
    CHECK(egg.section.shape == hydraulics::Shape::egg);
    CHECK(egg.section.height_m == Approx(1.2).epsilon(1e-15));
    CHECK(egg.section.width_m == Approx(0.8).epsilon(1e-15));
    CHECK(f.count("egg") == 0);
    CHECK(f.at("egg_off") == V{"DATA_IMPLAUSIBLE W_MM 1.000 m is not the standard egg's 0.800 m (height 1.200 m / "
                               "1.5); the egg is checked by its height."});
    CHECK(conduit(r.network, "egg_off").section.width_m == Approx(0.8).epsilon(1e-15));
    const auto& hs = conduit(r.network, "hs");
    CHECK(hs.usable);
    CHECK(hs.section.shape == hydraulics::Shape::table);
    REQUIRE(hs.section.table);
    CHECK(hs.section.table->name == "horseshoe");
    CHECK(hs.section.table->width == std::vector<double>{0.6, 1.0, 0.0});
    CHECK(f.at("arch") == V{"DATA_IMPLAUSIBLE SHAPE \"ARCH\" is not listed in [pipes.shapes]; the pipe is left out "
                            "of the analysis."});
    CHECK_FALSE(conduit(r.network, "arch").usable);
  }
  {
    std::string text = std::string(catalogue_project) + tables;
    text.replace(text.find("layer = \"pipes\""), 15, "layer = \"pipes\"\nunknown_shape = \"equal_area_circle\"");
    const config::Project project = config::parse_project(text, (dir / "run.toml").string());
    const gis::ReadResult r = gis::read_network(project);
    const auto f = by_feature(r.findings);
    const auto& arch = conduit(r.network, "arch");
    CHECK(arch.usable);
    CHECK(arch.section.shape == hydraulics::Shape::circular);
    CHECK(arch.section.diameter_m == Approx(std::sqrt(1.6 * 0.9)).epsilon(1e-14));
    CHECK(f.at("arch") == V{"DATA_IMPLAUSIBLE SHAPE \"ARCH\" is not listed in [pipes.shapes] or "
                            "[pipes.section_tables]; the pipe is checked as the circle of equal area, diameter "
                            "sqrt(width x height) ([pipes] unknown_shape)."});
  }
  // A table whose depths fall stops the run with the project file's own error.
  std::string bad = std::string(catalogue_project) + tables;
  bad.replace(bad.find("depth = [0, 0.5, 1]"), 19, "depth = [0, 1, 1]");
  CHECK_THROWS_WITH(config::parse_project(bad, (dir / "run.toml").string()),
                    Catch::Matchers::Contains("depths must rise strictly"));
}
