#pragma once
// The verdict at the top of the review report: per tailwater case (and the run's one flow case),
// whether the network meets the freeboard criterion (no structure's HGL within its required
// freeboard of the rim, none above it) and the surcharge criterion (no pipe's HGL above its crown),
// with the failing features and their shortfalls. Figures come from every case's march, not from
// the run's findings (those hold the worst case per feature only).
#include <string>
#include <vector>

#include "rimline/run/check_run.hpp"

namespace rimline::report {

// One feature that fails a criterion in one case. SI figures.
struct Shortfall {
  std::string id;
  double short_by_m = 0.0;  // freeboard: required - (rim - HGL); surcharge: HGL above the crown
  bool flooded = false;     // structures: the HGL stands above the rim
};

struct CaseVerdict {
  std::string label;                      // the case's label (q() tokens inside)
  std::vector<Shortfall> freeboard;       // the worst first
  std::vector<Shortfall> surcharged;      // the worst first
  std::vector<std::string> rim_unknown;   // solved structures without a rim: freeboard not checked
  std::size_t structures_not_solved = 0;  // not reached by the march (upstream of a blocked pipe)
};

std::vector<CaseVerdict> case_verdicts(const run::CheckRun& run);

// "does not meet freeboard at tailwater 3.900 m: T-04 short by 0.265 m, T-05 by 0.210 m; meets it at
// tailwater 3.200 m", in the run's units (no q() tokens left). `what`: "freeboard" or "surcharge".
std::string verdict_sentence(const run::CheckRun& run, const std::vector<CaseVerdict>& cases, bool freeboard);

// The <section id="verdict"> of report.html.
std::string verdict_section(const run::CheckRun& run);

}  // namespace rimline::report
