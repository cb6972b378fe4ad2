#include "rimline/solve/march.hpp"

#include <algorithm>
#include <cmath>
#include <exception>
#include <iterator>
#include <queue>
#include <thread>

#include "rimline/error.hpp"
#include "rimline/hydraulics/depth.hpp"
#include "rimline/hydraulics/friction.hpp"
#include "rimline/solve/structure_level.hpp"

namespace rimline::solve {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();
// A level far below any invert: the pipe discharges freely into it.
constexpr double free_level_m = free_outlet_level_m;

// Marches the structures it is seeded with and everything upstream of them. Several marchers
// run at once on disjoint connected components: each writes only the results of its own
// structures and pipes, and its findings to its own list.
class Marcher {
 public:
  Marcher(const model::Network& n, const topology::Topology& t, const std::vector<double>& q, const MarchOptions& o,
          MarchResult& out, std::vector<std::size_t>& pending, Findings& findings)
      : net_(n), topo_(t), flow_(q), opt_(o), out_(out), pending_(pending), findings_(findings) {}

  // `ready`: structures of this marcher's components with no outflow left to solve.
  void run(std::vector<std::size_t> ready) {
    // Downstream first: a structure is solved once all its outflows are, then its inflows.
    while (!ready.empty()) {
      const std::size_t s = ready.back();
      ready.pop_back();
      solve_structure(s);
      for (std::size_t ci : topo_.nodes[s].inflows) {
        const auto& c = net_.conduits[ci];
        if (!model::marched(c) || c.to != s) continue;
        solve_conduit(ci);
        if (--pending_[c.from] == 0) ready.push_back(c.from);
      }
      if (out_.structures[s].outfall || out_.structures[s].pumped) settle_outfall(s);
    }
  }

  // The walk of remarch() (march.hpp): solves `s` again, then the inflows whose flow changed or
  // that were solved against another level of `s`; returns the upstream structures to visit.
  template <typename Visit>
  void resolve(std::size_t s, const std::vector<char>& flow_changed, double still_m, Remarched& touched, Visit visit,
               const RemarchHooks& hooks) {
    if (hooks.undo) hooks.undo->structures.emplace_back(s, out_.structures[s]);
    const StructureResult old = out_.structures[s];
    out_.structures[s] = StructureResult{};
    solve_structure(s);
    const auto& r = out_.structures[s];
    touched.structures.push_back(s);
    // An outfall's or wet well's level, as its pipes see it, is the tailwater or pump-on level.
    const bool fixed = r.outfall || r.pumped;
    const bool moved = !fixed && (old.solved != r.solved || (r.solved && !(std::abs(old.hgl_m - r.hgl_m) <= still_m)));
    for (std::size_t ci : topo_.nodes[s].inflows) {
      const auto& c = net_.conduits[ci];
      if (!model::marched(c) || c.to != s) continue;
      const auto& cr = out_.conduits[ci];
      // A pipe left behind by an earlier walk (ended by `enough`) may have seen another level.
      const bool stale = !fixed && r.solved && cr.solved && !(std::abs(cr.downstream_level_m - r.hgl_m) <= still_m);
      if (!flow_changed[ci] && !moved && !stale) continue;
      if (!flow_changed[ci] && r.solved && hooks.enough && hooks.enough(ci, r.hgl_m)) continue;
      if (hooks.undo) hooks.undo->conduits.emplace_back(ci, cr);
      out_.conduits[ci] = ConduitResult{};
      solve_conduit(ci);
      touched.conduits.push_back(ci);
      visit(c.from);
    }
    if (fixed) settle_outfall(s);
  }

