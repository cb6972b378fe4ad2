#pragma once
// Text a project file must not hand to toml++ 3.3: a non-ASCII character where the parser probes
// for whitespace reaches a __builtin_unreachable() in its Unicode tables (undefined behaviour;
// marzer/tomlplusplus issues #190 and #295, fixed upstream by pull request #305, after 3.3.0).
// Outside strings and comments such a character is invalid TOML 1.0 anyway (keys are ASCII).
#include <string>

namespace rimline::config::detail {

// The text is first parsed with every non-ASCII byte replaced by '`' (valid in strings and
// comments, nowhere else), which toml++ handles safely. Throws rimline::Error(bad_config)
// "file: line N: ..." when that copy does not parse (naming a non-ASCII character when its line
// has one) or when a non-ASCII character follows a line-ending backslash in a """ string.
void reject_unsafe_toml(const std::string& text, const std::string& file);

}  // namespace rimline::config::detail
