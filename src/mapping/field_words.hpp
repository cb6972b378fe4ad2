#pragma once
// Words of field names and code values, in the languages exports come in (English, German, French,
// Dutch, Spanish, Danish, Norwegian, Swedish and common abbreviations). Names are only ever a second
// signal in the inference (src/mapping/infer_*.cpp): they break ties and name a direction, the data
// decides. Common practice, no source. Private to src/mapping.
#include <string>
#include <string_view>
#include <vector>

namespace rimline::mapping::detail {

// Upper-case ASCII words of a name or value: split at every non-alphanumeric character and where a
// lower-case letter meets an upper-case one; umlauts and accents folded (Ö -> OE, é -> E, ø -> OE).
std::vector<std::string> words_of(std::string_view text);

enum class Word {
  id, invert, rim, upstream, downstream, from, to, diameter, width, height, length, shape, material, roughness,
  flow, type, pressure, measured, design, node, slope
};

// Whether any word of `words` (or the words joined) belongs to the vocabulary of `w`.
bool says(const std::vector<std::string>& words, Word w);

// Code values: the structure kind a type value names ("manhole", "inlet", "junction", "outfall",
// "pump_station"; "" when none), the section a shape value names ("circular", "box", "egg", ""), whether a
// value names a pressure main, whether it names a pipe material.
std::string kind_named(std::string_view value);
std::string shape_named(std::string_view value);
bool pressure_named(std::string_view value);
bool material_named(std::string_view value);
// A value that means "yes" in a flag field (Y, YES, 1, TRUE, J, JA, OUI, SI, T, X).
bool yes_value(std::string_view value);

}  // namespace rimline::mapping::detail
