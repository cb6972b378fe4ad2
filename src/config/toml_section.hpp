#pragma once
// A checked view of one TOML table of the project file: every key asked for is remembered,
// and finish() rejects the rest with "did you mean ...?", so a misspelt key never passes
// silently. Private to src/config.
#include <toml++/toml.h>

#include <initializer_list>
#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "rimline/config/project.hpp"
#include "rimline/units.hpp"

namespace rimline::config::detail {

// The pattern of a section whose keys are not looked up in the key table (the field and unit of a
// field mapping: the mapping's own key is).
inline constexpr const char* unchecked_pattern = "~";

// Throws Error(internal) when the parser asks for a key that src/config/project_keys.cpp does not
// list: the table, docs/project-file.md and the parser are kept in step (a test compares them).
void require_in_key_table(const std::string& pattern);

// While one is alive on a thread, every key a section finds in the file is added to `set` as its
// pattern (for project_keys_set).
class KeyRecording {
 public:
  explicit KeyRecording(std::vector<std::string>& set);
  ~KeyRecording();
  KeyRecording(const KeyRecording&) = delete;
  KeyRecording& operator=(const KeyRecording&) = delete;
  static void note(const std::string& pattern);

 private:
  std::vector<std::string>* previous_;
};

class TomlSection {
 public:
  // `table` may be null (the section is absent); `name` is the dotted path, "" for the root.
  // `pattern` is the path in the key table (src/config/project_keys.cpp): `name` with each
  // name the user chose written `*` and each entry of an array of tables `[]`; empty: `name`.
  TomlSection(const toml::table* table, std::string name, const std::string& file, std::string pattern = "");

  bool present() const { return table_ != nullptr; }
  const std::string& name() const { return name_; }
  const std::string& pattern() const { return pattern_; }

  std::optional<std::string> string(std::string_view key);
  std::optional<double> number(std::string_view key);
  std::optional<bool> boolean(std::string_view key);
  // "<number> <unit>" string checked against the dimension, returned in SI.
  std::optional<double> quantity(std::string_view key, units::Dimension expected);
  std::vector<std::string> strings(std::string_view key);  // a string or an array of strings
  FieldRef field_ref(std::string_view key, units::Dimension dimension);
  TomlSection table(std::string_view key);  // absent -> an empty section
  // Any node under `key` (marked known), for values whose shape the caller checks (arrays of tables).
  const toml::node* node(std::string_view key) { return get(key); }
  const std::string& file() const { return file_; }

  // A string key restricted to the listed values (error names the choices, "did you mean").
  template <typename E>
  std::optional<E> choice(std::string_view key, std::initializer_list<std::pair<std::string_view, E>> values) {
    const auto text = string(key);
    if (!text) return std::nullopt;
    std::vector<std::string> names;
    for (const auto& [name, value] : values) {
      if (name == *text) return value;
      names.emplace_back(name);
    }
    fail_choice(key, *text, names);
  }

  // Every key of the table, for tables whose keys are data (material -> n); marks them known.
  std::vector<std::pair<std::string, const toml::node*>> entries();

  // Throws for the first key of the table that was never asked for.
  void finish() const;

  [[noreturn]] void fail(std::string_view key, const std::string& message) const;
  [[noreturn]] void fail_at(const toml::node* node, std::string_view key, const std::string& message) const;
  std::string where(std::string_view key) const;  // "line 12: key pipes.fields.id" for messages
  std::string where(const toml::node* node, std::string_view key) const;

 private:
  const toml::node* get(std::string_view key);
  [[noreturn]] void fail_choice(std::string_view key, const std::string& value,
                                const std::vector<std::string>& names) const;
  std::string dotted(std::string_view key) const;
  std::string dotted_pattern(std::string_view key) const;

  const toml::table* table_;
  std::string name_;
  std::string pattern_;
  const std::string& file_;
  std::vector<std::string> known_;
};

}  // namespace rimline::config::detail
