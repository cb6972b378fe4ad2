// Water-surface profiles: invariants that hold for every case, and the control semantics the
// network march relies on.
#include <catch2/catch.hpp>

#include <cmath>
#include <limits>
#include <vector>

#include "rimline/error.hpp"
#include "rimline/hydraulics/gvf.hpp"
#include "rimline/units.hpp"

using namespace rimline::hydraulics;

namespace {
constexpr double g = rimline::units::gravity_m_s2;
const Section d1000{Shape::circular, 1.0, 0.0, 0.0, {}};

ConduitReach reach(double slope, double flow, double length = 100.0, Section s = d1000) {
  ConduitReach r;
  r.section = s;
  r.length_m = length;
  r.invert_down_m = 10.0;
  r.invert_up_m = 10.0 + slope * length;
  r.flow_m3_s = flow;
  return r;
}

struct Case {
  const char* name;
  ConduitReach reach;
  double level;
};

std::vector<Case> battery() {
  return {
      {"mild free outlet (M2)", reach(0.001, 0.5), 9.0},
      {"mild backwater (M1)", reach(0.001, 0.5), 10.9},
      {"mild partly surcharged", reach(0.001, 0.5), 11.04},
      {"mild surcharged to inlet", reach(0.001, 0.5), 11.3},
      {"over capacity", reach(0.001, 2.0), 9.0},
      {"steep free (S2)", reach(0.02, 0.8), 9.0},
      {"steep jump", reach(0.02, 0.8), 10.9},
      {"steep jump below surcharge", reach(0.02, 0.8), 11.6},
      {"steep drowned", reach(0.005, 0.8, 30.0), 11.3},
      {"horizontal (H2)", reach(0.0, 0.5), 9.0},
      {"horizontal to crown", reach(0.0, 0.9, 300.0), 9.0},
      {"adverse (A2)", reach(-0.001, 0.5), 9.0},
      {"near-full mild", reach(0.001, 1.0), 10.99},
      {"tiny flow", reach(0.004, 1e-4), 9.0},
      {"small pipe steep", reach(0.05, 0.02, 40.0, Section{Shape::circular, 0.225, 0, 0, {}}), 9.0},
  };
}

double area(const Section& s, double y, bool full) { return full ? full_geometry(s).area_m2 : geometry_at(s, y).area_m2; }
}  // namespace

TEST_CASE("every point: EGL - HGL = V^2/2g with V = Q/A; stations ordered outlet to inlet", "[gvf][invariant]") {
  for (const Case& c : battery()) {
    INFO(c.name);
    const ConduitProfile p = compute_profile(c.reach, c.level);
    REQUIRE(p.points.size() >= 2);
    CHECK(p.points.size() < 120);  // accuracy-controlled steps keep profiles modest
    CHECK(p.outlet().station_m == 0.0);
    CHECK(p.inlet().station_m == Approx(c.reach.length_m).epsilon(1e-12));
    for (std::size_t i = 0; i < p.points.size(); ++i) {
      const ProfilePoint& q = p.points[i];
      const double v = c.reach.flow_m3_s / area(c.reach.section, q.depth_m, q.full);
      CHECK(q.velocity_m_s == Approx(v).epsilon(1e-12));
      CHECK(q.egl_m - q.hgl_m == Approx(v * v / (2 * g)).epsilon(1e-9).margin(1e-12));
      if (!q.full) CHECK(q.hgl_m == Approx(q.invert_m + q.depth_m).epsilon(1e-13));
      if (q.full) CHECK(q.hgl_m >= q.invert_m + rise_m(c.reach.section) - 1e-9);
      if (i > 0) CHECK(q.station_m >= p.points[i - 1].station_m);
    }
  }
}

