// Bad-input catalogue, the project file: unknown keys, wrong types, bad quantities. Expected
// messages follow include/rimline/config/project.hpp (file, key, "did you mean ...?").
// clang-format off
#include "e2e/badinput/cli_fixture.hpp"

#include <sys/stat.h>
// clang-format on

using namespace rimline;
using namespace rimline::badinput;

namespace {

std::string parse_error(const std::string& toml) {
  return error_of([&] { config::parse_project(toml, "project.toml"); });
}

}  // namespace

TEST_CASE("badinput project: an unknown key is an error with a did-you-mean") {
  CHECK(parse_error(replace(base_project(), "snap_tolerance", "snap_tolerence")) ==
        R"(project.toml: line 7: key pipes.snap_tolerence: unknown key; did you mean "snap_tolerance"?)");
}

TEST_CASE("badinput project: an unknown section is an error") {
  CHECK(parse_error(base_project() + "\n[critera]\nfreeboard = \"0.3 m\"\n") ==
        R"(project.toml: line 39: key critera: unknown key; did you mean "criteria"?)");
}

TEST_CASE("badinput project: a number where a quantity string belongs is an error naming the key") {
  CHECK(
      parse_error(replace(base_project(), R"(snap_tolerance = "0.5 m")", "snap_tolerance = 0.5")) ==
      R"(project.toml: line 7: key pipes.snap_tolerance: expected a quantity string "<number> <unit>" (a length), found a number)");
}

TEST_CASE("badinput project: a quantity in the wrong dimension is an error naming the key") {
  CHECK(parse_error(replace(base_project(), R"(snap_tolerance = "0.5 m")", R"(snap_tolerance = "0.5 m/s")")) ==
        R"(project.toml: line 7: key pipes.snap_tolerance: "0.5 m/s" is a velocity, expected a length)");
}

TEST_CASE("badinput project: an unknown unit is an error naming the key") {
  CHECK(parse_error(replace(base_project(), R"(unit = "mm")", R"(unit = "millimetres")")) ==
        R"(project.toml: line 11: key pipes.fields.diameter.unit: unknown unit "millimetres"; the units of length are m, mm, cm, ft, us_ft, in)");
}

TEST_CASE("badinput project: a string where a table belongs is an error naming the key") {
  CHECK(
      parse_error(replace(base_project(), R"(diameter = { field = "SIZE", unit = "mm" })", R"(diameter = 300)")) ==
      R"(project.toml: line 11: key pipes.fields.diameter: expected { field = "NAME", unit = "..." } (a length needs its unit), found an integer)");
}