 private:
  void solve_structure(std::size_t s) {
    auto& r = out_.structures[s];
    const auto& st = net_.structures[s];
    const auto& node = topo_.nodes[s];
    std::vector<std::size_t> outs;
    bool pumped = false;
    for (std::size_t ci : node.outflows) {
      const auto& c = net_.conduits[ci];
      if (!model::marched(c) || c.from != s) continue;
      // A force main leaving a structure means a pump: its HGL is the pump's discharge head, not
      // the wet-well level, so it does not back water up into the gravity pipes arriving there.
      if (c.force_main) pumped = true;
      else outs.push_back(ci);
    }
    if (outs.empty()) {
      r.pumped = pumped;
      r.outfall = !pumped;
      r.solved = true;
      r.tailwater_from_field = !pumped && st.tailwater_m.has_value();
      r.hgl_m = r.egl_m = outlet_level_m(st, s, pumped, opt_, pumped ? nullptr : &r.tailwater_m);
      return;
    }
    r.energy = structure_energy_at(opt_, s);
    double best = -std::numeric_limits<double>::infinity();
    // A dry outflow (no flow: a relief pipe set above the water, as the network solve finds) does
    // not hold water up in the structure while another outflow carries the flow.
    const bool some_flow = std::any_of(outs.begin(), outs.end(), [this](std::size_t ci) { return flow_[ci] > 0.0; });
    for (std::size_t ci : outs) {
      const auto& cr = out_.conduits[ci];
      if (!cr.solved) {
        r.solved = false;  // a level downstream is unknown: nothing upstream can be checked
        return;
      }
      if (some_flow && !(flow_[ci] > 0.0)) continue;
      const auto loss = loss_into(s, ci);
      const double level = structure_level_for_outflow(cr.profile.inlet(), loss);
      if (level > best) {
        best = level;
        r.governing_outflow = ci;
        r.loss_m = loss.loss_m;
        r.k_effective = loss.k_effective;
        r.outflow_velocity_m_s = cr.profile.inlet().velocity_m_s;
        r.loss_terms = loss.terms;
      }
    }
    r.solved = true;
    r.hgl_m = r.egl_m = best;
  }

  hydraulics::StructureLoss loss_into(std::size_t s, std::size_t outflow) {
    const auto& st = net_.structures[s];
    const auto& inlet = out_.conduits[outflow].profile.inlet();
    const double structure_invert = st.invert_m.value_or(inlet.invert_m);
    std::vector<hydraulics::StructureInflow> inflows;
    for (std::size_t ci : topo_.nodes[s].inflows) {
      const auto& c = net_.conduits[ci];
      if (!model::marched(c) || c.to != s) continue;
      const double d = ci < topo_.deflection_deg.size() ? topo_.deflection_deg[ci] : nan;
      inflows.push_back(structure_inflow(c, flow_[ci], d, structure_invert));
    }
    const auto in = structure_loss_inputs(net_, opt_, s, outflow, out_.conduits[outflow].flow_m3_s, inlet,
                                          std::move(inflows));
    std::string fallback;
    auto loss = structure_loss_for(opt_, in, &fallback);
    if (!fallback.empty()) {
      findings_.push_back({"LOSS_FALLBACK", Severity::info, LayerRole::structures, st.id, "", nan, nan,
                           units::Dimension::dimensionless,
                               "structure " + st.id + ": the chosen loss method could not be applied (" + fallback +
                                   "); the constant K " + q(in.k_constant, units::Dimension::dimensionless) + " was used."});
      findings_.back().fid = st.fid;
    }
    return loss;
  }

