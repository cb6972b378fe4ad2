#include "rimline/solve/march.hpp"

#include <algorithm>
#include <cmath>

#include "rimline/error.hpp"
#include "rimline/hydraulics/depth.hpp"
#include "rimline/hydraulics/friction.hpp"

namespace rimline::solve {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();
// A level far below any invert: the pipe discharges freely into it.
constexpr double free_level_m = -1.0e6;

class Marcher {
 public:
  Marcher(const model::Network& n, const topology::Topology& t, const std::vector<double>& q, const MarchOptions& o)
      : net_(n), topo_(t), flow_(q), opt_(o) {
    out_.conduits.resize(n.conduits.size());
    out_.structures.resize(n.structures.size());
  }

  MarchResult run() {
    const std::size_t ns = net_.structures.size();
    std::vector<std::size_t> pending(ns, 0);  // usable outflows not yet solved
    for (const auto& c : net_.conduits)
      if (model::marched(c)) ++pending[c.from];
    std::vector<std::size_t> ready;
    for (std::size_t s = 0; s < ns; ++s)
      if (pending[s] == 0) ready.push_back(s);
    // Downstream first: a structure is solved once all its outflows are, then its inflows.
    while (!ready.empty()) {
      const std::size_t s = ready.back();
      ready.pop_back();
      solve_structure(s);
      for (std::size_t ci : topo_.nodes[s].inflows) {
        const auto& c = net_.conduits[ci];
        if (!model::marched(c) || c.to != s) continue;
        solve_conduit(ci);
        if (--pending[c.from] == 0) ready.push_back(c.from);
      }
      if (out_.structures[s].outfall || out_.structures[s].pumped) settle_outfall(s);
    }
    report_unsolved();
    return std::move(out_);
  }

 private:
  double structure_k(const model::Structure& s) const {
    if (s.loss_k) return *s.loss_k;
    const auto it = opt_.k_by_type.find(std::string(model::structure_kind_name(s.kind)));
    return it != opt_.k_by_type.end() ? it->second : opt_.default_k;
  }

  double tailwater_of(const model::Structure& s) const {
    if (s.tailwater_m) return *s.tailwater_m;
    return opt_.tailwater_m;
  }

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
    if (outs.empty() && pumped) {
      r.pumped = true;
      r.solved = true;
      r.hgl_m = r.egl_m = free_level_m;  // the inflows discharge freely into the wet well
      return;
    }
    if (outs.empty()) {
      r.outfall = true;
      r.solved = true;
      const double tw = tailwater_of(st);
      r.tailwater_m = tw;
      const bool use_tw = std::isfinite(tw) && opt_.tailwater_mode != TailwaterMode::free;
      r.hgl_m = r.egl_m = use_tw ? tw : free_level_m;
      return;
    }
    double best = -std::numeric_limits<double>::infinity();
    for (std::size_t ci : outs) {
      const auto& cr = out_.conduits[ci];
      if (!cr.solved) {
        r.solved = false;  // a level downstream is unknown: nothing upstream can be checked
        return;
      }
      const auto loss = loss_into(s, ci);
      const double level = cr.profile.inlet().egl_m + loss.loss_m;
      if (level > best) {
        best = level;
        r.governing_outflow = ci;
        r.loss_m = loss.loss_m;
        r.k_effective = loss.k_effective;
        r.loss_terms = loss.terms;
      }
    }
    r.solved = true;
    r.hgl_m = r.egl_m = best;
  }

