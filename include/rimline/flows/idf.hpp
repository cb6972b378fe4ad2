#pragma once
// Rainfall intensity for a duration from an IDF relation (model::IdfCurve).
#include "rimline/model/catchment.hpp"

namespace rimline::flows {

struct IdfValue {
  double intensity_m_s = 0.0;
  bool extrapolated = false;  // table: the duration lies outside the tabulated range
};

// Formula: i = a / (t + b)^c with t, b in minutes, converted to m/s.
// Table: linear in log(t)-log(i) between the bracketing rows; outside the table the end segment
// is extended (extrapolated = true, the caller reports it). A one-row table is a constant.
IdfValue idf_intensity(const model::IdfCurve& idf, double duration_s);

// One line for reports: "i = 3330 / (t + 19 min)^1 mm/h (return period 10yr)" or "table of N durations ...".
std::string idf_description(const model::IdfCurve& idf);

}  // namespace rimline::flows
