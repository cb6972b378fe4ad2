#include "report/network_solve_html.hpp"

#include <cstdio>

#include "report/html_cells.hpp"
#include "rimline/report/profile_svg.hpp"

namespace rimline::report {

units::Unit small_flow_unit(units::System s) { return s == units::System::us ? units::Unit::gpm : units::Unit::l_s; }
units::Unit small_length_unit(units::System s) { return s == units::System::us ? units::Unit::in : units::Unit::mm; }

namespace {

std::string figure(double si, units::Unit u, const char* format) {
  char buf[48];
  std::snprintf(buf, sizeof buf, format, units::from_si(si, u));
  return std::string(buf) + " " + std::string(units::unit_symbol(u));
}

}  // namespace

std::string network_solve_section(const run::CheckRun& run) {
  const auto& n = run.network;
  if (n.components == 0 && n.fallback_components == 0) return "";
  const auto q = small_flow_unit(run.report_units), l = small_length_unit(run.report_units);
  std::string h = "<section id=\"network-solve\"><h2>Network solve</h2>\n<p>";
  h += std::to_string(n.components) + " network(s) with loops, diversions or several outlets (" +
       std::to_string(n.structures) + " structures, " + std::to_string(n.conduits) + " pipes, " +
       std::to_string(n.loops) + " loops) were solved for their water levels, each pipe's flow following from the levels "
       "at its ends, its direction a result; diversions split <b>" + xml_escape(n.split) + "</b>";
  if (n.split == "hydraulic") h += " (by the levels)";
  h += ". " + std::to_string(n.unknowns) + " levels by Newton's method in " + std::to_string(n.newton_pieces) +
       " looped piece(s); the rest follow from known flows. " + std::to_string(n.against_source_count) +
       " pipe(s) flow against their from/to ids or digitised direction (column <code>against_source</code> in "
       "results.gpkg).";
  if (n.components > 0)
    h += " Design flows accumulated by the solved split agreed with the solved flows after " +
         std::to_string(n.design_flow_rounds) + " round(s)" +
         (n.design_flows_converged ? "" : " <b>without settling</b> (largest difference " +
                                               figure(n.design_flow_change_m3_s, q, "%.3f") + ")") + ".";
  if (n.fallback_components > 0)
    h += " <b>" + std::to_string(n.fallback_components) +
         " network(s) did not converge</b> and were marched with the capacity split instead (NETWORK_NOT_CONVERGED).";
  h += "</p>\n<table class=\"grid\">\n";
  h += html::row({"Case", "Newton steps (most in a piece)", "Largest continuity error", "Last level change",
                  "Converged", "Pipes the other way than in the first case"},
                 "th");
  for (const auto& c : n.cases)
    h += html::row({xml_escape(render_message(c.label, run.report_units)), std::to_string(c.iterations),
                    figure(c.max_continuity_error_m3_s, q, "%.4f"), figure(c.max_level_change_m, l, "%.4f"),
                    c.converged ? "yes" : "<b>no</b>", std::to_string(c.flipped)});
  h += "</table></section>\n";
  return h;
}

}  // namespace rimline::report
