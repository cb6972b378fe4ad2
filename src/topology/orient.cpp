// Orientation: ids decide where given; else an outfall end, else the inverts, else the
// digitising direction (rule in build.hpp). A pipe is never turned against an outfall just
// because its inverts disagree: that is an adverse slope for a reviewer, not a digitising slip.
#include "rimline/topology/orient.hpp"

#include <algorithm>
#include <cmath>
#include <utility>
#include <vector>

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

// Why a pipe runs the way it does after orientation.
enum class Basis : unsigned char {
  ids, ids_turned, ids_inverts_turned, outfall, outfall_turned, inverts_turned, digitised, neighbours
};

bool turned_basis(Basis b) {
  return b == Basis::ids_turned || b == Basis::ids_inverts_turned || b == Basis::outfall_turned ||
         b == Basis::inverts_turned;
}

class Orienter {
 public:
  Orienter(model::Network& n, const Connection& k, const TopologyOptions& o, Findings& f)
      : net_(n), con_(k), opt_(o), findings_(f) {}

  std::size_t run() {
    const std::size_t nc = net_.conduits.size();
    basis_.resize(nc);
    geometry_turned_.assign(nc, false);
    for (std::size_t i = 0; i < nc; ++i) decide(i);
    keep_neighbours_flow();
    std::size_t turned = 0;
    for (std::size_t i = 0; i < nc; ++i) turned += report(i) ? 1 : 0;
    return turned;
  }

 private:
  bool is_outfall(std::size_t s) const {
    return s != no_index && net_.structures[s].kind == model::StructureKind::outfall;
  }
  std::string name(std::size_t s) const { return s == no_index ? "?" : label(net_.structures[s], s); }

  // Rules 1 and 2a-2c of build.hpp.
  void decide(std::size_t i) {
    Conduit& c = net_.conduits[i];
    const std::size_t first = con_.at_first[i], last = con_.at_last[i];
    Basis b = Basis::digitised;
    if (con_.ids[i] != IdDirection::none) {
      b = con_.ids[i] == IdDirection::last_vertex_upstream ? Basis::ids_turned : Basis::ids;
    } else if (is_outfall(first) != is_outfall(last)) {
      b = is_outfall(first) ? Basis::outfall_turned : Basis::outfall;
    } else if (rises(c, opt_.invert_tolerance_m) && !c.force_main) {  // a force main may rise: it is pumped
      b = Basis::inverts_turned;
    }
    if (b == Basis::ids_turned) turn_geometry(c);
    if (b == Basis::outfall_turned || b == Basis::inverts_turned) turn_conduit(c);
    bool turned = turned_basis(b);  // the line now runs against its digitising
    // flow_direction = "inverts": the ids connected the pipe; its inverts say which way it flows.
    if ((b == Basis::ids || b == Basis::ids_turned) && opt_.direction_from_inverts && !c.force_main &&
        rises(c, opt_.invert_tolerance_m)) {
      turn_conduit(c);
      turned = !turned;
      b = Basis::ids_inverts_turned;
    }
    basis_[i] = b;
    geometry_turned_[i] = turned;
    set_ends(c, turned ? last : first, turned ? first : last);
  }

  // Rule 2b yields to the network: a pipe turned by its inverts alone is turned back when,
  // as digitised, it carries on the flow of its neighbours at both ends (another pipe flows
  // into its first structure and another flows out of its last). Turning such a pipe would
  // make a false outfall upstream of it; it is an adverse slope. Counts are taken from the
  // directions of the first pass, so the result does not depend on the order of the pipes.
  void keep_neighbours_flow() {
    std::vector<std::size_t> in(net_.structures.size(), 0), out(net_.structures.size(), 0);
    for (const Conduit& c : net_.conduits) {
      if (c.from == no_index || c.to == no_index || c.from == c.to) continue;
      ++out[c.from];
      ++in[c.to];
    }
    for (std::size_t i = 0; i < net_.conduits.size(); ++i) {
      if (basis_[i] != Basis::inverts_turned) continue;
      Conduit& c = net_.conduits[i];
      const std::size_t first = con_.at_first[i], last = con_.at_last[i];  // c now runs last -> first
      if (first == no_index || last == no_index || first == last) continue;
      if (in[first] >= 2 && out[last] >= 2) {
        turn_conduit(c);
        set_ends(c, first, last);
        basis_[i] = Basis::neighbours;
        geometry_turned_[i] = false;
      }
    }
  }

  bool report(std::size_t i) {
    Conduit& c = net_.conduits[i];
    const Basis b = basis_[i];
    const bool turned = geometry_turned_[i];
    if (b == Basis::ids_inverts_turned)
      findings_.push_back(conduit_finding(c, "REVERSED", Severity::info,
                                          "pipe " + label(c, i) + " names " + name(c.to) + " as its from-structure and " +
                                              name(c.from) + " as its to-structure, but its inverts fall from " +
                                              fixed(*c.invert_up_m, 3) + " m at " + name(c.from) + " to " +
                                              fixed(*c.invert_down_m, 3) + " m at " + name(c.to) +
                                              " (flow_direction = \"inverts\"); it runs from " + name(c.from) +
                                              " to " + name(c.to)));
    if (b == Basis::ids_turned)
      findings_.push_back(conduit_finding(c, "TOPOLOGY_REVERSED_GEOMETRY", Severity::info,
                                          "pipe " + label(c, i) + " was digitised against its from/to ids; its line was turned to run from " +
                                              name(c.from) + " to " + name(c.to)));
    if (b == Basis::outfall_turned || b == Basis::inverts_turned) {
      const std::string reason =
          b == Basis::outfall_turned
              ? "its first end is outfall " + name(c.to)
              : "its inverts fall from " + q(*c.invert_up_m, units::Dimension::length) + " at its last vertex to " +
                    q(*c.invert_down_m, units::Dimension::length) + " at its first";
      findings_.push_back(conduit_finding(c, "REVERSED", Severity::info,
                                          "pipe " + label(c, i) + " was digitised against the flow (" + reason +
                                              "); turned so it runs from " + name(c.from) + " to " + name(c.to)));
    }
    if (rises(c, opt_.invert_tolerance_m) && !c.force_main) {
      if (b == Basis::ids || b == Basis::ids_turned) report_adverse(c, i, "its from/to ids fix");
      if (b == Basis::outfall || b == Basis::outfall_turned) report_adverse(c, i, "the outfall at its downstream end fixes");
      if (b == Basis::neighbours) report_adverse(c, i, "the pipes flowing into and out of its ends fix");
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
                                "pipe " + label(c, i) + ": inverts rise " + q(rise, units::Dimension::length) + " along the flow from " +
                                    name(c.from) + " (" + q(*c.invert_up_m, units::Dimension::length) + ") to " + name(c.to) +
                                    " (" + q(*c.invert_down_m, units::Dimension::length) + ") that " + direction_source +
                                    "; kept in that direction");
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
  std::vector<Basis> basis_;
  std::vector<bool> geometry_turned_;
};

}  // namespace

std::size_t orient_conduits(model::Network& network, const Connection& connection, const TopologyOptions& options,
                            Findings& findings) {
  return Orienter(network, connection, options, findings).run();
}

}  // namespace rimline::topology
