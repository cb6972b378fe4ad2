// `rimline fields SOURCE`: what a GIS source holds, and a proposed project file.
#include <filesystem>
#include <fstream>
#include <iomanip>
#include <iostream>

#include "cli/commands.hpp"
#include "rimline/error.hpp"
#include "rimline/signal_cleanup.hpp"
#include "rimline/mapping/inspect.hpp"

namespace rimline::cli {
namespace {

struct FieldsArgs {
  std::string source;
  std::string structures;
  std::string write_project;
};

void print_layer(const mapping::LayerSummary& l, std::ostream& os) {
  os << "layer " << l.name << ": " << l.feature_count << " features, " << l.declared_geometry;
  for (const auto& [type, n] : l.geometry_counts) os << " [" << type << " " << n << "]";
  os << "\n  crs: " << (l.crs_name.empty() ? "(none)" : l.crs_name) << (l.crs_id.empty() ? "" : " (" + l.crs_id + ")")
     << (l.crs_geographic ? ", geographic: lengths need a reprojection (rimline does it)" : "")
     << (l.crs_linear_unit.empty() ? "" : ", unit " + l.crs_linear_unit) << "\n";
  for (const auto& f : l.fields) {
    os << "  " << std::left << std::setw(24) << f.name << std::setw(10) << f.type << " nulls " << std::setw(6)
       << f.null_count;
    if (f.numeric()) os << " min " << *f.min << " max " << *f.max;
    if (!f.samples.empty()) {
      os << "  e.g.";
      for (const auto& s : f.samples) os << " '" << s << "'";
    }
    os << "\n";
  }
}

void print_proposal(const char* what, const mapping::MappingProposal& m, std::ostream& os) {
  if (m.fields.empty()) return;
  os << "proposed mapping (" << what << "), inferred from the data, names second:\n";
  for (const auto& p : m.fields)
    os << "  " << std::left << std::setw(22) << p.role << " = " << p.field
       << (p.unit ? " [" + std::string(units::unit_symbol(*p.unit)) + "]" : "") << "  (" << mapping::confidence_word(p.confidence)
       << ": " << p.reason << ")\n";
  auto values = [&os](const char* title, const std::vector<mapping::CodeValue>& vs) {
    if (vs.empty()) return;
    os << "  " << title << ":";
    for (const auto& v : vs) os << " '" << v.value << "'" << (v.meaning.empty() ? "" : "=" + v.meaning);
    os << "\n";
  };
  values("shape values", m.shape_values);
  values("type values", m.type_values);
  values("pressure-main values", m.force_main_values);
  for (const auto& n : m.notes) os << "  note: " << n << "\n";
}

const mapping::LayerSummary* first_of(const mapping::SourceSummary& s, bool lines) {
  for (const auto& l : s.layers)
    if (lines ? l.lines() : l.points()) return &l;
  return nullptr;
}

int run_fields(const FieldsArgs& a, const GlobalOptions& g) {
  const auto pipes = mapping::inspect_source(a.source);
  std::optional<mapping::SourceSummary> structures;
  if (!a.structures.empty()) structures = mapping::inspect_source(a.structures);
  const mapping::LayerSummary* pipe_layer = first_of(pipes, true);
  const mapping::LayerSummary* structure_layer =
      structures ? first_of(*structures, false) : first_of(pipes, false);
  if (!g.quiet) {
    std::cout << pipes.source << " (" << pipes.driver << ")\n";
    for (const auto& l : pipes.layers) print_layer(l, std::cout);
    if (structures) {
      std::cout << structures->source << " (" << structures->driver << ")\n";
      for (const auto& l : structures->layers) print_layer(l, std::cout);
    }
    const auto proposal = mapping::propose_network(pipe_layer, structure_layer);
    print_proposal("pipes", proposal.pipes, std::cout);
    print_proposal("structures", proposal.structures, std::cout);
  }
  if (a.write_project.empty()) return exit_ok;
  namespace fs = std::filesystem;
  const fs::path project_dir = fs::absolute(a.write_project).parent_path();
  auto relative = [&](const std::string& src) {
    std::error_code ec;
    const auto rel = fs::relative(fs::absolute(src), project_dir, ec);
    return ec || rel.empty() ? src : rel.string();
  };
  mapping::StarterLayer sp{relative(a.source), pipe_layer};
  mapping::StarterLayer ss;
  if (structure_layer) ss = {relative(structures ? a.structures : a.source), structure_layer};
  if (!sp.layer) throw Error(ErrorKind::bad_input, ErrorContext{a.source, "", "", ""}, "holds no line layer for pipes");
  if (fs::exists(a.write_project))
    throw Error(ErrorKind::bad_config, ErrorContext{a.write_project, "", "", ""},
                "exists already; rimline does not overwrite a project file");
  const std::string text = mapping::starter_project_toml(sp, ss);
  const std::string tmp = a.write_project + ".partial";
  register_for_cleanup(tmp);  // SIGINT / SIGTERM
  {
    std::ofstream out(tmp, std::ios::binary);
    out << text;
    out.flush();
    if (!out) {
      std::error_code ec;
      fs::remove(tmp, ec);
      release_from_cleanup(tmp);
      throw Error(ErrorKind::bad_config, ErrorContext{a.write_project, "", "", ""}, "cannot be written");
    }
  }
  fs::rename(tmp, a.write_project);
  release_from_cleanup(tmp);
  if (!g.quiet) std::cout << "wrote " << a.write_project << ": review every mapping and unit before a run\n";
  return exit_ok;
}

}  // namespace

std::function<int()> setup_fields(CLI::App& app, const GlobalOptions& global) {
  auto a = std::make_shared<FieldsArgs>();
  app.add_option("source", a->source, "GIS source: a file (GPKG, SHP, GeoJSON, GDB, CSV) or a connection string")
      ->required();
  app.add_option("--structures", a->structures, "A second source holding the structure points");
  app.add_option("--write-project", a->write_project, "Write a starter project file (TOML) to edit");
  app.footer("Every role is inferred from the data first and the field names second; the starter project says\n"
             "what each line was inferred from. Reference of every project key: docs/project-file.md\n\nExample:\n  rimline fields data/demo/metric/pipes.geojson --structures data/demo/metric/structures.geojson\n"
             "  rimline fields export.gpkg --write-project project.toml");
  return [a, &global] { return run_fields(*a, global); };
}

}  // namespace rimline::cli
