// Catchment flows on small trees, computed by hand in the comments.
#include "rimline/flows/catchment_flows.hpp"

#include <catch2/catch.hpp>
#include <cmath>

#include "rimline/flows/catchment_outlets.hpp"
#include "rimline/flows/idf.hpp"
#include "tree_fixture.hpp"

using namespace rimline;

namespace {

constexpr double minute = 60.0;

model::IdfCurve formula_3330_19() {  // i = 3330 / (t + 19) mm/h, t in min
  model::IdfCurve idf;
  idf.a = 3330.0;
  idf.b_min = 19.0;
  idf.c = 1.0;
  idf.intensity_si_per_unit = 1.0e-3 / 3600.0;
  return idf;
}

model::Catchment catchment(const std::string& id, double area_ha, double c, double inlet_min, std::size_t at) {
  model::Catchment k;
  k.id = id;
  k.area_m2 = area_ha * 1.0e4;
  k.runoff_c = c;
  k.inlet_time_s = inlet_min * minute;
  k.structure = at;
  return k;
}

}  // namespace

// A -P1-> C <-P2- B, C -P3-> O. Pipes 450 mm, n 0.013, S 0.01, full-flow velocity:
//   R = D/4 = 0.1125 m, R^(2/3) = 0.233042, V = (1/0.013) 0.233042 0.1 = 1.79263 m/s.
//   P1 120 m: 66.941 s = 1.11568 min;  P2 60 m: 33.470 s = 0.55784 min.
// Catchments: KA 0.5 ha C 0.8, 5 min at A; KB 1.0 ha C 0.5, 12 min at B; KC 0.2 ha C 0.9, 5 min at C.
//   P1: Tc 5 min, i = 3330/24 = 138.750 mm/h, C A = 0.40 ha, Q = 0.40 x 138.750 / 360 = 0.154167 m3/s
//   P2: Tc 12 min, i = 3330/31 = 107.419 mm/h, C A = 0.50 ha, Q = 0.149194 m3/s
//   P3: Tc = max(5 + 1.11568, 12 + 0.55784, 5) = 12.55784 min, i = 3330/31.55784 = 105.5205 mm/h,
//       C A = 0.40 + 0.50 + 0.18 = 1.08 ha, A = 1.7 ha, Q = 1.08 x 105.5205 / 360 = 0.316562 m3/s
TEST_CASE("Tc accumulates along a branched tree (hand computation)", "[flows][rational]") {
  test::Tree t;
  const auto a = t.structure("A", model::StructureKind::inlet);
  const auto b = t.structure("B", model::StructureKind::inlet);
  const auto c = t.structure("C", model::StructureKind::inlet);
  const auto o = t.structure("O", model::StructureKind::outfall);
  t.pipe("P1", a, c, 120.0);
  t.pipe("P2", b, c, 60.0);
  t.pipe("P3", c, o, 80.0);
  const std::vector<model::Catchment> ks{catchment("KA", 0.5, 0.8, 5, a), catchment("KB", 1.0, 0.5, 12, b),
                                         catchment("KC", 0.2, 0.9, 5, c)};
  Findings findings;
  const auto r = flows::storm_along_tree(t.net, t.topo, flows::local_inflows(t.net, ks), formula_3330_19(),
                                         flows::velocity_travel_time(t.net, flows::TravelVelocity::full_flow, findings),
                                         flows::Split::capacity, findings);
  CHECK(r.pipes[0].travel_velocity_m_s == Approx(1.79263).epsilon(1e-5));
  CHECK(r.pipes[0].travel_time_s / minute == Approx(1.11568).epsilon(1e-5));
  CHECK(r.pipes[0].flow_m3_s == Approx(0.154167).epsilon(1e-5));
  CHECK(r.pipes[1].flow_m3_s == Approx(0.149194).epsilon(1e-5));
  CHECK(r.pipes[2].tc_s / minute == Approx(12.55784).epsilon(1e-6));
  CHECK(r.pipes[2].intensity_m_s * 3.6e6 == Approx(105.5205).epsilon(1e-6));
  CHECK(r.pipes[2].area_m2 == Approx(1.7e4));
  CHECK(r.pipes[2].ca_m2 == Approx(1.08e4));
  CHECK(r.pipes[2].flow_m3_s == Approx(0.316562).epsilon(1e-5));
  CHECK(r.flows.flow_m3_s[2] == r.pipes[2].flow_m3_s);
  CHECK(findings.empty());
}

