// Proposing which field plays which role, from the field names the trade uses and the value
// ranges found. Every rule here is common practice, no source: the proposal is a starting point
// that the user reviews in the starter project file.
#include <algorithm>
#include <cctype>
#include <functional>
#include <regex>

#include "gis/value_checks.hpp"
#include "rimline/mapping/inspect.hpp"

namespace rimline::mapping {
// The readers' value checks and GDAL handles are shared with the gis stage.
namespace detail = gis::detail;
namespace {

using detail::format_number;
using units::Unit;

struct Name {
  std::string upper;                // "UPSTREAM_IL"
  std::vector<std::string> tokens;  // {"UPSTREAM", "IL"}
  std::string joined;               // "UPSTREAMIL"
  bool has(std::initializer_list<const char*> words) const {
    for (const auto& t : tokens)
      for (const char* w : words)
        if (t == w) return true;
    return false;
  }
};

Name parse_name(const std::string& field) {
  Name n;
  std::string token;
  for (char c : field) {
    const char u = static_cast<char>(std::toupper(static_cast<unsigned char>(c)));
    n.upper += u;
    if (std::isalnum(static_cast<unsigned char>(c))) {
      token += u;
      n.joined += u;
    } else if (!token.empty()) {
      n.tokens.push_back(std::move(token));
      token.clear();
    }
  }
  if (!token.empty()) n.tokens.push_back(std::move(token));
  return n;
}

const std::regex up_invert(
    "^(PIPE)?(US|UP|UPS|UPSTREAM|UPSTR|START|FROM|IN|BEG)(IL|INV|INVERT|IE|INVLEV|INVERTLEVEL|INVELEV|ELEV)$|"
    "^(IL|INV|INVERT|IE|INVLEV|INVERTLEVEL|ELEV)(US|UP|UPS|UPSTREAM|START|FROM|IN|BEG|1)$");
const std::regex down_invert(
    "^(PIPE)?(DS|DN|DOWN|DOWNSTREAM|DNSTR|END|TO|OUT)(IL|INV|INVERT|IE|INVLEV|INVERTLEVEL|INVELEV|ELEV)$|"
    "^(IL|INV|INVERT|IE|INVLEV|INVERTLEVEL|ELEV)(DS|DN|DOWN|DOWNSTREAM|END|TO|OUT|2)$");

// The unit a field's name states ("DIA_MM", "LEN_FT"), if any.
std::optional<Unit> unit_in_name(const Name& n) {
  if (n.has({"MM"})) return Unit::mm;
  if (n.has({"IN", "INCH", "INCHES"})) return Unit::in;
  if (n.has({"FT", "FEET"})) return Unit::ft;
  if (n.has({"M"})) return Unit::m;
  if (n.has({"CFS"})) return Unit::cfs;
  if (n.has({"LPS", "LS"})) return Unit::l_s;
  if (n.has({"CMS", "M3S"})) return Unit::m3_s;
  if (n.has({"MGD"})) return Unit::mgd;
  if (n.has({"GPM"})) return Unit::gpm;
  return std::nullopt;
}

struct Candidate {
  const FieldSummary* field;
  Name name;
};

class Proposer {
 public:
  explicit Proposer(const LayerSummary& l) : layer_(l) {
    for (const auto& f : l.fields) candidates_.push_back({&f, parse_name(f.name)});
  }

  // Picks the best unused field scoring > 0 for `role`.
  const Candidate* pick(const std::function<int(const Candidate&)>& score) {
    const Candidate* best = nullptr;
    int best_score = 0;
    for (const auto& c : candidates_) {
      if (std::find(used_.begin(), used_.end(), c.field->name) != used_.end()) continue;
      const int s = score(c);
      if (s > best_score) {
        best = &c;
        best_score = s;
      }
    }
    if (best) used_.push_back(best->field->name);
    return best;
  }

  void add(MappingProposal& m, const std::string& role, const Candidate* c, std::optional<Unit> unit,
           std::string reason) {
    if (c) m.fields.push_back({role, c->field->name, unit, std::move(reason)});
  }

