// Profile classes follow Chow (1959), Open-Channel Hydraulics, sec. 9-2: the letter from the bed
// slope (M mild yn > yc, S steep yn < yc, C critical, H horizontal, A adverse), the number from
// the zone of the depth (1 above both yn and yc, 2 between, 3 below both).
#include <algorithm>
#include <cmath>
#include <string>

#include "hydraulics/gvf_summary.hpp"
#include "hydraulics/kernels.hpp"
#include "rimline/units.hpp"

namespace rimline::hydraulics::detail {

namespace {
constexpr double g = units::gravity_m_s2;

char slope_letter(const PreparedReach& r) {
  if (r.slope == 0.0) return 'H';
  if (r.slope < 0.0) return 'A';
  if (!r.has_normal) return 'M';
  const double band = 1e-3 * r.rise;
  if (r.yn > r.yc + band) return 'M';
  if (r.yn < r.yc - band) return 'S';
  return 'C';
}

// Class of a run of free-surface nodes [a, b): its zone is decided by the node farthest from the
// asymptote (normal depth, or critical depth where there is none).
std::string class_of(const PreparedReach& r, const std::vector<Node>& n, std::size_t a, std::size_t b) {
  const char letter = slope_letter(r);
  const double band = 1e-3 * r.rise;
  double y_far = n[a].y, far = -1.0;
  for (std::size_t i = a; i < b; ++i) {
    const double d = std::fabs(n[i].y - (r.has_normal ? r.yn : r.yc));
    if (d > far) {
      far = d;
      y_far = n[i].y;
    }
  }
  if (r.has_normal && far <= band) return "uniform";
  int zone = 2;
  if (letter == 'H' || letter == 'A') {
    zone = y_far > r.yc ? 2 : 3;
  } else {
    const double upper = std::max(r.yn, r.yc), lower = std::min(r.yn, r.yc);
    zone = y_far > upper ? 1 : y_far < lower ? 3 : 2;
  }
  return std::string(1, letter) + std::to_string(zone);
}

ProfilePoint point_of(const PreparedReach& r, const Node& n) {
  ProfilePoint p;
  p.station_m = n.x;
  p.invert_m = r.invert(n.x);
  p.depth_m = std::min(n.y, r.rise);
  p.full = n.full;
  p.hgl_m = n.hgl;
  p.velocity_m_s = velocity_at(r, n);
  p.egl_m = p.hgl_m + p.velocity_m_s * p.velocity_m_s / (2.0 * g);
  if (n.full) {
    p.regime = Regime::pressurized;
  } else if (n.y <= 0.0) {
    p.regime = Regime::dry;
  } else {
    const Geometry geo = free_surface_geometry(r.section, n.y);
    if (geo.top_width_m > 0.0) p.froude = p.velocity_m_s / std::sqrt(g * geo.area_m2 / geo.top_width_m);
    p.regime = p.froude > 1.0 + 1e-9 ? Regime::supercritical : Regime::subcritical;
  }
  return p;
}
}  // namespace

ConduitProfile summarise(const PreparedReach& r, std::vector<Node> nodes, std::size_t super_from, bool free_outlet) {
  ConduitProfile p;
  if (nodes.back().x < r.length) {  // an incomplete march: close the conduit at the last depth
    if (super_from == nodes.size()) ++super_from;
    const Node& last = nodes.back();
    const double hgl = std::max(r.invert(r.length) + last.y, last.hgl);
    nodes.push_back({r.length, std::min(hgl - r.invert(r.length), r.rise), hgl, last.full});
  }
  for (const Node& n : nodes) p.points.push_back(point_of(r, n));

  // Each interval between neighbouring nodes is full, a jump, or a free run of one branch;
  // runs of equal kind form the segments named in flow order (inlet first).
  enum class Kind { full, jump, sub, super };
  std::vector<std::string> parts;
  bool any_full = false, any_free = false;
  std::size_t run_start = 0;
  auto kind_of = [&](std::size_t i) {
    if (nodes[i].full && nodes[i + 1].full) return Kind::full;
    if (i + 1 == super_from && super_from > 0) return Kind::jump;
    return i >= super_from ? Kind::super : Kind::sub;
  };
  for (std::size_t i = 0; i + 1 < nodes.size(); ++i) {
    const Kind k = kind_of(i);
    if (k == Kind::full) p.surcharged_length_m += nodes[i + 1].x - nodes[i].x;
    const bool run_ends = i + 2 == nodes.size() || kind_of(i + 1) != k;
    if (!run_ends) continue;
    if (k == Kind::full) {
      any_full = true;
      parts.push_back("full");
    } else if (k == Kind::jump) {
      parts.push_back("jump");
    } else {
      any_free = true;
      parts.push_back(class_of(r, nodes, run_start, i + 2));
    }
    run_start = i + 1;
  }
  std::string cls;
  for (auto it = parts.rbegin(); it != parts.rend(); ++it) cls += (cls.empty() ? "" : "-") + *it;
  p.profile_class = cls.empty() ? "full" : cls;

  const bool has_super = super_from < nodes.size();
  const bool has_sub = super_from > 0;
  if (has_super && has_sub) {
    p.regime = Regime::mixed;
  } else if (any_full && !any_free) {
    p.regime = Regime::pressurized;
  } else if (any_full) {
    p.regime = Regime::partly_pressurized;
  } else {
    p.regime = has_super ? Regime::supercritical : Regime::subcritical;
  }

  const Node& inlet = nodes.back();
  if (inlet.full) {
    p.governs = Governs::surcharge;
  } else if (has_super) {
    p.governs = Governs::inlet_control;
  } else if (r.has_normal && std::fabs(inlet.y - r.yn) <= std::max(1e-3, 0.01 * r.yn)) {
    p.governs = Governs::normal_depth;
  } else if (free_outlet && !nodes.front().full) {
    p.governs = Governs::critical_depth_outlet;
  } else {
    p.governs = Governs::outlet_water_level;
  }
  return p;
}

ConduitProfile summarise_still(const PreparedReach& r, const std::vector<Node>& nodes) {
  ConduitProfile p;
  bool wet = false, full = false, all_full = true;
  for (const Node& n : nodes) {
    p.points.push_back(point_of(r, n));
    wet = wet || n.y > 0.0;
    full = full || n.full;
    all_full = all_full && n.full;
  }
  for (std::size_t i = 0; i + 1 < nodes.size(); ++i)
    if (nodes[i].full && nodes[i + 1].full) p.surcharged_length_m += nodes[i + 1].x - nodes[i].x;
  p.governs = Governs::still_water;
  p.regime = !wet ? Regime::dry : all_full ? Regime::pressurized : full ? Regime::partly_pressurized : Regime::subcritical;
  p.profile_class = wet ? "still" : "dry";
  p.normal_depth_m = std::nan("");
  p.critical_depth_m = 0.0;
  return p;
}

}  // namespace rimline::hydraulics::detail
