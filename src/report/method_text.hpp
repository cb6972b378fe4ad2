#pragma once
// The conventions of a run in words, shared by report.html and summary.json: the structure-energy
// bookkeeping and the velocity each K multiplies, the self-cleansing velocity basis, the water
// properties. Private to src/report.
#include <string>
#include <vector>

#include "rimline/run/check_run.hpp"

namespace rimline::report {

// "whole_loss" | "still_pool" | "hec22" (HEC-22's own definition): the run's bookkeeping.
std::string structure_energy_id(const run::CheckRun& run);
// One sentence: how a structure's loss is booked and which velocity K multiplies.
std::string structure_energy_text(const run::CheckRun& run);
// Structures whose bookkeeping differs from the run's ([methods.structures."ID"]), with it.
std::vector<std::pair<std::string, std::string>> structure_energy_exceptions(const run::CheckRun& run);
// One sentence: what VELOCITY_LOW and VELOCITY_HIGH compare.
std::string velocity_rules_text(const run::CheckRun& run);
// Pipes whose self-cleansing basis differs from the run's ([criteria.conduits."ID"]), with it.
std::vector<std::pair<std::string, std::string>> velocity_basis_exceptions(const run::CheckRun& run);

}  // namespace rimline::report
