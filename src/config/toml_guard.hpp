#pragma once
// Text a project file must not hand to toml++ 3.3: a non-ASCII character where the parser probes
// for whitespace reaches a __builtin_unreachable() in its Unicode tables (undefined behaviour;
// marzer/tomlplusplus issues #190 and #295, fixed upstream by pull request #305, after 3.3.0).
// Outside strings and comments such a character is invalid TOML 1.0 anyway (keys are ASCII).
#include <string>
#include <string_view>

namespace rimline::config::detail {

// The text is first parsed with every non-ASCII byte replaced by '`' (valid in strings and
// comments, nowhere else), which toml++ handles safely. Throws rimline::Error(bad_config)
// "file: line N: ..." when that copy does not parse (naming a non-ASCII character when its line
// has one) or when a non-ASCII character follows a line-ending backslash in a """ string.
void reject_unsafe_toml(const std::string& text, const std::string& file);

// toml++ 3.3 builds and frees a dotted key or table header (`[a.b.c....]`) one nested table per
// part, recursively: ~200,000 parts overflow the stack (SIGSEGV). It caps nested arrays and inline
// tables (TOML_MAX_NESTED_VALUES, 256) but not key parts. The deepest nesting of the text (header
// parts, key parts, arrays and inline tables together) is counted here in one linear pass before
// toml++ sees it; more than max_toml_nesting throws rimline::Error(bad_config) "file: line N: ...".
// TOML 1.0 text is UTF-8. Returns the text without a UTF-8 byte-order mark (editors on Windows
// write one; TOML allows none, toml++ rejects it as a non-ASCII character); throws
// rimline::Error(bad_config) naming the encoding of UTF-16 or UTF-32 text (with or without its
// mark: told by its zero bytes), which would otherwise read as "non-ASCII character outside a string".
std::string_view without_utf8_bom(const std::string& text, const std::string& file);

inline constexpr int max_toml_nesting = 64;  // a project file needs at most 5 (pump_stations' tables)
void reject_deep_nesting(const std::string& text, const std::string& file);

}  // namespace rimline::config::detail
