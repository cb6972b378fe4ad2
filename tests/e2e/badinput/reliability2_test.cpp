// Bad-input catalogue, issue 18 ("Reliability II"): the cases of the 100 new bad inputs that are not
// about the project file, one source, or one attribute (those are in project_file_test,
// sources_test, attributes_test and catchments_test). Inputs invented for the tests (plumbing and
// invariants, not check values).
// clang-format off
#include "e2e/badinput/cli_fixture.hpp"
#include "e2e/reliability/output_files.hpp"

#include <signal.h>
#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <limits>
#include <chrono>
#include <filesystem>
#include <thread>

#include "base/number_text.hpp"
#include "rimline/report/report_html.hpp"
#include "report/write_failure.hpp"
// clang-format on

using namespace rimline;
using namespace rimline::badinput;
namespace fs = std::filesystem;

namespace {

std::size_t count_rows(const std::string& text) { return static_cast<std::size_t>(std::count(text.begin(), text.end(), '\n')); }

// A straight chain of n pipes from M<n> down to the outfall OF, every structure below a 9 m
// tailwater: each is FLOODED, so the report shows 200 budgets of up to n terms.
void write_chain(const Case& c, int n) {
  std::vector<std::string> pipes, structures;
  structures.push_back(structure("OF", "OUTFALL", ox, oy, 4.0, 2.0, 0.0));
  for (int i = 1; i <= n; ++i) {
    const double x = ox - 20.0 * i;
    structures.push_back(structure("M" + std::to_string(i), "MH", x, oy, 5.0 + 0.01 * i, 2.0 + 0.01 * i, 5.0));
    pipes.push_back(pipe("P" + std::to_string(i), x, oy, x + 20.0, oy, 300, 2.0 + 0.01 * i, 2.0 + 0.01 * (i - 1)));
  }
  c.write_network(pipes, structures, replace(base_project(), R"(levels = ["2.2 m"])", R"(levels = ["9 m"])"));
}

}  // namespace

// Issue 18, defect 9: every one of up to 200 findings carried its whole budget to the outfall: a
// 1,000-pipe chain gave a 38 MB report.html. Budgets now show 12 terms; budgets.csv holds each
// term once where budgets share their route.
TEST_CASE("badinput reliability: the report stays bounded on a 1,000-pipe chain; budgets.csv shares routes") {
  Case c("chain_1000");
  write_chain(c, 1000);
  const Ran r = run_cli({"check", c.path("project.toml"), "--out", c.path("out"), "--fail-on", "error"}, 120);
  INFO(r.out);
  REQUIRE(r.code <= 1);
  // The budgets live in the exception list: at most 200 rows per code and severity, each budget at
  // most 14 rows, whatever the depth. The page as a whole grows linearly with the network (issue 19's
  // full results tables, the plan map and the profile), not with the square of the depth.
  const std::string page = reliability::slurp(c.dir / "out" / "report.html");
  const auto from = page.find("<section id=\"exceptions\">");
  REQUIRE(from != std::string::npos);
  const auto to = page.find("</section>", from);
  CHECK(to - from < 1'200'000);     // 0.86 MB here
  CHECK(page.size() < 6'000'000);   // 4.7 MB here; was ~38 MB
  const std::string budgets = reliability::slurp(c.dir / "out" / "budgets.csv");
  // One row per term of the network (tailwater, and per pipe an exit, a conduit and a structure
  // term at most) plus the header and a "continues" row per budget: not 1,000 x 1,000.
  CHECK(count_rows(budgets) <= 1 + 4 * 1000 + 1000);
  CHECK(budgets.find(",continues,") != std::string::npos);
  CHECK(page.find("(every term: budgets.csv, budget M1000)") != std::string::npos);
}

