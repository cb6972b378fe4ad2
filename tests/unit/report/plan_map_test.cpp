// The plan map of report.html (plan_map.hpp) on the literal fixture and on a long invented chain
// (plumbing and invariants: invented data, no check values). Scale-bar lengths are the 1-2-5
// series of "nice" numbers (common practice, no source).
#include <catch2/catch.hpp>

#include "report/plan_map.hpp"
#include "report_fixture.hpp"
#include "text_count.hpp"
#include "xml_check.hpp"

using namespace rimline;


TEST_CASE("the plan map draws every structure and pipe once, coloured by its result", "[report][plan]") {
  const auto run = test::fixture_run();
  const report::FeatureLinks links(run, {});
  const auto m = report::plan_map(run, links);
  INFO(m.svg.substr(0, 600));
  const auto x = test::check_xml(m.svg);
  CHECK(x.error.empty());
  CHECK_FALSE(m.simplified);
  CHECK(m.structures_drawn == run.read.network.structures.size());
  CHECK(m.conduits_drawn == 0);  // the fixture's pipes have no plan vertices
  CHECK(test::count_of(m.svg, "class=\"feat structure\"") == 7);
  // S2 is short of its freeboard (0.150 m of 0.300 m): drawn in that status, labelled, ringed.
  CHECK(m.svg.find("id=\"map-s2\" class=\"feat structure\" data-key=\"s2\" data-status=\"freeboard\"") != std::string::npos);
  CHECK(m.svg.find(">S2</text>") != std::string::npos);
  CHECK(test::count_of(m.svg, "class=\"finding-ring\"") >= 1);
  // Outfalls S0 and S5 are squares with labels.
  CHECK(test::count_of(m.svg, "<rect id=\"map-s") == 2);
  CHECK(m.svg.find("S0 (outfall)") != std::string::npos);
  CHECK(m.svg.find("id=\"scale-bar\"") != std::string::npos);
  CHECK(m.svg.find("id=\"north-arrow\"") != std::string::npos);
  CHECK(m.data_json.find("\"s2\"") != std::string::npos);
  CHECK(m.data_json.find('<') == std::string::npos);
}

TEST_CASE("a city-sized network is grouped into cells, and the page says so", "[report][plan]") {
  run::CheckRun run;
  auto& net = run.read.network;
  const std::size_t n = 4000;  // 4000 structures + 3999 pipes > detailed_features
  for (std::size_t k = 0; k < n; ++k) {
    model::Structure s;
    s.id = "M" + std::to_string(k);
    // 40 dense estates of 100 structures each (0.1 m apart), 500 m between estates.
    s.location = {static_cast<double>(k / 100) * 500.0 + static_cast<double>(k % 10) * 0.1,
                  static_cast<double>(k % 100 / 10) * 0.1};
    net.structures.push_back(s);
    if (k == 0) continue;
    model::Conduit c;
    c.id = "P" + std::to_string(k);
    c.from = k;
    c.to = k - 1;
    c.vertices = {net.structures[k].location, net.structures[k - 1].location};
    net.conduits.push_back(c);
  }
  const report::FeatureLinks links(run, {});
  CHECK_FALSE(links.detailed());
  const auto m = report::plan_map(run, links);
  CHECK(m.simplified);
  CHECK(test::check_xml(m.svg).error.empty());
  CHECK(m.structures_drawn <= 80);  // one group per estate (an estate may straddle two cells)
  CHECK(m.conduits_drawn <= 80);
  CHECK(m.svg.size() < 40000);
  CHECK(m.note.find("too many to draw one by one") != std::string::npos);
  CHECK(report::plan_map_section(run, links).find("id=\"plan-simplified\"") != std::string::npos);
}

TEST_CASE("the scale bar takes a 1-2-5 length within a quarter of the map", "[report][plan]") {
  CHECK(report::scale_bar_length(430.0) == 200.0);
  CHECK(report::scale_bar_length(99.0) == 50.0);
  CHECK(report::scale_bar_length(1.0) == 1.0);
  CHECK(report::scale_bar_length(7.0) == 5.0);
}
