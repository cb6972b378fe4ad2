#include "report/design_flows_html.hpp"

#include <cmath>
#include <cstdio>

#include "report/html_cells.hpp"
#include "rimline/report/outputs.hpp"
#include "rimline/report/profile_svg.hpp"

namespace rimline::report {
namespace {

using units::Dimension;

std::string cell(double si, Dimension d, units::System sys) { return "<td>" + html::value(si, d, sys) + "</td>"; }
std::string cell(double si, Dimension d, units::System sys, const char* format) {
  return "<td>" + html::value(si, d, sys, format) + "</td>";
}

std::string head(const char* name, Dimension d, units::System sys) {
  return std::string("<th>") + name + " (" + html::unit(d, sys) + ")</th>";
}

}  // namespace

std::string design_flows_section(const run::CheckRun& run) {
  if (!run.catchment_flows) return "";
  const auto& cf = *run.catchment_flows;
  const auto& net = run.read.network;
  const auto sys = run.report_units;
  const bool storm = cf.mode == flows::CatchmentMode::storm;
  std::size_t assigned = 0;
  double area = 0.0;
  for (const auto& k : run.catchments) {
    area += k.area_m2;
    assigned += k.structure != model::no_index ? 1 : 0;
  }
  std::string h = "<section id=\"design-flows\"><h2>Design flows</h2>\n<p>" + xml_escape(cf.method) + ".</p>\n<p>" +
                  std::to_string(run.catchments.size()) + " catchments read (" + std::to_string(assigned) +
                  " drain to a structure), ";
  h += html::value(area, Dimension::area, sys) + " " + std::string(units::unit_symbol(units::display_unit(Dimension::area, sys))) +
       " in all. Figures at each pipe's upstream end, in upstream-first order of the network.</p>\n";
  h += "<table class=\"grid\">\n<tr><th>Pipe</th>" + head("Area", Dimension::area, sys);
  if (storm)
    h += head("C A", Dimension::area, sys) + head("Tc", Dimension::time, sys) +
         head("Travel time", Dimension::time, sys) + head("Intensity", Dimension::intensity, sys);
  else
    h += "<th>Population</th><th>Peaking factor</th>" + head("Infiltration", Dimension::flow, sys);
  h += head("Q", Dimension::flow, sys) + "</tr>\n";
  for (std::size_t ci : flows::upstream_first_order(net, run.topology)) {
    const auto& p = cf.pipes[ci];
    h += "<tr><td>" + xml_escape(net.conduits[ci].id) + "</td>" + cell(p.area_m2, Dimension::area, sys);
    if (storm)
      h += cell(p.ca_m2, Dimension::area, sys) + cell(p.tc_s, Dimension::time, sys) +
           cell(p.travel_time_s, Dimension::time, sys) + cell(p.intensity_m_s, Dimension::intensity, sys);
    else
      h += cell(p.population, Dimension::dimensionless, sys, "%.0f") +
           cell(p.peaking_factor, Dimension::dimensionless, sys) + cell(p.infiltration_m3_s, Dimension::flow, sys);
    h += cell(p.flow_m3_s, Dimension::flow, sys) + "</tr>\n";
  }
  return h + "</table>\n</section>\n";
}

}  // namespace rimline::report
