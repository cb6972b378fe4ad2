// Criteria of a solved pump station -> findings (codes in force_main.hpp).
#include <algorithm>
#include <cmath>
#include <limits>
#include <map>

#include "rimline/solve/force_main.hpp"

namespace rimline::solve {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();
using units::Dimension;

Finding fm(std::string code, Severity sev, const std::string& id, double value, double limit, Dimension d,
           std::string message) {
  return {std::move(code), sev, LayerRole::force_mains, id, "", value, limit, d, std::move(message)};
}

// Runs of consecutive points below the limit; each run is one finding at its highest pipe point
// (where air gathers: the valve candidate), with the lowest pressure head of the run. A free outlet
// sits at exactly 0 m, so the comparison allows a 1 mm rounding margin.
void subatmospheric(const model::Network& n, const StationResult& r, double limit, Findings& out) {
  struct Run {
    std::size_t first, last, lowest, case_index;
    double head;
  };
  std::map<std::size_t, Run> by_high_point;
  const auto& pts = r.layout.points;
  const double below = limit - 1e-3;
  for (std::size_t k = 0; k < r.cases.size(); ++k) {
    const auto& c = r.cases[k];
    if (!c.exists) continue;
    std::size_t i = 0;
    while (i < pts.size()) {
      if (!(c.pressure_head_m[i] < below)) {
        ++i;
        continue;
      }
      Run run{i, i, i, k, c.pressure_head_m[i]};
      std::size_t high = i;
      for (; i < pts.size() && c.pressure_head_m[i] < below; ++i) {
        run.last = i;
        if (c.pressure_head_m[i] < run.head) run.head = c.pressure_head_m[i], run.lowest = i;
        if (pts[i].centreline_m > pts[high].centreline_m) high = i;
      }
      auto it = by_high_point.find(high);
      if (it == by_high_point.end() || run.head < it->second.head) by_high_point[high] = run;
    }
  }
  const auto L = Dimension::length;
  for (const auto& [high, run] : by_high_point) {
    const auto& pt = pts[high];
    const std::string& id = n.conduits[pt.conduit].id;
    out.push_back(fm("FM_SUBATMOSPHERIC", Severity::warning, id, run.head, limit, Dimension::pressure_head,
                     "force main " + id + ": the HGL runs below the pipe from station " + q_station(pts[run.first].station_m) +
                         " to " + q_station(pts[run.last].station_m) + " (" + r.cases[run.case_index].label +
                         "), pressure head down to " + q(run.head, Dimension::pressure_head) + " at station " +
                         q_station(pts[run.lowest].station_m) + " against the limit " + q(limit, Dimension::pressure_head) +
                         "; air entry and column separation are likely: air-release valve candidate at the high point, station " +
                         q_station(pt.station_m) + " (pipe centreline " + q(pt.centreline_m, L) + ")."));
  }
}

void rating(const model::Network& n, const StationResult& r, Findings& out) {
  for (std::size_t ci : r.layout.chain) {
    const auto& c = n.conduits[ci];
    if (!c.rated_pressure_head_m) continue;
    double peak = -std::numeric_limits<double>::infinity();
    std::size_t at = 0, which = 0;
    for (std::size_t k = 0; k < r.cases.size(); ++k) {
      if (!r.cases[k].exists) continue;
      for (std::size_t i = 0; i < r.layout.points.size(); ++i)
        if (r.layout.points[i].conduit == ci && r.cases[k].pressure_head_m[i] > peak)
          peak = r.cases[k].pressure_head_m[i], at = i, which = k;
    }
    if (!(peak > *c.rated_pressure_head_m)) continue;
    out.push_back(fm("FM_PRESSURE_RATING", Severity::error, c.id, peak, *c.rated_pressure_head_m, Dimension::pressure_head,
                     "force main " + c.id + ": peak operating pressure head " + q(peak, Dimension::pressure_head) +
                         " at station " + q_station(r.layout.points[at].station_m) + " (" +
                         r.cases[which].label + ") exceeds its rated pressure " +
                         q(*c.rated_pressure_head_m, Dimension::pressure_head) + " (surge not included)."));
  }
}

void velocity(const model::Network& n, const StationResult& r, const model::ForceMainSettings& s, Findings& out) {
  for (std::size_t j = 0; j < r.layout.chain.size(); ++j) {
    const auto& c = n.conduits[r.layout.chain[j]];
    std::size_t lo = r.cases.size(), hi = r.cases.size();
    for (std::size_t k = 0; k < r.cases.size(); ++k) {
      if (!r.cases[k].exists) continue;
      const double v = r.cases[k].velocity_m_s[j];
      if (lo == r.cases.size() || v < r.cases[lo].velocity_m_s[j]) lo = k;
      if (hi == r.cases.size() || v > r.cases[hi].velocity_m_s[j]) hi = k;
    }
    if (lo == r.cases.size()) continue;
    const double v_lo = r.cases[lo].velocity_m_s[j], v_hi = r.cases[hi].velocity_m_s[j];
    if (v_lo < s.velocity_min_m_s)
      out.push_back(fm("FM_VELOCITY_LOW", Severity::warning, c.id, v_lo, s.velocity_min_m_s, Dimension::velocity,
                       "force main " + c.id + ": velocity " + q(v_lo, Dimension::velocity) + " (" + r.cases[lo].label +
                           ") is below the scour minimum " + q(s.velocity_min_m_s, Dimension::velocity) +
                           "; solids may settle."));
    if (v_hi > s.velocity_max_m_s)
      out.push_back(fm("FM_VELOCITY_HIGH", Severity::warning, c.id, v_hi, s.velocity_max_m_s, Dimension::velocity,
                       "force main " + c.id + ": velocity " + q(v_hi, Dimension::velocity) + " (" + r.cases[hi].label +
                           ") is above the maximum " + q(s.velocity_max_m_s, Dimension::velocity) + "."));
  }
}

}  // namespace

