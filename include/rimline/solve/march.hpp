#pragma once
// The HGL/EGL march: from each outfall's tailwater upstream through every conduit and structure.
//
// At a structure the loss h = K V_o^2/2g multiplies the velocity head at the outflow pipe's inlet
// (V_o from the profile there: partly full or full); with several outflows the highest requirement
// governs. The structure's energy level is E = EGL at the outflow pipe's inlet + h, and its water
// level (HGL) is E too: the velocity in a structure is taken as negligible. How E meets the pipes
// arriving there is the structure-energy bookkeeping (hydraulics::StructureEnergy):
//   whole_loss (default; the HEC-22 method always, by its own definition): h is the whole energy
//     loss across the structure, so each arriving pipe's EGL at its outlet is E and its HGL there
//     E - V^2/2g (its own velocity head kept); where E is below the pipe's critical energy, critical
//     depth governs at its outlet and it falls freely into the structure.
//   still_pool: E is each arriving pipe's HGL at its outlet (or critical depth where E lies below
//     it), so its velocity head is spent in the pool as well.
// Outfalls and pump wet wells are receiving water: their level is the arriving pipes' HGL at the
// outlet under both bookkeepings (the exit velocity head is spent there). The EGL never rises
// downstream, and loss_budget() adds each term back up to a structure's level exactly.
#include <functional>
#include <limits>
#include <map>
#include <string>
#include <utility>
#include <vector>

#include "rimline/finding.hpp"
#include "rimline/hydraulics/gvf.hpp"
#include "rimline/hydraulics/losses.hpp"
#include "rimline/model/network.hpp"
#include "rimline/topology/build.hpp"

