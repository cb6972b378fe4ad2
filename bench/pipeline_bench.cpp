// Stage timings of a whole check, for issue 8 (scale): where the time of a run goes.
//
//   RIMLINE_BENCH_PROJECT=/tmp/rimline-bench/n100000-s1/project.toml
//   build-bench/rimline_bench --benchmark_filter=check_stages
//
// Runs the stages of run::run_check one by one (read, topology, flows, march, checks; one pass
// per tailwater level, as run_check does) with a wall-clock timer and the peak RSS after each,
// then run_check itself and the output writers (exceptions.csv, summary.json, results.gpkg and,
// with RIMLINE_BENCH_DRAWINGS=1, the profiles and report) into a temporary directory. Each
// figure is a counter in seconds (or MiB). Without RIMLINE_BENCH_PROJECT the benchmark is skipped.
// The writers run one after the other here; `rimline check` writes results.gpkg on its own thread
// beside the others, so its output stage takes about the longest writer, not their sum.
#include <benchmark/benchmark.h>
#include <sys/resource.h>

#include <chrono>
#include <cstdlib>
#include <filesystem>
#include <string>

#include "rimline/config/project.hpp"
#include "rimline/report/outputs.hpp"
#include "rimline/report/profile_path.hpp"
#include "rimline/report/report_html.hpp"
#include "rimline/report/staged_files.hpp"
#include "rimline/run/check_run.hpp"

using namespace rimline;

namespace {

double peak_rss_mib() {
  rusage u{};
  getrusage(RUSAGE_SELF, &u);
  return static_cast<double>(u.ru_maxrss) / 1024.0;  // ru_maxrss is in KiB on Linux
}

class Clock {
 public:
  // Seconds since the last call (or construction).
  double lap() {
    const auto now = std::chrono::steady_clock::now();
    const double s = std::chrono::duration<double>(now - last_).count();
    last_ = now;
    return s;
  }

 private:
  std::chrono::steady_clock::time_point last_ = std::chrono::steady_clock::now();
};

void BM_check_stages(benchmark::State& state) {
  const char* path = std::getenv("RIMLINE_BENCH_PROJECT");
  if (!path) {
    state.SkipWithError("set RIMLINE_BENCH_PROJECT to a project file (scripts/make_network.py writes one)");
    return;
  }
  const bool drawings = std::getenv("RIMLINE_BENCH_DRAWINGS") != nullptr;
  const std::string out = (std::filesystem::temp_directory_path() / "rimline_pipeline_bench").string();
  for (auto _ : state) {
    const config::Project project = config::load_project(path);
    Clock clock;
    {
      // The stages as run_check chains them (check_run.cpp), timed one by one.
      auto read = gis::read_network(project);
      state.counters["1_read_s"] = clock.lap();
      state.counters["1_read_rss_MiB"] = peak_rss_mib();
      Findings findings = read.findings;
      topology::TopologyOptions topo_opt;
      topo_opt.snap_tolerance_m = project.snap_tolerance_m;
      const auto topo = topology::build_topology(read.network, topo_opt, findings);
      state.counters["2_topology_s"] = clock.lap();
      state.counters["2_topology_rss_MiB"] = peak_rss_mib();
      flows::FlowOptions flow_opt;
      flow_opt.mode = project.flow_mode == config::FlowMode::pipe_field ? flows::Mode::pipe_field
                                                                    : flows::Mode::structure_inflows;
      flow_opt.split = project.split_rule == config::SplitRule::field ? flows::Split::field : flows::Split::capacity;
      flow_opt.friction = project.methods.friction;
      flow_opt.default_inflow_m3_s = project.default_inflow_m3_s.value_or(0.0);
      const auto flows = flows::design_flows(read.network, topo, flow_opt, findings);
      state.counters["3_flows_s"] = clock.lap();
      // March options as run_check sets them (march_options_from in check_run.cpp).
      solve::MarchOptions march_opt;
      march_opt.tailwater_mode = project.tailwater_mode == config::TailwaterMode::fixed  ? solve::TailwaterMode::fixed
                                 : project.tailwater_mode == config::TailwaterMode::free ? solve::TailwaterMode::free
                                                                                     : solve::TailwaterMode::higher;
      march_opt.k_by_type = project.methods.k_by_type;
      march_opt.loss_method = project.methods.structure_loss;
      march_opt.benching = project.methods.benching;
      if (project.structure_defaults.loss_k) march_opt.default_k = *project.structure_defaults.loss_k;
      march_opt.default_structure_diameter_m = project.structure_defaults.diameter_m;
      // As the CLI asks it: every step point only for the pipes of the default drawings.
      march_opt.keep_step_points = report::drawn_conduits(read.network, topo, report::DrawingOptions{});
      state.counters["march_threads"] = solve::march_threads(march_opt, read.network.conduits.size());
      std::size_t points = 0, solved = 0;
      double march_s = 0.0, checks_s = 0.0;
      const std::size_t levels = std::max<std::size_t>(1, project.tailwater_levels_m.size());
      for (std::size_t k = 0; k < levels; ++k) {
        if (!project.tailwater_levels_m.empty()) march_opt.tailwater_m = project.tailwater_levels_m[k];
        const auto march = solve::march(read.network, topo, flows.flow_m3_s, march_opt);
        march_s += clock.lap();
        state.counters["4_march_rss_MiB"] = peak_rss_mib();
        const auto found = checks::run_checks(read.network, march, checks::Criteria{});
        checks_s += clock.lap();
        benchmark::DoNotOptimize(found.size());
        for (const auto& c : march.conduits) {
          points += c.profile.points.size();
          solved += c.solved ? 1 : 0;
        }
      }
      state.counters["4_march_s"] = march_s;
      state.counters["5_checks_s"] = checks_s;
      state.counters["profile_points_per_pipe"] = solved ? static_cast<double>(points) / static_cast<double>(solved) : 0.0;
      state.counters["pipes"] = static_cast<double>(read.network.conduits.size());
    }
    clock.lap();
    run::RunOptions run_opt;
    run_opt.detailed_conduits = [](const model::Network& net, const topology::Topology& topo) {
      return report::drawn_conduits(net, topo, report::DrawingOptions{});
    };
    const run::CheckRun run = run::run_check(project, run_opt);
    state.counters["6_run_check_s"] = clock.lap();
    state.counters["6_run_check_rss_MiB"] = peak_rss_mib();
    {
      report::StagedFiles files(out);
      files.write_stream("exceptions.csv", [&run](std::ostream& csv) { report::write_exceptions_csv(run, csv); });
      state.counters["7_exceptions_csv_s"] = clock.lap();
      files.write_text("summary.json", report::summary_json(run));
      state.counters["7_summary_json_s"] = clock.lap();
      report::write_results_gpkg(run, files.path_for("results.gpkg"));
      state.counters["7_results_gpkg_s"] = clock.lap();
      state.counters["7_outputs_rss_MiB"] = peak_rss_mib();
      if (drawings) {
        report::write_drawings(run, files);
        state.counters["8_drawings_s"] = clock.lap();
        state.counters["8_drawings_rss_MiB"] = peak_rss_mib();
      }
      files.commit();
    }
    state.counters["findings"] = static_cast<double>(run.findings.size());
  }
  std::error_code ec;
  std::filesystem::remove_all(out, ec);
}
BENCHMARK(BM_check_stages)->Iterations(1)->Unit(benchmark::kSecond);

}  // namespace
