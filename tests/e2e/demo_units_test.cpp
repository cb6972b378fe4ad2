// Issue 17: the demo with its pipe inverts (metres) declared in mm. Before, the inverts became
// millimetres of elevation, the topology changed and all three FREEBOARD findings vanished without a
// word; now the run says the unit looks wrong. The demo's data are invented: the check is the message.
#include <catch2/catch.hpp>
#include <fstream>
#include <sstream>

#include "rimline/config/project.hpp"
#include "rimline/run/check_run.hpp"
#include "test_paths.hpp"

using namespace rimline;

TEST_CASE("demo (metric) with the inverts declared in mm: UNIT_SUSPECT says they look like metres", "[e2e][demo]") {
  const std::string file = std::string(test::source_dir) + "/data/demo/metric/project.toml";
  std::ifstream in(file);
  std::stringstream text;
  text << in.rdbuf();
  std::string toml = text.str();
  for (const char* field : {"US_INV", "DS_INV"}) {
    const std::string from = std::string("field = \"") + field + "\", unit = \"m\"";
    const auto at = toml.find(from);
    REQUIRE(at != std::string::npos);
    toml.replace(at, from.size(), std::string("field = \"") + field + "\", unit = \"mm\"");
  }
  const auto r = run::run_check(config::parse_project(toml, file), {});
  const Finding* f = nullptr;
  for (const auto& x : r.findings)
    if (x.code == "UNIT_SUSPECT") f = &x;
  REQUIRE(f != nullptr);
  CHECK(f->severity == Severity::error);
  const std::string m = render_message(f->message, units::System::si);
  INFO(m);
  CHECK(m.rfind("looks like the pipe inverts US_INV and DS_INV are in m: declared mm. Read as mm, the median pipe slope "
                "is 0.0000046",
                0) == 0);
  CHECK(m.find("read as m, the median pipe slope is 0.0046") != std::string::npos);
}
