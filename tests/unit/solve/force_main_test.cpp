// Pump stations on a literal network: wet well WW -> force main FM (over a high point) -> MH -> OF.
// Checks the energy bookkeeping along the main against the formulas (Hazen-Williams SI form, K V^2/2g),
// the operating cases, and every finding code with its message.
#include <catch2/catch.hpp>
#include <cmath>

#include "rimline/hydraulics/losses.hpp"
#include "rimline/solve/force_main.hpp"
#include "rimline/units.hpp"

using namespace rimline;

namespace {

constexpr double g = units::gravity_m_s2;

struct Fixture {
  model::Network net;
  topology::Topology topo;
  std::vector<model::ForceMainProfile> profiles;
  model::PumpStation spec;
  model::ForceMainSettings settings;
};

model::Structure structure(const std::string& id, model::StructureKind kind, double invert) {
  model::Structure s;
  s.id = id;
  s.kind = kind;
  s.invert_m = invert;
  s.rim_m = invert + 4.0;
  return s;
}

// FM: 200 mm, 500 m, centreline 5 m at the pump, 14 m at the high point (station 250 m), 11 m at the
// outlet into MH. Pump (one): the straight line H = 30 - 500 Q, shut-off 30 m, run-out 0.06 m3/s.
Fixture fixture() {
  Fixture f;
  f.net.structures = {structure("OF", model::StructureKind::outfall, 10.0),
                      structure("MH", model::StructureKind::manhole, 10.2),
                      structure("WW", model::StructureKind::pump_station, 0.0)};
  model::Conduit p1;
  p1.id = "P1", p1.from = 1, p1.to = 0, p1.section.diameter_m = 0.6, p1.length_m = 100.0;
  p1.invert_up_m = 10.2, p1.invert_down_m = 10.0;
  model::Conduit fm;
  fm.id = "FM", fm.from = 2, fm.to = 1, fm.section.diameter_m = 0.2, fm.length_m = 500.0, fm.force_main = true;
  fm.invert_up_m = 4.9, fm.invert_down_m = 10.9;
  fm.vertices = {{0, 0}, {0, 250}, {0, 500}};
  f.net.conduits = {p1, fm};
  f.topo.nodes.resize(3);
  f.topo.nodes[0].inflows = {0};
  f.topo.nodes[0].outfall = true;
  f.topo.nodes[1].inflows = {1};
  f.topo.nodes[1].outflows = {0};
  f.topo.nodes[2].outflows = {1};
  model::ForceMainProfile prof;
  prof.conduit = 1;
  prof.source = model::ProfileSource::vertex_z;
  prof.station_m = {0.0, 250.0, 500.0};
  prof.centreline_m = {5.0, 14.0, 11.0};
  prof.xy = f.net.conduits[1].vertices;
  f.profiles = {prof};
  f.spec.id = "WW";
  f.spec.pump_on_m = 2.0;
  f.spec.pump_off_m = 1.0;
  f.spec.duty_pumps = 2;
  f.spec.curve = {{0.0, 30.0}, {0.06, 0.0}};
  f.spec.fittings_k = 2.5;
  f.spec.where = "x.toml: line 1: key pump_stations[1].id";
  f.settings.hazen_c = 120.0;
  return f;
}

// Hazen-Williams, SI head-loss form (as in force_main_reference_test): hf = 10.67 L Q^1.852 / (C^1.852 D^4.87).
double hw_loss(double q, double length, double c, double d) {
  return 10.67 * length * std::pow(q, 1.852) / (std::pow(c, 1.852) * std::pow(d, 4.87));
}

const Finding* find(const Findings& fs, const std::string& code) {
  for (const auto& f : fs)
    if (f.code == code) return &f;
  return nullptr;
}

}  // namespace

TEST_CASE("force main: lay-out follows the force main from the wet well to the receiving structure", "[force_main]") {
  auto f = fixture();
  Findings findings;
  const auto layouts = solve::lay_out_stations(f.net, f.topo, {f.spec}, f.profiles, findings);
  REQUIRE(layouts.size() == 1);
  CHECK(findings.empty());
  REQUIRE(layouts[0].ok);
  CHECK(layouts[0].wet_well == 2);
  CHECK(layouts[0].discharge == 1);
  CHECK(layouts[0].chain == std::vector<std::size_t>{1});
  CHECK(layouts[0].points.size() == 3);
}

