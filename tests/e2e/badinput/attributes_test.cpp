// Bad-input catalogue, attribute values: missing mapped fields, wrong field types, duplicate ids,
// sizes in the wrong unit, negative or absurd roughness, NaN / infinity, non-UTF-8 text, inverts
// above rims. Expected codes from include/rimline/gis/read_network.hpp; inputs invented for the test.
#include "e2e/badinput/fixture.hpp"
#include "e2e/reliability/output_files.hpp"
#include "rimline/report/outputs.hpp"

using namespace rimline;
using namespace rimline::badinput;

TEST_CASE("badinput attributes: a mapped field missing from the layer stops the run with did-you-mean") {
  Case c("missing_field");
  c.write_network(base_pipes(), base_structures(), replace(base_project(), R"(field = "SIZE")", R"(field = "SIZ")"));
  const std::string e = error_of([&] { c.run(); });
  CHECK(e ==
        c.path("pipes.geojson") +
            R"(:pipes:field SIZ: the field mapped by pipes.fields.diameter is not in the layer; did you mean "SIZE"?)");
}

TEST_CASE("badinput attributes: text in a numeric field is DATA_IMPLAUSIBLE naming feature and field") {
  Case c("wrong_field_type");
  auto pipes = base_pipes();
  pipes[2] = replace(pipes[2], R"("SIZE":300)", R"("SIZE":"12 inch")");
  c.write_network(pipes, base_structures());
  const auto r = c.run();
  INFO(dump(r));
  const Finding* f = find(r, "DATA_IMPLAUSIBLE", "P3", "SIZE");
  REQUIRE(f != nullptr);
  CHECK(message(f) == R"(SIZE holds "12 inch", which is not a number; the pipe is left out of the analysis.)");
  check_solved(r, {"OF", "M1", "M2", "M4"});
}

TEST_CASE("badinput attributes: a structure rim given as text is DATA_IMPLAUSIBLE, its freeboard unknown") {
  Case c("rim_as_text");
  auto s = base_structures();
  s[2] = replace(s[2], R"("RIM":5.2)", R"("RIM":"n/a")");
  c.write_network(base_pipes(), s);
  const auto r = c.run();
  INFO(dump(r));
  const Finding* f = find(r, "DATA_IMPLAUSIBLE", "M2", "RIM");
  REQUIRE(f != nullptr);
  CHECK(message(f) == R"(RIM holds "n/a", which is not a number; the rim is unknown.)");
  CHECK(find(r, "RIM_UNKNOWN", "M2") != nullptr);
  check_solved(r, {"OF", "M1", "M2", "M3", "M4"});
}

TEST_CASE("badinput attributes: duplicate pipe and structure ids are reported, features kept apart") {
  Case c("duplicate_ids");
  auto pipes = base_pipes();
  pipes[3] = replace(pipes[3], R"("PIPE_ID":"P4")", R"("PIPE_ID":"P2")");
  auto s = base_structures();
  s[4] = replace(s[4], R"("NODE_ID":"M4")", R"("NODE_ID":"M3")");
  c.write_network(pipes, s);
  const auto r = c.run();
  INFO(dump(r));
  const Finding* p = find(r, "DATA_DUPLICATE_ID", "P2");
  REQUIRE(p != nullptr);
  CHECK(p->layer == LayerRole::conduits);
  CHECK(message(p) ==
        R"(The id "P2" is also used by fid 1; both pipes are kept and told apart by their fid, so results under this id are ambiguous.)");
  const Finding* st = find(r, "DATA_DUPLICATE_ID", "M3");
  REQUIRE(st != nullptr);
  CHECK(st->layer == LayerRole::structures);
  CHECK(r.read.network.conduits.size() == 4);
  CHECK(r.read.network.structures.size() >= 5);
  for (const auto& s2 : r.cases.back().march.structures) CHECK(s2.solved);
}

TEST_CASE("badinput attributes: a diameter that looks like inches given as mm is DATA_IMPLAUSIBLE") {
  Case c("inches_as_mm");
  auto pipes = base_pipes();
  pipes[2] = replace(pipes[2], R"("SIZE":300)", R"("SIZE":12)");  // 12 (inch) read as 12 mm
  c.write_network(pipes, base_structures());
  const auto r = c.run();
  INFO(dump(r));
  const Finding* f = find(r, "DATA_IMPLAUSIBLE", "P3", "SIZE");
  REQUIRE(f != nullptr);
  CHECK(
      message(f) ==
      R"(SIZE 12 mm is smaller than the plausible 30 mm (it looks like a value in inches); the pipe is left out of the analysis.)");
  check_solved(r, {"OF", "M1", "M2", "M4"});
}

