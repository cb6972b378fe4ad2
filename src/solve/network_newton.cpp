// Newton's method with an Armijo line search on the continuity residuals of one piece.
// Residual at a structure: net inflow + flows arriving - flows leaving [m3/s]. Jacobian: each pipe
// adds its two derivatives to the rows of its two ends (an M-matrix up to sign when every pipe's
// downstream sensitivity is at most its upstream one, which holds for the pipe laws here).
#include "solve/network_newton.hpp"

#include "hydraulics/solve_1d.hpp"

#include <Eigen/Dense>
#include <Eigen/SparseLU>
#include <algorithm>
#include <cmath>
#include <cstdint>
#include <functional>
#include <limits>
#include <queue>

namespace rimline::solve::detail {
namespace {

// Dense LU below this many unknowns (a loop of a few structures), sparse LU above.
constexpr std::size_t dense_limit = 64;
// Every diagonal keeps at least this much, so a structure whose pipes all carry nothing (and
// whose residual is zero) leaves the matrix regular [m2/s].
constexpr double diagonal_floor = 1.0e-9;
// A structure whose pipes all stand dry is lifted this far past the lowest level at which one of
// them starts to flow [m].
constexpr double dry_margin_m = 1.0e-3;
// Newton steps allowed without cutting the largest continuity error by a tenth, and profiles
// computed per pipe of the piece before the solve gives up (a converging solve needs ~40).
constexpr int patience = 8;
constexpr double evaluation_budget = 300.0;
// Below this line-search factor a Newton step is followed by sweeps of the node-by-node solve.
constexpr double gauss_seidel_below = 0.125;
constexpr int gauss_seidel_sweeps = 2;
// A Newton step this small moves levels by less than the pipe profiles resolve [m].
constexpr double resolution_m = 1.0e-6;

class PieceSolver {
 public:
  PieceSolver(const PieceContext& ctx, const Piece& piece, const std::vector<char>& fixed, std::vector<double>& level,
              std::vector<double>& flow)
      : c_(ctx), g_(ctx.graph), piece_(piece), fixed_(fixed), level_(level), flow_(flow) {
    for (std::uint32_t u : piece_.nodes)
      if (!fixed_[u]) unknown_.push_back(u);
    pipe_slot_.assign(g_.pipes(), -1);
    for (std::size_t k = 0; k < piece_.pipes.size(); ++k) pipe_slot_[piece_.pipes[k]] = static_cast<std::int32_t>(k);
  }

