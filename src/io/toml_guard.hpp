#pragma once
// Text a project file must not hand to toml++ 3.3: a non-ASCII character where the parser probes
// for whitespace reaches a __builtin_unreachable() in its Unicode tables (undefined behaviour;
// marzer/tomlplusplus issues #190 and #295, fixed upstream by pull request #305, after 3.3.0).
// Outside strings and comments such a character is invalid TOML 1.0 anyway (keys are ASCII).
#include <string>

namespace rimline::io::detail {

// Throws rimline::Error(bad_config) "file: line N: ..." at the first such character.
void reject_unsafe_toml(const std::string& text, const std::string& file);

}  // namespace rimline::io::detail
