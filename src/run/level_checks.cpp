// Do the mapped levels agree with each other in the declared units? A unit mistake on levels does not
// stop a run: it changes slopes, orientation and every freeboard silently. These checks compare what
// the fields say with each other and name the unit under which they would agree.
#include "run/level_checks.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <functional>

#include "rimline/topology/finding_text.hpp"

namespace rimline::run {
namespace {

using topology::fixed;
using units::Dimension;
using units::Unit;

constexpr double nan = std::numeric_limits<double>::quiet_NaN();
// Median pipe slope of a drainage network: between 1e-4 (flat trunk sewers) and 0.3 (steep hillside
// laterals); common practice, no source. A unit mistake of 10x or more moves it out.
constexpr double slope_low = 1.0e-4, slope_high = 0.3;
// Pipe inverts meet the inverts of the structures they join within about a metre (drops included),
// and lie below the rims by at most a deep sewer's cover; common practice, no source.
constexpr double agreement_m = 1.0, cover_max_m = 30.0;
constexpr std::size_t enough = 5;  // fewer samples than this decide nothing

double median(std::vector<double> v) {
  if (v.empty()) return nan;
  const auto mid = v.begin() + static_cast<std::ptrdiff_t>(v.size() / 2);
  std::nth_element(v.begin(), mid, v.end());
  return *mid;
}

std::string sym(Unit u) { return std::string(units::unit_symbol(u)); }

// Factor that turns a value converted as `declared` into the value converted as `u`.
double factor(Unit declared, Unit u) { return units::to_si(1.0, u) / units::to_si(1.0, declared); }

constexpr std::array<Unit, 5> level_units{Unit::m, Unit::mm, Unit::cm, Unit::ft, Unit::in};

// One pipe end meeting a structure: the pipe's invert there, the structure's invert and rim.
struct End {
  double pipe, structure_invert, rim;
};

// What the levels say under one reading of the pipe inverts' unit (k) and the structures' (ks, kr).
struct Fit {
  double slope = nan;          // median pipe slope
  double distance = nan;       // median |pipe invert - structure invert|
  double below_rim = nan;      // share of ends with the invert below the rim (within 30 m)
  std::size_t slopes = 0, distances = 0, rims = 0;
  bool ok() const {
    return (slopes < enough || (slope >= slope_low && slope <= slope_high)) &&
           (distances < enough || distance <= agreement_m) && (rims < enough || below_rim >= 0.8);
  }
};

class LevelChecks {
 public:
  LevelChecks(const config::Project& p, const model::Network& n, const topology::Topology& t, Findings& f)
      : p_(p), net_(n), topo_(t), findings_(f) {
    collect();
  }

  void run() {
    const auto& pf = p_.pipe_fields;
    const auto& sf = p_.structure_fields;
    const bool pipes_mapped = pf.invert_up.mapped() || pf.invert_down.mapped();
    const FieldRefList pipe_fields = mapped({&pf.invert_up, &pf.invert_down});
    if (pipes_mapped && same_unit(pipe_fields)) {
      const Unit declared = pipe_fields.front()->unit;
      const Fit as_declared = fit(1.0, 1.0, 1.0);
      if (!as_declared.ok())
        for (Unit u : level_units) {
          if (u == declared) continue;
          const Fit other = fit(factor(declared, u), 1.0, 1.0);
          if (!other.ok()) continue;
          report_unit(pipe_fields, "pipe inverts", declared, u, as_declared, other);
          pipes_suspect_ = true;
          break;
        }
    }
    // The pipes agree with themselves: does a structure field disagree with them?
    if (!pipes_suspect_) {
      if (sf.invert.mapped()) structure_field_unit(sf.invert, true, structure_invert_suspect_);
      if (sf.rim.mapped()) structure_field_unit(sf.rim, false, rim_suspect_);
    }
    per_feature();
  }

 private:
  using FieldRefList = std::vector<const config::FieldRef*>;