  PieceResult run() {
    PieceResult res;
    res.unknowns = unknown_.size();
    for (std::size_t i = 0; i < unknown_.size(); ++i) c_.index[unknown_[i]] = static_cast<std::int32_t>(i);
    first_guess();
    std::vector<PipeFlow> pf(piece_.pipes.size());
    std::vector<double> r(unknown_.size());
    evaluate(level_, true, pf, r, res);
    double step = 0.0;
    int stalls = 0, since_best = 0;
    double best_residual = std::numeric_limits<double>::infinity();
    for (res.iterations = 0;; ++res.iterations) {
      res.max_residual_m3_s = max_abs(r);
      res.last_step_m = step;
      // Chords while far from the solution, tangents (Newton proper) once the error has fallen a
      // hundredfold or is within ten times the tolerance.
      if (res.iterations == 0) first_residual_ = res.max_residual_m3_s;
      if (res.max_residual_m3_s <= 0.01 * first_residual_ ||
          res.max_residual_m3_s <= 10.0 * c_.options.continuity_tolerance_m3_s)
        far_ = false;
      if (res.max_residual_m3_s <= c_.options.continuity_tolerance_m3_s && step <= c_.options.level_tolerance_m) break;
      // Steps below what the water-surface profiles resolve, with continuity closed to the looser
      // tolerance: as far as the pipe physics can go (a large pipe passes litres per second on a
      // micrometre of head).
      if (res.iterations > 0 && step <= resolution_m && res.max_residual_m3_s <= c_.options.stagnation_tolerance_m3_s) break;
      // No real progress for a while: more steps would only cost time; the caller falls back.
      if (res.max_residual_m3_s < 0.9 * best_residual) best_residual = res.max_residual_m3_s, since_best = 0;
      else ++since_best;
      const bool over_budget = static_cast<double>(res.evaluations) > evaluation_budget * static_cast<double>(piece_.pipes.size());
      if (res.iterations >= c_.options.max_iterations || stalls >= 3 || since_best > patience || over_budget ||
          unknown_.empty()) {
        res.converged = res.max_residual_m3_s <= c_.options.continuity_tolerance_m3_s;
        break;
      }
      std::vector<double> delta = newton_step(pf, r);
      const double largest = max_abs(delta);
      if (!std::isfinite(largest)) {
        res.converged = false;
        break;
      }
      // Each level's change is limited on its own: a structure whose pipes all stand dry can ask
      // for a huge step, which scaling the whole step would pass on to every other structure.
      for (double& d : delta) d = std::clamp(d, -c_.options.max_step_m, c_.options.max_step_m);
      const double lambda = line_search(delta, r, res, stalls);
      step = lambda * std::min(largest, c_.options.max_step_m);
      if (lambda < gauss_seidel_below) {
        // Newton's direction barely helps here (a weir starting to flow, a free outlet drowning):
        // sweeps of the node-by-node solve, which always makes progress, then Newton again.
        for (int k = 0; k < gauss_seidel_sweeps; ++k) step = std::max(step, gauss_seidel_sweep(res));
        res.sweeps += gauss_seidel_sweeps;
        stalls = 0;
      }
      evaluate(level_, true, pf, r, res);
    }
    for (std::size_t k = 0; k < piece_.pipes.size(); ++k) flow_[piece_.pipes[k]] = pf[k].q;
    if (!res.converged)
      for (std::size_t i = 0; i < unknown_.size(); ++i)
        if (std::fabs(r[i]) > c_.options.continuity_tolerance_m3_s) {
          res.failed.push_back(unknown_[i]);
          res.failed_error.push_back(r[i]);
        }
    for (std::uint32_t u : unknown_) c_.index[u] = -1;
    return res;
  }

 private:
  std::int32_t index_of(std::uint32_t node) const { return c_.index[node]; }

  static double max_abs(const std::vector<double>& v) {
    double m = 0.0;
    for (double x : v) m = std::max(m, std::fabs(x));
    return m;
  }

  bool own(std::uint32_t pipe) const {
    return std::isnan(c_.decomposition.known_flow[pipe]) &&
           c_.decomposition.piece_of[g_.end_a[pipe]] == c_.decomposition.piece_of[piece_.nodes.front()];
  }

