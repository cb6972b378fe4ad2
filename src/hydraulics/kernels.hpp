#pragma once
// Unchecked building blocks used in inner loops (normal/critical depth, step methods).
// The public functions validate their arguments once and then call these.
#include "rimline/hydraulics/friction.hpp"
#include "rimline/hydraulics/section.hpp"

namespace rimline::hydraulics::detail {

// Free-surface geometry for 0 < y <= rise: at y == rise a box (or a table with a flat soffit) is
// still open at the top (top width = span, perimeter without the soffit); a circle or an egg closes
// smoothly (top width 0).
Geometry free_surface_geometry(const Section& s, double depth_m);
// y >= rise: the full closed section; otherwise free_surface_geometry.
Geometry any_geometry(const Section& s, double depth_m);
// First moment of the wetted area about the surface (A zbar) for 0 < y <= rise, unchecked.
double area_moment(const Section& s, double depth_m);

// Friction slope for Q through a wetted shape (area, hydraulic radius). Q >= 0.
double friction_slope_of(const Roughness& r, double flow_m3_s, double area_m2, double hydraulic_radius_m);
// Uniform-flow discharge for the wetted shape at slope S > 0.
double uniform_flow_of(const Roughness& r, double area_m2, double hydraulic_radius_m, double slope);

// Depth on the free-surface rising limb at which the partly-full discharge peaks (rise for a box).
double peak_depth(const Roughness& r, const Section& s, double slope);

}  // namespace rimline::hydraulics::detail
