// The profile PDF: one page per sheet on ISO A3 landscape.
// ISO 216: A3 = 297 mm x 420 mm (from memory); 1 pt = 1/72 in, 1 in = 25.4 mm (PDF 32000-1:2008,
// 8.3.2.3 default user space; NIST SP 811 B.8), so the MediaBox is 1190.55 x 841.89 pt.
// Page objects are dictionaries of /Type /Page (PDF 32000-1:2008, 7.7.3.3).
#include <catch2/catch.hpp>

#include "report/plan_sheet.hpp"

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <regex>
#include <sstream>

#include "report_fixture.hpp"
#include "rimline/report/profile_pdf.hpp"

using namespace rimline;
namespace fs = std::filesystem;

TEST_CASE("profiles.pdf has the plan and one A3 landscape page per sheet", "[report][pdf]") {
  if (!report::pdf_supported()) {
    WARN("built without cairo: no PDF to check");
    return;
  }
  const auto run = test::fixture_run();
  const auto sheets = report::plan_sheets(run.read.network, run.topology, 1, {});
  REQUIRE(sheets.size() == 2);
  const auto path = (fs::temp_directory_path() / ("rimline-pdf-test-" + std::to_string(::getpid()) + ".pdf")).string();
  report::write_profiles_pdf(run, sheets, "2026-01-02", path);
  std::ifstream in(path, std::ios::binary);
  std::stringstream ss;
  ss << in.rdbuf();
  const std::string pdf = ss.str();
  std::remove(path.c_str());
  CHECK(pdf.rfind("%PDF-", 0) == 0);
  const std::regex page(R"(/Type\s*/Page[^s])");
  CHECK(std::distance(std::sregex_iterator(pdf.begin(), pdf.end(), page), std::sregex_iterator()) == 3);  // plan + 2
  std::smatch m;
  const std::regex media(R"(/MediaBox\s*\[\s*0\s+0\s+([0-9.]+)\s+([0-9.]+)\s*\])");
  REQUIRE(std::regex_search(pdf, m, media));
  CHECK(std::stod(m[1]) == Approx(420.0 / 25.4 * 72.0).margin(0.01));
  CHECK(std::stod(m[2]) == Approx(297.0 / 25.4 * 72.0).margin(0.01));
}

TEST_CASE("the plan sheet takes a scale of the 1-1.25-2-2.5-5 series, rounded up", "[report][pdf]") {
  CHECK(report::round_scale_up(1100.0) == 1250.0);
  CHECK(report::round_scale_up(1830.0) == 2000.0);
  CHECK(report::round_scale_up(2100.0) == 2500.0);
  CHECK(report::round_scale_up(2500.0) == 2500.0);
  CHECK(report::round_scale_up(4.2) == 5.0);
  CHECK(report::round_scale_up(6000.0) == 10000.0);
}

TEST_CASE("an unwritable PDF path is an error naming the file", "[report][pdf]") {
  if (!report::pdf_supported()) return;
  const auto run = test::fixture_run();
  const auto sheets = report::plan_sheets(run.read.network, run.topology, 1, {});
  CHECK_THROWS_WITH(report::write_profiles_pdf(run, sheets, "2026-01-02", "/nonexistent-dir/x/profiles.pdf"),
                    Catch::Contains("/nonexistent-dir/x/profiles.pdf"));
}
