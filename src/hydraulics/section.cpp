// Closed-conduit section geometry.
// Circle of diameter D at depth y, with half the central angle phi (cos phi = 1 - 2y/D):
//   A = D^2/8 (2phi - sin 2phi), P = D phi, T = 2 sqrt(y (D - y))   (circular segment, any
//   mathematical handbook, e.g. CRC Standard Mathematical Tables, "circular segment").
// Near full the angle is taken from the small quantity D - y (phi = pi - 2 asin sqrt((D-y)/D))
// so that neither phi nor the top width loses precision as T -> 0.
#include "rimline/hydraulics/section.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>

#include "hydraulics/kernels.hpp"
#include "rimline/error.hpp"

namespace rimline::hydraulics {

std::string_view shape_name(Shape s) {
  switch (s) {
    case Shape::circular: return "circular";
    case Shape::box: return "box";
    case Shape::egg: return "egg";
    case Shape::table: return "table";
  }
  return "circular";
}

double rise_m(const Section& s) { return s.shape == Shape::circular ? s.diameter_m : s.height_m; }

bool closes_at_soffit(const Section& s) {
  switch (s.shape) {
    case Shape::circular:
    case Shape::egg: return true;
    case Shape::box: return false;
    case Shape::table: return s.table && !s.table->width.empty() && s.table->width.back() == 0.0;
  }
  return true;
}

std::string table_problem(const SectionTable& t) {
  if (t.depth.size() < 2 || t.depth.size() != t.width.size())
    return "needs at least two rows and as many widths as depths";
  if (t.depth.front() != 0.0 || t.depth.back() != 1.0) return "depths must run from 0 (invert) to 1 (soffit)";
  double widest = 0.0;
  for (std::size_t i = 0; i < t.depth.size(); ++i) {
    if (!std::isfinite(t.depth[i]) || !std::isfinite(t.width[i])) return "holds a value that is not a number";
    if (i > 0 && !(t.depth[i] > t.depth[i - 1])) return "depths must rise strictly";
    if (t.width[i] < 0.0 || t.width[i] > 1.0) return "widths are fractions of the span, within 0 to 1";
    widest = std::max(widest, t.width[i]);
  }
  if (widest != 1.0) return "the widest row must be 1 (the span)";
  return "";
}

namespace {
void require_dimension(double v, const char* what) {
  if (!std::isfinite(v) || v <= 0.0)
    throw Error(ErrorKind::bad_argument, std::string("section ") + what + " must be a positive finite length in metres, got " +
                                             std::to_string(v));
}

Geometry finish(double y, double area, double perimeter, double top) {
  Geometry g;
  g.depth_m = y;
  g.area_m2 = area;
  g.wetted_perimeter_m = perimeter;
  g.top_width_m = top;
  g.hydraulic_radius_m = area / perimeter;
  g.hydraulic_depth_m = top > 0.0 ? area / top : std::numeric_limits<double>::infinity();
  return g;
}

Geometry circle_full(double d) {
  return finish(d, std::numbers::pi * d * d / 4.0, std::numbers::pi * d, 0.0);
}
}  // namespace

void validate(const Section& s) {
  switch (s.shape) {
    case Shape::circular: require_dimension(s.diameter_m, "diameter"); break;
    case Shape::egg: require_dimension(s.height_m, "height"); break;
    case Shape::table:
      if (!s.table) throw Error(ErrorKind::bad_argument, "a table section needs its table of widths");
      if (const auto why = table_problem(*s.table); !why.empty())
        throw Error(ErrorKind::bad_argument, "section table " + s.table->name + ": " + why);
      [[fallthrough]];
    case Shape::box:
      require_dimension(s.width_m, "width");
      require_dimension(s.height_m, "height");
      break;
  }
}

namespace detail {

namespace {

Geometry circle_free(double d, double y) {
  if (y >= d) return circle_full(d);
  // With s = sin(phi/2) = sqrt(y/D) (or its complement near full), sin 2phi follows algebraically:
  // sin phi = 2 s sqrt(1 - s^2), cos phi = +-(1 - 2 s^2); one asin per evaluation.
  const double gap = d - y;
  const bool lower = y <= 0.5 * d;
  const double sh = std::sqrt((lower ? y : gap) / d);
  const double half = std::asin(sh);
  const double phi = lower ? 2.0 * half : std::numbers::pi - 2.0 * half;
  const double sin_phi = 2.0 * sh * std::sqrt(1.0 - sh * sh);
  const double cos_phi = lower ? 1.0 - 2.0 * sh * sh : -(1.0 - 2.0 * sh * sh);
  // 2phi - sin 2phi cancels for shallow flow; its Taylor series keeps full precision there.
  const double u = 2.0 * phi;
  double lens = u - 2.0 * sin_phi * cos_phi;
  if (u < 0.5) {
    const double u2 = u * u;
    lens = u * u2 / 6.0 * (1.0 - u2 / 20.0 * (1.0 - u2 / 42.0 * (1.0 - u2 / 72.0 * (1.0 - u2 / 110.0))));
  }
  const double area = d * d / 8.0 * lens;
  return finish(y, area, d * phi, 2.0 * std::sqrt(y * gap));
}

// The standard egg of height H = 3R, origin at the invert (see section.hpp): below 0.2R the invert
// arc (a circle of diameter R), to 2R the side arcs of radius 3R centred 2R across and 2R up, above
// 2R the top arc of radius R centred 2R up. For a wall x = cx + sqrt(a^2 - t^2), t = eta - cy:
//   integral of sqrt(a^2 - t^2) dt = F(t) = (t sqrt(a^2 - t^2) + a^2 asin(t/a)) / 2,
//   wall length = a (asin(t2/a) - asin(t1/a)),
//   integral of t sqrt(a^2 - t^2) dt = -(a^2 - t^2)^(3/2) / 3   (first moments).
double F(double t, double a) {
  const double c = std::clamp(t / a, -1.0, 1.0);
  return 0.5 * (t * std::sqrt(std::max(a * a - t * t, 0.0)) + a * a * std::asin(c));
}
double G(double t, double a) { return -std::pow(std::max(a * a - t * t, 0.0), 1.5) / 3.0; }

struct EggZone {
  double cx, cy, a, lo, hi;  // wall centre, radius, depth range; in units of R
};
// The side and top zones (the invert zone is the circle of diameter R).
constexpr EggZone egg_side{-2.0, 2.0, 3.0, 0.2, 2.0};
constexpr EggZone egg_top{0.0, 2.0, 1.0, 2.0, 3.0};

// Area, wetted perimeter and first moment about the invert (integral of eta T d eta) of both halves
// of a zone from its bottom up to y, all for R = 1.
struct Partial {
  double area = 0.0, perimeter = 0.0, moment = 0.0;
};
Partial egg_zone(const EggZone& z, double y) {
  const double t0 = z.lo - z.cy, t1 = std::min(y, z.hi) - z.cy;
  Partial p;
  p.area = 2.0 * (z.cx * (t1 - t0) + F(t1, z.a) - F(t0, z.a));
  p.perimeter = 2.0 * z.a * (std::asin(std::clamp(t1 / z.a, -1.0, 1.0)) - std::asin(std::clamp(t0 / z.a, -1.0, 1.0)));
  // eta = cy + t: integral of (cy + t)(cx + sqrt(a^2 - t^2)) dt.
  p.moment = 2.0 * (z.cy * z.cx * (t1 - t0) + 0.5 * z.cx * (t1 * t1 - t0 * t0) + z.cy * (F(t1, z.a) - F(t0, z.a)) +
                    G(t1, z.a) - G(t0, z.a));
  return p;
}

// The invert zone for R = 1: the circle of diameter 1 up to 0.2 (area, perimeter, first moment
// about the invert = y A - (moment about the surface)).
Partial egg_invert(double y) {
  const double yy = std::min(y, 0.2);
  const Geometry g = circle_free(1.0, yy);
  const double t = g.top_width_m;
  return {g.area_m2, g.wetted_perimeter_m, yy * g.area_m2 - ((yy - 0.5) * g.area_m2 + t * t * t / 12.0)};
}

Partial egg_unit(double y) {
  Partial p = egg_invert(y);
  for (const EggZone* z : {&egg_side, &egg_top}) {
    if (y <= z->lo) break;
    const Partial q = egg_zone(*z, y);
    p.area += q.area, p.perimeter += q.perimeter, p.moment += q.moment;
  }
  return p;
}

const Partial& egg_full_unit() {
  static const Partial full = egg_unit(3.0);
  return full;
}

double egg_half_width_unit(double y) {
  if (y <= 0.2) return std::sqrt(std::max(0.25 - (y - 0.5) * (y - 0.5), 0.0));
  if (y <= 2.0) return -2.0 + std::sqrt(9.0 - (y - 2.0) * (y - 2.0));
  return std::sqrt(std::max(1.0 - (y - 2.0) * (y - 2.0), 0.0));
}

Geometry egg_free(double height, double y) {
  const double r = height / 3.0, u = y / r;
  const Partial& full = egg_full_unit();
  if (u >= 3.0) return finish(height, full.area * r * r, full.perimeter * r, 0.0);
  if (u <= 0.2) {
    const Geometry g = circle_free(r, y);  // the invert arc: a circle of diameter R
    return g;
  }
  if (u > 2.5) {
    // Near the crown: the full section less the cap above the surface, so that area and perimeter
    // keep their precision as the top width tends to 0 (cap of height h in the top arc of radius R).
    const double h = 3.0 - u;
    const double half = 2.0 * std::asin(std::sqrt(h / 2.0));  // acos(1 - h), without its cancellation
    const double cap = half - (1.0 - h) * std::sqrt(h * (2.0 - h));
    const double top = 2.0 * std::sqrt(h * (2.0 - h));
    return finish(y, (full.area - cap) * r * r, (full.perimeter - 2.0 * half) * r, top * r);
  }
  const Partial p = egg_unit(u);
  return finish(y, p.area * r * r, p.perimeter * r, 2.0 * egg_half_width_unit(u) * r);
}

double egg_surface_moment(double height, double y) {
  const double r = height / 3.0, u = std::min(y / r, 3.0);
  if (u <= 0.2) {
    const Geometry g = circle_free(r, y);
    const double t = g.top_width_m;
    return (y - 0.5 * r) * g.area_m2 + t * t * t / 12.0;
  }
  const Partial p = egg_unit(u);
  return (u * p.area - p.moment) * r * r * r;
}

// A table section: the width at y (m), linear between rows.
double table_width(const Section& s, double y) {
  const auto& t = *s.table;
  const double d = y / s.height_m;
  if (d >= 1.0) return t.width.back() * s.width_m;
  std::size_t i = 1;
  while (i + 1 < t.depth.size() && t.depth[i] < d) ++i;
  const double f = (d - t.depth[i - 1]) / (t.depth[i] - t.depth[i - 1]);
  return (t.width[i - 1] + f * (t.width[i] - t.width[i - 1])) * s.width_m;
}

// Area, wetted perimeter (walls and a flat invert) and the first moment about the surface at y,
// exact for widths linear between the rows.
Partial table_partial(const Section& s, double y) {
  const auto& t = *s.table;
  const double h = s.height_m, b = s.width_m;
  Partial p;
  p.perimeter = t.width.front() * b;  // a flat invert
  for (std::size_t i = 1; i < t.depth.size(); ++i) {
    const double e0 = t.depth[i - 1] * h;
    if (y <= e0) break;
    const double e1 = std::min(t.depth[i] * h, y);
    const double w0 = t.width[i - 1] * b;
    const double slope = (t.width[i] - t.width[i - 1]) * b / ((t.depth[i] - t.depth[i - 1]) * h);
    const double len = e1 - e0, w1 = w0 + slope * len;
    p.area += 0.5 * (w0 + w1) * len;
    p.perimeter += 2.0 * std::hypot(len, 0.5 * (w1 - w0));
    // integral over [e0, e1] of (y - eta) (w0 + slope (eta - e0)) d eta
    p.moment += (y - e0) * (w0 * len + 0.5 * slope * len * len) - (0.5 * w0 * len * len + slope * len * len * len / 3.0);
  }
  return p;
}

Geometry table_free(const Section& s, double y) {
  const double yy = std::min(y, s.height_m);
  const Partial p = table_partial(s, yy);
  return finish(yy, p.area, p.perimeter, table_width(s, yy));
}

}  // namespace

Geometry free_surface_geometry(const Section& s, double y) {
  switch (s.shape) {
    case Shape::box: return finish(y, s.width_m * y, s.width_m + 2.0 * y, s.width_m);
    case Shape::egg: return egg_free(s.height_m, y);
    case Shape::table: return table_free(s, y);
    case Shape::circular: break;
  }
  return circle_free(s.diameter_m, y);
}

Geometry any_geometry(const Section& s, double y) {
  if (y >= rise_m(s)) {
    switch (s.shape) {
      case Shape::circular: return circle_full(s.diameter_m);
      case Shape::egg: return egg_free(s.height_m, s.height_m);
      case Shape::table: {
        const Partial p = table_partial(s, s.height_m);
        return finish(s.height_m, p.area, p.perimeter + s.table->width.back() * s.width_m, 0.0);  // the soffit
      }
      case Shape::box: break;
    }
    return finish(s.height_m, s.width_m * s.height_m, 2.0 * (s.width_m + s.height_m), 0.0);
  }
  return free_surface_geometry(s, y);
}

double area_moment(const Section& s, double y) {
  switch (s.shape) {
    case Shape::box: return 0.5 * s.width_m * y * y;
    case Shape::egg: return egg_surface_moment(s.height_m, y);
    case Shape::table: return table_partial(s, std::min(y, s.height_m)).moment;
    case Shape::circular: break;
  }
  const Geometry g = circle_free(s.diameter_m, y);
  const double t = g.top_width_m;
  return (y - 0.5 * s.diameter_m) * g.area_m2 + t * t * t / 12.0;
}

}  // namespace detail

Geometry geometry_at(const Section& s, double depth_m) {
  validate(s);
  if (!std::isfinite(depth_m) || depth_m <= 0.0)
    throw Error(ErrorKind::bad_argument, "flow depth must be positive and finite, got " + std::to_string(depth_m) + " m");
  return detail::any_geometry(s, depth_m);
}

Geometry full_geometry(const Section& s) {
  validate(s);
  return detail::any_geometry(s, rise_m(s));
}

// First moment of the wetted area about the water surface, A * zbar.
// Circle: (y - D/2) A + T^3/12, from integrating 2 sqrt(r^2 - z^2)(h - z) over the segment; egg and
// table: closed forms zone by zone (detail::area_moment). Full: up to the soffit (pressure above the
// crown is added by the caller).
double area_moment_m3(const Section& s, double depth_m) {
  validate(s);
  if (!std::isfinite(depth_m) || depth_m <= 0.0)
    throw Error(ErrorKind::bad_argument, "flow depth must be positive and finite, got " + std::to_string(depth_m) + " m");
  return detail::area_moment(s, std::fmin(depth_m, rise_m(s)));
}

}  // namespace rimline::hydraulics
