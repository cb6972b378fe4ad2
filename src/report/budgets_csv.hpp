#pragma once
// budgets.csv: the full energy budget of every structure with a criteria warning or error, in the
// case with its highest HGL. Private to src/report.
//
// Why a file and why shared (issue 18, defect 9): the report once carried each flagged structure's
// whole budget down to the outfall, so its size grew with findings x path depth (a 20,000-pipe chain
// gave a 904 MB report.html). Budgets of one case that run down the same route share every term
// below the point where they meet; each term is written once, and a budget that reaches terms
// already written ends with a row "continues as the budget of X from step N". The file therefore
// holds at most one row per (case, term) of the network, however many structures are flagged.
#include <cstddef>
#include <ostream>

#include "rimline/run/check_run.hpp"

namespace rimline::report {

// The report shows at most this many terms of a budget (those nearest the structure); the terms
// further down are one summary row pointing to budgets.csv. Common practice, no source: a reviewer
// checks the last few losses by hand; the rest is bookkeeping.
inline constexpr std::size_t budget_rows_shown = 12;

// Whether the report shows a budget for this finding (a structure's warning or error).
bool has_budget(const Finding& f);

void write_budgets_csv(const run::CheckRun& run, std::ostream& out);

}  // namespace rimline::report
