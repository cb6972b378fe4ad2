#pragma once
// One whole check: read -> network -> topology -> flows -> march (per tailwater level) -> checks.
// Adds TOPOLOGY_NO_OUTFALL (warning, structures): where some structure is an outfall (typed, or named in
// [outfalls]), a tree that ends at a manhole, inlet, junction or derived structure; it is marched from
// there as if that were the outfall. The project's own checks (flow source, unknown ids, assumed
// outfalls, tailwater below an outfall, a run that checked nothing) are in src/run/project_checks.hpp,
// the level and unit cross-checks in src/run/level_checks.hpp, [ground] in src/run/ground_rims.hpp.
// No files are written here; report/ writes the outputs from a CheckRun.
#include <cstddef>
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "rimline/checks/checks.hpp"
#include "rimline/flows/catchment_flows.hpp"
#include "rimline/flows/design_flows.hpp"
#include "rimline/config/project.hpp"
#include "rimline/gis/read_network.hpp"
#include "rimline/solve/force_main.hpp"
#include "rimline/solve/march.hpp"
#include "rimline/topology/build.hpp"

namespace rimline::run {

struct RunOptions {
  std::optional<units::System> report_units;          // overrides [project] units
  std::vector<double> tailwater_levels_m;             // overrides [tailwater] levels
  bool dry_run = false;                               // read and build the network only
  // The pipes whose every water-surface step point is kept (those that will be drawn), asked once
  // the network is connected; the others keep only what the checks and result layers use.
  // Unset: every pipe keeps all its points.
  std::function<std::vector<bool>(const model::Network&, const topology::Topology&)> detailed_conduits;
  // A proposal's changes (src/connections): to the network once it is connected (pipes resized,
  // re-laid), and to the design flows each time they are made (inflows added at structures, split at
  // diversions by the rule of that round of design flows: the network solve's hydraulic split too).
  std::function<void(model::Network&, Findings&)> amend_network;
  std::function<void(const model::Network&, const topology::Topology&, const flows::SplitRule&,
                     std::vector<double>& flow_m3_s, Findings&)>
      amend_flows;
  // Told the name of each stage as it starts ("reading", "connecting", "march 1/2", ...).
  std::function<void(const std::string& stage)> progress;
};

// The label of a figure or finding that is the same in every case of a sweep.
inline constexpr const char* every_case = "every tailwater case";

// Which case of a sweep governs a figure of one feature; `every`: it is the same in every case.
struct EnvelopeCase {
  std::size_t index = 0;
  bool every = false;
};

// One tailwater level of a sweep.
struct Case {
  // "tailwater 3.200 m" (with " (outfall fields where given)" when some outfalls have their own),
  // "outfall tailwater fields", or "free outfall"; a q() token inside, rendered per report.
  std::string label;
  double tailwater_m = std::numeric_limits<double>::quiet_NaN();
  solve::MarchResult march;
  // Criteria findings of this case on the features the drawings can show (every one when every
  // pipe keeps its step points); the run's `findings` holds the worst of each over the cases.
  // Held once: the others went to the run's list (a city's run has ~10^6 of them).
  Findings findings;
  std::size_t criteria_count = 0;  // criteria findings of this case, drawn or not
};

// The network solve in one run (solve/network_solve.hpp): which components it took, how the
// design flows settled with it, and how each tailwater case converged.
struct NetworkSolveCase {
  std::string label;
  int iterations = 0;                     // the most Newton steps any piece took
  int evaluations = 0;                    // water-surface profiles the solve computed
  double max_continuity_error_m3_s = 0.0; // over every structure solved
  double max_level_change_m = 0.0;        // the last Newton step's largest level change
  bool converged = true;
  std::size_t flipped = 0;                // pipes flowing the other way than in the first case
};

struct NetworkSolveSummary {
  std::string split;              // how diversions were split: "hydraulic", "capacity", "field", "fixed"
  bool all_components = false;    // [network_solve] components = "all": trees too
  std::size_t components = 0, structures = 0, conduits = 0, loops = 0, diversions = 0;
  std::size_t unknowns = 0;       // levels Newton solved (the rest follow from known flows)
  std::size_t newton_pieces = 0;
  std::size_t against_source_count = 0;
  std::size_t fallback_components = 0;  // did not converge: marched with the capacity split instead
  int design_flow_rounds = 0;     // rounds of design flows by the solved split and solve
  bool design_flows_converged = true;
  double design_flow_change_m3_s = 0.0;  // largest change of a pipe's flow in the last round
  std::vector<NetworkSolveCase> cases;
  std::vector<char> solved_conduit;  // per conduit: its flow and direction come from the solve
  // Per structure, the solve's own level in the first tailwater case (NaN where it needed none); the
  // march of the solved flows reproduces it (to the root solves' tolerance).
  std::vector<double> level_m;
  std::vector<char> against_source;  // per conduit: it flows against its from/to ids or digitising
};

// A file the run read, with the SHA-256 of its bytes ("" when the source is not a file, e.g. a database).
struct InputFile {
  std::string path;
  std::string sha256;
};

struct CheckRun {
  config::Project project;
  gis::ReadResult read;
  std::vector<InputFile> inputs;  // the project file, then every file read (hashed once, beside the march)
  topology::Topology topology;
  flows::DesignFlows flows;
  // Flows modes "rational" / "sanitary": the catchments with their outlets and the per-pipe design
  // figures (contributing area, C A, Tc, intensity; population, peaking factor, infiltration).
  std::vector<model::Catchment> catchments;
  std::optional<flows::CatchmentFlows> catchment_flows;
  checks::Criteria criteria;
  checks::CriteriaOverrides overrides;  // per structure / pipe id
  solve::MarchOptions march_options;
  double kinematic_viscosity_m2_s = 0.0;  // of water at [methods] water_temperature (Darcy-Weisbach)
  units::System report_units = units::System::si;
  std::vector<Case> cases;
  // The sweep's envelope, each figure from the case that governs it (SI figures in the cases):
  std::vector<std::size_t> envelope_structure_case;  // per structure: the case with the highest HGL
  std::vector<bool> envelope_structure_every;        //   ... and whether the HGL is the same in every case
  // Per conduit, its levels, depths, velocities at the ends, regime and surcharged length: the case where
  // its HGL stands highest against its crown (surcharged cases first: the SURCHARGED finding's measure).
  std::vector<std::size_t> envelope_conduit_case;
  std::vector<bool> envelope_conduit_every;
  std::vector<EnvelopeCase> envelope_velocity_high;  // per conduit: the highest velocity along it (VELOCITY_HIGH)
  std::vector<EnvelopeCase> envelope_velocity_low;   // per conduit: the self-cleansing velocity (VELOCITY_LOW)
  // Pump stations (aligned with project.pump_stations) and the force-main profiles they use. The
  // design flow of each station (its largest operating flow) runs down its force main into the
  // gravity network; the receiving structure's HGL (the highest over the tailwater cases) is the
  // discharge level of the next operating-point solve, repeated until the flow changes < 0.5 %.
  std::vector<model::ForceMainProfile> force_main_profiles;
  std::vector<solve::StationResult> pump_stations;
  std::vector<double> wet_well_inflow_m3_s;  // design inflow reaching each station's wet well
  int pump_iterations = 0;
  NetworkSolveSummary network;
  Findings data_findings;  // reading, topology, flows, march problems
  Findings findings;       // every finding of the run: data + the worst criteria finding per feature and code
  std::vector<bool> data_finding;  // aligned with findings: true for those of data_findings
  // Aligned with findings: the case a finding comes from (its label, every_case, the labels of the
  // cases a march problem arose in joined by "; "), or "" for those that do not depend on the case
  // (reading, topology, flows).
  std::vector<std::string> finding_case;
};

CheckRun run_check(const config::Project& project, const RunOptions& options);

// True when no gravity pipe was solved in any case and no pump station laid out (NOTHING_CHECKED):
// the command line exits with a code of its own.
bool checked_nothing(const CheckRun& run);

// How bad a criteria finding is, to keep the worst over the cases and list the worst first:
// lower freeboard, velocity (minimum) or cover is worse, higher surcharge, velocity or ratio is worse.
double badness(const Finding& f);

// The envelope case of a structure's figures and of a conduit's level figures (index 0, not
// `every`, where a run assembled by hand lacks them).
EnvelopeCase structure_envelope(const CheckRun& run, std::size_t structure);
EnvelopeCase conduit_envelope(const CheckRun& run, std::size_t conduit);

// The label of an envelope case ("tailwater 3.200 m", every_case), a q() token inside.
std::string envelope_label(const CheckRun& run, std::size_t case_index, bool every);

// The freeboard a structure must keep (the run's, or its own override).
double required_freeboard_m(const CheckRun& run, std::size_t structure);

// Status of each structure in the envelope, for the result layer.
std::string envelope_status(const CheckRun& run, std::size_t structure);

}  // namespace rimline::run
