#pragma once
// A small valid network written as GeoJSON + TOML by each bad-input test, then broken in one
// place. Every value here is invented for the test; none is a check value.
//
//   M3 --P3--> M2 --P2--> M1 --P1--> OF      (x falls 50 m per pipe, y = 5385200)
//                          ^
//              M4 --P4-----+                  (M4 50 m north of M1)
#include <catch2/catch.hpp>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

#include "rimline/error.hpp"
#include "rimline/config/project.hpp"
#include "rimline/run/check_run.hpp"
#include "test_paths.hpp"

namespace rimline::badinput {

namespace fs = std::filesystem;

inline std::string num(double v) {
  std::ostringstream s;
  s.precision(10);
  s << v;
  return s.str();
}

// A pipe feature; `props` are extra "KEY": value pairs appended verbatim (", " separated).
inline std::string pipe(const std::string& id, double x1, double y1, double x2, double y2, double size_mm,
                        double inv_up, double inv_dn, const std::string& props = "") {
  return R"({"type":"Feature","properties":{"PIPE_ID":")" + id + R"(","SIZE":)" + num(size_mm) + R"(,"US_INV":)" +
         num(inv_up) + R"(,"DS_INV":)" + num(inv_dn) + (props.empty() ? "" : "," + props) +
         R"(},"geometry":{"type":"LineString","coordinates":[[)" + num(x1) + "," + num(y1) + "],[" + num(x2) + "," +
         num(y2) + "]]}}";
}

// A feature with raw properties and raw geometry JSON (for null / multi-part / wrong geometry).
inline std::string feature(const std::string& props, const std::string& geometry) {
  return R"({"type":"Feature","properties":{)" + props + R"(},"geometry":)" + geometry + "}";
}

inline std::string structure(const std::string& id, const std::string& type, double x, double y, double rim,
                             double sump, double q_l_s = 20.0) {
  return R"({"type":"Feature","properties":{"NODE_ID":")" + id + R"(","NODE_TYPE":")" + type + R"(","RIM":)" +
         num(rim) + R"(,"SUMP":)" + num(sump) + R"(,"Q_LOCAL":)" + num(q_l_s) +
         R"(},"geometry":{"type":"Point","coordinates":[)" + num(x) + "," + num(y) + "]}}";
}

constexpr double ox = 452300.0, oy = 5385200.0;

inline std::vector<std::string> base_pipes() {
  return {pipe("P1", ox - 50, oy, ox, oy, 450, 2.25, 2.0), pipe("P2", ox - 100, oy, ox - 50, oy, 375, 2.5, 2.25),
          pipe("P3", ox - 150, oy, ox - 100, oy, 300, 2.75, 2.5),
          pipe("P4", ox - 50, oy + 50, ox - 50, oy, 300, 2.5, 2.25)};
}

inline std::vector<std::string> base_structures() {
  return {structure("OF", "OUTFALL", ox, oy, 4.0, 2.0, 0.0), structure("M1", "MH", ox - 50, oy, 5.0, 2.25),
          structure("M2", "MH", ox - 100, oy, 5.2, 2.5), structure("M3", "MH", ox - 150, oy, 5.4, 2.75),
          structure("M4", "MH", ox - 50, oy + 50, 5.2, 2.5)};
}

// crs_block: the GeoJSON "crs" member ("" leaves it out: WGS 84 by RFC 7946).
inline std::string collection(
    const std::vector<std::string>& features,
    const std::string& crs = R"("crs":{"type":"name","properties":{"name":"urn:ogc:def:crs:EPSG::32631"}},)") {
  std::string s = R"({"type":"FeatureCollection",)" + crs + R"("features":[)";
  for (std::size_t i = 0; i < features.size(); ++i) s += (i ? ",\n" : "\n") + features[i];
  return s + "\n]}\n";
}

inline std::string base_project() {
  return R"([project]
name = "bad-input fixture"
units = "si"

[pipes]
source = "pipes.geojson"
snap_tolerance = "0.5 m"

[pipes.fields]
id = "PIPE_ID"
diameter = { field = "SIZE", unit = "mm" }
invert_up = { field = "US_INV", unit = "m" }
invert_down = { field = "DS_INV", unit = "m" }

[pipes.defaults]
manning_n = 0.013

[structures]
source = "structures.geojson"

[structures.fields]
id = "NODE_ID"
type = "NODE_TYPE"
rim = { field = "RIM", unit = "m" }
invert = { field = "SUMP", unit = "m" }
inflow = { field = "Q_LOCAL", unit = "L/s" }

[structures.types]
outfall = ["OUTFALL"]
manhole = ["MH"]

[flows]
mode = "structure_inflows"

[tailwater]
mode = "higher"
levels = ["2.2 m"]
)";
}