  // Structures without a level yet (none from a previous solution): each takes the lowest level
  // at which its own inflow could leave through one pipe to a structure already placed (Dijkstra
  // on levels: water goes where the level is lowest, so it runs down the inverts, not over a high
  // overflow). Then all the water is routed down the tree that search made and the levels are
  // marched up it. Continuity holds on the tree; where the real flow splits the levels lie above
  // the solution: a safe side to start Newton from.
  void first_guess() {
    std::vector<std::uint32_t> order, reached_by;
    using Entry = std::pair<double, std::pair<std::uint32_t, std::uint32_t>>;  // level, (node, via)
    std::priority_queue<Entry, std::vector<Entry>, std::greater<Entry>> queue;
    std::size_t seeds = 0;
    for (std::uint32_t u : piece_.nodes)
      if (fixed_[u] || std::isfinite(level_[u])) queue.push({level_[u], {u, none32}}), ++seeds;
    if (seeds == piece_.nodes.size()) return;
    while (!queue.empty()) {
      const auto [h, entry] = queue.top();
      queue.pop();
      const auto [u, via] = entry;
      if (c_.position[u] >= 0) continue;
      c_.position[u] = static_cast<std::int32_t>(order.size());
      order.push_back(u);
      reached_by.push_back(via);
      level_[u] = h;
      for (std::uint32_t k = g_.adj_start[u]; k < g_.adj_start[u + 1]; ++k) {
        const std::uint32_t p = g_.adj[k];
        if (!own(p)) continue;
        const std::uint32_t v = g_.other(p, u);
        if (c_.position[v] >= 0) continue;
        const double q = std::max(c_.decomposition.inflow[v], 0.0);
        const bool forward = g_.end_a[p] == v;  // water from v to u
        const double candidate =
            q > 0.0 ? required_level(c_.network, c_.laws[p], forward, q, h, c_.relation, c_.gvf).level_m
                    : threshold_level(c_.laws[p], forward, h);
        queue.push({candidate, {v, p}});
      }
    }
    std::vector<double> carried(order.size(), 0.0);
    for (std::size_t k = 0; k < order.size(); ++k)
      if (reached_by[k] != none32) carried[k] = c_.decomposition.inflow[order[k]];
    for (std::size_t k = order.size(); k-- > 0;) {
      if (reached_by[k] == none32) continue;
      const std::uint32_t p = reached_by[k];
      const auto parent = static_cast<std::size_t>(c_.position[g_.other(p, order[k])]);
      if (reached_by[parent] != none32) carried[parent] += carried[k];
      flow_[p] = g_.end_a[p] == order[k] ? carried[k] : -carried[k];
    }
    for (std::size_t k = 0; k < order.size(); ++k) {
      if (reached_by[k] == none32) continue;
      const std::uint32_t p = reached_by[k], u = order[k];
      const double h_parent = level_[g_.other(p, u)];
      const bool forward = g_.end_a[p] == u;
      // Without flow to carry, still water: the level stands at the pipe's higher invert or the
      // level beyond, not at a free outlet's notional level far below.
      level_[u] = carried[k] > 0.0
                      ? required_level(c_.network, c_.laws[p], forward, carried[k], h_parent, c_.relation, c_.gvf).level_m
                      : threshold_level(c_.laws[p], forward, h_parent);
    }
    for (std::uint32_t u : order) c_.position[u] = -1;
  }

  void evaluate(const std::vector<double>& h, bool derivatives, std::vector<PipeFlow>& pf, std::vector<double>& r,
                PieceResult& res) {
    for (std::size_t i = 0; i < unknown_.size(); ++i) r[i] = c_.decomposition.inflow[unknown_[i]];
    for (std::size_t k = 0; k < piece_.pipes.size(); ++k) {
      const std::uint32_t p = piece_.pipes[k];
      const std::uint32_t a = g_.end_a[p], b = g_.end_b[p];
      pf[k] = pipe_flow(c_.network, c_.laws[p], h[a], h[b], flow_[p], c_.relation, c_.gvf, c_.pipe_settings,
                        derivatives);
      flow_[p] = pf[k].q;
      res.evaluations += pf[k].evaluations;
      if (const auto ia = index_of(a); ia >= 0) r[static_cast<std::size_t>(ia)] -= pf[k].q;
      if (const auto ib = index_of(b); ib >= 0) r[static_cast<std::size_t>(ib)] += pf[k].q;
    }
  }

