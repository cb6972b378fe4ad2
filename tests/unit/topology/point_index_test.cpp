// PointIndex: radius queries against a brute-force scan. Expected values follow from plane
// geometry of the literal points; no outside data.
#include <catch2/catch.hpp>

#include <cmath>
#include <limits>

#include "rimline/topology/point_index.hpp"

using rimline::model::Point2;
using rimline::topology::PointIndex;

TEST_CASE("point index returns the points within a radius, nearest first") {
  const std::vector<Point2> pts = {{0, 0}, {3, 4}, {1, 0}, {0.5, 0.5}, {10, 10}};
  const PointIndex index(pts);
  const auto near = index.within({0, 0}, 1.0);
  REQUIRE(near.size() == 3);
  CHECK(near[0].index == 0);
  CHECK(near[0].distance_m == 0.0);
  CHECK(near[1].index == 3);
  CHECK(near[1].distance_m == Approx(std::sqrt(0.5)));
  CHECK(near[2].index == 2);  // exactly on the radius counts
  CHECK(index.within({0, 0}, 4.99).size() == 3);
  CHECK(index.within({0, 0}, 5.0).size() == 4);  // (3,4) at exactly 5 m counts; (10,10) does not
  CHECK(index.within({100, 100}, 1.0).empty());
}

TEST_CASE("point index skips non-finite points and answers an empty set") {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  const PointIndex index({{nan, 0}, {2, 2}});
  const auto near = index.within({2, 2}, 0.1);
  REQUIRE(near.size() == 1);
  CHECK(near[0].index == 1);
  const PointIndex empty({});
  CHECK(empty.within({0, 0}, 1.0).empty());
}

TEST_CASE("point index agrees with a brute-force scan on a grid") {
  std::vector<Point2> pts;
  for (int i = 0; i < 40; ++i)
    for (int j = 0; j < 40; ++j) pts.push_back({i * 0.7, j * 0.3});
  const PointIndex index(pts);
  for (const Point2 q : {Point2{5.1, 3.3}, Point2{0, 0}, Point2{27.3, 11.7}}) {
    std::size_t brute = 0;
    for (const Point2& p : pts) brute += std::hypot(p.x - q.x, p.y - q.y) <= 1.0;
    CHECK(index.within(q, 1.0).size() == brute);
  }
}
