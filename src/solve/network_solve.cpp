// The network solve driver: each component's pipes and levels, its pieces in order from the
// outlets, Newton on the pieces that need it; components on several threads (each writes only
// its own structures and pipes, so the results do not depend on the threads).
#include "rimline/solve/network_solve.hpp"

#include <algorithm>
#include <cmath>
#include <exception>
#include <limits>
#include <optional>
#include <thread>

#include "rimline/error.hpp"
#include "rimline/hydraulics/friction.hpp"
#include "rimline/hydraulics/losses.hpp"
#include "rimline/solve/structure_level.hpp"
#include "solve/network_newton.hpp"
#include "solve/network_pieces.hpp"
#include "solve/network_pipe.hpp"

namespace rimline::solve {
namespace {

using detail::none32;
constexpr double nan = std::numeric_limits<double>::quiet_NaN();

// A stand-in for a missing invert at one end, as the march would take it: the structure's own
// invert, else the lowest invert another pipe has there, else the pipe's other end (level pipe).
std::optional<double> end_invert(const model::Network& net, const topology::Topology& topo, std::size_t ci,
                                 bool from_end) {
  const auto& c = net.conduits[ci];
  const auto& own = from_end ? c.invert_up_m : c.invert_down_m;
  if (own) return own;
  const std::size_t s = from_end ? c.from : c.to;
  if (net.structures[s].invert_m) return net.structures[s].invert_m;
  std::optional<double> best;
  if (s < topo.nodes.size()) {
    auto consider = [&](const std::vector<std::size_t>& list) {
      for (std::size_t k : list) {
        if (k == ci) continue;
        const auto& o = net.conduits[k];
        const auto& v = o.from == s ? o.invert_up_m : o.invert_down_m;
        if (v && (!best || *v < *best)) best = v;
      }
    };
    consider(topo.nodes[s].inflows);
    consider(topo.nodes[s].outflows);
  }
  if (best) return best;
  return from_end ? c.invert_down_m : c.invert_up_m;
}

// The pipe's law, or nothing when its data cannot give a profile (the march reports why).
std::optional<detail::PipeLaw> pipe_law(const model::Network& net, const topology::Topology& topo, std::size_t ci,
                                        const MarchOptions& march) {
  const auto& c = net.conduits[ci];
  const auto up = end_invert(net, topo, ci, true), down = end_invert(net, topo, ci, false);
  if (!up || !down || !std::isfinite(*up) || !std::isfinite(*down)) return std::nullopt;
  if (!(c.length_m > 0.0) || !std::isfinite(c.length_m)) return std::nullopt;
  detail::PipeLaw law;
  law.conduit = ci;
  law.a = c.from;
  law.b = c.to;
  law.invert_a_m = *up;
  law.invert_b_m = *down;
  try {
    hydraulics::validate(c.section);
    hydraulics::validate(c.roughness);
    const double area = hydraulics::full_geometry(c.section).area_m2;
    const double k = std::max(structure_k(net.structures[c.from], march), structure_k(net.structures[c.to], march));
    law.resistance_s2_m5 = hydraulics::full_friction_slope(c.roughness, c.section, 1.0) * c.length_m +
                           (1.0 + k) / (2.0 * units::gravity_m_s2 * area * area);
  } catch (const Error&) {
    return std::nullopt;
  }
  if (!(law.resistance_s2_m5 > 0.0) || !std::isfinite(law.resistance_s2_m5)) return std::nullopt;
  return law;
}

class ComponentSolver {
 public:
  ComponentSolver(const model::Network& net, const topology::Topology& topo, const NetworkInputs& in,
                  const MarchOptions& march, const NetworkSolveOptions& opt, detail::StructureRelation& relation,
                  std::vector<std::uint32_t>& local_of)
      : net_(net), topo_(topo), in_(in), march_(march), opt_(opt), relation_(relation), local_of_(local_of) {}

  void run(const NetworkComponent& comp, NetworkSolution& out, ComponentReport& rep) {
    rep.structures = comp.structures.size();
    rep.conduits = comp.conduits.size();
    for (std::size_t i = 0; i < comp.structures.size(); ++i)
      local_of_[comp.structures[i]] = static_cast<std::uint32_t>(i);
    try {
      solve(comp, out, rep);
    } catch (const Error&) {
      // A profile the data cannot give after all: the component is reported as not solved.
      rep.converged = false;
      for (std::size_t ci : comp.conduits) out.flow_m3_s[ci] = nan;
      rep.failed_structures = comp.structures;
      rep.failed_error_m3_s.assign(comp.structures.size(), nan);
    }
    for (std::size_t s : comp.structures) local_of_[s] = none32;
  }