  static FieldRefList mapped(std::initializer_list<const config::FieldRef*> refs) {
    FieldRefList out;
    for (const auto* r : refs)
      if (r->mapped()) out.push_back(r);
    return out;
  }
  static bool same_unit(const FieldRefList& refs) {
    return !refs.empty() && std::all_of(refs.begin(), refs.end(), [&](const auto* r) { return r->unit == refs.front()->unit; });
  }

  void collect() {
    for (const auto& c : net_.conduits) {
      if (!c.usable || c.force_main) continue;
      if (c.invert_up_m && c.invert_down_m && c.length_m > 0.0 && *c.invert_up_m != *c.invert_down_m)
        slopes_.push_back(std::abs(*c.invert_up_m - *c.invert_down_m) / c.length_m);
      for (bool up : {true, false}) {
        const std::size_t s = up ? c.from : c.to;
        const auto inv = up ? c.invert_up_m : c.invert_down_m;
        if (s == model::no_index || !inv) continue;
        const auto& st = net_.structures[s];
        if (st.invert_m || st.rim_m) ends_.push_back({*inv, st.invert_m.value_or(nan), st.rim_m.value_or(nan)});
      }
    }
  }

  // k: factor on the pipe inverts, ks on the structure inverts, kr on the rims.
  Fit fit(double k, double ks, double kr) const {
    Fit f;
    std::vector<double> s;
    for (double x : slopes_) s.push_back(x * k);
    f.slopes = s.size();
    f.slope = median(std::move(s));
    std::vector<double> d;
    std::size_t below = 0;
    for (const auto& e : ends_) {
      if (std::isfinite(e.structure_invert)) d.push_back(std::abs(e.pipe * k - e.structure_invert * ks));
      if (std::isfinite(e.rim)) {
        ++f.rims;
        const double cover = e.rim * kr - e.pipe * k;
        if (cover >= -p_.plausibility.level_tolerance_m && cover <= cover_max_m) ++below;
      }
    }
    f.distances = d.size();
    f.distance = median(std::move(d));
    f.below_rim = f.rims ? static_cast<double>(below) / static_cast<double>(f.rims) : nan;
    return f;
  }

  void structure_field_unit(const config::FieldRef& ref, bool invert, bool& suspect) {
    const Fit as_declared = invert ? fit(1.0, 1.0, 1.0) : fit(1.0, 1.0, 1.0);
    const bool fails = invert ? (as_declared.distances >= enough && as_declared.distance > agreement_m)
                              : (as_declared.rims >= enough && as_declared.below_rim < 0.8);
    if (!fails) return;
    for (Unit u : level_units) {
      if (u == ref.unit) continue;
      const double k = factor(ref.unit, u);
      const Fit other = invert ? fit(1.0, k, 1.0) : fit(1.0, 1.0, k);
      const bool passes = invert ? other.distance <= agreement_m : other.below_rim >= 0.8;
      if (!passes) continue;
      report_unit({&ref}, invert ? "structure inverts" : "rims", ref.unit, u, as_declared, other);
      suspect = true;
      return;
    }
  }

  std::string evidence(const Fit& f) const {
    std::vector<std::string> parts;
    if (f.slopes >= enough) parts.push_back("the median pipe slope is " + fixed(f.slope, f.slope < 0.001 ? 7 : 4));
    if (f.distances >= enough)
      parts.push_back("pipe inverts lie a median " + q(f.distance, Dimension::length) +
                      " from the inverts of the structures they meet");
    if (f.rims >= enough)
      parts.push_back(fixed(100.0 * f.below_rim, 0) + " % of pipe inverts lie below the rims they meet");
    std::string out;
    for (std::size_t i = 0; i < parts.size(); ++i) out += (i ? (i + 1 == parts.size() ? " and " : ", ") : "") + parts[i];
    return out;
  }

