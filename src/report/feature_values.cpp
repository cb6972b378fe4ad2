#include "report/feature_values.hpp"

#include <algorithm>
#include <cmath>

#include "report/html_cells.hpp"
#include "report/profile_scene.hpp"
#include "rimline/checks/checks.hpp"

namespace rimline::report {
namespace {

using units::Dimension;

std::string u(Dimension d, units::System sys) { return " (" + html::unit(d, sys) + ")"; }

std::string case_text(const run::CheckRun& run, run::EnvelopeCase e) {
  if (run.cases.empty()) return "";
  return render_message(run::envelope_label(run, e.index, e.every), run.report_units);
}

}  // namespace

std::string structure_status(const run::CheckRun& run, std::size_t s) { return run::envelope_status(run, s); }

std::string conduit_status(const run::CheckRun& run, std::size_t c) {
  const auto& conduit = run.read.network.conduits[c];
  if (conduit.force_main) return "force_main";
  if (run.cases.empty()) return "not_checked";
  const auto& r = run.cases[run::conduit_envelope(run, c).index].march.conduits[c];
  if (!r.solved) return "not_checked";
  return checks::surcharge_of(conduit, r).surcharged ? "surcharged" : "ok";
}

std::vector<ValueColumn> structure_columns(units::System sys) {
  const auto L = u(Dimension::length, sys);
  return {{"Structure", false}, {"Kind", false},          {"Status", false},     {"Rim" + L, true},
          {"Invert" + L, true}, {"HGL" + L, true},        {"Freeboard" + L, true}, {"Required" + L, true},
          {"Short by" + L, true}, {"K", true},            {"Structure loss" + L, true}, {"Case", false}};
}

std::vector<std::string> structure_values(const run::CheckRun& run, std::size_t s) {
  const auto sys = run.report_units;
  const auto& st = run.read.network.structures[s];
  const double rim = st.rim_m.value_or(NAN), invert = st.invert_m.value_or(NAN);
  double hgl = NAN, k = NAN, loss = NAN;
  std::string kase;
  if (!run.cases.empty()) {
    const auto e = run::structure_envelope(run, s);
    const auto& r = run.cases[e.index].march.structures[s];
    if (r.solved) {
      hgl = r.hgl_m;
      if (!r.outfall && !r.pumped) k = r.k_effective, loss = r.loss_m;
      kase = case_text(run, e);
    }
  }
  const double required = run::required_freeboard_m(run, s);
  const double fb = rim - hgl;
  const double short_by = std::isfinite(fb) && fb < required ? required - fb : NAN;
  return {st.id,
          std::string(model::structure_kind_name(st.kind)),
          structure_status(run, s),
          html::value(rim, Dimension::length, sys),
          html::value(invert, Dimension::length, sys),
          html::value(hgl, Dimension::length, sys),
          html::value(fb, Dimension::length, sys),
          html::value(required, Dimension::length, sys),
          html::value(short_by, Dimension::length, sys),
          html::value(k, Dimension::dimensionless, sys),
          html::value(loss, Dimension::length, sys),
          kase};
}

std::vector<ValueColumn> conduit_columns(units::System sys) {
  const auto L = u(Dimension::length, sys), Q = u(Dimension::flow, sys), V = u(Dimension::velocity, sys);
  return {{"Pipe", false},          {"From", false},           {"To", false},          {"Status", false},
          {"Size", true},           {"Length" + L, true},      {"Slope", true},        {"Design flow" + Q, true},
          {"Capacity" + Q, true},   {"Flow / capacity", true}, {"Highest velocity" + V, true},
          {"HGL up" + L, true},     {"HGL down" + L, true},    {"Surcharged length" + L, true}, {"Case", false}};
}

std::vector<std::string> conduit_values(const run::CheckRun& run, std::size_t c) {
  const auto sys = run.report_units;
  const auto& net = run.read.network;
  const auto& p = net.conduits[c];
  const double design = c < run.flows.flow_m3_s.size() ? run.flows.flow_m3_s[c] : NAN;
  double capacity = NAN, v_high = NAN, hgl_up = NAN, hgl_down = NAN, surcharged = NAN;
  double slope = p.invert_up_m && p.invert_down_m && p.length_m > 0.0 ? (*p.invert_up_m - *p.invert_down_m) / p.length_m : NAN;
  std::string kase;
  if (!run.cases.empty() && !p.force_main) {
    const auto e = run::conduit_envelope(run, c);
    const auto& r = run.cases[e.index].march.conduits[c];
    if (r.solved) {
      capacity = r.capacity_m3_s;
      slope = r.slope;
      hgl_up = r.profile.inlet().hgl_m;
      hgl_down = r.profile.outlet().hgl_m;
      surcharged = r.profile.surcharged_length_m;
      kase = case_text(run, e);
    }
    if (c < run.envelope_velocity_high.size()) {
      const auto& rv = run.cases[run.envelope_velocity_high[c].index].march.conduits[c];
      if (rv.solved) v_high = checks::highest_velocity_m_s(rv);
    }
  }
  const auto id_of = [&](std::size_t s) { return s < net.structures.size() ? net.structures[s].id : std::string(); };
  return {p.id,
          id_of(p.from),
          id_of(p.to),
          conduit_status(run, c),
          pipe_size_text(p.section, sys),
          html::distance(p.length_m, sys),
          html::value(slope, Dimension::slope, sys),
          html::value(design, Dimension::flow, sys),
          html::value(capacity, Dimension::flow, sys),
          std::isfinite(capacity) && capacity > 0.0 && std::isfinite(design) ? html::value(design / capacity, Dimension::dimensionless, sys) : "",
          html::value(v_high, Dimension::velocity, sys),
          html::value(hgl_up, Dimension::length, sys),
          html::value(hgl_down, Dimension::length, sys),
          html::distance(surcharged, sys),
          kase};
}

}  // namespace rimline::report
