// Outputs are staged under hidden temporary names; a killed run's temporaries are cleared next time.
#include <catch2/catch.hpp>
#include <filesystem>
#include <fstream>

#include "rimline/report/staged_files.hpp"
#include "test_paths.hpp"

namespace fs = std::filesystem;

TEST_CASE("staged files: nothing is visible until commit; leftovers of a dead process are removed") {
  const fs::path dir = fs::path(rimline::test::binary_dir) / "staged-files";
  fs::remove_all(dir);
  fs::create_directories(dir);
  // pid 2^22 + 1 is above the kernel's pid_max (4194304), so no such process can exist.
  const fs::path stale = dir / ".exceptions.partial-4194305.csv";
  std::ofstream(stale) << "half a row";
  std::ofstream(dir / "keep.txt") << "the user's own file";
  {
    rimline::report::StagedFiles files(dir.string());
    CHECK_FALSE(fs::exists(stale));
    CHECK(fs::exists(dir / "keep.txt"));
    files.write_text("a.csv", "x\n");
    CHECK_FALSE(fs::exists(dir / "a.csv"));
    files.commit();
  }
  CHECK(fs::exists(dir / "a.csv"));
  {
    rimline::report::StagedFiles files(dir.string());
    files.write_text("b.csv", "y\n");
  }  // destroyed without commit: the temporary goes, nothing appears
  CHECK_FALSE(fs::exists(dir / "b.csv"));
  std::size_t hidden = 0;
  for (const auto& e : fs::directory_iterator(dir)) hidden += e.path().filename().string()[0] == '.' ? 1 : 0;
  CHECK(hidden == 0);
}
