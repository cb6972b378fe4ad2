#include <cmath>
#include <ostream>
#include <sstream>
#include <string_view>

#include "base/number_text.hpp"
#include "report/csv_cell.hpp"
#include "report/feature_locator.hpp"
#include "rimline/report/outputs.hpp"

namespace rimline::report {
namespace {

// Rounded as in the messages (rimline::display_decimals): what the data supports.
std::string number(double v, units::Dimension d, units::System sys) {
  if (!std::isfinite(v)) return "";
  return display_number(v, d, sys);
}

std::string unit_text(units::Dimension d, units::System sys) {
  if (d == units::Dimension::dimensionless) return "";
  return std::string(units::unit_symbol(units::display_unit(d, sys)));
}

}  // namespace

double to_report(double si_value, units::Dimension d, units::System s) {
  return units::from_si(si_value, units::display_unit(d, s));
}

void write_exceptions_csv(const run::CheckRun& run, std::ostream& out, const Findings& more) {
  const auto sys = run.report_units;
  out << "code,severity,layer,feature_id,fid,field,value,limit,shortfall,unit,case,x,y,message\n";
  const FeatureLocator where(run);
  const double per_unit = run.read.network.crs_metres_per_unit > 0.0 ? run.read.network.crs_metres_per_unit : 1.0;
  auto row = [&](const Finding& f, const std::string& kase) {
    // shortfall: value - limit with its sign, in the value's unit (negative: below a minimum).
    const std::string shortfall = number(f.value - f.limit, f.dimension, sys);
    std::string xy = ",";
    if (const auto p = where.place(f)) xy = fixed_text(p->x / per_unit, 3) + ',' + fixed_text(p->y / per_unit, 3);
    out << csv_cell(f.code) + ',' + std::string(severity_name(f.severity)) + ',' +
           std::string(layer_role_name(f.layer)) + ',' + csv_cell(f.feature_id) + ',' +
           (f.fid >= 0 ? std::to_string(f.fid) : std::string()) + ',' + csv_cell(f.field) + ',' +
           number(f.value, f.dimension, sys) + ',' + number(f.limit, f.dimension, sys) + ',' + shortfall + ',' +
           csv_cell(std::isfinite(f.value) || std::isfinite(f.limit) ? unit_text(f.dimension, sys) : "") + ',' +
           csv_cell(kase) + ',' + xy + ',' + csv_cell(render_message(f.message, sys)) + '\n';
  };
  // run.findings is in output order; the few findings of the writing (no case) are merged into it.
  Findings extra = more;
  sort_findings(extra);
  std::size_t e = 0;
  for (std::size_t k = 0; k < run.findings.size(); ++k) {
    const Finding& f = run.findings[k];
    for (; e < extra.size() && finding_before(extra[e], f); ++e) row(extra[e], "");
    row(f, k < run.finding_case.size() ? render_message(run.finding_case[k], sys) : std::string());
  }
  for (; e < extra.size(); ++e) row(extra[e], "");
}

std::string exceptions_csv(const run::CheckRun& run) {
  std::ostringstream out;
  write_exceptions_csv(run, out);
  return out.str();
}

}  // namespace rimline::report