TEST_CASE("EGL never rises downstream, and its drop is friction plus the jump loss", "[gvf][invariant]") {
  for (const Case& c : battery()) {
    INFO(c.name);
    const ConduitProfile p = compute_profile(c.reach, c.level);
    double friction = 0.0;
    for (std::size_t i = 1; i < p.points.size(); ++i) {
      const ProfilePoint &a = p.points[i - 1], &b = p.points[i];
      CHECK(b.egl_m >= a.egl_m - 1e-12);
      // Trapezoidal friction between points: the standard step's own energy balance.
      const double sa = friction_slope(c.reach.roughness, c.reach.section, c.reach.flow_m3_s, a.full ? 1e9 : a.depth_m);
      const double sb = friction_slope(c.reach.roughness, c.reach.section, c.reach.flow_m3_s, b.full ? 1e9 : b.depth_m);
      friction += 0.5 * (sa + sb) * (b.station_m - a.station_m);
    }
    CHECK(p.inlet().egl_m - p.outlet().egl_m == Approx(friction + p.jump_loss_m).margin(1e-7));
  }
}

TEST_CASE("a long mild pipe approaches normal depth upstream", "[gvf][invariant]") {
  for (double level : {9.0, 10.45, 10.95}) {
    const ConduitProfile p = compute_profile(reach(0.001, 0.5, 3000.0), level);
    const DepthSolve yn = normal_depth(Roughness{}, d1000, 0.5, 0.001);
    CHECK(p.inlet().depth_m == Approx(yn.depth_m).margin(1e-3));
    CHECK(p.governs == Governs::normal_depth);
    CHECK(p.normal_depth_m == Approx(yn.depth_m));
  }
}

TEST_CASE("a profile starting at normal depth stays there", "[gvf][invariant]") {
  for (double slope : {0.0005, 0.003}) {  // mild: the outlet level is the control
    const DepthSolve yn = normal_depth(Roughness{}, d1000, 0.4, slope);
    const ConduitProfile p = compute_profile(reach(slope, 0.4), 10.0 + yn.depth_m);
    for (const ProfilePoint& q : p.points) CHECK(q.depth_m == Approx(yn.depth_m).margin(1e-6));
  }
  for (double slope : {0.01, 0.05}) {  // steep: the inlet depth is the control
    GvfOptions opt;
    opt.inlet_supercritical_depth_m = normal_depth(Roughness{}, d1000, 0.4, slope).depth_m;
    const ConduitProfile p = compute_profile(reach(slope, 0.4), 9.0, opt);
    for (const ProfilePoint& q : p.points) CHECK(q.depth_m == Approx(opt.inlet_supercritical_depth_m).margin(1e-6));
    CHECK(p.profile_class == "uniform");
  }
  const ConduitProfile mild = compute_profile(reach(0.003, 0.4), 10.0 + normal_depth(Roughness{}, d1000, 0.4, 0.003).depth_m);
  CHECK(mild.profile_class == "uniform");
  CHECK(mild.points.size() <= 3);
}

TEST_CASE("free outlet: critical depth at a mild outlet, the supercritical depth at a steep one", "[gvf][control]") {
  const ConduitProfile mild = compute_profile(reach(0.001, 0.5), 9.0);
  CHECK(mild.free_outlet);
  CHECK(mild.outlet().depth_m == Approx(critical_depth(d1000, 0.5).depth_m).margin(1e-9));
  CHECK(mild.profile_class == "M2");
  CHECK(mild.governs == Governs::critical_depth_outlet);
  CHECK(mild.regime == Regime::subcritical);
  const ConduitProfile steep = compute_profile(reach(0.02, 0.8), 10.2);
  CHECK(steep.free_outlet);
  CHECK(steep.outlet().depth_m < steep.critical_depth_m);
  CHECK(steep.outlet().depth_m > steep.normal_depth_m);
  CHECK(steep.inlet().depth_m == Approx(steep.critical_depth_m).margin(1e-9));
  CHECK(steep.profile_class == "S2");
  CHECK(steep.governs == Governs::inlet_control);
  CHECK(steep.regime == Regime::supercritical);
}

