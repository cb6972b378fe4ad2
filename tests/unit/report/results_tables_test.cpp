// The full results tables and the inputs detail of report.html, on the literal fixture
// (report_fixture.hpp; invented data: plumbing and consistency, not check values).
#include <catch2/catch.hpp>

#include "report/inputs_detail.hpp"
#include "report/results_tables.hpp"
#include "report_fixture.hpp"
#include "rimline/report/report_html.hpp"
#include "text_count.hpp"
#include "xml_check.hpp"

using namespace rimline;


TEST_CASE("the results tables hold every structure and pipe, with the design flow of each pipe", "[report][tables]") {
  auto run = test::fixture_run();
  run.flows.flow_m3_s = {0.5, 0.3, 0.2, 0.1, 0.05};
  const report::FeatureLinks links(run, {});
  const std::string h = report::results_tables_section(run, links);
  CHECK(test::check_xml(h).error.empty());
  const auto structures = h.substr(h.find("id=\"structure-table\""), h.find("id=\"pipe-table\"") - h.find("id=\"structure-table\""));
  const auto pipes = h.substr(h.find("id=\"pipe-table\""));
  CHECK(test::count_of(structures, "<tr>") == 1 + 7);  // heading + every structure
  CHECK(test::count_of(pipes, "<tr>") == 1 + 5);
  CHECK(pipes.find("<th data-num=\"1\">Design flow (m3/s)</th>") != std::string::npos);
  CHECK(pipes.find("<td>0.300</td>") != std::string::npos);  // C1's design flow, three figures
  // S2: rim 4.200, HGL 4.050, freeboard 0.150, short by 0.150 of the required 0.300.
  CHECK(structures.find("<td>S2</td><td>manhole</td><td class=\"st st-freeboard\">freeboard</td><td>4.200</td><td>2.500</td>"
                        "<td>4.050</td><td>0.150</td><td>0.300</td><td>0.150</td>") != std::string::npos);
  CHECK(structures.find("<a href=\"#map-s2\">map</a>") != std::string::npos);
  CHECK(h.find("id=\"structure-table-filter\" hidden=\"hidden\"") != std::string::npos);  // shown by the script only
}

TEST_CASE("the inputs state the datum, K by type, where each tailwater came from and the pump curves", "[report][tables]") {
  auto run = test::fixture_run();
  run.march_options.k_by_type = {{"manhole", 0.5}, {"inlet", 0.4}};
  run.read.network.structures[3].loss_k = 1.3;
  run.project.tailwater_levels_m = {3.0};
  run.project.vertical_datum = "Fixture datum";
  std::string h = report::inputs_detail(run);
  CHECK(test::check_xml(h).error.empty());
  CHECK(h.find("Fixture datum") != std::string::npos);
  CHECK(h.find("<td>inlet</td><td>0.40</td><td>2</td>") != std::string::npos);
  CHECK(h.find("<td>outfall</td><td>0.50 (default)</td><td>2</td>") != std::string::npos);
  CHECK(h.find("S3 1.30") != std::string::npos);
  CHECK(h.find("project file, [tailwater] levels") != std::string::npos);
  run.project.tailwater_levels_m = {2.0};  // the case's 3.000 m then came from the command line
  run.read.network.structures[0].tailwater_m = 3.1;
  h = report::inputs_detail(run);
  CHECK(h.find("command line (--tailwater)") != std::string::npos);
  CHECK(h.find("S0 3.100 m") != std::string::npos);
  run.project.vertical_datum.clear();
  CHECK(report::vertical_datum_text(run).find("not stated") != std::string::npos);
}