TEST_CASE("normal-depth travel velocity is below full-flow velocity for a part-full pipe", "[flows][rational]") {
  // Manning's circular pipe: at Q/Qfull = 0.1 the depth is ~0.22 D and V/Vfull ~0.7 (partial-flow curves,
  // from memory) - only the direction is checked here: slower than full, faster than 0.
  test::Tree t;
  const auto a = t.structure("A", model::StructureKind::inlet);
  const auto o = t.structure("O", model::StructureKind::outfall);
  t.pipe("P1", a, o, 100.0);
  Findings findings;
  flows::PipeDesign p;
  const double full = 100.0 / 1.79263;
  const double t_normal =
      flows::velocity_travel_time(t.net, flows::TravelVelocity::normal_depth, findings)(0, 0.028, p);
  CHECK(t_normal > full);
  CHECK(t_normal < 2.0 * full);
}

TEST_CASE("a pipe without a slope travels in no time and says so", "[flows][rational]") {
  test::Tree t;
  const auto a = t.structure("A");
  const auto o = t.structure("O", model::StructureKind::outfall);
  t.pipe("FLAT", a, o, 100.0, 0.45, 0.0);
  Findings findings;
  flows::PipeDesign p;
  CHECK(flows::velocity_travel_time(t.net, flows::TravelVelocity::full_flow, findings)(0, 0.1, p) == 0.0);
  REQUIRE(findings.size() == 1);
  CHECK(findings[0].code == "TRAVEL_VELOCITY");
  CHECK(findings[0].feature_id == "FLAT");
}

// IDF table (10 min, 100 mm/h), (40 min, 50 mm/h): log-log slope ln(0.5)/ln(4) = -0.5, so at 20 min
// i = 100 x 2^-0.5 = 70.7107 mm/h; at 5 min the first segment is extended: 100 x 0.5^-0.5 = 141.421.
TEST_CASE("IDF table interpolates log-log and flags extrapolation", "[flows][idf]") {
  model::IdfCurve idf;
  idf.kind = model::IdfCurve::Kind::table;
  idf.durations_s = {10 * minute, 40 * minute};
  idf.intensities_m_s = {100.0 / 3.6e6, 50.0 / 3.6e6};
  const auto mid = flows::idf_intensity(idf, 20 * minute);
  CHECK(mid.intensity_m_s * 3.6e6 == Approx(70.7107).epsilon(1e-6));
  CHECK_FALSE(mid.extrapolated);
  const auto before = flows::idf_intensity(idf, 5 * minute);
  CHECK(before.intensity_m_s * 3.6e6 == Approx(141.421).epsilon(1e-5));
  CHECK(before.extrapolated);
  CHECK(flows::idf_intensity(idf, 10 * minute).intensity_m_s * 3.6e6 == Approx(100.0));
}

TEST_CASE("IDF formula with an exponent", "[flows][idf]") {
  // i = 1000 / (t + 10)^0.8 mm/h at t = 22 min: 32^0.8 = 2^4 = 16, i = 62.5 mm/h.
  model::IdfCurve idf;
  idf.a = 1000.0;
  idf.b_min = 10.0;
  idf.c = 0.8;
  idf.intensity_si_per_unit = 1.0e-3 / 3600.0;
  CHECK(flows::idf_intensity(idf, 22 * minute).intensity_m_s * 3.6e6 == Approx(62.5).epsilon(1e-12));
}

