// The egg (ovoid) section and the closed section given by a depth -> width table: geometry, normal and
// critical depth, profiles and full flow. Check values: the standard egg's full-bore area, perimeter and
// hydraulic radius (A = 1.1485 D^2, P = 3.965 D, R = 0.2897 D for width D, height 1.5 D; the
// "old form" egg-shaped sewer's hydraulic elements as printed in sewer-design handbooks; from memory).
// Everything else here is an invariant (dA/dy = T, d(A zbar)/dy = A, continuity at the arcs' joins,
// a table that is a box is the box, a fine table of the egg is the egg) on invented sizes.
#include <catch2/catch.hpp>

#include <cmath>
#include <memory>
#include <numbers>

#include "rimline/error.hpp"
#include "rimline/hydraulics/depth.hpp"
#include "rimline/hydraulics/gvf.hpp"
#include "rimline/units.hpp"

using namespace rimline::hydraulics;

namespace {
constexpr double g = rimline::units::gravity_m_s2;

Section egg(double width) {
  Section s;
  s.shape = Shape::egg;
  s.width_m = width;
  s.height_m = egg_height_over_width * width;
  return s;
}

Section table_section(double width, double height, std::vector<double> depth, std::vector<double> w) {
  Section s;
  s.shape = Shape::table;
  s.width_m = width;
  s.height_m = height;
  s.table = std::make_shared<SectionTable>(SectionTable{"test", std::move(depth), std::move(w)});
  return s;
}

// The standard egg tabulated at n + 1 depths (width fractions from the egg's own top width).
Section egg_as_table(double width, int n) {
  const Section e = egg(width);
  std::vector<double> depth, w;
  for (int i = 0; i <= n; ++i) {
    const double f = static_cast<double>(i) / n;
    depth.push_back(f);
    w.push_back(i == 0 || i == n ? 0.0 : geometry_at(e, f * e.height_m).top_width_m / width);
  }
  // The widest row must be exactly 1: the egg is widest at two thirds of its height.
  double widest = 0.0;
  for (double x : w) widest = std::max(widest, x);
  for (double& x : w) x /= widest;
  return table_section(width * widest, e.height_m, depth, w);
}

ConduitReach reach(const Section& s, double slope, double flow, double length = 200.0) {
  ConduitReach r;
  r.section = s;
  r.length_m = length;
  r.invert_down_m = 10.0;
  r.invert_up_m = 10.0 + slope * length;
  r.flow_m3_s = flow;
  return r;
}
}  // namespace

TEST_CASE("standard egg full bore: A = 1.1485 D^2, P = 3.965 D, R = 0.2897 D (handbook values, from memory)",
          "[section][egg]") {
  for (double d : {0.6, 1.0, 1.8}) {
    const Geometry full = full_geometry(egg(d));
    CHECK(full.area_m2 / (d * d) == Approx(1.1485).margin(5e-4));
    CHECK(full.wetted_perimeter_m / d == Approx(3.965).margin(1e-3));
    CHECK(full.hydraulic_radius_m / d == Approx(0.2897).margin(2e-4));
    CHECK(full.top_width_m == 0.0);
    CHECK(rise_m(egg(d)) == Approx(1.5 * d).epsilon(1e-15));
  }
}

TEST_CASE("egg: widest (T = D) at two thirds of its height, closes at the crown, joins its arcs smoothly",
          "[section][egg]") {
  const Section e = egg(1.2);
  const double r = e.height_m / 3.0;
  CHECK(geometry_at(e, 2.0 * r).top_width_m == Approx(1.2).epsilon(1e-12));
  CHECK(geometry_at(e, e.height_m - 1e-9).top_width_m < 1e-3);
  // In the invert arc (radius R/2, centre R/2 up) at y = 0.1 R: T = 2 sqrt(0.25 - 0.16) R = 0.6 R.
  CHECK(geometry_at(e, 0.1 * r).top_width_m == Approx(0.6 * r).epsilon(1e-12));
  for (double join : {0.2 * r, 2.0 * r, 2.5 * r}) {
    INFO("join at y = " << join);
    const Geometry lo = geometry_at(e, join * (1 - 1e-9)), hi = geometry_at(e, join * (1 + 1e-9));
    CHECK(lo.area_m2 == Approx(hi.area_m2).epsilon(1e-7));
    CHECK(lo.wetted_perimeter_m == Approx(hi.wetted_perimeter_m).epsilon(1e-7));
    CHECK(lo.top_width_m == Approx(hi.top_width_m).epsilon(1e-6));
  }
}

