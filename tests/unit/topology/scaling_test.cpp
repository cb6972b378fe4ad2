// Scaling sanity: a synthetic comb of 100 rows x 1000 pipes (10^5 pipes) draining through a
// collector to one outfall, half the rows digitised against the flow. Run time is not
// asserted (it depends on the machine); the counts and the march order must be exact, which
// would not survive a wrong snap, a missed turn or a quadratic fallback that gives up.
#include <catch2/catch.hpp>

#include <string>

#include "rimline/topology/build.hpp"
#include "rimline/topology/plan_geometry.hpp"
#include "rimline/topology/summary.hpp"

using namespace rimline;
using model::Point2;

namespace {

constexpr int rows = 100, per_row = 1000;
constexpr double spacing = 10.0, row_gap = 20.0;
const double outlet_x = per_row * spacing;

// Invert that falls 1 cm per metre of flow path to the outfall (invented geometry).
double invert_at(double path_to_outfall_m) { return 10.0 + 0.01 * path_to_outfall_m; }

std::string node_id(int r, int i) { return "N" + std::to_string(r) + "_" + std::to_string(i); }

model::Network comb(bool with_ids) {
  model::Network n;
  n.conduits.reserve(rows * per_row + rows);
  auto add = [&](Point2 up, Point2 down, double path_up, double path_down, bool digitise_reversed, std::string from,
                 std::string to) {
    model::Conduit c;
    c.id = "P" + std::to_string(n.conduits.size());
    c.section.diameter_m = 0.3;
    if (with_ids) {
      c.from_id = std::move(from);
      c.to_id = std::move(to);
    }
    double inv_first = invert_at(path_up), inv_last = invert_at(path_down);
    if (digitise_reversed) {
      std::swap(up, down);
      if (!with_ids) std::swap(inv_first, inv_last);  // inverts belong to the line's ends
    }
    c.invert_up_m = inv_first;
    c.invert_down_m = inv_last;
    topology::set_plan_geometry(c, {up, down});
    n.conduits.push_back(std::move(c));
  };
  for (int r = 0; r < rows; ++r) {
    const double y = r * row_gap, collector_path = r * row_gap + spacing;
    for (int i = 0; i < per_row; ++i) {
      const double x0 = i * spacing, x1 = (i + 1) * spacing;
      add({x0, y}, {x1, y}, collector_path + outlet_x - x0, collector_path + outlet_x - x1, r % 2 == 1, node_id(r, i),
          node_id(r, i + 1));
    }
  }
  for (int r = rows - 1; r >= 1; --r)
    add({outlet_x, r * row_gap}, {outlet_x, (r - 1) * row_gap}, r * row_gap + spacing, (r - 1) * row_gap + spacing, false,
        node_id(r, per_row), node_id(r - 1, per_row));
  add({outlet_x, 0.0}, {outlet_x + spacing, 0.0}, spacing, 0.0, false, node_id(0, per_row), "OUT");
  return n;
}

void check_comb(const model::Network& n, const topology::Topology& t, const Findings& fs, std::size_t derived) {
  const std::size_t pipes = rows * per_row + rows;
  REQUIRE(n.conduits.size() == pipes);
  CHECK(t.derived_structures == derived);
  CHECK(n.structures.size() == static_cast<std::size_t>(rows * (per_row + 1) + 1));
  CHECK(t.turned_conduits == static_cast<std::size_t>(rows / 2 * per_row));
  REQUIRE(t.trees.size() == 1);
  CHECK(t.trees[0].conduits.size() == pipes);
  CHECK(t.trees[0].structures.size() == n.structures.size());
  std::size_t info = 0;
  for (const Finding& f : fs) info += f.severity == Severity::info;
  CHECK(info == fs.size());  // only the turns are reported
  CHECK(fs.size() == t.turned_conduits);
  // Every conduit after its downstream structure and after the conduits it drains into.
  std::vector<std::size_t> s_pos(n.structures.size(), model::no_index), c_pos(n.conduits.size(), model::no_index);
  for (std::size_t k = 0; k < t.trees[0].structures.size(); ++k) s_pos[t.trees[0].structures[k]] = k;
  for (std::size_t k = 0; k < t.trees[0].conduits.size(); ++k) c_pos[t.trees[0].conduits[k]] = k;
  std::size_t bad = 0;
  for (std::size_t c = 0; c < n.conduits.size(); ++c) {
    const model::Conduit& p = n.conduits[c];
    bad += !(s_pos[p.to] < s_pos[p.from]);
    bad += !(*p.invert_up_m > *p.invert_down_m);
    for (std::size_t out : t.nodes[p.to].outflows) bad += !(c_pos[out] < c_pos[c]);
  }
  CHECK(bad == 0);
  const auto summary = topology::summarize(n, t);
  CHECK(summary.total_length_m == Approx(rows * per_row * spacing + (rows - 1) * row_gap + spacing));
}

}  // namespace

TEST_CASE("10^5 pipes without structures or ids: clustered, turned by inverts, one tree") {
  model::Network n = comb(false);
  Findings fs;
  const auto t = topology::build_topology(n, {}, fs);
  check_comb(n, t, fs, n.structures.size());
}

TEST_CASE("10^5 pipes linked by ids without a structure layer: derived by id, lines turned to the ids") {
  model::Network n = comb(true);
  Findings fs;
  const auto t = topology::build_topology(n, {}, fs);
  check_comb(n, t, fs, n.structures.size());
}

TEST_CASE("10^5 pipes snapped to a structure layer of 10^5 manholes") {
  model::Network derived = comb(false);
  Findings ignored;
  topology::build_topology(derived, {}, ignored);
  model::Network n = comb(false);
  n.structures = derived.structures;
  for (auto& s : n.structures) s.kind = model::StructureKind::manhole;
  Findings fs;
  const auto t = topology::build_topology(n, {}, fs);
  check_comb(n, t, fs, 0);
}