TEST_CASE("force main: operating cases and the HGL / EGL along the main by hand", "[force_main]") {
  auto f = fixture();
  Findings findings;
  const auto layout = solve::lay_out_stations(f.net, f.topo, {f.spec}, f.profiles, findings).front();
  // Receiving level 10.5 m lies below the outlet centreline 11 m: a free outlet at 11 m.
  const auto r = solve::solve_station(f.net, f.spec, layout, f.settings, 10.5);
  CHECK(r.discharge_level_m == Approx(11.0));
  REQUIRE(r.cases.size() == 4);  // low / high wet well x 1 / 2 pumps
  const double area = M_PI * 0.2 * 0.2 / 4.0;
  for (const auto& c : r.cases) {
    INFO(c.label);
    REQUIRE(c.exists);
    const double q = c.flow_m3_s, v = q / area, hv = v * v / (2.0 * g);
    // On the pump curve: n pumps share Q at one head, H = 30 - 500 Q / n.
    CHECK(c.head_m == Approx(30.0 - 500.0 * q / c.pumps).epsilon(1e-9));
    // On the system curve: static lift + friction (Hazen-Williams) + fittings and exit (K + 1) V^2/2g.
    CHECK(c.head_m == Approx(11.0 - c.wet_well_m + hw_loss(q, 500.0, 120.0, 0.2) + 3.5 * hv).epsilon(0.005));
    // The HGL meets the discharge level at the outlet; EGL - HGL = V^2/2g everywhere.
    CHECK(c.hgl_m.back() == Approx(11.0).margin(1e-12));
    for (std::size_t i = 0; i < c.hgl_m.size(); ++i) {
      CHECK(c.egl_m[i] - c.hgl_m[i] == Approx(hv).epsilon(1e-12));
      CHECK(c.pressure_head_m[i] == Approx(c.hgl_m[i] - layout.points[i].centreline_m).margin(1e-12));
    }
    // The EGL falls linearly with station (uniform section) by the whole friction loss.
    CHECK(c.egl_m.front() - c.egl_m.back() == Approx(hw_loss(q, 500.0, 120.0, 0.2)).epsilon(0.01));
    CHECK(c.egl_m[1] == Approx(0.5 * (c.egl_m[0] + c.egl_m[2])).epsilon(1e-12));
    // Pump head = EGL after the fittings + the fittings' loss - the wet-well level.
    CHECK(c.head_m == Approx(c.egl_m.front() + 2.5 * hv - c.wet_well_m).epsilon(1e-9));
  }
  // More pumps and a higher wet well each give more flow; the design case is the largest flow.
  CHECK(r.cases[1].flow_m3_s > r.cases[0].flow_m3_s);
  CHECK(r.cases[2].flow_m3_s > r.cases[0].flow_m3_s);
  CHECK(r.design_case == 3);
  CHECK(r.design_flow_m3_s == Approx(r.cases[3].flow_m3_s));
  // A receiving level above the outlet is the discharge level.
  CHECK(solve::solve_station(f.net, f.spec, layout, f.settings, 12.0).discharge_level_m == Approx(12.0));
}

TEST_CASE("force main: findings for the high point, the rating, the velocity band and the capacity", "[force_main]") {
  auto f = fixture();
  f.net.conduits[1].rated_pressure_head_m = 10.0;
  // Limits set so that both velocity findings fire (the parser would refuse min > max; the check does not care).
  f.settings.velocity_min_m_s = 5.0;
  f.settings.velocity_max_m_s = 0.5;
  Findings findings;
  const auto layout = solve::lay_out_stations(f.net, f.topo, {f.spec}, f.profiles, findings).front();
  const auto r = solve::solve_station(f.net, f.spec, layout, f.settings, NAN);
  // At the high point (centreline 14 m) the HGL = 11 + hf/2 (half the main lies downstream of it):
  // below the pipe when hf < 6 m, i.e. for the one-pump cases.
  const auto& one = r.cases[0];
  const double hgl_high = 11.0 + 0.5 * (one.egl_m.front() - one.egl_m.back());
  REQUIRE(hgl_high < 14.0);
  const auto out = solve::check_station(f.net, f.spec, r, f.settings, 1.0);
  const Finding* sub = find(out, "FM_SUBATMOSPHERIC");
  REQUIRE(sub != nullptr);
  CHECK(sub->feature_id == "FM");
  CHECK(sub->layer == LayerRole::force_mains);
  CHECK(sub->value == Approx(hgl_high - 14.0).epsilon(1e-9));
  CHECK(render_message(sub->message, units::System::si).find("air-release valve candidate at the high point, station 0+250.0") !=
        std::string::npos);
  // Peak pressure at the pump end: EGL - V^2/2g - 5 m, above the 10 m rating in every case.
  const Finding* rating = find(out, "FM_PRESSURE_RATING");
  REQUIRE(rating != nullptr);
  CHECK(rating->severity == Severity::error);
  CHECK(rating->limit == Approx(10.0));
  CHECK(rating->value == Approx(r.cases[3].pressure_head_m.front()).epsilon(1e-9));
  const Finding* low = find(out, "FM_VELOCITY_LOW");
  const Finding* high = find(out, "FM_VELOCITY_HIGH");
  const double area = M_PI * 0.01;
  REQUIRE(low != nullptr);
  REQUIRE(high != nullptr);
  CHECK(low->value == Approx(r.cases[0].flow_m3_s / area));
  CHECK(high->value == Approx(r.cases[3].flow_m3_s / area));
  // 1 m3/s arriving is more than two pumps deliver at the low wet-well level.
  const Finding* cap = find(out, "PUMP_CAPACITY");
  REQUIRE(cap != nullptr);
  CHECK(cap->layer == LayerRole::structures);
  CHECK(cap->feature_id == "WW");
  CHECK(cap->limit == Approx(r.cases[1].flow_m3_s));
  CHECK(find(solve::check_station(f.net, f.spec, r, f.settings, 0.001), "PUMP_CAPACITY") == nullptr);
}

