// GEOS STRtree behind PointIndex. Items are point indices stored in the void* payload; the
// tree copies each envelope on insert (GEOS >= 3.9, geos_c.h), so the point geometries are
// freed right after insertion and memory stays proportional to the tree itself.
#include "rimline/topology/point_index.hpp"

#include <geos_c.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <string>

#include "rimline/error.hpp"

namespace rimline::topology {

namespace {

// GEOS reports errors through a message callback; keep the last message for the Error.
void store_message(const char* message, void* userdata) {
  if (userdata != nullptr && message != nullptr) *static_cast<std::string*>(userdata) = message;
}

struct GeometryDeleter {
  GEOSContextHandle_t ctx;
  void operator()(GEOSGeometry* g) const {
    if (g != nullptr) GEOSGeom_destroy_r(ctx, g);
  }
};
using GeometryPtr = std::unique_ptr<GEOSGeometry, GeometryDeleter>;

void* item_of(std::size_t index) { return reinterpret_cast<void*>(static_cast<std::uintptr_t>(index + 1)); }
std::size_t index_of(void* item) { return static_cast<std::size_t>(reinterpret_cast<std::uintptr_t>(item)) - 1; }

}  // namespace

struct PointIndex::Geos {
  GEOSContextHandle_t ctx = nullptr;
  GEOSSTRtree* tree = nullptr;
  std::string last_error;

  Geos() {
    ctx = GEOS_init_r();
    if (ctx == nullptr) throw Error(ErrorKind::internal, "GEOS: cannot create a context");
    GEOSContext_setErrorMessageHandler_r(ctx, store_message, &last_error);
    tree = GEOSSTRtree_create_r(ctx, 10);  // node capacity 10: the value geos_c.h recommends
    if (tree == nullptr) {
      GEOS_finish_r(ctx);
      throw Error(ErrorKind::internal, "GEOS: cannot create an STRtree");
    }
  }
  ~Geos() {
    GEOSSTRtree_destroy_r(ctx, tree);
    GEOS_finish_r(ctx);
  }
  Geos(const Geos&) = delete;
  Geos& operator=(const Geos&) = delete;

  [[noreturn]] void fail(const char* what) const {
    throw Error(ErrorKind::internal, std::string("GEOS: ") + what + (last_error.empty() ? "" : ": " + last_error));
  }
};

PointIndex::PointIndex(const std::vector<model::Point2>& points) : points_(points), geos_(std::make_unique<Geos>()) {
  for (std::size_t i = 0; i < points_.size(); ++i) {
    const model::Point2& p = points_[i];
    if (!std::isfinite(p.x) || !std::isfinite(p.y)) continue;
    GeometryPtr g(GEOSGeom_createPointFromXY_r(geos_->ctx, p.x, p.y), GeometryDeleter{geos_->ctx});
    if (!g) geos_->fail("cannot create a point");
    GEOSSTRtree_insert_r(geos_->ctx, geos_->tree, g.get(), item_of(i));
  }
}

PointIndex::~PointIndex() = default;

namespace {
struct QueryState {
  const std::vector<model::Point2>* points;
  model::Point2 centre;
  double radius;
  std::vector<Neighbour>* out;
};

void collect(void* item, void* userdata) {
  auto* q = static_cast<QueryState*>(userdata);
  const std::size_t i = index_of(item);
  const model::Point2& p = (*q->points)[i];
  const double d = std::hypot(p.x - q->centre.x, p.y - q->centre.y);
  if (d <= q->radius) q->out->push_back({i, d});
}
}  // namespace

std::vector<Neighbour> PointIndex::within(model::Point2 p, double radius_m) const {
  std::vector<Neighbour> out;
  if (points_.empty() || !std::isfinite(p.x) || !std::isfinite(p.y) || !(radius_m >= 0.0)) return out;
  GeometryPtr box(GEOSGeom_createRectangle_r(geos_->ctx, p.x - radius_m, p.y - radius_m, p.x + radius_m, p.y + radius_m),
                  GeometryDeleter{geos_->ctx});
  if (!box) geos_->fail("cannot create a query rectangle");
  QueryState state{&points_, p, radius_m, &out};
  GEOSSTRtree_query_r(geos_->ctx, geos_->tree, box.get(), collect, &state);
  std::sort(out.begin(), out.end(), [](const Neighbour& a, const Neighbour& b) {
    return a.distance_m != b.distance_m ? a.distance_m < b.distance_m : a.index < b.index;
  });
  return out;
}

}  // namespace rimline::topology
