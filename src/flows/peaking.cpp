#include "rimline/flows/peaking.hpp"

#include <algorithm>
#include <cmath>

namespace rimline::flows {

double harmon_peaking_factor(double population) {
  const double thousands = std::max(population, 0.0) / 1000.0;
  return 1.0 + 14.0 / (4.0 + std::sqrt(thousands));
}

}  // namespace rimline::flows
