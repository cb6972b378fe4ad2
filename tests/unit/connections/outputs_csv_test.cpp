// The connection CSVs follow the conventions of exceptions.csv (issue 18): a text cell a spreadsheet
// would run as a formula is neutralised, each row names its feature's fid, numbers are rounded as
// display_number rounds them; and the files belong to the output set replaced whole. Invented
// values: plumbing checks, not check values.
#include <catch2/catch.hpp>

#include <algorithm>
#include <string>
#include <vector>

#include "rimline/connections/outputs.hpp"
#include "rimline/report/outputs.hpp"

using namespace rimline;

TEST_CASE("headroom.csv neutralises formula cells and carries fids and rounded flows", "[connections][csv]") {
  connections::Headroom h;
  h.id = "=HYPERLINK(\"x\")";
  h.fid = 17;
  h.headroom_m3_s = 0.0123456;
  h.governing_layer = LayerRole::conduits;
  h.governing_id = "@P1";
  h.governing_fid = 3;
  h.criterion = "CAPACITY";
  h.change = "worsened";
  h.case_label = "every tailwater case";
  const std::string csv = connections::headroom_csv({h}, units::System::si);
  const std::string row = csv.substr(csv.find('\n') + 1);
  INFO(csv);
  CHECK(csv.rfind("structure,fid,headroom,unit,", 0) == 0);
  CHECK(row.rfind("\"'=HYPERLINK(\"\"x\"\")\",17,", 0) == 0);
  CHECK(row.find(",\"'@P1\",3,CAPACITY,") != std::string::npos);
  // Flows to three significant figures (rimline::display_number), as exceptions.csv writes them.
  CHECK(row.find(',' + display_number(0.0123456, units::Dimension::flow, units::System::si) + ',') != std::string::npos);
  CHECK(row.find("0.0123456") == std::string::npos);
}

TEST_CASE("structure_changes.csv and changes.csv carry fids and neutralise ids", "[connections][csv]") {
  connections::Comparison cmp;
  connections::StructureChange sc;
  sc.id = "-T1";
  sc.fid = 5;
  sc.hgl_before_m = 4.1234;
  sc.hgl_after_m = 4.1801;
  cmp.structures.push_back(sc);
  connections::ExceptionChange e;
  e.change = connections::Change::new_exception;
  e.layer = LayerRole::structures;
  e.feature_id = "+T2";
  e.question = "FREEBOARD";
  Finding f;
  f.code = "FREEBOARD";
  f.layer = LayerRole::structures;
  f.feature_id = "+T2";
  f.fid = 9;
  f.value = 0.25;
  f.limit = 0.3;
  f.dimension = units::Dimension::length;
  e.after = connections::Exception{f, "every tailwater case"};
  cmp.exceptions.push_back(e);
  const std::string sc_csv = connections::structure_changes_csv(cmp, units::System::si);
  INFO(sc_csv);
  CHECK(sc_csv.rfind("id,fid,status,hgl_before,", 0) == 0);
  CHECK(sc_csv.find("\n\"'-T1\",5,existing,4.123,4.180,0.057,") != std::string::npos);
  const std::string ch_csv = connections::changes_csv(cmp, units::System::si);
  INFO(ch_csv);
  CHECK(ch_csv.rfind("change,layer,feature_id,fid,", 0) == 0);
  CHECK(ch_csv.find("\nnew,structures,\"'+T2\",9,FREEBOARD,") != std::string::npos);
}

TEST_CASE("the connection CSVs are part of the output set replaced whole", "[connections][csv]") {
  const auto& names = report::output_names();
  for (const char* name : {"changes.csv", "structure_changes.csv", "headroom.csv"}) {
    INFO(name);
    CHECK(std::find(names.begin(), names.end(), name) != names.end());
  }
}
