// Pipe ends -> structures: ids first, then snapping (GEOS STRtree via PointIndex), then
// derived structures for what is left. Every step is O(n log n) in the number of pipes.
#include "rimline/topology/connect.hpp"

#include <cmath>
#include <limits>
#include <numeric>
#include <string>
#include <unordered_map>

#include "rimline/topology/finding_text.hpp"
#include "rimline/topology/point_index.hpp"

namespace rimline::topology {

namespace {

using model::Conduit;
using model::no_index;
using model::Point2;
using model::Structure;

constexpr double nan = std::numeric_limits<double>::quiet_NaN();

double distance(Point2 a, Point2 b) { return std::hypot(a.x - b.x, a.y - b.y); }

std::string end_name(bool first) { return first ? "first end (as digitised)" : "last end (as digitised)"; }

std::string at_text(Point2 p) { return "(" + fixed(p.x, 2) + ", " + fixed(p.y, 2) + ")"; }

struct UnionFind {
  std::vector<std::size_t> parent;
  explicit UnionFind(std::size_t n) : parent(n) { std::iota(parent.begin(), parent.end(), std::size_t{0}); }
  std::size_t find(std::size_t i) {
    while (parent[i] != i) i = parent[i] = parent[parent[i]];
    return i;
  }
  void unite(std::size_t a, std::size_t b) {
    a = find(a);
    b = find(b);
    if (a != b) parent[std::max(a, b)] = std::min(a, b);  // the lowest index is the root: deterministic
  }
};

struct FreeEnd {
  std::size_t conduit;
  bool first;  // the line's first vertex (else its last)
};

class Connector {
 public:
  Connector(model::Network& n, const TopologyOptions& o, Findings& f)
      : net_(n), opt_(o), findings_(f), had_layer_(!n.structures.empty()), first_new_(n.structures.size()) {}

  Connection run() {
    const std::size_t nc = net_.conduits.size();
    out_.at_first.assign(nc, no_index);
    out_.at_last.assign(nc, no_index);
    out_.ids.assign(nc, IdDirection::none);
    anchored_.assign(net_.structures.size(), 1);
    index_structures();
    link_ids();
    place_id_derived();
    decide_id_ends();
    snap_free_ends();
    derive_unconnected();
    out_.derived_structures = net_.structures.size() - first_new_;
    return std::move(out_);
  }

 private:
  void index_structures() {
    by_id_.reserve(net_.structures.size() * 2);
    for (std::size_t i = 0; i < net_.structures.size(); ++i) {
      const Structure& s = net_.structures[i];
      if (s.id.empty()) continue;
      auto [it, fresh] = by_id_.emplace(s.id, i);
      if (!fresh)
        findings_.push_back(structure_finding(s, "TOPOLOGY_DUPLICATE_ID", Severity::warning,
                                              "structure id '" + s.id + "' is used by more than one structure; pipes linked by id go to the first one"));
    }
  }

  std::size_t link(const Conduit& c, std::size_t i, const std::string& id, bool from) {
    if (id.empty()) return no_index;
    if (auto it = by_id_.find(id); it != by_id_.end()) return it->second;
    if (!had_layer_) {
      Structure s;
      s.id = id;
      s.kind = model::StructureKind::derived;
      s.location = {nan, nan};  // placed once every pipe naming it is known
      net_.structures.push_back(std::move(s));
      anchored_.push_back(0);
      by_id_.emplace(id, net_.structures.size() - 1);
      return net_.structures.size() - 1;
    }
    Finding f = conduit_finding(c, "TOPOLOGY", Severity::warning,
                                "pipe " + label(c, i) + ": " + (from ? "from" : "to") + "-structure id '" + id +
                                    "' not found in structures; that end is snapped by geometry instead");
    f.field = from ? "from_id" : "to_id";
    findings_.push_back(std::move(f));
    return no_index;
  }

  void link_ids() {
    const std::size_t nc = net_.conduits.size();
    up_link_.assign(nc, no_index);
    down_link_.assign(nc, no_index);
    for (std::size_t i = 0; i < nc; ++i) {
      const Conduit& c = net_.conduits[i];
      up_link_[i] = link(c, i, c.from_id, true);
      down_link_[i] = link(c, i, c.to_id, false);
    }
  }