// A -P1 (100 m)-> B -P2 (100 m)-> O; 1000 persons at A, 3000 at B, q = 300 L/d, I/I 0.1 L/s/km.
//   P1: Qavg = 1000 x 300 / 86400 = 3.47222 L/s, PF(1) = 3.8, peak 13.19444, I/I 0.01 -> 13.20444 L/s
//   P2: P = 4000, Qavg = 13.88889 L/s, PF(4) = 20/6, peak 46.29630, I/I over 200 m 0.02 -> 46.31630 L/s
TEST_CASE("sanitary peak flows accumulate population and infiltration", "[flows][sanitary]") {
  test::Tree t;
  const auto a = t.structure("A");
  const auto b = t.structure("B");
  const auto o = t.structure("O", model::StructureKind::outfall);
  t.pipe("P1", a, b);
  t.pipe("P2", b, o);
  std::vector<model::Catchment> ks{catchment("KA", 1, 0, 0, a), catchment("KB", 1, 0, 0, b)};
  ks[0].population = 1000;
  ks[1].population = 3000;
  flows::SanitaryOptions opt;
  opt.per_capita_m3_s = 300.0e-3 / 86400.0;
  opt.infiltration_per_length_m3_s_m = 0.1e-3 / 1000.0;
  const auto r =
      flows::sanitary_along_tree(t.net, t.topo, flows::local_inflows(t.net, ks), opt, flows::Split::capacity);
  CHECK(r.pipes[0].peaking_factor == Approx(3.8));
  CHECK(r.pipes[0].flow_m3_s * 1e3 == Approx(13.20444).epsilon(1e-6));
  CHECK(r.pipes[1].population == Approx(4000));
  CHECK(r.pipes[1].flow_m3_s * 1e3 == Approx(46.31630).epsilon(1e-6));
}

TEST_CASE("catchment outlets: inside, ambiguous, nearest, none, named", "[flows][catchments]") {
  test::Tree t;
  const auto i1 = t.structure("IN-1", model::StructureKind::inlet, {5, 5});
  const auto i2 = t.structure("IN-2", model::StructureKind::inlet, {8, 8});
  const auto mh = t.structure("MH", model::StructureKind::manhole, {2, 2});
  const auto o = t.structure("O", model::StructureKind::outfall, {50, 0});
  const auto far = t.structure("FAR", model::StructureKind::manhole, {500, 500});
  t.pipe("P1", i1, o);
  t.pipe("P2", i2, o);
  t.pipe("P3", mh, o);
  t.pipe("P4", far, o);
  auto square = [](const std::string& id, double x0, double y0, double size) {
    model::Catchment k;
    k.id = id;
    k.rings = {{{x0, y0}, {x0 + size, y0}, {x0 + size, y0 + size}, {x0, y0 + size}}};
    k.centroid = {x0 + size / 2, y0 + size / 2};
    return k;
  };
  std::vector<model::Catchment> ks{square("K-AMB", 0, 0, 10), square("K-NEAR", 20, 0, 10), square("K-NONE", 200, 0, 10),
                                   square("K-NAMED", 20, 20, 5), square("K-BAD", 0, 0, 3)};
  ks[3].structure_id = "MH";
  ks[4].structure_id = "NOPE";
  Findings f;
  flows::assign_outlets(t.net, t.topo, ks, 50.0, f);
  CHECK(ks[0].structure == i1);  // both inlets inside (the manhole too, but inlets first); IN-1 nearer the centroid
  CHECK(ks[1].structure == i2);  // 12 m from (8, 8) to the edge x = 20
  CHECK(ks[2].structure == model::no_index);
  CHECK(ks[3].structure == mh);
  CHECK(ks[4].structure == mh);  // unknown name: the manhole inside is taken
  auto count = [&](const std::string& code) {
    return std::count_if(f.begin(), f.end(), [&](const Finding& x) { return x.code == code; });
  };
  CHECK(count("CATCHMENT_AMBIGUOUS") == 1);
  CHECK(count("CATCHMENT_NEAREST") == 1);
  CHECK(count("CATCHMENT_NO_OUTLET") == 1);
  CHECK(count("CATCHMENT_OUTLET") == 1);
  CHECK(flows::distance_to_rings_m(ks[1].rings, {8, 8}) == Approx(12.0));
}

