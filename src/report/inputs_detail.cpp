#include "report/inputs_detail.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <set>

#include "report/html_cells.hpp"
#include "rimline/report/profile_svg.hpp"

namespace rimline::report {
namespace {

using units::Dimension;
using html::row;
using html::unit;
using html::value;

std::string esc(std::string_view s) { return xml_escape(s); }

constexpr std::size_t listed = 60;  // own-K structures and outfall fields listed by name; the rest counted

std::string mode_text(config::TailwaterMode m) {
  switch (m) {
    case config::TailwaterMode::fixed: return "fixed: the level given, at every outfall";
    case config::TailwaterMode::free: return "free: each outfall pipe discharges at its own free-outlet level (critical or normal depth)";
    case config::TailwaterMode::higher: return "higher: the higher of the level given and the free-outlet level, per outfall";
  }
  return "";
}

std::string k_section(const run::CheckRun& run) {
  const auto sys = run.report_units;
  const auto& net = run.read.network;
  std::string h = "<h3 id=\"inputs-k\">Structure loss K</h3>\n<table class=\"grid\">\n" +
                  row({"Structure type", "K", "Structures of this type"}, "th");
  std::map<std::string, std::size_t> by_type;
  for (const auto& s : net.structures) ++by_type[std::string(model::structure_kind_name(s.kind))];
  std::set<std::string> shown;
  for (const auto& [type, k] : run.march_options.k_by_type) {
    h += row({esc(type), value(k, Dimension::dimensionless, sys), std::to_string(by_type[type])});
    shown.insert(type);
  }
  for (const auto& [type, n] : by_type)
    if (!shown.count(type))
      h += row({esc(type), value(run.march_options.default_k, Dimension::dimensionless, sys) + " (default)", std::to_string(n)});
  h += "</table>\n";
  std::vector<std::pair<std::string, double>> own;
  for (const auto& s : net.structures)
    if (s.loss_k) own.emplace_back(s.id, *s.loss_k);
  if (own.empty()) {
    h += "<p>No structure has its own K (the structure layer's K field is not mapped or empty): every structure "
         "takes the K of its type.</p>\n";
  } else {
    h += "<p id=\"inputs-own-k\">" + std::to_string(own.size()) + " structures take their own K from the structure layer: ";
    for (std::size_t k = 0; k < own.size() && k < listed; ++k)
      h += std::string(k ? ", " : "") + esc(own[k].first) + " " + value(own[k].second, Dimension::dimensionless, sys);
    h += own.size() > listed ? ", and " + std::to_string(own.size() - listed) + " more (results.gpkg: k_effective).</p>\n" : ".</p>\n";
  }
  return h;
}

std::string tailwater_section(const run::CheckRun& run) {
  const auto sys = run.report_units;
  const auto& net = run.read.network;
  const std::string u = unit(Dimension::length, sys);
  std::string h = "<h3 id=\"inputs-tailwater\">Tailwater</h3>\n<p>Mode " + esc(mode_text(run.project.tailwater_mode)) +
                  ".</p>\n<table class=\"grid\">\n" + row({"Case", "Level (" + u + ")", "Where the level came from"}, "th");
  const auto& given = run.project.tailwater_levels_m;
  for (const auto& c : run.cases) {
    std::string from;
    if (!std::isfinite(c.tailwater_m)) from = "no level given: free outlets, or the outfalls' own fields";
    else if (std::any_of(given.begin(), given.end(), [&](double l) { return std::abs(l - c.tailwater_m) < 1e-9; }))
      from = "project file, [tailwater] levels";
    else from = "command line (--tailwater), replacing the project file's levels";
    h += row({esc(render_message(c.label, sys)), value(c.tailwater_m, Dimension::length, sys), esc(from)});
  }
  h += "</table>\n";
  std::vector<const model::Structure*> own;
  for (const auto& s : net.structures)
    if (s.kind == model::StructureKind::outfall && s.tailwater_m) own.push_back(&s);
  if (!own.empty()) {
    h += "<p id=\"inputs-outfall-levels\">Outfalls with their own level (the structure layer's tailwater field, which "
         "governs there): ";
    for (std::size_t k = 0; k < own.size() && k < listed; ++k)
      h += std::string(k ? ", " : "") + esc(own[k]->id) + " " + value(*own[k]->tailwater_m, Dimension::length, sys) + " " + u;
    h += own.size() > listed ? ", and " + std::to_string(own.size() - listed) + " more.</p>\n" : ".</p>\n";
  } else {
    h += "<p>No outfall has a level of its own: the case's level applies at every outfall.</p>\n";
  }
  return h;
}

std::string pump_curves(const run::CheckRun& run) {
  if (run.project.pump_stations.empty()) return "";
  const auto sys = run.report_units;
  const std::string uq = unit(Dimension::flow, sys), ul = unit(Dimension::length, sys);
  std::string h = "<h3 id=\"inputs-pumps\">Pump curves</h3>\n";
  for (const auto& ps : run.project.pump_stations) {
    h += "<p>Pump station " + esc(ps.id) + ": " + std::to_string(ps.duty_pumps) + " duty pump" +
         (ps.duty_pumps == 1 ? "" : "s") + " (identical, in parallel), pump on at " + value(ps.pump_on_m, Dimension::length, sys) +
         " " + ul + ", off at " + value(ps.pump_off_m, Dimension::length, sys) + " " + ul + ", fittings K " +
         value(ps.fittings_k, Dimension::dimensionless, sys) + ". One pump's curve:</p>\n<table class=\"grid pump-curve\">\n" +
         row({"Flow (" + uq + ")", "Total head (" + ul + ")"}, "th");
    for (const auto& pt : ps.curve)
      h += row({value(pt.flow_m3_s, Dimension::flow, sys), value(pt.head_m, Dimension::length, sys)});
    h += "</table>\n";
  }
  return h;
}

}  // namespace

std::string vertical_datum_text(const run::CheckRun& run) {
  if (!run.project.vertical_datum.empty()) return run.project.vertical_datum;
  return "not stated in the project ([project] vertical_datum): the datum of the input levels";
}

std::string inputs_detail(const run::CheckRun& run) {
  return "<p id=\"inputs-datum\"><b>Vertical datum</b> of every level (rims, inverts, HGL, EGL, tailwater): " +
         esc(vertical_datum_text(run)) + ". rimline does not shift datums.</p>\n" + k_section(run) +
         tailwater_section(run) + pump_curves(run);
}

}  // namespace rimline::report
