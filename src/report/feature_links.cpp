#include "report/feature_links.hpp"

namespace rimline::report {
namespace {

constexpr std::size_t none = static_cast<std::size_t>(-1);

// Pump stations are named by their wet well (a structure); force mains are conduits.
char layer_letter(LayerRole layer) {
  switch (layer) {
    case LayerRole::structures:
    case LayerRole::pump_stations: return 's';
    case LayerRole::conduits:
    case LayerRole::force_mains: return 'c';
    default: return 'x';
  }
}

std::string key(LayerRole layer, const std::string& id) { return std::string(1, layer_letter(layer)) + id; }

}  // namespace

FeatureLinks::FeatureLinks(const run::CheckRun& run, const std::vector<RenderedProfile>& profiles)
    : run_(run), profiles_(profiles) {
  const auto& net = run.read.network;
  for (std::size_t c = 0; c < run.cases.size(); ++c) case_of_label_.emplace(run.cases[c].label, c);
  for (std::size_t k = 0; k < profiles.size(); ++k) {
    for (const auto& id : profiles[k].structure_ids) profiles_of_["s" + id].push_back(k);
    for (const auto& id : profiles[k].conduit_ids) profiles_of_["c" + id].push_back(k);
  }
  // A grouped map has no element per feature: nothing to index (a city's 10^6 ids).
  detailed_ = net.structures.size() + net.conduits.size() <= detailed_features;
  if (!detailed_) return;
  for (std::size_t s = 0; s < net.structures.size(); ++s) map_index_.emplace("s" + net.structures[s].id, s);
  for (std::size_t c = 0; c < net.conduits.size(); ++c) map_index_.emplace("c" + net.conduits[c].id, c);
  for (std::size_t k = 0; k < run.findings.size(); ++k) findings_[key(run.findings[k].layer, run.findings[k].feature_id)].push_back(k);
}

std::optional<FeatureLinks::ProfileLink> FeatureLinks::profile(LayerRole layer, const std::string& id,
                                                               std::size_t case_index, const std::string& code) const {
  const auto it = profiles_of_.find(key(layer, id));
  if (it == profiles_of_.end() || it->second.empty()) return std::nullopt;
  std::size_t pick = it->second.front();
  for (std::size_t k : it->second)
    if (profiles_[k].case_index == case_index) {
      pick = k;
      break;
    }
  const auto& p = profiles_[pick];
  ProfileLink link{pick < inline_profiles ? "#figure-" + p.name : "profiles/" + p.name + ".svg", p.name, 0};
  for (const auto& m : p.markers)
    if (m.feature_id == id && (code.empty() || m.code == code)) {
      link.marker = m.number;
      break;
    }
  return link;
}

std::string FeatureLinks::map_id(LayerRole layer, const std::string& id) const {
  const auto it = map_index_.find(key(layer, id));
  if (it == map_index_.end()) return "";
  return "map-" + std::string(1, layer_letter(layer)) + std::to_string(it->second);
}

std::size_t FeatureLinks::finding_case_index(std::size_t finding) const {
  if (finding >= run_.finding_case.size()) return none;
  const auto it = case_of_label_.find(run_.finding_case[finding]);
  return it == case_of_label_.end() ? none : it->second;
}

const std::vector<std::size_t>& FeatureLinks::findings_of(LayerRole layer, const std::string& id) const {
  static const std::vector<std::size_t> empty;
  const auto it = findings_.find(key(layer, id));
  return it == findings_.end() ? empty : it->second;
}

}  // namespace rimline::report
