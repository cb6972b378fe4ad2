// A starter project file from inspected layers: the proposed mapping written in the project
// schema (include/rimline/config/project.hpp), every guess followed by its reason as a comment.
#include <sstream>

#include "rimline/mapping/inspect.hpp"

namespace rimline::mapping {
namespace {

std::string quoted(const std::string& s) {
  std::string out = "\"";
  for (char c : s) {
    if (c == '"' || c == '\\') out += '\\';
    out += c;
  }
  return out + "\"";
}

bool dimensioned(const std::string& role) {
  for (const char* r : {"diameter", "width", "height", "ks", "invert_up", "invert_down", "length", "flow", "rim",
                        "invert", "inflow", "tailwater"})
    if (role == r) return true;
  return false;
}

void write_fields(std::ostream& out, const MappingProposal& m) {
  for (const auto& f : m.fields) {
    out << f.role << " = ";
    if (dimensioned(f.role) && f.unit)
      out << "{ field = " << quoted(f.field) << ", unit = " << quoted(std::string(units::unit_symbol(*f.unit))) << " }";
    else
      out << quoted(f.field);
    out << "  # " << f.reason << "\n";
  }
}

void write_layer_head(std::ostream& out, const char* table, const StarterLayer& l) {
  out << "[" << table << "]\n";
  out << "source = " << quoted(l.source) << "\n";
  out << "layer = " << quoted(l.layer->name) << "\n";
}

std::string crs_line(const LayerSummary& l) {
  if (l.crs_name.empty()) return "crs = \"EPSG:\"  # the layer has no CRS: complete with its EPSG code\n";
  return "# crs = \"EPSG:....\"  # only for a source without a CRS; this one is " + l.crs_name +
         (l.crs_id.empty() ? "" : " (" + l.crs_id + ")") + "\n";
}

}  // namespace

std::string starter_project_toml(const StarterLayer& pipes, const StarterLayer& structures) {
  std::ostringstream out;
  out << "# Starter project written by `rimline fields` from the fields it found.\n"
         "# Every mapping below is a guess from names and value ranges: check each line.\n\n";
  out << "[project]\n";
  out << "name = " << quoted(pipes.layer ? pipes.layer->name : "network") << "\n";
  if (pipes.layer) out << crs_line(*pipes.layer);
  if (pipes.layer) {
    const MappingProposal m = propose_mapping(*pipes.layer);
    out << "\n";
    write_layer_head(out, "pipes", pipes);
    out << "snap_tolerance = \"0.5 m\"  # pipe ends this close are joined; common practice, no source\n";
    if (m.shape_from_height)
      out << "shape_from_height = true  # no shape field; the height is 0 for some pipes: 0 = circular, > 0 = box\n";
    out << "\n[pipes.fields]\n";
    write_fields(out, m);
    out << "\n[pipes.defaults]\n";
    if (!m.find("manning_n"))
      out << "manning_n = 0.013  # no Manning n field found; common practice for concrete, no source: review\n";
    if (!m.find("diameter") && !(m.shape_from_height && m.find("width")))
      out << "# diameter = \"300 mm\"  # no diameter field found: set one, or map pipes.fields.diameter\n";
    if (m.find("material"))
      out << "# [pipes.defaults.manning_n_by_material]  # n by the values of the material field, e.g.\n"
             "# RC = 0.013\n";
    if (m.find("shape"))
      out << "\n[pipes.shapes]  # which values of the shape field mean which section\n"
             "circular = []\nbox = []\n";
  }
  if (structures.layer) {
    const MappingProposal m = propose_mapping(*structures.layer);
    out << "\n";
    write_layer_head(out, "structures", structures);
    out << "\n[structures.fields]\n";
    write_fields(out, m);
    if (m.find("type"))
      out << "\n[structures.types]  # which values of the type field mean which kind\n"
             "manhole = []\ninlet = []\njunction = []\noutfall = []\n";
    out << "\n[structures.defaults]\ndiameter = \"1.2 m\"  # access-hole diameter where none is given; common "
           "practice, no source\n";
  }
  out << "\n[criteria]\nfreeboard = \"0.3 m\"  # common practice, no source: set your agency's value\n";
  return out.str();
}

}  // namespace rimline::mapping
