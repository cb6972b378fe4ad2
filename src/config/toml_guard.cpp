#include "config/toml_guard.hpp"
#include "config/toml_plain.hpp"

#include <toml++/toml.h>

#include <algorithm>
#include <vector>

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
  reject_deep_nesting(text, file);  // before any parse, the ASCII copy's included
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

namespace {

// Index just past the string starting at the quote t[i] (basic or literal, one line or three
// quotes), counting the newlines it spans into `line`. A string left open ends at its line end
// (one-line) or at the end of the text; toml++ reports it.
std::size_t past_string(const std::string& t, std::size_t i, std::size_t& line) {
  const char q = t[i];
  const std::string three(3, q);
  const bool multi = t.compare(i, 3, three) == 0;
  std::size_t j = i + (multi ? 3 : 1);
  while (j < t.size()) {
    const char c = t[j];
    if (c == '\n') {
      if (!multi) return j;
      ++line;
    } else if (c == '\\' && q == '"' && j + 1 < t.size()) {
      if (t[j + 1] == '\n') ++line;
      ++j;  // the escaped character is part of the string
    } else if (c == q) {
      if (!multi) return j + 1;
      if (t.compare(j, 3, three) == 0) {
        j += 3;
        while (j < t.size() && t[j] == q) ++j;  // up to two more quotes close it ("""a"""" is 'a"')
        return j;
      }
    }
    ++j;
  }
  return j;
}

}  // namespace

std::string_view without_utf8_bom(const std::string& text, const std::string& file) {
  auto at = [&text](std::size_t i) { return i < text.size() ? static_cast<unsigned char>(text[i]) : 0x100u; };
  auto fail = [&file](const std::string& encoding) {
    throw Error(ErrorKind::bad_config, ErrorContext{file, "", "", ""},
                "the project file is " + encoding + " text; TOML is UTF-8: save it as UTF-8 (without a byte-order mark is best)");
  };
  // Byte-order marks (The Unicode Standard, section 23.8, table 23-4), the longer UTF-32 ones first.
  if (at(0) == 0xFF && at(1) == 0xFE && at(2) == 0 && at(3) == 0) fail("UTF-32 (little-endian)");
  if (at(0) == 0 && at(1) == 0 && at(2) == 0xFE && at(3) == 0xFF) fail("UTF-32 (big-endian)");
  if (at(0) == 0xFF && at(1) == 0xFE) fail("UTF-16 (little-endian)");
  if (at(0) == 0xFE && at(1) == 0xFF) fail("UTF-16 (big-endian)");
  std::string_view out(text);
  if (at(0) == 0xEF && at(1) == 0xBB && at(2) == 0xBF) out.remove_prefix(3);
  // Without a mark: ASCII in UTF-16 has a zero byte in every other position.
  if (out.size() >= 2 && out.find('\0') != std::string_view::npos) {
    std::size_t even = 0, odd = 0;
    for (std::size_t i = 0; i < out.size() && i < 4096; ++i)
      if (out[i] == '\0') ++(i % 2 ? odd : even);
    const std::size_t half = std::min<std::size_t>(out.size(), 4096) / 2;
    if (odd * 4 >= half * 3 && even * 4 < half) fail("UTF-16 (little-endian, no byte-order mark)");
    if (even * 4 >= half * 3 && odd * 4 < half) fail("UTF-16 (big-endian, no byte-order mark)");
  }
  return out;
}

void reject_deep_nesting(const std::string& t, const std::string& file) {
  // Depths: the root table is 0; a [header] of p parts is a table at depth p (an [[array]] one
  // more); a key of p parts in a table at depth d puts its value at d + p; an array's elements are
  // one deeper than the array; an inline table is a table at the depth of its value.
  struct Open {
    char kind;        // '[' array, '{' inline table
    std::size_t depth;  // the depth of its elements (array) or of itself (inline table)
  };
  std::vector<Open> open;
  std::size_t table_depth = 0, value_depth = 0, parts = 1, header_extra = 0, line = 1;
  enum class Mode { line_start, key, header, value } mode = Mode::line_start;
  auto fail = [&](const std::string& what, std::size_t depth) {
    throw Error(ErrorKind::bad_config, ErrorContext{file, "", "", ""},
                "line " + std::to_string(line) + ": " + what + " nested " + std::to_string(depth) +
                    " levels deep; a project file needs a few, rimline reads at most " +
                    std::to_string(max_toml_nesting));
  };
  auto base = [&] { return open.empty() ? table_depth : open.back().depth; };
  const std::string nested_values = "arrays, inline tables and keys";
  // A key or header ends at '=' or ']' (or, unfinished, at its line end): its depth is checked then.
  auto end_key = [&] {
    if (mode == Mode::key && base() + parts > static_cast<std::size_t>(max_toml_nesting))
      fail(2 * parts > base() + parts ? "a dotted key of " + std::to_string(parts) + " parts" : nested_values,
           base() + parts);
    if (mode == Mode::header && parts + header_extra > static_cast<std::size_t>(max_toml_nesting))
      fail("a table header of " + std::to_string(parts) + " parts", parts + header_extra);
  };
  auto enter = [&](char kind, std::size_t depth) {
    if (depth > static_cast<std::size_t>(max_toml_nesting)) fail(nested_values, depth);
    open.push_back({kind, depth});
  };
  for (std::size_t i = 0; i < t.size();) {
    const char c = t[i];
    if (c == '\n') {
      end_key();
      ++line, ++i;
      if (open.empty()) mode = Mode::line_start;
      continue;
    }
    if (c == '#') {  // a comment runs to the line end
      while (i < t.size() && t[i] != '\n') ++i;
      continue;
    }
    if (c == '"' || c == '\'') {  // a quoted key part or a string value: nothing inside counts
      i = past_string(t, i, line);
      continue;
    }
    if (mode == Mode::line_start) {
      if (c == ' ' || c == '\t' || c == '\r') {
        ++i;
        continue;
      }
      parts = 1;
      if (c == '[') {
        header_extra = i + 1 < t.size() && t[i + 1] == '[' ? 1 : 0;  // an [[array of tables]] element
        mode = Mode::header;
        i += 1 + header_extra;
        continue;
      }
      mode = Mode::key;
    }
    switch (mode) {
      case Mode::line_start:
        break;
      case Mode::header:
        if (c == '.') ++parts;
        if (c == ']') {
          end_key();
          table_depth = parts + header_extra;
          mode = Mode::value;  // the rest of the line: a comment at most
          value_depth = table_depth;
        }
        break;
      case Mode::key:
        if (c == '.') ++parts;
        if (c == '=') {
          end_key();
          value_depth = base() + parts;
          mode = Mode::value;
        } else if (c == '}' && !open.empty() && open.back().kind == '{') {  // an empty inline table
          open.pop_back();
          mode = Mode::value;
        }
        break;
      case Mode::value:
        if (c == '[') {
          enter('[', value_depth + 1);
          value_depth = open.back().depth;
        } else if (c == '{') {
          enter('{', value_depth);
          mode = Mode::key;
          parts = 1;
        } else if (c == ',' && !open.empty()) {
          if (open.back().kind == '{') {
            mode = Mode::key;
            parts = 1;
          } else {
            value_depth = open.back().depth;
          }
        } else if ((c == ']' || c == '}') && !open.empty()) {
          open.pop_back();
        }
        break;
    }
    ++i;
  }
  end_key();
}

}  // namespace rimline::config::detail
