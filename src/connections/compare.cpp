#include "rimline/connections/compare.hpp"

#include <algorithm>
#include <cmath>
#include <unordered_map>

#include "rimline/checks/checks.hpp"

namespace rimline::connections {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();

std::string key_of(const Finding& f) {
  return std::string(layer_role_name(f.layer)) + '\t' + f.feature_id + '\t' + question_of(f.code);
}

int change_order(Change c) {
  switch (c) {
    case Change::new_exception: return 0;
    case Change::worsened: return 1;
    case Change::resolved: return 2;
    case Change::improved: return 3;
    case Change::unchanged: return 4;
  }
  return 5;
}

// Envelope HGL of each structure (by id): the highest over the cases.
std::unordered_map<std::string, std::size_t> structure_index(const run::CheckRun& run) {
  std::unordered_map<std::string, std::size_t> out;
  const auto& st = run.read.network.structures;
  for (std::size_t s = 0; s < st.size(); ++s) out.emplace(st[s].id, s);
  return out;
}

double envelope_hgl(const run::CheckRun& run, std::size_t s) {
  if (run.cases.empty()) return nan;
  const auto& r = run.cases[run.envelope_structure_case[s]].march.structures[s];
  return r.solved ? r.hgl_m : nan;
}

}  // namespace

std::string_view change_name(Change c) {
  switch (c) {
    case Change::new_exception: return "new";
    case Change::worsened: return "worsened";
    case Change::unchanged: return "unchanged";
    case Change::improved: return "improved";
    case Change::resolved: return "resolved";
  }
  return "unchanged";
}

bool compared_code(const std::string& code) {
  return code == "FLOODED" || code == "FREEBOARD" || code == "SURCHARGED" || code == "VELOCITY_LOW" ||
         code == "VELOCITY_HIGH" || code == "CAPACITY" || code == "COVER";
}

std::string question_of(const std::string& code) { return code == "FLOODED" ? "FREEBOARD" : code; }

double tolerance_of(const Finding& f, const config::ComparisonSettings& settings) {
  switch (f.dimension) {
    case units::Dimension::length: return settings.level_tolerance_m;
    case units::Dimension::velocity: return settings.velocity_tolerance_m_s;
    default: return settings.ratio_tolerance;
  }
}

ExceptionSet exceptions_of(const run::CheckRun& run, const config::ComparisonSettings& settings) {
  ExceptionSet out;
  const auto ignored = [&settings](const std::string& code) {
    return std::find(settings.ignore_codes.begin(), settings.ignore_codes.end(), code) != settings.ignore_codes.end();
  };
  for (const auto& c : run.cases) {
    for (auto& f : checks::run_checks(run.read.network, c.march, run.criteria, run.overrides)) {
      if (!compared_code(f.code) || ignored(f.code) || ignored(question_of(f.code))) continue;
      const std::string key = key_of(f);
      const auto it = out.find(key);
      if (it == out.end()) out.emplace(key, Exception{std::move(f), c.label});
      else if (run::badness(f) > run::badness(it->second.finding)) it->second = Exception{std::move(f), c.label};
    }
  }
  return out;
}

Comparison compare_runs(const run::CheckRun& base, const run::CheckRun& proposed,
                        const config::ComparisonSettings& settings, const std::string& proposal_name) {
  Comparison cmp;
  cmp.proposal_name = proposal_name;
  cmp.settings = settings;
  const ExceptionSet before = exceptions_of(base, settings), after = exceptions_of(proposed, settings);
  auto add = [&cmp, &settings](const Exception* b, const Exception* a) {
    ExceptionChange ch;
    const Finding& any = a ? a->finding : b->finding;
    ch.layer = any.layer;
    ch.feature_id = any.feature_id;
    ch.question = question_of(any.code);
    if (b) ch.before = *b;
    if (a) ch.after = *a;
    if (!b) ch.change = Change::new_exception;
    else if (!a) ch.change = Change::resolved;
    else {
      const double d = run::badness(a->finding) - run::badness(b->finding), tol = tolerance_of(any, settings);
      ch.change = d > tol ? Change::worsened : d < -tol ? Change::improved : Change::unchanged;
    }
    ++cmp.counts[ch.change];
    cmp.exceptions.push_back(std::move(ch));
  };
  for (const auto& [key, b] : before) {
    const auto it = after.find(key);
    add(&b, it == after.end() ? nullptr : &it->second);
  }
  for (const auto& [key, a] : after)
    if (!before.count(key)) add(nullptr, &a);
  std::stable_sort(cmp.exceptions.begin(), cmp.exceptions.end(), [](const auto& x, const auto& y) {
    return change_order(x.change) < change_order(y.change);
  });

  const auto base_index = structure_index(base);
  const auto& net = proposed.read.network;
  for (std::size_t s = 0; s < net.structures.size(); ++s) {
    StructureChange sc;
    sc.id = net.structures[s].id;
    sc.structure = s;
    sc.fid = net.structures[s].fid;
    sc.hgl_after_m = envelope_hgl(proposed, s);
    sc.added = net.structures[s].proposed;
    if (sc.added) cmp.added_structures.push_back(sc.id);
    if (const auto it = base_index.find(sc.id); it != base_index.end()) sc.hgl_before_m = envelope_hgl(base, it->second);
    const auto rim = net.structures[s].rim_m;
    if (rim) sc.freeboard_before_m = *rim - sc.hgl_before_m, sc.freeboard_after_m = *rim - sc.hgl_after_m;
    const double rise = sc.hgl_change_m();
    if (std::isfinite(rise) && rise > cmp.largest_rise_m) cmp.largest_rise_m = rise, cmp.largest_rise_at = sc.id;
    cmp.structures.push_back(sc);
  }

  for (const auto& c : net.conduits)
    if (c.proposed) cmp.added_pipes.push_back(c.id);

  const std::size_t bad = cmp.counts[Change::new_exception] + cmp.counts[Change::worsened];
  cmp.acceptable = bad == 0;
  std::string v;
  if (cmp.acceptable) {
    v = "no new or worsened exception";
  } else {
    auto count = [](std::size_t n, const char* what) { return std::to_string(n) + " " + what; };
    v = count(cmp.counts[Change::new_exception], "new") + " and " +
        count(cmp.counts[Change::worsened], cmp.counts[Change::worsened] == 1 ? "worsened exception" : "worsened exceptions");
    std::string first;
    for (const auto& e : cmp.exceptions)
      if (e.change == Change::new_exception || e.change == Change::worsened) {
        first = " (first: " + e.after->finding.code + " at " + e.feature_id + ")";
        break;
      }
    v += first;
  }
  const auto L = units::Dimension::length;
  if (cmp.largest_rise_m > settings.level_tolerance_m)
    v += "; largest HGL rise " + q(cmp.largest_rise_m, L) + " at " + cmp.largest_rise_at;
  else
    v += "; no HGL rises by more than " + q(settings.level_tolerance_m, L);
  cmp.verdict = v + " (changes within " + q(settings.level_tolerance_m, L) + " count as none)";
  return cmp;
}

}  // namespace rimline::connections
