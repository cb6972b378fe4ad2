#pragma once
// Small helpers so every topology finding carries the same fields in the same way.
#include <string>

#include "rimline/finding.hpp"
#include "rimline/model/network.hpp"

namespace rimline::topology {

// "12.35" style text of a value with a fixed number of decimals (finite values only).
std::string fixed(double value, int decimals);

Finding conduit_finding(const model::Conduit& c, std::string code, Severity severity, std::string message);
Finding structure_finding(const model::Structure& s, std::string code, Severity severity, std::string message);

// The id to name a feature by in a message: its own id, else "fid N", else "#index".
std::string label(const model::Conduit& c, std::size_t index);
std::string label(const model::Structure& s, std::size_t index);

}  // namespace rimline::topology
