#include "rimline/connections/headroom.hpp"

#include <algorithm>
#include <atomic>
#include <cmath>
#include <exception>
#include <optional>
#include <thread>
#include <unordered_map>

#include "rimline/checks/checks.hpp"
#include "rimline/connections/added_flow.hpp"
#include "rimline/connections/compare.hpp"
#include "rimline/error.hpp"
#include "rimline/hydraulics/section.hpp"

namespace rimline::connections {
namespace {

struct Failure {
  LayerRole layer = LayerRole::structures;
  std::string id, criterion, change;
  std::size_t case_index = 0;
  double value = std::numeric_limits<double>::quiet_NaN();
  units::Dimension dimension = units::Dimension::dimensionless;
  std::int64_t fid = -1;
};

std::string key_of(LayerRole layer, const std::string& id, const std::string& question) {
  return std::string(layer_role_name(layer)) + '\t' + id + '\t' + question;
}

// What the run without an added flow holds, shared read-only by the workers.
struct Base {
  const run::CheckRun& run;
  const config::ConnectionSettings& settings;
  std::vector<std::size_t> rank;
  std::vector<solve::MarchOptions> options;       // per case
  std::unordered_map<std::string, double> worst;  // key -> badness, worst over the cases
  flows::SplitRule split;
  double limit_m3_s;
  // Per case and structure: the largest rise of its level that can cause no failure anywhere upstream
  // of it (safe_rise_upstream below); a trial's re-solve stops there.
  std::vector<std::vector<double>> safe_up;
  // Per conduit: solved by the network solve (loops, diversions by the hydraulic split, several
  // outlets; run.network). A trial re-solve is a tree march: it cannot stand for the solve there.
  const std::vector<char>* by_network = nullptr;

  bool network_solved(std::size_t ci) const { return by_network && ci < by_network->size() && (*by_network)[ci]; }

  bool ignored(const std::string& code) const {
    const auto& list = settings.comparison.ignore_codes;
    return std::find(list.begin(), list.end(), code) != list.end() ||
           std::find(list.begin(), list.end(), question_of(code)) != list.end();
  }
};

// One worker's copies of the cases' marches and flows, restored after each trial.
struct CaseCopy {
  solve::MarchResult march;
  std::vector<double> flow;
  solve::RemarchScratch scratch;
  solve::Remarched touched;
  Findings junk;  // the re-solve's own findings (the run already has them)
};

class Searcher {
 public:
  explicit Searcher(const Base& base) : base_(base) {
    for (const auto& c : base.run.cases) copies_.push_back(CaseCopy{c.march, base.run.flows.flow_m3_s, {}, {}, {}});
  }

  Headroom search(std::size_t s) {
    const auto& run = base_.run;
    const auto& net = run.read.network;
    Headroom h;
    h.structure = s;
    h.id = net.structures[s].id;
    h.fid = net.structures[s].fid;
    bool solved = false;
    for (const auto& c : run.cases) solved = solved || c.march.structures[s].solved;
    const auto path = added_flow_path(net, run.topology, base_.split, base_.rank, s);
    if (path.empty()) {
      h.note = run.topology.nodes[s].outflows.empty() ? "outfall or end of the network: no pipe leaves it"
                                                      : "the flow leaving it is set by a pump station";
      return h;
    }
    if (!solved) {
      h.note = "not checked: a pipe downstream of it could not be solved";
      return h;
    }
    bool looped = false;
    for (const auto& p : path) looped = looped || base_.network_solved(p.conduit);
    for (std::size_t ci : run.topology.nodes[s].inflows) looped = looped || base_.network_solved(ci);
    if (looped) return not_searched(h);
    reached_network_ = false;
    const double precision = base_.settings.headroom.precision_m3_s;
    const double relative = base_.settings.headroom.relative_precision;
    double leaving = 0.0;
    for (const auto& p : path)
      if (net.conduits[p.conduit].from == s && std::isfinite(run.flows.flow_m3_s[p.conduit]))
        leaving += run.flows.flow_m3_s[p.conduit];
    double lo = 0.0, hi = std::numeric_limits<double>::infinity();
    std::optional<Failure> at_hi;
    double d = std::min(std::max(10.0 * precision, leaving), base_.limit_m3_s);
    for (;;) {
      ++h.trials;
      auto f = fails(path, d);
      if (reached_network_) return not_searched(h);
      if (f) {
        hi = d, at_hi = std::move(f);
        break;
      }
      lo = d;
      if (d >= base_.limit_m3_s) break;
      d = std::min(4.0 * d, base_.limit_m3_s);
    }
    if (!at_hi) {
      h.headroom_m3_s = lo;
      h.at_limit = true;
      return h;
    }
    while (hi - lo > std::max(precision, relative * lo)) {
      const double mid = lo > 0.0 && hi > 2.0 * lo ? std::sqrt(lo * hi) : 0.5 * (lo + hi);
      ++h.trials;
      auto f = fails(path, mid);
      if (reached_network_) return not_searched(h);
      if (f) hi = mid, at_hi = std::move(f);
      else lo = mid;
    }
    h.headroom_m3_s = lo;
    h.governing_layer = at_hi->layer;
    h.governing_id = at_hi->id;
    h.governing_fid = at_hi->fid;
    h.criterion = at_hi->criterion;
    h.change = at_hi->change;
    h.case_label = run.cases[at_hi->case_index].label;
    h.value = at_hi->value;
    h.dimension = at_hi->dimension;
    return h;
  }

