#pragma once
// Every method and default criterion rimline applies, with its source: one table that feeds
// `rimline methods`, the summary and the README.
#include <span>
#include <string_view>

namespace rimline {

struct MethodRow {
  std::string_view group;        // "friction", "structure loss", "criterion", "profile"
  std::string_view id;           // the project-file value
  std::string_view name;
  std::string_view description;
  std::string_view source;       // document and equation, or "common practice, no source" / "from memory"
};

std::span<const MethodRow> method_rows();

}  // namespace rimline
