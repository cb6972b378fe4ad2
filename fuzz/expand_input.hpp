#pragma once
// Shared by the project-parser harness and its regression test (tests/e2e/badinput/fuzz_regressions_test.cpp).
#include <cstddef>
#include <cstdint>
#include <string>

namespace rimline::fuzz {

// libFuzzer's inputs are short (scripts/fuzz.sh: -max_len=4096), but the stack overflow of issue
// 18 needed a dotted key or table header of ~200,000 parts. An input starting with 0xFE is read as
// 0xFE, a repeat count (2 bytes, big-endian, times 4: up to 262,140), then HEAD 0x01 UNIT 0x01
// TAIL, and parsed as HEAD + UNIT x count + TAIL: "[a" + ".a" x 200000 + "]" is 11 bytes of input.
inline std::string expand(const std::uint8_t* data, std::size_t size) {
  const std::string raw(reinterpret_cast<const char*>(data), size);
  if (size < 3 || data[0] != 0xFE) return raw;
  const std::size_t count = ((std::size_t{data[1]} << 8) | data[2]) * 4;
  const std::size_t a = raw.find('\x01', 3), b = a == std::string::npos ? a : raw.find('\x01', a + 1);
  if (b == std::string::npos) return raw;
  const std::string unit = raw.substr(a + 1, b - a - 1);
  std::string text = raw.substr(3, a - 3);
  text.reserve(text.size() + unit.size() * count + (size - b));
  for (std::size_t i = 0; i < count; ++i) text += unit;
  return text + raw.substr(b + 1);
}


}  // namespace rimline::fuzz
