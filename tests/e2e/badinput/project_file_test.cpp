// Bad-input catalogue, the project file: unknown keys, wrong types, bad quantities. Expected
// messages follow include/rimline/config/project.hpp (file, key, "did you mean ...?").
#include "e2e/badinput/fixture.hpp"

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
