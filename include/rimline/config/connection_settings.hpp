#pragma once
// [comparison] and [headroom] of the project file (docs/project-file.md): when a change of a level,
// velocity or ratio counts as none, and how each structure's connection headroom is searched. SI.
#include <optional>
#include <string>
#include <vector>

namespace rimline::config {

// How existing exceptions bound a structure's headroom.
enum class ExistingExceptions {
  no_worse,  // an existing exception may stay but must not worsen by more than the tolerance (default)
  none       // no exception at all may stand on the part the added flow reaches
};

struct ComparisonSettings {
  // A level (HGL, freeboard, surcharge above the crown) that moves less than this counts as unchanged:
  // 3 mm, the level a survey of inverts and rims is given to; common practice, no source.
  double level_tolerance_m = 0.003;
  // Velocities: the 0.01 m/s they are reported to; common practice, no source.
  double velocity_tolerance_m_s = 0.01;
  // Capacity ratio (Q / Q full): one percentage point; common practice, no source.
  double ratio_tolerance = 0.01;
  // Finding codes left out of the comparison and the headroom (e.g. SURCHARGED where the agency
  // allows a surcharged pipe as long as the freeboard holds).
  std::vector<std::string> ignore_codes;
};

struct HeadroomSettings {
  std::vector<std::string> structures;  // empty: every structure a pipe leaves
  ExistingExceptions existing = ExistingExceptions::no_worse;
  // The search stops when the bracket is narrower than the larger of these (0.1 L/s or 1 %).
  double precision_m3_s = 1.0e-4;
  double relative_precision = 0.01;
  // Search ceiling; unset: 10 times the largest design flow of the network, at least 0.1 m3/s.
  std::optional<double> limit_m3_s;
};

struct ConnectionSettings {
  ComparisonSettings comparison;
  HeadroomSettings headroom;
};

}  // namespace rimline::config
