#include "report/feature_locator.hpp"

#include <cmath>
#include <unordered_set>

namespace rimline::report {

std::optional<model::Point2> line_middle(const std::vector<model::Point2>& v) {
  if (v.empty()) return std::nullopt;
  double total = 0.0;
  for (std::size_t k = 1; k < v.size(); ++k) total += std::hypot(v[k].x - v[k - 1].x, v[k].y - v[k - 1].y);
  double left = total / 2.0;
  for (std::size_t k = 1; k < v.size(); ++k) {
    const double seg = std::hypot(v[k].x - v[k - 1].x, v[k].y - v[k - 1].y);
    if (seg > 0.0 && left <= seg) {
      const double t = left / seg;
      return model::Point2{v[k - 1].x + t * (v[k].x - v[k - 1].x), v[k - 1].y + t * (v[k].y - v[k - 1].y)};
    }
    left -= seg;
  }
  return v.front();
}

FeatureLocator::FeatureLocator(const run::CheckRun& run) : run_(run) {
  const auto& net = run.read.network;
  // Only the ids some finding names are looked up: indexing those alone keeps the maps as large as
  // the exception list, not the network (issue 22: three writers each indexed a city's 2 x 10^6 ids
  // at once, ~97 MB apiece at the peak). The first feature of a repeated id is still the one found.
  std::unordered_set<std::string_view> named_structures, named_conduits;
  for (const auto& f : run.findings) {
    if (f.layer == LayerRole::structures || f.layer == LayerRole::pump_stations) named_structures.insert(f.feature_id);
    else if (f.layer == LayerRole::conduits || f.layer == LayerRole::force_mains) named_conduits.insert(f.feature_id);
  }
  for (std::size_t k = 0; k < net.structures.size(); ++k)
    if (named_structures.count(net.structures[k].id)) structures_.emplace(net.structures[k].id, k);
  for (std::size_t k = 0; k < net.conduits.size(); ++k)
    if (named_conduits.count(net.conduits[k].id)) conduits_.emplace(net.conduits[k].id, k);
  for (std::size_t k = 0; k < run.catchments.size(); ++k) catchments_.emplace(run.catchments[k].id, k);
}

std::optional<std::size_t> FeatureLocator::structure(const std::string& id) const {
  const auto it = structures_.find(std::string_view(id));
  return it == structures_.end() ? std::nullopt : std::optional<std::size_t>(it->second);
}

std::optional<std::size_t> FeatureLocator::conduit(const std::string& id) const {
  const auto it = conduits_.find(std::string_view(id));
  return it == conduits_.end() ? std::nullopt : std::optional<std::size_t>(it->second);
}

std::optional<model::Point2> FeatureLocator::place(const Finding& f) const {
  const auto& net = run_.read.network;
  switch (f.layer) {
    case LayerRole::structures:
    case LayerRole::pump_stations:  // a station is named by its wet well
      if (const auto s = structure(f.feature_id)) return net.structures[*s].location;
      return std::nullopt;
    case LayerRole::conduits:
    case LayerRole::force_mains:
      if (const auto c = conduit(f.feature_id)) return line_middle(net.conduits[*c].vertices);
      return std::nullopt;
    case LayerRole::catchments: {
      const auto it = catchments_.find(std::string_view(f.feature_id));
      if (it == catchments_.end()) return std::nullopt;
      return run_.catchments[it->second].centroid;
    }
    case LayerRole::project:
      return std::nullopt;
  }
  return std::nullopt;
}

}  // namespace rimline::report