// Issue 18: SIGINT/SIGTERM left the staging files until the next run into that folder.
TEST_CASE("badinput reliability: SIGTERM during the writing of the outputs leaves no staging folder behind") {
  Case c("sigterm");
  write_chain(c, 1000);
  const std::string out = c.path("out");
  const pid_t pid = ::fork();
  REQUIRE(pid >= 0);
  if (pid == 0) {
    ::execl((std::string(test::binary_dir) + "/rimline").c_str(), "rimline", "check", c.path("project.toml").c_str(),
            "--out", out.c_str(), "--quiet", static_cast<char*>(nullptr));
    ::_exit(127);
  }
  auto staging_exists = [&] {
    for (const auto& e : fs::directory_iterator(c.dir))
      if (e.path().filename().string().rfind(".out.staging-", 0) == 0) return true;
    return false;
  };
  bool seen = false;
  int status = 0;
  for (int i = 0; i < 60000 && !seen; ++i) {
    if (::waitpid(pid, &status, WNOHANG) == pid) break;  // finished before the outputs were staged
    seen = staging_exists();
    if (!seen) std::this_thread::sleep_for(std::chrono::milliseconds(1));
  }
  REQUIRE(seen);
  ::kill(pid, SIGTERM);
  REQUIRE(::waitpid(pid, &status, 0) == pid);
  CHECK(WIFSIGNALED(status));
  CHECK(WTERMSIG(status) == SIGTERM);
  CHECK_FALSE(staging_exists());
  CHECK_FALSE(fs::exists(out));  // the folder is as it was: not there
}

// Issue 18, defect 3: a layer read from an earlier run's results.gpkg, with --out that folder.
TEST_CASE("badinput reliability: an output over an input of the run is refused before anything is written") {
  Case c("output_over_input");
  c.write_network(base_pipes(), base_structures());
  const Ran first = run_cli({"check", c.path("project.toml"), "--out", c.path("out"), "--fail-on", "error"});
  REQUIRE(first.code <= 1);
  const auto before = reliability::hash_tree(c.dir / "out");
  c.write("again.toml", replace(replace(base_project(), R"(source = "structures.geojson")",
                                        "source = \"out/results.gpkg\"\nlayer = \"structures\""),
                                "[structures.fields]\nid = \"NODE_ID\"", "[structures.fields]\nid = \"id\""));
  const Ran r = run_cli({"check", c.path("again.toml"), "--out", c.path("out")});
  CHECK(r.code == 2);
  CHECK_THAT(r.out, Catch::Contains("results.gpkg: is an input of this run ("));
  CHECK_THAT(r.out, Catch::Contains("would replace it: choose another --out (nothing was written)"));
  CHECK(reliability::hash_tree(c.dir / "out") == before);
}

// Issue 18, defect 8: a 303-character outfall id made a profile file name too long; the run
// exited 3 without exceptions.csv and wrote a file named from freed memory into the working folder.
TEST_CASE("badinput reliability: a 303-character outfall id gives a bounded file name and a complete run") {
  Case c("long_outfall_id");
  const std::string id(303, 'O');
  auto s = base_structures();
  s[0] = replace(s[0], R"("NODE_ID":"OF")", "\"NODE_ID\":\"" + id + "\"");
  c.write_network(base_pipes(), s);
  const Ran r = run_cli({"check", "project.toml", "--out", "out", "--fail-on", "error"}, 60, c.dir.string());
  INFO(r.out);
  CHECK(r.code <= 1);
  CHECK(fs::exists(c.dir / "out" / "exceptions.csv"));
  std::size_t svgs = 0;
  for (const auto& e : fs::directory_iterator(c.dir / "out" / "profiles")) {
    ++svgs;
    CHECK(e.path().filename().string().size() <= 80 + 4);
  }
  CHECK(svgs > 0);
  std::vector<std::string> in_cwd;
  for (const auto& e : fs::directory_iterator(c.dir)) in_cwd.push_back(e.path().filename().string());
  std::sort(in_cwd.begin(), in_cwd.end());
  CHECK(in_cwd == std::vector<std::string>{"out", "pipes.geojson", "project.toml", "structures.geojson"});
  CHECK(report::file_stem(id).size() == 80);
  CHECK(report::file_stem(id) != report::file_stem(id + "x"));
  CHECK(report::file_stem("../CON") == "_.._CON");
  CHECK(report::file_stem("nul.txt") == "_nul.txt");
}

