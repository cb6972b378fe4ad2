#pragma once
// One gravity pipe as the network solve sees it: its discharge as a function of the levels of
// the two structures it joins, by the same physics as the march (hydraulics::compute_profile
// for the pipe, structure_level.hpp for the structure the water leaves). Private to src/solve.
//
// The level the upstream structure must hold to pass Q into a downstream level h,
//   G(Q; h) = EGL at the pipe's inlet (compute_profile) + structure loss at the inlet,
// rises with Q from G(0; h) = max(h, both inverts) (still water). The pipe flows from the higher
// end; Q(h_up, h_down) inverts G in Q by a safeguarded regula falsi (Illinois) in Q^2, on which G
// is close to linear (friction and velocity heads grow with Q^2), inside a bracket that always
// holds the root. Below G(0; h) the pipe carries nothing (its water stands below an invert).
#include <cstddef>
#include <limits>
#include <vector>

#include "rimline/hydraulics/gvf.hpp"
#include "rimline/model/network.hpp"
#include "rimline/solve/march.hpp"

namespace rimline::solve::detail {

struct PipeLaw {
  std::size_t conduit = model::no_index;
  std::size_t a = model::no_index, b = model::no_index;  // structures at its from / to ends
  double invert_a_m = 0.0, invert_b_m = 0.0;             // as used (estimates stand in for missing ones)
  // Head per (m3/s)^2 of the pipe running full (friction over its length, exit and entrance velocity
  // heads): the first guess of a flow and the scale of the regularised derivative near no flow.
  double resistance_s2_m5 = 1.0;
};

// The structure loss where water leaves a structure through a pipe. The constant-K method needs
// only K; the bend and HEC-22 methods also see the pipes arriving there, taken from the flows of
// the previous solve (lagged).
class StructureRelation {
 public:
  // `outlet`: per structure, it holds a level of its own (an outfall or wet well: a still pool).
  StructureRelation(const model::Network& network, const MarchOptions& options, const std::vector<bool>& outlet);
  // Pipes arriving at each structure, for the bend and HEC-22 methods: flow signed along from -> to.
  void set_inflows(const std::vector<std::size_t>& structures, const std::vector<std::size_t>& conduits,
                   const std::vector<double>& signed_flow_m3_s, const std::vector<double>& deflection_deg);
  double loss_m(std::size_t structure, std::size_t outflow, double flow_m3_s,
                const hydraulics::ProfilePoint& inlet) const;
  // As the march: a pipe arriving at a structure whose loss is the whole loss across it keeps its
  // velocity head to its outlet (its outlet EGL is the structure's level); into a still pool, an
  // outfall or a wet well its outlet water level is the structure's level.
  bool outlet_energy_control(std::size_t structure) const;

 private:
  const model::Network& net_;
  const MarchOptions& opt_;
  const std::vector<bool>& outlet_;
  std::vector<std::vector<hydraulics::StructureInflow>> inflows_;  // by structure (empty: none known)
};

// The level needed at the end the water leaves (`forward`: from a to b) to pass q >= 0 into
// level h_down at the other end.
struct Required {
  double level_m = 0.0;
  bool free_outlet = false;    // the outlet falls freely (the downstream level does not matter)
  double outlet_control_m = 0.0;  // outlet invert + critical depth: the free-outlet limit
};
Required required_level(const model::Network& network, const PipeLaw& pipe, bool forward, double q, double h_down,
                        const StructureRelation& loss, const hydraulics::GvfOptions& gvf);

// Still water: the level at which the pipe starts to carry flow from the `forward` end.
double threshold_level(const PipeLaw& pipe, bool forward, double h_down);

struct PipeFlow {
  double q = 0.0;      // signed along a -> b
  double dq_da = 0.0;  // derivatives by the end levels (regularised near no flow)
  double dq_db = 0.0;
  // The same with the chord from no flow (Q over its excess head above the still-water level)
  // instead of the tangent: for a Q^2 law twice the tangent; steps from far away do not overshoot.
  double chord_da = 0.0;
  double chord_db = 0.0;
  bool dead = false;   // no flow either way
  bool converged = true;
  // Where the outlet falls freely (the level at the receiving end does not matter up to it): the
  // receiving end's level at which it would start to (outlet invert + critical depth); NaN otherwise.
  double free_outlet_until_m = std::numeric_limits<double>::quiet_NaN();
  int evaluations = 0;
};

struct PipeFlowSettings {
  double level_tolerance_m = 1.0e-7;  // |G(Q) - h_up| accepted
  double derivative_step_m = 2.0e-3;  // finite difference of G in the downstream level
  double regularise_head_m = 1.0e-5;  // the derivative is capped at its value for this excess head
  int max_evaluations = 80;
};

// The flow for end levels h_a, h_b; `derivatives` off skips the two extra profiles of the slopes.
PipeFlow pipe_flow(const model::Network& network, const PipeLaw& pipe, double h_a, double h_b, double q_guess,
                   const StructureRelation& loss, const hydraulics::GvfOptions& gvf, const PipeFlowSettings& settings,
                   bool derivatives = true);

// The level at the downstream end (`forward`: b) for which the pipe passes q > 0 from an upstream
// level h_up; where the outlet falls freely, outlet invert + critical depth.
double downstream_level(const model::Network& network, const PipeLaw& pipe, bool forward, double q, double h_up,
                        const StructureRelation& loss, const hydraulics::GvfOptions& gvf);

}  // namespace rimline::solve::detail