// Populations at structures add to those of their catchments: A serves 400 persons itself and
// has a 600-person catchment; B serves 3000. P1 carries 1000, P2 4000 (PF(4) = 20/6, no infiltration):
//   Q(P2) = 20/6 x 4000 x 300 L/d / 86400 = 46.29630 L/s.
TEST_CASE("sanitary: structure populations add to catchment populations", "[flows][sanitary]") {
  test::Tree t;
  const auto a = t.structure("A");
  const auto b = t.structure("B");
  const auto o = t.structure("O", model::StructureKind::outfall);
  t.pipe("P1", a, b);
  t.pipe("P2", b, o);
  t.net.structures[a].population = 400;
  t.net.structures[b].population = 3000;
  std::vector<model::Catchment> ks{catchment("KA", 1, 0, 0, a)};
  ks[0].population = 600;
  flows::SanitaryOptions opt;
  opt.per_capita_m3_s = 300.0e-3 / 86400.0;
  const auto r =
      flows::sanitary_along_tree(t.net, t.topo, flows::local_inflows(t.net, ks), opt, flows::Split::capacity);
  CHECK(r.pipes[0].population == 1000.0);
  CHECK(r.pipes[1].flow_m3_s * 1e3 == Approx(46.29630).epsilon(1e-6));
}

// A diversion at D with given split fractions 0.3 / 0.7 (Split::field): every accumulated quantity
// follows the flow. K at A: 1 ha, C 0.6, 10 min -> at P-LOW (0.3): A 0.3 ha, C A 0.18 ha; P-HIGH
// (0.7): 0.7 ha, 0.42 ha; both keep A's Tc plus P0's travel time (given: 60 s) = 11 min.
TEST_CASE("a diversion splits area and C A by the flow shares", "[flows][rational]") {
  test::Tree t;
  const auto a = t.structure("A", model::StructureKind::inlet);
  const auto d = t.structure("D");
  const auto o1 = t.structure("O1", model::StructureKind::outfall);
  const auto o2 = t.structure("O2", model::StructureKind::outfall);
  t.pipe("P0", a, d);
  const auto low = t.pipe("P-LOW", d, o1);
  const auto high = t.pipe("P-HIGH", d, o2);
  t.net.conduits[low].split_fraction = 0.3;
  t.net.conduits[high].split_fraction = 0.7;
  const std::vector<model::Catchment> ks{catchment("K", 1.0, 0.6, 10, a)};
  Findings findings;
  const auto r = flows::storm_along_tree(
      t.net, t.topo, flows::local_inflows(t.net, ks), formula_3330_19(),
      [](std::size_t, double, flows::PipeDesign&) { return 60.0; }, flows::Split::field, findings);
  CHECK(r.pipes[low].area_m2 == Approx(3000.0));
  CHECK(r.pipes[low].ca_m2 == Approx(1800.0));
  CHECK(r.pipes[high].ca_m2 == Approx(4200.0));
  CHECK(r.pipes[high].tc_s == Approx(660.0));
  CHECK(r.pipes[low].flow_m3_s + r.pipes[high].flow_m3_s ==
        Approx(flows::idf_intensity(formula_3330_19(), 660.0).intensity_m_s * 6000.0));
}

TEST_CASE("catchment outlets: a structure in a hole of the polygon is not inside it", "[flows][catchments]") {
  test::Tree t;
  const auto hole = t.structure("IN-HOLE", model::StructureKind::inlet, {5, 5});
  const auto edge = t.structure("IN-EDGE", model::StructureKind::inlet, {1, 1});
  const auto o = t.structure("O", model::StructureKind::outfall, {50, 0});
  t.pipe("P1", hole, o);
  t.pipe("P2", edge, o);
  model::Catchment k;
  k.id = "K";
  k.rings = {{{0, 0}, {10, 0}, {10, 10}, {0, 10}}};
  k.holes = {{{3, 3}, {7, 3}, {7, 7}, {3, 7}}};
  k.centroid = {5, 5};
  std::vector<model::Catchment> ks{k};
  Findings f;
  flows::assign_outlets(t.net, t.topo, ks, 30.0, f);
  CHECK(ks[0].structure == edge);
  CHECK(f.empty());
}

