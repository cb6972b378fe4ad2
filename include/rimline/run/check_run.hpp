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
  // re-laid), and to the design flows each time they are made (inflows added at structures).
  std::function<void(model::Network&, Findings&)> amend_network;
  std::function<void(const model::Network&, const topology::Topology&, std::vector<double>& flow_m3_s, Findings&)>
      amend_flows;
  // Told the name of each stage as it starts ("reading", "connecting", "march 1/2", ...).
  std::function<void(const std::string& stage)> progress;
};

// One tailwater level of a sweep.
struct Case {
  std::string label;       // "TW 12.400 m" or "free outfall"
  double tailwater_m = std::numeric_limits<double>::quiet_NaN();
  solve::MarchResult march;
  // Criteria findings of this case on the features the drawings can show (every one when every
  // pipe keeps its step points); the run's `findings` holds the worst of each over the cases.
  // Held once: the others went to the run's list (a city's run has ~10^6 of them).
  Findings findings;
  std::size_t criteria_count = 0;  // criteria findings of this case, drawn or not
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
  units::System report_units = units::System::si;
  std::vector<Case> cases;
  std::vector<std::size_t> envelope_structure_case;  // per structure: the case with the highest HGL
  std::vector<std::size_t> envelope_conduit_case;    // per conduit: the case with the highest inlet HGL
  // Pump stations (aligned with project.pump_stations) and the force-main profiles they use. The
  // design flow of each station (its largest operating flow) runs down its force main into the
  // gravity network; the receiving structure's HGL (the highest over the tailwater cases) is the
  // discharge level of the next operating-point solve, repeated until the flow changes < 0.5 %.
  std::vector<model::ForceMainProfile> force_main_profiles;
  std::vector<solve::StationResult> pump_stations;
  std::vector<double> wet_well_inflow_m3_s;  // design inflow reaching each station's wet well
  int pump_iterations = 0;
  Findings data_findings;  // reading, topology, flows, march problems
  Findings findings;       // every finding of the run: data + the worst criteria finding per feature and code
  std::vector<bool> data_finding;  // aligned with findings: true for those of data_findings
};

CheckRun run_check(const config::Project& project, const RunOptions& options);

// True when no gravity pipe was solved in any case and no pump station laid out (NOTHING_CHECKED):
// the command line exits with a code of its own.
bool checked_nothing(const CheckRun& run);

// How bad a criteria finding is, to keep the worst over the cases and list the worst first:
// lower freeboard, velocity (minimum) or cover is worse, higher surcharge, velocity or ratio is worse.
double badness(const Finding& f);

// The freeboard a structure must keep (the run's, or its own override).
double required_freeboard_m(const CheckRun& run, std::size_t structure);

// Status of each structure in the envelope, for the result layer.
std::string envelope_status(const CheckRun& run, std::size_t structure);

}  // namespace rimline::run
