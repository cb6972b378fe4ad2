#pragma once
// One palette for the result status of structures and pipes, shared by the plan map in report.html
// and the default styles stored in results.gpkg (layer_styles), so the map on screen and the layers
// in a desktop GIS read alike. Failing statuses are warm and dark, passing ones cool, unknown grey;
// the map also tells them apart by size and outline, so greyscale print keeps the distinction.
#include <array>
#include <string_view>

namespace rimline::report {

struct StatusColour {
  std::string_view status;  // as written in results.gpkg's `status` column / the map's data-status
  std::string_view label;   // legend text
  std::string_view hex;     // "#rrggbb"
  int r, g, b;
};

// Structures: results.gpkg `structures.status` (checks::structure_status).
inline constexpr std::array<StatusColour, 5> structure_palette{{
    {"flooded", "Flooded: HGL above the rim", "#8f1313", 143, 19, 19},
    {"freeboard", "Short of the required freeboard", "#d9480f", 217, 72, 15},
    {"ok", "Freeboard met", "#1f6f8b", 31, 111, 139},
    {"unknown_rim", "No rim: freeboard not checked", "#7a8088", 122, 128, 136},
    {"not_checked", "Not reached by the march", "#b8bdc3", 184, 189, 195},
}};

// Pipes: surcharged anywhere along it (the envelope), running below the crown, or not solved.
inline constexpr std::array<StatusColour, 3> conduit_palette{{
    {"surcharged", "Surcharged: HGL above the crown", "#c27c0e", 194, 124, 14},
    {"ok", "HGL below the crown", "#1f6f8b", 31, 111, 139},
    {"not_checked", "Not solved", "#b8bdc3", 184, 189, 195},
}};

// Force mains, drawn apart from gravity pipes.
inline constexpr StatusColour force_main_colour{"force_main", "Force main", "#6a3d9a", 106, 61, 154};

// The colour of a status (an unknown status takes the palette's last, "not checked" grey).
inline const StatusColour& structure_colour(std::string_view status) {
  for (const auto& c : structure_palette)
    if (c.status == status) return c;
  return structure_palette.back();
}

inline const StatusColour& conduit_colour(std::string_view status) {
  if (status == "force_main") return force_main_colour;
  for (const auto& c : conduit_palette)
    if (c.status == status) return c;
  return conduit_palette.back();
}

}  // namespace rimline::report
