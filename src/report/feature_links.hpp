#pragma once
// Where a feature shows in report.html besides its table row: the profile that draws it (the one of
// the case that governs its figures when there is one, else the first) with its finding markers,
// its place on the plan map, and its exception rows. Built once per page.
#include <optional>
#include <string>
#include <unordered_map>
#include <vector>

#include "rimline/report/report_html.hpp"
#include "rimline/run/check_run.hpp"

namespace rimline::report {

// Past this many structures and pipes the plan map groups them (plan_map.hpp) and has no element per
// feature to link to. Common practice, no source: a page of a few thousand SVG elements stays responsive.
inline constexpr std::size_t detailed_features = 6000;

class FeatureLinks {
 public:
  FeatureLinks(const run::CheckRun& run, const std::vector<RenderedProfile>& profiles);

  struct ProfileLink {
    std::string href;  // "#figure-OF-1-2" (inline) or "profiles/OF-1-2.svg"
    std::string name;  // "OF-1-2"
    int marker = 0;    // the number of the finding's marker on it, 0 when not marked
  };
  // The drawing of a structure or pipe, preferring the case `case_index` (-1: any).
  std::optional<ProfileLink> profile(LayerRole layer, const std::string& id, std::size_t case_index,
                                     const std::string& code = "") const;
  // Whether the plan map draws every feature (not grouped).
  bool detailed() const { return detailed_; }
  // The plan map's element id of a structure or pipe ("map-s12", "map-c5"); "" when not on the map.
  std::string map_id(LayerRole layer, const std::string& id) const;
  // The case index of a finding of run.findings (its governing case), -1 when none or every case.
  std::size_t finding_case_index(std::size_t finding) const;
  // Ids of the exception rows (run.findings positions "exc-K") of a structure or pipe (detailed maps only).
  const std::vector<std::size_t>& findings_of(LayerRole layer, const std::string& id) const;

 private:
  const run::CheckRun& run_;
  const std::vector<RenderedProfile>& profiles_;
  bool detailed_ = true;
  std::unordered_map<std::string, std::vector<std::size_t>> profiles_of_;  // key -> profile positions
  std::unordered_map<std::string, std::size_t> map_index_;                // key -> structure / conduit index
  std::unordered_map<std::string, std::vector<std::size_t>> findings_;    // key -> run.findings positions
  std::unordered_map<std::string, std::size_t> case_of_label_;
};

}  // namespace rimline::report