  hydraulics::StructureLoss loss_into(std::size_t s, std::size_t outflow) {
    const auto& st = net_.structures[s];
    const auto& oc = net_.conduits[outflow];
    const auto& inlet = out_.conduits[outflow].profile.inlet();
    hydraulics::StructureLossInputs in;
    in.k_constant = structure_k(st);
    in.outflow_velocity_m_s = inlet.velocity_m_s;
    in.outflow_flow_m3_s = out_.conduits[outflow].flow_m3_s;
    in.outflow_diameter_m = hydraulics::rise_m(oc.section);
    in.outflow_depth_m = inlet.depth_m;
    in.structure_diameter_m = st.diameter_m.value_or(opt_.default_structure_diameter_m);
    in.structure_invert_m = st.invert_m.value_or(inlet.invert_m);
    in.water_level_m = inlet.egl_m;
    in.benching = opt_.benching;
    for (std::size_t ci : topo_.nodes[s].inflows) {
      const auto& c = net_.conduits[ci];
      if (!model::marched(c) || c.to != s) continue;
      hydraulics::StructureInflow f;
      f.flow_m3_s = std::isfinite(flow_[ci]) ? flow_[ci] : 0.0;
      f.diameter_m = hydraulics::rise_m(c.section);
      f.outlet_invert_m = c.invert_down_m.value_or(in.structure_invert_m);
      const double d = ci < topo_.deflection_deg.size() ? topo_.deflection_deg[ci] : nan;
      f.deflection_deg = std::isfinite(d) ? d : 0.0;
      if (c.section.diameter_m > 0.0 || c.section.width_m > 0.0) {
        const auto full = hydraulics::full_geometry(c.section);
        f.velocity_m_s = f.flow_m3_s / full.area_m2;
      }
      in.inflows.push_back(f);
    }
    std::stable_sort(in.inflows.begin(), in.inflows.end(),
                     [](const auto& a, const auto& b) { return a.flow_m3_s > b.flow_m3_s; });
    if (in.outflow_velocity_m_s <= 0.0) return {};
    try {
      return hydraulics::structure_loss(opt_.loss_method, in);
    } catch (const Error& e) {
      // The chosen method cannot be applied here (e.g. no inflow for HEC-22): fall back to K.
      out_.findings.push_back({"LOSS_FALLBACK", Severity::info, LayerRole::structures, st.id, "", nan, nan,
                               units::Dimension::dimensionless,
                               "structure " + st.id + ": the chosen loss method could not be applied (" + e.what() +
                                   "); the constant K " + q(in.k_constant, units::Dimension::dimensionless) + " was used."});
      return hydraulics::structure_loss(hydraulics::StructureLossMethod::constant_k, in);
    }
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
    auto inv_up = c.invert_up_m ? c.invert_up_m : estimate_invert(ci, c.from, true, up_source);
    auto inv_down = c.invert_down_m ? c.invert_down_m : estimate_invert(ci, c.to, false, down_source);
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
      out_.findings.push_back({"INVERT_ESTIMATED", Severity::warning, LayerRole::conduits, c.id, "", nan, nan,
                               units::Dimension::length,
                               "pipe " + c.id + " has no usable " + end + " invert; " + from +
                                   " stands in for it, so its figures and those upstream rest on an estimate."});
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
    try {
      if (r.slope > 0.0) r.capacity_m3_s = hydraulics::full_capacity_m3_s(c.roughness, c.section, r.slope);
      r.profile = hydraulics::compute_profile(reach, down.hgl_m, opt_.gvf);
      // The step points stay in the result for the whole run (drawings, outputs); growth by
      // doubling left up to half of each vector's capacity unused, most of the march's memory.
      r.profile.points.shrink_to_fit();
      r.solved = true;
    } catch (const Error& e) {
      r.note = std::string("not checked: ") + e.what();
      blocked_at(ci, r.note);
      return;
    }
    if (!r.profile.converged)
      out_.findings.push_back({"NOT_CONVERGED", Severity::warning, LayerRole::conduits, c.id, "", nan, nan,
                               units::Dimension::dimensionless,
                               "pipe " + c.id + ": the water-surface profile did not converge (" + r.profile.note +
                                   "); its figures are approximate."});
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
    out_.findings.push_back({"NOT_CHECKED", Severity::warning, LayerRole::conduits, c.id, "", nan, nan,
                             units::Dimension::dimensionless,
                             "pipe " + c.id + " was " + why + "; the structures upstream of it were not checked."});
  }

  void report_unsolved() {
    for (std::size_t s = 0; s < net_.structures.size(); ++s) {
      const auto& r = out_.structures[s];
      if (r.solved || (topo_.nodes[s].inflows.empty() && topo_.nodes[s].outflows.empty())) continue;
      const auto& st = net_.structures[s];
      out_.findings.push_back({"NOT_CHECKED", Severity::warning, LayerRole::structures, st.id, "", nan, nan,
                               units::Dimension::dimensionless,
                               "structure " + st.id + " was not checked: a pipe downstream of it could not be solved."});
    }
  }

  const model::Network& net_;
  const topology::Topology& topo_;
  const std::vector<double>& flow_;
  const MarchOptions& opt_;
  MarchResult out_;
};

}  // namespace

MarchResult march(const model::Network& network, const topology::Topology& topo, const std::vector<double>& flow_m3_s,
                  const MarchOptions& options) {
  if (flow_m3_s.size() != network.conduits.size())
    throw Error(ErrorKind::internal, "march: one design flow per conduit is needed");
  return Marcher(network, topo, flow_m3_s, options).run();
}

std::vector<BudgetItem> loss_budget(const model::Network& network, const MarchResult& result, std::size_t structure) {
  std::vector<BudgetItem> items;
  std::size_t s = structure;
  for (std::size_t guard = 0; guard <= network.conduits.size(); ++guard) {
    const auto& r = result.structures[s];
    if (!r.solved) return {};
    if (r.outfall || r.pumped) {
      items.push_back({r.pumped ? "wet_well" : "tailwater", network.structures[s].id, r.hgl_m});
      break;
    }
    const std::size_t ci = r.governing_outflow;
    const auto& cr = result.conduits[ci];
    const std::size_t down = network.conduits[ci].to;
    items.push_back({"structure", network.structures[s].id, r.loss_m});
    items.push_back({"conduit", network.conduits[ci].id, cr.profile.inlet().egl_m - cr.profile.outlet().egl_m});
    items.push_back({"exit", network.conduits[ci].id, cr.profile.outlet().egl_m - result.structures[down].egl_m});
    s = down;
  }
  std::reverse(items.begin(), items.end());
  return items;
}

}  // namespace rimline::solve