  std::vector<double> newton_step(const std::vector<PipeFlow>& pf, const std::vector<double>& r) {
    const std::size_t n = unknown_.size();
    // Structures whose levels no pipe leading towards a fixed level responds to (their outflows
    // stand dry, their inflows fall freely into them; one structure or a group joined by flowing
    // pipes) have a flat total residual until one of them reaches a level at which a pipe does:
    // the threshold of a dry pipe, or the level that drowns a free outlet. Their rows are replaced
    // by a common lift just past the lowest such level when water collects there (none otherwise),
    // so that they do not ask for a huge step that would hold back every other level.
    // Anchored: a fixed level, or a pipe to an anchored structure whose flow responds to this level.
    std::vector<char> anchored(n, 0);
    std::vector<std::uint32_t> queue;
    auto responds = [&pf](std::size_t k, bool to_a) {
      if (pf[k].dead) return false;
      const double d = std::fabs(to_a ? pf[k].dq_da : pf[k].dq_db);
      return d > 1.0e-3 * std::max(std::fabs(pf[k].dq_da), std::fabs(pf[k].dq_db)) && d > 0.0;
    };
    for (std::uint32_t u : piece_.nodes)
      if (index_of(u) < 0) queue.push_back(u);
    for (std::size_t h = 0; h < queue.size(); ++h) {
      const std::uint32_t v = queue[h];
      for (std::uint32_t k = g_.adj_start[v]; k < g_.adj_start[v + 1]; ++k) {
        const std::uint32_t p = g_.adj[k];
        const std::int32_t slot = pipe_slot_[p];
        if (slot < 0) continue;
        const std::uint32_t u = g_.other(p, v);
        const int i = index_of(u);
        if (i < 0 || anchored[static_cast<std::size_t>(i)]) continue;
        if (!responds(static_cast<std::size_t>(slot), g_.end_a[p] == u)) continue;
        anchored[static_cast<std::size_t>(i)] = 1;
        queue.push_back(u);
      }
    }
    // The unanchored in groups joined by flowing pipes, each with its total residual and lift.
    std::vector<std::size_t> group(n);
    for (std::size_t i = 0; i < n; ++i) group[i] = i;
    auto root = [&group](std::size_t i) {
      while (group[i] != i) i = group[i] = group[group[i]];
      return i;
    };
    for (std::size_t k = 0; k < piece_.pipes.size(); ++k) {
      if (pf[k].dead) continue;
      const std::uint32_t p = piece_.pipes[k];
      const int ia = index_of(g_.end_a[p]), ib = index_of(g_.end_b[p]);
      if (ia < 0 || ib < 0 || anchored[static_cast<std::size_t>(ia)] || anchored[static_cast<std::size_t>(ib)]) continue;
      const std::size_t a = root(static_cast<std::size_t>(ia)), b = root(static_cast<std::size_t>(ib));
      if (a != b) group[std::max(a, b)] = std::min(a, b);
    }
    std::vector<double> total(n, 0.0), lift(n, std::numeric_limits<double>::infinity());
    for (std::size_t i = 0; i < n; ++i)
      if (!anchored[i]) total[root(i)] += r[i];
    for (std::size_t k = 0; k < piece_.pipes.size(); ++k) {
      const std::uint32_t p = piece_.pipes[k];
      for (const std::uint32_t u : {g_.end_a[p], g_.end_b[p]}) {
        const int i = index_of(u);
        if (i < 0 || anchored[static_cast<std::size_t>(i)]) continue;
        const std::uint32_t o = g_.other(p, u);
        const int io = index_of(o);
        const std::size_t gi = root(static_cast<std::size_t>(i));
        if (io >= 0 && !anchored[static_cast<std::size_t>(io)] && root(static_cast<std::size_t>(io)) == gi) continue;
        const bool is_a = g_.end_a[p] == u;
        double target = std::numeric_limits<double>::infinity();
        if (pf[k].dead) target = threshold_level(c_.laws[p], is_a, level_[o]);
        else if (std::isfinite(pf[k].free_outlet_until_m) && (pf[k].q > 0.0) != is_a) target = pf[k].free_outlet_until_m;
        if (target > level_[u]) lift[gi] = std::min(lift[gi], target - level_[u]);
      }
    }
    const std::vector<char>& live = anchored;
    std::vector<Eigen::Triplet<double>> t;
    t.reserve(4 * piece_.pipes.size() + n);
    auto add = [&](int row, int col, double v) { t.emplace_back(row, col, live[static_cast<std::size_t>(row)] ? v : 0.0); };
    auto da = [&](std::size_t k) { return far_ ? pf[k].chord_da : pf[k].dq_da; };
    auto db = [&](std::size_t k) { return far_ ? pf[k].chord_db : pf[k].dq_db; };
    for (std::size_t i = 0; i < n; ++i)
      t.emplace_back(static_cast<int>(i), static_cast<int>(i), live[i] ? -diagonal_floor : 1.0);
    for (std::size_t k = 0; k < piece_.pipes.size(); ++k) {
      const std::uint32_t p = piece_.pipes[k];
      const int ia = index_of(g_.end_a[p]), ib = index_of(g_.end_b[p]);
      if (ia >= 0) {
        add(ia, ia, -da(k));
        if (ib >= 0) add(ia, ib, -db(k));
      }
      if (ib >= 0) {
        add(ib, ib, db(k));
        if (ia >= 0) add(ib, ia, da(k));
      }
    }
    Eigen::VectorXd rhs(static_cast<Eigen::Index>(n));
    for (std::size_t i = 0; i < n; ++i) {
      double v = -r[i];
      if (!live[i]) {
        const std::size_t gi = root(i);
        v = total[gi] > c_.options.continuity_tolerance_m3_s && std::isfinite(lift[gi]) ? lift[gi] + dry_margin_m : 0.0;
      }
      rhs[static_cast<Eigen::Index>(i)] = v;
    }
    Eigen::VectorXd x;
    const auto en = static_cast<Eigen::Index>(n);
    if (n <= dense_limit) {
      Eigen::MatrixXd j = Eigen::MatrixXd::Zero(en, en);
      for (const auto& e : t) j(e.row(), e.col()) += e.value();
      x = j.partialPivLu().solve(rhs);
    } else {
      Eigen::SparseMatrix<double> j(en, en);
      j.setFromTriplets(t.begin(), t.end());
      if (!analysed_) {
        lu_.analyzePattern(j);
        analysed_ = true;
      }
      lu_.factorize(j);
      if (lu_.info() != Eigen::Success) return std::vector<double>(n, std::nan(""));
      x = lu_.solve(rhs);
    }
    std::vector<double> delta(n);
    for (std::size_t i = 0; i < n; ++i) delta[i] = x[static_cast<Eigen::Index>(i)];
    return delta;
  }