// Replaces the first occurrence of `from` in `text` (the test fails if there is none).
inline std::string replace(std::string text, const std::string& from, const std::string& to) {
  const auto at = text.find(from);
  REQUIRE(at != std::string::npos);
  return text.replace(at, from.size(), to);
}

// One case's directory under the build tree, emptied, with its files.
struct Case {
  fs::path dir;
  explicit Case(const std::string& name) : dir(fs::path(test::binary_dir) / "badinput" / name) {
    fs::remove_all(dir);
    fs::create_directories(dir);
  }
  std::string path(const std::string& file) const { return (dir / file).string(); }
  void write(const std::string& file, const std::string& text) const {
    std::ofstream(dir / file, std::ios::binary) << text;
  }
  // Writes the base network with the given replacements of its pieces.
  void write_network(const std::vector<std::string>& pipes, const std::vector<std::string>& structures,
                     const std::string& project = base_project()) const {
    write("pipes.geojson", collection(pipes));
    write("structures.geojson", collection(structures));
    write("project.toml", project);
  }
  config::Project project() const { return config::load_project(path("project.toml")); }
  run::CheckRun run() const { return run::run_check(project(), {}); }
};

inline std::string dump(const run::CheckRun& r) {
  std::string s;
  for (const auto& f : r.findings)
    s += f.code + " | " + std::string(layer_role_name(f.layer)) + " | " + f.feature_id + " | " + f.field + " | " +
         render_message(f.message, units::System::si) + "\n";
  return s;
}

inline const Finding* find(const run::CheckRun& r, const std::string& code, const std::string& id,
                           const std::string& field = "*") {
  for (const auto& f : r.findings)
    if (f.code == code && f.feature_id == id && (field == "*" || f.field == field)) return &f;
  return nullptr;
}

inline std::string message(const Finding* f) { return f ? render_message(f->message, units::System::si) : "<none>"; }

inline std::size_t structure_index(const run::CheckRun& r, const std::string& id) {
  const auto& s = r.read.network.structures;
  for (std::size_t i = 0; i < s.size(); ++i)
    if (s[i].id == id) return i;
  FAIL("no structure " << id);
  return 0;
}

inline std::size_t conduit_index(const run::CheckRun& r, const std::string& id) {
  const auto& c = r.read.network.conduits;
  for (std::size_t i = 0; i < c.size(); ++i)
    if (c[i].id == id) return i;
  FAIL("no conduit " << id);
  return 0;
}

// The rest of the network was still checked: each named structure has a solved, finite HGL.
inline void check_solved(const run::CheckRun& r, const std::vector<std::string>& ids) {
  REQUIRE(!r.cases.empty());
  for (const auto& id : ids) {
    const auto& s = r.cases.back().march.structures[structure_index(r, id)];
    INFO("structure " << id);
    CHECK(s.solved);
    CHECK(std::isfinite(s.hgl_m));
  }
}

// The error a whole run stops with (empty if none).
template <class F>
std::string error_of(F&& f) {
  try {
    f();
  } catch (const Error& e) {
    return e.what();
  }
  return "";
}

}  // namespace rimline::badinput
