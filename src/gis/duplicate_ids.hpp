#pragma once
// DATA_DUPLICATE_ID after a layer is read: sorting the ids once is cheaper than a hash map of
// a million strings built feature by feature. Private to src/gis.
#include <cstdint>
#include <functional>
#include <string>
#include <string_view>
#include <vector>

#include "rimline/finding.hpp"

namespace rimline::gis::detail {

struct IdRef {
  std::string_view id;  // views the feature's own id; the features must outlive the call
  std::int64_t fid;
};

// The id of the feature `fid` as the source holds it, untrimmed ("" when unknown).
using RawId = std::function<std::string(std::int64_t fid)>;

// One finding for every feature (in reading order) whose id an earlier feature already has, with
// the feature's fid: "The id "X" is also used by fid N; both <noun> are kept, <consequence>."
// Ids are read trimmed: where the two ids as held (`raw_id`) differ only by spaces around them,
// the message says so.
void report_duplicate_ids(const std::vector<IdRef>& ids, LayerRole layer, const std::string& id_field,
                          std::string_view noun, std::string_view consequence, Findings& findings,
                          const RawId& raw_id = {});

}  // namespace rimline::gis::detail