// A 5 min inlet time below a table that starts at 10 min: the first segment is extended,
// i = 100 x (5/10)^-0.5 = 141.421 mm/h, and the pipe carries an IDF_EXTRAPOLATED finding.
TEST_CASE("a Tc outside the IDF table is reported on the pipe", "[flows][idf]") {
  test::Tree t;
  const auto a = t.structure("A", model::StructureKind::inlet);
  const auto o = t.structure("O", model::StructureKind::outfall);
  t.pipe("P1", a, o);
  model::IdfCurve idf;
  idf.kind = model::IdfCurve::Kind::table;
  idf.durations_s = {10 * minute, 40 * minute};
  idf.intensities_m_s = {100.0 / 3.6e6, 50.0 / 3.6e6};
  Findings findings;
  const auto r = flows::storm_along_tree(
      t.net, t.topo, flows::local_inflows(t.net, {catchment("K", 1.0, 0.5, 5, a)}), idf,
      [](std::size_t, double, flows::PipeDesign&) { return 0.0; }, flows::Split::capacity, findings);
  CHECK(r.pipes[0].intensity_m_s * 3.6e6 == Approx(141.421).epsilon(1e-5));
  REQUIRE(findings.size() == 1);
  CHECK(findings[0].code == "IDF_EXTRAPOLATED");
  CHECK(findings[0].feature_id == "P1");
  CHECK(render_message(findings[0].message, units::System::si) ==
        "pipe P1: the time of concentration 5.0 min lies outside the IDF table; its end segment was extended "
        "(log-log) to give 141.4 mm/h.");
}

// A pump station's force main inside a Rational tree: WW -FM-> J <-P1- A, J -P2-> O.
// WW carries 2 ha at C 0.5 (its own catchment, stopped by the wet well), A 1 ha at C 0.6,
// inlet time 10 min; travel times 0 (flat test function) so Tc at P2 = 10 min.
//   i(10 min) = 3330 / (10 + 19) = 114.828 mm/h = 3.18966e-5 m/s
//   P1: Q = 3.18966e-5 x 6000 m^2 = 0.191379 m3/s
//   FM: the pumped design flow, 0.040 m3/s (fixed, replaces its catchment accumulation)
//   P2: Q = i(10 min) x 6000 m^2 + 0.040 = 0.231379 m3/s; C A = 6000 m^2 (WW's 10000 m^2 not passed on)
TEST_CASE("a force main passes its pumped flow on as a constant inflow and stops the catchment sums",
          "[flows][rational]") {
  test::Tree t;
  const auto ww = t.structure("WW", model::StructureKind::pump_station);
  const auto a = t.structure("A", model::StructureKind::inlet);
  const auto j = t.structure("J");
  const auto o = t.structure("O", model::StructureKind::outfall);
  const auto fm = t.pipe("FM", ww, j, 300.0, 0.15);
  const auto p1 = t.pipe("P1", a, j);
  const auto p2 = t.pipe("P2", j, o);
  t.net.conduits[fm].force_main = true;
  std::vector<flows::LocalInflow> local(4);
  local[ww].area_m2 = 2.0e4;
  local[ww].ca_m2 = 1.0e4;
  local[ww].inlet_time_s = 10.0 * minute;
  local[a].area_m2 = 1.0e4;
  local[a].ca_m2 = 0.6e4;
  local[a].inlet_time_s = 10.0 * minute;
  Findings findings;
  const auto zero = [](std::size_t, double, flows::PipeDesign&) { return 0.0; };
  const auto r = flows::storm_along_tree(t.net, t.topo, local, formula_3330_19(), zero, flows::Split::capacity,
                                         findings, {{fm, 0.040}});
  CHECK(r.pipes[fm].flow_m3_s == 0.040);
  CHECK(r.pipes[p1].flow_m3_s == Approx(0.191379).epsilon(1e-5));
  CHECK(r.pipes[p2].flow_m3_s == Approx(0.231379).epsilon(1e-5));
  CHECK(r.pipes[p2].ca_m2 == Approx(6000.0));
  CHECK(r.pipes[p2].tc_s == Approx(600.0));
  // Sanitary: the pumped flow is added below the receiving structure the same way.
  flows::SanitaryOptions so;
  so.per_capita_m3_s = 0.0;
  const auto s = flows::sanitary_along_tree(t.net, t.topo, local, so, flows::Split::capacity, {{fm, 0.040}});
  CHECK(s.pipes[p2].flow_m3_s == Approx(0.040));
}
