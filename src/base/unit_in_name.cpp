// The unit a field's own name states: the last word of the name, in the spellings exports use.
// Common practice, no source: the abbreviations are those seen in municipal exports.
#include <array>
#include <cctype>
#include <string>
#include <utility>
#include <vector>

#include "rimline/units.hpp"

namespace rimline::units {
namespace {

std::vector<std::string> words(std::string_view name) {
  std::vector<std::string> out;
  std::string w;
  char prev = 0;
  for (char c : name) {
    const auto u = static_cast<unsigned char>(c);
    const bool alnum = std::isalnum(u) != 0;
    const bool camel = alnum && std::isupper(u) && prev && std::islower(static_cast<unsigned char>(prev));
    if ((!alnum || camel) && !w.empty()) {
      out.push_back(w);
      w.clear();
    }
    if (alnum) w += static_cast<char>(std::toupper(u));
    prev = c;
  }
  if (!w.empty()) out.push_back(w);
  return out;
}

}  // namespace

std::optional<Unit> unit_named_in(std::string_view field_name) {
  static const std::array<std::pair<std::string_view, Unit>, 29> last_word{{
      {"M", Unit::m},       {"MTR", Unit::m},      {"METER", Unit::m},   {"METRE", Unit::m},  {"METERS", Unit::m},
      {"METRES", Unit::m},  {"MM", Unit::mm},      {"CM", Unit::cm},     {"FT", Unit::ft},    {"FEET", Unit::ft},
      {"FOOT", Unit::ft},   {"USFT", Unit::us_ft}, {"FTUS", Unit::us_ft}, {"IN", Unit::in},   {"INCH", Unit::in},
      {"INCHES", Unit::in}, {"ZOLL", Unit::in},    {"PULG", Unit::in},   {"LPS", Unit::l_s},  {"LS", Unit::l_s},
      {"CFS", Unit::cfs},   {"CMS", Unit::m3_s},   {"M3S", Unit::m3_s},  {"GPM", Unit::gpm},  {"MGD", Unit::mgd},
      {"KPA", Unit::kpa},   {"PSI", Unit::psi},    {"BAR", Unit::bar},   {"HA", Unit::ha},
  }};
  const auto w = words(field_name);
  if (w.size() < 2) return std::nullopt;  // a name that is only a unit ("M", "IN") states nothing
  // "Q_L_S", "Q_M3_S": a unit written in two words.
  const std::string& last = w.back();
  const std::string& before = w[w.size() - 2];
  if (last == "S" && before == "L" && w.size() >= 3) return Unit::l_s;
  if (last == "S" && before == "M3" && w.size() >= 3) return Unit::m3_s;
  for (const auto& [spelling, unit] : last_word)
    if (last == spelling) return unit;
  return std::nullopt;
}

}  // namespace rimline::units
