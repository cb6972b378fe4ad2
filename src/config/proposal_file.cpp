// A proposal file: TOML -> config::Proposal (SI). Keys in docs/project-file.md ("Proposal files")
// and src/config/project_keys.cpp (the proposal.* rows).
#include "rimline/config/proposal.hpp"

#include <filesystem>
#include <fstream>
#include <sstream>

#include "config/source_path.hpp"
#include "config/toml_guard.hpp"
#include "config/toml_plain.hpp"
#include "config/toml_section.hpp"
#include "rimline/error.hpp"

namespace rimline::config {
namespace {

using detail::TomlSection;
using units::Dimension;

// Each entry of an array of tables [[proposal.<key>]], read by `read`.
template <typename Read>
void each_entry(TomlSection& s, std::string_view key, Read read) {
  const toml::node* node = s.node(key);
  if (!node) return;
  const toml::array* list = node->as_array();
  if (!list) s.fail_at(node, key, "expected [[" + s.name() + "." + std::string(key) + "]] tables");
  std::size_t n = 0;
  for (const toml::node& item : *list) {
    ++n;
    if (!item.is_table()) s.fail_at(&item, key, "expected [[" + s.name() + "." + std::string(key) + "]] tables");
    read(TomlSection(item.as_table(), s.name() + "." + std::string(key) + "[" + std::to_string(n) + "]", s.file(),
                     s.pattern() + "." + std::string(key) + "[]"));
  }
}

// [proposal.new_pipes] / [proposal.new_structures]: a layer of added features. A relative source
// is read beside the proposal file, as the project's own layers are beside the project file.
LayerSource new_layer(TomlSection t, const std::string& proposal_path) {
  if (!t.present()) return {};
  LayerSource src = detail::read_layer_source(t, std::filesystem::path(proposal_path).parent_path().string());
  if (!src.where.empty()) src.where_origin = proposal_path;
  t.finish();
  return src;
}

std::string required_id(TomlSection& t, std::string_view key) {
  const auto id = t.string(key);
  if (!id || id->empty()) t.fail(key, "is missing");
  return *id;
}

}  // namespace

Proposal parse_proposal(const std::string& toml_text, const std::string& path_for_messages) {
  Proposal p;
  p.file = path_for_messages;
  toml::table root;
  detail::reject_unsafe_toml(toml_text, p.file);
  try {
    root = toml::parse(toml_text, path_for_messages);
  } catch (const toml::parse_error& e) {
    throw Error(ErrorKind::bad_config, ErrorContext{p.file, "", "", ""},
                "line " + std::to_string(e.source().begin.line) + ": " + detail::plain_toml_error(e.description()));
  }
  TomlSection top(&root, "", p.file);
  TomlSection s = top.table("proposal");
  top.finish();
  if (!s.present())
    throw Error(ErrorKind::bad_config, ErrorContext{p.file, "", "", ""},
                "a proposal file holds a [proposal] table (docs/project-file.md, \"Proposal files\")");
  p.name = s.string("name").value_or("");
  each_entry(s, "inflows", [&p](TomlSection t) {
    AddedInflow a;
    a.structure = required_id(t, "structure");
    const auto q = t.quantity("flow", Dimension::flow);
    if (!q) t.fail("flow", "is missing");
    if (!(*q > 0.0)) t.fail("flow", "must be greater than 0");
    a.flow_m3_s = *q;
    t.finish();
    p.inflows.push_back(a);
  });
  each_entry(s, "pipes", [&p](TomlSection t) {
    PipeChange c;
    c.id = required_id(t, "id");
    c.diameter_m = t.quantity("diameter", Dimension::length);
    c.width_m = t.quantity("width", Dimension::length);
    c.height_m = t.quantity("height", Dimension::length);
    c.manning_n = t.number("manning_n");
    c.invert_up_m = t.quantity("invert_up", Dimension::length);
    c.invert_down_m = t.quantity("invert_down", Dimension::length);
    if (c.width_m.has_value() != c.height_m.has_value()) t.fail("width", "a box needs both width and height");
    if (c.diameter_m && c.width_m) t.fail("diameter", "give a diameter (circular) or a width and height (box), not both");
    for (const auto& v : {c.diameter_m, c.width_m, c.height_m, c.manning_n})
      if (v && !(*v > 0.0)) t.fail("diameter", "sizes and Manning's n must be greater than 0");
    t.finish();
    p.pipes.push_back(c);
  });
  p.new_pipes = new_layer(s.table("new_pipes"), p.file);
  p.new_structures = new_layer(s.table("new_structures"), p.file);
  TomlSection tw = s.table("tailwater");
  p.tailwater_mode = tw.choice<TailwaterMode>(
      "mode", {{"fixed", TailwaterMode::fixed}, {"free", TailwaterMode::free}, {"higher", TailwaterMode::higher}});
  for (const auto& level : tw.strings("levels"))
    p.tailwater_levels_m.push_back(parse_quantity(level, Dimension::length, p.file + ": " + tw.where("levels")));
  tw.finish();
  s.finish();
  if (p.inflows.empty() && p.pipes.empty() && !p.tailwater_mode && p.tailwater_levels_m.empty() &&
      p.new_pipes.source.empty() && p.new_structures.source.empty())
    throw Error(ErrorKind::bad_config, ErrorContext{p.file, "", "", ""},
                "the proposal changes nothing: give [[proposal.inflows]], [[proposal.pipes]], [proposal.new_pipes], "
                "[proposal.new_structures] or [proposal.tailwater]");
  return p;
}

Proposal load_proposal(const std::string& path) {
  std::error_code ec;
  if (!std::filesystem::exists(path, ec))
    throw Error(ErrorKind::bad_config, ErrorContext{path, "", "", ""}, "the proposal file does not exist");
  std::ifstream in(path, std::ios::binary);
  if (!in) throw Error(ErrorKind::bad_config, ErrorContext{path, "", "", ""}, "cannot open the proposal file");
  std::ostringstream text;
  text << in.rdbuf();
  return parse_proposal(text.str(), path);
}

Project proposed_project(const Project& base, const Proposal& proposal) {
  Project p = base;
  if (proposal.tailwater_mode) p.tailwater_mode = *proposal.tailwater_mode;
  if (!proposal.tailwater_levels_m.empty()) p.tailwater_levels_m = proposal.tailwater_levels_m;
  if (!proposal.new_structures.source.empty() && base.structures.source.empty())
    throw Error(ErrorKind::bad_config, ErrorContext{proposal.file, "", "proposal.new_structures", ""},
                "the project has no [structures] layer (its structures are the pipe ends), so there is no field "
                "mapping to read new structures with; give the project a structures layer, or leave "
                "[proposal.new_structures] out and let the new pipes' ends be the new structures");
  p.proposal_pipes = proposal.new_pipes;
  p.proposal_structures = proposal.new_structures;
  p.proposal_file = proposal.file;
  return p;
}

}  // namespace rimline::config
