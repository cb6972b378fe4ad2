#include "rimline/report/profile_path.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>

#include "rimline/error.hpp"
#include "rimline/finding.hpp"

namespace rimline::report {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();

bool in_tree(const topology::Topology& topo, std::size_t s) {
  return s < topo.nodes.size() && topo.nodes[s].tree != model::no_index;
}

// The rise of a structure's main outflow, or 0 at an outfall.
double main_outflow_rise_m(const model::Network& net, const topology::Topology& topo, std::size_t s) {
  const std::size_t c = topo.nodes[s].main_outflow;
  return c == model::no_index ? 0.0 : hydraulics::rise_m(net.conduits[c].section);
}

}  // namespace

std::vector<double> distance_to_outfall_m(const model::Network& network, const topology::Topology& topo) {
  std::vector<double> dist(network.structures.size(), nan);
  // Tree::structures lists each structure after every structure it drains into, so its main
  // outflow's downstream end already has its distance.
  for (const auto& tree : topo.trees) {
    for (std::size_t s : tree.structures) {
      const std::size_t c = topo.nodes[s].main_outflow;
      if (c == model::no_index) {
        dist[s] = 0.0;
        continue;
      }
      const double below = dist[network.conduits[c].to];
      dist[s] = std::isfinite(below) ? below + network.conduits[c].length_m : nan;
    }
  }
  return dist;
}

ProfilePath path_from(const model::Network& network, const topology::Topology& topo, std::size_t structure) {
  ProfilePath p;
  if (structure >= network.structures.size()) return p;
  std::vector<std::size_t> up_structures{structure};
  std::vector<std::size_t> up_conduits;
  if (in_tree(topo, structure)) {
    p.tree = topo.nodes[structure].tree;
    std::size_t s = structure;
    // A main-outflow chain ends at the outfall; the bound guards against a malformed topology.
    for (std::size_t guard = 0; guard <= network.conduits.size(); ++guard) {
      const std::size_t c = topo.nodes[s].main_outflow;
      if (c == model::no_index) break;
      up_conduits.push_back(c);
      s = network.conduits[c].to;
      up_structures.push_back(s);
    }
    p.outfall = s;
  }
  p.structures.assign(up_structures.rbegin(), up_structures.rend());
  p.conduits.assign(up_conduits.rbegin(), up_conduits.rend());
  p.station_m.push_back(0.0);
  for (std::size_t c : p.conduits) p.station_m.push_back(p.station_m.back() + network.conduits[c].length_m);
  return p;
}

std::vector<ProfilePath> longest_paths(const model::Network& network, const topology::Topology& topo) {
  const auto dist = distance_to_outfall_m(network, topo);
  std::vector<ProfilePath> out;
  for (const auto& tree : topo.trees) {
    std::size_t head = model::no_index;
    for (std::size_t s : tree.structures) {
      if (!std::isfinite(dist[s])) continue;
      if (head == model::no_index || dist[s] > dist[head] || (dist[s] == dist[head] && s < head)) head = s;
    }
    if (head == model::no_index || head == tree.outfall) continue;
    out.push_back(path_from(network, topo, head));
  }
  return out;
}

std::vector<ProfilePath> trunk_paths(const model::Network& network, const topology::Topology& topo,
                                     double min_rise_m) {
  std::vector<ProfilePath> out;
  for (const auto& tree : topo.trees) {
    std::vector<ProfilePath> in_this_tree;
    for (std::size_t s : tree.structures) {
      if (main_outflow_rise_m(network, topo, s) < min_rise_m) continue;
      const auto& inflows = topo.nodes[s].inflows;
      const bool fed_by_trunk = std::any_of(inflows.begin(), inflows.end(), [&](std::size_t c) {
        return topo.nodes[network.conduits[c].from].main_outflow == c &&
               hydraulics::rise_m(network.conduits[c].section) >= min_rise_m;
      });
      if (!fed_by_trunk) in_this_tree.push_back(path_from(network, topo, s));
    }
    std::stable_sort(in_this_tree.begin(), in_this_tree.end(),
                     [](const ProfilePath& a, const ProfilePath& b) { return a.length_m() > b.length_m(); });
    for (auto& p : in_this_tree) out.push_back(std::move(p));
  }
  return out;
}

std::string selection_text(const DrawingOptions& options, units::System system) {
  switch (options.selection) {
    case PathSelection::longest:
      return "Each profile follows the longest path (by plan length) of one outfall tree, from its head down the "
             "main outflows to the outfall.";
    case PathSelection::from_structure:
      return "The profile runs from structure " + options.from_structure_id + " down the main outflows to its outfall.";
    case PathSelection::trunks:
      return "One profile per trunk of pipes at least " +
             render_message(q(options.min_rise_m, units::Dimension::length), system) +
             " high, from where the trunk begins down to the outfall.";
  }
  return "";
}

std::vector<ProfileSheet> plan_sheets(const model::Network& network, const topology::Topology& topo,
                                      std::size_t case_count, const DrawingOptions& options) {
  std::vector<ProfilePath> paths;
  switch (options.selection) {
    case PathSelection::longest: paths = longest_paths(network, topo); break;
    case PathSelection::trunks: paths = trunk_paths(network, topo, options.min_rise_m); break;
    case PathSelection::from_structure: {
      const std::size_t s = model::find_structure(network, options.from_structure_id);
      if (s == model::no_index) {
        std::vector<std::string> ids;
        for (const auto& st : network.structures) ids.push_back(st.id);
        const std::string near = closest_name(options.from_structure_id, ids);
        throw Error(ErrorKind::bad_config, ErrorContext{"", "structures", options.from_structure_id, ""},
                    "profile start structure not in the network" + (near.empty() ? "" : "; did you mean " + near + "?"));
      }
      ProfilePath p = path_from(network, topo, s);
      if (!p.conduits.empty()) paths.push_back(std::move(p));
      break;
    }
  }
  std::vector<ProfileSheet> sheets;
  std::map<std::size_t, int> per_outfall;
  for (const auto& p : paths) {
    for (std::size_t k = 0; k < case_count; ++k) sheets.push_back({p, k, ++per_outfall[p.outfall]});
  }
  return sheets;
}

std::vector<bool> drawn_conduits(const model::Network& network, const topology::Topology& topo,
                                 const DrawingOptions& options) {
  std::vector<bool> drawn(network.conduits.size(), false);
  for (const auto& sheet : plan_sheets(network, topo, 1, options))
    for (std::size_t ci : sheet.path.conduits) drawn[ci] = true;
  return drawn;
}

}  // namespace rimline::report