  void solve_conduit(std::size_t ci) {
    const auto& c = net_.conduits[ci];
    auto& r = out_.conduits[ci];
    const auto& down = out_.structures[c.to];
    r.flow_m3_s = flow_[ci];
    if (c.force_main) {  // pressure flow: solved with its pump station (solve/force_main.hpp)
      r.note = "force main: pressure flow, solved with its pump station ([[pump_stations]])";
      return;
    }
    if (!down.solved) {
      r.note = "not checked: the level downstream is unknown";
      return;
    }
    std::string up_source, down_source;
    std::optional<double> inv_up = c.invert_up_m ? std::optional<double>(c.invert_up_m) : estimate_invert(ci, c.from, true, up_source);
    std::optional<double> inv_down = c.invert_down_m ? std::optional<double>(c.invert_down_m) : estimate_invert(ci, c.to, false, down_source);
    // One end known, nothing around the other: take the pipe as level so the march goes on.
    if (inv_up && !inv_down) inv_down = inv_up, down_source = "the upstream invert (level pipe assumed)";
    if (inv_down && !inv_up) inv_up = inv_down, up_source = "the downstream invert (level pipe assumed)";
    if (!inv_up || !inv_down) {
      r.note = "not checked: no invert at either end and none at its structures";
      blocked_at(ci, r.note);
      return;
    }
    for (const auto& [end, from] : {std::pair{"upstream", up_source}, std::pair{"downstream", down_source}}) {
      if (from.empty()) continue;
      findings_.push_back({"INVERT_ESTIMATED", Severity::warning, LayerRole::conduits, c.id, "", nan, nan,
                               units::Dimension::length,
                               "pipe " + c.id + " has no usable " + end + " invert; " + from +
                                   " stands in for it, so its figures and those upstream rest on an estimate."});
      findings_.back().fid = c.fid;
    }
    if (!std::isfinite(r.flow_m3_s)) {
      r.note = "not checked: no design flow";
      blocked_at(ci, r.note);
      return;
    }
    r.invert_up_m = *inv_up;
    r.invert_down_m = *inv_down;
    hydraulics::ConduitReach reach{c.section, c.roughness, c.length_m, r.invert_up_m, r.invert_down_m,
                                   std::max(0.0, r.flow_m3_s)};
    r.slope = (r.invert_up_m - r.invert_down_m) / c.length_m;
    r.downstream_level_m = down.hgl_m;
    // Into a structure whose loss is the whole loss across it, the pipe keeps its velocity head to
    // its outlet: the structure's energy level is the outlet's EGL. A still pool, an outfall or a
    // wet well takes the water level instead.
    r.outlet_energy_control =
        !down.outfall && !down.pumped && down.energy == hydraulics::StructureEnergy::whole_loss;
    try {
      if (r.slope > 0.0) r.capacity_m3_s = hydraulics::full_capacity_m3_s(c.roughness, c.section, r.slope);
      r.profile = r.outlet_energy_control ? hydraulics::compute_profile_to_energy(reach, down.egl_m, opt_.gvf)
                                          : hydraulics::compute_profile(reach, down.hgl_m, opt_.gvf);
      keep_needed_points(ci, r.profile.points);
      r.solved = true;
    } catch (const Error& e) {
      r.note = std::string("not checked: ") + e.what();
      blocked_at(ci, r.note);
      return;
    }
    if (!r.profile.converged) {
      findings_.push_back({"NOT_CONVERGED", Severity::warning, LayerRole::conduits, c.id, "", nan, nan,
                               units::Dimension::dimensionless,
                               "pipe " + c.id + ": the water-surface profile did not converge (" + r.profile.note +
                                   "); its figures are approximate."});
      findings_.back().fid = c.fid;
    }
  }

  // The step points stay in the result for the whole run. Only drawn pipes need them all; the
  // others keep the outlet and the inlet, and the fastest point between them only where it is
  // faster than both ends (what the checks and the result layers read: the end levels and the
  // highest velocity), instead of ~24, which was most of a city-wide run's memory. A gradually
  // varied profile is monotonic, so most pipes keep two points.
  void keep_needed_points(std::size_t ci, std::vector<hydraulics::ProfilePoint>& points) const {
    const auto& keep = opt_.keep_step_points;
    if (keep.empty() || (ci < keep.size() && keep[ci]) || points.size() <= 2) {
      points.shrink_to_fit();  // growth by doubling leaves up to half of the capacity unused
      return;
    }
    std::size_t fastest = 1;
    for (std::size_t k = 2; k + 1 < points.size(); ++k)
      if (points[k].velocity_m_s > points[fastest].velocity_m_s) fastest = k;
    const double ends = std::max(points.front().velocity_m_s, points.back().velocity_m_s);
    std::vector<hydraulics::ProfilePoint> few;
    if (points[fastest].velocity_m_s > ends) few = {points.front(), points[fastest], points.back()};
    else few = {points.front(), points.back()};
    points.swap(few);
  }

