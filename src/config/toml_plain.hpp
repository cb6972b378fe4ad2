#pragma once
// toml++'s syntax errors in plain words: what was expected and how to write it. Private to src/config.
#include <string>
#include <string_view>

namespace rimline::config::detail {

// "Error while parsing key-value pair: expected '=', saw 'x'" -> "a '=' and a value were expected after
// the key, but found 'x' (write key = value ...)". The parser's own words follow in parentheses for
// anything the table below does not know.
std::string plain_toml_error(std::string_view description);

}  // namespace rimline::config::detail
