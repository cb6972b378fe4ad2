#include "report/exception_links.hpp"

#include "rimline/report/profile_svg.hpp"

namespace rimline::report {

std::string finding_links(const run::CheckRun& run, const FeatureLinks& links, std::size_t k) {
  const Finding& f = run.findings[k];
  std::string h;
  const std::string map = links.map_id(f.layer, f.feature_id);
  if (!map.empty()) h += "<a class=\"to-map\" href=\"#" + xml_escape(map) + "\">map</a>";
  if (const auto p = links.profile(f.layer, f.feature_id, links.finding_case_index(k), f.code)) {
    h += (h.empty() ? "" : " ") + std::string("<a class=\"to-profile\" href=\"") + xml_escape(p->href) + "\">" +
         xml_escape(p->name) + (p->marker ? " marker " + std::to_string(p->marker) : std::string()) + "</a>";
  }
  return h;
}

}  // namespace rimline::report
