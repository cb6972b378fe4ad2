#include <cmath>
#include <ostream>
#include <sstream>

#include "base/number_text.hpp"
#include "rimline/report/outputs.hpp"

namespace rimline::report {
namespace {

std::string csv_cell(const std::string& s) {
  if (s.find_first_of(",\"\n\r") == std::string::npos) return s;
  std::string out = "\"";
  for (char c : s) {
    if (c == '"') out += '"';
    out += c;
  }
  return out + "\"";
}

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

void write_exceptions_csv(const run::CheckRun& run, std::ostream& out) {
  const auto sys = run.report_units;
  out << "code,severity,layer,feature_id,field,value,limit,unit,case,message\n";
  for (std::size_t k = 0; k < run.findings.size(); ++k) {
    const Finding& f = run.findings[k];
    const std::string kase = k < run.finding_case.size() ? render_message(run.finding_case[k], sys) : std::string();
    out << csv_cell(f.code) + ',' + std::string(severity_name(f.severity)) + ',' +
           std::string(layer_role_name(f.layer)) + ',' + csv_cell(f.feature_id) + ',' + csv_cell(f.field) + ',' +
           number(f.value, f.dimension, sys) + ',' + number(f.limit, f.dimension, sys) + ',' +
           csv_cell(std::isfinite(f.value) || std::isfinite(f.limit) ? unit_text(f.dimension, sys) : "") + ',' +
           csv_cell(kase) + ',' + csv_cell(render_message(f.message, sys)) + '\n';
  }
}

std::string exceptions_csv(const run::CheckRun& run) {
  std::ostringstream out;
  write_exceptions_csv(run, out);
  return out.str();
}

}  // namespace rimline::report
