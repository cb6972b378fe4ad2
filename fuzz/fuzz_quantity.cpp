// libFuzzer harness: attribute and unit text. The first byte picks the expected dimension, the
// rest is the text. parse_unit must return a unit or nullopt; parse_quantity must return a finite
// SI value or throw rimline::Error. Anything else (a crash, another exception, an infinite or NaN
// value returned quietly) is a defect.
#include <cmath>
#include <cstdint>
#include <string>

#include "rimline/error.hpp"
#include "rimline/config/project.hpp"
#include "rimline/units.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  if (size == 0) return 0;
  using rimline::units::Dimension;
  constexpr Dimension dims[] = {Dimension::length,      Dimension::flow,          Dimension::velocity,
                                Dimension::area,        Dimension::dimensionless, Dimension::slope,
                                Dimension::temperature, Dimension::pressure_head};
  const Dimension expected = dims[data[0] % (sizeof dims / sizeof dims[0])];
  const std::string text(reinterpret_cast<const char*>(data + 1), size - 1);
  if (const auto u = rimline::units::parse_unit(text)) {
    (void)rimline::units::dimension_of(*u);
    (void)rimline::units::unit_symbol(*u);
  }
  try {
    const double v = rimline::config::parse_quantity(text, expected, "fuzz");
    if (!std::isfinite(v)) __builtin_trap();
  } catch (const rimline::Error&) {
  }
  return 0;
}
