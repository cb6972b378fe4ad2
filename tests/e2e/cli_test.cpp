// The rimline executable: exit codes, messages that name file and key, dry run, methods, fields.
#include <sys/wait.h>

#include <catch2/catch.hpp>
#include <algorithm>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <string>

#include "test_paths.hpp"

namespace {

struct Ran {
  int code = -1;
  std::string out;  // stdout and stderr together
};

Ran run(const std::string& args) {
  const std::string cmd = std::string(rimline::test::binary_dir) + "/rimline " + args + " 2>&1";
  Ran r;
  FILE* p = popen(cmd.c_str(), "r");
  REQUIRE(p != nullptr);
  char buf[4096];
  while (std::fgets(buf, sizeof buf, p)) r.out += buf;
  const int status = pclose(p);
  r.code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  return r;
}

std::string demo(const char* v) { return std::string(rimline::test::source_dir) + "/data/demo/" + v + "/project.toml"; }

std::string temp_file(const std::string& name, const std::string& text) {
  const auto path = std::filesystem::path(rimline::test::binary_dir) / name;
  std::ofstream(path) << text;
  return path.string();
}

}  // namespace

TEST_CASE("cli: --version and --help") {
  CHECK(run("--version").out.find("rimline 0.1.0") != std::string::npos);
  const auto h = run("check --help");
  CHECK(h.code == 0);
  CHECK(h.out.find("Example:") != std::string::npos);
}

TEST_CASE("cli: the dry run prints the network summary and the data findings") {
  const auto r = run("check " + demo("metric") + " --dry-run");
  INFO(r.out);
  CHECK(r.out.find("network: 43 structures, 42 conduits (42 usable), 1 outfalls, 1 trees") != std::string::npos);
  CHECK(r.out.find("REVERSED: conduits:C-02") != std::string::npos);
  CHECK(r.out.find("DATA_MISSING: structures:B-05:field RIM") != std::string::npos);
}

TEST_CASE("cli: exit codes 0/1 follow --fail-on") {
  const auto out = std::string(rimline::test::binary_dir) + "/cli-demo";
  // The demo has warnings (freeboard, surcharge) and no error-severity finding.
  CHECK(run("check " + demo("metric") + " --out " + out + " -q").code == 1);
  CHECK(run("check " + demo("metric") + " --out " + out + " -q --fail-on error").code == 0);
}

TEST_CASE("cli: a bad project file is exit 2 and names the file, line and key with a suggestion") {
  const auto p = temp_file("cli-bad.toml", "[pipes]\nsource = \"x.gpkg\"\nsnap_tolerence = \"1 m\"\n");
  const auto r = run("check " + p + " --out /tmp/never");
  CHECK(r.code == 2);
  CHECK(r.out.find(p) != std::string::npos);
  CHECK(r.out.find("snap_tolerence") != std::string::npos);
  CHECK(r.out.find("did you mean \"snap_tolerance\"") != std::string::npos);
}

TEST_CASE("cli: an unreadable source is exit 3 and names the file") {
  const auto p = temp_file("cli-missing.toml", "[pipes]\nsource = \"no-such-file.gpkg\"\n[flows]\nmode = "
                                              "\"structure_inflows\"\ndefault_inflow = \"1 L/s\"\n");
  const auto r = run("check " + p + " --out /tmp/never");
  INFO(r.out);
  CHECK(r.code == 3);
  CHECK(r.out.find("no-such-file.gpkg") != std::string::npos);
}

TEST_CASE("cli: a bad option value is exit 2") {
  CHECK(run("check " + demo("metric") + " --out /tmp/x --fail-on sometimes").code == 2);
  CHECK(run("check " + demo("metric") + " --out /tmp/x --units furlongs").code == 2);
  CHECK(run("check " + demo("metric") + " --tailwater \"3 parsecs\" --out /tmp/x").code == 2);
}

TEST_CASE("cli: methods lists every method with a source") {
  const auto r = run("methods");
  CHECK(r.code == 0);
  CHECK(r.out.find("hec22") != std::string::npos);
  CHECK(r.out.find("from memory") != std::string::npos);
}

