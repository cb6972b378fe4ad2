// Orientation: ids decide where given; else an outfall end, else the inverts, else the
// digitising direction (rule in build.hpp). A pipe is never turned against an outfall just
// because its inverts disagree: that is an adverse slope for a reviewer, not a digitising slip.
#include "rimline/topology/orient.hpp"

#include <algorithm>
#include <cmath>
#include <utility>

#include "rimline/topology/finding_text.hpp"

namespace rimline::topology {

using model::Conduit;
using model::no_index;
using model::Point2;

void turn_geometry(Conduit& c) {
  std::swap(c.up_point, c.down_point);
  const Point2 up = c.up_direction;
  c.up_direction = {-c.down_direction.x, -c.down_direction.y};
  c.down_direction = {-up.x, -up.y};
  std::reverse(c.vertices.begin(), c.vertices.end());
  std::reverse(c.vertex_z_m.begin(), c.vertex_z_m.end());
}

void turn_conduit(Conduit& c) {
  turn_geometry(c);
  std::swap(c.invert_up_m, c.invert_down_m);
}

namespace {

bool rises(const Conduit& c, double tolerance_m) {
  return c.invert_up_m && c.invert_down_m && *c.invert_up_m < *c.invert_down_m - tolerance_m;
}

class Orienter {
 public:
  Orienter(model::Network& n, const Connection& k, const TopologyOptions& o, Findings& f)
      : net_(n), con_(k), opt_(o), findings_(f) {}

  std::size_t run() {
    std::size_t turned = 0;
    for (std::size_t i = 0; i < net_.conduits.size(); ++i) turned += orient(i) ? 1 : 0;
    return turned;
  }

 private:
  bool is_outfall(std::size_t s) const {
    return s != no_index && net_.structures[s].kind == model::StructureKind::outfall;
  }
  std::string name(std::size_t s) const { return s == no_index ? "?" : label(net_.structures[s], s); }

  bool orient(std::size_t i) {
    Conduit& c = net_.conduits[i];
    const std::size_t first = con_.at_first[i], last = con_.at_last[i];
    bool turned = false;
    if (con_.ids[i] != IdDirection::none) {
      turned = con_.ids[i] == IdDirection::last_vertex_upstream;
      if (turned) turn_geometry(c);
      set_ends(c, turned ? last : first, turned ? first : last);
      if (turned)
        findings_.push_back(conduit_finding(c, "TOPOLOGY_REVERSED_GEOMETRY", Severity::info,
                                            "pipe " + label(c, i) + " was digitised against its from/to ids; its line was turned to run from " +
                                                name(c.from) + " to " + name(c.to)));
      if (rises(c, opt_.invert_tolerance_m) && !c.force_main) report_adverse(c, i, "its from/to ids");
    } else {
      const bool outfall_first = is_outfall(first), outfall_last = is_outfall(last);
      std::string reason;
      if (outfall_first != outfall_last) {
        turned = outfall_first;
        reason = "its " + std::string(turned ? "first" : "last") + " end is outfall " + name(turned ? first : last);
      } else if (rises(c, opt_.invert_tolerance_m)) {
        turned = true;
        reason = "its inverts fall from " + fixed(*c.invert_down_m, 3) + " m at its last vertex to " +
                 fixed(*c.invert_up_m, 3) + " m at its first";
      }
      if (turned) turn_conduit(c);
      set_ends(c, turned ? last : first, turned ? first : last);
      if (turned)
        findings_.push_back(conduit_finding(c, "REVERSED", Severity::info,
                                            "pipe " + label(c, i) + " was digitised against the flow (" + reason +
                                                "); turned so it runs from " + name(c.from) + " to " + name(c.to)));
      if (outfall_first != outfall_last && rises(c, opt_.invert_tolerance_m) && !c.force_main)
        report_adverse(c, i, "the outfall at its downstream end");
    }
    c.reversed = c.reversed || turned;
    return turned;
  }

  void set_ends(Conduit& c, std::size_t from, std::size_t to) const {
    c.from = from;
    c.to = to;
    if (from != no_index) c.from_id = net_.structures[from].id;
    if (to != no_index) c.to_id = net_.structures[to].id;
  }

  void report_adverse(const Conduit& c, std::size_t i, const std::string& direction_source) {
    const double rise = *c.invert_down_m - *c.invert_up_m;
    const double length = c.length_m > 0.0 ? c.length_m : c.geometry_length_m;
    Finding f = conduit_finding(c, "ADVERSE_SLOPE", Severity::warning,
                                "pipe " + label(c, i) + ": inverts rise " + fixed(rise, 3) + " m along the flow from " +
                                    name(c.from) + " (" + fixed(*c.invert_up_m, 3) + " m) to " + name(c.to) + " (" +
                                    fixed(*c.invert_down_m, 3) + " m) that " + direction_source +
                                    " fix; kept in that direction");
    if (length > 0.0) {
      f.value = -rise / length;
      f.limit = 0.0;
      f.dimension = units::Dimension::slope;
    }
    findings_.push_back(std::move(f));
  }

  model::Network& net_;
  const Connection& con_;
  const TopologyOptions& opt_;
  Findings& findings_;
};

}  // namespace

std::size_t orient_conduits(model::Network& network, const Connection& connection, const TopologyOptions& options,
                            Findings& findings) {
  return Orienter(network, connection, options, findings).run();
}

}  // namespace rimline::topology