  const LayerSummary& layer_;
  std::vector<Candidate> candidates_;
  std::vector<std::string> used_;
};

bool numeric(const Candidate& c) { return c.field->numeric(); }

int id_score(const Candidate& c) {
  if (!c.field->unique.value_or(false) || c.field->null_count > 0) return 0;
  if (c.name.upper == "ID") return 10;
  if (c.name.has({"OBJECTID", "FID", "MI_PRINX", "OID"}) || c.name.upper == "OBJECTID") return 2;
  for (const char* w : {"FACILITY", "ASSET", "PIPE", "MH", "NODE", "UNIT", "STRUCT", "MANHOLE", "GIS"})
    if (c.name.upper.find(w) != std::string::npos) return 9;
  return 5;
}

// Size fields: the unit from the name, else from the median value.
std::pair<std::optional<Unit>, std::string> size_unit(const Candidate& c) {
  if (const auto u = unit_in_name(c.name)) return {u, "the name states " + std::string(units::unit_symbol(*u))};
  const double m = c.field->median_positive.value_or(0.0);
  if (m <= 0.0) return {Unit::mm, "no positive values; unit unknown, check"};
  if (m < 3.0) return {Unit::m, "median " + format_number(m) + " looks like metres"};
  if (m <= 120.0) return {Unit::in, "median " + format_number(m) + " looks like inches"};
  return {Unit::mm, "median " + format_number(m) + " looks like millimetres"};
}

// A length field against the lines' own lengths [m].
std::pair<Unit, std::string> length_unit(const Candidate& c) {
  if (const auto u = unit_in_name(c.name)) return {*u, "the name states " + std::string(units::unit_symbol(*u))};
  if (const auto r = c.field->median_ratio_to_line_length) {
    const std::string said = "median ratio to the line length in metres " + detail::format_fixed(*r, 3);
    if (*r > 0.8 && *r < 1.25) return {Unit::m, said + ": metres"};
    if (*r > 2.6 && *r < 4.1) return {Unit::ft, said + ": feet"};
    if (*r > 800.0 && *r < 1250.0) return {Unit::mm, said + ": millimetres"};
    return {Unit::m, said + ": unit unclear, check"};
  }
  return {Unit::m, "unit unknown, check"};
}

}  // namespace

const FieldProposal* MappingProposal::find(const std::string& role) const {
  for (const auto& f : fields)
    if (f.role == role) return &f;
  return nullptr;
}

MappingProposal propose_mapping(const LayerSummary& layer) {
  MappingProposal m;
  m.kind = layer.lines() ? LayerKind::pipes : layer.points() ? LayerKind::structures : LayerKind::other;
  if (m.kind == LayerKind::other) return m;
  Proposer p(layer);
  const bool pipes = m.kind == LayerKind::pipes;

  p.add(m, "id", p.pick(id_score), std::nullopt, "unique, never empty");
  if (pipes) {
    // Node ids: the usual names, or a pair X / X2 (upstream, downstream).
    const Candidate* from = p.pick([](const Candidate& c) {
      return c.name.has({"FROM", "USNODE", "UPNODE", "STARTNODE", "USMH", "UPMH", "NODE1"}) ||
                     c.name.joined == "USNODE" || c.name.joined == "FROMNODE" || c.name.joined == "UPSTREAMNODE" ||
                     c.name.joined == "STARTNODE" || c.name.joined == "USMH"
                 ? 8
                 : 0;
    });
    std::string pair_reason = "the name says upstream";
    if (!from) {
      for (const auto& c : p.candidates_)
        for (const auto& d : p.candidates_)
          if (!from && d.name.upper == c.name.upper + "2" && !c.field->unique.value_or(false)) {
            from = p.pick([&](const Candidate& x) { return x.field == c.field ? 1 : 0; });
            pair_reason = "with " + d.field->name + ", a pair of node ids read as upstream, downstream";
          }
    }
    p.add(m, "from", from, std::nullopt, pair_reason);
    const Candidate* to = p.pick([&](const Candidate& c) {
      if (from && c.name.upper == from->name.upper + "2") return 9;
      return c.name.upper == "TO" || c.name.joined == "TONODE" || c.name.joined == "DSNODE" ||
                     c.name.joined == "DOWNSTREAMNODE" || c.name.joined == "ENDNODE" || c.name.joined == "DSMH" ||
                     c.name.has({"DSNODE", "DNNODE", "ENDNODE", "DSMH", "NODE2"})
                 ? 8
                 : 0;
    });
    p.add(m, "to", to, std::nullopt,
          from && to && to->name.upper == from->name.upper + "2" ? "the pair's second id" : "the name says downstream");
    p.add(m, "shape", p.pick([](const Candidate& c) {
      return !numeric(c) && c.name.has({"SHAPE", "SECTION", "XSECTION", "PIPESHAPE"}) &&
                     !c.name.has({"LENGTH", "LEN", "AREA", "LENG"})
                 ? 8
                 : 0;
    }),
          std::nullopt, "text field named for the section shape; list its values in [pipes.shapes]");
    p.add(m, "material", p.pick([](const Candidate& c) {
      return !numeric(c) && (c.name.has({"MATERIAL", "MAT", "MATL", "PIPEMAT"}) || c.name.joined == "PIPEMATERIAL") ? 8
                                                                                                                    : 0;
    }),
          std::nullopt, "the name says material");
    p.add(m, "manning_n", p.pick([](const Candidate& c) {
      const double med = c.field->median.value_or(-1.0);
      return numeric(c) && med >= 0.008 && med <= 0.05 &&
                     c.name.has({"MANNING", "MANNINGS", "MANN", "N", "NVALUE", "ROUGHNESS", "ROUGH"})
                 ? 8
                 : 0;
    }),
          std::nullopt, "values in the range of Manning's n");
  }
  auto size_role = [&](const char* role, std::initializer_list<const char*> words) {
    const Candidate* c = p.pick([&](const Candidate& x) { return numeric(x) && x.name.has(words) ? 8 : 0; });
    if (!c) return;
    const auto [unit, why] = size_unit(*c);
    p.add(m, role, c, unit, why);
  };
  size_role("diameter", {"DIA", "DIAM", "DIAMETER", "DIAMETRE", "SIZE", "PIPESIZE"});
  if (pipes) {
    size_role("width", {"WIDTH", "SPAN", "W", "BREADTH"});
    size_role("height", {"HEIGHT", "RISE", "H"});
  }
  // Elevations: the name's unit, else the length field's, else the CRS's, else inches -> feet.
  std::optional<Unit> system_length;
  std::string system_why;
  if (pipes) {
    const Candidate* len = p.pick([](const Candidate& c) {
      return numeric(c) && c.name.has({"LENGTH", "LEN", "LENGTHM", "PIPELENGTH", "LENG"}) && !c.name.has({"SHAPE"}) ? 8
                                                                                                                    : 0;
    });
    if (len) {
      const auto [unit, why] = length_unit(*len);
      p.add(m, "length", len, unit, why);
      if (why.find("check") == std::string::npos) {
        system_length = unit == Unit::mm ? Unit::m : unit;
        system_why = "as the length field";
      }
    }
  }
  if (!system_length && layer.crs_metres_per_unit != 1.0) {
    system_length =
        std::abs(layer.crs_metres_per_unit - units::metres_per_us_survey_foot) < 1e-9 ? Unit::us_ft : Unit::ft;
    system_why = "as the CRS's unit";
  }
  if (!system_length)
    if (const auto* d = m.find("diameter"); d && d->unit == Unit::in) {
      system_length = Unit::ft;
      system_why = "diameters are in inches, so US units";
    }
  auto level_role = [&](const char* role, const std::function<bool(const Name&)>& matches) {
    const Candidate* c = p.pick([&](const Candidate& x) { return numeric(x) && matches(x.name) ? 8 : 0; });
    if (!c) return;
    if (const auto u = unit_in_name(c->name))
      p.add(m, role, c, u, "the name states " + std::string(units::unit_symbol(*u)));
    else if (system_length)
      p.add(m, role, c, system_length, system_why);
    else
      p.add(m, role, c, Unit::m, "metres assumed: nothing says otherwise, check");
  };
  if (pipes) {
    level_role("invert_up", [](const Name& n) { return std::regex_match(n.joined, up_invert); });
    level_role("invert_down", [](const Name& n) { return std::regex_match(n.joined, down_invert); });
    const Candidate* q = p.pick([](const Candidate& c) {
      return numeric(c) && c.name.has({"FLOW", "Q", "DISCHARGE", "QDESIGN", "DESIGNFLOW", "QPEAK"}) ? 6 : 0;
    });
    if (q) {
      const auto u = unit_in_name(q->name);
      const bool flow_unit = u && units::dimension_of(*u) == units::Dimension::flow;
      const Unit guess = system_length == Unit::ft || system_length == Unit::us_ft ? Unit::cfs : Unit::m3_s;
      p.add(m, "flow", q, flow_unit ? *u : guess,
            flow_unit ? "the name states " + std::string(units::unit_symbol(*u)) : "unit unknown, check");
    }
    const auto* w = m.find("width");
    const auto* h = m.find("height");
    if (w && h && !m.find("shape")) {
      const auto& hf = *std::find_if(layer.fields.begin(), layer.fields.end(),
                                     [&](const FieldSummary& f) { return f.name == h->field; });
      m.shape_from_height = hf.zero_fraction.value_or(0.0) > 0.0 && hf.max.value_or(0.0) > 0.0;
    }
  } else {
    p.add(m, "type", p.pick([](const Candidate& c) {
      return !numeric(c) && c.name.has({"TYPE", "KIND", "CLASS", "SUBTYPE", "FEATURETYPE"}) ? 6 : 0;
    }),
          std::nullopt, "text field named for the structure type; list its values in [structures.types]");
    level_role("rim", [](const Name& n) {
      return n.has({"RIM", "COVER", "GROUND", "GL", "CL", "LID", "TOP", "RIMELEV", "SURFACE", "RL"});
    });
    level_role("invert", [](const Name& n) { return n.has({"INV", "IL", "INVERT", "SUMP", "BOTTOM", "IE"}); });
    p.add(m, "loss_k", p.pick([](const Candidate& c) {
      return numeric(c) && c.name.has({"K", "LOSS", "KLOSS", "LOSSK"}) ? 6 : 0;
    }),
          std::nullopt, "the name says loss coefficient");
  }
  return m;
}

}  // namespace rimline::mapping
