// Operating points of a pump station and the HGL / EGL / pressure head along its force main.
//   EGL at the main's outlet = discharge level + V_out^2/2g (the outlet's velocity head is lost in
//   the receiving structure: exit K = 1); friction adds Sf L upstream along each conduit; the
//   fittings' K V^2/2g sits at the pump end. Pump head = EGL just downstream of the fittings +
//   fittings loss - wet-well level (the wet well's velocity head is negligible).
#include <algorithm>
#include <cmath>

#include "rimline/hydraulics/losses.hpp"
#include "rimline/solve/force_main.hpp"

namespace rimline::solve {
namespace {

struct Main {
  std::vector<double> area_m2, length_m;
  std::vector<hydraulics::Roughness> roughness;
  std::vector<hydraulics::Section> section;
};

Main main_of(const model::Network& n, const StationLayout& l, const model::ForceMainSettings& s) {
  Main m;
  for (std::size_t ci : l.chain) {
    const auto& c = n.conduits[ci];
    m.section.push_back(c.section);
    m.area_m2.push_back(hydraulics::full_geometry(c.section).area_m2);
    m.length_m.push_back(c.length_m);
    m.roughness.push_back(force_main_roughness(c, s));
  }
  return m;
}

double friction_m(const Main& m, double q, std::size_t k) {
  return hydraulics::full_friction_slope(m.roughness[k], m.section[k], q) * m.length_m[k];
}

// The EGL just downstream of the pump-end fittings, for flow q into discharge level h_d.
double egl_start(const Main& m, double q, double h_d) {
  double e = h_d + hydraulics::velocity_head_m(q / m.area_m2.back());
  for (std::size_t k = 0; k < m.area_m2.size(); ++k) e += friction_m(m, q, k);
  return e;
}

void fill_profile(const Main& m, const StationLayout& l, double h_d, PumpCase& c) {
  const double q = c.flow_m3_s;
  for (double a : m.area_m2) c.velocity_m_s.push_back(q / a);
  // Station where each chain conduit starts, and the friction slope on it.
  std::vector<double> start(m.area_m2.size(), 0.0), slope(m.area_m2.size(), 0.0);
  for (std::size_t k = 0; k < m.area_m2.size(); ++k) {
    slope[k] = hydraulics::full_friction_slope(m.roughness[k], m.section[k], q);
    if (k + 1 < m.area_m2.size()) start[k + 1] = start[k] + m.length_m[k];
  }
  double egl_at_start = egl_start(m, q, h_d);
  std::size_t k = 0;
  double egl_k = egl_at_start;  // EGL where conduit k starts
  for (const auto& p : l.points) {
    while (k + 1 < l.chain.size() && l.chain[k] != p.conduit) {
      egl_k -= slope[k] * m.length_m[k];
      ++k;
    }
    const double egl = egl_k - slope[k] * std::clamp(p.station_m - start[k], 0.0, m.length_m[k]);
    const double hgl = egl - hydraulics::velocity_head_m(c.velocity_m_s[k]);
    c.egl_m.push_back(egl);
    c.hgl_m.push_back(hgl);
    c.pressure_head_m.push_back(hgl - p.centreline_m);
  }
}

std::string case_label(bool high, int pumps) {
  return std::string(high ? "wet well high (pump on)" : "wet well low (pump off)") + ", " + std::to_string(pumps) +
         (pumps == 1 ? " pump" : " pumps");
}

}  // namespace

hydraulics::Roughness force_main_roughness(const model::Conduit& c, const model::ForceMainSettings& s) {
  hydraulics::Roughness r = c.roughness;
  r.law = s.friction;
  if (s.friction == hydraulics::FrictionLaw::hazen_williams) r.hazen_c = s.hazen_c;
  return r;
}

StationResult solve_station(const model::Network& network, const model::PumpStation& spec, const StationLayout& layout,
                            const model::ForceMainSettings& settings, double receiving_hgl_m) {
  StationResult r;
  r.layout = layout;
  if (!layout.ok) return r;
  const Main m = main_of(network, layout, settings);
  const double outlet = layout.points.back().centreline_m;
  const std::string& receiving = network.structures[layout.discharge].id;
  if (spec.discharge_level_m) {
    r.discharge_level_m = *spec.discharge_level_m;
    r.discharge_basis = "fixed level (project file)";
  } else if (std::isfinite(receiving_hgl_m) && receiving_hgl_m >= outlet) {
    r.discharge_level_m = receiving_hgl_m;
    r.discharge_basis = "water level in " + receiving + " (gravity march)";
  } else {
    r.discharge_level_m = outlet;
    r.discharge_basis = "free outlet into " + receiving + " (outlet centreline above its water level)";
  }
  const hydraulics::PumpCurve pump(spec.curve);
  std::vector<int> pump_counts{1};
  if (spec.duty_pumps > 1) pump_counts.push_back(spec.duty_pumps);
  for (bool high : {false, true}) {
    for (int n : pump_counts) {
      PumpCase c;
      c.label = case_label(high, n);
      c.wet_well_m = high ? spec.pump_on_m : spec.pump_off_m;
      c.pumps = n;
      c.static_lift_m = r.discharge_level_m - c.wet_well_m;
      auto system = [&](double q) {
        return egl_start(m, q, r.discharge_level_m) + spec.fittings_k * hydraulics::velocity_head_m(q / m.area_m2.front()) -
               c.wet_well_m;
      };
      const auto op = hydraulics::operating_point(pump, n, system);
      c.exists = op.exists;
      if (op.exists) {
        c.flow_m3_s = op.flow_m3_s;
        c.head_m = op.head_m;
        fill_profile(m, layout, r.discharge_level_m, c);
      }
      r.cases.push_back(std::move(c));
    }
  }
  for (std::size_t k = 0; k < r.cases.size(); ++k)
    if (r.cases[k].exists && r.cases[k].flow_m3_s > r.design_flow_m3_s) {
      r.design_flow_m3_s = r.cases[k].flow_m3_s;
      r.design_case = k;
    }
  return r;
}

}  // namespace rimline::solve
