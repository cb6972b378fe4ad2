#pragma once
// Where a finding's feature is on the ground (exceptions.csv x, y; the plan map's exception marks):
// a structure at its point, a pipe or force main at the middle of its plan line (half its length
// along the vertices), a catchment at its centroid, a pump station at its wet well. Run CRS, metres.
#include <optional>
#include <string>
#include <string_view>
#include <unordered_map>

#include "rimline/finding.hpp"
#include "rimline/model/catchment.hpp"
#include "rimline/model/network.hpp"
#include "rimline/run/check_run.hpp"

namespace rimline::report {

// The point halfway along a plan line (its first vertex when it has one; nothing when none).
std::optional<model::Point2> line_middle(const std::vector<model::Point2>& vertices);

class FeatureLocator {
 public:
  explicit FeatureLocator(const run::CheckRun& run);
  // Index of a structure / conduit by its id (the first of duplicates); nullopt when unknown or
  // when no finding of the run names it (only those are indexed).
  std::optional<std::size_t> structure(const std::string& id) const;
  std::optional<std::size_t> conduit(const std::string& id) const;
  // The finding's place in the run CRS (metres); nullopt for project findings and unknown ids.
  std::optional<model::Point2> place(const Finding& f) const;

 private:
  const run::CheckRun& run_;
  // Keyed by views of the run's own ids (a city's 10^6 ids are not copied).
  std::unordered_map<std::string_view, std::size_t> structures_, conduits_, catchments_;
};

}  // namespace rimline::report