 private:
  void solve(const NetworkComponent& comp, NetworkSolution& out, ComponentReport& rep) {
    exit_evaluations_ = 0;
    detail::LocalGraph g;
    std::vector<detail::PipeLaw> laws;
    std::vector<std::size_t> conduit_of;
    const std::size_t n = comp.structures.size();
    g.net_inflow_m3_s.assign(n, 0.0);
    g.outlet.assign(n, 0);
    for (std::size_t i = 0; i < n; ++i) {
      const std::size_t s = comp.structures[i];
      const double q = s < in_.net_inflow_m3_s.size() ? in_.net_inflow_m3_s[s] : 0.0;
      g.net_inflow_m3_s[i] = std::isfinite(q) ? q : 0.0;
      g.outlet[i] = s < in_.outlet.size() && in_.outlet[s];
    }
    for (std::size_t ci : comp.conduits) {
      const auto law = pipe_law(net_, topo_, ci, march_);
      if (!law) continue;  // left out: its flow stays unknown and the march says why
      g.end_a.push_back(local_of_[law->a]);
      g.end_b.push_back(local_of_[law->b]);
      laws.push_back(*law);
      conduit_of.push_back(ci);
    }
    g.build_adjacency();
    const detail::Decomposition d = detail::decompose(g, opt_.reduce_bridges);
    relation_.set_inflows(comp.structures, comp.conduits, in_.flow_m3_s, topo_.deflection_deg);

    std::vector<double> level(n, nan), flow(laws.size(), 0.0);
    std::vector<char> fixed(n, 0);
    for (std::size_t i = 0; i < n; ++i) {
      if (!g.outlet[i]) continue;
      const std::size_t s = comp.structures[i];
      level[i] = outlet_level_m(net_.structures[s], s, s < in_.wet_well.size() && in_.wet_well[s], march_);
      fixed[i] = 1;
    }
    for (std::size_t p = 0; p < laws.size(); ++p) {
      const std::size_t ci = conduit_of[p];
      const double w = ci < in_.flow_m3_s.size() ? in_.flow_m3_s[ci] : nan;
      if (std::isfinite(w)) flow[p] = w;
    }
    std::vector<std::int32_t> index(n, -1), position(n, -1);
    const detail::PieceContext ctx{net_, g, d, laws, relation_, march_.gvf, opt_, {}, index, position};
    std::vector<char> solved_piece(d.pieces.size(), 0);
    for (std::size_t k = 0; k < d.pieces.size(); ++k) {
      const detail::Piece& pc = d.pieces[k];
      if (pc.no_outlet) {
        rep.no_outlet = true;
        rep.converged = false;
        continue;
      }
      if (!pc.needed && !opt_.all_levels) continue;
      if (pc.exit_pipe != none32) {
        level[pc.exit_node] = exit_level(g, d, laws, pc, level);
        fixed[pc.exit_node] = 1;
      }
      if (pc.pipes.empty()) continue;
      for (std::uint32_t u : pc.nodes) {
        if (fixed[u]) continue;
        const std::size_t s = comp.structures[u];
        level[u] = s < in_.level_m.size() ? in_.level_m[s] : nan;
      }
      const detail::PieceResult r = detail::solve_piece(ctx, pc, fixed, level, flow);
      solved_piece[k] = 1;
      rep.unknowns += r.unknowns;
      rep.newton_pieces += r.unknowns > 0 ? 1 : 0;
      rep.iterations = std::max(rep.iterations, r.iterations);
      rep.evaluations += r.evaluations;
      rep.max_continuity_error_m3_s = std::max(rep.max_continuity_error_m3_s, r.max_residual_m3_s);
      rep.max_level_change_m = std::max(rep.max_level_change_m, r.last_step_m);
      rep.converged = rep.converged && r.converged;
      for (std::size_t f = 0; f < r.failed.size(); ++f) {
        rep.failed_structures.push_back(comp.structures[r.failed[f]]);
        rep.failed_error_m3_s.push_back(r.failed_error[f]);
      }
    }
    rep.evaluations += exit_evaluations_;
    sort_failures(rep);
    for (std::size_t p = 0; p < laws.size(); ++p) {
      const std::size_t ci = conduit_of[p];
      const double known = d.known_flow[p];
      if (std::isfinite(known)) out.flow_m3_s[ci] = known;
      else if (solved_piece[d.piece_of[g.end_a[p]]]) out.flow_m3_s[ci] = flow[p];
    }
    for (std::size_t i = 0; i < n; ++i) out.level_m[comp.structures[i]] = level[i];
  }