Findings check_station(const model::Network& network, const model::PumpStation& spec, const StationResult& r,
                       const model::ForceMainSettings& settings, double wet_well_inflow_m3_s) {
  Findings out;
  if (!r.layout.ok) return out;
  const std::string& first = network.conduits[r.layout.chain.front()].id;
  const bool any = std::any_of(r.cases.begin(), r.cases.end(), [](const PumpCase& c) { return c.exists; });
  const double shutoff = spec.curve.empty() ? nan : spec.curve.front().head_m;
  for (const auto& c : r.cases) {
    if (c.exists) continue;
    const std::string why =
        c.static_lift_m >= shutoff
            ? "the static lift " + q(c.static_lift_m, Dimension::length) + " reaches the shut-off head " +
                  q(shutoff, Dimension::length) + ", so the pumps cannot open their check valves"
            : "the system needs less head than the pump curve's last point gives, so the pumps would run out beyond "
              "their curve (static lift " + q(c.static_lift_m, Dimension::length) + ")";
    out.push_back(fm("FM_NO_OPERATING_POINT", any ? Severity::warning : Severity::error, first, c.static_lift_m, shutoff,
                     Dimension::length,
                     "pump station " + spec.id + " (" + c.label + "): the pump and system curves do not meet: " + why +
                         "; no steady flow is computed for this case."));
  }
  subatmospheric(network, r, settings.pressure_min_m, out);
  rating(network, r, out);
  velocity(network, r, settings, out);
  // Firm capacity with all duty pumps at the low wet-well level (the highest lift).
  double capacity = nan;
  for (const auto& c : r.cases)
    if (c.pumps == spec.duty_pumps && c.wet_well_m == spec.pump_off_m) capacity = c.exists ? c.flow_m3_s : 0.0;
  if (std::isfinite(capacity) && wet_well_inflow_m3_s > capacity)
    out.push_back({"PUMP_CAPACITY", Severity::warning, LayerRole::structures, spec.id, "", wet_well_inflow_m3_s, capacity,
                   Dimension::flow,
                   "pump station " + spec.id + ": the design inflow " + q(wet_well_inflow_m3_s, Dimension::flow) +
                       " exceeds the " + q(capacity, Dimension::flow) + " that all " + std::to_string(spec.duty_pumps) +
                       " duty pumps deliver at the low wet-well level; the wet well would fill and overflow."});
  return out;
}

}  // namespace rimline::solve