TEST_CASE("cli: fields proposes a mapping and writes a starter project that parses") {
  const std::string pipes = std::string(rimline::test::source_dir) + "/data/demo/metric/pipes.geojson";
  const auto project = std::filesystem::path(rimline::test::binary_dir) / "cli-starter.toml";
  std::filesystem::remove(project);
  const auto r = run("fields " + pipes + " --write-project " + project.string());
  INFO(r.out);
  CHECK(r.code == 0);
  CHECK(r.out.find("PIPE_ID") != std::string::npos);
  CHECK(std::filesystem::exists(project));
  // It refuses to overwrite the file it wrote.
  CHECK(run("fields " + pipes + " --write-project " + project.string()).code == 2);
  // The starter parses and runs a dry run.
  const auto dry = run("check " + project.string() + " --dry-run");
  INFO(dry.out);
  CHECK(dry.code <= 1);
}

TEST_CASE("cli: --profile-from draws one structure's path; an unknown id is exit 2 with a suggestion") {
  const auto out = std::string(rimline::test::binary_dir) + "/cli-profile";
  std::filesystem::remove_all(out);
  const auto ok = run("check " + demo("metric") + " --out " + out + " -q --fail-on error --profile-from B-08");
  INFO(ok.out);
  CHECK(ok.code == 0);
  CHECK(std::filesystem::exists(out + "/profiles.pdf"));
  CHECK(std::filesystem::exists(out + "/report.html"));
  const auto bad = run("check " + demo("metric") + " --out " + out + " -q --profile-from B-99");
  CHECK(bad.code == 2);
  CHECK(bad.out.find("B-99") != std::string::npos);
}

TEST_CASE("cli: a pump curve whose head rises is a bad project file (exit 2) naming file, line and key") {
  std::ifstream in(demo("metric"));
  std::string text((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
  const std::string good = R"(["0 L/s", "16.0 m"], ["5 L/s", "15.0 m"])";
  const auto at = text.find(good);
  REQUIRE(at != std::string::npos);
  text.replace(at, good.size(), R"(["0 L/s", "16.0 m"], ["5 L/s", "17.0 m"])");
  const std::string path = temp_file("rising_pump_curve.toml", text);
  const auto line = 1 + std::count(text.begin(), text.begin() + static_cast<std::ptrdiff_t>(at), '\n');
  const auto r = run("check " + path + " --dry-run");
  CHECK(r.code == 2);
  CHECK(r.out.find(path + ": line " + std::to_string(line) +
                   ": key pump_stations[1].curve: pump curve heads must fall strictly with flow (point 2)") !=
        std::string::npos);
}

TEST_CASE("cli: a run that checks nothing exits 5 and says so on stderr, even with --quiet") {
  const std::string pipes = std::string(rimline::test::source_dir) + "/data/demo/metric/pipes.geojson";
  const auto p = temp_file("cli-nothing.toml", "[pipes]\nsource = \"" + pipes +
                                                   "\"\n[pipes.fields]\nid = \"PIPE_ID\"\ndiameter = { field = \"SIZE\", "
                                                   "unit = \"mm\" }\n[pipes.defaults]\nmanning_n = 0.013\n[flows]\nmode = "
                                                   "\"structure_inflows\"\ndefault_inflow = \"5 L/s\"\n");
  const auto out = std::string(rimline::test::binary_dir) + "/cli-nothing";
  std::filesystem::remove_all(out);
  const auto r = run("check " + p + " --out " + out + " -q");
  INFO(r.out);
  CHECK(r.code == 5);
  CHECK(r.out.find("rimline: THIS RUN CHECKED NOTHING") != std::string::npos);
  std::ifstream csv(out + "/exceptions.csv");
  std::string text((std::istreambuf_iterator<char>(csv)), std::istreambuf_iterator<char>());
  CHECK(text.find("NOTHING_CHECKED") != std::string::npos);
}

TEST_CASE("cli: a missing project file says it does not exist") {
  const auto r = run("check /nonexistent/project.toml --dry-run");
  CHECK(r.code == 2);
  CHECK(r.out.find("/nonexistent/project.toml: the project file does not exist") != std::string::npos);
}
