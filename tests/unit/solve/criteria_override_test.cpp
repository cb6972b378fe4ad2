// Per-feature criteria: an override replaces only the limits it sets.
#include <catch2/catch.hpp>

#include "rimline/checks/checks.hpp"

using namespace rimline;

TEST_CASE("criteria: a per-structure freeboard and a per-pipe minimum velocity override the run's") {
  checks::Criteria run;
  run.freeboard_m = 0.3;
  run.velocity_min_m_s = 0.9;
  std::map<std::string, checks::Override> structures{{"T-04", {0.5, {}, {}, {}, {}, {}}}};
  std::map<std::string, checks::Override> conduits{{"D-05", {{}, 0.6, {}, {}, {}, checks::VelocityBasis::full_flow}}};
  CHECK(checks::criteria_for(run, structures, "T-04").freeboard_m == 0.5);
  CHECK(checks::criteria_for(run, structures, "T-05").freeboard_m == 0.3);
  const auto d05 = checks::criteria_for(run, conduits, "D-05");
  CHECK(d05.velocity_min_m_s == 0.6);
  CHECK(d05.freeboard_m == 0.3);  // not overridden
  CHECK(d05.velocity_max_m_s == run.velocity_max_m_s);
  // The self-cleansing basis per pipe: D-05 full flow, the run's normal depth elsewhere.
  CHECK(d05.velocity_basis == checks::VelocityBasis::full_flow);
  CHECK(checks::criteria_for(run, conduits, "D-06").velocity_basis == checks::VelocityBasis::normal_depth);
}
