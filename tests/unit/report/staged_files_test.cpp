// The output set is staged in a sibling folder and swapped into place whole; the user's own files
// in the output folder are carried over untouched; a killed run's staging folder is cleared next
// time; an output that would replace an input is refused. Values invented for the tests.
#include <catch2/catch.hpp>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "rimline/error.hpp"
#include "rimline/file_kind.hpp"
#include "rimline/report/staged_files.hpp"
#include "test_paths.hpp"

namespace fs = std::filesystem;
using rimline::report::StagedFiles;

namespace {

std::string slurp(const fs::path& p) {
  std::ifstream in(p);
  std::stringstream ss;
  ss << in.rdbuf();
  return ss.str();
}

std::size_t hidden_siblings(const fs::path& dir) {
  std::size_t n = 0;
  for (const auto& e : fs::directory_iterator(dir.parent_path()))
    n += e.path().filename().string().rfind("." + dir.filename().string() + ".", 0) == 0 ? 1 : 0;
  return n;
}

}  // namespace

TEST_CASE("staged files: nothing is visible until commit; the set replaces the old one whole") {
  const fs::path dir = fs::path(rimline::test::binary_dir) / "staged-files" / "out";
  fs::remove_all(dir.parent_path());
  fs::create_directories(dir / "profiles");
  // pid 2^22 + 1 is above the kernel's pid_max (4194304), so no such process can exist.
  const fs::path stale = dir.parent_path() / ".out.staging-4194305";
  fs::create_directories(stale);
  std::ofstream(stale / "exceptions.csv") << "half a row";
  std::ofstream(dir / ".exceptions.partial-4194305.csv") << "an older version's temporary";
  std::ofstream(dir / "keep.txt") << "the user's own file";
  fs::create_directories(dir / "notes");
  std::ofstream(dir / "notes" / "n.txt") << "the user's own folder";
  std::ofstream(dir / "report.html") << "old report";
  std::ofstream(dir / "results.gpkg-wal") << "an old sidecar";
  std::ofstream(dir / "profiles" / "OLD-9.svg") << "<svg/>";
  const auto keep_id = rimline::file_identity((dir / "keep.txt").string());
  {
    StagedFiles files(dir.string(), {"report.html", "results.gpkg", "profiles"});
    CHECK_FALSE(fs::exists(stale));
    files.write_text("a.csv", "x\n");
    files.write_text("profiles/NEW-1.svg", "<svg/>");
    CHECK_FALSE(fs::exists(dir / "a.csv"));
    CHECK(hidden_siblings(dir) == 1);  // its own staging folder
    files.commit();
  }
  CHECK(slurp(dir / "a.csv") == "x\n");
  CHECK(fs::exists(dir / "profiles" / "NEW-1.svg"));
  CHECK_FALSE(fs::exists(dir / "profiles" / "OLD-9.svg"));  // the set is replaced as a whole
  CHECK_FALSE(fs::exists(dir / "report.html"));              // an output this run did not write
  CHECK_FALSE(fs::exists(dir / "results.gpkg-wal"));
  CHECK_FALSE(fs::exists(dir / ".exceptions.partial-4194305.csv"));
  CHECK(slurp(dir / "keep.txt") == "the user's own file");
  CHECK(rimline::file_identity((dir / "keep.txt").string()) == keep_id);  // the same file, not a copy
  CHECK(slurp(dir / "notes" / "n.txt") == "the user's own folder");
  CHECK(hidden_siblings(dir) == 0);
  {
    StagedFiles files(dir.string());
    files.write_text("b.csv", "y\n");
  }  // destroyed without commit: the staging folder goes, nothing appears
  CHECK_FALSE(fs::exists(dir / "b.csv"));
  CHECK(fs::exists(dir / "a.csv"));
  CHECK(hidden_siblings(dir) == 0);
}

TEST_CASE("staged files: a folder that does not exist yet is made by the commit") {
  const fs::path dir = fs::path(rimline::test::binary_dir) / "staged-files-new" / "a" / "out";
  fs::remove_all(dir.parent_path().parent_path());
  {
    StagedFiles files(dir.string());
    files.write_text("x.txt", "1");
    CHECK_FALSE(fs::exists(dir));
    files.commit();
  }
  CHECK(slurp(dir / "x.txt") == "1");
}

TEST_CASE("staged files: an output folder that is a file is refused") {
  const fs::path file = fs::path(rimline::test::binary_dir) / "staged-files-file.txt";
  std::ofstream(file) << "x";
  try {
    StagedFiles files(file.string());
    FAIL("no error");
  } catch (const rimline::Error& e) {
    CHECK(std::string(e.what()) ==
          file.string() + ": is a regular file, not a folder; --out names the folder the outputs go in");
  }
}

TEST_CASE("staged files: an output that would replace an input is refused, by identity not by name") {
  const fs::path dir = fs::path(rimline::test::binary_dir) / "staged-files-inputs" / "out";
  fs::remove_all(dir.parent_path());
  fs::create_directories(dir);
  std::ofstream(dir / "results.gpkg") << "an earlier run's layers, now an input";
  std::ofstream(dir / "pipes.geojson") << "an input that is not an output";
  fs::create_hard_link(dir / "results.gpkg", dir.parent_path() / "linked.gpkg");
  const std::vector<std::string> names = {"results.gpkg", "profiles"};
  // Another name of the same file (a hard link outside the folder) is caught; "../out/" spelling too.
  const std::string via_link = (dir.parent_path() / "linked.gpkg").string();
  CHECK_THROWS_WITH(rimline::report::refuse_outputs_over_inputs(dir.string(), names, {via_link}),
                    (dir / "results.gpkg").string() + ": is an input of this run (" + via_link + "); the outputs written to " +
                        dir.string() + " would replace it: choose another --out (nothing was written)");
  const std::string odd = (dir / ".." / "out" / "results.gpkg").string();
  CHECK_THROWS(rimline::report::refuse_outputs_over_inputs(dir.string(), names, {odd}));
  // An input in the folder that is not an output is kept by the swap: no refusal.
  CHECK_NOTHROW(rimline::report::refuse_outputs_over_inputs(dir.string(), names, {(dir / "pipes.geojson").string()}));
}