TEST_CASE("egg and table: dA/dy = T, d(A zbar)/dy = A, area below full and rising (invariants)", "[section][egg][table]") {
  const Section shapes[] = {egg(0.9), egg_as_table(0.9, 12),
                            table_section(1.0, 1.2, {0.0, 0.3, 0.8, 1.0}, {0.5, 1.0, 0.7, 0.0}),
                            table_section(2.0, 1.0, {0.0, 0.5, 1.0}, {0.8, 1.0, 1.0})};
  for (const Section& s : shapes) {
    INFO(shape_name(s.shape));
    const double h = rise_m(s), full = full_geometry(s).area_m2;
    double last = 0.0;
    for (double f : {0.03, 0.1, 0.18, 0.25, 0.4, 0.55, 0.66, 0.7, 0.85, 0.95, 0.99}) {
      const double y = f * h, dy = 1e-6 * h;
      const Geometry geo = geometry_at(s, y);
      const double da = (geometry_at(s, y + dy).area_m2 - geometry_at(s, y - dy).area_m2) / (2 * dy);
      CHECK(da == Approx(geo.top_width_m).epsilon(1e-5));
      const double dm = (area_moment_m3(s, y + dy) - area_moment_m3(s, y - dy)) / (2 * dy);
      CHECK(dm == Approx(geo.area_m2).epsilon(1e-5));
      CHECK(geo.area_m2 > last);
      CHECK(geo.area_m2 < full);
      last = geo.area_m2;
    }
  }
}

TEST_CASE("a table of constant width is the box; a fine table of the egg is the egg", "[section][table]") {
  const Section box{Shape::box, 0.0, 1.8, 1.2, {}};
  const Section as_table = table_section(1.8, 1.2, {0.0, 1.0}, {1.0, 1.0});
  CHECK_FALSE(closes_at_soffit(as_table));
  for (double y : {0.05, 0.6, 1.19, 1.2}) {
    const Geometry a = geometry_at(box, y), b = geometry_at(as_table, y);
    CHECK(b.area_m2 == Approx(a.area_m2).epsilon(1e-14));
    CHECK(b.wetted_perimeter_m == Approx(a.wetted_perimeter_m).epsilon(1e-14));
    CHECK(b.top_width_m == Approx(a.top_width_m).epsilon(1e-14));
    CHECK(area_moment_m3(as_table, y) == Approx(area_moment_m3(box, y)).epsilon(1e-13));
  }
  CHECK(full_geometry(as_table).wetted_perimeter_m == Approx(full_geometry(box).wetted_perimeter_m).epsilon(1e-14));
  CHECK(critical_depth(as_table, 1.5).depth_m == Approx(critical_depth(box, 1.5).depth_m).epsilon(1e-9));
  CHECK(normal_depth(Roughness{}, as_table, 1.5, 0.002).depth_m ==
        Approx(normal_depth(Roughness{}, box, 1.5, 0.002).depth_m).epsilon(1e-9));

  const Section e = egg(1.0), fine = egg_as_table(1.0, 400);
  CHECK(closes_at_soffit(fine));
  // Chords of 1/400 of the height fall short of the arcs by ~1e-4 of the area.
  CHECK(full_geometry(fine).area_m2 == Approx(full_geometry(e).area_m2).epsilon(3e-4));
  CHECK(full_geometry(fine).wetted_perimeter_m == Approx(full_geometry(e).wetted_perimeter_m).epsilon(3e-4));
  CHECK(critical_depth(fine, 0.8).depth_m == Approx(critical_depth(e, 0.8).depth_m).epsilon(1e-3));
  CHECK(normal_depth(Roughness{}, fine, 0.8, 0.003).depth_m ==
        Approx(normal_depth(Roughness{}, e, 0.8, 0.003).depth_m).epsilon(1e-3));
}