TEST_CASE("badinput attributes: a diameter that looks like metres given as mm is DATA_IMPLAUSIBLE") {
  Case c("metres_as_mm");
  auto pipes = base_pipes();
  pipes[2] = replace(pipes[2], R"("SIZE":300)", R"("SIZE":0.3)");
  c.write_network(pipes, base_structures());
  const auto r = c.run();
  INFO(dump(r));
  const Finding* f = find(r, "DATA_IMPLAUSIBLE", "P3", "SIZE");
  REQUIRE(f != nullptr);
  CHECK(
      message(f) ==
      R"(SIZE 0.3 mm is smaller than the plausible 30 mm (it looks like a value in metres); the pipe is left out of the analysis.)");
}

TEST_CASE("badinput attributes: negative and absurd Manning n are DATA_IMPLAUSIBLE, the default is used") {
  Case c("bad_roughness");
  auto pipes = base_pipes();
  pipes[1] = replace(pipes[1], R"("SIZE":375)", R"("SIZE":375,"N":-0.013)");
  pipes[2] = replace(pipes[2], R"("SIZE":300)", R"("SIZE":300,"N":13)");
  c.write_network(pipes, base_structures(),
                  replace(base_project(), R"(id = "PIPE_ID")", "id = \"PIPE_ID\"\nmanning_n = \"N\""));
  const auto r = c.run();
  INFO(dump(r));
  const Finding* neg = find(r, "DATA_IMPLAUSIBLE", "P2", "N");
  REQUIRE(neg != nullptr);
  CHECK(message(neg) ==
        R"(N -0.013 is outside the plausible 0.008 to 0.05; n = 0.013 from [pipes.defaults] manning_n is used.)");
  const Finding* big = find(r, "DATA_IMPLAUSIBLE", "P3", "N");
  REQUIRE(big != nullptr);
  CHECK(message(big) ==
        R"(N 13 is outside the plausible 0.008 to 0.05; n = 0.013 from [pipes.defaults] manning_n is used.)");
  check_solved(r, {"OF", "M1", "M2", "M3", "M4"});
}

TEST_CASE("badinput attributes: a negative ks in the project defaults stops the run naming the key") {
  Case c("negative_ks_default");
  auto p = replace(base_project(), "manning_n = 0.013", "ks = \"-1.5 mm\"");
  p += "\n[methods]\nfriction = \"darcy_weisbach\"\n";
  c.write_network(base_pipes(), base_structures(), p);
  const std::string e = error_of([&] { c.run(); });
  CHECK(
      e ==
      c.path("project.toml") +
          R"(: line 16: key pipes.defaults.ks: -0.0015 m is outside the plausible 0 m to 0.1 m ([plausibility] ks_max))");
}

TEST_CASE("badinput attributes: NaN and infinity in numeric fields are DATA_IMPLAUSIBLE") {
  Case c("nan_infinity");
  auto pipes = base_pipes();
  pipes[2] = replace(pipes[2], R"("US_INV":2.75)", R"("US_INV":NaN)");
  pipes[3] = replace(pipes[3], R"("SIZE":300)", R"("SIZE":Infinity)");
  auto s = base_structures();
  s[3] = replace(s[3], R"("RIM":5.4)", R"("RIM":-Infinity)");
  c.write_network(pipes, s);
  const auto r = c.run();
  INFO(dump(r));
  const Finding* inv = find(r, "DATA_IMPLAUSIBLE", "P3", "US_INV");
  REQUIRE(inv != nullptr);
  CHECK(message(inv) == R"(US_INV is not a finite number; the upstream invert is unknown.)");
  const Finding* size = find(r, "DATA_IMPLAUSIBLE", "P4", "SIZE");
  REQUIRE(size != nullptr);
  CHECK(message(size) == R"(SIZE is not a finite number; the pipe is left out of the analysis.)");
  const Finding* rim = find(r, "DATA_IMPLAUSIBLE", "M3", "RIM");
  REQUIRE(rim != nullptr);
  CHECK(message(rim) == R"(RIM is not a finite number; the rim is unknown.)");
  check_solved(r, {"OF", "M1", "M2"});
}

