#pragma once
// Cross-section geometry of closed conduits at any flow depth. SI: metres.
#include <string>

namespace rimline::hydraulics {

enum class Shape { circular, box };
std::string_view shape_name(Shape s);

struct Section {
  Shape shape = Shape::circular;
  double diameter_m = 0.0;  // circular
  double width_m = 0.0;     // box (span)
  double height_m = 0.0;    // box (rise)
};

// Inside height (rise): diameter for a circle, height for a box [m].
double rise_m(const Section& s);

// Throws rimline::Error(bad_argument) for a non-positive or non-finite dimension.
void validate(const Section& s);

struct Geometry {
  double depth_m = 0.0;
  double area_m2 = 0.0;
  double wetted_perimeter_m = 0.0;
  double top_width_m = 0.0;         // 0 when full (closed conduit)
  double hydraulic_radius_m = 0.0;  // area / wetted perimeter
  double hydraulic_depth_m = 0.0;   // area / top width; +inf when full
};

// Geometry at depth y, 0 < y <= rise. A depth at or above the rise gives the full section
// (top width 0, wetted perimeter including the soffit). Throws for y <= 0 or NaN.
Geometry geometry_at(const Section& s, double depth_m);
Geometry full_geometry(const Section& s);

// Centroid depth below the water surface times area (first moment, m^3), for the momentum function.
double area_moment_m3(const Section& s, double depth_m);

}  // namespace rimline::hydraulics
