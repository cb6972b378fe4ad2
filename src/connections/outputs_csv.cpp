// changes.csv, structure_changes.csv, headroom.csv (include/rimline/connections/outputs.hpp).
#include <cmath>
#include <sstream>

#include "base/number_text.hpp"
#include "rimline/connections/outputs.hpp"
#include "rimline/report/outputs.hpp"

namespace rimline::connections {
namespace {

std::string cell(const std::string& s) {
  if (s.find_first_of(",\"\n\r") == std::string::npos) return s;
  std::string out = "\"";
  for (char c : s) {
    if (c == '"') out += '"';
    out += c;
  }
  return out + "\"";
}

// Four decimals in the report's unit, as exceptions.csv writes its values.
std::string number(double si, units::Dimension d, units::System sys) {
  return std::isfinite(si) ? fixed_text(report::to_report(si, d, sys), 4) : "";
}

std::string unit_of(units::Dimension d, units::System sys) {
  return d == units::Dimension::dimensionless ? "" : std::string(units::unit_symbol(units::display_unit(d, sys)));
}

}  // namespace

std::string changes_csv(const Comparison& cmp, units::System sys) {
  std::ostringstream out;
  out << "change,layer,feature_id,question,code_before,value_before,case_before,code_after,value_after,case_after,"
         "limit,unit\n";
  for (const auto& e : cmp.exceptions) {
    const Finding& any = e.after ? e.after->finding : e.before->finding;
    auto side = [&](const std::optional<Exception>& x) {
      if (!x) return std::string(",,");
      return cell(x->finding.code) + ',' + number(x->finding.value, x->finding.dimension, sys) + ',' +
             cell(render_message(x->case_label, sys));
    };
    out << change_name(e.change) << ',' << layer_role_name(e.layer) << ',' << cell(e.feature_id) << ','
        << e.question << ',' << side(e.before) << ',' << side(e.after) << ','
        << number(any.limit, any.dimension, sys) << ',' << unit_of(any.dimension, sys) << '\n';
  }
  return out.str();
}

std::string structure_changes_csv(const Comparison& cmp, units::System sys) {
  using units::Dimension;
  std::ostringstream out;
  out << "id,hgl_before,hgl_after,hgl_change,freeboard_before,freeboard_after,freeboard_change,unit\n";
  for (const auto& s : cmp.structures) {
    out << cell(s.id) << ',' << number(s.hgl_before_m, Dimension::length, sys) << ','
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
  out << "structure,headroom,unit,at_limit,governing_layer,governing_id,criterion,change,value,value_unit,"
         "tailwater_case,trials,note\n";
  for (const auto& h : headroom) {
    const bool governed = !h.governing_id.empty();
    out << cell(h.id) << ',' << number(h.headroom_m3_s, units::Dimension::flow, sys) << ','
        << unit_of(units::Dimension::flow, sys) << ',' << (h.at_limit ? "yes" : "no") << ','
        << (governed ? std::string(layer_role_name(h.governing_layer)) : "") << ',' << cell(h.governing_id) << ','
        << h.criterion << ',' << h.change << ',' << number(h.value, h.dimension, sys) << ','
        << (std::isfinite(h.value) ? unit_of(h.dimension, sys) : "") << ','
        << cell(render_message(h.case_label, sys)) << ',' << h.trials << ',' << cell(h.note) << '\n';
  }
  return out.str();
}

std::string headroom_text(const Headroom& h, units::System sys) {
  if (!std::isfinite(h.headroom_m3_s)) return h.note;
  // Four decimals of m3/s or cfs: the 0.1 L/s the search is exact to.
  const std::string v = number(h.headroom_m3_s, units::Dimension::flow, sys) + " " + unit_of(units::Dimension::flow, sys);
  return h.at_limit ? "at least " + v + " (the search ceiling)" : v;
}

}  // namespace rimline::connections
