#pragma once
// Decimal text of numbers for the outputs. std::to_chars prints exactly what printf's "%.*f" and
// "%.*g" print in the C locale (ISO C++ [charconv.to.chars]; one exception: no "-0.000"), without printf's format parsing and
// arbitrary-precision digit loop, which were a tenth of the CPU time of writing a city's outputs.
#include <algorithm>
#include <charconv>
#include <string>
#include <string_view>

namespace rimline {

// Beyond this magnitude fixed notation would print up to 309 digits (a 1e300 coordinate, a huge
// tailwater in ft: issue 18); no measured quantity comes near it, so such a value is printed in
// scientific notation with 7 significant digits, and no number is wider than 25 characters.
inline constexpr double fixed_text_limit = 1e15;

// printf("%.*f", decimals, v), decimals taken within 0..17; |v| >= fixed_text_limit as "%.6e"
inline void append_fixed(std::string& out, double v, int decimals) {
  char buf[400];  // the longest fixed double (1.8e308 with its sign and 17 decimals) fits
  const int d = decimals < 0 ? 0 : decimals > 17 ? 17 : decimals;
  const bool huge = v >= fixed_text_limit || v <= -fixed_text_limit;
  const auto r = huge ? std::to_chars(buf, buf + sizeof buf, v, std::chars_format::scientific, 6)
                      : std::to_chars(buf, buf + sizeof buf, v, std::chars_format::fixed, d);
  // A small negative value that rounds to zero reads "0.000", not "-0.000": a change of -0.2 mm
  // shown to the millimetre is no change, and a sign on it would suggest one.
  char* first = buf;
  if (!huge && buf[0] == '-' && std::all_of(buf + 1, r.ptr, [](char c) { return c == '0' || c == '.'; })) ++first;
  out.append(first, r.ptr);
}

inline std::string fixed_text(double v, int decimals) {
  std::string s;
  append_fixed(s, v, decimals);
  return s;
}

// printf("%.*g", digits, v)
inline void append_general(std::string& out, double v, int digits) {
  char buf[64];
  const auto r = std::to_chars(buf, buf + sizeof buf, v, std::chars_format::general, digits);
  out.append(buf, r.ptr);
}

}  // namespace rimline
