#pragma once
// Cube root for the friction kernels. Manning's R^(4/3) and R^(2/3) are evaluated at every trial
// depth of every step of every water-surface profile; the C library's cbrt, with its frexp/ldexp
// range reduction, was the largest single cost of the march (perf, 10^6-pipe network). Here:
// the exponent divided by three in the bit pattern (an estimate within a few per cent), two
// Halley steps (cubic convergence) and one Newton step to polish, for a result within a few ulp
// of std::cbrt (tests/unit/hydraulics/cube_root_test.cpp). Outside the normal range, std::cbrt.
// Twice the library's throughput in a loop; in the march, whose trial depths wait on each other,
// its three divisions cost about what the library did (bench/RESULTS.md).
#include <bit>
#include <cmath>
#include <cstdint>

namespace rimline::hydraulics::detail {

inline double cube_root(double x) {
  if (!(x > 0x1p-1000 && x < 0x1p1000)) return std::cbrt(x);  // zero, negative, tiny, huge, inf, NaN
  // Dividing the biased exponent (and mantissa) by three and re-biasing: 0x2a9f7893782da1ce
  // is the bias term (1023 - 1023/3) << 52 less a constant that centres the estimate's error.
  double y = std::bit_cast<double>(std::bit_cast<std::uint64_t>(x) / 3 + 0x2a9f7893782da1ceULL);
  for (int i = 0; i < 2; ++i) {
    const double y3 = y * y * y;
    y *= (y3 + 2.0 * x) / (2.0 * y3 + x);
  }
  return y - (y * y * y - x) / (3.0 * y * y);
}

}  // namespace rimline::hydraulics::detail
