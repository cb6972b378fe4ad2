#pragma once
// A spatial index of points for "which points lie within r of p" queries, so snapping and
// clustering stay O(n log n) for networks of 10^6 pipes. Backed by a GEOS STRtree (the
// reentrant C API with its own context); no GEOS type appears in this header.
#include <cstddef>
#include <memory>
#include <vector>

#include "rimline/model/network.hpp"

namespace rimline::topology {

struct Neighbour {
  std::size_t index = 0;   // position in the points the index was built from
  double distance_m = 0.0; // plan (Euclidean) distance to the query point
};

class PointIndex {
 public:
  // Copies the points. Non-finite points are left out of the index (never found).
  explicit PointIndex(const std::vector<model::Point2>& points);
  ~PointIndex();
  PointIndex(const PointIndex&) = delete;
  PointIndex& operator=(const PointIndex&) = delete;

  // Points within radius_m of p (distance <= radius_m), nearest first, ties by index.
  // Throws rimline::Error(internal) if GEOS fails.
  std::vector<Neighbour> within(model::Point2 p, double radius_m) const;

  std::size_t size() const { return points_.size(); }

 private:
  struct Geos;
  std::vector<model::Point2> points_;
  std::unique_ptr<Geos> geos_;
};

}  // namespace rimline::topology