  // The level of a hanging piece's exit structure from the known flow of the pipe that leaves it
  // towards the outlets: the march's relation (still water without flow).
  double exit_level(const detail::LocalGraph& g, const detail::Decomposition& d,
                    const std::vector<detail::PipeLaw>& laws, const detail::Piece& pc, const std::vector<double>& level) {
    const std::uint32_t p = pc.exit_pipe, x = pc.exit_node, y = g.other(p, x);
    const bool x_is_a = g.end_a[p] == x;
    const double q_out = x_is_a ? d.known_flow[p] : -d.known_flow[p];  // from x towards y
    ++exit_evaluations_;
    if (q_out > 0.0)
      return detail::required_level(net_, laws[p], x_is_a, q_out, level[y], relation_, march_.gvf).level_m;
    if (q_out == 0.0) return detail::threshold_level(laws[p], x_is_a, level[y]);
    return detail::downstream_level(net_, laws[p], !x_is_a, -q_out, level[y], relation_, march_.gvf);
  }

  static void sort_failures(ComponentReport& rep) {
    std::vector<std::size_t> order(rep.failed_structures.size());
    for (std::size_t k = 0; k < order.size(); ++k) order[k] = k;
    std::stable_sort(order.begin(), order.end(), [&rep](std::size_t a, std::size_t b) {
      return std::fabs(rep.failed_error_m3_s[a]) > std::fabs(rep.failed_error_m3_s[b]);
    });
    std::vector<std::size_t> s;
    std::vector<double> e;
    for (std::size_t k : order) s.push_back(rep.failed_structures[k]), e.push_back(rep.failed_error_m3_s[k]);
    rep.failed_structures.swap(s);
    rep.failed_error_m3_s.swap(e);
  }

  const model::Network& net_;
  const topology::Topology& topo_;
  const NetworkInputs& in_;
  const MarchOptions& march_;
  const NetworkSolveOptions& opt_;
  detail::StructureRelation& relation_;
  std::vector<std::uint32_t>& local_of_;
  int exit_evaluations_ = 0;
};

// Components per worker: largest first to the least loaded, so the split depends on the network only.
std::vector<std::vector<std::size_t>> share_out(const std::vector<NetworkComponent>& components, unsigned workers) {
  std::vector<std::size_t> order(components.size());
  for (std::size_t k = 0; k < order.size(); ++k) order[k] = k;
  std::stable_sort(order.begin(), order.end(), [&components](std::size_t a, std::size_t b) {
    return components[a].conduits.size() > components[b].conduits.size();
  });
  std::vector<std::vector<std::size_t>> work(workers);
  std::vector<std::size_t> load(workers, 0);
  for (std::size_t k : order) {
    const auto w = static_cast<std::size_t>(std::min_element(load.begin(), load.end()) - load.begin());
    work[w].push_back(k);
    load[w] += components[k].conduits.size() + 1;
  }
  return work;
}

}  // namespace

NetworkSolution solve_network(const model::Network& network, const topology::Topology& topology,
                              const std::vector<NetworkComponent>& components, const NetworkInputs& inputs,
                              const MarchOptions& march, const NetworkSolveOptions& options) {
  NetworkSolution out;
  out.flow_m3_s.assign(network.conduits.size(), nan);
  out.level_m.assign(network.structures.size(), nan);
  out.components.resize(components.size());
  std::size_t pipes = 0;
  for (const auto& c : components) pipes += c.conduits.size();
  MarchOptions threads_asked = march;
  threads_asked.threads = options.threads;
  const unsigned workers =
      std::max(1u, std::min<unsigned>(march_threads(threads_asked, pipes), static_cast<unsigned>(components.size())));
  detail::StructureRelation relation(network, march, inputs.outlet);
  const auto work = share_out(components, workers);
  std::vector<std::exception_ptr> failed(workers);
  auto run = [&](unsigned w) {
    try {
      std::vector<std::uint32_t> local_of(network.structures.size(), none32);
      ComponentSolver solver(network, topology, inputs, march, options, relation, local_of);
      for (std::size_t k : work[w]) solver.run(components[k], out, out.components[k]);
    } catch (...) {
      failed[w] = std::current_exception();
    }
  };
  std::vector<std::thread> threads;
  for (unsigned w = 1; w < workers; ++w) threads.emplace_back(run, w);
  run(0);
  for (auto& t : threads) t.join();
  for (const auto& e : failed)
    if (e) std::rethrow_exception(e);
  return out;
}

}  // namespace rimline::solve
