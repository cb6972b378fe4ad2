#pragma once
// A text cell of rimline's CSV files, quoted as RFC 4180 asks. Text that starts with = + - @ (or a
// tab or carriage return) is what a spreadsheet runs as a formula ("CSV injection", OWASP): such a
// cell gets a leading apostrophe, which spreadsheets show as text, and is quoted. Only in CSV
// files: the id is unchanged in every other output. Numbers (value, limit) are not text cells.
// Private to src/report.
#include <string>
#include <string_view>

namespace rimline::report {

inline std::string csv_cell(const std::string& s) {
  const bool formula = !s.empty() && std::string_view("=+-@\t\r").find(s[0]) != std::string_view::npos;
  if (!formula && s.find_first_of(",\"\n\r") == std::string::npos) return s;
  std::string out = formula ? "\"'" : "\"";
  for (char c : s) {
    if (c == '"') out += '"';
    out += c;
  }
  return out + "\"";
}

}  // namespace rimline::report