  // Nonlinear Gauss-Seidel: each level in turn set so that its own structure's continuity closes
  // with the other levels held. The residual of a piece is an M-function (a pipe's flow rises with
  // its upstream level and falls with its downstream one), for which these sweeps converge from
  // any start (Rheinboldt, "On M-functions and their application to nonlinear Gauss-Seidel
  // iterations and to network flows", J. Math. Anal. Appl. 32, 1970; citation from memory); they
  // lack Newton's speed, so they only rescue steps the line search refused. Returns the largest
  // level change.
  double gauss_seidel_sweep(PieceResult& res) {
    if (sweep_order_.empty()) sweep_order_ = order_from_fixed();
    double moved = 0.0;
    std::vector<std::uint32_t> at;
    for (std::uint32_t u : sweep_order_) {
      at.clear();
      for (std::uint32_t k = g_.adj_start[u]; k < g_.adj_start[u + 1]; ++k)
        if (pipe_slot_[g_.adj[k]] >= 0) at.push_back(g_.adj[k]);
      auto residual = [&](double h) {
        level_[u] = h;
        double r = c_.decomposition.inflow[u];
        for (std::uint32_t p : at) {
          const auto f = pipe_flow(c_.network, c_.laws[p], level_[g_.end_a[p]], level_[g_.end_b[p]], flow_[p], c_.relation,
                                   c_.gvf, c_.pipe_settings, false);
          res.evaluations += f.evaluations;
          flow_[p] = f.q;
          r += g_.end_b[p] == u ? f.q : -f.q;
        }
        return r;
      };
      const double h0 = level_[u];
      const double r0 = residual(h0);
      if (std::fabs(r0) <= 0.1 * c_.options.continuity_tolerance_m3_s) continue;
      // The residual falls as the level rises: bracket the root by doubling steps.
      double lo = h0, r_lo = r0, hi = h0, r_hi = r0, step = 0.01;
      bool found = false;
      for (int k = 0; k < 40 && !found; ++k, step *= 2.0) {
        if (r0 > 0.0) {
          lo = hi, r_lo = r_hi;
          hi = h0 + step, r_hi = residual(hi);
          found = r_hi <= 0.0;
        } else {
          hi = lo, r_hi = r_lo;
          lo = h0 - step, r_lo = residual(lo);
          found = r_lo >= 0.0;
        }
      }
      double h = h0;
      if (found) {
        const auto root = hydraulics::detail::brent_root(residual, lo, hi, r_lo, r_hi, 1.0e-7, 40);
        h = root.x;
      }
      residual(h);  // leaves the level and the pipes' flows at the chosen level
      moved = std::max(moved, std::fabs(h - h0));
    }
    return moved;
  }

