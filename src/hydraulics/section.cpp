// Closed-conduit section geometry.
// Circle of diameter D at depth y, with half the central angle phi (cos phi = 1 - 2y/D):
//   A = D^2/8 (2phi - sin 2phi), P = D phi, T = 2 sqrt(y (D - y))   (circular segment, any
//   mathematical handbook, e.g. CRC Standard Mathematical Tables, "circular segment").
// Near full the angle is taken from the small quantity D - y (phi = pi - 2 asin sqrt((D-y)/D))
// so that neither phi nor the top width loses precision as T -> 0.
#include "rimline/hydraulics/section.hpp"

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
  }
  return "circular";
}

double rise_m(const Section& s) { return s.shape == Shape::circular ? s.diameter_m : s.height_m; }

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
  if (s.shape == Shape::circular) {
    require_dimension(s.diameter_m, "diameter");
  } else {
    require_dimension(s.width_m, "width");
    require_dimension(s.height_m, "height");
  }
}

namespace detail {

Geometry free_surface_geometry(const Section& s, double y) {
  if (s.shape == Shape::box) return finish(y, s.width_m * y, s.width_m + 2.0 * y, s.width_m);
  const double d = s.diameter_m;
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

Geometry any_geometry(const Section& s, double y) {
  if (y >= rise_m(s)) {
    if (s.shape == Shape::circular) return circle_full(s.diameter_m);
    return finish(s.height_m, s.width_m * s.height_m, 2.0 * (s.width_m + s.height_m), 0.0);
  }
  return free_surface_geometry(s, y);
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
// Circle: (y - D/2) A + T^3/12, from integrating 2 sqrt(r^2 - z^2)(h - z) over the segment.
// Full: the centroid sits D/2 below the crown (pressure above the crown is added by the caller).
double area_moment_m3(const Section& s, double depth_m) {
  validate(s);
  if (!std::isfinite(depth_m) || depth_m <= 0.0)
    throw Error(ErrorKind::bad_argument, "flow depth must be positive and finite, got " + std::to_string(depth_m) + " m");
  const double y = std::fmin(depth_m, rise_m(s));
  if (s.shape == Shape::box) return 0.5 * s.width_m * y * y;
  const Geometry g = detail::free_surface_geometry(s, y);
  const double t = g.top_width_m;
  return (y - 0.5 * s.diameter_m) * g.area_m2 + t * t * t / 12.0;
}

}  // namespace rimline::hydraulics
