// A deterministic sweep over many conduit, roughness, flow and tailwater combinations (from
// trickles to surcharge, adverse to very steep, with and without a supercritical inflow): every
// profile must come back without an exception and keep the contract the network march relies on.
#include <catch2/catch.hpp>

#include <cmath>
#include <random>
#include <string>

#include "rimline/hydraulics/gvf.hpp"
#include "rimline/units.hpp"

using namespace rimline::hydraulics;

TEST_CASE("sweep: 20000 random reaches keep the profile contract", "[gvf][sweep]") {
  std::mt19937 rng(20261201);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  constexpr double g = rimline::units::gravity_m_s2;
  int failures = 0;
  std::string first_failure;
  for (int i = 0; i < 20000; ++i) {
    ConduitReach r;
    const bool box = u(rng) < 0.3;
    const double rise = 0.1 + 3.0 * u(rng) * u(rng);
    r.section = box ? Section{Shape::box, 0.0, rise * (0.5 + 2.0 * u(rng)), rise, {}} : Section{Shape::circular, rise, 0.0, 0.0, {}};
    if (u(rng) < 0.3) {
      r.roughness.law = FrictionLaw::darcy_weisbach;
      r.roughness.ks_m = 1e-5 + 3e-3 * u(rng);
    } else {
      r.roughness.manning_n = 0.009 + 0.02 * u(rng);
    }
    r.length_m = 0.5 + 500.0 * u(rng) * u(rng);
    const double pick = u(rng);
    const double slope = pick < 0.1 ? 0.0 : pick < 0.25 ? -0.01 * u(rng) : 0.15 * std::pow(u(rng), 3);
    r.invert_down_m = 100.0;
    r.invert_up_m = 100.0 + slope * r.length_m;
    const double q_full = full_capacity_m3_s(r.roughness, r.section, std::max(slope, 1e-4));
    r.flow_m3_s = u(rng) < 0.05 ? 0.0 : q_full * 1.3 * std::pow(u(rng), 2);
    const double level = 100.0 + (2.5 * u(rng) - 0.8) * rise;
    GvfOptions opt;
    if (u(rng) < 0.1) opt.inlet_supercritical_depth_m = 0.3 * rise * u(rng);

    std::string why;
    try {
      const ConduitProfile p = compute_profile(r, level, opt);
      if (p.points.size() < 2) why = "fewer than 2 points";
      if (p.points.size() > 200) why = "more than 200 points";
      if (!p.converged) why = "not converged: " + p.note;
      if (p.outlet().station_m != 0.0 || std::fabs(p.inlet().station_m - r.length_m) > 1e-9) why = "ends not at 0 and L";
      for (std::size_t k = 0; k < p.points.size(); ++k) {
        const ProfilePoint& q = p.points[k];
        if (!std::isfinite(q.egl_m) || !std::isfinite(q.hgl_m)) why = "non-finite level";
        if (std::fabs(q.egl_m - q.hgl_m - q.velocity_m_s * q.velocity_m_s / (2 * g)) > 1e-9) why = "EGL - HGL != V^2/2g";
        if (k > 0 && q.egl_m < p.points[k - 1].egl_m - 1e-9) why = "EGL rises downstream";
        if (k > 0 && q.station_m < p.points[k - 1].station_m) why = "stations out of order";
      }
      // Energy balance (circles: a box's friction slope jumps at the soffit). Profiles flagged as
      // near-critical-slope approximations, and absurd ones (velocity heads over 100 m), are exempt.
      const bool exempt = box || r.flow_m3_s == 0.0 || p.note.find("near-critical") != std::string::npos ||
                          p.inlet().egl_m - p.inlet().hgl_m > 100.0;
      if (!exempt) {
        double friction = 0.0;
        for (std::size_t k = 1; k < p.points.size(); ++k) {
          const ProfilePoint &a = p.points[k - 1], &b = p.points[k];
          const double sa = friction_slope(r.roughness, r.section, r.flow_m3_s, a.full ? 1e9 : a.depth_m);
          const double sb = friction_slope(r.roughness, r.section, r.flow_m3_s, b.full ? 1e9 : b.depth_m);
          friction += 0.5 * (sa + sb) * (b.station_m - a.station_m);
        }
        if (std::fabs(p.inlet().egl_m - p.outlet().egl_m - friction - p.jump_loss_m) > 1e-5) why = "EGL drop != friction + jump";
      }
    } catch (const std::exception& e) {
      why = std::string("threw: ") + e.what();
    }
    if (!why.empty()) {
      if (failures++ == 0) first_failure = "case " + std::to_string(i) + ": " + why;
    }
  }
  INFO(first_failure);
  CHECK(failures == 0);
}
