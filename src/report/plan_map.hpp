#pragma once
// The plan map of report.html: the whole network seen from above as inline SVG (no network request,
// no script needed to read it), pipes and structures coloured by result (status_palette.hpp), every
// structure or pipe with a criteria or data warning or error ringed where it is on the ground, outfalls
// (squares) and pump stations (diamonds) labelled, a scale bar and a grid-north arrow. A small inline
// script shows a clicked feature's figures with links to its profile and its exception rows.
// A city-sized export (more than `detailed_features` structures and pipes, feature_links.hpp) is drawn simplified:
// structures grouped into grid cells and pipes as one segment between cells, each group in its worst
// status; the page says so, and the tables and results.gpkg keep every feature.
#include <cstddef>
#include <ostream>
#include <string>
#include <vector>

#include "report/feature_links.hpp"
#include "rimline/run/check_run.hpp"

namespace rimline::report {

// The network's extent in the run CRS (structures and every pipe vertex; non-finite points skipped),
// at least 1 m each way; a network with no finite point gives the unit square.
struct PlanExtent {
  double x0 = 0.0, y0 = 0.0, x1 = 1.0, y1 = 1.0;
  double dx() const { return x1 - x0 > 1.0 ? x1 - x0 : 1.0; }
  double dy() const { return y1 - y0 > 1.0 ? y1 - y0 : 1.0; }
};
PlanExtent network_extent(const model::Network& network);

struct PlanGeometry {
  double min_x = 0.0, min_y = 0.0, max_x = 1.0, max_y = 1.0;  // run CRS, metres
  double width = 1000.0, height = 700.0;                       // drawing units (SVG viewBox)
  double margin = 36.0;
  double scale = 1.0;  // drawing units per metre
  double sx(double x) const { return margin + (x - min_x) * scale; }
  double sy(double y) const { return height - margin - (y - min_y) * scale; }  // north up
};
PlanGeometry plan_geometry(const model::Network& network, double width, double max_height);

// A "nice" scale-bar length (1, 2 or 5 x 10^n) in the report's length unit, at most `max_units` long.
double scale_bar_length(double max_units);

struct PlanMap {
  std::string svg;          // <svg id="plan-svg" ...>...</svg>
  std::string data_json;    // feature key -> title, values, links (for the script)
  std::size_t structures_drawn = 0, conduits_drawn = 0;
  bool simplified = false;
  std::string note;         // what was simplified, for the page
};
PlanMap plan_map(const run::CheckRun& run, const FeatureLinks& links);

// The <section id="plan"> of report.html, written to `out` as it is made; as a string for tests.
void write_plan_map_section(std::ostream& out, const run::CheckRun& run, const FeatureLinks& links);
std::string plan_map_section(const run::CheckRun& run, const FeatureLinks& links);

}  // namespace rimline::report