  // The unknowns outwards from the fixed levels (breadth first), the order of the sweeps.
  std::vector<std::uint32_t> order_from_fixed() {
    std::vector<std::uint32_t> order, out;
    for (std::uint32_t u : piece_.nodes)
      if (fixed_[u]) order.push_back(u), c_.position[u] = 0;
    for (std::size_t h = 0; h < order.size(); ++h) {
      const std::uint32_t u = order[h];
      for (std::uint32_t k = g_.adj_start[u]; k < g_.adj_start[u + 1]; ++k) {
        const std::uint32_t p = g_.adj[k];
        if (pipe_slot_[p] < 0) continue;
        const std::uint32_t v = g_.other(p, u);
        if (c_.position[v] >= 0) continue;
        c_.position[v] = 0;
        order.push_back(v);
      }
    }
    for (std::uint32_t u : order) {
      c_.position[u] = -1;
      if (!fixed_[u]) out.push_back(u);
    }
    return out;
  }

  // Armijo backtracking on half the squared residual norm; when no trial step decreases it, the
  // best trial is taken and counted as a stall (three in a row end the solve).
  double line_search(const std::vector<double>& delta, const std::vector<double>& r, PieceResult& res, int& stalls) {
    double phi0 = 0.0;
    for (double x : r) phi0 += x * x;
    std::vector<double> trial = level_, r_try(r.size()), best_level;
    std::vector<double> flow_before = flow_, best_flow;
    std::vector<PipeFlow> pf(piece_.pipes.size());
    double best_phi = std::numeric_limits<double>::infinity(), best_lambda = 0.0;
    double lambda = 1.0;
    for (int k = 0; k < 12; ++k, lambda *= 0.5) {
      for (std::size_t i = 0; i < unknown_.size(); ++i) trial[unknown_[i]] = level_[unknown_[i]] + lambda * delta[i];
      evaluate(trial, false, pf, r_try, res);
      double phi = 0.0;
      for (double x : r_try) phi += x * x;
      if (phi < best_phi) {
        best_phi = phi, best_lambda = lambda, best_level = trial, best_flow = flow_;
      }
      if (phi <= (1.0 - 1.0e-4 * lambda) * phi0) {
        level_.swap(trial);
        stalls = 0;
        return lambda;
      }
    }
    ++stalls;
    if (best_phi < std::numeric_limits<double>::infinity()) {
      level_.swap(best_level);
      flow_.swap(best_flow);
    } else {
      flow_.swap(flow_before);
    }
    return best_lambda;
  }

  const PieceContext& c_;
  const LocalGraph& g_;
  const Piece& piece_;
  const std::vector<char>& fixed_;
  std::vector<double>& level_;
  std::vector<double>& flow_;
  std::vector<std::uint32_t> unknown_;
  std::vector<std::int32_t> pipe_slot_;
  std::vector<std::uint32_t> sweep_order_;
  bool far_ = true;
  double first_residual_ = 0.0;  // per local pipe: its place in piece_.pipes, -1 if not its own
  Eigen::SparseLU<Eigen::SparseMatrix<double>, Eigen::COLAMDOrdering<int>> lu_;
  bool analysed_ = false;
};

}  // namespace

PieceResult solve_piece(const PieceContext& ctx, const Piece& piece, const std::vector<char>& fixed,
                        std::vector<double>& level, std::vector<double>& flow) {
  return PieceSolver(ctx, piece, fixed, level, flow).run();
}

}  // namespace rimline::solve::detail
