// End to end through the reader on real third-party data: Melbourne Water's trunk sewer
// pipelines (GeoJSON, 2,252 pipes linked by UNITID -> UNITID2, no structure layer). The
// expected figures are the ones measured independently of rimline and written down in
// ../shared/data/real/melbourne-water-sewer-mains/README.txt ("Topology" section): 2,180
// node ids, 51 nodes without an outgoing pipe, 95 with more than one.
#include <catch2/catch.hpp>

#include <filesystem>
#include <cmath>
#include <map>
#include <vector>

#include "rimline/gis/read_network.hpp"
#include "rimline/topology/build.hpp"
#include "rimline/topology/summary.hpp"
#include "test_paths.hpp"

using namespace rimline;

namespace {

const std::filesystem::path data_dir =
    std::filesystem::path(test::shared_data_dir) / "real" / "melbourne-water-sewer-mains";

config::Project melbourne_project() {
  const std::string toml = R"(
[pipes]
source = "Sewerage_Network_Main_Pipelines.geojson"
shape_from_height = true
force_main_values = ["RM", "EO-RM"]
[pipes.fields]
id = "OBJECTID"
from = "UNITID"
to = "UNITID2"
force_main = "UNITTYPE"
material = "MATERIAL"
invert_up = { field = "UPSTREAM_IL", unit = "m" }
invert_down = { field = "DOWNSTREAM_IL", unit = "m" }
length = { field = "PIPE_LENGTH", unit = "m" }
width = { field = "PIPE_WIDTH", unit = "mm" }
height = { field = "PIPE_HEIGHT", unit = "mm" }
[pipes.defaults]
manning_n = 0.013
)";
  return config::parse_project(toml, (data_dir / "melbourne.toml").string());
}

std::map<std::string, std::size_t> count_codes(const Findings& fs) {
  std::map<std::string, std::size_t> n;
  for (const Finding& f : fs) ++n[f.code];
  return n;
}

struct Joins {
  std::size_t joins = 0, meeting = 0;
};

// A pipe with a pipe downstream (its to_id is some pipe's from_id) is a join; it meets when its
// last vertex lies within 0.5 m of the first vertex of one of those pipes.
Joins count_joins(const model::Network& n) {
  std::multimap<std::string, std::size_t> by_from;
  for (std::size_t i = 0; i < n.conduits.size(); ++i) by_from.emplace(n.conduits[i].from_id, i);
  Joins j;
  for (const model::Conduit& p : n.conduits) {
    const auto [b, e] = by_from.equal_range(p.to_id);
    if (b == e) continue;
    ++j.joins;
    bool meets = false;
    for (auto it = b; it != e; ++it) {
      const model::Point2 q = n.conduits[it->second].up_point;
      meets = meets || std::hypot(p.down_point.x - q.x, p.down_point.y - q.y) <= 0.5;
    }
    j.meeting += meets;
  }
  return j;
}

}  // namespace

TEST_CASE("Melbourne trunk sewers: derived nodes, outlets and diversions match the data README", "[e2e][melbourne]") {
  if (!std::filesystem::exists(data_dir / "Sewerage_Network_Main_Pipelines.geojson")) {
    WARN("Melbourne data not found under " << data_dir.string() << "; skipped");
    return;
  }
  gis::ReadResult read = gis::read_network(melbourne_project());
  model::Network& n = read.network;
  Findings fs;
  const topology::Topology t = topology::build_topology(n, {}, fs);
  const auto s = topology::summarize(n, t);
  const auto codes = count_codes(fs);

  // Graph of all pipes as linked by id, against the README's counts.
  CHECK(s.conduits == 2252);
  CHECK(s.structures == 2180);
  CHECK(s.derived_structures == 2180);
  std::vector<std::size_t> outgoing(n.structures.size(), 0), incoming(n.structures.size(), 0);
  for (const model::Conduit& c : n.conduits) {
    REQUIRE(c.from != model::no_index);
    REQUIRE(c.to != model::no_index);
    ++outgoing[c.from];
    ++incoming[c.to];
  }
  std::size_t outlets = 0, heads = 0, splits = 0;
  for (std::size_t k = 0; k < n.structures.size(); ++k) {
    outlets += outgoing[k] == 0;
    heads += incoming[k] == 0;
    splits += outgoing[k] > 1;
  }
  CHECK(outlets == 51);
  CHECK(heads == 81);
  CHECK(splits == 95);

  // Joins as the README counts them: 2,184 pipes have a pipe downstream (by id), and for 2,102
  // the last vertex is the first vertex of the next pipe. After turning, more of them meet.
  const auto joins = count_joins(n);
  CHECK(joins.joins == 2184);
  const auto as_read = count_joins(gis::read_network(melbourne_project()).network);
  CHECK(as_read.joins == 2184);
  CHECK(as_read.meeting >= 2102);  // the README's exact coincidences; 0.5 m can only add to them
  CHECK(as_read.meeting == 2134);  // measured with this build
  CHECK(joins.meeting == 2166);    // measured with this build: 32 more joins meet after turning

  // The march graph: the reader leaves out 3 pipes (PIPE_WIDTH 0: DATA_IMPLAUSIBLE) and one
  // loop is cut. A recount over the GeoJSON with those 4 pipes removed (a Python script, not
  // rimline code) gives 50 outlets, 94 structures with more than one outflow, 4 structures
  // touched only by removed pipes, and the one directed cycle closed by pipe 311760.
  CHECK(s.usable_conduits == 2249);
  CHECK(s.loops_cut == 1);
  CHECK(s.turned_conduits == 29);  // TOPOLOGY_REVERSED_GEOMETRY; measured with this build
  REQUIRE(codes.count("TOPOLOGY_LOOP") == 1);
  for (const Finding& f : fs)
    if (f.code == "TOPOLOGY_LOOP") CHECK(f.feature_id == "311760");
  CHECK(s.marched_conduits == 2248);
  CHECK(s.outfalls == 50);
  CHECK(s.trees == 50);
  CHECK(s.diversions == 94);
  CHECK(codes.at("DIVERSION") == 94);
  CHECK(codes.at("TOPOLOGY_ISOLATED") == 4);
  // 42 pipes repeat the UNITID/UNITID2 pair of an earlier pipe (same recount).
  CHECK(codes.at("PARALLEL") == 42);
  // README: 80 gravity pipes with adverse slope; 22 of them owe it to an invert of exactly 0.0
  // or >= 900 (placeholders / sentinels, which the reader drops), leaving 58 (same recount).
  CHECK(codes.at("ADVERSE_SLOPE") == 58);
  CHECK(codes.count("TOPOLOGY") == 0);
  CHECK(codes.count("TOPOLOGY_UNCONNECTED") == 0);

  // March order: every marched conduit after its downstream structure, in the same tree.
  std::size_t placed = 0, bad = 0;
  for (const topology::Tree& tree : t.trees) {
    std::map<std::size_t, std::size_t> pos;
    for (std::size_t k = 0; k < tree.structures.size(); ++k) pos[tree.structures[k]] = k;
    std::size_t last = 0;
    for (std::size_t c : tree.conduits) {
      const auto it = pos.find(n.conduits[c].to);
      bad += it == pos.end() || it->second < last;
      if (it != pos.end()) last = it->second;
    }
    placed += tree.conduits.size();
  }
  CHECK(bad == 0);
  CHECK(placed == s.marched_conduits);
}