TEST_CASE("badinput attributes: non-UTF-8 attribute text does not stop the run or break the outputs") {
  Case c("non_utf8");
  auto pipes = base_pipes();
  pipes[2] = replace(pipes[2], R"("PIPE_ID":"P3")", "\"PIPE_ID\":\"P3-\xE9\xE8\"");  // Latin-1 bytes
  pipes[2] = replace(pipes[2], R"("SIZE":300)", R"("SIZE":3)");                      // and a finding on it
  c.write_network(pipes, base_structures());
  const auto r = c.run();
  INFO(dump(r));
  // The id is kept byte for byte as the source holds it, so it still matches the export.
  const Finding* f = find(r, "DATA_IMPLAUSIBLE", "P3-\xE9\xE8", "SIZE");
  REQUIRE(f != nullptr);
  check_solved(r, {"OF", "M1", "M2", "M4"});
  // The outputs are still written and whole.
  const fs::path out = c.dir / "out";
  report::write_outputs(r, out.string());
  const auto csv = reliability::slurp(out / "exceptions.csv");
  CHECK(csv.find("P3-\xE9\xE8") != std::string::npos);
  for (const char* name : {"exceptions.csv", "summary.json", "results.gpkg", "report.html"}) {
    INFO(name);
    CHECK(reliability::file_problem(out / name) == "");
  }
}

TEST_CASE("badinput attributes: a structure invert above its rim is DATA_IMPLAUSIBLE") {
  Case c("invert_above_rim");
  auto s = base_structures();
  s[2] = replace(s[2], R"("RIM":5.2)", R"("RIM":2.1)");  // rim 2.1 m, sump 2.5 m
  c.write_network(base_pipes(), s);
  const auto r = c.run();
  INFO(dump(r));
  const Finding* f = find(r, "DATA_IMPLAUSIBLE", "M2", "RIM");
  REQUIRE(f != nullptr);
  CHECK(message(f) == R"(RIM 2.100 m is below the invert SUMP 2.500 m; the rim is unknown.)");
  check_solved(r, {"OF", "M1", "M2", "M3", "M4"});
}

namespace {

// The criteria findings of one code and id, as (fid) in the run's list and as rows of exceptions.csv.
std::vector<std::int64_t> fids_of(const run::CheckRun& r, const std::string& code, const std::string& id) {
  std::vector<std::int64_t> out;
  for (const auto& f : r.findings)
    if (f.code == code && f.feature_id == id) out.push_back(f.fid);
  std::sort(out.begin(), out.end());
  return out;
}

std::size_t rows_starting(const std::string& csv, const std::string& start) {
  std::size_t n = 0;
  for (std::size_t at = csv.find("\n" + start); at != std::string::npos; at = csv.find("\n" + start, at + 1)) ++n;
  return n;
}

// Two structures "M2" (M4 renamed) both below the HGL, two pipes "P2" (P4 renamed) both surcharged
// and slow, under a 4.5 m tailwater. Invented values (plumbing, not a check value).
void write_repeated_ids(const Case& c, const std::string& second_m2) {
  auto pipes = base_pipes();
  pipes[3] = replace(pipes[3], R"("PIPE_ID":"P4")", R"("PIPE_ID":"P2")");
  auto s = base_structures();
  s[2] = replace(s[2], R"("RIM":5.2)", R"("RIM":4.3)");
  s[4] = replace(replace(s[4], R"("NODE_ID":"M4")", "\"NODE_ID\":\"" + second_m2 + "\""), R"("RIM":5.2)", R"("RIM":4.3)");
  c.write_network(pipes, s, replace(base_project(), R"(levels = ["2.2 m"])", R"(levels = ["4.5 m"])"));
}

}  // namespace

// Issue 18, defect 2: only one finding per (code, id, layer) survived into exceptions.csv, so the
// second "M2" flooded in results.gpkg with no FLOODED row and the second "P2" lost its rows.
TEST_CASE("badinput attributes: every feature sharing an id keeps its own findings, told apart by fid") {
  Case c("repeated_ids_rows");
  write_repeated_ids(c, "M2");
  const auto r = c.run();
  INFO(dump(r));
  CHECK(fids_of(r, "FLOODED", "M2") == std::vector<std::int64_t>{2, 4});
  CHECK(fids_of(r, "SURCHARGED", "P2") == std::vector<std::int64_t>{1, 3});
  // VELOCITY_LOW is judged on the design flow at normal depth (issue 16): only the second P2 (fid 3,
  // the former P4) is slow; before issue 18 its row was lost to the first P2's key.
  CHECK(fids_of(r, "VELOCITY_LOW", "P2") == std::vector<std::int64_t>{3});
  CHECK(fids_of(r, "DATA_DUPLICATE_ID", "M2") == std::vector<std::int64_t>{4});
  report::write_outputs(r, (c.dir / "out").string());
  const auto csv = reliability::slurp(c.dir / "out" / "exceptions.csv");
  CHECK(csv.rfind("code,severity,layer,feature_id,fid,field,value,limit,shortfall,unit,case,x,y,message\n", 0) == 0);
  CHECK(rows_starting(csv, "FLOODED,error,structures,M2,2,") == 1);
  CHECK(rows_starting(csv, "FLOODED,error,structures,M2,4,") == 1);
  CHECK(rows_starting(csv, "SURCHARGED,warning,conduits,P2,1,") == 1);
  CHECK(rows_starting(csv, "SURCHARGED,warning,conduits,P2,3,") == 1);
  CHECK(rows_starting(csv, "VELOCITY_LOW,warning,conduits,P2,3,") == 1);
}