  void report_unit(const FieldRefList& refs, const std::string& what, Unit declared, Unit likely, const Fit& as_declared,
                   const Fit& other) {
    std::string names;
    for (const auto* r : refs) names += (names.empty() ? "" : " and ") + r->field;
    Finding f;
    f.code = "UNIT_SUSPECT";
    f.severity = Severity::error;
    f.layer = LayerRole::project;
    f.feature_id = what;
    f.field = refs.front()->field;
    f.message = "looks like the " + what + " " + names + " are in " + sym(likely) + ": declared " + sym(declared) +
                ". Read as " + sym(declared) + ", " + evidence(as_declared) + "; read as " + sym(likely) + ", " +
                evidence(other) + ". Every level, slope and freeboard rests on this unit: check it.";
    findings_.push_back(std::move(f));
  }

  // Why two levels that should agree do not: a unit's factor between them, or something else.
  static std::string cause(double a, double b, const std::string& a_name, const std::string& b_name) {
    if (a > 0.5 && b > 0.5)
      for (Unit u : {Unit::ft, Unit::mm, Unit::cm})
        for (bool a_wrong : {true, false}) {
          const double r = a_wrong ? a / b : b / a;
          if (std::abs(r / units::from_si(1.0, u) - 1.0) < 0.02)
            return "; the " + (a_wrong ? a_name : b_name) + " looks like it is in " + sym(u);
        }
    if (std::abs(a - b) >= 10.0) return "; a difference this large is a typing error, a no-data value or another datum";
    return "";
  }

  void level_finding(const model::Conduit& c, const char* code, const std::string& field, double value, double limit,
                     std::string message) {
    Finding f = topology::conduit_finding(c, code, Severity::warning, std::move(message));
    f.field = field;
    f.value = value;
    f.limit = limit;
    f.dimension = Dimension::length;
    findings_.push_back(std::move(f));
  }

  void per_feature() {
    const double tol = p_.plausibility.level_tolerance_m;
    const auto& pf = p_.pipe_fields;
    const auto& sf = p_.structure_fields;
    const bool pipes_ok = !pipes_suspect_;
    for (std::size_t ci = 0; ci < net_.conduits.size() && pipes_ok; ++ci) {
      const auto& c = net_.conduits[ci];
      if (!model::marched(c) || c.force_main) continue;
      for (bool up : {true, false}) {
        const auto inv = up ? c.invert_up_m : c.invert_down_m;
        if (!inv) continue;
        const auto& st = net_.structures[up ? c.from : c.to];
        const std::string field = (up ? pf.invert_up : pf.invert_down).field;
        const std::string end = up ? "upstream" : "downstream";
        const std::string lies = "the " + end + " invert " + field + " of pipe " + c.id + " (" + q(*inv, Dimension::length) + ") lies ";
        if (st.invert_m && !structure_invert_suspect_ && *inv < *st.invert_m - tol)
          level_finding(c, "INVERT_BELOW_STRUCTURE", field, *inv, *st.invert_m,
                        lies + q(*st.invert_m - *inv, Dimension::length) + " below the invert " + sf.invert.field +
                            " of structure " + st.id + " (" + q(*st.invert_m, Dimension::length) +
                            ") that it meets; a pipe cannot lie below the structure's floor, so one of the two is wrong" +
                            cause(*inv, *st.invert_m, "pipe's invert", "structure's invert"));
        if (st.rim_m && !rim_suspect_ && *inv > *st.rim_m + tol)
          level_finding(c, "INVERT_ABOVE_RIM", field, *inv, *st.rim_m,
                        lies + q(*inv - *st.rim_m, Dimension::length) + " above the rim of structure " + st.id + " (" +
                            q(*st.rim_m, Dimension::length) +
                            "); a buried pipe lies below the ground, so one of the two is wrong" +
                            cause(*inv, *st.rim_m, "pipe's invert", "rim"));
      }
    }
    if (pipes_ok) steps();
  }

