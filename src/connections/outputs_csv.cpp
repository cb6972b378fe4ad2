// changes.csv, structure_changes.csv, headroom.csv (include/rimline/connections/outputs.hpp).
#include <cmath>
#include <cstdint>
#include <sstream>

#include "report/csv_cell.hpp"
#include "rimline/connections/outputs.hpp"
#include "rimline/report/outputs.hpp"

namespace rimline::connections {
namespace {

// Text cells as exceptions.csv writes them: quoted, and a formula's leading = + - @ neutralised.
std::string cell(const std::string& s) { return report::csv_cell(s); }

std::string fid_cell(std::int64_t fid) { return fid >= 0 ? std::to_string(fid) : std::string(); }

// In the report's unit, rounded to what the data supports, as exceptions.csv writes its values
// (display_number: levels to the millimetre or 0.01 ft, flows to three significant figures).
std::string number(double si, units::Dimension d, units::System sys) {
  return std::isfinite(si) ? display_number(si, d, sys) : "";
}

std::string unit_of(units::Dimension d, units::System sys) {
  return d == units::Dimension::dimensionless ? "" : std::string(units::unit_symbol(units::display_unit(d, sys)));
}

}  // namespace

std::string changes_csv(const Comparison& cmp, units::System sys) {
  std::ostringstream out;
  out << "change,layer,feature_id,fid,question,code_before,value_before,case_before,code_after,value_after,case_after,"
         "limit,unit\n";
  for (const auto& e : cmp.exceptions) {
    const Finding& any = e.after ? e.after->finding : e.before->finding;
    auto side = [&](const std::optional<Exception>& x) {
      if (!x) return std::string(",,");
      return cell(x->finding.code) + ',' + number(x->finding.value, x->finding.dimension, sys) + ',' +
             cell(render_message(x->case_label, sys));
    };
    out << change_name(e.change) << ',' << layer_role_name(e.layer) << ',' << cell(e.feature_id) << ','
        << fid_cell(any.fid) << ',' << e.question << ',' << side(e.before) << ',' << side(e.after) << ','
        << number(any.limit, any.dimension, sys) << ',' << unit_of(any.dimension, sys) << '\n';
  }
  return out.str();
}

std::string structure_changes_csv(const Comparison& cmp, units::System sys) {
  using units::Dimension;
  std::ostringstream out;
  out << "id,fid,status,hgl_before,hgl_after,hgl_change,freeboard_before,freeboard_after,freeboard_change,unit\n";
  for (const auto& s : cmp.structures) {
    out << cell(s.id) << ',' << fid_cell(s.fid) << ',' << (s.added ? "added" : "existing") << ','
        << number(s.hgl_before_m, Dimension::length, sys) << ','
        << number(s.hgl_after_m, Dimension::length, sys) << ',' << number(s.hgl_change_m(), Dimension::length, sys)
        << ',' << number(s.freeboard_before_m, Dimension::length, sys) << ','
        << number(s.freeboard_after_m, Dimension::length, sys) << ','
        << number(s.freeboard_after_m - s.freeboard_before_m, Dimension::length, sys) << ','
        << unit_of(Dimension::length, sys) << '\n';
  }
  return out.str();
}

std::string headroom_csv(const std::vector<Headroom>& headroom, units::System sys) {
  std::ostringstream out;
  out << "structure,fid,headroom,unit,at_limit,governing_layer,governing_id,governing_fid,criterion,change,value,value_unit,"
         "tailwater_case,trials,note\n";
  for (const auto& h : headroom) {
    const bool governed = !h.governing_id.empty();
    out << cell(h.id) << ',' << fid_cell(h.fid) << ',' << number(h.headroom_m3_s, units::Dimension::flow, sys) << ','
        << unit_of(units::Dimension::flow, sys) << ',' << (h.at_limit ? "yes" : "no") << ','
        << (governed ? std::string(layer_role_name(h.governing_layer)) : "") << ',' << cell(h.governing_id) << ','
        << fid_cell(h.governing_fid) << ',' << h.criterion << ',' << h.change << ',' << number(h.value, h.dimension, sys) << ','
        << (std::isfinite(h.value) ? unit_of(h.dimension, sys) : "") << ','
        << cell(render_message(h.case_label, sys)) << ',' << h.trials << ',' << cell(h.note) << '\n';
  }
  return out.str();
}

std::string headroom_text(const Headroom& h, units::System sys) {
  if (!std::isfinite(h.headroom_m3_s)) return h.note;
  // Three significant figures in the run's flow unit (display_number), as every flow a user reads.
  const std::string v = number(h.headroom_m3_s, units::Dimension::flow, sys) + " " + unit_of(units::Dimension::flow, sys);
  return h.at_limit ? "at least " + v + " (the search ceiling)" : v;
}

}  // namespace rimline::connections
