// write_drawings through StagedFiles into a scratch directory: the file layout of the outputs
// contract (DIR/profiles/<outfall-id>-<n>.svg, DIR/profiles.pdf, DIR/report.html).
#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>

#include "report_fixture.hpp"
#include "rimline/report/profile_pdf.hpp"
#include "rimline/report/report_html.hpp"
#include "rimline/report/staged_files.hpp"

using namespace rimline;
namespace fs = std::filesystem;

TEST_CASE("write_drawings stages one SVG per profile, the PDF and the report", "[report][drawings]") {
  const fs::path dir = fs::temp_directory_path() / ("rimline-drawings-test-" + std::to_string(::getpid()));
  fs::remove_all(dir);
  fs::create_directories(dir / "profiles");
  std::ofstream(dir / "profiles" / "OLD-9.svg") << "<svg/>";  // from an earlier run
  const auto run = test::fixture_run();
  {
    report::StagedFiles files(dir.string());
    report::write_drawings(run, files);
    // Nothing final before the commit.
    CHECK_FALSE(fs::exists(dir / "report.html"));
    files.commit();
  }
  CHECK(fs::exists(dir / "report.html"));
  CHECK(fs::exists(dir / "profiles" / "S0-1.svg"));  // longest path of tree 0 (S3, 220 m)
  CHECK(fs::exists(dir / "profiles" / "S5-1.svg"));  // tree 1
  CHECK_FALSE(fs::exists(dir / "profiles" / "OLD-9.svg"));
  CHECK(fs::exists(dir / "profiles.pdf") == report::pdf_supported());
  std::size_t svgs = 0;
  for (const auto& e : fs::recursive_directory_iterator(dir)) {
    CHECK(e.path().filename().string().find(".partial") == std::string::npos);
    svgs += e.path().extension() == ".svg" ? 1 : 0;
  }
  CHECK(svgs == 2);
  // The index row of S0-1: path S3 -> S1 -> S0, 220 m; freeboards (rim - HGL) S0 2.000,
  // S1 2.200, S3 2.500 m in the fixture, so the least is 2.000 m at S0.
  std::ifstream in(dir / "report.html");
  const std::string html((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
  CHECK(html.find("id=\"profile-index\"") != std::string::npos);
  // Lengths to 0.1 m, levels to the millimetre.
  CHECK(html.find("<td>220.0</td><td>3</td><td>2.000</td><td>S0</td>") != std::string::npos);
  fs::remove_all(dir);
}

TEST_CASE("a run with no case draws no profile but still writes the report", "[report][drawings]") {
  const fs::path dir = fs::temp_directory_path() / ("rimline-drawings-empty-" + std::to_string(::getpid()));
  fs::remove_all(dir);
  auto run = test::fixture_run();
  run.cases.clear();
  run.envelope_structure_case.clear();
  {
    report::StagedFiles files(dir.string());
    report::write_drawings(run, files);
    files.commit();
  }
  CHECK(fs::exists(dir / "report.html"));
  CHECK_FALSE(fs::exists(dir / "profiles.pdf"));
  fs::remove_all(dir);
}
