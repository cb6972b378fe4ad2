#include "config/toml_plain.hpp"

#include <array>
#include <utility>

namespace rimline::config::detail {
namespace {

// The text after "saw '" up to the closing quote, shown as found.
std::string saw(std::string_view d) {
  const auto at = d.find("saw '");
  if (at == std::string_view::npos) return "";
  const auto begin = at + 5, end = d.find('\'', begin);
  if (end == std::string_view::npos) return "";
  const std::string_view c = d.substr(begin, end - begin);
  if (c == "\\n" || c == "\n") return "the end of the line";
  return "'" + std::string(c) + "'";
}

bool has(std::string_view d, std::string_view part) { return d.find(part) != std::string_view::npos; }

}  // namespace

std::string plain_toml_error(std::string_view d) {
  const std::string found = saw(d);
  const std::string but = found.empty() ? std::string() : ", but found " + found;
  // Most specific first: a string scope with an end of line or file means a missing closing quote.
  if ((has(d, "parsing string") || has(d, "parsing literal string")) &&
      (has(d, "control character") || has(d, "end-of-file") || has(d, "\\n")))
    return "a quoted text is not closed: a closing quote was expected before the end of the line";
  if (has(d, "unknown escape sequence"))
    return "a backslash in a \"quoted\" text starts an escape (\\n, \\t, \\\\, \\\"); write \\\\ for a backslash, or "
           "use 'single quotes', which take the text as it is";
  if (has(d, "cannot redefine") || has(d, "cannot insert"))
    return "a table or key is given twice: each [table] and each key may appear once (put all keys of a table "
           "under one header)";
  if (has(d, "expected '='"))
    return "'=' and a value were expected after the key" + but +
           " (write key = value; a key with spaces or dots in it goes in quotes)";
  if (has(d, "expected value, saw") || has(d, "could not determine value type"))
    return "a value was expected after '='" + but +
           ": text goes in quotes (\"...\"), numbers and true/false as they are, lists in [ ], tables in { }";
  if (has(d, "parsing array") && has(d, "end-of-file"))
    return "a list [ ... ] is not closed: items are separated by ',' and the list ends with ']' (the file ended first)";
  if (has(d, "expected comma or closing ']'") || has(d, "expected value or closing ']'"))
    return "a list [ ... ] is not closed: items are separated by ',' and the list ends with ']'" + but;
  if (has(d, "expected comma or closing '}'") || has(d, "expected key or closing '}'") ||
      has(d, "dangling comma") || has(d, "parsing inline table"))
    return "an inline table { ... } is not closed: its keys are separated by ',' (no comma after the last) and it "
           "ends with '}' on the same line" + but;
  if (has(d, "parsing table header") || has(d, "expected ']'"))
    return "a table header is not closed: write it [name] or [[name]] on a line of its own" + but;
  if (has(d, "expected keys, tables, whitespace or comments") || has(d, "expected a comment or whitespace"))
    return "a new line with a key = value, a [table] header or a # comment was expected" + but +
           " (one key = value per line)";
  if (has(d, "parsing key"))
    return "a key was expected: keys are letters, digits, '_' and '-', or a text in quotes" + but;
  if (has(d, "integer") || has(d, "floating-point") || has(d, "leading zero") || has(d, "underscore") ||
      has(d, "exponent"))
    return "a number is written wrongly" + but + " (write 0.013 or 12; a quantity with its unit goes in quotes, \"0.3 m\")";
  if (has(d, "date") || has(d, "time"))
    return "a date or time is written wrongly" + but + " (a text goes in quotes)";
  return "the TOML syntax is wrong here (" + std::string(d) + ")";
}

}  // namespace rimline::config::detail