  // A stand-in for a pipe's missing invert at a structure: the structure's own invert, else the
  // pipes meeting it there (the outflows' inlet inverts for an arriving pipe, the inflows' outlet
  // inverts for a leaving one). Empty when nothing is known.
  std::optional<double> estimate_invert(std::size_t self, std::size_t s, bool leaving, std::string& source) const {
    const auto& st = net_.structures[s];
    if (st.invert_m) {
      source = "the invert of structure " + st.id;
      return st.invert_m;
    }
    std::optional<double> best;
    std::string via;
    auto consider = [&](const std::vector<std::size_t>& list, bool use_up, bool highest) {
      for (std::size_t ci : list) {
        if (ci == self) continue;
        auto v = use_up ? net_.conduits[ci].invert_up_m : net_.conduits[ci].invert_down_m;
        // A pipe already marched (downstream of this one) offers the invert it was solved with,
        // itself perhaps an estimate: estimates chain upstream through a run of missing inverts.
        const auto& solved = out_.conduits[ci];
        if (!v && solved.solved) v = use_up ? solved.invert_up_m : solved.invert_down_m;
        if (!v) continue;
        if (!best || (highest ? *v > *best : *v < *best)) best = v, via = net_.conduits[ci].id;
      }
    };
    const auto& node = topo_.nodes[s];
    if (leaving) consider(node.inflows, false, false);   // lowest arriving outlet
    else consider(node.outflows, true, true);            // highest leaving inlet
    if (!best) {
      if (leaving) consider(node.outflows, true, false);
      else consider(node.inflows, false, false);
    }
    if (best) source = "the invert of pipe " + via + " at structure " + st.id;
    return best;
  }

  // An outfall's reported level is the tailwater, or the free-outlet level of its pipes if
  // that is higher (modes free and higher).
  void settle_outfall(std::size_t s) {
    auto& r = out_.structures[s];
    double level = r.hgl_m;
    if (r.pumped || opt_.tailwater_mode != TailwaterMode::fixed || !std::isfinite(r.tailwater_m)) {
      for (std::size_t ci : topo_.nodes[s].inflows)
        if (out_.conduits[ci].solved && net_.conduits[ci].to == s)
          level = std::max(level, out_.conduits[ci].profile.outlet().hgl_m);
    }
    if (level <= free_level_m) level = net_.structures[s].invert_m.value_or(nan);
    r.hgl_m = r.egl_m = level;
    r.solved = std::isfinite(level);
  }

  void blocked_at(std::size_t ci, const std::string& why) {
    const auto& c = net_.conduits[ci];
    findings_.push_back({"NOT_CHECKED", Severity::warning, LayerRole::conduits, c.id, "", nan, nan,
                             units::Dimension::dimensionless,
                             "pipe " + c.id + " was " + why + "; the structures upstream of it were not checked."});
    findings_.back().fid = c.fid;
  }

  const model::Network& net_;
  const topology::Topology& topo_;
  const std::vector<double>& flow_;
  const MarchOptions& opt_;
  MarchResult& out_;
  std::vector<std::size_t>& pending_;
  Findings& findings_;
};

void report_unsolved(const model::Network& net, const topology::Topology& topo, MarchResult& out) {
  for (std::size_t s = 0; s < net.structures.size(); ++s) {
    const auto& r = out.structures[s];
    if (r.solved || (topo.nodes[s].inflows.empty() && topo.nodes[s].outflows.empty())) continue;
    const auto& st = net.structures[s];
    out.findings.push_back({"NOT_CHECKED", Severity::warning, LayerRole::structures, st.id, "", nan, nan,
                            units::Dimension::dimensionless,
                            "structure " + st.id + " was not checked: a pipe downstream of it could not be solved."});
    out.findings.back().fid = st.fid;
  }
}

// Connected components of the marched graph (union-find): each structure's lowest-index member.
std::vector<std::size_t> components(const model::Network& net) {
  std::vector<std::size_t> parent(net.structures.size());
  for (std::size_t s = 0; s < parent.size(); ++s) parent[s] = s;
  auto root = [&parent](std::size_t s) {
    while (parent[s] != s) s = parent[s] = parent[parent[s]];
    return s;
  };
  for (const auto& c : net.conduits) {
    if (!model::marched(c)) continue;
    const std::size_t a = root(c.from), b = root(c.to);
    if (a != b) parent[std::max(a, b)] = std::min(a, b);
  }
  for (std::size_t s = 0; s < parent.size(); ++s) parent[s] = root(s);
  return parent;
}

// Starting structures per worker. Components go whole to one worker (largest first, to the least
// loaded), so no pipe's downstream level belongs to another thread; the split depends on the
// network only, so the results and the order of the findings do not depend on timing.
std::vector<std::vector<std::size_t>> seeds_per_worker(const model::Network& net,
                                                       const std::vector<std::size_t>& pending, unsigned workers) {
  const std::size_t ns = net.structures.size();
  std::vector<std::vector<std::size_t>> seeds(workers);
  if (workers == 1) {
    for (std::size_t s = 0; s < ns; ++s)
      if (pending[s] == 0) seeds[0].push_back(s);
    return seeds;
  }
  const auto comp = components(net);
  std::vector<std::size_t> size(ns, 0);
  for (std::size_t s = 0; s < ns; ++s) ++size[comp[s]];
  std::vector<std::size_t> roots;
  for (std::size_t s = 0; s < ns; ++s)
    if (comp[s] == s) roots.push_back(s);
  std::stable_sort(roots.begin(), roots.end(), [&size](std::size_t a, std::size_t b) { return size[a] > size[b]; });
  std::vector<std::size_t> load(workers, 0), owner(ns, 0);
  for (std::size_t r : roots) {
    const auto w = static_cast<std::size_t>(std::min_element(load.begin(), load.end()) - load.begin());
    owner[r] = w;
    load[w] += size[r];
  }
  for (std::size_t s = 0; s < ns; ++s)
    if (pending[s] == 0) seeds[owner[comp[s]]].push_back(s);
  return seeds;
}

}  // namespace

