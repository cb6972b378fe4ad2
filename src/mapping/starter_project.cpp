// A starter project file from the inferred mapping (include/rimline/mapping/inspect.hpp): every
// role with its evidence as a comment, the code values seen, a flow source, a tailwater and criteria.
// What the data could not tell is marked "EDIT". The result parses with parse_project as written.
#include <algorithm>
#include <sstream>

#include "rimline/mapping/inspect.hpp"

namespace rimline::mapping {
namespace {

std::string quoted(const std::string& s) {
  std::string out = "\"";
  for (char c : s) {
    if (c == '"' || c == '\\') out += '\\';
    if (c == '\n' || c == '\r') continue;
    out += c;
  }
  return out + "\"";
}

// A comment on one line: no line breaks inside.
std::string comment(std::string s) {
  std::replace(s.begin(), s.end(), '\n', ' ');
  return "  # " + s;
}

bool dimensioned(const std::string& role) {
  for (const char* r : {"diameter", "width", "height", "ks", "invert_up", "invert_down", "invert_up_fallback",
                        "invert_down_fallback", "length", "flow", "rim", "invert", "inflow", "tailwater"})
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
    out << comment("[" + confidence_word(f.confidence) + "] " + f.reason) << "\n";
  }
}

void write_layer_head(std::ostream& out, const char* table, const StarterLayer& l) {
  out << "[" << table << "]\n";
  out << "source = " << quoted(l.source) << "\n";
  out << "layer = " << quoted(l.layer->name) << "\n";
}

std::string crs_line(const LayerSummary& l) {
  if (l.crs_name.empty()) return "crs = \"EPSG:4326\"  # EDIT: the layer has no CRS; give its EPSG code\n";
  return "# crs = \"EPSG:....\"  # only for a source without a CRS; this one is " + l.crs_name +
         (l.crs_id.empty() ? "" : " (" + l.crs_id + ")") + "\n";
}

// A multi-line TOML array of code values, each with what it was taken for.
void write_values(std::ostream& out, const std::string& key, const std::vector<const CodeValue*>& values) {
  out << key << " = [\n";
  for (const auto* v : values)
    out << "  " << quoted(v->value) << ","
        << comment(std::to_string(v->count) + " feature(s)" + (v->why.empty() ? "" : "; " + v->why)) << "\n";
  out << "]\n";
}

bool us_units(const NetworkProposal& p) {
  for (const auto* m : {&p.pipes, &p.structures})
    for (const auto& f : m->fields)
      if (f.unit && (*f.unit == units::Unit::ft || *f.unit == units::Unit::us_ft || *f.unit == units::Unit::in))
        return true;
  return false;
}

}  // namespace