TEST_CASE("surcharged outlet: pressure flow until the HGL meets the crown, then M1", "[gvf][control]") {
  const ConduitReach r = reach(0.001, 0.5);
  const ConduitProfile p = compute_profile(r, 11.04);
  const double sf = full_friction_slope(r.roughness, r.section, 0.5);
  const double x_meet = (11.04 - 11.0) / (0.001 - sf);  // HGL 11.04 + sf x meets crown 11.0 + 0.001 x
  CHECK(p.outlet().full);
  CHECK(p.outlet().regime == Regime::pressurized);
  CHECK(p.inlet().regime == Regime::subcritical);
  CHECK(p.outlet().hgl_m == 11.04);
  CHECK(p.surcharged_length_m == Approx(x_meet).epsilon(1e-12));
  CHECK(p.profile_class == "M1-full");
  CHECK(p.regime == Regime::partly_pressurized);
  CHECK_FALSE(p.inlet().full);
  const ConduitProfile all = compute_profile(r, 11.3);
  CHECK(all.profile_class == "full");
  CHECK(all.regime == Regime::pressurized);
  CHECK(all.governs == Governs::surcharge);
  CHECK(all.inlet().hgl_m == Approx(11.3 + sf * 100.0).epsilon(1e-12));
}

TEST_CASE("flow above full capacity runs pressurized from the outlet crown, never throws", "[gvf][control]") {
  const ConduitReach r = reach(0.001, 2.0);
  const ConduitProfile p = compute_profile(r, 9.0);
  const double sf = full_friction_slope(r.roughness, r.section, 2.0);
  CHECK(p.regime == Regime::pressurized);
  CHECK(p.governs == Governs::surcharge);
  CHECK(p.outlet().hgl_m == 11.0);
  CHECK(p.inlet().hgl_m == Approx(11.0 + sf * 100.0).epsilon(1e-12));
  CHECK(std::isnan(p.normal_depth_m));
  CHECK_FALSE(p.note.empty());
  CHECK(compute_profile(r, 12.0).outlet().hgl_m == 12.0);
}

TEST_CASE("steep pipe with tailwater: jump where the specific forces balance", "[gvf][control]") {
  const ConduitReach r = reach(0.02, 0.8);
  const ConduitProfile p = compute_profile(r, 10.9);
  REQUIRE(p.jump_station_m.has_value());
  CHECK(*p.jump_station_m > 0.0);
  CHECK(*p.jump_station_m < 100.0);
  CHECK(p.profile_class == "S2-jump-S1");
  CHECK(p.regime == Regime::mixed);
  CHECK(p.governs == Governs::inlet_control);
  std::size_t k = 0;
  while (p.points[k].station_m != *p.jump_station_m) ++k;
  const ProfilePoint &down = p.points[k], &up = p.points[k + 1];
  CHECK(up.station_m == down.station_m);
  CHECK(up.depth_m < p.critical_depth_m);
  CHECK(down.depth_m > p.critical_depth_m);
  CHECK(specific_force_m3(r.section, 0.8, down.depth_m) == Approx(specific_force_m3(r.section, 0.8, up.depth_m)).epsilon(1e-5));
  CHECK(p.jump_loss_m == Approx(up.egl_m - down.egl_m).margin(1e-12));
  // Per-point regime: subcritical below the jump, supercritical above it, critical at the inlet.
  for (std::size_t i = 0; i + 1 < p.points.size(); ++i) {
    CHECK(p.points[i].regime == (i <= k ? Regime::subcritical : Regime::supercritical));
    CHECK((p.points[i].froude > 1.0) == (i > k));
  }
  CHECK(p.inlet().froude == Approx(1.0).epsilon(1e-6));
  CHECK(p.jump_loss_m > 0.0);
  // A low tailwater cannot hold the jump: supercritical to the outlet.
  CHECK(compute_profile(r, 10.45).profile_class == "S2");
  // A high one drowns it: subcritical (S1) up to the inlet.
  const ConduitProfile drowned = compute_profile(reach(0.005, 0.8, 30.0), 10.95);
  CHECK(drowned.profile_class == "S1");
  CHECK(drowned.governs == Governs::outlet_water_level);
}

