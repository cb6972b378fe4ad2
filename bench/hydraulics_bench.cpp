// Speed of the hydraulics core: one water-surface profile over a 100 m circular pipe, and the
// normal and critical depth solvers. Target: median under 20 us per partly full profile.
#include <benchmark/benchmark.h>

#include "rimline/hydraulics/gvf.hpp"

using namespace rimline::hydraulics;

namespace {
ConduitReach pipe_100m(double slope, double flow) {
  ConduitReach r;
  r.section = {Shape::circular, 1.0, 0.0, 0.0, {}};
  r.length_m = 100.0;
  r.invert_down_m = 10.0;
  r.invert_up_m = 10.0 + slope * 100.0;
  r.flow_m3_s = flow;
  return r;
}

void profile(benchmark::State& state, ConduitReach reach, double level) {
  std::size_t points = 0;
  for (auto _ : state) {
    const ConduitProfile p = compute_profile(reach, level);
    points = p.points.size();
    benchmark::DoNotOptimize(p.inlet().hgl_m);
  }
  state.counters["points"] = static_cast<double>(points);
}
}  // namespace

static void BM_profile_mild_free_outlet_M2(benchmark::State& s) { profile(s, pipe_100m(0.001, 0.5), 9.0); }
static void BM_profile_mild_backwater_M1(benchmark::State& s) { profile(s, pipe_100m(0.001, 0.5), 10.9); }
static void BM_profile_mild_drawdown_M2(benchmark::State& s) { profile(s, pipe_100m(0.001, 0.5), 10.45); }
static void BM_profile_partly_surcharged(benchmark::State& s) { profile(s, pipe_100m(0.001, 0.5), 11.04); }
static void BM_profile_steep_S2(benchmark::State& s) { profile(s, pipe_100m(0.02, 0.8), 9.0); }
static void BM_profile_steep_jump(benchmark::State& s) { profile(s, pipe_100m(0.02, 0.8), 10.9); }
static void BM_profile_darcy_M2(benchmark::State& s) {
  ConduitReach r = pipe_100m(0.001, 0.5);
  r.roughness.law = FrictionLaw::darcy_weisbach;
  profile(s, r, 9.0);
}

static void BM_normal_depth(benchmark::State& state) {
  const Section s{Shape::circular, 1.0, 0.0, 0.0, {}};
  for (auto _ : state) benchmark::DoNotOptimize(normal_depth(Roughness{}, s, 0.5, 0.001).depth_m);
}
static void BM_normal_depth_darcy(benchmark::State& state) {
  const Section s{Shape::circular, 1.0, 0.0, 0.0, {}};
  Roughness r;
  r.law = FrictionLaw::darcy_weisbach;
  for (auto _ : state) benchmark::DoNotOptimize(normal_depth(r, s, 0.5, 0.001).depth_m);
}
static void BM_critical_depth(benchmark::State& state) {
  const Section s{Shape::circular, 1.0, 0.0, 0.0, {}};
  for (auto _ : state) benchmark::DoNotOptimize(critical_depth(s, 0.5).depth_m);
}

BENCHMARK(BM_profile_mild_free_outlet_M2);
BENCHMARK(BM_profile_mild_backwater_M1);
BENCHMARK(BM_profile_mild_drawdown_M2);
BENCHMARK(BM_profile_partly_surcharged);
BENCHMARK(BM_profile_steep_S2);
BENCHMARK(BM_profile_steep_jump);
BENCHMARK(BM_profile_darcy_M2);
BENCHMARK(BM_normal_depth);
BENCHMARK(BM_normal_depth_darcy);
BENCHMARK(BM_critical_depth);