// Issue 18: an inflow of 1e300 L/s was taken and read much later as "must be finite, got inf".
TEST_CASE("badinput reliability: a flow beyond any drain is DATA_IMPLAUSIBLE where it is read") {
  Case c("huge_inflow");
  auto s = base_structures();
  s[3] = replace(s[3], R"("Q_LOCAL":20)", R"("Q_LOCAL":1e300)");
  c.write_network(base_pipes(), s);
  const auto r = c.run();
  INFO(dump(r));
  const Finding* f = find(r, "DATA_IMPLAUSIBLE", "M3");
  REQUIRE(f != nullptr);
  CHECK_THAT(message(f), Catch::StartsWith("Q_LOCAL 1e+300 L/s is beyond any drain (above 1"));
  CHECK_THAT(message(f), Catch::EndsWith("); the structure has no local inflow."));
  check_solved(r, {"OF", "M1", "M2", "M3", "M4"});
}

// Issue 18: projected coordinates declared as a geographic CRS dropped every feature one by one.
TEST_CASE("badinput reliability: projected coordinates under a geographic CRS are said once, exit 3") {
  Case c("projected_as_geographic");
  c.write_network(base_pipes(), base_structures());
  c.write("pipes.geojson", collection(base_pipes(), R"("crs":{"type":"name","properties":{"name":"urn:ogc:def:crs:EPSG::4326"}},)"));
  const Ran r = run_cli({"check", c.path("project.toml"), "--out", c.path("out")});
  CHECK(r.code == 3);
  CHECK_THAT(r.out, Catch::Contains("is geographic, but its coordinates (x 452150 to 452300, y 5385200 to 5385250) are "
                                    "not longitudes and latitudes (they look like projected metres or feet); declare "
                                    "the CRS the coordinates are in ([project] crs = \"EPSG:...\")"));
  CHECK(count_rows(r.out) == 1);
}

// Issue 18: very large integer ids were false duplicates under ids not in the file.
TEST_CASE("badinput reliability: ids a number type cannot hold exactly are DATA_ID_INEXACT") {
  Case c("huge_ids");
  // Every id a number, so the field is a number field (mixed with text GDAL makes it a text field,
  // which keeps the digits). Beyond 64 bits GDAL clamps both to 9223372036854775807.
  auto s = base_structures();
  const char* ids[] = {"1", "2", "3", "9223372036854775808", "9223372036854775809"};
  const char* was[] = {"OF", "M1", "M2", "M3", "M4"};
  for (int i = 0; i < 5; ++i) s[i] = replace(s[i], "\"NODE_ID\":\"" + std::string(was[i]) + "\"", "\"NODE_ID\":" + std::string(ids[i]));
  c.write_network(base_pipes(), s);
  const auto r = c.run();
  INFO(dump(r));
  std::size_t inexact = 0;
  for (const auto& f : r.findings)
    if (f.code == "DATA_ID_INEXACT") {
      ++inexact;
      CHECK_THAT(message(&f), Catch::EndsWith("ids that differ only there read alike: store ids as text."));
    }
  CHECK(inexact == 2);
}

// Issue 18: "16 raw GDAL ERROR 1 lines, then no such table" on a full disk.
TEST_CASE("badinput reliability: a full disk is named as such, with the file") {
  CHECK(report::write_failure_text(ENOSPC, "") ==
        "the disk is full (no space left on device); free space or choose another --out");
  CHECK(report::means_disk_full(0, "sqlite3_exec(CREATE TABLE ...) failed: database or disk is full"));
  CHECK(report::write_failure_text(EACCES, "") == "cannot be written: Permission denied");
  try {
    report::throw_write_failure("out/results.gpkg", 0, "ERROR 1: database or disk is full");
    FAIL("no error");
  } catch (const Error& e) {
    CHECK(std::string(e.what()) ==
          "out/results.gpkg: the disk is full (no space left on device); free space or choose another --out");
    CHECK(e.kind() == ErrorKind::bad_config);
  }
}

// Issue 18: numbers printed with 300 digits (1e300 coordinates, a huge tailwater in ft).
TEST_CASE("badinput reliability: printed numbers are bounded in width") {
  CHECK(fixed_text(1e300, 3) == "1.000000e+300");
  CHECK(fixed_text(-3.28e300, 2) == "-3.280000e+300");
  CHECK(fixed_text(123456.789, 3) == "123456.789");
  CHECK(fixed_text(std::numeric_limits<double>::max(), 17).size() <= 25);
}
