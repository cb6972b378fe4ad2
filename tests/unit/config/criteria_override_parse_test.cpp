// [criteria.structures.<id>] and [criteria.conduits.<id>] in the project file.
#include <catch2/catch.hpp>

#include "rimline/error.hpp"
#include "rimline/config/project.hpp"

using namespace rimline;

TEST_CASE("project: per-feature criteria parse into SI, and a misspelt limit is refused") {
  const auto p = config::parse_project(R"(
[pipes]
source = "p.gpkg"
[criteria]
freeboard = "1 ft"
[criteria.structures."T-04"]
freeboard = "0.5 m"
[criteria.conduits.D-05]
velocity_min = "2 ft/s"
capacity_ratio_max = 0.8
)",
                                   "/tmp/x.toml");
  CHECK(p.criteria.freeboard_m == Approx(0.3048));
  REQUIRE(p.structure_criteria.count("T-04") == 1);
  CHECK(*p.structure_criteria.at("T-04").freeboard_m == Approx(0.5));
  REQUIRE(p.conduit_criteria.count("D-05") == 1);
  CHECK(*p.conduit_criteria.at("D-05").velocity_min_m_s == Approx(2 * 0.3048));  // NIST SP 811 B.8
  CHECK(*p.conduit_criteria.at("D-05").capacity_ratio_max == Approx(0.8));
  CHECK_FALSE(p.conduit_criteria.at("D-05").cover_min_m.has_value());

  CHECK_THROWS_WITH(config::parse_project("[pipes]\nsource = \"p.gpkg\"\n[criteria.structures.A]\nfreebord = \"1 m\"\n",
                                      "/tmp/x.toml"),
                    Catch::Contains("freebord") && Catch::Contains("did you mean \"freeboard\""));
}
