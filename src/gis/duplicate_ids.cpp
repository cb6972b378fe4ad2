#include "gis/duplicate_ids.hpp"

#include <algorithm>
#include <numeric>

namespace rimline::gis::detail {

void report_duplicate_ids(const std::vector<IdRef>& ids, LayerRole layer, const std::string& id_field,
                          std::string_view noun, std::string_view consequence, Findings& findings,
                          const RawId& raw_id) {
  std::vector<std::size_t> order(ids.size());
  std::iota(order.begin(), order.end(), std::size_t{0});
  // Stable: within one id the features stay in reading order, so the first is the one kept as "used by".
  std::stable_sort(order.begin(), order.end(), [&ids](std::size_t a, std::size_t b) { return ids[a].id < ids[b].id; });
  std::vector<std::pair<std::size_t, std::int64_t>> repeats;  // (feature index, fid of the first with its id)
  for (std::size_t i = 1; i < order.size(); ++i) {
    std::size_t first = i - 1;
    while (i < order.size() && ids[order[i]].id == ids[order[first]].id)
      repeats.emplace_back(order[i++], ids[order[first]].fid);
  }
  std::sort(repeats.begin(), repeats.end());
  for (const auto& [index, first_fid] : repeats) {
    Finding f;
    f.code = "DATA_DUPLICATE_ID";
    f.severity = Severity::warning;
    f.layer = layer;
    f.feature_id = std::string(ids[index].id);
    f.fid = ids[index].fid;
    f.field = id_field;
    std::string spaces;
    if (raw_id) {
      const std::string mine = raw_id(ids[index].fid), theirs = raw_id(first_fid);
      if (mine != theirs)
        spaces = " (as held the two differ only by spaces around them, \"" + mine + "\" and \"" + theirs +
                 "\", which rimline trims)";
    }
    f.message = "The id \"" + f.feature_id + "\" is also used by fid " + std::to_string(first_fid) + spaces +
                "; both " + std::string(noun) + " are kept and told apart by their fid, " + std::string(consequence) + ".";
    findings.push_back(std::move(f));
  }
}

}  // namespace rimline::gis::detail