TEST_CASE("egg: normal depth meets Manning, critical depth meets Q^2 T = g A^3, above the peak none",
          "[depth][egg]") {
  const Section e = egg(0.8);
  const Roughness n013{};
  for (double q : {0.01, 0.1, 0.4}) {
    INFO("Q = " << q);
    const DepthSolve yn = normal_depth(n013, e, q, 0.004);
    REQUIRE(yn.exists);
    const Geometry a = geometry_at(e, yn.depth_m);
    // Manning (SI): Q = A R^(2/3) S^(1/2) / n.
    CHECK(a.area_m2 * std::pow(a.hydraulic_radius_m, 2.0 / 3.0) * std::sqrt(0.004) / 0.013 == Approx(q).epsilon(1e-8));
    const DepthSolve yc = critical_depth(e, q);
    REQUIRE(yc.exists);
    const Geometry c = geometry_at(e, yc.depth_m);
    CHECK(q * q * c.top_width_m / (g * std::pow(c.area_m2, 3)) == Approx(1.0).epsilon(1e-7));
  }
  // The peak of Q(y) lies below the crown (as in the circle): the peak flow is above full-bore flow.
  const PeakFlow peak = peak_partly_full_flow(n013, e, 0.004);
  const Geometry full = full_geometry(e);
  const double q_full = full.area_m2 * std::pow(full.hydraulic_radius_m, 2.0 / 3.0) * std::sqrt(0.004) / 0.013;
  CHECK(peak.depth_m > 0.85 * e.height_m);
  CHECK(peak.depth_m < e.height_m);
  CHECK(peak.flow_m3_s > q_full);
  CHECK_FALSE(normal_depth(n013, e, 1.01 * peak.flow_m3_s, 0.004).exists);
}

TEST_CASE("egg and table pipes: profiles keep EGL - HGL = V^2/2g, reach normal depth, run full like the circle",
          "[gvf][egg][table]") {
  const Section shapes[] = {egg(0.9), table_section(1.0, 1.2, {0.0, 0.3, 0.8, 1.0}, {0.5, 1.0, 0.7, 0.0})};
  for (const Section& s : shapes) {
    INFO(shape_name(s.shape));
    const double q = 0.3, slope = 0.001;
    const DepthSolve yn = normal_depth(Roughness{}, s, q, slope);
    REQUIRE(yn.exists);
    // Free outlet on a mild slope: M2 from critical depth, normal depth far upstream.
    const ConduitProfile m2 = compute_profile(reach(s, slope, q, 3000.0), 9.0);
    CHECK(m2.outlet().depth_m == Approx(critical_depth(s, q).depth_m).margin(1e-9));
    CHECK(m2.inlet().depth_m == Approx(yn.depth_m).margin(1e-3));
    for (const ProfilePoint& p : m2.points) {
      const double v = q / geometry_at(s, p.depth_m).area_m2;
      CHECK(p.egl_m - p.hgl_m == Approx(v * v / (2 * g)).epsilon(1e-9));
    }
    // Tailwater above the crown throughout: pressure flow with the full section's friction slope.
    const ConduitReach r = reach(s, slope, q);
    const ConduitProfile full = compute_profile(r, 12.0);
    CHECK(full.profile_class == "full");
    CHECK(full.inlet().hgl_m == Approx(12.0 + full_friction_slope(Roughness{}, s, q) * 200.0).epsilon(1e-12));
    const Geometry fg = full_geometry(s);
    CHECK(full_friction_slope(Roughness{}, s, q) ==
          Approx(std::pow(q * 0.013 / (fg.area_m2 * std::pow(fg.hydraulic_radius_m, 2.0 / 3.0)), 2)).epsilon(1e-12));
    // A steep egg with tailwater: a jump where the specific forces balance.
    const ConduitProfile jump = compute_profile(reach(s, 0.03, q, 100.0), 10.0 + 0.9 * rise_m(s) - 0.0);
    if (jump.jump_station_m) {
      std::size_t k = 0;
      while (jump.points[k].station_m != *jump.jump_station_m) ++k;
      CHECK(specific_force_m3(s, q, jump.points[k].depth_m) ==
            Approx(specific_force_m3(s, q, jump.points[k + 1].depth_m)).epsilon(1e-5));
    }
  }
}

TEST_CASE("bad egg and table sections are refused", "[section][table]") {
  auto refused = [](const Section& s) {
    try {
      validate(s);
      return false;
    } catch (const rimline::Error& e) {
      return e.kind() == rimline::ErrorKind::bad_argument;
    }
  };
  Section e = egg(1.0);
  e.height_m = 0.0;
  CHECK(refused(e));
  CHECK(refused(table_section(1.0, 1.0, {0.0, 0.6, 0.5, 1.0}, {0.5, 1.0, 1.0, 0.0})));  // depths fall
  CHECK(refused(table_section(1.0, 1.0, {0.0, 1.0}, {0.5, 0.8})));                       // never the span
  CHECK(refused(table_section(1.0, 1.0, {0.1, 1.0}, {1.0, 1.0})));                       // not from the invert
  CHECK(refused(table_section(1.0, 1.0, {0.0, 1.0}, {1.0, 1.2})));                       // wider than the span
  Section no_table = table_section(1.0, 1.0, {0.0, 1.0}, {1.0, 1.0});
  no_table.table.reset();
  CHECK(refused(no_table));
  CHECK_FALSE(refused(egg(1.0)));
}
