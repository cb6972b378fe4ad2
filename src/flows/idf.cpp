#include "rimline/flows/idf.hpp"

#include <cmath>
#include <sstream>

#include "rimline/units.hpp"

namespace rimline::flows {

IdfValue idf_intensity(const model::IdfCurve& idf, double duration_s) {
  const double t_min = duration_s / units::seconds_per_minute;
  if (idf.kind == model::IdfCurve::Kind::formula)
    return {idf.a / std::pow(t_min + idf.b_min, idf.c) * idf.intensity_si_per_unit, false};
  const auto& t = idf.durations_s;
  const auto& i = idf.intensities_m_s;
  if (t.empty()) return {0.0, true};
  if (t.size() == 1) return {i[0], duration_s != t[0]};
  // Segment k..k+1 bracketing the duration; the end segments extend beyond the table.
  std::size_t k = 0;
  while (k + 2 < t.size() && duration_s > t[k + 1]) ++k;
  const bool outside = duration_s < t.front() || duration_s > t.back();
  const double d = std::max(duration_s, 1.0e-9);
  const double slope = std::log(i[k + 1] / i[k]) / std::log(t[k + 1] / t[k]);
  return {i[k] * std::exp(slope * std::log(d / t[k])), outside};
}

std::string idf_description(const model::IdfCurve& idf) {
  std::ostringstream o;
  if (idf.kind == model::IdfCurve::Kind::formula) {
    o << "i = " << idf.a << " / (t + " << idf.b_min << " min)^" << idf.c << " " << idf.intensity_unit << ", t in min";
  } else {
    o << "table of " << idf.durations_s.size() << " durations from " << idf.durations_s.front() / 60.0 << " to "
      << idf.durations_s.back() / 60.0 << " min, interpolated log-log";
  }
  if (!idf.label.empty()) o << " (return period " << idf.label << ")";
  return o.str();
}

}  // namespace rimline::flows