  // A structure known only by id sits where the pipe ends naming it agree: the candidate
  // point (each pipe's expected end, then its other end) that most candidates lie within the
  // tolerance of. One pipe alone cannot anchor it; decide_id_ends places it from its pipe.
  void place_id_derived() {
    const std::size_t n_new = net_.structures.size() - first_new_;
    if (n_new == 0) return;
    struct Candidates {
      Point2 expected, other;
    };
    std::vector<std::size_t> start(n_new + 1, 0);
    auto derived = [&](std::size_t s) { return s != no_index && s >= first_new_; };
    for (std::size_t i = 0; i < net_.conduits.size(); ++i) {
      if (derived(up_link_[i])) ++start[up_link_[i] - first_new_ + 1];
      if (derived(down_link_[i])) ++start[down_link_[i] - first_new_ + 1];
    }
    std::partial_sum(start.begin(), start.end(), start.begin());
    std::vector<Candidates> cands(start.back());
    std::vector<std::size_t> fill(start.begin(), start.end() - 1);
    for (std::size_t i = 0; i < net_.conduits.size(); ++i) {
      const Conduit& c = net_.conduits[i];
      if (derived(up_link_[i])) cands[fill[up_link_[i] - first_new_]++] = {c.up_point, c.down_point};
      if (derived(down_link_[i])) cands[fill[down_link_[i] - first_new_]++] = {c.down_point, c.up_point};
    }
    const double tol = opt_.snap_tolerance_m;
    for (std::size_t k = 0; k < n_new; ++k) {
      const std::size_t b = start[k], e = start[k + 1];
      // Scoring every candidate against every other is quadratic in the pipes at one node;
      // 32 candidates are plenty to find where they agree.
      const std::size_t tried = std::min<std::size_t>(e - b, 16);
      std::size_t best_support = 0;
      Point2 best{nan, nan};
      for (std::size_t a = 0; a < 2 * tried; ++a) {
        const Point2 p = (a % 2 == 0) ? cands[b + a / 2].expected : cands[b + a / 2].other;
        std::size_t support = 0;
        for (std::size_t j = b; j < e; ++j)
          support += (distance(p, cands[j].expected) <= tol) + (distance(p, cands[j].other) <= tol);
        if (support > best_support) {
          best_support = support;
          best = p;
        }
      }
      if (best_support >= 2) {
        net_.structures[first_new_ + k].location = best;
        anchored_[first_new_ + k] = 1;
      }
    }
  }

  void place(std::size_t s, Point2 p) {
    if (s != no_index && !anchored_[s]) {
      net_.structures[s].location = p;
      anchored_[s] = 1;
    }
  }

  void decide_id_ends() {
    auto known = [&](std::size_t s) { return s != no_index && anchored_[s]; };
    for (std::size_t i = 0; i < net_.conduits.size(); ++i) {
      const std::size_t a = up_link_[i], b = down_link_[i];
      if (a == no_index && b == no_index) {
        free_.push_back({i, true});
        free_.push_back({i, false});
        continue;
      }
      const Point2 first = net_.conduits[i].up_point, last = net_.conduits[i].down_point;
      bool reversed = false;  // the line runs from the downstream structure to the upstream one
      if (known(a) && known(b)) {
        const Point2 pa = net_.structures[a].location, pb = net_.structures[b].location;
        reversed = distance(first, pb) + distance(last, pa) < distance(first, pa) + distance(last, pb);
      } else if (known(a)) {
        reversed = distance(last, net_.structures[a].location) < distance(first, net_.structures[a].location);
      } else if (known(b)) {
        reversed = distance(first, net_.structures[b].location) < distance(last, net_.structures[b].location);
      }
      place(a, reversed ? last : first);
      place(b, reversed ? first : last);
      out_.at_first[i] = reversed ? b : a;
      out_.at_last[i] = reversed ? a : b;
      out_.ids[i] = reversed ? IdDirection::last_vertex_upstream : IdDirection::first_vertex_upstream;
      if (a == no_index) free_.push_back({i, !reversed});
      if (b == no_index) free_.push_back({i, reversed});
    }
  }

  Point2 end_point(const FreeEnd& e) const {
    return e.first ? net_.conduits[e.conduit].up_point : net_.conduits[e.conduit].down_point;
  }
  void assign(const FreeEnd& e, std::size_t s) { (e.first ? out_.at_first : out_.at_last)[e.conduit] = s; }

  void snap_free_ends() {
    if (free_.empty()) return;
    if (net_.structures.empty()) {
      for (const FreeEnd& e : free_) {
        if (finite(end_point(e)))
          unconnected_.push_back(e);
        else
          report_no_geometry(e);
      }
      return;
    }
    std::vector<Point2> locations(net_.structures.size());
    for (std::size_t s = 0; s < locations.size(); ++s) locations[s] = net_.structures[s].location;
    const PointIndex index(locations);
    for (const FreeEnd& e : free_) {
      if (!finite(end_point(e))) {
        report_no_geometry(e);
        continue;
      }
      const std::vector<Neighbour> near = index.within(end_point(e), opt_.snap_tolerance_m);
      if (near.empty()) {
        unconnected_.push_back(e);
        continue;
      }
      assign(e, near[0].index);
      if (near.size() >= 2) report_ambiguous(e, near);
    }
  }

