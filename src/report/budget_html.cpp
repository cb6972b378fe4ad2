#include "report/budget_html.hpp"

#include <cmath>
#include <cstdio>

#include "report/budgets_csv.hpp"
#include "report/html_cells.hpp"
#include "rimline/report/outputs.hpp"
#include "rimline/report/profile_svg.hpp"
#include "rimline/solve/march.hpp"

namespace rimline::report {
namespace {

using html::row;
using html::unit;
using html::value;
using units::Dimension;

std::string esc(std::string_view s) { return xml_escape(s); }

// What the HGL in a structure is made of, summed over its budget's terms.
struct Shares {
  double start_m = 0.0;      // the level at the outfall (or the wet well's level)
  double structures_m = 0.0; // K V^2/2g terms
  double friction_m = 0.0;   // EGL drop along the pipes (friction and any jump's loss)
  double exits_m = 0.0;      // from a pipe's outlet energy to the level below (negative where a pipe falls freely)
};

Shares shares_of(const std::vector<solve::BudgetItem>& items) {
  Shares s;
  for (const auto& it : items) {
    if (it.kind == "structure") s.structures_m += it.head_m;
    else if (it.kind == "conduit") s.friction_m += it.head_m;
    else if (it.kind == "exit") s.exits_m += it.head_m;
    else s.start_m += it.head_m;
  }
  return s;
}

std::string percent(double part, double whole) {
  return std::to_string(static_cast<long>(std::lround(100.0 * part / whole))) + "&#160;%";
}

// One sentence: HGL = start + losses, and, when the outfall's invert is known and below the HGL,
// each part's share of the height above it.
std::string shares_sentence(const run::CheckRun& run, const std::vector<solve::BudgetItem>& items, double hgl_m,
                            const std::string& outfall_id) {
  const auto sys = run.report_units;
  const std::string u = " " + unit(Dimension::length, sys);
  const Shares s = shares_of(items);
  const double losses = s.structures_m + s.friction_m + s.exits_m;
  const bool wet_well = !items.empty() && items.front().kind == "wet_well";
  std::string h = "<p class=\"budget-shares\">HGL " + value(hgl_m, Dimension::length, sys) + u + " = " +
                  (wet_well ? "the wet well's level " : "the level at the outfall ") + esc(outfall_id) + " " +
                  value(s.start_m, Dimension::length, sys) + u + " + losses " + value(losses, Dimension::length, sys) +
                  u + " (structures " + value(s.structures_m, Dimension::length, sys) + u + ", pipe friction " +
                  value(s.friction_m, Dimension::length, sys) + u + ", exits and drops " +
                  value(s.exits_m, Dimension::length, sys) + u + ").";
  const auto& net = run.read.network;
  double invert = std::nan("");
  for (const auto& st : net.structures)
    if (st.id == outfall_id && st.invert_m) {
      invert = *st.invert_m;
      break;
    }
  const double height = hgl_m - invert;
  if (std::isfinite(height) && height > 0.0 && s.start_m >= invert)
    h += " Of its height above " + esc(outfall_id) + "'s invert (" + value(invert, Dimension::length, sys) + u + "), " +
         (wet_well ? "the wet well's level" : "the tailwater") + " accounts for " + percent(s.start_m - invert, height) +
         " and the losses for " + percent(losses, height) + ".";
  return h + "</p>\n";
}

// Friction slope of a pipe's term: its EGL drop less any jump's loss, over its length.
std::string friction_slope(const solve::BudgetItem& it) {
  if (it.kind != "conduit" || !(it.length_m > 0.0)) return "";
  const double sf = (it.head_m - it.jump_m) / it.length_m;
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.5f", sf);
  return buf;
}

}  // namespace

std::string budget_html(const run::CheckRun& run, std::size_t s) {
  const auto sys = run.report_units;
  const std::size_t k = run.envelope_structure_case.empty() ? 0 : run.envelope_structure_case[s];
  const auto& march = run.cases[k].march;
  if (!march.structures[s].solved) return "";
  const auto items = solve::loss_budget(run.read.network, march, s);
  if (items.empty()) return "";
  const double hgl = march.structures[s].hgl_m;
  const std::string u = unit(Dimension::length, sys), uv = unit(Dimension::velocity, sys);
  // open: the budget is the reason the row is there, and it prints with the page.
  std::string h = "<details open class=\"budget\"><summary>Energy budget to the outfall (" +
                  esc(render_message(run.cases[k].label, sys)) + ")</summary>\n" +
                  shares_sentence(run, items, hgl, items.front().feature_id) + "<table class=\"budget\">\n";
  h += row({"Item", "Feature", "How", "K", "V (" + uv + ")", "V&#178;/2g (" + u + ")", "Length (" + u + ")",
            "Friction slope", "Head (" + u + ")", "Level (" + u + ")"},
           "th");
  // Bounded (issue 18, defect 9): the terms nearest the structure, the rest one summary row; the
  // whole budget, shared with the others along its route, is in budgets.csv.
  // (A summary row in place of a single term would hide nothing.)
  const std::size_t first_shown = items.size() > budget_rows_shown + 1 ? items.size() - budget_rows_shown : 0;
  double level = 0.0;
  for (std::size_t i = 0; i < first_shown; ++i) level += items[i].head_m;
  if (first_shown > 0)
    h += "<tr class=\"summarised\"><td colspan=\"8\">" + esc(items[0].kind) + " and the next " +
         std::to_string(first_shown - 1) + " terms down the route, from " + esc(items[first_shown - 1].feature_id) +
         " to the outfall (every term: budgets.csv, budget " + esc(run.read.network.structures[s].id) + ")</td><td>" +
         value(level, Dimension::length, sys) + "</td><td>" + value(level, Dimension::length, sys) + "</td></tr>\n";
  for (std::size_t i = first_shown; i < items.size(); ++i) {
    const auto& it = items[i];
    level += it.head_m;
    std::string how = it.basis;
    if (it.jump_m > 0.0) how += "; jump " + value(it.jump_m, Dimension::length, sys) + " " + u;
    h += row({esc(it.kind), esc(it.feature_id), esc(how), value(it.k, Dimension::dimensionless, sys),
              value(it.velocity_m_s, Dimension::velocity, sys), value(it.velocity_head_m, Dimension::length, sys),
              html::distance(it.length_m, sys), friction_slope(it), value(it.head_m, Dimension::length, sys),
              value(level, Dimension::length, sys)});
  }
  auto total = [&](const std::string& label, double v) {
    return "<tr class=\"total\"><td colspan=\"9\">" + label + "</td><td>" + value(v, Dimension::length, sys) +
           "</td></tr>\n";
  };
  h += total("HGL in the structure (its energy level)", hgl);
  // How the level stands against the ground: the figures the verdict is made of.
  const auto& st = run.read.network.structures[s];
  if (st.rim_m) {
    const double freeboard = *st.rim_m - hgl;
    const double required = run::required_freeboard_m(run, s);
    h += total("Rim", *st.rim_m);
    h += total("Freeboard (rim &#8722; HGL)", freeboard);
    if (std::isfinite(required)) {
      h += total("Required freeboard", required);
      h += total(freeboard < required ? "Shortfall (freeboard &#8722; required)" : "Margin (freeboard &#8722; required)",
                 freeboard - required);
    }
  }
  h += "</table></details>";
  return h;
}

}  // namespace rimline::report
