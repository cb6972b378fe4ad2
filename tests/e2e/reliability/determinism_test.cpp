// "Same inputs, same outputs": two separate `rimline check` processes on the same inputs write
// byte-identical exceptions.csv and summary.json and GeoPackages with the same feature values.
// (The run date appears only in report.html and the PDF, which are not compared.)
#include "e2e/reliability/output_files.hpp"
#include "e2e/reliability/run_cli.hpp"

using namespace rimline;
using namespace rimline::badinput;
using namespace rimline::reliability;

namespace {

void check_twice(const std::string& project, const fs::path& out_a, const fs::path& out_b) {
  fs::remove_all(out_a);
  fs::remove_all(out_b);
  CHECK(run_rimline({"check", project, "--out", out_a.string(), "--fail-on", "error"}) <= 1);
  CHECK(run_rimline({"check", project, "--out", out_b.string(), "--fail-on", "error"}) <= 1);
  REQUIRE(fs::exists(out_a / "exceptions.csv"));
  REQUIRE(fs::exists(out_b / "exceptions.csv"));
  CHECK(slurp(out_a / "exceptions.csv") == slurp(out_b / "exceptions.csv"));
  CHECK(slurp(out_a / "summary.json") == slurp(out_b / "summary.json"));
  const auto rows_a = gpkg_rows(out_a / "results.gpkg");
  CHECK(rows_a.size() > 3);
  CHECK(rows_a == gpkg_rows(out_b / "results.gpkg"));
}

}  // namespace

TEST_CASE("reliability: the demo twice gives the same exceptions, summary and result layers") {
  const fs::path base = fs::path(test::binary_dir) / "badinput";
  check_twice(std::string(test::source_dir) + "/data/demo/metric/project.toml", base / "determinism_demo_a",
              base / "determinism_demo_b");
}

TEST_CASE("reliability: a network of many trees twice gives the same outputs") {
  Case c("determinism_trees");
  write_big_network(c, 12, 15);
  check_twice(c.path("project.toml"), c.dir / "out_a", c.dir / "out_b");
}
