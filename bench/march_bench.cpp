// Throughput of the solve stage, for issue 8 (scale):
// - partly full pipe solves per second (target >= 1e6 per core): normal depth, and the whole
//   water-surface profile of one pipe, each over a spread of 1024 sizes, slopes and flows so that
//   no single easy case flatters the figure;
// - the march over an in-memory dendritic network of N pipes (pipes per second), so that a change
//   in src/solve is measured without GDAL in the way.
// The networks and cases are invented for timing; no value here is checked.
#include <benchmark/benchmark.h>

#include <cmath>
#include <string>
#include <vector>

#include "rimline/flows/design_flows.hpp"
#include "rimline/hydraulics/depth.hpp"
#include "rimline/hydraulics/gvf.hpp"
#include "rimline/solve/march.hpp"
#include "rimline/topology/build.hpp"

using namespace rimline;

namespace {

struct PipeCase {
  hydraulics::ConduitReach reach;
  double downstream_level_m;
};

// 1024 partly full cases: diameters 225-2400 mm, slopes 0.1-2 %, flows 10-70 % of full capacity
// (Manning), downstream levels from a free outlet to half the rise above the outlet invert.
std::vector<PipeCase> partly_full_cases() {
  std::vector<PipeCase> cases;
  const double sizes[] = {0.225, 0.3, 0.375, 0.45, 0.6, 0.75, 0.9, 1.05, 1.2, 1.5, 1.8, 2.4};
  for (int i = 0; i < 1024; ++i) {
    const double d = sizes[i % 12];
    const double slope = 0.001 + 0.019 * ((i * 37) % 101) / 100.0;
    const double area = M_PI * d * d / 4.0;
    const double q_full = area * std::pow(d / 4.0, 2.0 / 3.0) * std::sqrt(slope) / 0.013;
    const double q = q_full * (0.1 + 0.6 * ((i * 53) % 97) / 96.0);
    PipeCase c;
    c.reach.section = {hydraulics::Shape::circular, d, 0.0, 0.0, {}};
    c.reach.length_m = 30.0 + 90.0 * ((i * 29) % 89) / 88.0;
    c.reach.invert_down_m = 10.0;
    c.reach.invert_up_m = 10.0 + slope * c.reach.length_m;
    c.reach.flow_m3_s = q;
    c.downstream_level_m = (i % 3 == 0) ? 9.0 : 10.0 + 0.5 * d * ((i * 17) % 11) / 10.0;
    cases.push_back(c);
  }
  return cases;
}

void BM_partly_full_normal_depth(benchmark::State& state) {
  const auto cases = partly_full_cases();
  std::size_t i = 0;
  for (auto _ : state) {
    const auto& c = cases[i++ & 1023];
    const double slope = (c.reach.invert_up_m - c.reach.invert_down_m) / c.reach.length_m;
    benchmark::DoNotOptimize(
        hydraulics::normal_depth(c.reach.roughness, c.reach.section, c.reach.flow_m3_s, slope).depth_m);
  }
  state.SetItemsProcessed(static_cast<std::int64_t>(state.iterations()));
}
BENCHMARK(BM_partly_full_normal_depth);

void BM_partly_full_profile(benchmark::State& state) {
  const auto cases = partly_full_cases();
  std::size_t i = 0;
  for (auto _ : state) {
    const auto& c = cases[i++ & 1023];
    benchmark::DoNotOptimize(hydraulics::compute_profile(c.reach, c.downstream_level_m).inlet().hgl_m);
  }
  state.SetItemsProcessed(static_cast<std::int64_t>(state.iterations()));
}
BENCHMARK(BM_partly_full_profile);

// A dendritic network of n pipes joined by ids: structure k (k >= 1) drains through pipe k-1 to
// structure (k - 1) / 2, so every manhole takes two inflows and the depth is log2(n). Sizes shrink
// upstream, inverts rise upstream at 0.5 % over 75 m pipes with a 20 mm drop at each manhole.
struct Built {
  model::Network net;
  topology::Topology topo;
  std::vector<double> flow;
};

Built dendritic(std::size_t n) {
  Built b;
  auto& net = b.net;
  const auto level = [](std::size_t k) { return static_cast<int>(std::log2(static_cast<double>(k + 1))); };
  for (std::size_t k = 0; k <= n; ++k) {
    model::Structure s;
    s.id = "S" + std::to_string(k);
    s.kind = k == 0 ? model::StructureKind::outfall : model::StructureKind::manhole;
    s.location = {80.0 * static_cast<double>(k % 1024), 80.0 * static_cast<double>(k / 1024)};
    s.invert_m = 10.0 + 0.395 * level(k);
    s.rim_m = *s.invert_m + 3.5;
    s.inflow_m3_s = k == 0 ? 0.0 : 0.003;
    net.structures.push_back(s);
  }
  for (std::size_t k = 1; k <= n; ++k) {
    const std::size_t down = (k - 1) / 2;
    model::Conduit c;
    c.id = "P" + std::to_string(k);
    c.from_id = net.structures[k].id;
    c.to_id = net.structures[down].id;
    c.section = {hydraulics::Shape::circular, std::max(0.225, 2.4 * std::pow(0.8, level(k))), 0.0, 0.0, {}};
    c.length_m = c.geometry_length_m = 75.0;
    c.invert_up_m = *net.structures[k].invert_m;
    c.invert_down_m = *c.invert_up_m - 0.375;
    c.vertices = {net.structures[k].location, net.structures[down].location};
    c.up_point = c.vertices.front();
    c.down_point = c.vertices.back();
    net.conduits.push_back(c);
  }
  Findings findings;
  b.topo = topology::build_topology(net, topology::TopologyOptions{}, findings);
  flows::FlowOptions fo;
  fo.mode = flows::Mode::structure_inflows;
  b.flow = flows::design_flows(net, b.topo, fo, findings).flow_m3_s;
  return b;
}

void BM_march_dendritic(benchmark::State& state) {
  const Built b = dendritic(static_cast<std::size_t>(state.range(0)));
  solve::MarchOptions opt;
  opt.k_by_type = {{"manhole", 0.5}, {"outfall", 0.0}};
  std::size_t solved = 0;
  for (auto _ : state) {
    const auto r = solve::march(b.net, b.topo, b.flow, opt);
    solved = 0;
    for (const auto& c : r.conduits) solved += c.solved ? 1 : 0;
    benchmark::DoNotOptimize(solved);
  }
  state.counters["solved"] = static_cast<double>(solved);
  state.SetItemsProcessed(static_cast<std::int64_t>(state.iterations()) * state.range(0));
}
BENCHMARK(BM_march_dendritic)->Arg(10000)->Arg(100000)->Unit(benchmark::kMillisecond);

}  // namespace
