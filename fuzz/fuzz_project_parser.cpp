// libFuzzer harness: any byte string as a project file (or, see expand(), a short input that
// stands for a deep one). The parser may only accept it or throw
// rimline::Error (bad_config) with a message naming the file; any other exception, a crash or a
// sanitizer report is a defect. An accepted project must hold finite SI figures.
#include <cmath>
#include <cstdint>
#include <string>

#include "expand_input.hpp"
#include "rimline/error.hpp"
#include "rimline/config/project.hpp"

namespace {

void require(bool ok) {
  if (!ok) __builtin_trap();
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string text = rimline::fuzz::expand(data, size);
  try {
    const rimline::config::Project p = rimline::config::parse_project(text, "fuzz/project.toml");
    require(std::isfinite(p.snap_tolerance_m));
    for (double tw : p.tailwater_levels_m) require(std::isfinite(tw));
    require(std::isfinite(p.criteria.freeboard_m));
    require(std::isfinite(p.criteria.velocity_min_m_s));
  } catch (const rimline::Error& e) {
    require(std::string(e.what()).find("fuzz/project.toml") != std::string::npos);
  }
  return 0;
}
