#include "io/toml_guard.hpp"

#include "rimline/error.hpp"

namespace rimline::io::detail {
namespace {

enum class State { normal, comment, basic, literal, multi_basic, multi_literal };

bool starts(const std::string& t, std::size_t i, const char* s) { return t.compare(i, 3, s) == 0; }
bool non_ascii(char c) { return static_cast<unsigned char>(c) >= 0x80; }

}  // namespace

void reject_unsafe_toml(const std::string& text, const std::string& file) {
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
          fail("a non-ASCII character outside a string or comment; TOML allows it only in quotes");
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

}  // namespace rimline::io::detail