unsigned march_threads(const MarchOptions& options, std::size_t conduits) {
  if (conduits < 4000) return 1;  // below a few thousand pipes a thread costs more than it saves
  const unsigned n = options.threads ? options.threads : std::max(1u, std::thread::hardware_concurrency());
  return std::min(n, 64u);
}

MarchResult march(const model::Network& network, const topology::Topology& topo, const std::vector<double>& flow_m3_s,
                  const MarchOptions& options) {
  if (flow_m3_s.size() != network.conduits.size())
    throw Error(ErrorKind::internal, "march: one design flow per conduit is needed");
  MarchResult out;
  out.conduits.resize(network.conduits.size());
  out.structures.resize(network.structures.size());
  std::vector<std::size_t> pending(network.structures.size(), 0);  // marched outflows not yet solved
  for (const auto& c : network.conduits)
    if (model::marched(c)) ++pending[c.from];

  const unsigned workers = march_threads(options, network.conduits.size());
  auto seeds = seeds_per_worker(network, pending, workers);
  std::vector<Findings> found(workers);
  std::vector<std::exception_ptr> failed(workers);
  auto work = [&](unsigned w) {
    try {
      Marcher(network, topo, flow_m3_s, options, out, pending, found[w]).run(std::move(seeds[w]));
    } catch (...) {
      failed[w] = std::current_exception();
    }
  };
  std::vector<std::thread> threads;
  for (unsigned w = 1; w < workers; ++w) threads.emplace_back(work, w);
  work(0);
  for (auto& t : threads) t.join();
  for (const auto& e : failed)
    if (e) std::rethrow_exception(e);
  for (auto& f : found)
    out.findings.insert(out.findings.end(), std::make_move_iterator(f.begin()), std::make_move_iterator(f.end()));
  report_unsolved(network, topo, out);
  return out;
}

std::vector<std::size_t> march_rank(const model::Network& network, const topology::Topology& topo) {
  const std::size_t ns = network.structures.size();
  std::vector<std::size_t> pending(ns, 0), rank(ns, std::numeric_limits<std::size_t>::max()), ready;
  for (const auto& c : network.conduits)
    if (model::marched(c)) ++pending[c.from];
  for (std::size_t s = 0; s < ns; ++s)
    if (pending[s] == 0) ready.push_back(s);
  std::size_t next = 0;
  for (std::size_t k = 0; k < ready.size(); ++k) {  // breadth first: any order with the dependencies will do
    const std::size_t s = ready[k];
    rank[s] = next++;
    for (std::size_t ci : topo.nodes[s].inflows) {
      const auto& c = network.conduits[ci];
      if (model::marched(c) && c.to == s && --pending[c.from] == 0) ready.push_back(c.from);
    }
  }
  return rank;
}

