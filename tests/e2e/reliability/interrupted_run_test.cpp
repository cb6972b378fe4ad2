// "Never a half-written result": a run killed (SIGTERM, SIGKILL) at several points leaves each
// output either as the previous run wrote it or as the new run writes it, and every one whole
// (CSV rows match the header, JSON parses, GDAL opens the GeoPackage, HTML and PDF are closed).
// Old and new are told apart by bytes, GeoPackages by feature values (see content_key).
#include "e2e/reliability/output_files.hpp"
#include "e2e/reliability/run_cli.hpp"

using namespace rimline;
using namespace rimline::badinput;
using namespace rimline::reliability;

namespace {

using clock_type = std::chrono::steady_clock;

std::map<std::string, std::string> final_outputs(const fs::path& dir) {
  std::map<std::string, std::string> out;
  for (const auto& entry : hash_tree(dir)) {
    const std::string& name = entry.first;
    if (fs::path(name).filename().string().rfind(".", 0) != 0)
      out[name] = content_key(dir / name);  // temporaries are hidden
  }
  return out;
}

}  // namespace

TEST_CASE("reliability: an interrupted run leaves the old outputs or the new, never a partial one") {
  Case c("interrupted");
  write_big_network(c, 20, 20);  // 400 pipes, 20 profiles
  const fs::path old_dir = c.dir / "old", new_dir = c.dir / "new", out = c.dir / "out";
  const auto project = c.path("project.toml");
  REQUIRE(run_rimline({"check", project, "--out", old_dir.string(), "--tailwater", "2.2 m", "--fail-on", "error"}) <=
          1);
  const auto t0 = clock_type::now();
  REQUIRE(run_rimline({"check", project, "--out", new_dir.string(), "--tailwater", "2.9 m", "--fail-on", "error"}) <=
          1);
  const double full_s = std::chrono::duration<double>(clock_type::now() - t0).count();
  const auto old_files = final_outputs(old_dir), new_files = final_outputs(new_dir);
  REQUIRE(old_files.count("exceptions.csv"));
  REQUIRE(old_files.count("summary.json"));
  REQUIRE(old_files.at("summary.json") != new_files.at("summary.json"));  // the two runs are told apart

  int saw_old = 0, saw_new = 0;
  // Dense near the end, where the renames happen (the full run time includes process start and exit).
  const double fractions[] = {0.05, 0.3, 0.6, 0.8, 0.9, 0.95, 0.98, 1.0, 1.02};
  for (std::size_t k = 0; k < std::size(fractions); ++k) {
    const int sig = k % 2 ? SIGKILL : SIGTERM;
    fs::remove_all(out);
    fs::copy(old_dir, out, fs::copy_options::recursive);
    const pid_t pid = spawn_rimline({"check", project, "--out", out.string(), "--tailwater", "2.9 m"});
    std::this_thread::sleep_for(std::chrono::duration<double>(fractions[k] * full_s));
    ::kill(pid, sig);
    const int rc = wait_child(pid);
    INFO("signal " << sig << " after " << fractions[k] * full_s << " s of " << full_s << " s; exit " << rc);
    const auto now = final_outputs(out);
    for (const auto& [name, hash] : old_files) {
      INFO(name);
      REQUIRE(now.count(name));
      const std::string& got = now.at(name);
      CHECK((got == hash || (new_files.count(name) && got == new_files.at(name))));
      CHECK(file_problem(out / name) == "");
    }
    const bool all_new = now.at("summary.json") == new_files.at("summary.json");
    (all_new ? saw_new : saw_old)++;
  }
  // The early kills left the old outputs (the late ones land on either side of the renames).
  CHECK(saw_old > 0);
  CHECK(saw_new + saw_old == static_cast<int>(std::size(fractions)));
}