std::string starter_project_toml(const StarterLayer& pipes, const StarterLayer& structures) {
  const NetworkProposal p = propose_network(pipes.layer, structures.layer);
  const MappingProposal& pm = p.pipes;
  const MappingProposal& sm = p.structures;
  const bool us = us_units(p);
  std::ostringstream out;
  out << "# Starter project written by `rimline fields`. Each role below was inferred from the data first\n"
         "# (values shared between fields, levels that agree where pipes meet, magnitudes, ratios to the\n"
         "# geometry) and from the field names second; the comment on each line says from what, with a\n"
         "# confidence. Review every line: lines marked EDIT hold nothing the data could tell.\n"
         "# Reference of every key: docs/project-file.md. Results are for review by a licensed engineer;\n"
         "# local codes and the approving authority govern.\n\n";
  out << "[project]\n";
  out << "name = " << quoted(pipes.layer ? pipes.layer->name : "network") << "\n";
  out << "units = " << quoted(us ? "us" : "si") << comment(us ? "levels or sizes are in feet / inches" : "metric data") << "\n";
  if (pipes.layer) out << crs_line(*pipes.layer);
  if (pipes.layer) {
    out << "\n";
    write_layer_head(out, "pipes", pipes);
    out << "snap_tolerance = " << quoted(us ? "1.5 ft" : "0.5 m")
        << comment("pipe ends this close to a structure join it; common practice, no source") << "\n";
    if (pm.shape_from_height)
      out << "shape_from_height = true"
          << comment("no shape field; the height is 0 or empty for some pipes: those are circular, the others boxes")
          << "\n";
    if (!pm.force_main_values.empty()) {
      out << "force_main_values = [";
      for (std::size_t i = 0; i < pm.force_main_values.size(); ++i)
        out << (i ? ", " : "") << quoted(pm.force_main_values[i].value);
      std::string why;
      for (const auto& v : pm.force_main_values) why += (why.empty() ? "" : "; ") + v.value + ": " + v.why;
      out << "]" << comment(why) << "\n";
    }
    if (pm.direction_from_inverts)
      out << "flow_direction = \"inverts\"" << comment("many pipes rise along from/to: see the note below") << "\n";
    for (const auto& n : pm.notes) out << "# note: " << n << "\n";
    out << "\n[pipes.fields]\n";
    write_fields(out, pm);
    out << "\n[pipes.defaults]\n";
    if (!pm.find("manning_n"))
      out << "manning_n = 0.013" << comment("no Manning n field: 0.013 (concrete) for every pipe; common practice, no "
                                            "source: review, or give n by material below")
          << "\n";
    const bool sized = pm.find("diameter") || (pm.shape_from_height && pm.find("width"));
    if (!sized) out << "diameter = " << quoted(us ? "12 in" : "300 mm") << comment("EDIT: no size field found") << "\n";
    if (!pm.material_values.empty()) {
      out << "\n# Manning n by material: the values of " << pm.find("material")->field
          << " seen, most frequent first (a table\n# [pipes.defaults.manning_n_by_material] with a row per value, e.g. RC = 0.013, gives each its n):\n#";
      for (std::size_t i = 0; i < pm.material_values.size() && i < 60; ++i) {
        out << " " << pm.material_values[i] << (i + 1 < pm.material_values.size() ? "," : "");
        if (i % 12 == 11) out << "\n#";
      }
      out << "\n";
    }
    if (pm.find("shape")) {
      const bool box_ok = pm.find("width") && pm.find("height");
      std::vector<const CodeValue*> circ, box, egg, other;
      for (const auto& v : pm.shape_values)
        (v.meaning == "circular"        ? circ
         : v.meaning == "box" && box_ok ? box
         : v.meaning == "egg" && box_ok ? egg  // an egg, like a box, is read from its width and height
                                        : other)
            .push_back(&v);
      out << "\n[pipes.shapes]" << comment("values of " + pm.find("shape")->field + " seen, by the section they name") << "\n";
      write_values(out, "circular", circ);
      write_values(out, "box", box);
      if (!egg.empty()) write_values(out, "egg", egg);
      for (const auto* v : other)
        out << "# " << quoted(v->value) << comment("not recognised" + std::string(box_ok ? "" : " (or a box or an egg: no width/height mapped)") +
                                                   "; such pipes take pipes.defaults.shape")
            << "\n";
    }
  }
  if (structures.layer) {
    out << "\n";
    write_layer_head(out, "structures", structures);
    out << "\n[structures.fields]\n";
    write_fields(out, sm);
    if (sm.find("type")) {
      out << "\n[structures.types]" << comment("values of " + sm.find("type")->field + " seen, by the kind they name") << "\n";
      for (const char* kind : {"manhole", "inlet", "junction", "outfall", "pump_station"}) {
        std::vector<const CodeValue*> vs;
        for (const auto& v : sm.type_values)
          if (v.meaning == kind || (std::string(kind) == "manhole" && v.meaning.empty())) vs.push_back(&v);
        if (vs.empty()) continue;
        out << kind << " = [\n";
        for (const auto* v : vs)
          out << "  " << quoted(v->value) << ","
              << comment(std::to_string(v->count) + " feature(s); " +
                         (v->meaning.empty() ? "EDIT: not recognised, taken as a manhole" : v->why))
              << "\n";
        out << "]\n";
      }
    }
    out << "\n[structures.defaults]\ndiameter = " << quoted(us ? "4 ft" : "1.2 m")
        << comment("access-hole diameter where none is given; common practice, no source") << "\n";
  }
  // Outfalls: typed ones need nothing; otherwise name them (the network ends found are listed).
  bool typed_outfall = false;
  for (const auto& v : sm.type_values) typed_outfall = typed_outfall || v.meaning == "outfall";
  const auto& ends = structures.layer ? sm.network_ends : pm.network_ends;
  if (!typed_outfall) {
    out << "\n# Outfalls: nothing in the data types them, so every structure no pipe leaves is taken as one\n"
           "# (OUTFALL_ASSUMED, counted in the summary). Name the real ones, each with its own tailwater:\n"
           "# [outfalls]\n# ids = [";
    for (std::size_t i = 0; i < ends.size() && i < 20; ++i) out << (i ? ", " : "") << quoted(ends[i]);
    out << "]" << comment(std::to_string(ends.size()) + " network end(s) found" + (ends.size() > 20 ? ", the first 20" : ""))
        << "\n# [outfalls.tailwater]\n# \"ID\" = \"2.5 m\"\n";
  }
  bool has_rim = sm.find("rim") != nullptr;
  if (!has_rim)
    out << "\n# No rims in the data: a ground raster (any GDAL raster, its unit stated) gives the structures\n"
           "# rims from the ground level, so that freeboard can be checked:\n"
           "# [ground]\n# source = \"dem.tif\"\n# unit = \"m\"\n# offset = \"0 m\"\n";
  out << "\n[flows]\n";
  if (const auto* f = pm.find("flow")) {
    out << "mode = \"pipe_field\"" << comment("design flows per pipe in " + f->field) << "\n";
  } else if (const auto* i = sm.find("inflow")) {
    out << "mode = \"structure_inflows\"" << comment("local inflows in " + i->field + ", accumulated downstream") << "\n";
  } else {
    out << "mode = \"structure_inflows\"" << comment("EDIT: the data holds no flows") << "\n"
        << "default_inflow = " << quoted(us ? "0.035 cfs" : "1 L/s")
        << comment("EDIT: a uniform placeholder load at every structure, not a design flow; give pipe flows, "
                   "structure inflows, or catchments (mode rational / sanitary)")
        << "\n";
  }
  out << "\n[tailwater]\nmode = \"free\""
      << comment("EDIT: no tailwater in the data, so every outfall discharges freely; set mode = \"higher\" and "
                 "levels = [\"...\"] for a receiving water level")
      << "\n";
  out << "\n[criteria]" << comment("common practice, no source: set your agency's values") << "\n";
  if (us)
    out << "freeboard = \"1 ft\"\nvelocity_min = \"2 ft/s\"\nvelocity_max = \"15 ft/s\"\ncapacity_ratio_max = 1.0\n";
  else
    out << "freeboard = \"0.3 m\"\nvelocity_min = \"0.6 m/s\"\nvelocity_max = \"4.6 m/s\"\ncapacity_ratio_max = 1.0\n";
  return out.str();
}

}  // namespace rimline::mapping
