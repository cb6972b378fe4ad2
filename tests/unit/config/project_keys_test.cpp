// docs/project-file.md, the parser's key table (src/config/project_keys.cpp) and the parser itself
// are kept in step: the docs list exactly the table's keys, and the docs' example projects parse and,
// together, set every key. A key added to the parser without a row in the table fails every parse
// that reads it; one added to the table without a row in the docs fails here.
#include <catch2/catch.hpp>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <regex>
#include <sstream>

#include "rimline/config/project.hpp"
#include "rimline/error.hpp"
#include "test_paths.hpp"

using namespace rimline;

namespace {

std::string docs() {
  std::ifstream in(std::string(test::source_dir) + "/docs/project-file.md");
  REQUIRE(in);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

std::vector<std::string> documented_keys(const std::string& text) {
  std::vector<std::string> keys;
  const std::regex row(R"(^\| `([^`]+)` \|)");
  std::istringstream lines(text);
  std::string line;
  for (std::smatch m; std::getline(lines, line);)
    if (std::regex_search(line, m, row)) keys.push_back(m[1]);
  std::sort(keys.begin(), keys.end());
  return keys;
}

std::vector<std::string> toml_blocks(const std::string& text) {
  std::vector<std::string> blocks;
  for (std::size_t at = text.find("```toml\n"); at != std::string::npos; at = text.find("```toml\n", at)) {
    at += 8;
    const std::size_t end = text.find("```", at);
    REQUIRE(end != std::string::npos);
    blocks.push_back(text.substr(at, end - at));
  }
  return blocks;
}

}  // namespace

TEST_CASE("docs/project-file.md lists exactly the keys of the parser's table", "[config][docs]") {
  const auto documented = documented_keys(docs());
  const auto& table = config::project_key_table();
  std::vector<std::string> missing, extra;
  std::set_difference(table.begin(), table.end(), documented.begin(), documented.end(), std::back_inserter(missing));
  std::set_difference(documented.begin(), documented.end(), table.begin(), table.end(), std::back_inserter(extra));
  INFO("in the parser's table, not in the docs: " << Catch::Detail::stringify(missing));
  INFO("in the docs, not in the parser's table: " << Catch::Detail::stringify(extra));
  CHECK(missing.empty());
  CHECK(extra.empty());
  CHECK(std::adjacent_find(documented.begin(), documented.end()) == documented.end());  // each key once
}

TEST_CASE("the docs' example projects parse and together set every key", "[config][docs]") {
  const auto dir = std::filesystem::path(test::binary_dir) / "docs-examples";
  std::filesystem::create_directories(dir);
  std::ofstream(dir / "pump.csv") << "flow,head\n0,30\n40,20\n";  // the curve_table example reads it
  std::vector<std::string> set;
  const auto blocks = toml_blocks(docs());
  CHECK(blocks.size() >= 3);
  for (const auto& block : blocks) {
    INFO(block);
    std::vector<std::string> keys;
    try {
      keys = config::project_keys_set(block, (dir / "project.toml").string());
    } catch (const Error& e) {
      FAIL(e.what());
    }
    set.insert(set.end(), keys.begin(), keys.end());
  }
  std::sort(set.begin(), set.end());
  set.erase(std::unique(set.begin(), set.end()), set.end());
  std::vector<std::string> unused;
  const auto& table = config::project_key_table();
  std::set_difference(table.begin(), table.end(), set.begin(), set.end(), std::back_inserter(unused));
  INFO("keys no example sets: " << Catch::Detail::stringify(unused));
  CHECK(unused.empty());
}

TEST_CASE("a missing project file says it does not exist", "[config]") {
  try {
    config::load_project("/nonexistent/dir/project.toml");
    FAIL("no error");
  } catch (const Error& e) {
    CHECK(e.kind() == ErrorKind::bad_config);
    CHECK(std::string(e.what()).find("/nonexistent/dir/project.toml: the project file does not exist") == 0);
  }
}
