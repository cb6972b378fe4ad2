#include "rimline/report/report_html.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>
#include <ostream>
#include <set>
#include <sstream>
#include <unordered_map>

#include "base/number_text.hpp"
#include "report/budget_html.hpp"
#include "report/budgets_csv.hpp"
#include "report/design_flows_html.hpp"
#include "report/method_text.hpp"
#include "report/html_cells.hpp"
#include "report/html_style.hpp"
#include "report/review_style.hpp"
#include "report/network_solve_html.hpp"
#include "report/pump_station_html.hpp"
#include "report/sheet_text.hpp"
#include "report/verdict.hpp"
#include "report/inputs_detail.hpp"
#include "report/results_tables.hpp"
#include "report/exception_links.hpp"
#include "report/plan_map.hpp"
#include "rimline/hydraulics/friction.hpp"
#include "rimline/method_registry.hpp"
#include "rimline/report/outputs.hpp"
#include "rimline/report/profile_svg.hpp"
#include "rimline/topology/summary.hpp"
#include "rimline/version.hpp"

namespace rimline::report {
namespace {

using units::Dimension;

std::string esc(std::string_view s) { return xml_escape(s); }

using html::row;
using html::unit;
using html::value;

std::string finding_key(const Finding& f) {
  return f.code + '\x1f' + std::to_string(static_cast<int>(f.layer)) + '\x1f' + f.feature_id + '\x1f' + f.field +
         '\x1f' + f.message;
}

std::string summary_section(const run::CheckRun& run, const std::string& date) {
  const auto& net = run.read.network;
  const auto ns = topology::summarize(net, run.topology);
  const auto sys = run.report_units;
  std::string h = "<section id=\"summary\"><h2>Job summary</h2>\n<table class=\"kv\">\n";
  h += row({"Project", esc(run.project.name)});
  h += row({"Project file", "<code>" + esc(run.project.file) + "</code>"});
  h += row({"Run date (UTC)", esc(date)});
  h += row({"rimline", esc(version_string)});
  h += row({"Report units", esc(units_text(sys))});
  h += row({"Vertical datum", esc(vertical_datum_text(run))});
  h += row({"Coordinate system", esc(net.crs_description) + (net.crs_note.empty() ? "" : " (" + esc(net.crs_note) + ")")});
  h += row({"Flow case", esc(flow_case_text(run))});
  h += row({"Network", std::to_string(ns.structures) + " structures (" + std::to_string(ns.derived_structures) +
                           " derived), " + std::to_string(ns.conduits) + " conduits (" +
                           std::to_string(ns.marched_conduits) + " marched), " + std::to_string(ns.outfalls) +
                           " outfalls, " + std::to_string(ns.diversions) + " diversions, total length " +
                           html::distance(ns.total_length_m, sys) + " " + unit(Dimension::length, sys)});
  std::map<Severity, int> by_sev;
  for (const auto& f : run.findings) ++by_sev[f.severity];
  h += row({"Findings", std::to_string(by_sev[Severity::error]) + " errors, " +
                            std::to_string(by_sev[Severity::warning]) + " warnings, " +
                            std::to_string(by_sev[Severity::info]) + " info"});
  h += "</table>\n<h3>Tailwater cases</h3>\n<table class=\"grid\">\n";
  h += row({"Case", "Tailwater (" + unit(Dimension::length, sys) + ")", "Structures solved", "Criteria findings"}, "th");
  for (const auto& c : run.cases) {
    std::size_t solved = 0;
    for (const auto& s : c.march.structures) solved += s.solved ? 1 : 0;
    h += row({esc(render_message(c.label, sys)), std::isfinite(c.tailwater_m) ? value(c.tailwater_m, Dimension::length, sys) : "free",
              std::to_string(solved) + " of " + std::to_string(c.march.structures.size()),
              std::to_string(c.criteria_count)});
  }
  h += "</table></section>\n";
  return h;
}

std::string inputs_section(const run::CheckRun& run) {
  std::string h = "<section id=\"inputs\"><h2>Inputs</h2>\n<table class=\"grid\">\n";
  h += row({"File", "SHA-256"}, "th");
  for (const auto& f : run.inputs) {
    const std::string hash = f.sha256.empty() ? "(not a file: not hashed)" : f.sha256;
    h += row({"<code>" + esc(f.path) + "</code>", "<code class=\"hash\">" + esc(hash) + "</code>"});
  }
  h += "</table>\n";
  if (!run.read.defaults_used.empty()) {
    h += "<h3>Values filled from the project defaults</h3>\n<table class=\"grid\">\n";
    h += row({"Layer", "Value", "Used for", "Examples"}, "th");
    for (const auto& d : run.read.defaults_used) {
      std::string ex;
      for (const auto& id : d.example_ids) ex += (ex.empty() ? "" : ", ") + esc(id);
      h += row({esc(layer_role_name(d.layer)), esc(render_message(d.text, run.report_units)), std::to_string(d.count), ex});
    }
    h += "</table>\n";
  }
  h += inputs_detail(run);
  h += "</section>\n";
  return h;
}

// Whether a "flows" row of the method table applies to this run's flows mode.
bool flows_row_in_use(const run::CheckRun& run, std::string_view id) {
  const auto& p = run.project;
  if (p.flow_mode == config::FlowMode::rational)
    return id == "rational" || id == "idf" || id == "travel_velocity" || id == "inlet_time" ||
           (id == "composite_c" && !p.catchments.land_use.source.empty());
  return p.flow_mode == config::FlowMode::sanitary && id == "harmon" && !p.sanitary.peaking_constant;
}

// nu in m2/s or ft2/s, four significant figures ("1.139e-06 m2/s").
std::string viscosity_text(double nu_m2_s, units::System sys) {
  const bool us = sys == units::System::us;
  std::string t;
  append_general(t, us ? nu_m2_s / (units::metres_per_foot * units::metres_per_foot) : nu_m2_s, 4);
  return t + (us ? " ft2/s" : " m2/s");
}

std::string methods_section(const run::CheckRun& run) {
  const auto sys = run.report_units;
  const std::string friction(hydraulics::friction_law_name(run.project.methods.friction));
  const std::string loss(hydraulics::structure_loss_method_name(run.march_options.loss_method));
  const auto& c = run.criteria;
  std::map<std::string, std::string> criterion_value{
      {"freeboard", value(c.freeboard_m, Dimension::length, sys) + " " + unit(Dimension::length, sys)},
      {"velocity_min", value(c.velocity_min_m_s, Dimension::velocity, sys) + " " + unit(Dimension::velocity, sys)},
      {"velocity_max", c.velocity_max_m_s ? value(*c.velocity_max_m_s, Dimension::velocity, sys) + " " +
                                                unit(Dimension::velocity, sys)
                                          : "off"},
      {"capacity_ratio_max", value(c.capacity_ratio_max, Dimension::dimensionless, sys)},
      {"cover_min", c.cover_min_m ? value(*c.cover_min_m, Dimension::length, sys) + " " + unit(Dimension::length, sys)
                                  : "off"}};
  const std::string energy = structure_energy_id(run);
  std::string h = "<section id=\"methods\"><h2>Methods and criteria</h2>\n";
  h += "<p>Structure loss default K = " + value(run.march_options.default_k, Dimension::dimensionless, sys) +
       ". Rows marked <span class=\"used\">in use</span> apply to this run.</p>\n";
  h += "<p id=\"structure-energy\"><b>Structure energy (" + esc(energy) + ").</b> " + esc(structure_energy_text(run));
  const auto own = structure_energy_exceptions(run);
  if (!own.empty()) {
    h += " Structures with their own bookkeeping:";
    for (std::size_t i = 0; i < own.size(); ++i) h += std::string(i ? "," : "") + " " + esc(own[i].first) + " (" + esc(own[i].second) + ")";
    h += ".";
  }
  h += "</p>\n<p id=\"velocity-rules\"><b>Velocity rules.</b> " + esc(velocity_rules_text(run));
  const auto bases = velocity_basis_exceptions(run);
  if (!bases.empty()) {
    h += " Pipes with their own basis:";
    for (std::size_t i = 0; i < bases.size(); ++i) h += std::string(i ? "," : "") + " " + esc(bases[i].first) + " (" + esc(bases[i].second) + ")";
    h += ".";
  }
  const bool darcy = run.project.methods.friction == hydraulics::FrictionLaw::darcy_weisbach ||
                     (!run.pump_stations.empty() && run.project.force_mains.friction == hydraulics::FrictionLaw::darcy_weisbach);
  h += "</p>\n<p id=\"water\"><b>Water.</b> Temperature " +
       fixed_text(units::from_si(run.project.methods.water_temperature_c, units::display_unit(Dimension::temperature, sys)), 1) +
       " " + unit(Dimension::temperature, sys) + ", kinematic viscosity " + viscosity_text(run.kinematic_viscosity_m2_s, sys) +
       (darcy ? " (Darcy-Weisbach's Reynolds number)." : " (not used: no Darcy-Weisbach friction in this run).") +
       "</p>\n<table class=\"grid\">\n";
  h += row({"Group", "Method", "Description", "This run", "Source"}, "th");
  for (const auto& m : method_rows()) {
    std::string here;
    if (m.group == "friction") here = m.id == friction ? "<span class=\"used\">in use</span>" : "";
    else if (m.group == "structure loss") here = m.id == loss ? "<span class=\"used\">in use</span>" : "";
    else if (m.group == "structure energy")
      here = m.id == "receiving_water" || m.id == energy || (energy == "hec22" && m.id == "whole_loss") ||
                     std::any_of(own.begin(), own.end(), [&](const auto& o) { return o.second == m.id; })
                 ? "<span class=\"used\">in use</span>"
                 : "";
    else if (m.group == "water") here = darcy ? "<span class=\"used\">in use</span>" : "";
    else if (m.group == "profile") here = "<span class=\"used\">in use</span>";
    else if (m.group == "flows") here = flows_row_in_use(run, m.id) ? "<span class=\"used\">in use</span>" : "";
    else if (m.group == "diversion split") here = m.id == run.network.split ? "<span class=\"used\">in use</span>" : "";
    else if (auto it = criterion_value.find(std::string(m.id)); it != criterion_value.end())
      here = "<span class=\"used\">" + esc(it->second) + "</span>";
    h += row({esc(m.group), esc(m.name) + " <code>" + esc(m.id) + "</code>", esc(m.description), here, esc(m.source)});
  }
  h += "</table></section>\n";
  return h;
}

// A city-wide run can hold hundreds of thousands of findings; the report lists at most this many
// per code and severity (the worst first) and exceptions.csv keeps them all. Common practice, no source.
constexpr std::size_t rows_per_code = 200;
// Past a city's first few dozen outfalls inline figures would make the page unwieldy; the rest are
// linked from the profile index (each is its own SVG file and a PDF sheet).
constexpr std::size_t max_inline_profiles = inline_profiles;

std::string finding_row(const run::CheckRun& run, const Finding& f, const FeatureLinks& links) {
  const auto sys = run.report_units;
  const bool has_value = std::isfinite(f.value) || std::isfinite(f.limit);
  const auto k = static_cast<std::size_t>(&f - run.findings.data());  // rows are findings of the run
  const bool own = k < run.findings.size();
  const std::string r = row({"<b>" + esc(f.code) + "</b>", esc(layer_role_name(f.layer)), esc(f.feature_id), esc(f.field),
                             value(f.value, f.dimension, sys), value(f.limit, f.dimension, sys),
                             has_value ? esc(unit(f.dimension, sys)) : "", esc(render_message(f.message, sys)),
                             own ? finding_links(run, links, k) : std::string()});
  return own ? "<tr id=\"exc-" + std::to_string(k) + "\"" + r.substr(3) : r;
}

std::string findings_table(const run::CheckRun& run, const std::vector<const Finding*>& list, const std::string& id,
                           bool budgets, const FeatureLinks& links) {
  std::unordered_map<std::string, std::size_t> structure_index;
  if (budgets)
    for (std::size_t s = 0; s < run.read.network.structures.size(); ++s)
      structure_index.emplace(run.read.network.structures[s].id, s);
  std::string h = "<table class=\"findings\" id=\"" + id + "\">\n<thead>" +
                  row({"Code", "Layer", "Feature", "Field", "Value", "Limit", "Unit", "Message", "Shown"}, "th") + "</thead>\n";
  for (Severity sev : {Severity::error, Severity::warning, Severity::info}) {
    std::map<std::string, std::vector<const Finding*>> by_code;
    std::size_t n = 0;
    for (const Finding* f : list)
      if (f->severity == sev) {
        by_code[f->code].push_back(f);
        ++n;
      }
    const std::string name(severity_name(sev));
    h += "<tbody class=\"sev-" + name + "\"><tr class=\"group\"><th colspan=\"9\">" + name + " (" + std::to_string(n) +
         ")</th></tr>\n";
    for (auto& [code, rows] : by_code) {
      const std::size_t total = rows.size();
      if (total > rows_per_code) {
        // The worst first, ties in list order: a partial sort on (badness, position), each badness
        // worked out once (a city has ~10^6 findings of one code; only the first rows are shown).
        std::vector<std::pair<double, std::size_t>> keyed(total);
        for (std::size_t k = 0; k < total; ++k) {
          const double b = run::badness(*rows[k]);
          keyed[k] = {std::isnan(b) ? std::numeric_limits<double>::infinity() : -b, k};  // unknown: last
        }
        std::partial_sort(keyed.begin(), keyed.begin() + static_cast<std::ptrdiff_t>(rows_per_code), keyed.end());
        std::vector<const Finding*> worst(rows_per_code);
        for (std::size_t k = 0; k < rows_per_code; ++k) worst[k] = rows[keyed[k].second];
        rows = std::move(worst);
      }
      for (const Finding* f : rows) {
        h += finding_row(run, *f, links);
        // Budgets answer "why is the HGL this high here": asked of warnings and errors, not of
        // notes such as an unknown rim (thousands of them in a municipal export).
        if (!budgets || !has_budget(*f) || run.cases.empty()) continue;
        const auto it = structure_index.find(f->feature_id);
        if (it == structure_index.end()) continue;
        std::size_t s = it->second;  // where ids repeat, the structure with the finding's fid
        if (f->fid >= 0 && run.read.network.structures[s].fid != f->fid)
          for (std::size_t t = 0; t < run.read.network.structures.size(); ++t)
            if (run.read.network.structures[t].fid == f->fid && run.read.network.structures[t].id == f->feature_id) s = t;
        const std::string b = budget_html(run, s);
        if (!b.empty()) h += "<tr class=\"budget-row\"><td></td><td colspan=\"8\">" + b + "</td></tr>\n";
      }
      if (total > rows_per_code)
        h += "<tr class=\"more\"><td colspan=\"9\">" + std::to_string(rows_per_code) + " of " +
             std::to_string(total) + " " + esc(code) + " " + name +
             "s shown, the worst first; exceptions.csv lists all of them.</td></tr>\n";
    }
    h += "</tbody>\n";
  }
  h += "</table>\n";
  return h;
}

std::string data_findings_section(const run::CheckRun& run, const std::vector<const Finding*>& data,
                                  const FeatureLinks& links) {
  std::map<std::string, int> by_code;
  for (const Finding* f : data) ++by_code[f->code];
  std::string h = "<section id=\"data-findings\"><h2>Data findings</h2>\n<p>Problems in the input data found while "
                  "reading, connecting and marching. Counts by code: ";
  std::string counts;
  for (const auto& [code, n] : by_code) counts += (counts.empty() ? "" : ", ") + esc(code) + " " + std::to_string(n);
  h += (counts.empty() ? "none" : counts) + ".</p>\n";
  h += findings_table(run, data, "data-table", false, links);
  h += "</section>\n";
  return h;
}

// A figure of a drawing, already in the report's units, with the given decimals; empty when unknown.
std::string fixed_or_empty(double v, int decimals) {
  if (!std::isfinite(v)) return "";
  return fixed_text(v, decimals);
}

// One row per drawing, so a reviewer sees where the tightest freeboard of each path is.
std::string profile_index(const std::vector<RenderedProfile>& profiles, units::System sys) {
  const std::string u = unit(Dimension::length, sys);
  const int level_decimals = display_decimals(Dimension::length, sys, 0.0);
  const int distance_decimals = sys == units::System::us ? 0 : 1;
  std::string h = "<table class=\"grid\" id=\"profile-index\">\n";
  h += row({"Profile", "Path and case", "Length (" + u + ")", "Structures", "Least freeboard (" + u + ")", "At",
            "Findings marked"},
           "th");
  for (std::size_t k = 0; k < profiles.size(); ++k) {
    const auto& p = profiles[k];
    const std::string target = k < max_inline_profiles ? "#figure-" + esc(p.name) : "profiles/" + esc(p.name) + ".svg";
    h += row({"<a href=\"" + target + "\">" + esc(p.name) + "</a>", esc(p.caption), fixed_or_empty(p.length, distance_decimals),
              std::to_string(p.structures), fixed_or_empty(p.least_freeboard, level_decimals), esc(p.least_freeboard_at),
              std::to_string(p.findings)});
  }
  h += "</table>\n";
  return h;
}

std::string profiles_section(const std::vector<RenderedProfile>& profiles, bool pdf_written, units::System sys,
                             const std::string& selection) {
  std::string h = "<section id=\"profiles\"><h2>Profiles</h2>\n<p>" + esc(selection) +
                  (selection.empty() ? "" : " ") + "Station 0 at the outfall, increasing upstream. ";
  h += pdf_written ? "Every profile is also a sheet of <a href=\"profiles.pdf\">profiles.pdf</a> (A3 landscape)."
                   : "No PDF was written.";
  h += "</p>\n";
  if (profiles.size() > max_inline_profiles)
    h += "<p>The first " + std::to_string(max_inline_profiles) + " of " + std::to_string(profiles.size()) +
         " profiles are shown below; every profile is linked from the index.</p>\n";
  if (profiles.empty()) h += "<p>No path with a pipe was found: no profile drawn.</p>\n";
  else h += profile_index(profiles, sys);
  for (std::size_t k = 0; k < profiles.size() && k < max_inline_profiles; ++k) {
    const auto& p = profiles[k];
    h += "<figure class=\"profile-figure\" id=\"figure-" + esc(p.name) + "\">\n" + p.svg + "<figcaption>Profile " +
         esc(p.name) + ": " + esc(p.caption) + " (<a href=\"profiles/" + esc(p.name) + ".svg\">SVG</a>)</figcaption>\n</figure>\n";
  }
  h += "</section>\n";
  return h;
}

}  // namespace

void write_report_html(std::ostream& out, const run::CheckRun& run, const std::vector<RenderedProfile>& profiles,
                       const std::string& date, bool pdf_written, const std::string& selection,
                       const Findings* output_findings, const std::string& more_sections) {
  std::vector<const Finding*> criteria, data;
  if (run.data_finding.size() == run.findings.size()) {
    for (std::size_t k = 0; k < run.findings.size(); ++k) (run.data_finding[k] ? data : criteria).push_back(&run.findings[k]);
  } else {  // a run assembled by hand: tell the two apart by content
    std::set<std::string> data_keys;
    for (const auto& f : run.data_findings) data_keys.insert(finding_key(f));
    for (const auto& f : run.findings) (data_keys.count(finding_key(f)) ? data : criteria).push_back(&f);
  }
  if (output_findings)
    for (const auto& f : *output_findings) data.push_back(&f);

  // Written a section at a time: the page of a city's run is ~22 MB, and built as one string it
  // held ~0.1 GB at once (its growth and the sections appended to it).
  std::string h = "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>rimline review: " +
                  esc(run.project.name) + "</title>\n<style>\n" + std::string(report_css) + review_css + "</style>\n</head>\n<body>\n";
  h += "<header><div class=\"mark\">rimline</div><h1>Hydraulic grade line review: " + esc(run.project.name) +
       "</h1>\n<p class=\"caution\" id=\"caution-top\">" + esc(caution) + "</p></header>\n<main>\n";
  // The sections a later stage adds (src/connections) are linked when present.
  const auto linked = [&more_sections](const char* id, const char* label) {
    return more_sections.find("<section id=\"" + std::string(id) + "\"") == std::string::npos
               ? std::string()
               : "<a href=\"#" + std::string(id) + "\">" + label + "</a> ";
  };
  h += "<nav><a href=\"#verdict\">Verdict</a> <a href=\"#plan\">Plan</a> <a href=\"#summary\">Summary</a> " +
       linked("proposal", "Proposal") + linked("headroom", "Connection headroom") +
       "<a href=\"#inputs\">Inputs</a> <a href=\"#methods\">Methods</a> "
       "<a href=\"#exceptions\">Exceptions</a> " +
       std::string(run.pump_stations.empty() ? "" : "<a href=\"#pump-stations\">Pump stations</a> ") +
       "<a href=\"#results\">Results</a> <a href=\"#profiles\">Profiles</a> <a href=\"#data-findings\">Data findings</a>" +
       std::string(run.catchment_flows ? " <a href=\"#design-flows\">Design flows</a>" : "") + "</nav>\n";
  const FeatureLinks links(run, profiles);
  out << h << verdict_section(run);
  write_plan_map_section(out, run, links);
  out << summary_section(run, date) << more_sections << inputs_section(run) << methods_section(run) << design_flows_section(run)
      << network_solve_section(run);
  out << "<section id=\"exceptions\"><h2>Exception list</h2>\n<p>Design criteria not met, worst case over the "
         "tailwater cases, by severity. A structure warning or error opens to its energy budget down to the "
         "outfall: the " + std::to_string(budget_rows_shown) + " terms nearest the structure, the rest summarised in one "
         "row; budgets.csv holds every term, each once where budgets share their route.</p>\n";
  out << findings_table(run, criteria, "exception-table", true, links) << "</section>\n";
  out << pump_stations_section(run);
  out << results_tables_section(run, links);
  out << profiles_section(profiles, pdf_written, run.report_units, selection);
  out << data_findings_section(run, data, links);
  out << "</main>\n<footer><p class=\"caution\" id=\"caution\">" << esc(caution)
      << "</p></footer>\n<script>" << sortable_script << "</script>\n</body>\n</html>\n";
}

std::string report_html(const run::CheckRun& run, const std::vector<RenderedProfile>& profiles,
                        const std::string& date, bool pdf_written, const std::string& selection) {
  std::ostringstream out;
  write_report_html(out, run, profiles, date, pdf_written, selection);
  return std::move(out).str();
}

}  // namespace rimline::report
