#pragma once
// How many times a text occurs in a page or drawing (overlapping occurrences counted).
#include <cstddef>
#include <string>

namespace rimline::test {

inline std::size_t count_of(const std::string& text, const std::string& what) {
  std::size_t n = 0;
  for (auto p = text.find(what); p != std::string::npos; p = text.find(what, p + 1)) ++n;
  return n;
}

}  // namespace rimline::test
