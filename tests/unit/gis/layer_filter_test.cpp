// `where` (project file) and `--where TABLE=SQL` (command line): only the selected features are read,
// and a filter GDAL rejects stops the run naming the project file, the layer and the filter.
// Invented two-pipe layers: plumbing checks, no check values.
#include <catch2/catch.hpp>

#include "layer_fixture.hpp"
#include "rimline/config/project.hpp"
#include "rimline/error.hpp"
#include "rimline/gis/read_network.hpp"

using namespace rimline;
using rimline::test::FieldSpec;
using rimline::test::Row;

namespace {

const std::vector<FieldSpec> fields{{"ID", OFTString}, {"PART", OFTInteger}, {"DIA_MM", OFTInteger},
                                    {"US_IL", OFTReal}, {"DS_IL", OFTReal}};

std::string project_text(const std::string& where) {
  return R"(
[pipes]
source = "pipes.gpkg"
layer = "pipes"
)" + where + R"(
[pipes.fields]
id = "ID"
diameter = { field = "DIA_MM", unit = "mm" }
invert_up = { field = "US_IL", unit = "m" }
invert_down = { field = "DS_IL", unit = "m" }
[pipes.defaults]
manning_n = 0.013
)";
}

std::filesystem::path two_pipes() {
  const auto dir = test::fresh_dir("layer_filter");
  test::write_layer(dir / "pipes.gpkg", "GPKG", "pipes", 32755, wkbLineString, fields,
                    {Row{"LINESTRING (0 0,100 0)", {"A", "0", "300", "10", "9.9"}},
                     Row{"LINESTRING (500 0,600 0)", {"B", "1", "300", "10", "9.9"}}});
  return dir;
}

std::vector<std::string> ids(const gis::ReadResult& r) {
  std::vector<std::string> out;
  for (const auto& c : r.network.conduits) out.push_back(c.id);
  return out;
}

}  // namespace

TEST_CASE("where in [pipes] reads only the features it selects", "[io][read][where]") {
  const auto dir = two_pipes();
  const auto file = (dir / "run.toml").string();
  CHECK(ids(gis::read_network(config::parse_project(project_text(""), file))) == std::vector<std::string>{"A", "B"});
  const auto p = config::parse_project(project_text("where = \"PART = 1\""), file);
  CHECK(p.pipes.where == "PART = 1");
  CHECK(p.pipes.where_origin == file);
  CHECK(ids(gis::read_network(p)) == std::vector<std::string>{"B"});
}

TEST_CASE("--where replaces the project file's filter, TABLE= removes it", "[config][where]") {
  const auto dir = two_pipes();
  const auto file = (dir / "run.toml").string();
  auto p = config::parse_project(project_text("where = \"PART = 1\""), file);
  config::apply_where_overrides(p, {"pipes=PART = 0"});
  CHECK(p.pipes.where == "PART = 0");
  CHECK(ids(gis::read_network(p)) == std::vector<std::string>{"A"});
  config::apply_where_overrides(p, {"pipes="});
  CHECK(ids(gis::read_network(p)) == std::vector<std::string>{"A", "B"});
  CHECK_THROWS_WITH(config::apply_where_overrides(p, {"PART"}), Catch::Contains("--where needs TABLE=SQL"));
  CHECK_THROWS_WITH(config::apply_where_overrides(p, {"pipe=PART = 0"}), Catch::Contains("no layer table \"pipe\""));
  CHECK_THROWS_WITH(config::apply_where_overrides(p, {"structures=PART = 0"}),
                    Catch::Contains("the project reads no structures layer"));
}

TEST_CASE("a filter GDAL rejects, or one that selects nothing, stops the run with the filter named", "[io][read][where]") {
  const auto dir = two_pipes();
  const auto file = (dir / "run.toml").string();
  const auto bad = config::parse_project(project_text("where = \"NO_SUCH_FIELD = 1\""), file);
  try {
    (void)gis::read_network(bad);
    FAIL("no error");
  } catch (const Error& e) {
    CHECK(e.kind() == ErrorKind::bad_config);
    const std::string what = e.what();
    CHECK_THAT(what, Catch::Contains(file));
    CHECK_THAT(what, Catch::Contains("pipes"));
    CHECK_THAT(what, Catch::Contains("where = \"NO_SUCH_FIELD = 1\""));
  }
  const auto none = config::parse_project(project_text("where = \"PART = 7\""), file);
  CHECK_THROWS_WITH(gis::read_network(none), Catch::Contains("no features that match its filter where = \"PART = 7\""));
}