namespace rimline::solve {

enum class TailwaterMode { fixed, free, higher };

struct MarchOptions {
  TailwaterMode tailwater_mode = TailwaterMode::higher;
  double tailwater_m = std::numeric_limits<double>::quiet_NaN();  // NaN: none (free unless an outfall field gives one)
  hydraulics::StructureLossMethod loss_method = hydraulics::StructureLossMethod::constant_k;
  hydraulics::Benching benching = hydraulics::Benching::flat;
  std::map<std::string, double> k_by_type;  // structure kind name -> K
  double default_k = 0.5;                   // common practice, no source
  double default_structure_diameter_m = 1.2;
  // The bookkeeping of every structure, and of those that differ by structure index. The HEC-22
  // method has its own (whole_loss); config rejects still_pool with it.
  hydraulics::StructureEnergy structure_energy = hydraulics::StructureEnergy::whole_loss;
  std::map<std::size_t, hydraulics::StructureEnergy> structure_energy_at;
  hydraulics::GvfOptions gvf;
  // Water level of pump wet wells by structure index: the pump-on level, the highest the incoming
  // sewers see in operation. A wet well without one takes the inflows freely (the pipes' own outlet levels).
  std::map<std::size_t, double> wet_well_level_m;
  // Worker threads over the network's connected components (0: one per core). Results do not
  // depend on it; small networks run on one thread.
  unsigned threads = 0;
  // Pipes whose every step point is kept (the drawn ones); the others keep the outlet, the inlet
  // and the point of highest velocity, all that the checks and the result layers use. Empty: all.
  std::vector<bool> keep_step_points;
};

// The number of threads march() uses for a network of `conduits` pipes.
unsigned march_threads(const MarchOptions& options, std::size_t conduits);

struct ConduitResult {
  std::string note;                    // why not solved, or a caveat
  double flow_m3_s = 0.0;
  double slope = 0.0;                  // (invert_up - invert_down) / length
  double capacity_m3_s = std::numeric_limits<double>::quiet_NaN();  // full flow at slope; NaN if slope <= 0
  double invert_up_m = 0.0;            // as used (a structure invert may stand in for a missing one)
  double invert_down_m = 0.0;
  hydraulics::ConduitProfile profile;  // step points, outlet first
  double downstream_level_m = 0.0;     // the water level (HGL) of what it discharged into
  // The two flags last, side by side: 232 bytes a result instead of 240 (one per pipe of a city).
  bool solved = false;
  // Whether its outlet was set by the structure's energy level (whole_loss: it keeps its velocity
  // head to the outlet) rather than by the water level (still pool, outfall, wet well).
  bool outlet_energy_control = false;
};

struct StructureResult {
  // The flags and the bookkeeping first, packed into one word: 88 bytes a result instead of 104.
  bool solved = false;
  bool outfall = false;
  bool pumped = false;                  // a pump wet well: only force mains leave it
  bool tailwater_from_field = false;    // outfalls: the tailwater came from the outfall's own field
  hydraulics::StructureEnergy energy = hydraulics::StructureEnergy::whole_loss;  // its bookkeeping
  double hgl_m = std::numeric_limits<double>::quiet_NaN();  // water level = energy level (no velocity)
  double egl_m = std::numeric_limits<double>::quiet_NaN();
  double tailwater_m = std::numeric_limits<double>::quiet_NaN();  // outfalls: the tailwater given (NaN: none)
  std::size_t governing_outflow = model::no_index;  // conduit that set the level (diversions)
  double loss_m = 0.0;                  // structure loss on the governing outflow
  double k_effective = 0.0;
  double outflow_velocity_m_s = 0.0;    // V_o at the governing outflow's inlet: K multiplies V_o^2/2g
  std::vector<hydraulics::LossTerm> loss_terms;
};

struct MarchResult {
  std::vector<ConduitResult> conduits;     // aligned with network.conduits
  std::vector<StructureResult> structures; // aligned with network.structures
  Findings findings;                       // march problems (blocked, not converged)
};

MarchResult march(const model::Network& network, const topology::Topology& topo, const std::vector<double>& flow_m3_s,
                  const MarchOptions& options);

// Each structure's place in a downstream-first order (the order a serial march solves them: every
// structure after all those its outflows drain into); structures the march never reaches come last.
std::vector<std::size_t> march_rank(const model::Network& network, const topology::Topology& topo);

// What remarch solved again (indices), in the order it did.
struct Remarched {
  std::vector<std::size_t> structures;
  std::vector<std::size_t> conduits;
};

// Scratch kept between calls, so that a call costs what it touches, not the network's size.
struct RemarchScratch {
  std::vector<char> queued;        // per structure
  std::vector<char> flow_changed;  // per conduit
};

// What the caller of remarch may add to the walk (all optional).
struct RemarchUndo {  // the results as they were before the walk changed them, in the order it did
  std::vector<std::pair<std::size_t, StructureResult>> structures;
  std::vector<std::pair<std::size_t, ConduitResult>> conduits;
};
struct RemarchHooks {
  // May leave pipe `conduit` (whose flow did not change) and everything upstream of it as they
  // are, with its downstream structure now at `level_m`, when the caller knows that nothing there
  // can matter for it. Those results then belong to another level (remarch notices that when a
  // later walk reaches the pipe: it is solved again there unless `enough` says so again).
  std::function<bool(std::size_t conduit, double level_m)> enough;
  // Called after each structure is solved again (with the pipes into it): true ends the walk there,
  // leaving the rest of the part a full walk would solve as it was (to be undone by the caller).
  std::function<bool(const Remarched& touched)> stop;
  RemarchUndo* undo = nullptr;  // appended to, for the caller to restore the march
};

// Solves again, in place, the part of a march that a change of the flows in `changed` conduits
// reaches: `result` holds a march with the old flows, `flow_m3_s` the new ones. The downstream
// structure of each changed conduit is solved again, then upstream in `rank` order each conduit
// whose flow changed or which was solved against a level of its downstream structure more than
// `still_m` away from the new one, and its upstream structure; where the level stays within
// `still_m` the walk ends (the pipes upstream see what they saw). With still_m = 0 and no hooks the
// result equals a full march with the new flows; the findings of the part solved again
// (INVERT_ESTIMATED, ...) go to `findings`. Returns false when `hooks.stop` ended the walk early.
bool remarch(const model::Network& network, const topology::Topology& topo, const std::vector<double>& flow_m3_s,
             const MarchOptions& options, const std::vector<std::size_t>& rank, const std::vector<std::size_t>& changed,
             double still_m, MarchResult& result, Remarched& touched, RemarchScratch& scratch, Findings& findings,
             const RemarchHooks& hooks = {});

// The energy budget from a structure down to its outfall along the governing outflows: each
// item adds to the tailwater so that the sum equals the structure's HGL (EGL) exactly, and carries
// what a reviewer needs to redo it by hand.
struct BudgetItem {
  // "tailwater" or "wet_well" (the start), "exit" (from a pipe's outlet EGL down to the level of
  // what it discharges into), "conduit" (the EGL drop along a pipe: friction, and a jump's loss),
  // "structure" (K V_o^2/2g)
  std::string kind;
  std::string feature_id;
  double head_m = 0.0;
  double k = std::numeric_limits<double>::quiet_NaN();             // structure: the K applied
  double velocity_m_s = std::numeric_limits<double>::quiet_NaN();  // structure: V_o; exit: the outlet velocity
  double velocity_head_m = std::numeric_limits<double>::quiet_NaN();  // V^2/2g of that velocity
  double length_m = std::numeric_limits<double>::quiet_NaN();      // conduit: its length (Sf = friction / L)
  double jump_m = 0.0;                                             // conduit: of head_m, lost in a jump
  std::string basis;  // one phrase: how the item arises ("K V_o^2/2g, whole loss across the structure", ...)
};
std::vector<BudgetItem> loss_budget(const model::Network& network, const MarchResult& result, std::size_t structure);

}  // namespace rimline::solve
