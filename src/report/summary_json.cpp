#include <cmath>
#include <map>
#include <nlohmann/json.hpp>

#include "rimline/hydraulics/friction.hpp"
#include "rimline/report/outputs.hpp"
#include "rimline/topology/summary.hpp"
#include "rimline/version.hpp"

namespace rimline::report {
namespace {

using nlohmann::ordered_json;

ordered_json length(double si, units::System s) {
  if (!std::isfinite(si)) return nullptr;
  return std::round(to_report(si, units::Dimension::length, s) * 1e4) / 1e4;
}

ordered_json flow(double si, units::System s) {
  return std::round(to_report(si, units::Dimension::flow, s) * 1e6) / 1e6;
}

ordered_json velocity(double si, units::System s) {
  return std::round(to_report(si, units::Dimension::velocity, s) * 1e4) / 1e4;
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
                    {"catchment_area", std::round(to_report(area, units::Dimension::area, sys) * 1e4) / 1e4},
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
  j["methods"] = {{"friction", hydraulics::friction_law_name(run.project.methods.friction)},
                  {"structure_loss", hydraulics::structure_loss_method_name(run.march_options.loss_method)},
                  {"default_k", run.march_options.default_k}};
  if (run.catchment_flows) j["design_flows"] = design_flows_json(run);
  ordered_json crit = {{"freeboard", length(run.criteria.freeboard_m, sys)},
                       {"velocity_min", velocity(run.criteria.velocity_min_m_s, sys)},
                       {"capacity_ratio_max", run.criteria.capacity_ratio_max}};
  crit["velocity_max"] = run.criteria.velocity_max_m_s ? velocity(*run.criteria.velocity_max_m_s, sys) : ordered_json();
  crit["cover_min"] = run.criteria.cover_min_m ? length(*run.criteria.cover_min_m, sys) : ordered_json();
  j["criteria"] = crit;

  const auto ns = topology::summarize(net, run.topology);
  j["network"] = {{"structures", ns.structures}, {"conduits", ns.conduits}, {"outfalls", ns.outfalls},
                  {"trees", ns.trees},           {"diversions", ns.diversions},
                  {"total_length", length(ns.total_length_m, sys)}};

  ordered_json cases = ordered_json::array();
  for (const auto& c : run.cases) {
    std::size_t solved = 0;
    for (const auto& s : c.march.structures) solved += s.solved ? 1 : 0;
    cases.push_back({{"label", render_message(c.label, sys)}, {"tailwater", length(c.tailwater_m, sys)},
                     {"structures_solved", solved}, {"criteria_findings", c.criteria_count}});
  }
  j["cases"] = cases;

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
  std::string worst_id;
  for (std::size_t s = 0; s < net.structures.size() && !run.cases.empty(); ++s) {
    const auto& r = run.cases[run.envelope_structure_case[s]].march.structures[s];
    if (!r.solved || !net.structures[s].rim_m) continue;
    const double fb = *net.structures[s].rim_m - r.hgl_m;
    if (fb < worst) {
      worst = fb;
      worst_id = net.structures[s].id;
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
  j["worst_freeboard"] = std::isfinite(worst) ? ordered_json{{"structure", worst_id}, {"freeboard", length(worst, sys)}}
                                              : ordered_json();
  return j.dump(2) + "\n";
}

}  // namespace rimline::report
