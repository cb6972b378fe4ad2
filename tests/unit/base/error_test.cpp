#include "rimline/error.hpp"

#include <catch2/catch.hpp>

using namespace rimline;

TEST_CASE("error messages carry the file:layer:fid:field prefix", "[base][error]") {
  const Error e(ErrorKind::bad_input, ErrorContext{"pipes.gpkg", "mains", "P-12", "DIA"}, "no such field");
  CHECK(std::string(e.what()) == "pipes.gpkg:mains:fid P-12:field DIA: no such field");
  CHECK(e.kind() == ErrorKind::bad_input);
  CHECK(e.where().layer == "mains");
  CHECK(std::string(Error(ErrorKind::bad_config, "plain").what()) == "plain");
  CHECK(format_context(ErrorContext{"a.toml", "", "", ""}) == "a.toml: ");
}

TEST_CASE("closest_name suggests near misses only", "[base][error]") {
  const std::vector<std::string> names{"diameter", "invert_up", "invert_down", "material"};
  CHECK(closest_name("diamter", names) == "diameter");
  CHECK(closest_name("INVERT_UP", names) == "invert_up");  // case-insensitive
  CHECK(closest_name("invert_dwn", names) == "invert_down");
  CHECK(closest_name("colour", names).empty());
  CHECK(closest_name("x", {}).empty());
}