TEST_CASE("horizontal and adverse conduits: H2 and A2 from a free outlet, surcharge upstream", "[gvf][control]") {
  const ConduitProfile h = compute_profile(reach(0.0, 0.5), 9.0);
  CHECK(h.profile_class == "H2");
  CHECK(std::isnan(h.normal_depth_m));
  CHECK(h.inlet().depth_m > h.outlet().depth_m);
  const ConduitProfile a = compute_profile(reach(-0.001, 0.5), 9.0);
  CHECK(a.profile_class == "A2");
  const ConduitProfile crown = compute_profile(reach(0.0, 0.9, 300.0), 9.0);
  CHECK(crown.profile_class == "full-H2");
  CHECK(crown.inlet().full);
  CHECK(crown.surcharged_length_m > 0.0);
  CHECK(crown.governs == Governs::surcharge);
}

TEST_CASE("supercritical inflow at the inlet: M3 into a jump, S3 on a steep pipe", "[gvf][control]") {
  GvfOptions opt;
  opt.inlet_supercritical_depth_m = 0.15;
  const ConduitProfile m = compute_profile(reach(0.001, 0.5), 10.8, opt);
  CHECK(m.profile_class.rfind("M3-jump-", 0) == 0);
  CHECK(m.inlet().depth_m == Approx(0.15));
  const ConduitProfile s = compute_profile(reach(0.02, 0.8), 9.0, opt);
  CHECK(s.profile_class == "S3");
  CHECK(compute_profile(reach(0.0, 0.5), 10.8, opt).profile_class.rfind("H3-jump-", 0) == 0);
  CHECK(compute_profile(reach(-0.001, 0.5), 10.5, opt).profile_class.rfind("A3-jump-", 0) == 0);
  CHECK(compute_profile(reach(-0.001, 0.5), 10.8, opt).profile_class == "A2");  // a deep tailwater drowns the jump
  CHECK(s.outlet().depth_m > 0.15);
  CHECK(s.outlet().depth_m < s.normal_depth_m);
}

TEST_CASE("zero flow: a level pool where the water stands above the invert, else dry", "[gvf][control]") {
  const ConduitProfile pool = compute_profile(reach(0.001, 0.0), 10.05);
  CHECK(pool.governs == Governs::still_water);
  CHECK(pool.outlet().hgl_m == 10.05);
  CHECK(pool.inlet().depth_m == 0.0);
  CHECK(pool.inlet().hgl_m == Approx(10.1));
  for (const ProfilePoint& q : pool.points) CHECK(q.egl_m == q.hgl_m);
  const ConduitProfile dry = compute_profile(reach(0.001, 0.0), 9.0);
  CHECK(dry.regime == Regime::dry);
  CHECK(dry.points.size() >= 2);
  CHECK(dry.outlet().depth_m == 0.0);
  CHECK(dry.outlet().hgl_m == 10.0);
  const ConduitProfile drowned = compute_profile(reach(0.001, 0.0), 12.0);
  CHECK(drowned.regime == Regime::pressurized);
}

TEST_CASE("bad reach arguments are rimline::Error(bad_argument)", "[gvf][bad]") {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  auto bad = [](ConduitReach r, double level) {
    try {
      compute_profile(r, level);
    } catch (const rimline::Error& e) {
      return e.kind() == rimline::ErrorKind::bad_argument;
    }
    return false;
  };
  ConduitReach r = reach(0.001, 0.5);
  CHECK(bad(r, nan));
  r.length_m = 0.0;
  CHECK(bad(r, 10.5));
  r = reach(0.001, 0.5);
  r.flow_m3_s = -0.1;
  CHECK(bad(r, 10.5));
  r.flow_m3_s = nan;
  CHECK(bad(r, 10.5));
  r = reach(0.001, 0.5);
  r.section.diameter_m = -1.0;
  CHECK(bad(r, 10.5));
  r = reach(0.001, 0.5);
  r.invert_up_m = nan;
  CHECK(bad(r, 10.5));
}
