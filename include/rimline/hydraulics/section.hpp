#pragma once
// Cross-section geometry of closed conduits at any flow depth. SI: metres.
//   circular  diameter D
//   box       span (width) x rise (height), flat soffit
//   egg       the standard egg (ovoid) of height H = 1.5 x width: top arc of radius R = H/3, side arcs
//             of radius 3R tangent to it at mid-width, invert arc of radius R/2; the geometry follows
//             from the height alone (width_m = H / 1.5 is kept for the outputs)
//   table     a closed section given by its width at each depth, as fractions of the span (width_m)
//             and the rise (height_m), linear between the rows; a last width above 0 is a flat soffit
#include <memory>
#include <string>
#include <vector>

namespace rimline::hydraulics {

enum class Shape { circular, box, egg, table };
std::string_view shape_name(Shape s);  // "circular" | "box" | "egg" | "table"

// Widths at depths, both as fractions: depth from 0 (invert) to 1 (soffit), strictly rising; width
// fractions of the span, within 0..1. Shared by every pipe of that section.
struct SectionTable {
  std::string name;
  std::vector<double> depth;
  std::vector<double> width;
};

struct Section {
  Shape shape = Shape::circular;
  double diameter_m = 0.0;  // circular
  double width_m = 0.0;     // box, egg, table (span)
  double height_m = 0.0;    // box, egg, table (rise)
  std::shared_ptr<const SectionTable> table;  // table only
};

// The standard egg's height over width (its proportion).
inline constexpr double egg_height_over_width = 1.5;

// Inside height (rise): diameter for a circle, the height of the others [m].
double rise_m(const Section& s);

// Throws rimline::Error(bad_argument) for a non-positive or non-finite dimension, or a table whose
// depths do not rise from 0 to 1 or whose widths leave 0..1.
void validate(const Section& s);
// The message for a bad table ("" when it is fine), for the project file's own error.
std::string table_problem(const SectionTable& t);

// Whether the free surface closes at the soffit (top width -> 0: circle, egg, a table ending at
// width 0); otherwise the section is still open at y = rise (box, a table with a flat soffit).
bool closes_at_soffit(const Section& s);

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
