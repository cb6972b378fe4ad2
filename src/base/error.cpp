#include "rimline/error.hpp"

#include <algorithm>
#include <cctype>

namespace rimline {

std::string format_context(const ErrorContext& where) {
  std::string out;
  auto add = [&out](const std::string& part) {
    if (part.empty()) return;
    out += part;
    out += ':';
  };
  add(where.file);
  add(where.layer);
  if (!where.feature_id.empty()) add("fid " + where.feature_id);
  if (!where.field.empty()) add("field " + where.field);
  if (!out.empty()) out += ' ';
  return out;
}

Error::Error(ErrorKind kind, const ErrorContext& where, const std::string& what)
    : std::runtime_error(format_context(where) + what), kind_(kind), where_(where) {}

namespace {
std::size_t edit_distance(const std::string& a, const std::string& b) {
  std::vector<std::size_t> row(b.size() + 1);
  for (std::size_t j = 0; j <= b.size(); ++j) row[j] = j;
  for (std::size_t i = 1; i <= a.size(); ++i) {
    std::size_t diag = row[0];
    row[0] = i;
    for (std::size_t j = 1; j <= b.size(); ++j) {
      const std::size_t up = row[j];
      const bool same = std::tolower(static_cast<unsigned char>(a[i - 1])) ==
                        std::tolower(static_cast<unsigned char>(b[j - 1]));
      row[j] = std::min({row[j] + 1, row[j - 1] + 1, diag + (same ? 0 : 1)});
      diag = up;
    }
  }
  return row[b.size()];
}
}  // namespace

std::string closest_name(const std::string& wrong, const std::vector<std::string>& candidates) {
  std::string best;
  std::size_t best_d = std::max<std::size_t>(2, wrong.size() / 3) + 1;
  for (const auto& c : candidates) {
    const std::size_t d = edit_distance(wrong, c);
    if (d < best_d) {
      best_d = d;
      best = c;
    }
  }
  return best;
}

}  // namespace rimline
