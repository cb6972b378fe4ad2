// The verdict at the top of report.html (verdict.hpp): what decides a permit, per case, first.
#include "report/verdict.hpp"

#include <algorithm>
#include <cmath>
#include <map>

#include "report/html_cells.hpp"
#include "report/sheet_text.hpp"
#include "rimline/checks/checks.hpp"
#include "rimline/report/outputs.hpp"
#include "rimline/report/profile_svg.hpp"

namespace rimline::report {
namespace {

using units::Dimension;

// A feature list in a sentence stays readable: the worst few, then how many more.
constexpr std::size_t listed_per_case = 8;

std::string esc(std::string_view s) { return xml_escape(s); }

std::string length_text(double m, units::System sys) {
  return display_number(m, Dimension::length, sys) + " " + html::unit(Dimension::length, sys);
}

void worst_first(std::vector<Shortfall>& v) {
  std::stable_sort(v.begin(), v.end(), [](const Shortfall& a, const Shortfall& b) { return a.short_by_m > b.short_by_m; });
}

// "T-04 short by 0.012 m, T-05 by 0.010 m, and 3 more" / "P-T01 0.400 m above the crown, ...".
std::string feature_list(const std::vector<Shortfall>& list, bool freeboard, units::System sys) {
  std::string t;
  for (std::size_t k = 0; k < list.size() && k < listed_per_case; ++k) {
    const auto& s = list[k];
    t += (k ? ", " : "") + s.id;
    if (freeboard && s.flooded) t += " flooded (HGL above the rim; short by " + length_text(s.short_by_m, sys) + ")";
    else if (freeboard) t += (k ? " by " : " short by ") + length_text(s.short_by_m, sys);
    else t += (k ? " " : " HGL ") + length_text(s.short_by_m, sys) + (k ? "" : " above the crown");
  }
  if (list.size() > listed_per_case) t += ", and " + std::to_string(list.size() - listed_per_case) + " more";
  return t;
}

}  // namespace

std::vector<CaseVerdict> case_verdicts(const run::CheckRun& run) {
  const auto& net = run.read.network;
  std::vector<CaseVerdict> out;
  for (const auto& c : run.cases) {
    CaseVerdict v;
    v.label = c.label;
    for (std::size_t s = 0; s < net.structures.size() && s < c.march.structures.size(); ++s) {
      const auto& r = c.march.structures[s];
      if (!r.solved) {
        ++v.structures_not_solved;
        continue;
      }
      if (r.outfall || r.pumped) continue;  // receiving water: its level is given, not a result
      if (!net.structures[s].rim_m) {
        v.rim_unknown.push_back(net.structures[s].id);
        continue;
      }
      const double fb = *net.structures[s].rim_m - r.hgl_m;
      const double required = run::required_freeboard_m(run, s);
      if (fb < required) v.freeboard.push_back({net.structures[s].id, required - fb, fb < 0.0});
    }
    for (std::size_t p = 0; p < net.conduits.size() && p < c.march.conduits.size(); ++p) {
      const auto& r = c.march.conduits[p];
      if (!r.solved || net.conduits[p].force_main) continue;
      const auto sur = checks::surcharge_of(net.conduits[p], r);
      if (sur.surcharged) v.surcharged.push_back({net.conduits[p].id, std::max(sur.crown_excess_m, 0.0), false});
    }
    worst_first(v.freeboard);
    worst_first(v.surcharged);
    out.push_back(std::move(v));
  }
  return out;
}

std::string verdict_sentence(const run::CheckRun& run, const std::vector<CaseVerdict>& cases, bool freeboard) {
  const auto sys = run.report_units;
  const std::string what = freeboard ? "freeboard" : "the surcharge criterion";
  std::string fails, meets;
  for (const auto& c : cases) {
    const auto& list = freeboard ? c.freeboard : c.surcharged;
    const std::string label = render_message(c.label, sys);
    if (list.empty()) {
      meets += (meets.empty() ? "" : ", ") + label;
      continue;
    }
    fails += (fails.empty() ? "does not meet " + what + " at " : "; at ") + label + ": " +
             feature_list(list, freeboard, sys) + " (" + std::to_string(list.size()) +
             (freeboard ? (list.size() == 1 ? " structure)" : " structures)") : (list.size() == 1 ? " pipe)" : " pipes)"));
  }
  if (fails.empty()) return cases.empty() ? "not checked (no case was marched)" : "meets " + what + " at " + meets;
  return fails + (meets.empty() ? "" : "; meets it at " + meets);
}

std::string verdict_section(const run::CheckRun& run) {
  const auto sys = run.report_units;
  const auto cases = case_verdicts(run);
  std::size_t failing_cases = 0;
  for (const auto& c : cases) {
    failing_cases += c.freeboard.empty() ? 0 : 1;
  }
  // Criteria that do not depend on the tailwater (velocity, capacity, cover, pump stations), and
  // errors of any kind: what else a reviewer must weigh, by code.
  std::map<std::string, std::vector<std::string>> errors, others;
  for (std::size_t k = 0; k < run.findings.size(); ++k) {
    const Finding& f = run.findings[k];
    if (f.code == "FREEBOARD" || f.code == "FLOODED" || f.code == "SURCHARGED" || f.code == "RIM_UNKNOWN") continue;
    const bool data = k < run.data_finding.size() && run.data_finding[k];
    if (f.severity == Severity::error) errors[f.code].push_back(f.feature_id);
    else if (f.severity == Severity::warning && !data) others[f.code].push_back(f.feature_id);
  }
  const bool errors_elsewhere = !errors.empty();
  const bool fails = failing_cases > 0 || errors_elsewhere;

  std::string h = "<section id=\"verdict\"><h2>Verdict</h2>\n";
  h += std::string("<p class=\"verdict-head ") + (fails ? "fails" : "meets") + "\" id=\"verdict-head\"><b>";
  if (cases.empty()) h += "Not checked: no tailwater case was marched.";
  else if (failing_cases > 0)
    h += "Does not meet the freeboard criterion in " + std::to_string(failing_cases) + " of " +
         std::to_string(cases.size()) + (cases.size() == 1 ? " tailwater case." : " tailwater cases.");
  else if (errors_elsewhere) h += "Meets the freeboard criterion in every tailwater case; errors below decide too.";
  else h += "Meets the freeboard criterion in every tailwater case.";
  h += "</b> Flow case: " + esc(flow_case_text(run)) + ". Errors decide a permit; warnings are for the reviewer "
       "to weigh; notes inform (severities in the README).</p>\n<ul class=\"verdict\">\n";
  h += "<li id=\"verdict-freeboard\"><b>Freeboard</b> (the HGL at least " +
       esc(length_text(run.criteria.freeboard_m, sys)) + " below the rim" +
       (run.overrides.structures.empty() ? "" : ", or the structure's own requirement") +
       "; error): " + esc(verdict_sentence(run, cases, true)) + ".</li>\n";
  h += "<li id=\"verdict-surcharge\"><b>Surcharge</b> (the HGL at or below the crown; warning: allowed where the "
       "freeboard holds, unless the approving authority forbids surcharge at the design flow): " +
       esc(verdict_sentence(run, cases, false)) + ".</li>\n";
  auto code_list = [](const std::map<std::string, std::vector<std::string>>& m) {
    std::string t;
    for (const auto& [code, ids] : m) {
      t += (t.empty() ? "" : "; ") + code + " at ";
      for (std::size_t k = 0; k < ids.size() && k < listed_per_case; ++k) t += (k ? ", " : "") + ids[k];
      if (ids.size() > listed_per_case) t += ", and " + std::to_string(ids.size() - listed_per_case) + " more";
    }
    return t;
  };
  if (errors_elsewhere)
    h += "<li id=\"verdict-errors\"><b>Other errors</b>: " + esc(code_list(errors)) + ".</li>\n";
  h += "<li id=\"verdict-other\"><b>Other criteria</b> (velocity, capacity, cover, pump stations; warnings, the "
       "worst case): " + (others.empty() ? std::string("all met") : esc(code_list(others))) + ".</li>\n";
  std::string unchecked;
  if (!cases.empty()) {
    std::size_t not_solved = 0;
    for (const auto& c : cases) not_solved = std::max(not_solved, c.structures_not_solved);
    const auto& rims = cases.front().rim_unknown;
    if (!rims.empty()) {
      unchecked = std::to_string(rims.size()) + (rims.size() == 1 ? " structure" : " structures") +
                  " without a rim (";
      for (std::size_t k = 0; k < rims.size() && k < listed_per_case; ++k) unchecked += (k ? ", " : "") + rims[k];
      unchecked += rims.size() > listed_per_case ? ", …)" : ")";
    }
    if (not_solved > 0)
      unchecked += (unchecked.empty() ? "" : "; ") + std::to_string(not_solved) +
                   " structures the march did not reach";
  }
  h += "<li id=\"verdict-unchecked\"><b>Not checked</b>: " + (unchecked.empty() ? std::string("nothing") : esc(unchecked)) +
       ".</li>\n</ul>\n";
  // One row per case: the figures behind the sentences.
  h += "<table class=\"grid\" id=\"verdict-table\">\n" +
       html::row({"Case", "Structures short of freeboard", "Flooded", "Greatest shortfall (" +
                  html::unit(Dimension::length, sys) + ")", "Surcharged pipes"}, "th");
  for (const auto& c : cases) {
    std::size_t flooded = 0;
    for (const auto& s : c.freeboard) flooded += s.flooded ? 1 : 0;
    h += html::row({esc(render_message(c.label, sys)), std::to_string(c.freeboard.size()), std::to_string(flooded),
                    c.freeboard.empty() ? "" : esc(c.freeboard.front().id) + " " +
                                                   display_number(c.freeboard.front().short_by_m, Dimension::length, sys),
                    std::to_string(c.surcharged.size())});
  }
  h += "</table></section>\n";
  return h;
}

}  // namespace rimline::report