TEST_CASE("force main: no operating point when the lift exceeds the shut-off head", "[force_main]") {
  auto f = fixture();
  f.spec.discharge_level_m = 40.0;  // 39 m above the low wet well, shut-off head 30 m
  Findings findings;
  const auto layout = solve::lay_out_stations(f.net, f.topo, {f.spec}, f.profiles, findings).front();
  const auto r = solve::solve_station(f.net, f.spec, layout, f.settings, NAN);
  for (const auto& c : r.cases) CHECK_FALSE(c.exists);
  CHECK(r.design_flow_m3_s == 0.0);
  const auto out = solve::check_station(f.net, f.spec, r, f.settings, 0.0);
  const Finding* none = find(out, "FM_NO_OPERATING_POINT");
  REQUIRE(none != nullptr);
  CHECK(none->severity == Severity::error);
}

TEST_CASE("force main: a station that cannot be laid out is FM_NOT_CHECKED with its project line", "[force_main][bad]") {
  auto f = fixture();
  Findings findings;
  auto spec = f.spec;
  spec.id = "WW-9";
  auto layouts = solve::lay_out_stations(f.net, f.topo, {spec}, f.profiles, findings);
  REQUIRE(findings.size() == 1);
  CHECK_FALSE(layouts[0].ok);
  CHECK(findings[0].code == "FM_NOT_CHECKED");
  CHECK(findings[0].layer == LayerRole::project);
  CHECK(findings[0].message ==
        "x.toml: line 1: key pump_stations[1].id: pump station WW-9: no structure has the id WW-9 (the wet well); the "
        "station is not checked.");
  findings.clear();
  spec = f.spec;
  spec.discharge_id = "OF";
  layouts = solve::lay_out_stations(f.net, f.topo, {spec}, f.profiles, findings);
  REQUIRE(findings.size() == 1);
  CHECK(findings[0].message ==
        "x.toml: line 1: key pump_stations[1].id: pump station WW: its force main ends at structure MH, not at the "
        "discharge structure OF; the station is not checked.");
  findings.clear();
  layouts = solve::lay_out_stations(f.net, f.topo, {f.spec}, {}, findings);
  REQUIRE(findings.size() == 1);
  CHECK(findings[0].message ==
        "x.toml: line 1: key pump_stations[1].id: pump station WW: force main FM has no vertical profile (no usable "
        "line); the station is not checked.");
}

TEST_CASE("force main: the no-operating-point message says why", "[force_main]") {
  auto f = fixture();
  f.spec.discharge_level_m = 40.0;
  f.spec.duty_pumps = 1;
  Findings findings;
  const auto layout = solve::lay_out_stations(f.net, f.topo, {f.spec}, f.profiles, findings).front();
  const auto r = solve::solve_station(f.net, f.spec, layout, f.settings, NAN);
  const auto out = solve::check_station(f.net, f.spec, r, f.settings, 0.0);
  REQUIRE(!out.empty());
  CHECK(render_message(out.front().message, units::System::si) ==
        "pump station WW (wet well low (pump off), 1 pump): the pump and system curves do not meet: the static lift "
        "39.000 m reaches the shut-off head 30.000 m, so the pumps cannot open their check valves; no steady flow is "
        "computed for this case.");
}

TEST_CASE("force main: Darcy-Weisbach friction uses the pipe's ks and the water's viscosity", "[force_main]") {
  auto f = fixture();
  f.settings.friction = hydraulics::FrictionLaw::darcy_weisbach;
  f.net.conduits[1].roughness.ks_m = 0.1e-3;
  f.net.conduits[1].roughness.kinematic_viscosity_m2_s = 1.139e-6;  // water at 15 degC (from memory)
  Findings findings;
  const auto layout = solve::lay_out_stations(f.net, f.topo, {f.spec}, f.profiles, findings).front();
  const auto r = solve::solve_station(f.net, f.spec, layout, f.settings, NAN);
  for (const auto& c : r.cases) {
    REQUIRE(c.exists);
    // hf = f L/D V^2/2g with f from Colebrook-White at Re = V D / nu and ks / D (the friction module's own solver).
    const double v = c.flow_m3_s / (M_PI * 0.01), fr = hydraulics::darcy_friction_factor(v * 0.2 / 1.139e-6, 0.1e-3 / 0.2);
    CHECK(c.egl_m.front() - c.egl_m.back() == Approx(fr * 500.0 / 0.2 * v * v / (2 * g)).epsilon(1e-9));
  }
}
