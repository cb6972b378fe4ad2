#include "rimline/connections/headroom.hpp"

#include <algorithm>
#include <atomic>
#include <condition_variable>
#include <cmath>
#include <exception>
#include <mutex>
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

// The marched gravity pipes leaving structure s.
std::size_t gravity_outflows(const model::Network& net, const topology::Topology& topo, std::size_t s) {
  std::size_t n = 0;
  for (std::size_t ci : topo.nodes[s].outflows) {
    const auto& c = net.conduits[ci];
    if (model::marched(c) && c.from == s && !c.force_main) ++n;
  }
  return n;
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
  // Per case and pipe: the largest rise of the level at its downstream end that can cause no
  // failure in it or anywhere upstream of it (safe_rise_upstream below); a trial's re-solve leaves
  // such a pipe as it is. NaN where that cannot be said (its upstream structure has another outflow).
  std::vector<std::vector<double>> safe_up;
  // Per conduit: solved by the network solve (loops, diversions by the hydraulic split, several
  // outlets; run.network). A trial re-solve is a tree march: it cannot stand for the solve there.
  const std::vector<char>* by_network = nullptr;

  bool network_solved(std::size_t ci) const { return by_network && ci < by_network->size() && (*by_network)[ci]; }
  // Whether a structure's loss is the same whatever flows into it (constant K): then an inflow
  // added upstream of a structure fails at least what the same inflow added at it fails.
  bool loss_ignores_inflows = false;

  bool ignored(const std::string& code) const {
    const auto& list = settings.comparison.ignore_codes;
    return std::find(list.begin(), list.end(), code) != list.end() ||
           std::find(list.begin(), list.end(), question_of(code)) != list.end();
  }
};

// What a structure's search ended with: a trial at `lo` passed, one at `hi` failed with `at_hi`.
struct Bracket {
  bool known = false;
  double lo = 0.0, hi = 0.0;
  Failure at_hi;
  std::size_t outflow = model::no_index;  // the pipe the added flow leaves by (the first of its path)
};

// One worker's copy of a case's march and flows: the run's, with the trials on the worker's stack.
struct CaseState {
  solve::MarchResult march;
  std::vector<double> flow;
  std::vector<std::size_t> flow_set;  // the pipes whose flow differs from the run's
  solve::RemarchScratch scratch;
  solve::Remarched touched;
  Findings junk;  // the re-solve's own findings (the run already has them)
};

// One trial in one case, as what it changed was before.
struct Frame {
  std::size_t k = 0;
  solve::RemarchUndo undo;
  std::vector<std::pair<std::size_t, double>> flows;
  std::vector<std::size_t> flow_set;
};

// Searches structures one after another on one worker. Each trial starts from the march the
// worker holds (the run's, plus the passing trials still on its stack) and re-solves only what
// differs: after a structure's last passing trial, the same added flow one structure upstream
// re-solves only the pipe between them and what lies upstream of it.
class Searcher {
 public:
  explicit Searcher(const Base& base)
      : base_(base), mark_(base.run.flows.flow_m3_s.size(), 0), on_path_(base.run.read.network.structures.size(), 0) {
    for (const auto& c : base.run.cases) states_.push_back(CaseState{c.march, base.run.flows.flow_m3_s, {}, {}, {}, {}});
  }

  std::size_t depth() const { return frames_.size(); }
  void undo_to(std::size_t depth) {
    while (frames_.size() > depth) undo_top();
  }