 private:
  static constexpr const char* network_note =
      "not searched: the added flow would reach pipes the network solve settles (loops, diversions split "
      "by the levels, several outlets), which a trial re-solve along the tree cannot stand for";
  // A trial reached a part the network solve settles: no figure, whatever the trials so far said.
  static Headroom not_searched(Headroom h) {
    h.note = network_note;
    h.network_part = true;
    h.headroom_m3_s = std::numeric_limits<double>::quiet_NaN();
    h.at_limit = false;
    return h;
  }

  // The first failure of a trial with `added` at the path's structure, trying first the case
  // that failed last.
  std::optional<Failure> fails(const std::vector<FlowShare>& path, double added) {
    const std::size_t n = copies_.size();
    for (std::size_t j = 0; j < n; ++j) {
      const std::size_t k = (last_failed_ + j) % n;
      if (auto f = trial(path, added, k)) {
        last_failed_ = k;
        return f;
      }
    }
    return std::nullopt;
  }

  std::optional<Failure> trial(const std::vector<FlowShare>& path, double added, std::size_t k) {
    const auto& run = base_.run;
    const auto& net = run.read.network;
    const auto& base_march = run.cases[k].march;
    CaseCopy& cc = copies_[k];
    changed_.clear();
    for (const auto& p : path) {
      const double q0 = run.flows.flow_m3_s[p.conduit];
      if (!std::isfinite(q0)) continue;
      cc.flow[p.conduit] = q0 + added * p.share;
      changed_.push_back(p.conduit);
    }
    cc.junk.clear();
    const auto& safe = base_.safe_up[k];
    const double still = still_m_;
    solve::remarch(net, run.topology, cc.flow, base_.options[k], base_.rank, changed_, still_m_, cc.march, cc.touched,
                   cc.scratch, cc.junk, [&safe, still](std::size_t s, double old_hgl, double new_hgl) {
                     const double rise = new_hgl - old_hgl;
                     return rise >= -still && rise <= safe[s];
                   });
    for (std::size_t ci : cc.touched.conduits) reached_network_ = reached_network_ || base_.network_solved(ci);
    std::optional<Failure> out = judge(k, cc);
    for (std::size_t s : cc.touched.structures) cc.march.structures[s] = base_march.structures[s];
    for (std::size_t ci : cc.touched.conduits) cc.march.conduits[ci] = base_march.conduits[ci];
    for (std::size_t ci : changed_) cc.flow[ci] = run.flows.flow_m3_s[ci];
    return out;
  }

  std::optional<Failure> judge(std::size_t k, const CaseCopy& cc) const {
    const auto& run = base_.run;
    const auto& net = run.read.network;
    for (std::size_t ci : cc.touched.conduits)
      if (run.cases[k].march.conduits[ci].solved && !cc.march.conduits[ci].solved)
        return Failure{LayerRole::conduits, net.conduits[ci].id, "NOT_CHECKED", "not solved", k,
                       std::numeric_limits<double>::quiet_NaN(), units::Dimension::dimensionless, net.conduits[ci].fid};
    const bool none = base_.settings.headroom.existing == config::ExistingExceptions::none;
    for (const auto& f :
         checks::check_features(net, cc.march, run.criteria, run.overrides, cc.touched.structures, cc.touched.conduits)) {
      if (!compared_code(f.code) || base_.ignored(f.code)) continue;
      const auto it = base_.worst.find(key_of(f.layer, f.feature_id, question_of(f.code)));
      std::string change;
      if (it == base_.worst.end()) change = "new";
      else if (none) change = "stands";
      else if (run::badness(f) - it->second > tolerance_of(f, base_.settings.comparison)) change = "worsened";
      if (!change.empty()) return Failure{f.layer, f.feature_id, f.code, change, k, f.value, f.dimension, f.fid};
    }
    return std::nullopt;
  }

  const Base& base_;
  std::vector<CaseCopy> copies_;
  std::vector<std::size_t> changed_;
  std::size_t last_failed_ = 0;
  double still_m_ = 1.0e-6;
  bool reached_network_ = false;

