// Number text of the outputs against the C library's printf (ISO C 7.21.6.1, "%.*f" and "%.*g"),
// which wrote these files before: the same characters for every value and precision used, except
// that a negative value rounding to zero reads "0.00", not printf's "-0.00" (no sign on no change).
#include <catch2/catch.hpp>

#include <cmath>
#include <cstdio>
#include <limits>
#include <random>
#include <string>

#include "base/number_text.hpp"

namespace {
std::string printf_text(const char* format, int precision, double v) {
  char buf[512];
  std::snprintf(buf, sizeof buf, format, precision, v);
  return buf;
}
// printf's "%.*f" without the sign of a negative zero ("-0.000" -> "0.000").
std::string printf_fixed(int precision, double v) {
  std::string s = printf_text("%.*f", precision, v);
  if (s.size() > 1 && s[0] == '-' && s.find_first_not_of("0.", 1) == std::string::npos) s.erase(0, 1);
  return s;
}
}  // namespace

TEST_CASE("fixed_text and append_general print what printf prints (fixed up to 1e15)", "[number_text]") {
  std::mt19937_64 rng(20261202);
  std::uniform_real_distribution<double> mantissa(-1.0, 1.0);
  std::uniform_int_distribution<int> exponent(-12, 9);
  int mismatches = 0;
  for (int i = 0; i < 100000; ++i) {
    const double v = mantissa(rng) * std::pow(10.0, exponent(rng));
    for (int d : {0, 2, 3, 4}) mismatches += rimline::fixed_text(v, d) != printf_fixed(d, v);
    std::string g;
    rimline::append_general(g, v, 9);
    mismatches += g != printf_text("%.*g", 9, v);
  }
  CHECK(mismatches == 0);
  // Halfway cases round on the exact binary value, as printf does: 0.125 is exact (ties to even).
  CHECK(rimline::fixed_text(0.125, 2) == printf_text("%.*f", 2, 0.125));
  CHECK(rimline::fixed_text(2.675, 2) == printf_text("%.*f", 2, 2.675));
  CHECK(printf_text("%.*f", 2, -0.0001) == "-0.00");
  CHECK(rimline::fixed_text(-0.0001, 2) == "0.00");
  CHECK(rimline::fixed_text(-0.0, 3) == "0.000");
  CHECK(rimline::fixed_text(-0.0006, 3) == "-0.001");
  CHECK(rimline::fixed_text(9.99e14, 3) == printf_text("%.*f", 3, 9.99e14));
  // Beyond 1e15 the width is bounded (issue 18: 1e300 printed 301 digits): printf's "%.6e".
  CHECK(rimline::fixed_text(1e300, 3) == printf_text("%.*e", 6, 1e300));
  std::string nan_text;
  rimline::append_general(nan_text, std::numeric_limits<double>::quiet_NaN(), 9);
  CHECK(nan_text == printf_text("%.*g", 9, std::numeric_limits<double>::quiet_NaN()));
}
