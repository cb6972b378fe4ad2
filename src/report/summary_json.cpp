#include <cmath>
#include <map>
#include <optional>
#include <nlohmann/json.hpp>

#include "base/number_text.hpp"
#include "report/method_text.hpp"
#include "report/network_solve_html.hpp"
#include "rimline/hydraulics/friction.hpp"
#include "rimline/report/outputs.hpp"
#include "rimline/topology/summary.hpp"
#include "rimline/version.hpp"

namespace rimline::report {
namespace {

using nlohmann::ordered_json;

// Figures rounded as the report shows them (rimline::display_decimals): what the data supports.
ordered_json shown(double si, units::Dimension d, units::System s) {
  if (!std::isfinite(si)) return nullptr;
  return std::stod(display_number(si, d, s));
}

ordered_json length(double si, units::System s) { return shown(si, units::Dimension::length, s); }
ordered_json flow(double si, units::System s) { return shown(si, units::Dimension::flow, s); }
ordered_json velocity(double si, units::System s) { return shown(si, units::Dimension::velocity, s); }

// A value to `digits` significant figures (printf's %.*g), as a number.
double significant(double v, int digits) {
  std::string text;
  append_general(text, v, digits);
  return std::stod(text);
}

// Flows from catchments: the method (with the IDF relation) and the catchments' totals.
ordered_json design_flows_json(const run::CheckRun& run) {
  const auto& cf = *run.catchment_flows;
  const auto sys = run.report_units;
  double area = 0.0;
  std::size_t assigned = 0;
  for (const auto& k : run.catchments) {
    area += k.area_m2;
    assigned += k.structure != model::no_index ? 1 : 0;
  }
  ordered_json d = {{"mode", cf.mode == flows::CatchmentMode::storm ? "rational" : "sanitary"},
                    {"method", cf.method},
                    {"catchments", run.catchments.size()},
                    {"catchments_with_outlet", assigned},
                    {"catchment_area", shown(area, units::Dimension::area, sys)},
                    {"area_unit", units::unit_symbol(units::display_unit(units::Dimension::area, sys))}};
  if (cf.mode == flows::CatchmentMode::storm) {
    const auto& idf = run.project.rational.idf;
    d["return_period"] = idf.label;
    d["idf"] = idf.kind == model::IdfCurve::Kind::formula
                   ? ordered_json{{"form", "i = a / (t + b)^c, t and b in min"}, {"a", idf.a}, {"b_min", idf.b_min},
                                  {"c", idf.c}, {"intensity_unit", idf.intensity_unit}}
                   : ordered_json{{"form", "table, log-log interpolation"}, {"rows", idf.durations_s.size()}};
    d["travel_velocity"] = run.project.rational.full_flow_velocity ? "full_flow" : "normal_depth";
  }
  return d;
}

// The network solve: what it took, how the design flows settled, each case's convergence (the
// small figures in L/s and mm, or gpm and in).
ordered_json network_solve_json(const run::CheckRun& run) {
  const auto& n = run.network;
  const auto q = small_flow_unit(run.report_units), l = small_length_unit(run.report_units);
  auto small = [](double si, units::Unit u) { return std::round(units::from_si(si, u) * 1e4) / 1e4; };
  ordered_json cases = ordered_json::array();
  for (const auto& c : n.cases)
    cases.push_back({{"case", render_message(c.label, run.report_units)},
                     {"newton_steps", c.iterations},
                     {"profiles_computed", c.evaluations},
                     {"largest_continuity_error", small(c.max_continuity_error_m3_s, q)},
                     {"last_level_change", small(c.max_level_change_m, l)},
                     {"converged", c.converged},
                     {"pipes_other_way_than_first_case", c.flipped}});
  return {{"diversion_split", n.split},
          {"all_components", n.all_components},
          {"units", {{"continuity_error", units::unit_symbol(q)}, {"level_change", units::unit_symbol(l)}}},
          {"networks", n.components},
          {"structures", n.structures},
          {"pipes", n.conduits},
          {"loops", n.loops},
          {"diversions", n.diversions},
          {"levels_by_newton", n.unknowns},
          {"newton_pieces", n.newton_pieces},
          {"pipes_against_source", n.against_source_count},
          {"design_flow_rounds", n.design_flow_rounds},
          {"design_flows_settled", n.design_flows_converged},
          {"networks_not_converged", n.fallback_components},
          {"cases", cases}};
}

// Each outfall's tailwater in a case and where it came from (the run's level, the outfall's own
// field, none: a free outlet), and whether the tailwater or the free-outlet level governs there.
// The list when there are at most 50 outfalls; the counts always. Without a run level, the case's
// tailwater is the outfalls' field value when they all give the same one.
void outfalls_json(const run::CheckRun& run, const run::Case& c, ordered_json& kase) {
  const auto sys = run.report_units;
  const auto& net = run.read.network;
  std::map<std::string, int> by_source{{"run", 0}, {"field", 0}, {"none", 0}};
  ordered_json list = ordered_json::array();
  std::optional<double> common;
  bool differ = false;
  for (const auto& tree : run.topology.trees) {
    const auto& r = c.march.structures[tree.outfall];
    if (!r.outfall) continue;
    const bool given = std::isfinite(r.tailwater_m) && run.march_options.tailwater_mode != solve::TailwaterMode::free;
    const std::string source = !given ? "none" : r.tailwater_from_field ? "field" : "run";
    ++by_source[source];
    if (r.tailwater_from_field && given) {
      if (common && !(*common == r.tailwater_m)) differ = true;
      common = r.tailwater_m;
    }
    if (run.topology.trees.size() <= 50)
      list.push_back({{"outfall", net.structures[tree.outfall].id},
                      {"tailwater", given ? length(r.tailwater_m, sys) : ordered_json()},
                      {"source", source},
                      {"level", r.solved ? length(r.hgl_m, sys) : ordered_json()},
                      {"governed_by", given && r.solved && r.hgl_m <= r.tailwater_m + 1e-9 ? "tailwater" : "free outlet"}});
  }
  if (!std::isfinite(c.tailwater_m) && common && !differ) kase["tailwater"] = length(*common, sys);
  kase["outfalls_by_source"] = by_source;
  if (run.topology.trees.size() <= 50) kase["outfalls"] = list;
}

}  // namespace

std::string summary_json(const run::CheckRun& run, const Findings& more) {
  const auto sys = run.report_units;
  const auto& net = run.read.network;
  ordered_json j;
  j["tool"] = "rimline";
  j["version"] = version_string;
  j["caution"] = caution;
  j["project"] = {{"name", run.project.name}, {"file", run.project.file}};
  ordered_json inputs = ordered_json::array();
  for (const auto& f : run.inputs) inputs.push_back({{"path", f.path}, {"sha256", f.sha256}});
  j["inputs"] = inputs;
  j["units"] = {{"system", sys == units::System::us ? "us" : "si"},
                {"length", units::unit_symbol(units::display_unit(units::Dimension::length, sys))},
                {"flow", units::unit_symbol(units::display_unit(units::Dimension::flow, sys))},
                {"velocity", units::unit_symbol(units::display_unit(units::Dimension::velocity, sys))}};
  j["crs"] = {{"run", net.crs_description}, {"note", net.crs_note}};
  // The datum of every level in this file ([project] vertical_datum as written; null: not stated).
  j["vertical_datum"] = run.project.vertical_datum.empty() ? nlohmann::json() : nlohmann::json(run.project.vertical_datum);
  ordered_json energy_by_structure = ordered_json::object();
  for (const auto& [id, e] : structure_energy_exceptions(run)) energy_by_structure[id] = e;
  ordered_json basis_by_pipe = ordered_json::object();
  for (const auto& [id, b] : velocity_basis_exceptions(run)) basis_by_pipe[id] = b;
  const bool us = sys == units::System::us;
  const double nu_ft2_s = run.kinematic_viscosity_m2_s / (units::metres_per_foot * units::metres_per_foot);
  j["methods"] = {
      {"friction", hydraulics::friction_law_name(run.project.methods.friction)},
      {"structure_loss", hydraulics::structure_loss_method_name(run.march_options.loss_method)},
      {"default_k", run.march_options.default_k},
      {"structure_energy", structure_energy_id(run)},
      {"structure_energy_by_structure", energy_by_structure},
      {"k_multiplies", "the velocity head at the inlet of the pipe leaving the structure (V_o^2/2g)"},
      {"structure_energy_text", structure_energy_text(run)},
      {"water_temperature", std::round(to_report(run.project.methods.water_temperature_c, units::Dimension::temperature, sys) * 10.0) / 10.0},
      {"water_temperature_unit", units::unit_symbol(units::display_unit(units::Dimension::temperature, sys))},
      {"kinematic_viscosity", significant(us ? nu_ft2_s : run.kinematic_viscosity_m2_s, 4)},
      {"kinematic_viscosity_unit", us ? "ft2/s" : "m2/s"},
      {"velocity_min_basis", checks::velocity_basis_name(run.criteria.velocity_basis)},
      {"velocity_min_basis_by_pipe", basis_by_pipe},
      {"velocity_rules", velocity_rules_text(run)},
      {"diversion_split", run.network.split}};
  if (run.catchment_flows) j["design_flows"] = design_flows_json(run);
  if (run.network.components > 0 || run.network.fallback_components > 0) j["network_solve"] = network_solve_json(run);
  ordered_json crit = {{"freeboard", length(run.criteria.freeboard_m, sys)},
                       {"velocity_min", velocity(run.criteria.velocity_min_m_s, sys)},
                       {"capacity_ratio_max", run.criteria.capacity_ratio_max}};
  crit["velocity_max"] = run.criteria.velocity_max_m_s ? velocity(*run.criteria.velocity_max_m_s, sys) : ordered_json();
  crit["cover_min"] = run.criteria.cover_min_m ? length(*run.criteria.cover_min_m, sys) : ordered_json();
  j["criteria"] = crit;

  const auto ns = topology::summarize(net, run.topology);
  j["network"] = {{"structures", ns.structures}, {"conduits", ns.conduits}, {"outfalls", ns.outfalls},
                  {"outfalls_assumed", ns.outfalls_assumed},  // tree ends no type or [outfalls] entry names
                  {"trees", ns.trees},           {"diversions", ns.diversions},
                  {"total_length", std::stod(distance_number(ns.total_length_m, sys))}};
  j["checked_nothing"] = run::checked_nothing(run);

  ordered_json cases = ordered_json::array();
  for (const auto& c : run.cases) {
    std::size_t solved = 0;
    for (const auto& s : c.march.structures) solved += s.solved ? 1 : 0;
    ordered_json kase = {{"label", render_message(c.label, sys)}, {"tailwater", length(c.tailwater_m, sys)},
                         {"structures_solved", solved}, {"criteria_findings", c.criteria_count}};
    outfalls_json(run, c, kase);
    cases.push_back(kase);
  }
  j["cases"] = cases;
  if (run.cases.size() > 1)
    j["envelope"] =
        "results.gpkg holds each figure from the case that governs it, and names it: a structure's from the case "
        "with its highest HGL (tailwater_case); a conduit's levels, depths, end velocities, regime and surcharged "
        "length from the case where its HGL stands highest against its crown (tailwater_case, as SURCHARGED); "
        "velocity_selfclean and velocity_highest from the case with the lowest and the highest of each "
        "(velocity_selfclean_case, velocity_highest_case); '" + std::string(run::every_case) +
        "' where a figure is the same in every case. exceptions.csv names the case of each row (column case).";

  std::map<std::string, int> by_code;
  std::map<std::string, int> by_severity{{"error", 0}, {"warning", 0}, {"info", 0}};
  for (const auto* list : {&run.findings, &more})
    for (const auto& f : *list) {
      ++by_code[f.code];
      ++by_severity[std::string(severity_name(f.severity))];
    }
  j["counts"] = {{"by_code", by_code}, {"by_severity", by_severity}};

  // Worst freeboard over the envelope.
  double worst = std::numeric_limits<double>::infinity();
  std::string worst_id, worst_case;
  for (std::size_t s = 0; s < net.structures.size() && !run.cases.empty(); ++s) {
    const auto& r = run.cases[run.envelope_structure_case[s]].march.structures[s];
    if (!r.solved || !net.structures[s].rim_m) continue;
    const double fb = *net.structures[s].rim_m - r.hgl_m;
    if (fb < worst) {
      worst = fb;
      worst_id = net.structures[s].id;
      const auto env = run::structure_envelope(run, s);
      worst_case = render_message(run::envelope_label(run, env.index, env.every), sys);
    }
  }
  // Pump stations: the operating point of every case (only when the project has stations).
  if (!run.pump_stations.empty()) {
    ordered_json stations = ordered_json::array();
    for (std::size_t i = 0; i < run.pump_stations.size(); ++i) {
      const auto& st = run.pump_stations[i];
      ordered_json cs = ordered_json::array();
      for (const auto& c : st.cases)
        cs.push_back({{"case", c.label},
                      {"operating_point", c.exists},
                      {"flow", c.exists ? flow(c.flow_m3_s, sys) : ordered_json()},
                      {"head", c.exists ? ordered_json(length(c.head_m, sys)) : ordered_json()}});
      stations.push_back({{"id", run.project.pump_stations[i].id},
                          {"checked", st.layout.ok},
                          {"design_flow", flow(st.design_flow_m3_s, sys)},
                          {"discharge_level", st.layout.ok ? ordered_json(length(st.discharge_level_m, sys)) : ordered_json()},
                          {"cases", cs}});
    }
    j["pump_stations"] = stations;
  }
  j["worst_freeboard"] = std::isfinite(worst) ? ordered_json{{"structure", worst_id}, {"freeboard", length(worst, sys)},
                                                             {"case", worst_case},
                                                             {"structure_energy", structure_energy_id(run)}}
                                              : ordered_json();
  return j.dump(2) + "\n";
}

}  // namespace rimline::report