  void steps() {
    const double step_max = p_.plausibility.invert_step_max_m;
    for (std::size_t s = 0; s < net_.structures.size() && s < topo_.nodes.size(); ++s) {
      const auto& node = topo_.nodes[s];
      if (node.main_outflow == model::no_index) continue;
      const auto& out = net_.conduits[node.main_outflow];
      if (!out.invert_up_m || out.force_main) continue;
      for (std::size_t ci : node.inflows) {
        const auto& in = net_.conduits[ci];
        if (!in.invert_down_m || in.force_main) continue;
        const double step = *in.invert_down_m - *out.invert_up_m;  // > 0: a drop into the structure's outflow
        if (std::abs(step) <= step_max) continue;
        const auto& st = net_.structures[s];
        const std::string where = step > 0.0 ? " above " : " below ";
        Finding f = topology::structure_finding(
            st, "INVERT_STEP", Severity::warning,
            "at structure " + st.id + ", pipe " + in.id + " arrives with its outlet invert at " +
                q(*in.invert_down_m, Dimension::length) + ", " + q(std::abs(step), Dimension::length) + where +
                "the inlet invert of pipe " + out.id + " that leaves it (" + q(*out.invert_up_m, Dimension::length) +
                "), more than the plausible " + q(step_max, Dimension::length) +
                " (plausibility.invert_step_max)" +
                (step < 0.0 ? "; the water would have to climb it to leave, which surcharges everything upstream" : "") +
                "; one of the two inverts is likely wrong" +
                cause(*in.invert_down_m, *out.invert_up_m, "arriving pipe's invert", "leaving pipe's invert"));
        f.field = p_.pipe_fields.invert_down.field;
        f.value = step;
        f.limit = step_max;
        f.dimension = Dimension::length;
        findings_.push_back(std::move(f));
      }
    }
  }

  const config::Project& p_;
  const model::Network& net_;
  const topology::Topology& topo_;
  Findings& findings_;
  std::vector<double> slopes_;
  std::vector<End> ends_;
  bool pipes_suspect_ = false, structure_invert_suspect_ = false, rim_suspect_ = false;
};

}  // namespace

void check_levels(const config::Project& project, const model::Network& network, const topology::Topology& topology,
                  Findings& findings) {
  LevelChecks(project, network, topology, findings).run();
}

void check_declared_units(const config::Project& project, Findings& findings) {
  const auto& pf = project.pipe_fields;
  const auto& sf = project.structure_fields;
  const std::vector<std::pair<std::string, const config::FieldRef*>> refs{
      {"pipes.fields.diameter", &pf.diameter},       {"pipes.fields.width", &pf.width},
      {"pipes.fields.height", &pf.height},           {"pipes.fields.invert_up", &pf.invert_up},
      {"pipes.fields.invert_down", &pf.invert_down}, {"pipes.fields.invert_up_fallback", &pf.invert_up_fallback},
      {"pipes.fields.invert_down_fallback", &pf.invert_down_fallback},
      {"pipes.fields.length", &pf.length},           {"pipes.fields.flow", &pf.flow},
      {"structures.fields.rim", &sf.rim},            {"structures.fields.invert", &sf.invert},
      {"structures.fields.diameter", &sf.diameter},  {"structures.fields.inflow", &sf.inflow},
      {"structures.fields.tailwater", &sf.tailwater}};
  auto family = [](Unit u) { return u == Unit::us_ft ? Unit::ft : u; };  // ft and US survey ft: one name
  for (const auto& [key, ref] : refs) {
    if (!ref->mapped()) continue;
    const auto named = units::unit_named_in(ref->field);
    if (!named || units::dimension_of(*named) != units::dimension_of(ref->unit)) continue;
    if (family(*named) == family(ref->unit)) continue;
    Finding f;
    f.code = "UNIT_NAME_CONFLICT";
    f.severity = Severity::warning;
    f.layer = LayerRole::project;
    f.feature_id = key;
    f.field = ref->field;
    f.message = "the name of " + ref->field + " (" + key + ") says " + sym(*named) + ", but the project declares " +
                sym(ref->unit) + "; if the name is right, every value of it is off by a factor of " +
                fixed(units::to_si(1.0, *named) / units::to_si(1.0, ref->unit), 4);
    findings.push_back(std::move(f));
  }
}

}  // namespace rimline::run