TEST_CASE("badinput attributes: ids that differ only by trailing spaces are a finding and kept apart") {
  Case c("repeated_ids_spaces");
  write_repeated_ids(c, "M2  ");
  const auto r = c.run();
  INFO(dump(r));
  const Finding* d = find(r, "DATA_DUPLICATE_ID", "M2");
  REQUIRE(d != nullptr);
  CHECK(d->fid == 4);
  CHECK(message(d) == R"(The id "M2" is also used by fid 2 (as held the two differ only by spaces around them, "M2  " and "M2", which rimline trims); both structures are kept and told apart by their fid, so pipes that name this id are ambiguous.)");
  CHECK(fids_of(r, "FLOODED", "M2") == std::vector<std::int64_t>{2, 4});
}

// Issue 18: an id such as =HYPERLINK(...) went into exceptions.csv as it was, and a spreadsheet ran it.
TEST_CASE("badinput attributes: ids a spreadsheet would run as formulas are neutralised in exceptions.csv only") {
  Case c("csv_injection");
  auto pipes = base_pipes();
  pipes[1] = replace(pipes[1], R"("PIPE_ID":"P2")", R"x("PIPE_ID":"=HYPERLINK(\"http://x.invalid\",\"P2\")")x");
  pipes[2] = replace(pipes[2], R"("PIPE_ID":"P3")", R"("PIPE_ID":"@P3")");
  pipes[3] = replace(pipes[3], R"("PIPE_ID":"P4")", R"("PIPE_ID":"-P4")");
  auto s = base_structures();
  s[4] = replace(s[4], R"("NODE_ID":"M4")", R"("NODE_ID":"+M4")");
  s[4] = replace(s[4], R"("RIM":5.2)", R"("RIM":"n/a")");
  c.write_network(pipes, s, replace(base_project(), R"(levels = ["2.2 m"])", R"(levels = ["4.5 m"])"));
  const auto r = c.run();
  INFO(dump(r));
  REQUIRE(find(r, "SURCHARGED", R"x(=HYPERLINK("http://x.invalid","P2"))x") != nullptr);  // the id itself unchanged
  report::write_outputs(r, (c.dir / "out").string());
  const auto csv = reliability::slurp(c.dir / "out" / "exceptions.csv");
  CHECK(csv.find(R"x(,conduits,"'=HYPERLINK(""http://x.invalid"",""P2"")",1,)x") != std::string::npos);
  CHECK(csv.find(R"(,conduits,"'@P3",2,)") != std::string::npos);
  CHECK(csv.find(R"(,conduits,"'-P4",3,)") != std::string::npos);
  CHECK(csv.find(R"(,structures,"'+M4",4,RIM,)") != std::string::npos);
  CHECK(csv.find("\n=") == std::string::npos);
  CHECK(csv.find(",=") == std::string::npos);
  CHECK(csv.find(",@") == std::string::npos);
  CHECK(csv.find(",+") == std::string::npos);
  // Negative numbers are numbers, not text: untouched.
  CHECK(csv.find(",-0.") != std::string::npos);
  // Elsewhere the id is as the source holds it.
  CHECK(reliability::slurp(c.dir / "out" / "summary.json").find("'=HYPERLINK") == std::string::npos);
  CHECK(reliability::gpkg_rows(c.dir / "out" / "results.gpkg").size() > 0);
  bool in_gpkg = false;
  for (const auto& row : reliability::gpkg_rows(c.dir / "out" / "results.gpkg"))
    in_gpkg = in_gpkg || row.find(R"x(|=HYPERLINK("http://x.invalid","P2")|)x") != std::string::npos;
  CHECK(in_gpkg);
}
