#pragma once
// Draws one profile scene into a panel of a sheet: legend and scale line, the profile plot
// (ground, freeboard line, pipes, structures, HGL, EGL, finding markers), the data band
// (rim, invert, HGL at each structure; size and slope of each pipe) and the finding list.
//
// Line language (weight and dash carry the meaning, colour only helps, so a greyscale copy reads):
//   ground / rim       heavy solid          required freeboard  thin dotted, below the rim
//   pipe crown         thin solid           pipe invert         medium solid; pipe bore shaded
//   HGL                medium long dash     EGL                 thin dash-dot
//   structure          white box invert..rim; dashed box: rim unknown (drawn a little above the crown)
//   findings           error: solid triangle; warning: hollow triangle; info: hollow circle,
//                      numbered in station order and listed under the band
// Labels that would collide are thinned: the outfall, the head and flagged structures first.
#include "report/canvas.hpp"
#include "report/drawing_scale.hpp"
#include "report/profile_scene.hpp"

namespace rimline::report {

struct Panel {
  double left_mm = 0.0, top_mm = 0.0, width_mm = 400.0, height_mm = 240.0;
};

// The plot frame draw_profile will use for this scene in this panel.
PlotFrame profile_frame(const ProfileScene& scene, const Panel& panel);

// Returns the frame used.
PlotFrame draw_profile(const ProfileScene& scene, const Panel& panel, Canvas& canvas);

// Pens of the profile lines (shared with the legend and the HTML key).
Pen pen_for(Stroke s);
std::string stroke_label(Stroke s, const ProfileScene& scene);

// "H 1:2000  V 1:200  vertical exaggeration 10:1"
std::string scale_text(const PlotFrame& f);

// Douglas-Peucker (1973) on sheet coordinates: the points of `pts` farther than `tolerance_mm`
// from the chords of the kept ones, ends always kept. A trunk's HGL carries a step point every
// few metres, thousands per line, most closer than a hundredth of a millimetre to that chord;
// dropping them leaves the drawing unchanged at any zoom a reader uses and keeps a city's
// profiles small and quick to write.
inline constexpr double drawing_tolerance_mm = 0.01;
std::vector<Pt> simplified_polyline(const std::vector<Pt>& pts, double tolerance_mm);

}  // namespace rimline::report