TEST_CASE("badinput project: a TOML syntax error names the line and says in plain words what was expected") {
  CHECK(parse_error(replace(base_project(), R"(name = "bad-input fixture")", R"(name = "bad-input fixture)")) ==
        R"(project.toml: line 2: a quoted text is not closed: a closing quote was expected before the end of the line)");
  CHECK(parse_error(replace(base_project(), R"(name = "bad-input fixture")", R"(name "bad-input fixture")")) ==
        R"(project.toml: line 2: '=' and a value were expected after the key, but found '"' (write key = value; a key with spaces or dots in it goes in quotes))");
  CHECK(parse_error(replace(base_project(), R"(levels = ["2.2 m"])", R"(levels = ["2.2 m")")) ==
        R"(project.toml: line 37: a list [ ... ] is not closed: items are separated by ',' and the list ends with ']' (the file ended first))");
  CHECK(parse_error(replace(base_project(), R"(id = "PIPE_ID")", R"(id = PIPE_ID)")) ==
        R"(project.toml: line 10: a value was expected after '=': text goes in quotes ("..."), numbers and true/false as they are, lists in [ ], tables in { })");
  CHECK(parse_error(base_project() + "\n[flows]\nsplit = \"capacity\"\n") ==
        R"(project.toml: line 39: a table or key is given twice: each [table] and each key may appear once (put all keys of a table under one header))");
}

TEST_CASE("badinput project: an unknown unit in a quantity lists the units of its kind") {
  CHECK(parse_error(replace(base_project(), R"(snap_tolerance = "0.5 m")", R"(snap_tolerance = "0.5 furlong")")) ==
        R"(project.toml: line 7: key pipes.snap_tolerance: unknown unit "furlong" in "0.5 furlong" (a length takes m, mm, cm, ft, us_ft, in))");
}

TEST_CASE("badinput project: NaN and infinity in the project are errors") {
  CHECK(
      parse_error(replace(base_project(), "manning_n = 0.013", "manning_n = nan")) ==
      R"(project.toml: line 16: key pipes.defaults.manning_n: nan is outside the plausible 0.008 to 0.05 ([plausibility] manning_n_min, manning_n_max))");
  CHECK(parse_error(replace(base_project(), R"(levels = ["2.2 m"])", R"(levels = ["inf m"])")) ==
        R"(project.toml: line 37: key tailwater.levels: "inf m" is not a quantity "<number> <unit>")");
}

TEST_CASE("badinput project: non-ASCII text in quotes and comments is accepted, elsewhere it is an error") {
  // "Schöneck" and "Ø" in UTF-8: fine in a string and in a comment (TOML 1.0 allows any Unicode there).
  const auto ok =
      replace(base_project(), R"(name = "bad-input fixture")", "name = \"Sch\xC3\xB6neck \xC3\x98st\" # \xC3\xB8st");
  CHECK(config::parse_project(ok, "project.toml").name == "Sch\xC3\xB6neck \xC3\x98st");
  CHECK(parse_error(replace(base_project(), "[flows]", "[flows]\n\xC3\xB8 = 1")) ==
        R"(project.toml: line 33: a non-ASCII character outside a string or comment; TOML allows it only in quotes)");
}

// Issue 18, defect 1: toml++ 3.3 recursed once per part of a dotted key or table header and
// overflowed the stack at ~200,000 parts (SIGSEGV, exit 139). Depth is now counted before parsing.
std::string dotted(const std::string& part, int n) {
  std::string s = part;
  for (int i = 1; i < n; ++i) s += "." + part;
  return s;
}

TEST_CASE("badinput project: a table header of 200,000 parts is an error, not a stack overflow") {
  CHECK(parse_error("[" + dotted("a", 200000) + "]\nx = 1\n") ==
        "project.toml: line 1: a table header of 200000 parts nested 200000 levels deep; a project file needs a "
        "few, rimline reads at most 64");
  // The same through the command line: exit 2 (a bad project file), not 139.
  Case c("deep_header");
  c.write("project.toml", "# deep\n[[" + dotted("b", 200000) + "]]\n");
  const Ran r = run_cli({"check", c.path("project.toml"), "--out", c.path("out")});
  CHECK(r.code == 2);
  CHECK(r.out == "rimline: error: " + c.path("project.toml") +
                     ": line 2: a table header of 200000 parts nested 200001 levels deep; a project file needs a few, "
                     "rimline reads at most 64\n");
}

TEST_CASE("badinput project: a dotted key of 200,000 parts is an error, also inside a table or inline table") {
  CHECK(parse_error(base_project() + dotted("k", 200000) + " = 1\n") ==
        "project.toml: line 38: a dotted key of 200000 parts nested 200001 levels deep; a project file needs a few, "
        "rimline reads at most 64");
  CHECK(parse_error("[a.b]\nx = { y = { " + dotted("\"q.q\"", 70) + " = 2 } }\n") ==
        "project.toml: line 2: a dotted key of 70 parts nested 74 levels deep; a project file needs a few, rimline "
        "reads at most 64");
  // Dots inside quoted parts, strings and comments are not parts; 64 levels are accepted by the guard.
  CHECK_THAT(parse_error("# " + dotted("c", 500) + "\nname = \"" + dotted("s", 500) + "\"\n" + dotted("d", 64) +
                         " = 1.5\n"),
             Catch::Contains(": unknown key"));
}

TEST_CASE("badinput project: arrays and inline tables nested past 64 levels are an error") {
  std::string open, close;
  for (int i = 0; i < 40; ++i) open += "[{ a = ", close = " }]" + close;
  CHECK(parse_error("x = " + open + "1" + close + "\n") ==
        "project.toml: line 1: arrays, inline tables and keys nested 65 levels deep; a project file needs a few, rimline "
        "reads at most 64");
}

// Issue 18: a byte-order mark (Windows editors write one) was "a non-ASCII character outside a
// string"; UTF-16 text was the same. The mark is skipped; UTF-16 and UTF-32 are named.
TEST_CASE("badinput project: a UTF-8 byte-order mark is accepted") {
  CHECK(config::parse_project("\xEF\xBB\xBF" + base_project(), "project.toml").name == "bad-input fixture");
}

TEST_CASE("badinput project: UTF-16 and UTF-32 project files are named, with or without a mark") {
  const std::string ascii = base_project();
  std::string le = "\xFF\xFE", be = "\xFE\xFF", le_bare, be_bare;
  for (char c : ascii) {
    le += std::string(1, c) + '\0', be += std::string(1, '\0') + c;
    le_bare += std::string(1, c) + '\0', be_bare += std::string(1, '\0') + c;
  }
  const std::string tail = " text; TOML is UTF-8: save it as UTF-8 (without a byte-order mark is best)";
  CHECK(parse_error(le) == "project.toml: the project file is UTF-16 (little-endian)" + tail);
  CHECK(parse_error(be) == "project.toml: the project file is UTF-16 (big-endian)" + tail);
  CHECK(parse_error(le_bare) == "project.toml: the project file is UTF-16 (little-endian, no byte-order mark)" + tail);
  CHECK(parse_error(be_bare) == "project.toml: the project file is UTF-16 (big-endian, no byte-order mark)" + tail);
  CHECK(parse_error(std::string("\xFF\xFE\0\0", 4) + "x") == "project.toml: the project file is UTF-32 (little-endian)" + tail);
}

// Issue 18: a folder given as the project file read as an empty file ("pipes.source missing"); a
// FIFO blocked the reading forever.
TEST_CASE("badinput project: a folder or a FIFO given as the project file is named, exit 2") {
  Case c("project_is_folder");
  c.write_network(base_pipes(), base_structures());
  CHECK(error_of([&] { config::load_project(c.dir.string()); }) ==
        c.dir.string() + ": is a folder, not a project file; give the path of the .toml file (did you mean " +
            c.path("project.toml") + "?)");
  const Ran r = run_cli({"check", c.dir.string(), "--out", c.path("out")});
  CHECK(r.code == 2);
  REQUIRE(::mkfifo(c.path("fifo.toml").c_str(), 0600) == 0);
  const Ran f = run_cli({"check", c.path("fifo.toml"), "--out", c.path("out")}, 20);
  CHECK(f.code == 2);
  CHECK(f.out == "rimline: error: " + c.path("fifo.toml") +
                     ": is a named pipe (FIFO), not a project file; rimline reads the project file only from a regular "
                     "file\n");
}
