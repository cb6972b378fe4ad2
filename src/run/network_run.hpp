#pragma once
// The network solve inside one check: which components go to it, the rounds of design flows by
// the solved split, the pipes turned the way they flow, each tailwater case's solve and march, and
// the findings. Private to src/run.
//
// Design flows in a solved component. The accumulation (flows/, catchment flows) needs flows
// before levels; the solve needs each structure's net inflow. Round 1 accumulates along the
// pipes' digitised/invert direction (loops cut) with diversions split by capacity; a structure's
// net inflow is what leaves it minus what arrives (its own catchments and inflow, and the change
// of the Rational or sanitary flow there), or its own flow where no pipe leaves it yet. The solve
// gives flows and directions; the pipes are turned the way they flow; the next round accumulates
// along them with each diversion split as the solve split it, and so on until no pipe's design
// flow differs from its solved flow by more than 0.1 L/s (or 0.1 % of the largest flow). With
// given pipe flows (pipe_field) the net inflows come from them once, and one solve settles it.
#include <functional>
#include <string>
#include <vector>

#include "rimline/run/check_run.hpp"
#include "rimline/solve/network_solve.hpp"
#include "rimline/topology/components.hpp"

namespace rimline::run {

class NetworkRun {
 public:
  NetworkRun(const config::Project& project, CheckRun& run);
  bool active() const { return !solved_.empty(); }

  using DesignFlowsFn = std::function<flows::DesignFlows(const flows::SplitRule&)>;
  // Design flows settled with the solve for the first tailwater case `first`; `own_flow` per
  // structure is what it sends down when nothing reaches it. Turns the solved pipes the way they
  // flow (and the topology with them).
  flows::DesignFlows settle(const DesignFlowsFn& design, const std::vector<double>& own_flow,
                            const solve::MarchOptions& first);

  // The march of one tailwater case with that case's solved flows (case 0: those of settle()).
  solve::MarchResult march_case(std::size_t case_index, const solve::MarchOptions& options, const std::string& label);

  // Findings of the solve; topology findings its results replace are dropped (see the .cpp).
  void finish(Findings& findings);

 private:
  std::vector<double> net_inflow(const std::vector<double>& flow, const std::vector<double>& own) const;
  solve::NetworkSolution solve_case(const solve::MarchOptions& options, const solve::NetworkSolution* warm) const;
  // Turns the solved pipes of `net` the way `sol` says they flow; returns the flows along them.
  std::vector<double> orient(model::Network& net, topology::Topology& topo, const solve::NetworkSolution& sol) const;
  NetworkSolveCase case_figures(const solve::NetworkSolution& sol, const std::string& label) const;
  // Components whose first solve did not converge leave the solve: the march takes them with the
  // capacity split and loop cuts (the method without the solve), and the findings say so.
  void fall_back(solve::NetworkSolution& sol);

  const config::Project& project_;
  CheckRun& run_;
  topology::Components components_;
  std::vector<std::size_t> solved_;               // indices into components_.list
  std::vector<solve::NetworkComponent> problem_;  // the solved components as the solve takes them
  solve::NetworkInputs inputs_;
  solve::NetworkSolveOptions options_;
  std::vector<double> share_;                     // per conduit: share of its upstream structure's outflow
  solve::NetworkSolution first_;                  // the first case's solution (warm start of the others)
  Findings case_findings_;                        // FLOW_DIRECTION_CASES
  struct Fallback {
    std::size_t component;             // index into components_.list
    solve::ComponentReport report;
  };
  std::vector<Fallback> fallbacks_;
};

}  // namespace rimline::run