bool remarch(const model::Network& network, const topology::Topology& topo, const std::vector<double>& flow_m3_s,
             const MarchOptions& options, const std::vector<std::size_t>& rank, const std::vector<std::size_t>& changed,
             double still_m, MarchResult& result, Remarched& touched, RemarchScratch& scratch, Findings& findings,
             const RemarchHooks& hooks) {
  scratch.queued.resize(network.structures.size(), 0);
  scratch.flow_changed.resize(network.conduits.size(), 0);
  touched.structures.clear();
  touched.conduits.clear();
  std::vector<std::size_t> no_pending;
  Marcher marcher(network, topo, flow_m3_s, options, result, no_pending, findings);
  using Item = std::pair<std::size_t, std::size_t>;  // rank, structure: lowest rank first
  std::priority_queue<Item, std::vector<Item>, std::greater<Item>> heap;
  auto visit = [&](std::size_t s) {
    if (s == model::no_index || scratch.queued[s]) return;
    scratch.queued[s] = 1;
    heap.push({rank[s], s});
  };
  for (std::size_t ci : changed) {
    scratch.flow_changed[ci] = 1;
    if (model::marched(network.conduits[ci])) visit(network.conduits[ci].to);
  }
  bool complete = true;
  while (!heap.empty()) {
    const std::size_t s = heap.top().second;
    heap.pop();
    marcher.resolve(s, scratch.flow_changed, still_m, touched, visit, hooks);
    if (hooks.stop && hooks.stop(touched)) {
      complete = false;
      break;
    }
  }
  for (; !heap.empty(); heap.pop()) scratch.queued[heap.top().second] = 0;
  for (std::size_t ci : changed) scratch.flow_changed[ci] = 0;
  for (std::size_t s : touched.structures) scratch.queued[s] = 0;
  return complete;
}

namespace {

// How a pipe's outlet EGL comes down to the level of what it discharges into.
std::string exit_basis(const ConduitResult& cr, const StructureResult& down) {
  if (cr.profile.free_outlet) return "free outlet: critical depth at the outlet, the energy above the level below lost in the fall";
  if (cr.outlet_energy_control) return "none: K V_o^2/2g is the whole loss across the structure, the pipe keeps its velocity head";
  if (down.outfall || down.pumped) return "velocity head V^2/2g spent in the receiving water";
  return "velocity head V^2/2g spent in the still pool";
}

BudgetItem item(std::string kind, const std::string& feature_id, double head_m) {
  BudgetItem b;
  b.kind = std::move(kind);
  b.feature_id = feature_id;
  b.head_m = head_m;
  return b;
}

}  // namespace

std::vector<BudgetItem> loss_budget(const model::Network& network, const MarchResult& result, std::size_t structure) {
  std::vector<BudgetItem> items;
  std::size_t s = structure;
  for (std::size_t guard = 0; guard <= network.conduits.size(); ++guard) {
    const auto& r = result.structures[s];
    if (!r.solved) return {};
    if (r.outfall || r.pumped) {
      BudgetItem start = item(r.pumped ? "wet_well" : "tailwater", network.structures[s].id, r.hgl_m);
      start.basis = r.pumped ? "the wet well's pump-on level" : "the level at the outfall";
      items.push_back(std::move(start));
      break;
    }
    const std::size_t ci = r.governing_outflow;
    if (ci == model::no_index || !result.conduits[ci].solved) return {};
    const auto& cr = result.conduits[ci];
    const std::size_t down = network.conduits[ci].to;
    const auto& pr = cr.profile;
    BudgetItem st = item("structure", network.structures[s].id, r.loss_m);
    st.k = r.k_effective;
    st.velocity_m_s = r.outflow_velocity_m_s;
    st.velocity_head_m = hydraulics::velocity_head_m(r.outflow_velocity_m_s);
    st.basis = "K V_o^2/2g on the velocity at the inlet of " + network.conduits[ci].id + " (" +
               std::string(hydraulics::structure_energy_name(r.energy)) + ")";
    items.push_back(std::move(st));
    BudgetItem along = item("conduit", network.conduits[ci].id, pr.inlet().egl_m - pr.outlet().egl_m);
    along.length_m = network.conduits[ci].length_m;
    along.jump_m = pr.jump_loss_m;
    along.basis = pr.jump_station_m ? "friction along the pipe and the hydraulic jump's loss" : "friction along the pipe";
    items.push_back(std::move(along));
    BudgetItem exit = item("exit", network.conduits[ci].id, pr.outlet().egl_m - result.structures[down].egl_m);
    exit.velocity_m_s = pr.outlet().velocity_m_s;
    exit.velocity_head_m = hydraulics::velocity_head_m(pr.outlet().velocity_m_s);
    exit.basis = exit_basis(cr, result.structures[down]);
    items.push_back(std::move(exit));
    s = down;
  }
  std::reverse(items.begin(), items.end());
  return items;
}

}  // namespace rimline::solve
