#include "rimline/flows/catchment_outlets.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <unordered_map>

#include "rimline/topology/point_index.hpp"

namespace rimline::flows {
namespace {

double segment_distance(model::Point2 p, model::Point2 a, model::Point2 b) {
  const double dx = b.x - a.x, dy = b.y - a.y;
  const double len2 = dx * dx + dy * dy;
  double t = len2 > 0.0 ? ((p.x - a.x) * dx + (p.y - a.y) * dy) / len2 : 0.0;
  t = std::clamp(t, 0.0, 1.0);
  return std::hypot(p.x - (a.x + t * dx), p.y - (a.y + t * dy));
}

double distance(model::Point2 a, model::Point2 b) { return std::hypot(a.x - b.x, a.y - b.y); }

void add(Findings& findings, const char* code, Severity sev, const model::Catchment& k, const std::string& field,
         std::string message) {
  Finding f;
  f.code = code;
  f.severity = sev;
  f.layer = LayerRole::catchments;
  f.feature_id = k.id;
  f.fid = k.fid;
  f.field = field;
  f.message = std::move(message);
  findings.push_back(std::move(f));
}

}  // namespace

bool inside_rings(const std::vector<std::vector<model::Point2>>& rings, model::Point2 p) {
  bool in = false;
  for (const auto& ring : rings) {
    if (ring.size() < 3) continue;
    for (std::size_t i = 0, j = ring.size() - 1; i < ring.size(); j = i++) {
      const auto& a = ring[i];
      const auto& b = ring[j];
      if ((a.y > p.y) != (b.y > p.y) && p.x < (b.x - a.x) * (p.y - a.y) / (b.y - a.y) + a.x) in = !in;
    }
  }
  return in;
}

double distance_to_rings_m(const std::vector<std::vector<model::Point2>>& rings, model::Point2 p) {
  if (inside_rings(rings, p)) return 0.0;
  double best = std::numeric_limits<double>::infinity();
  for (const auto& ring : rings)
    for (std::size_t i = 0, j = ring.size() - 1; i < ring.size() && ring.size() >= 2; j = i++)
      best = std::min(best, segment_distance(p, ring[j], ring[i]));
  return best;
}

void assign_outlets(const model::Network& network, const topology::Topology& topo,
                    std::vector<model::Catchment>& catchments, double search_m, Findings& findings) {
  const std::size_t ns = network.structures.size();
  auto drains = [&](std::size_t s) {
    if (s >= topo.nodes.size()) return false;
    for (std::size_t ci : topo.nodes[s].outflows)
      if (model::marched(network.conduits[ci])) return true;
    return false;
  };
  std::unordered_map<std::string, std::size_t> by_id;
  for (std::size_t s = 0; s < ns; ++s) by_id.emplace(network.structures[s].id, s);
  // Candidates come from a spatial index (GEOS STRtree) of the structures that can take a
  // catchment: those within the catchment's bounding circle plus search_m.
  constexpr double none = std::numeric_limits<double>::quiet_NaN();
  std::vector<model::Point2> points(ns, model::Point2{none, none});
  for (std::size_t s = 0; s < ns; ++s)
    if (drains(s)) points[s] = network.structures[s].location;
  const topology::PointIndex index(points);

  for (auto& k : catchments) {
    k.structure = model::no_index;
    if (!k.structure_id.empty()) {
      const auto it = by_id.find(k.structure_id);
      if (it != by_id.end() && drains(it->second)) {
        k.structure = it->second;
        continue;
      }
      add(findings, "CATCHMENT_OUTLET", Severity::warning, k, "structure",
          "catchment " + k.id + " names structure \"" + k.structure_id + "\", " +
              (it == by_id.end() ? "which is not in the network" : "which no marched pipe leaves") +
              "; the structure inside or nearest the catchment is used instead.");
    }
    std::vector<std::size_t> inside;
    std::size_t nearest = model::no_index;
    double nearest_m = std::numeric_limits<double>::infinity();
    double x0 = std::numeric_limits<double>::infinity(), y0 = x0, x1 = -x0, y1 = -x0;
    for (const auto& ring : k.rings)
      for (const auto& v : ring)
        x0 = std::min(x0, v.x), y0 = std::min(y0, v.y), x1 = std::max(x1, v.x), y1 = std::max(y1, v.y);
    if (!(x0 <= x1 && y0 <= y1)) x0 = x1 = y0 = y1 = 0.0;
    const model::Point2 centre{(x0 + x1) / 2, (y0 + y1) / 2};
    auto boundary = k.rings;  // even-odd over exterior rings and holes: a structure in a hole is outside
    boundary.insert(boundary.end(), k.holes.begin(), k.holes.end());
    for (const auto& near : index.within(centre, std::hypot(x1 - x0, y1 - y0) / 2 + search_m)) {
      const std::size_t s = near.index;
      const double d = distance_to_rings_m(boundary, network.structures[s].location);
      if (d == 0.0) inside.push_back(s);
      if (d < nearest_m) nearest_m = d, nearest = s;
    }
    const bool any_inlet = std::any_of(inside.begin(), inside.end(), [&](std::size_t s) {
      return network.structures[s].kind == model::StructureKind::inlet;
    });
    if (any_inlet)
      std::erase_if(inside, [&](std::size_t s) { return network.structures[s].kind != model::StructureKind::inlet; });
    if (!inside.empty()) {
      std::sort(inside.begin(), inside.end(), [&](std::size_t a, std::size_t b) {
        const double da = distance(network.structures[a].location, k.centroid);
        const double db = distance(network.structures[b].location, k.centroid);
        return da != db ? da < db : network.structures[a].id < network.structures[b].id;
      });
      k.structure = inside.front();
      if (inside.size() > 1) {
        std::string names;
        for (std::size_t s : inside) names += (names.empty() ? "" : ", ") + network.structures[s].id;
        add(findings, "CATCHMENT_AMBIGUOUS", Severity::warning, k, "",
            "catchment " + k.id + " contains " + std::to_string(inside.size()) + " candidate structures (" + names +
                "); " + network.structures[k.structure].id + ", the nearest to its centroid, takes its runoff.");
      }
      continue;
    }
    if (nearest != model::no_index && nearest_m <= search_m) {
      k.structure = nearest;
      add(findings, "CATCHMENT_NEAREST", Severity::info, k, "",
          "catchment " + k.id + " contains no structure; " + network.structures[nearest].id + ", " +
              q(nearest_m, units::Dimension::length) + " away, takes its runoff.");
      continue;
    }
    add(findings, "CATCHMENT_NO_OUTLET", Severity::warning, k, "",
        "catchment " + k.id + " has no structure a pipe leaves within " + q(search_m, units::Dimension::length) +
            "; it contributes no flow.");
  }
}

}  // namespace rimline::flows
