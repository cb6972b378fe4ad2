#include "config/toml_section.hpp"

#include <algorithm>

#include "rimline/error.hpp"

namespace rimline::config::detail {
namespace {

std::string_view type_name(const toml::node& n) {
  switch (n.type()) {
    case toml::node_type::table:
      return "a table";
    case toml::node_type::array:
      return "an array";
    case toml::node_type::string:
      return "a string";
    case toml::node_type::integer:
      return "an integer";
    case toml::node_type::floating_point:
      return "a number";
    case toml::node_type::boolean:
      return "a boolean";
    case toml::node_type::date:
    case toml::node_type::time:
    case toml::node_type::date_time:
      return "a date/time";
    case toml::node_type::none:
      break;
  }
  return "nothing";
}

std::string_view dimension_name(units::Dimension d) {
  switch (d) {
    case units::Dimension::length:
      return "length";
    case units::Dimension::flow:
      return "flow";
    case units::Dimension::velocity:
      return "velocity";
    case units::Dimension::area:
      return "area";
    case units::Dimension::dimensionless:
      return "number without unit";
    case units::Dimension::slope:
      return "slope";
    case units::Dimension::temperature:
      return "temperature";
    case units::Dimension::pressure_head:
      return "pressure head";
    case units::Dimension::time:
      return "time";
    case units::Dimension::intensity:
      return "rainfall intensity";
    case units::Dimension::flow_per_length:
      return "flow per length";
    case units::Dimension::flow_per_area:
      return "flow per area";
  }
  return "quantity";
}

thread_local std::vector<std::string>* recording = nullptr;

}  // namespace

KeyRecording::KeyRecording(std::vector<std::string>& set) : previous_(recording) { recording = &set; }
KeyRecording::~KeyRecording() { recording = previous_; }
void KeyRecording::note(const std::string& pattern) {
  if (recording && std::find(recording->begin(), recording->end(), pattern) == recording->end())
    recording->push_back(pattern);
}

TomlSection::TomlSection(const toml::table* table, std::string name, const std::string& file, std::string pattern)
    : table_(table), name_(std::move(name)), pattern_(pattern.empty() ? name_ : std::move(pattern)), file_(file) {}

std::string TomlSection::dotted(std::string_view key) const {
  if (name_.empty()) return std::string(key);
  return name_ + "." + std::string(key);
}

std::string TomlSection::dotted_pattern(std::string_view key) const {
  if (pattern_.empty()) return std::string(key);
  return pattern_ + "." + std::string(key);
}

std::string TomlSection::where(const toml::node* node, std::string_view key) const {
  std::string out;
  if (node && node->source().begin.line > 0)
    out = "line " + std::to_string(node->source().begin.line) + ": ";
  else if (table_ && table_->source().begin.line > 0)
    out = "line " + std::to_string(table_->source().begin.line) + ": ";
  return out + "key " + dotted(key);
}

std::string TomlSection::where(std::string_view key) const {
  const toml::node* node = table_ ? table_->get(key) : nullptr;
  return where(node, key);
}

void TomlSection::fail_at(const toml::node* node, std::string_view key, const std::string& message) const {
  throw Error(ErrorKind::bad_config, ErrorContext{file_, "", "", ""}, where(node, key) + ": " + message);
}

void TomlSection::fail(std::string_view key, const std::string& message) const {
  fail_at(table_ ? table_->get(key) : nullptr, key, message);
}

void TomlSection::fail_choice(std::string_view key, const std::string& value,
                              const std::vector<std::string>& names) const {
  std::string list;
  for (const auto& n : names) list += (list.empty() ? "" : ", ") + ("\"" + n + "\"");
  std::string msg = "\"" + value + "\" is not one of " + list;
  const std::string near = closest_name(value, names);
  if (!near.empty()) msg += "; did you mean \"" + near + "\"?";
  fail(key, msg);
}

const toml::node* TomlSection::get(std::string_view key) {
  const std::string pattern = dotted_pattern(key);
  require_in_key_table(pattern);
  known_.emplace_back(key);
  const toml::node* n = table_ ? table_->get(key) : nullptr;
  if (n && recording) KeyRecording::note(pattern);
  return n;
}

std::optional<std::string> TomlSection::string(std::string_view key) {
  const toml::node* n = get(key);
  if (!n) return std::nullopt;
  if (!n->is_string()) fail_at(n, key, "expected a string, found " + std::string(type_name(*n)));
  return std::string(n->as_string()->get());
}

std::optional<double> TomlSection::number(std::string_view key) {
  const toml::node* n = get(key);
  if (!n) return std::nullopt;
  if (n->is_floating_point()) return n->as_floating_point()->get();
  if (n->is_integer()) return static_cast<double>(n->as_integer()->get());
  fail_at(n, key, "expected a number, found " + std::string(type_name(*n)));
}

std::optional<bool> TomlSection::boolean(std::string_view key) {
  const toml::node* n = get(key);
  if (!n) return std::nullopt;
  if (!n->is_boolean()) fail_at(n, key, "expected true or false, found " + std::string(type_name(*n)));
  return n->as_boolean()->get();
}

std::optional<double> TomlSection::quantity(std::string_view key, units::Dimension expected) {
  const toml::node* n = get(key);
  if (!n) return std::nullopt;
  if (!n->is_string())
    fail_at(n, key,
            "expected a quantity string \"<number> <unit>\" (a " + std::string(dimension_name(expected)) + "), found " +
                std::string(type_name(*n)));
  return parse_quantity(std::string(n->as_string()->get()), expected, file_ + ": " + where(n, key));
}

std::vector<std::string> TomlSection::strings(std::string_view key) {
  const toml::node* n = get(key);
  std::vector<std::string> out;
  if (!n) return out;
  if (n->is_string()) {
    out.emplace_back(n->as_string()->get());
    return out;
  }
  if (!n->is_array()) fail_at(n, key, "expected a string or an array of strings, found " + std::string(type_name(*n)));
  for (const toml::node& item : *n->as_array()) {
    if (!item.is_string())
      fail_at(&item, key, "expected an array of strings, found an element that is " + std::string(type_name(item)));
    out.emplace_back(item.as_string()->get());
  }
  return out;
}

FieldRef TomlSection::field_ref(std::string_view key, units::Dimension dimension) {
  const toml::node* n = get(key);
  FieldRef ref;
  if (!n) return ref;
  if (dimension == units::Dimension::dimensionless && n->is_string()) {
    ref.field = n->as_string()->get();
    return ref;
  }
  if (!n->is_table())
    fail_at(n, key,
            "expected { field = \"NAME\", unit = \"...\" } (a " + std::string(dimension_name(dimension)) +
                " needs its unit), found " + std::string(type_name(*n)));
  TomlSection sub(n->as_table(), dotted(key), file_, unchecked_pattern);  // the role's key is in the table
  const auto field = sub.string("field");
  if (!field || field->empty()) sub.fail("field", "the source field name is missing");
  ref.field = *field;
  const auto unit_text = sub.string("unit");
  if (!unit_text && dimension != units::Dimension::dimensionless) sub.fail("unit", "the unit is missing");
  if (unit_text) {
    const auto unit = units::parse_unit(*unit_text);
    if (!unit) {
      std::string msg = "unknown unit \"" + *unit_text + "\"";
      if (dimension != units::Dimension::dimensionless)
        msg += "; the units of " + std::string(dimension_name(dimension)) + " are " + units::unit_symbols(dimension);
      sub.fail("unit", msg);
    }
    if (units::dimension_of(*unit) != dimension)
      sub.fail("unit", "\"" + *unit_text + "\" is not a unit of " + std::string(dimension_name(dimension)));
    ref.unit = *unit;
  }
  sub.finish();
  return ref;
}

TomlSection TomlSection::table(std::string_view key) {
  const toml::node* n = get(key);
  if (n && !n->is_table()) fail_at(n, key, "expected a table, found " + std::string(type_name(*n)));
  return TomlSection(n ? n->as_table() : nullptr, dotted(key), file_, dotted_pattern(key));
}

std::vector<std::pair<std::string, const toml::node*>> TomlSection::entries() {
  std::vector<std::pair<std::string, const toml::node*>> out;
  require_in_key_table(dotted_pattern("*"));
  if (!table_) return out;
  if (recording && !table_->empty()) KeyRecording::note(dotted_pattern("*"));
  for (const auto& [k, v] : *table_) {
    known_.emplace_back(k.str());
    out.emplace_back(std::string(k.str()), &v);
  }
  return out;
}

void TomlSection::finish() const {
  if (!table_) return;
  for (const auto& [k, v] : *table_) {
    if (std::find(known_.begin(), known_.end(), k.str()) != known_.end()) continue;
    std::string msg = "unknown key";
    const std::string near = closest_name(std::string(k.str()), known_);
    if (!near.empty()) msg += "; did you mean \"" + near + "\"?";
    fail_at(&v, k.str(), msg);
  }
}

}  // namespace rimline::config::detail