 public:
  void set_still(double still_m) { still_m_ = still_m; }
};

// How far the level at each structure may rise with nothing upstream of it failing, in one case.
// Off the added flow's path the flows do not change, and a level rising at a structure rises by no
// more upstream: a subcritical profile converges on normal depth going upstream, a surcharged pipe
// carries the rise unchanged, and a deeper pool means a slower outflow and a smaller structure loss.
// So a rise up to the smallest of these margins over everything upstream fails nothing there:
//  - a structure: its freeboard beyond the required one (no exception yet), else the level tolerance;
//  - a pipe: its crown above the EGL at its ends (not surcharged), else the level tolerance;
//  - a partly full pipe's lowest velocity: its margin over the minimum (or the velocity tolerance
//    when below it) times y / (1.5 v) at each end, since a rise dy changes the area by B dy and
//    A >= (2/3) B y in a circle (the parabola's area; a box has A = B y), so |dv| <= 1.5 v dy / y.
// Higher velocities, capacity ratios and cover cannot worsen with a rise. With existing = "none"
// a feature with an exception allows no rise.
std::vector<double> safe_rise_upstream(const Base& b, std::size_t k) {
  const auto& run = b.run;
  const auto& net = run.read.network;
  const auto& march = run.cases[k].march;
  const auto& cmp = b.settings.comparison;
  const bool none = b.settings.headroom.existing == config::ExistingExceptions::none;
  const double inf = std::numeric_limits<double>::infinity();
  auto has = [&b](LayerRole layer, const std::string& id, const char* question) {
    return b.worst.count(key_of(layer, id, question)) > 0;
  };
  auto counted = [&b](const char* code) { return !b.ignored(code); };
  std::vector<double> own_s(net.structures.size(), inf), own_c(net.conduits.size(), inf);
  for (std::size_t s = 0; s < net.structures.size(); ++s) {
    const auto& st = net.structures[s];
    const auto& r = march.structures[s];
    if (!r.solved || !st.rim_m || !counted("FREEBOARD")) continue;
    const double fb = checks::criteria_for(run.criteria, run.overrides.structures, st.id).freeboard_m;
    own_s[s] = has(LayerRole::structures, st.id, "FREEBOARD") ? (none ? 0.0 : cmp.level_tolerance_m)
                                                              : std::max(0.0, *st.rim_m - r.hgl_m - fb);
  }
  for (std::size_t ci = 0; ci < net.conduits.size(); ++ci) {
    const auto& c = net.conduits[ci];
    const auto& r = march.conduits[ci];
    if (!r.solved) continue;
    double m = inf;
    const double rise = hydraulics::rise_m(c.section);
    if (counted("SURCHARGED")) {
      // The EGL, not the HGL: under whole-loss bookkeeping a pipe keeps its velocity head into the
      // structure, so a rise dE there lifts its outlet HGL by dE plus the velocity head it loses as it
      // deepens; the new HGL stays below the old EGL + dE all the same.
      const double excess = std::max(r.profile.outlet().egl_m - (r.invert_down_m + rise),
                                     r.profile.inlet().egl_m - (r.invert_up_m + rise));
      m = has(LayerRole::conduits, c.id, "SURCHARGED") ? (none ? 0.0 : cmp.level_tolerance_m) : std::max(0.0, -excess);
    }
    const auto crit = checks::criteria_for(run.criteria, run.overrides.conduits, c.id);
    if (counted("VELOCITY_LOW") && r.flow_m3_s > 0.0 &&
        checks::self_cleansing_velocity(c, r, crit.velocity_basis).basis == "marched") {
      const double vmin = crit.velocity_min_m_s;
      const double v_low = std::min(r.profile.outlet().velocity_m_s, r.profile.inlet().velocity_m_s);
      const double allowed = has(LayerRole::conduits, c.id, "VELOCITY_LOW") ? (none ? 0.0 : cmp.velocity_tolerance_m_s)
                                                                             : std::max(0.0, v_low - vmin);
      for (const auto* p : {&r.profile.outlet(), &r.profile.inlet()})
        if (p->depth_m < rise && p->velocity_m_s > 0.0) m = std::min(m, allowed * p->depth_m / (1.5 * p->velocity_m_s));
    }
    own_c[ci] = m;
  }
  // Upstream first (highest rank first): each structure takes the minimum over its inflows, their
  // upstream structures and what lies upstream of those.
  std::vector<std::size_t> order;
  for (std::size_t s = 0; s < net.structures.size(); ++s)
    if (b.rank[s] != std::numeric_limits<std::size_t>::max()) order.push_back(s);
  std::sort(order.begin(), order.end(), [&b](std::size_t x, std::size_t y) { return b.rank[x] > b.rank[y]; });
  std::vector<double> up(net.structures.size(), inf);
  for (std::size_t s : order)
    for (std::size_t ci : run.topology.nodes[s].inflows) {
      const auto& c = net.conduits[ci];
      if (!model::marched(c) || c.to != s) continue;
      up[s] = std::min({up[s], own_c[ci], own_s[c.from], up[c.from]});
    }
  return up;
}

}  // namespace

flows::SplitRule headroom_split(const run::CheckRun& run) {
  switch (run.project.split_rule) {
    case config::SplitRule::field: return flows::Split::field;
    // Diversions the march splits under the hydraulic rule are those of components the solve gave
    // back (not converged): the march splits them by capacity.
    case config::SplitRule::hydraulic:
    case config::SplitRule::capacity: return flows::Split::capacity;
    case config::SplitRule::fixed: break;
  }
  // [flows.shares]: the shares as the run's design flows took them (each pipe's flow over what
  // leaves its upstream structure); a structure with no flow falls back to capacity.
  const auto& net = run.read.network;
  flows::SplitRule rule(flows::Split::hydraulic);
  rule.share.assign(net.conduits.size(), std::numeric_limits<double>::quiet_NaN());
  for (std::size_t s = 0; s < net.structures.size(); ++s) {
    const auto& outs = run.topology.nodes[s].outflows;
    double total = 0.0;
    for (std::size_t ci : outs)
      if (std::isfinite(run.flows.flow_m3_s[ci])) total += run.flows.flow_m3_s[ci];
    if (total > 0.0)
      for (std::size_t ci : outs)
        if (std::isfinite(run.flows.flow_m3_s[ci])) rule.share[ci] = run.flows.flow_m3_s[ci] / total;
  }
  return rule;
}

std::size_t not_searched_for_the_solve(const std::vector<Headroom>& headroom) {
  return static_cast<std::size_t>(
      std::count_if(headroom.begin(), headroom.end(), [](const Headroom& h) { return h.network_part; }));
}

double headroom_limit_m3_s(const run::CheckRun& run, const config::HeadroomSettings& settings) {
  if (settings.limit_m3_s) return *settings.limit_m3_s;
  double largest = 0.0;
  for (double q : run.flows.flow_m3_s)
    if (std::isfinite(q)) largest = std::max(largest, q);
  return std::max(0.1, 10.0 * largest);
}

std::vector<Headroom> connection_headroom(const run::CheckRun& run, const config::ConnectionSettings& settings,
                                          std::vector<std::size_t> structures, const HeadroomOptions& options) {
  const auto& net = run.read.network;
  if (structures.empty()) {
    for (const auto& id : settings.headroom.structures) {
      const std::size_t s = model::find_structure(net, id);
      if (s == model::no_index)
        throw Error(ErrorKind::bad_config, "[headroom] structures: the network has no structure \"" + id + "\"");
      structures.push_back(s);
    }
  }
  if (structures.empty())
    for (std::size_t s = 0; s < net.structures.size(); ++s) structures.push_back(s);
  std::vector<Headroom> out(structures.size());
  if (run.cases.empty()) return out;

  Base base{run, settings, solve::march_rank(net, run.topology), {}, {}, headroom_split(run),
            headroom_limit_m3_s(run, settings.headroom), {}};
  base.by_network = &run.network.solved_conduit;
  for (const auto& c : run.cases) {
    auto o = run.march_options;
    o.tailwater_m = c.tailwater_m;
    o.threads = 1;
    base.options.push_back(std::move(o));
    for (const auto& f : checks::run_checks(net, c.march, run.criteria, run.overrides)) {
      if (!compared_code(f.code) || base.ignored(f.code)) continue;
      const auto [it, fresh] = base.worst.try_emplace(key_of(f.layer, f.feature_id, question_of(f.code)), run::badness(f));
      if (!fresh) it->second = std::max(it->second, run::badness(f));
    }
  }

  for (std::size_t k = 0; k < run.cases.size(); ++k) base.safe_up.push_back(safe_rise_upstream(base, k));

  // Structures go to the workers one at a time from a shared counter; each result has its own slot.
  const unsigned cores = options.threads ? options.threads : std::max(1u, std::thread::hardware_concurrency());
  const unsigned workers = static_cast<unsigned>(std::min<std::size_t>(cores, structures.size() < 8 ? 1 : structures.size()));
  std::atomic<std::size_t> next{0};
  std::vector<std::exception_ptr> failed(workers);
  auto work = [&](unsigned w) {
    try {
      Searcher searcher(base);
      searcher.set_still(options.still_m);
      for (std::size_t i = next++; i < structures.size(); i = next++) out[i] = searcher.search(structures[i]);
    } catch (...) {
      failed[w] = std::current_exception();
    }
  };
  {
    std::vector<std::jthread> threads;
    for (unsigned w = 1; w < workers; ++w) threads.emplace_back(work, w);
    work(0);
  }
  for (const auto& e : failed)
    if (e) std::rethrow_exception(e);
  return out;
}

}  // namespace rimline::connections
