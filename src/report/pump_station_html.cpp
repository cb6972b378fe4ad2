#include "report/pump_station_html.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "report/html_cells.hpp"
#include "rimline/report/outputs.hpp"
#include "rimline/report/profile_svg.hpp"

namespace rimline::report {
namespace {

using units::Dimension;

std::string esc(std::string_view s) { return xml_escape(s); }

std::string val(double si, Dimension d, units::System sys) { return html::value(si, d, sys); }

std::string friction_text(const model::ForceMainSettings& s) {
  if (s.friction == hydraulics::FrictionLaw::hazen_williams) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "Hazen-Williams (C %.0f)", s.hazen_c);
    return buf;
  }
  return "Darcy-Weisbach with Colebrook-White (each pipe's ks)";
}

using html::row;
using html::unit;

std::string station_block(const run::CheckRun& run, std::size_t i) {
  const auto sys = run.report_units;
  const auto& spec = run.project.pump_stations[i];
  const auto& st = run.pump_stations[i];
  const auto L = Dimension::length, Q = Dimension::flow;
  std::string h = "<h3 id=\"pump-station-" + esc(spec.id) + "\">Pump station " + esc(spec.id) + "</h3>\n";
  if (!st.layout.ok) return h + "<p>Not checked: " + esc(st.layout.note) + ".</p>\n";
  const auto& net = run.read.network;
  std::string mains, profiles;
  for (std::size_t j = 0; j < st.layout.chain.size(); ++j) {
    const auto& c = net.conduits[st.layout.chain[j]];
    const auto source = st.layout.sources[j];
    mains += (mains.empty() ? "" : ", ") + esc(c.id) + " (" + html::size(hydraulics::rise_m(c.section), sys) + ", " +
             html::distance(c.length_m, sys) + " " + unit(L, sys) +
             (c.rated_pressure_head_m ? ", rated " + val(*c.rated_pressure_head_m, Dimension::pressure_head, sys) + " " +
                                            unit(L, sys) + " of head"
                                      : "") +
             ")";
    profiles += (profiles.empty() ? "" : ", ") + esc(c.id) + ": " +
                (source == model::ProfileSource::vertex_z ? "vertex Z"
                 : source == model::ProfileSource::dem    ? "ground DEM minus cover"
                                                          : "end inverts only (coarse: high points between unseen)");
  }
  h += "<table class=\"kv\">\n";
  h += row({"Force main", mains + " to " + esc(net.structures[st.layout.discharge].id)});
  h += row({"Vertical profile", profiles + "; " + std::to_string(st.layout.points.size()) + " profile points"});
  h += row({"Wet-well levels", "pump off " + val(spec.pump_off_m, L, sys) + ", pump on " + val(spec.pump_on_m, L, sys) +
                                   " " + unit(L, sys)});
  h += row({"Duty pumps", std::to_string(spec.duty_pumps) + " identical, in parallel"});
  h += row({"Fittings", "K " + val(spec.fittings_k, Dimension::dimensionless, sys) + " at the pump end, plus the exit K 1"});
  h += row({"Discharge level", val(st.discharge_level_m, L, sys) + " " + unit(L, sys) + ", " + esc(st.discharge_basis)});
  h += row({"Design flow into the gravity network",
            val(st.design_flow_m3_s, Q, sys) + " " + unit(Q, sys) + " (" + esc(st.cases.empty() ? "" : st.cases[st.design_case].label) +
                ", the largest operating flow); settled after " + std::to_string(run.pump_iterations) + " round(s) with the gravity march"});
  h += row({"Design inflow to the wet well", val(run.wet_well_inflow_m3_s[i], Q, sys) + " " + unit(Q, sys)});
  h += "</table>\n<table class=\"grid\">\n";
  h += row({"Operating case", "Wet well (" + unit(L, sys) + ")", "Static lift (" + unit(L, sys) + ")",
            "Flow (" + unit(Q, sys) + ")", "Pump head (" + unit(L, sys) + ")",
            "Velocity (" + unit(Dimension::velocity, sys) + ")", "Least pressure head (" + unit(L, sys) + ")",
            "Greatest pressure head (" + unit(L, sys) + ")"},
           "th");
  for (const auto& c : st.cases) {
    if (!c.exists) {
      h += row({esc(c.label), val(c.wet_well_m, L, sys), val(c.static_lift_m, L, sys), "no operating point", "", "", "", ""});
      continue;
    }
    const auto [lo, hi] = std::minmax_element(c.pressure_head_m.begin(), c.pressure_head_m.end());
    h += row({esc(c.label), val(c.wet_well_m, L, sys), val(c.static_lift_m, L, sys), val(c.flow_m3_s, Q, sys),
              val(c.head_m, L, sys), val(c.velocity_m_s.front(), Dimension::velocity, sys),
              val(*lo, Dimension::pressure_head, sys), val(*hi, Dimension::pressure_head, sys)});
  }
  return h + "</table>\n";
}

}  // namespace

std::string pump_stations_section(const run::CheckRun& run) {
  if (run.pump_stations.empty()) return "";
  std::string h = "<section id=\"pump-stations\"><h2>Pump stations and force mains</h2>\n<p>Operating points where the "
                  "pump curve meets the force main's system curve (static lift to the discharge level, friction by " +
                  friction_text(run.project.force_mains) +
                  ", fittings and exit losses), at the low and the high wet-well level with one and with all duty pumps. "
                  "Pressure heads are steady operating values along the pipe centreline; surge (water hammer) is not "
                  "computed. The force-main profiles are among the drawings below.</p>\n";
  for (std::size_t i = 0; i < run.pump_stations.size(); ++i) h += station_block(run, i);
  return h + "</section>\n";
}

}  // namespace rimline::report
