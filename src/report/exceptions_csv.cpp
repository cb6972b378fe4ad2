#include <cmath>
#include <ostream>
#include <sstream>
#include <string_view>

#include "base/number_text.hpp"
#include "rimline/report/outputs.hpp"

namespace rimline::report {
namespace {

// A text cell, quoted as RFC 4180 asks. Text that starts with = + - @ (or a tab or carriage
// return) is what a spreadsheet runs as a formula ("CSV injection", OWASP): such a cell gets a
// leading apostrophe, which spreadsheets show as text, and is quoted. Only here: the id is
// unchanged in every other output. Numbers (value, limit) are not text cells.
std::string csv_cell(const std::string& s) {
  const bool formula = !s.empty() && std::string_view("=+-@\t\r").find(s[0]) != std::string_view::npos;
  if (!formula && s.find_first_of(",\"\n\r") == std::string::npos) return s;
  std::string out = formula ? "\"'" : "\"";
  for (char c : s) {
    if (c == '"') out += '"';
    out += c;
  }
  return out + "\"";
}

std::string number(double v, units::Dimension d, units::System sys) {
  if (!std::isfinite(v)) return "";
  return fixed_text(to_report(v, d, sys), 4);
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
  out << "code,severity,layer,feature_id,fid,field,value,limit,unit,message\n";
  auto row = [&](const Finding& f) {
    out << csv_cell(f.code) + ',' + std::string(severity_name(f.severity)) + ',' +
           std::string(layer_role_name(f.layer)) + ',' + csv_cell(f.feature_id) + ',' +
           (f.fid >= 0 ? std::to_string(f.fid) : std::string()) + ',' + csv_cell(f.field) + ',' +
           number(f.value, f.dimension, sys) + ',' + number(f.limit, f.dimension, sys) + ',' +
           csv_cell(std::isfinite(f.value) || std::isfinite(f.limit) ? unit_text(f.dimension, sys) : "") + ',' +
           csv_cell(render_message(f.message, sys)) + '\n';
  };
  // run.findings is in output order; the few findings of the writing are merged into it.
  Findings extra = more;
  sort_findings(extra);
  std::size_t k = 0;
  for (const auto& f : run.findings) {
    for (; k < extra.size() && finding_before(extra[k], f); ++k) row(extra[k]);
    row(f);
  }
  for (; k < extra.size(); ++k) row(extra[k]);
}

std::string exceptions_csv(const run::CheckRun& run) {
  std::ostringstream out;
  write_exceptions_csv(run, out);
  return out.str();
}

}  // namespace rimline::report