  static bool finite(Point2 p) { return std::isfinite(p.x) && std::isfinite(p.y); }

  // An end without coordinates cannot be snapped or placed; the pipe stays out of the march.
  void report_no_geometry(const FreeEnd& e) {
    const Conduit& c = net_.conduits[e.conduit];
    findings_.push_back(conduit_finding(c, "TOPOLOGY_UNCONNECTED", Severity::warning,
                                        "pipe " + label(c, e.conduit) + ": its " + end_name(e.first) +
                                            " has no coordinates; it is left unconnected and out of the march"));
  }

  void report_ambiguous(const FreeEnd& e, const std::vector<Neighbour>& near) {
    const Conduit& c = net_.conduits[e.conduit];
    const Structure& s0 = net_.structures[near[0].index];
    const Structure& s1 = net_.structures[near[1].index];
    Finding f = conduit_finding(
        c, "TOPOLOGY_AMBIGUOUS", Severity::warning,
        "pipe " + label(c, e.conduit) + ": " + std::to_string(near.size()) + " structures lie within " +
            q(opt_.snap_tolerance_m, units::Dimension::length) + " of its " + end_name(e.first) +
            "; snapped to the nearest, " + label(s0, near[0].index) + " (" + q(near[0].distance_m, units::Dimension::length) +
            "), not " + label(s1, near[1].index) + " (" + q(near[1].distance_m, units::Dimension::length) + ")");
    f.value = near[1].distance_m;
    f.limit = opt_.snap_tolerance_m;
    f.dimension = units::Dimension::length;
    findings_.push_back(std::move(f));
  }

  std::string fresh_id() {
    for (;;) {
      std::string id = "derived-" + std::to_string(next_derived_++);
      if (by_id_.find(id) == by_id_.end()) return id;
    }
  }

  // Ends that met no structure share one derived structure per cluster of ends lying within
  // the tolerance of each other (union-find over index queries), placed at their mean.
  void derive_unconnected() {
    if (unconnected_.empty()) return;
    std::vector<Point2> points(unconnected_.size());
    for (std::size_t k = 0; k < points.size(); ++k) points[k] = end_point(unconnected_[k]);
    UnionFind clusters(points.size());
    {
      const PointIndex index(points);
      for (std::size_t k = 0; k < points.size(); ++k)
        for (const Neighbour& n : index.within(points[k], opt_.snap_tolerance_m))
          if (n.index > k) clusters.unite(k, n.index);
    }
    std::vector<std::size_t> structure_of(points.size(), no_index);
    std::vector<std::size_t> members(points.size(), 0);
    std::vector<Point2> sum(points.size(), Point2{0.0, 0.0});
    for (std::size_t k = 0; k < points.size(); ++k) {
      const std::size_t r = clusters.find(k);
      ++members[r];
      sum[r].x += points[k].x;
      sum[r].y += points[k].y;
    }
    for (std::size_t k = 0; k < points.size(); ++k) {
      const std::size_t r = clusters.find(k);
      if (structure_of[r] == no_index) {
        Structure s;
        s.id = fresh_id();
        s.kind = model::StructureKind::derived;
        const double m = static_cast<double>(members[r]);
        s.location = {sum[r].x / m, sum[r].y / m};
        by_id_.emplace(s.id, net_.structures.size());
        net_.structures.push_back(std::move(s));
        structure_of[r] = net_.structures.size() - 1;
      }
      assign(unconnected_[k], structure_of[r]);
      if (had_layer_) report_unconnected(unconnected_[k], structure_of[r]);
    }
  }

  void report_unconnected(const FreeEnd& e, std::size_t s) {
    const Conduit& c = net_.conduits[e.conduit];
    Finding f = conduit_finding(c, "TOPOLOGY_UNCONNECTED", Severity::warning,
                                "pipe " + label(c, e.conduit) + ": its " + end_name(e.first) + " at " +
                                    at_text(end_point(e)) + " is more than " + q(opt_.snap_tolerance_m, units::Dimension::length) +
                                    " from every structure; derived structure " + net_.structures[s].id +
                                    " placed there");
    f.limit = opt_.snap_tolerance_m;
    f.dimension = units::Dimension::length;
    findings_.push_back(std::move(f));
  }

  model::Network& net_;
  const TopologyOptions& opt_;
  Findings& findings_;
  const bool had_layer_;
  const std::size_t first_new_;
  std::unordered_map<std::string, std::size_t> by_id_;
  std::vector<std::size_t> up_link_, down_link_;
  std::vector<char> anchored_;
  std::vector<FreeEnd> free_, unconnected_;
  std::size_t next_derived_ = 1;
  Connection out_;
};

}  // namespace

Connection connect_network(model::Network& network, const TopologyOptions& options, Findings& findings) {
  return Connector(network, options, findings).run();
}

}  // namespace rimline::topology