  // `below`: the brackets of the structures the whole added flow goes through next, nearest first
  // (empty if none), searched before this one.
  Headroom search(std::size_t s, const std::vector<const Bracket*>& below, Bracket& bracket) {
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
    bracket.outflow = path.front().conduit;
    const double precision = base_.settings.headroom.precision_m3_s;
    const double relative = base_.settings.headroom.relative_precision;
    double lo = 0.0, hi = std::numeric_limits<double>::infinity();
    std::optional<Failure> at_hi;
    const Bracket* next = below.empty() || !below.front()->known ? nullptr : below.front();
    // Up to the flow that passed one structure down, only the pipe between them and what lies
    // upstream of this structure can fail (the rest sees what the passing trial below saw, or
    // less): the walk leaves the other branches of the path as they are.
    local_up_to_ = next && base_.loss_ignores_inflows ? next->lo : -1.0;
    if (next) {
      // What a structure further down failed at its failing flow fails here too: the same flow added
      // here raises every level at least as much (each structure between keeps its level, its loss
      // being a constant K on its outflow) and the flows of the same pipes and more. Not so for the
      // pipes between, which carry the flow here and only backwater there (a backwater-lowered
      // velocity rises here): the nearest structure whose failure is not one of them gives the upper
      // end, without a trial. With another loss method the nearest one's failing flow is tried.
      if (base_.loss_ignores_inflows) {
        std::vector<std::size_t> between{bracket.outflow};
        for (const Bracket* b : below) {
          if (!b->known) break;
          const bool on_the_way =
              b->at_hi.layer == LayerRole::conduits &&
              std::any_of(between.begin(), between.end(), [&](std::size_t ci) { return net.conduits[ci].id == b->at_hi.id; });
          if (!on_the_way) {
            hi = b->hi, at_hi = b->at_hi;
            break;
          }
          if (b->outflow == model::no_index) break;
          between.push_back(b->outflow);
        }
      }
      if (!base_.loss_ignores_inflows) {
        ++h.trials;
        auto f = fails(path, next->hi);
        if (reached_network_) return not_searched(h);
        if (f) hi = next->hi, at_hi = std::move(f);
        else lo = next->hi;
      }
      if (next->lo > lo && next->lo < hi) {
        ++h.trials;
        auto f = fails(path, next->lo);
        if (reached_network_) return not_searched(h);
        if (f) hi = next->lo, at_hi = std::move(f);
        else lo = next->lo;
      }
    }
    if (!at_hi) {
      double leaving = 0.0;
      for (const auto& p : path)
        if (net.conduits[p.conduit].from == s && std::isfinite(run.flows.flow_m3_s[p.conduit]))
          leaving += run.flows.flow_m3_s[p.conduit];
      double d = lo > 0.0 ? std::min(4.0 * lo, base_.limit_m3_s)
                          : std::min(std::max(10.0 * precision, leaving), base_.limit_m3_s);
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
    }
    while (hi - lo > std::max(precision, relative * lo)) {
      const double mid = lo > 0.0 && hi > 2.0 * lo ? std::sqrt(lo * hi) : 0.5 * (lo + hi);
      ++h.trials;
      auto f = fails(path, mid);
      if (reached_network_) return not_searched(h);
      if (f) hi = mid, at_hi = std::move(f);
      else lo = mid;
    }
    bracket = Bracket{true, lo, hi, *at_hi, bracket.outflow};
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

  // The first failure of a trial with `added` at the path's structure, the cases tried in their
  // order, so that the case named does not depend on which worker searched which structure first
  // (a failure that does not depend on the tailwater, such as a capacity ratio, is named under the
  // first case every run). A failing trial is undone; a passing one stays on the stack (all cases).
  std::optional<Failure> fails(const std::vector<FlowShare>& path, double added) {
    const std::size_t n = states_.size();
    const std::size_t depth = frames_.size();
    for (std::size_t k = 0; k < n; ++k) {
      if (auto f = trial(path, added, k)) {
        undo_to(depth);
        return f;
      }
    }
    return std::nullopt;
  }

  std::optional<Failure> trial(const std::vector<FlowShare>& path, double added, std::size_t k) {
    const auto& run = base_.run;
    const auto& net = run.read.network;
    const auto& q0 = run.flows.flow_m3_s;
    CaseState& cs = states_[k];
    Frame& frame = frames_.emplace_back();
    frame.k = k;
    frame.flow_set = cs.flow_set;
    changed_.clear();
    auto set_flow = [&](std::size_t ci, double q) {
      if (cs.flow[ci] == q) return;
      frame.flows.emplace_back(ci, cs.flow[ci]);
      cs.flow[ci] = q;
      changed_.push_back(ci);
    };
    std::vector<std::size_t> now;
    for (const auto& p : path) {
      if (!std::isfinite(q0[p.conduit])) continue;
      set_flow(p.conduit, q0[p.conduit] + added * p.share);
      mark_[p.conduit] = 1;
      if (added != 0.0) now.push_back(p.conduit);
    }
    for (std::size_t ci : cs.flow_set)
      if (!mark_[ci]) set_flow(ci, q0[ci]);
    for (const auto& p : path) mark_[p.conduit] = 0;
    cs.flow_set = std::move(now);
    if (changed_.empty()) return std::nullopt;  // the march held is this trial's, and it passed

    // Judged as the walk goes (downstream first), which ends at the first failure.
    std::optional<Failure> failure;
    std::size_t seen_s = 0, seen_c = 0;
    solve::RemarchHooks hooks;
    hooks.undo = &frame.undo;
    hooks.stop = [&](const solve::Remarched& t) {
      // A walk reaching a part the network solve settles cannot stand for it: the trial ends as a
      // failure (so it is undone) and the search gives no figure (reached_network_).
      for (std::size_t i = seen_c; i < t.conduits.size(); ++i)
        if (base_.network_solved(t.conduits[i])) {
          reached_network_ = true;
          failure = Failure{LayerRole::conduits, net.conduits[t.conduits[i]].id, "NETWORK_PART", "not searched", k,
                            std::numeric_limits<double>::quiet_NaN(), units::Dimension::dimensionless,
                            net.conduits[t.conduits[i]].fid};
          return true;
        }
      failure = judge(k, cs, t, seen_s, seen_c);
      seen_s = t.structures.size(), seen_c = t.conduits.size();
      return failure.has_value();
    };
    const auto& safe = base_.safe_up[k];
    const auto& levels = run.cases[k].march.structures;
    const double still = still_m_;
    const bool local = added <= local_up_to_;
    if (local)
      for (const auto& p : path) on_path_[net.conduits[p.conduit].to] = 1;
    hooks.enough = [&safe, &levels, &net, still, local, this](std::size_t ci, double level) {
      const std::size_t to = net.conduits[ci].to;
      if (local && on_path_[to]) return true;
      const double rise = level - levels[to].hgl_m;
      return rise >= -still && rise <= safe[ci];  // false for NaN
    };
    cs.junk.clear();
    solve::remarch(net, run.topology, cs.flow, base_.options[k], base_.rank, changed_, still_m_, cs.march, cs.touched,
                   cs.scratch, cs.junk, hooks);
    if (local)
      for (const auto& p : path) on_path_[net.conduits[p.conduit].to] = 0;
    return failure;
  }

  void undo_top() {
    Frame& f = frames_.back();
    CaseState& cs = states_[f.k];
    for (auto it = f.undo.structures.rbegin(); it != f.undo.structures.rend(); ++it)
      cs.march.structures[it->first] = std::move(it->second);
    for (auto it = f.undo.conduits.rbegin(); it != f.undo.conduits.rend(); ++it)
      cs.march.conduits[it->first] = std::move(it->second);
    for (auto it = f.flows.rbegin(); it != f.flows.rend(); ++it) cs.flow[it->first] = it->second;
    cs.flow_set = std::move(f.flow_set);
    frames_.pop_back();
  }

  // The first failure among what the walk solved again since it was last asked.
  std::optional<Failure> judge(std::size_t k, const CaseState& cs, const solve::Remarched& t, std::size_t from_s,
                               std::size_t from_c) {
    const auto& run = base_.run;
    const auto& net = run.read.network;
    for (std::size_t i = from_c; i < t.conduits.size(); ++i) {
      const std::size_t ci = t.conduits[i];
      if (run.cases[k].march.conduits[ci].solved && !cs.march.conduits[ci].solved)
        return Failure{LayerRole::conduits, net.conduits[ci].id, "NOT_CHECKED", "not solved", k,
                       std::numeric_limits<double>::quiet_NaN(), units::Dimension::dimensionless, net.conduits[ci].fid};
    }
    new_s_.assign(t.structures.begin() + static_cast<std::ptrdiff_t>(from_s), t.structures.end());
    new_c_.assign(t.conduits.begin() + static_cast<std::ptrdiff_t>(from_c), t.conduits.end());
    const bool none = base_.settings.headroom.existing == config::ExistingExceptions::none;
    for (const auto& f : checks::check_features(net, cs.march, run.criteria, run.overrides, new_s_, new_c_)) {
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
  std::vector<CaseState> states_;
  std::vector<Frame> frames_;
  std::vector<char> mark_;  // per pipe, scratch
  std::vector<char> on_path_;  // per structure, scratch: downstream of the searched one on the path
  double local_up_to_ = -1.0;
  std::vector<std::size_t> changed_, new_s_, new_c_;
  double still_m_ = 1.0e-6;
  bool reached_network_ = false;

 public:
  void set_still(double still_m) { still_m_ = still_m; }
};

// How far the level at the downstream end of each pipe may rise with nothing failing in it or
// upstream of it, in one case.
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
// a feature with an exception allows no rise. A pipe whose upstream structure has another outflow
// gets NaN: that structure's level also depends on the other one.
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
  std::vector<double> branch(net.conduits.size(), std::numeric_limits<double>::quiet_NaN());
  for (std::size_t s : order)
    for (std::size_t ci : run.topology.nodes[s].inflows) {
      const auto& c = net.conduits[ci];
      if (!model::marched(c) || c.to != s) continue;
      const double m = std::min({own_c[ci], own_s[c.from], up[c.from]});
      up[s] = std::min(up[s], m);
      if (gravity_outflows(net, run.topology, c.from) == 1) branch[ci] = m;
    }
  return branch;
}

// Structures that take the whole added flow of another one: `down[s]`, the structure the single
// outflow of s leads to (no_index if none, or if it is not searched).
std::vector<std::size_t> single_outflow_targets(const Base& b, const std::vector<char>& searched) {
  const auto& net = b.run.read.network;
  std::vector<std::size_t> down(net.structures.size(), model::no_index);
  for (std::size_t s = 0; s < net.structures.size(); ++s) {
    if (!searched[s] || gravity_outflows(net, b.run.topology, s) != 1) continue;
    bool pumped = false;
    std::size_t to = model::no_index;
    for (std::size_t ci : b.run.topology.nodes[s].outflows) {
      const auto& c = net.conduits[ci];
      if (c.force_main) pumped = true;
      else if (model::marched(c) && c.from == s) to = c.to;
    }
    if (!pumped && to != s && to != model::no_index && searched[to]) down[s] = to;
  }
  return down;
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
  base.loss_ignores_inflows = run.march_options.loss_method == hydraulics::StructureLossMethod::constant_k;
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

  // The structures searched form trees along single outflows (down[s]); each tree is searched from
  // its downstream end up, depth first, so that a structure starts from the bracket and the march
  // of the one below it. Trees (and, when a worker waits, subtrees) go to the workers from a shared stack.
  const std::size_t ns = net.structures.size();
  std::vector<std::size_t> slot(ns, model::no_index);
  std::vector<char> searched(ns, 0);
  for (std::size_t i = 0; i < structures.size(); ++i)
    if (slot[structures[i]] == model::no_index) slot[structures[i]] = i, searched[structures[i]] = 1;
  auto down = single_outflow_targets(base, searched);
  std::vector<std::vector<std::size_t>> above(ns);
  std::vector<std::size_t> roots, order;
  auto grow = [&] {
    for (auto& a : above) a.clear();
    roots.clear();
    for (std::size_t s = 0; s < ns; ++s)
      if (searched[s]) (down[s] == model::no_index ? roots : above[down[s]]).push_back(s);
    order = roots;
    for (std::size_t i = 0; i < order.size(); ++i)
      for (std::size_t a : above[order[i]]) order.push_back(a);
  };
  grow();
  if (static_cast<std::ptrdiff_t>(order.size()) < std::count(searched.begin(), searched.end(), 1)) {
    // A loop of single outflows (the march does not reach it): those are searched one by one.
    std::vector<char> reached(ns, 0);
    for (std::size_t s : order) reached[s] = 1;
    for (std::size_t s = 0; s < ns; ++s)
      if (searched[s] && !reached[s]) down[s] = model::no_index;
    grow();
  }
  // Structures in each subtree (for sharing out the big ones), counted upstream first.
  std::vector<std::size_t> size(ns, 1);
  for (auto it = order.rbegin(); it != order.rend(); ++it)
    if (down[*it] != model::no_index) size[down[*it]] += size[*it];
  for (auto& a : above)
    std::sort(a.begin(), a.end(), [&size](std::size_t x, std::size_t y) { return size[x] > size[y]; });
  std::sort(roots.begin(), roots.end(), [&size](std::size_t x, std::size_t y) { return size[x] < size[y]; });

  const unsigned cores = options.threads ? options.threads : std::max(1u, std::thread::hardware_concurrency());
  const unsigned workers = static_cast<unsigned>(std::min<std::size_t>(cores, structures.size() < 8 ? 1 : structures.size()));
  std::vector<Bracket> brackets(ns);
  std::mutex mutex;
  std::condition_variable wake;
  std::vector<std::size_t> tasks = roots;  // taken from the back: largest first
  unsigned waiting = 0;
  std::atomic<bool> hungry{false};
  bool finished = false;
  constexpr std::size_t share_from = 16;  // a subtree worth a trial from the run's march
  std::vector<std::exception_ptr> failed(workers);
  auto work = [&](unsigned w) {
    try {
      Searcher searcher(base);
      searcher.set_still(options.still_m);
      struct Item {
        std::size_t s, next, depth;
      };
      std::vector<Item> stack;
      std::vector<const Bracket*> below;
      auto enter = [&](std::size_t s) {
        const std::size_t depth = searcher.depth();
        below.clear();
        for (std::size_t d = down[s]; d != model::no_index && below.size() < 8; d = down[d]) below.push_back(&brackets[d]);
        out[slot[s]] = searcher.search(s, below, brackets[s]);
        stack.push_back({s, 0, depth});
      };
      for (;;) {
        std::size_t root = model::no_index;
        {
          std::unique_lock lock(mutex);
          ++waiting;
          while (tasks.empty() && !finished) {
            if (waiting == workers) {
              finished = true;
              wake.notify_all();
              break;
            }
            hungry = true;
            wake.wait(lock);
          }
          --waiting;
          if (tasks.empty()) return;
          root = tasks.back();
          tasks.pop_back();
          hungry = waiting > 0 && tasks.empty();
        }
        enter(root);
        while (!stack.empty()) {
          Item& it = stack.back();
          if (it.next == above[it.s].size()) {
            searcher.undo_to(it.depth);
            stack.pop_back();
            continue;
          }
          const std::size_t a = above[it.s][it.next++];
          if (hungry && size[a] >= share_from) {
            std::lock_guard lock(mutex);
            tasks.push_back(a);
            hungry = false;
            wake.notify_one();
            continue;
          }
          enter(a);
        }
      }
    } catch (...) {
      failed[w] = std::current_exception();
      std::lock_guard lock(mutex);
      finished = true;
      wake.notify_all();
    }
  };
  {
    std::vector<std::jthread> threads;
    for (unsigned w = 1; w < workers; ++w) threads.emplace_back(work, w);
    work(0);
  }
  for (std::size_t i = 0; i < structures.size(); ++i)
    if (slot[structures[i]] != i) out[i] = out[slot[structures[i]]];
  for (const auto& e : failed)
    if (e) std::rethrow_exception(e);
  return out;
}

}  // namespace rimline::connections
