// The inference on exports named in other languages and styles (invented data: the values only need
// to be consistent, as a real export's are). German names, a separate node layer whose integer ids the
// pipes refer to, no unit in any name, one line digitised against the flow.
#include <catch2/catch.hpp>

#include <algorithm>

#include "unit/gis/layer_fixture.hpp"
#include "rimline/config/project.hpp"
#include "rimline/mapping/inspect.hpp"
#include "rimline/run/check_run.hpp"

using namespace rimline;
using rimline::test::FieldSpec;

namespace {

std::string role(const mapping::MappingProposal& m, const char* r) {
  const auto* f = m.find(r);
  if (!f) return "<none>";
  return f->field + (f->unit ? ":" + std::string(units::unit_symbol(*f->unit)) : "");
}

std::string num(double v) {
  char b[32];
  std::snprintf(b, sizeof b, "%.3f", v);
  return b;
}

}  // namespace

TEST_CASE("a German export with a separate node layer: every role from the data", "[mapping][infer]") {
  const auto dir = test::fresh_dir("infer_german");
  // Schaechte 101..107 eastwards, 50 m apart, sumps falling 0.5 m each; 107 is the outfall (Auslauf).
  std::vector<test::Row> nodes, pipes;
  for (int i = 0; i < 7; ++i) {
    const double x = 500000.0 + 50.0 * i, sump = 110.0 - 0.5 * i;
    nodes.push_back({"POINT (" + num(x) + " 5500000)",
                     {std::to_string(i + 1), std::to_string(101 + i), num(sump + 2.5 + 0.1 * (i % 3)), num(sump),
                      i == 6 ? "Auslauf" : "Schacht"}});
  }
  for (int i = 0; i < 6; ++i) {
    const double x0 = 500000.0 + 50.0 * i, x1 = x0 + 50.0;
    const double up = 110.0 - 0.5 * i, down = 110.0 - 0.5 * (i + 1) + 0.02;
    // H4 is digitised against the flow (east to west); its ids still name the upstream manhole first.
    const std::string wkt = i == 3 ? "LINESTRING (" + num(x1) + " 5500000," + num(x0) + " 5500000)"
                                   : "LINESTRING (" + num(x0) + " 5500000," + num(x1) + " 5500000)";
    pipes.push_back({wkt,
                     {"H" + std::to_string(i + 1), std::to_string(101 + i), std::to_string(102 + i), num(up), num(down),
                      i < 3 ? "300" : "400", "KREIS", i % 2 ? "STZ" : "B", "50.00"}});
  }
  test::write_layer(dir / "haltungen.gpkg", "GPKG", "haltungen", 25832, wkbLineString,
                    {{"HALTUNG", OFTString},
                     {"SCHACHT_OBEN", OFTInteger},
                     {"SCHACHT_UNTEN", OFTInteger},
                     {"SOHLE_OBEN", OFTReal},
                     {"SOHLE_UNTEN", OFTReal},
                     {"DN", OFTInteger},
                     {"PROFIL", OFTString},
                     {"WERKSTOFF", OFTString},
                     {"LAENGE", OFTReal}},
                    pipes);
  test::write_layer(dir / "schaechte.gpkg", "GPKG", "schaechte", 25832, wkbPoint,
                    {{"OBJEKT", OFTInteger},
                     {"SCHACHTNR", OFTInteger},
                     {"DECKELHOEHE", OFTReal},
                     {"SOHLHOEHE", OFTReal},
                     {"ART", OFTString}},
                    nodes);
  const auto p = mapping::inspect_source((dir / "haltungen.gpkg").string());
  const auto s = mapping::inspect_source((dir / "schaechte.gpkg").string());
  const auto m = mapping::propose_network(&p.layers[0], &s.layers[0]);
  std::string all;
  for (const auto* x : {&m.pipes, &m.structures})
    for (const auto& f : x->fields) all += f.role + " = " + f.field + " (" + f.reason + ")\n";
  INFO(all);
  CHECK(role(m.pipes, "id") == "HALTUNG");
  CHECK(role(m.pipes, "from") == "SCHACHT_OBEN");  // 5 of 6 lines start at the manhole it names
  CHECK(role(m.pipes, "to") == "SCHACHT_UNTEN");
  CHECK(role(m.pipes, "invert_up") == "SOHLE_OBEN:m");
  CHECK(role(m.pipes, "invert_down") == "SOHLE_UNTEN:m");
  CHECK(role(m.pipes, "diameter") == "DN:mm");
  CHECK(role(m.pipes, "material") == "WERKSTOFF");
  CHECK(role(m.pipes, "length") == "LAENGE:m");
  CHECK(role(m.pipes, "shape") == "PROFIL");
  REQUIRE(m.pipes.shape_values.size() == 1);
  CHECK(m.pipes.shape_values[0].meaning == "circular");
  CHECK(role(m.structures, "id") == "SCHACHTNR");  // the pipes refer to it, not to the row number OBJEKT
  CHECK(role(m.structures, "rim") == "DECKELHOEHE:m");
  CHECK(role(m.structures, "invert") == "SOHLHOEHE:m");
  CHECK(role(m.structures, "type") == "ART");
  for (const auto& v : m.structures.type_values)
    CHECK(v.meaning == (v.value == "Auslauf" ? "outfall" : "manhole"));

  // The starter runs as written (its placeholder flow is an invented load: it only has to run).
  const std::string toml = mapping::starter_project_toml({"haltungen.gpkg", &p.layers[0]}, {"schaechte.gpkg", &s.layers[0]});
  INFO(toml);
  const auto r = run::run_check(config::parse_project(toml, (dir / "project.toml").string()), {});
  CHECK_FALSE(run::checked_nothing(r));
  for (const auto& f : r.findings) {
    CHECK(f.code != "UNIT_SUSPECT");
    CHECK(f.code != "OUTFALL_ASSUMED");  // Auslauf is typed an outfall
  }
  for (const auto& c : r.cases[0].march.conduits) CHECK(c.solved);
}
