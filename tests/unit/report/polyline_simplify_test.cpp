// Polyline simplification of the drawn lines (Douglas & Peucker 1973, "Algorithms for the
// reduction of the number of points required to represent a digitized line or its caricature",
// The Canadian Cartographer 10(2)): the kept points are a subset with both ends, and every dropped
// point lies within the tolerance of the kept polyline (the algorithm's guarantee, checked here
// by brute force); collinear points go.
#include <catch2/catch.hpp>

#include <cmath>
#include <random>

#include "report/profile_draw.hpp"

using namespace rimline::report;

namespace {

double distance_to_polyline(const Pt& p, const std::vector<Pt>& line) {
  double best = INFINITY;
  for (std::size_t k = 0; k + 1 < line.size(); ++k) {
    const double dx = line[k + 1].x - line[k].x, dy = line[k + 1].y - line[k].y;
    const double len2 = dx * dx + dy * dy;
    double t = len2 > 0 ? ((p.x - line[k].x) * dx + (p.y - line[k].y) * dy) / len2 : 0.0;
    t = std::clamp(t, 0.0, 1.0);
    best = std::min(best, std::hypot(p.x - (line[k].x + t * dx), p.y - (line[k].y + t * dy)));
  }
  return best;
}

}  // namespace

TEST_CASE("drawn lines: collinear step points go, a bump stays", "[report][drawing]") {
  std::vector<Pt> pts;
  for (int k = 0; k <= 1000; ++k) pts.push_back({10.0 + 0.38 * k, 100.0 - 0.05 * k});
  pts[500].y += 0.5;  // a hydraulic jump's rise, half a millimetre on the sheet
  const auto out = simplified_polyline(pts, drawing_tolerance_mm);
  // The spike and its two neighbours (the line runs straight to and from them), and the ends.
  REQUIRE(out.size() == 5);
  for (std::size_t k = 0; k < 5; ++k) {
    const std::size_t want = std::vector<std::size_t>{0, 499, 500, 501, 1000}[k];
    CHECK(out[k].x == pts[want].x);
    CHECK(out[k].y == pts[want].y);
  }
}

TEST_CASE("drawn lines: every dropped point within the tolerance of the kept line", "[report][drawing]") {
  std::mt19937 rng(5);
  std::normal_distribution<double> wiggle(0.0, 0.02);
  std::vector<Pt> pts;
  for (int k = 0; k < 3000; ++k) {
    const double x = 20.0 + 0.12 * k;
    pts.push_back({x, 120.0 - 30.0 * std::sin(x / 60.0) + wiggle(rng)});
  }
  const auto out = simplified_polyline(pts, drawing_tolerance_mm);
  CHECK(out.size() < pts.size());
  CHECK(out.front().x == pts.front().x);
  CHECK(out.back().x == pts.back().x);
  double worst = 0.0;
  for (const auto& p : pts) worst = std::max(worst, distance_to_polyline(p, out));
  CHECK(worst <= drawing_tolerance_mm + 1e-12);
  // Fewer than three points come back unchanged.
  CHECK(simplified_polyline({{1, 2}, {3, 4}}, 0.01).size() == 2);
  CHECK(simplified_polyline({{1, 2}}, 0.01).size() == 1);
}
