// Inputs the libFuzzer harnesses (fuzz/, scripts/fuzz.sh) or their review found to break the
// parsers, kept as regressions: each must end in a rimline::Error naming its file, nothing else.
//   project/crash-e1f5..., crash-5e7a...  fuzz_project_parser: a non-ASCII character where toml++ 3.3 probes
//                                for whitespace reaches __builtin_unreachable() (UBSan report)
//   project/tomlplusplus-295-*   the minimal form reported upstream (marzer/tomlplusplus #295)
//   project/tomlplusplus-190-*   the same after a line-ending backslash (marzer/tomlplusplus #190)
//   fuzz/corpus/project/deep_*  seeds of ~200,000 nested parts (issue 18: toml++ overflowed the stack)
//   quantity/overflow-1e308-ha   parse_quantity returned +inf for "1e308 ha" (finite as written)
#include <filesystem>
#include <fstream>
#include <sstream>

#include "e2e/badinput/fixture.hpp"
#include "../fuzz/expand_input.hpp"

using namespace rimline;
namespace fs = std::filesystem;

namespace {

std::string read_bytes(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::stringstream ss;
  ss << in.rdbuf();
  return ss.str();
}

std::vector<fs::path> cases(const char* kind) {
  std::vector<fs::path> out;
  for (const auto& e : fs::directory_iterator(fs::path(test::source_dir) / "tests/data/badinput/fuzz" / kind))
    out.push_back(e.path());
  std::sort(out.begin(), out.end());
  return out;
}

}  // namespace

TEST_CASE("badinput fuzz regressions: project files that broke the TOML parser are bad_config errors") {
  const auto files = cases("project");
  REQUIRE(files.size() == 4);
  for (const auto& f : files) {
    INFO(f.filename().string());
    const std::string e = badinput::error_of([&] { config::parse_project(read_bytes(f), "fuzz.toml"); });
    CHECK_THAT(e, Catch::StartsWith("fuzz.toml: line "));
    CHECK_THAT(e, Catch::Contains("non-ASCII character"));
  }
}

TEST_CASE("badinput fuzz regressions: quantities beyond a double in SI are bad_config errors") {
  const auto files = cases("quantity");
  REQUIRE(files.size() == 1);
  const std::string bytes = read_bytes(files[0]);
  REQUIRE(bytes.size() > 1);
  CHECK(static_cast<units::Dimension>(bytes[0]) == units::Dimension::area);  // harness: first byte picks
  const std::string e = badinput::error_of(
      [&] { config::parse_quantity(bytes.substr(1), units::Dimension::area, "plausibility.catchment_max"); });
  CHECK(e == R"(plausibility.catchment_max: "1e308 ha" is out of range)");
}

// Issue 18, defect 1: the harness's seeds for deep keys and headers, expanded as the harness does.
TEST_CASE("badinput fuzz regressions: the deep-nesting seeds of the project harness are bad_config errors") {
  std::size_t n = 0;
  for (const auto& e : fs::directory_iterator(fs::path(test::source_dir) / "fuzz/corpus/project")) {
    if (e.path().filename().string().rfind("deep_", 0) != 0) continue;
    ++n;
    INFO(e.path().filename().string());
    const std::string bytes = read_bytes(e.path());
    const std::string text = fuzz::expand(reinterpret_cast<const std::uint8_t*>(bytes.data()), bytes.size());
    CHECK(text.size() > 200000);
    const std::string err = badinput::error_of([&] { config::parse_project(text, "fuzz.toml"); });
    CHECK_THAT(err, Catch::StartsWith("fuzz.toml: line "));
    CHECK_THAT(err, Catch::Contains("levels deep; a project file needs a few, rimline reads at most 64"));
  }
  CHECK(n == 5);
}
