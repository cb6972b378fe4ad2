#include "report/budgets_csv.hpp"

#include <cmath>
#include <map>
#include <set>
#include <string>
#include <tuple>
#include <unordered_map>

#include "report/csv_cell.hpp"
#include "rimline/report/outputs.hpp"
#include "rimline/solve/march.hpp"

namespace rimline::report {
namespace {

std::string cell(const std::string& s) { return csv_cell(s); }

std::string num(double si, units::Dimension d, units::System sys) {
  return std::isfinite(si) ? display_number(si, d, sys) : std::string();
}

}  // namespace

bool has_budget(const Finding& f) { return f.layer == LayerRole::structures && f.severity != Severity::info; }

void write_budgets_csv(const run::CheckRun& run, std::ostream& out) {
  const auto sys = run.report_units;
  const auto& net = run.read.network;
  const std::string u = std::string(units::unit_symbol(units::display_unit(units::Dimension::length, sys)));
  const std::string uv = std::string(units::unit_symbol(units::display_unit(units::Dimension::velocity, sys)));
  out << "budget,fid,case,step,item,feature_id,how,k,velocity_" << uv << ",velocity_head_" << u << ",length_" << u
      << ",head_" << u << ",level_" << u << '\n';
  if (run.cases.empty()) return;
  // The structures whose budget is listed, once each, in the order of the findings.
  std::unordered_multimap<std::string, std::size_t> by_id;
  for (std::size_t s = 0; s < net.structures.size(); ++s) by_id.emplace(net.structures[s].id, s);
  std::vector<std::size_t> wanted;
  std::set<std::size_t> seen;
  for (const auto& f : run.findings) {
    if (!has_budget(f)) continue;
    const auto [lo, hi] = by_id.equal_range(f.feature_id);
    for (auto it = lo; it != hi; ++it)
      if ((f.fid < 0 || net.structures[it->second].fid == f.fid) && seen.insert(it->second).second)
        wanted.push_back(it->second);
  }
  // A term already written: (case, step, item, feature, level up to it) -> the budget that holds it.
  using Key = std::tuple<std::size_t, std::size_t, std::string, std::string, double>;
  std::map<Key, std::string> written;
  for (const std::size_t s : wanted) {
    const std::size_t k = run.envelope_structure_case.empty() ? 0 : run.envelope_structure_case[s];
    const auto& march = run.cases[k].march;
    if (!march.structures[s].solved) continue;
    const auto items = solve::loss_budget(net, march, s);
    std::vector<double> level(items.size());
    for (std::size_t i = 0; i < items.size(); ++i) level[i] = (i ? level[i - 1] : 0.0) + items[i].head_m;
    // The deepest term from the outfall up that an earlier budget already wrote: the route from
    // there down is the same (a tree has one way to its outfall).
    std::size_t shared = 0;
    std::string shared_with;
    for (std::size_t i = items.size(); i-- > 0;)
      if (const auto it = written.find(Key{k, i, items[i].kind, items[i].feature_id, level[i]}); it != written.end()) {
        shared = i + 1, shared_with = it->second;
        break;
      }
    const auto& st = net.structures[s];
    const std::string name = cell(st.id), fid = st.fid >= 0 ? std::to_string(st.fid) : "";
    const std::string kase = cell(render_message(run.cases[k].label, sys));
    for (std::size_t i = items.size(); i-- > shared;) {  // from the structure down, as a reviewer reads it
      const auto& it = items[i];
      written.emplace(Key{k, i, it.kind, it.feature_id, level[i]}, st.id);
      out << name << ',' << fid << ',' << kase << ',' << i + 1 << ',' << cell(it.kind) << ',' << cell(it.feature_id)
          << ',' << cell(it.basis) << ',' << num(it.k, units::Dimension::dimensionless, sys) << ','
          << num(it.velocity_m_s, units::Dimension::velocity, sys) << ','
          << num(it.velocity_head_m, units::Dimension::length, sys) << ','
          << (std::isfinite(it.length_m) ? distance_number(it.length_m, sys) : std::string()) << ','
          << num(it.head_m, units::Dimension::length, sys) << ',' << num(level[i], units::Dimension::length, sys)
          << '\n';
    }
    if (shared > 0)
      out << name << ',' << fid << ',' << kase << ',' << shared << ",continues," << cell(shared_with) << ','
          << cell("the terms from step " + std::to_string(shared) + " down to the outfall are those of the budget of " +
                  shared_with)
          << ",,,,,," << num(level[shared - 1], units::Dimension::length, sys) << '\n';
  }
}

}  // namespace rimline::report
