#include "config/toml_guard.hpp"
#include "config/toml_plain.hpp"

#include <toml++/toml.h>

#include <algorithm>

#include "rimline/error.hpp"

namespace rimline::config::detail {
namespace {

enum class State { normal, comment, basic, literal, multi_basic, multi_literal };

bool starts(const std::string& t, std::size_t i, const char* s) { return t.compare(i, 3, s) == 0; }
bool non_ascii(char c) { return static_cast<unsigned char>(c) >= 0x80; }

constexpr const char* outside_quotes =
    "a non-ASCII character outside a string or comment; TOML allows it only in quotes";

// Parses an ASCII stand-in of the text: where it fails, toml++ would have met a non-ASCII
// character outside a string (or the text is wrong anyway).
void parse_ascii_copy(const std::string& text, const std::string& file) {
  std::string ascii = text;
  std::replace_if(ascii.begin(), ascii.end(), non_ascii, '`');
  try {
    (void)toml::parse(ascii, file);
  } catch (const toml::parse_error& e) {
    const std::size_t line = e.source().begin.line;
    std::size_t begin = 0;
    for (std::size_t l = 1; l < line && begin != std::string::npos; ++l) {
      begin = text.find('\n', begin);
      if (begin != std::string::npos) ++begin;
    }
    const std::string this_line =
        begin == std::string::npos ? std::string() : text.substr(begin, text.find('\n', begin) - begin);
    const bool has_non_ascii = std::any_of(this_line.begin(), this_line.end(), non_ascii);
    throw Error(ErrorKind::bad_config, ErrorContext{file, "", "", ""},
                "line " + std::to_string(line) + ": " +
                    (has_non_ascii ? std::string(outside_quotes) : plain_toml_error(e.description())));
  }
}

}  // namespace

void reject_unsafe_toml(const std::string& text, const std::string& file) {
  if (std::none_of(text.begin(), text.end(), non_ascii)) return;
  parse_ascii_copy(text, file);
  State state = State::normal;
  std::size_t line = 1;
  auto fail = [&](const std::string& what) {
    throw Error(ErrorKind::bad_config, ErrorContext{file, "", "", ""}, "line " + std::to_string(line) + ": " + what);
  };
  for (std::size_t i = 0; i < text.size(); ++i) {
    const char c = text[i];
    if (c == '\n') ++line;
    switch (state) {
      case State::normal:
        if (c == '#')
          state = State::comment;
        else if (starts(text, i, "\"\"\""))
          state = State::multi_basic, i += 2;
        else if (starts(text, i, "'''"))
          state = State::multi_literal, i += 2;
        else if (c == '"')
          state = State::basic;
        else if (c == '\'')
          state = State::literal;
        else if (non_ascii(c))
          fail(outside_quotes);
        break;
      case State::comment:
        if (c == '\n') state = State::normal;
        break;
      case State::basic:
        if (c == '\\' && i + 1 < text.size() && text[i + 1] != '\n')
          ++i;
        else if (c == '"' || c == '\n')
          state = State::normal;
        break;
      case State::literal:
        if (c == '\'' || c == '\n') state = State::normal;
        break;
      case State::multi_basic:
        if (c == '\\') {
          // A line-ending backslash trims the whitespace that follows; the first character after
          // it is where toml++ 3.3 misreads a non-ASCII character (issue #190).
          std::size_t j = i + 1;
          while (j < text.size() && (text[j] == ' ' || text[j] == '\t')) ++j;
          if (j < text.size() && (text[j] == '\n' || text[j] == '\r')) {
            while (j < text.size() && (text[j] == ' ' || text[j] == '\t' || text[j] == '\n' || text[j] == '\r')) {
              if (text[j] == '\n') ++line;
              ++j;
            }
            if (j < text.size() && non_ascii(text[j]))
              fail(
                  "a non-ASCII character right after a line-ending backslash in a \"\"\" string; start the line with "
                  "an ASCII character");
            i = j - 1;
          } else {
            ++i;  // an escape: the next character is taken as it is
          }
        } else if (starts(text, i, "\"\"\"")) {
          state = State::normal, i += 2;
        }
        break;
      case State::multi_literal:
        if (starts(text, i, "'''")) state = State::normal, i += 2;
        break;
    }
  }
}

}  // namespace rimline::config::detail
