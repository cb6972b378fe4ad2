#pragma once
// Counts each use of a project default once per kind (role + what was used), so a run over a
// million pipes reports "n = 0.013 from ... for 779 pipes" instead of a million findings.
// The note's text is built only the first time a kind is seen.
#include <map>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "rimline/gis/read_network.hpp"

namespace rimline::gis::detail {

class DefaultTally {
 public:
  // `key` tells kinds of the same role apart (a material name, a default's name).
  template <typename MakeText>
  void add(LayerRole layer, std::string_view role, std::string_view key, const std::string& feature_id,
           MakeText&& make_text) {
    auto& by_key = index_[static_cast<int>(layer)][std::string(role)];
    auto it = by_key.find(key);
    if (it == by_key.end()) {
      it = by_key.emplace(std::string(key), notes_.size()).first;
      notes_.push_back(DefaultNote{layer, std::string(role), make_text(), 0, {}});
    }
    DefaultNote& n = notes_[it->second];
    ++n.count;
    if (n.example_ids.size() < 5) n.example_ids.push_back(feature_id);
  }
  std::vector<DefaultNote> take() { return std::move(notes_); }

 private:
  std::map<int, std::map<std::string, std::map<std::string, std::size_t, std::less<>>, std::less<>>> index_;
  std::vector<DefaultNote> notes_;
};

}  // namespace rimline::gis::detail
