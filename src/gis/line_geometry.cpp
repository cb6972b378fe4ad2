#include "gis/line_geometry.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <memory>

namespace rimline::gis::detail {
namespace {

using model::Point2;

struct Part {
  std::vector<Point2> xy;
  std::vector<double> z;
};

double distance(Point2 a, Point2 b) { return std::hypot(b.x - a.x, b.y - a.y); }

void append_points(const OGRSimpleCurve& line, const Placement& where, bool with_z, std::vector<Point2>& xy,
                   std::vector<double>& z) {
  const int n = line.getNumPoints();
  xy.reserve(xy.size() + static_cast<std::size_t>(n));
  if (with_z) z.reserve(z.size() + static_cast<std::size_t>(n));
  for (int i = 0; i < n; ++i) {
    xy.push_back({line.getX(i) * where.metres_per_unit, line.getY(i) * where.metres_per_unit});
    if (with_z) z.push_back(line.getZ(i) * where.z_metres_per_unit);
  }
}

// Appends `p` (turned when `reverse`) to the chain; a joint vertex shared exactly is not doubled.
void attach(Part& chain, Part& p, bool at_end, bool reverse, bool with_z) {
  if (reverse) {
    std::reverse(p.xy.begin(), p.xy.end());
    std::reverse(p.z.begin(), p.z.end());
  }
  if (at_end) {
    const bool shared = distance(chain.xy.back(), p.xy.front()) == 0.0;
    chain.xy.insert(chain.xy.end(), p.xy.begin() + (shared ? 1 : 0), p.xy.end());
    if (with_z) chain.z.insert(chain.z.end(), p.z.begin() + (shared ? 1 : 0), p.z.end());
  } else {
    const bool shared = distance(p.xy.back(), chain.xy.front()) == 0.0;
    chain.xy.insert(chain.xy.begin(), p.xy.begin(), p.xy.end() - (shared ? 1 : 0));
    if (with_z) chain.z.insert(chain.z.begin(), p.z.begin(), p.z.end() - (shared ? 1 : 0));
  }
}

LineOutcome merge_parts(const OGRMultiLineString& multi, const Placement& where, double tolerance_m, bool with_z,
                        std::vector<Point2>& xy, std::vector<double>& z) {
  LineOutcome out;
  out.type_name = multi.getGeometryName();
  std::vector<Part> parts;
  for (const OGRLineString* line : multi) {
    if (line->IsEmpty()) continue;
    Part p;
    append_points(*line, where, with_z, p.xy, p.z);
    parts.push_back(std::move(p));
  }
  out.parts = static_cast<int>(parts.size());
  if (parts.empty()) {
    out.status = LineStatus::missing;
    return out;
  }
  Part chain = std::move(parts.front());
  std::vector<bool> used(parts.size(), false);
  used[0] = true;
  for (std::size_t joined = 1; joined < parts.size(); ++joined) {
    double best = std::numeric_limits<double>::infinity();
    std::size_t best_i = 0;
    bool best_end = true, best_reverse = false;
    for (std::size_t i = 0; i < parts.size(); ++i) {
      if (used[i]) continue;
      const Part& p = parts[i];
      const double options[4] = {distance(chain.xy.back(), p.xy.front()), distance(chain.xy.back(), p.xy.back()),
                                 distance(p.xy.back(), chain.xy.front()), distance(p.xy.front(), chain.xy.front())};
      for (int k = 0; k < 4; ++k)
        if (options[k] < best) {
          best = options[k];
          best_i = i;
          best_end = k < 2;
          best_reverse = k == 1 || k == 3;
        }
    }
    if (best > tolerance_m) {
      out.status = LineStatus::gap;
      out.gap_m = best;
      // Keep every part for drawing, in reading order; the pipe is not used for the march.
      for (std::size_t i = 0; i < parts.size(); ++i)
        if (!used[i]) {
          chain.xy.insert(chain.xy.end(), parts[i].xy.begin(), parts[i].xy.end());
          chain.z.insert(chain.z.end(), parts[i].z.begin(), parts[i].z.end());
        }
      break;
    }
    attach(chain, parts[best_i], best_end, best_reverse, with_z);
    used[best_i] = true;
  }
  if (out.status != LineStatus::gap) out.status = parts.size() > 1 ? LineStatus::merged : LineStatus::ok;
  xy = std::move(chain.xy);
  z = std::move(chain.z);
  return out;
}

}  // namespace

LineOutcome read_line(OGRGeometry* g, const Placement& where, double tolerance_m, std::vector<Point2>& xy,
                      std::vector<double>& z) {
  LineOutcome out;
  xy.clear();
  z.clear();
  if (!g || g->IsEmpty()) {
    out.status = LineStatus::missing;
    return out;
  }
  out.type_name = g->getGeometryName();
  std::unique_ptr<OGRGeometry> linear;  // curves are approximated by GDAL's default segmentation
  if (g->hasCurveGeometry()) {
    linear.reset(g->getLinearGeometry());
    g = linear.get();
    if (!g) {
      out.status = LineStatus::wrong_type;
      return out;
    }
  }
  if (where.to_run && g->transform(where.to_run) != OGRERR_NONE) {
    out.status = LineStatus::transform_failed;
    return out;
  }
  const bool with_z = g->Is3D();
  switch (wkbFlatten(g->getGeometryType())) {
    case wkbLineString:
      append_points(*g->toLineString(), where, with_z, xy, z);
      return out;
    case wkbMultiLineString: {
      const std::string name = out.type_name;
      out = merge_parts(*g->toMultiLineString(), where, tolerance_m, with_z, xy, z);
      out.type_name = name;
      return out;
    }
    default:
      out.status = LineStatus::wrong_type;
      return out;
  }
}

double plan_length_m(const std::vector<Point2>& xy) {
  double total = 0.0;
  for (std::size_t i = 1; i < xy.size(); ++i) total += distance(xy[i - 1], xy[i]);
  return total;
}

Point2 start_direction(const std::vector<Point2>& xy) {
  for (std::size_t i = 1; i < xy.size(); ++i) {
    const double d = distance(xy[0], xy[i]);
    if (d > 0.0) return {(xy[i].x - xy[0].x) / d, (xy[i].y - xy[0].y) / d};
  }
  return {};
}

Point2 end_direction(const std::vector<Point2>& xy) {
  if (xy.empty()) return {};
  const Point2 last = xy.back();
  for (std::size_t i = xy.size() - 1; i-- > 0;) {
    const double d = distance(xy[i], last);
    if (d > 0.0) return {(last.x - xy[i].x) / d, (last.y - xy[i].y) / d};
  }
  return {};
}

PointStatus read_point(OGRGeometry* g, const Placement& where, Point2& out, std::string& type_name) {
  if (!g || g->IsEmpty()) return PointStatus::missing;
  type_name = g->getGeometryName();
  if (where.to_run && g->transform(where.to_run) != OGRERR_NONE) return PointStatus::transform_failed;
  const OGRPoint* p = nullptr;
  const auto type = wkbFlatten(g->getGeometryType());
  if (type == wkbPoint)
    p = g->toPoint();
  else if (type == wkbMultiPoint && g->toMultiPoint()->getNumGeometries() == 1)
    p = g->toMultiPoint()->getGeometryRef(0);
  if (!p) return PointStatus::wrong_type;
  out = {p->getX() * where.metres_per_unit, p->getY() * where.metres_per_unit};
  return PointStatus::ok;
}

}  // namespace rimline::gis::detail
