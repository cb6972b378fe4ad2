#pragma once
// What one profile drawing shows, in the run's report units, independent of SVG or PDF:
// built once from a CheckRun, a path and a tailwater case, then drawn by either backend.
#include <cstddef>
#include <string>
#include <unordered_map>
#include <vector>

#include "rimline/report/profile_path.hpp"
#include "rimline/run/check_run.hpp"

namespace rimline::report {

struct XY {
  double x = 0.0;  // station (report length unit), 0 at the outfall
  double y = 0.0;  // elevation (report length unit)
};

enum class Stroke { ground, freeboard, invert, crown, hgl, egl };

// A line made of parts: a gap where a value is unknown (no rim, an unsolved pipe).
struct SceneLine {
  Stroke stroke = Stroke::ground;
  std::vector<std::vector<XY>> parts;
};

struct SceneStructure {
  std::string id;
  double station = 0.0;
  double rim = 0.0;     // NaN when unknown
  double invert = 0.0;  // NaN when unknown
  double hgl = 0.0;     // NaN when not solved
  double bottom = 0.0;  // invert, else the lowest pipe invert there; NaN when neither is known
  double crown = 0.0;   // highest crown of the pipes there; NaN when none is known
  bool outfall = false;
};

struct ScenePipe {
  std::string id;
  double station_down = 0.0, station_up = 0.0;
  double invert_down = 0.0, invert_up = 0.0;  // as the march used them
  double rise = 0.0;
  std::string size_text;   // "1500 mm" / "60 in" / "1200 x 900 mm"
  std::string slope_text;  // "0.22 %"
  bool solved = false;
  double jump_station = 0.0;    // hydraulic jump in the pipe; NaN when none
  double jump_elevation = 0.0;  // HGL at the step point nearest the jump
  // The band's pipe figures, rendered in the run's units ("" when unknown):
  std::string flow_text;      // "0.512" (the design flow, m3/s | cfs)
  std::string velocity_text;  // "2.31" (the highest along it, m/s | ft/s)
  std::string length_text;    // "72.0" (m | ft)
};

struct SceneMarker {
  int number = 0;  // 1.. in station order
  double station = 0.0;
  double elevation = 0.0;
  Severity severity = Severity::warning;
  std::string code;
  std::string feature_id;
  std::string text;  // the rendered message
};

struct ProfileScene {
  std::string outfall_id;
  std::string head_id;
  int number = 0;           // n of <outfall-id>-<n>
  std::string case_label;   // rendered, e.g. "tailwater 3.200 m"
  units::System system = units::System::si;
  std::string length_unit;  // "m" | "ft"
  double metres_per_unit = 1.0;
  double freeboard = 0.0;   // required freeboard, report units
  std::vector<SceneStructure> structures;  // outfall first
  std::vector<ScenePipe> pipes;            // outfall's inflow first
  std::vector<SceneLine> lines;            // one per Stroke, in enum order
  std::vector<SceneMarker> markers;        // station order
  double x_min = 0.0, x_max = 1.0, y_min = 0.0, y_max = 1.0;

  std::string name() const { return outfall_id + "-" + std::to_string(number); }
  const SceneLine& line(Stroke s) const { return lines[static_cast<std::size_t>(s)]; }
};

// The findings of a run looked up by the feature they concern, built once per drawing pass so a
// scene costs what its path holds, not what the whole run holds (10^6-pipe exports). Given the
// sheets, only findings of features on them are indexed (a city's 10^6 findings, a few thousand drawn).
class FindingIndex {
 public:
  explicit FindingIndex(const run::CheckRun& run, const std::vector<ProfileSheet>* sheets = nullptr);
  struct Entry {
    std::size_t list;      // case index, or data_list for the run's data findings
    std::size_t position;  // in that list
    const Finding* finding;
  };
  static constexpr std::size_t data_list = static_cast<std::size_t>(-1);

  // Findings that concern (layer, id) in one case: its criteria findings and the data findings.
  std::vector<Entry> concerning(std::size_t case_index, LayerRole layer, const std::string& id) const;

 private:
  std::unordered_map<std::string, std::vector<Entry>> by_feature_;  // key: layer letter + id
};

// The scene of `path` in run.cases[case_index]. Pass an index to share it between scenes.
ProfileScene build_scene(const run::CheckRun& run, const ProfilePath& path, std::size_t case_index, int number,
                         const FindingIndex* index = nullptr);

// Findings of the case (criteria) and of the run (data) that concern a structure or conduit on
// the path, placed at that feature: structures at their station, conduits mid-pipe.
std::vector<SceneMarker> place_findings(const ProfileScene& scene, const Findings& findings, units::System system);

// A pipe's size as the drawings label it ("1500 mm", "60 in", "1200 x 900 mm"); also the results tables'.
std::string pipe_size_text(const hydraulics::Section& section, units::System system);

}  // namespace rimline::report
