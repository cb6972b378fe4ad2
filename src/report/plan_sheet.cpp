#include "report/plan_sheet.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <set>

#include "base/number_text.hpp"
#include "report/feature_links.hpp"
#include "report/feature_locator.hpp"
#include "report/feature_values.hpp"
#include "report/plan_map.hpp"
#include "report/status_palette.hpp"

namespace rimline::report {
namespace {

constexpr double txt = min_text_mm;
const Rgb black{0, 0, 0};

Rgb rgb(const StatusColour& c) { return Rgb{c.r / 255.0, c.g / 255.0, c.b / 255.0}; }


std::vector<Pt> circle(Pt at, double r, int n = 16) {
  std::vector<Pt> v;
  for (int k = 0; k < n; ++k) v.push_back({at.x + r * std::cos(2.0 * M_PI * k / n), at.y + r * std::sin(2.0 * M_PI * k / n)});
  return v;
}

std::vector<Pt> square(Pt at, double r) { return {{at.x - r, at.y - r}, {at.x + r, at.y - r}, {at.x + r, at.y + r}, {at.x - r, at.y + r}}; }

}  // namespace

double round_scale_up(double n) {
  if (!(n > 0.0)) return 1.0;
  const double p = std::pow(10.0, std::floor(std::log10(n)));
  for (double m : {1.0, 1.25, 2.0, 2.5, 5.0, 10.0})
    if (m * p >= n * (1.0 - 1e-9)) return m * p;
  return 10.0 * p;
}

std::string draw_plan_sheet(const run::CheckRun& run, const Panel& panel, Canvas& c) {
  const auto& net = run.read.network;
  const auto sys = run.report_units;
  const double legend_h = 12.0;
  // Fit, then round the scale up to one a reviewer can measure with; centre the plan in the panel.
  double x0 = INFINITY, y0 = INFINITY, x1 = -INFINITY, y1 = -INFINITY;
  auto take = [&](const model::Point2& p) {
    if (std::isfinite(p.x) && std::isfinite(p.y)) x0 = std::min(x0, p.x), y0 = std::min(y0, p.y), x1 = std::max(x1, p.x), y1 = std::max(y1, p.y);
  };
  for (const auto& s : net.structures) take(s.location);
  for (const auto& p : net.conduits)
    for (const auto& v : p.vertices) take(v);
  if (!(x1 >= x0)) x0 = y0 = 0.0, x1 = y1 = 1.0;
  const double dx = std::max(x1 - x0, 1.0), dy = std::max(y1 - y0, 1.0);
  const double mm_per_m = std::min(0.9 * panel.width_mm / dx, (panel.height_mm - legend_h - 16.0) / dy);
  const double n = round_scale_up(1000.0 / mm_per_m);
  const double k = 1000.0 / n;  // mm on paper per metre on the ground
  const double mx = 0.5 * (x0 + x1), my = 0.5 * (y0 + y1);
  const double ox = panel.left_mm + 0.5 * panel.width_mm, oy = panel.top_mm + legend_h + 0.5 * (panel.height_mm - legend_h);
  auto at = [&](const model::Point2& p) { return Pt{ox + (p.x - mx) * k, oy - (p.y - my) * k}; };

  const bool grouped = net.structures.size() + net.conduits.size() > detailed_features;
  const double cell = 1.5;  // mm: a grouped sheet's cell
  auto snap = [&](Pt p) { return Pt{(std::floor(p.x / cell) + 0.5) * cell, (std::floor(p.y / cell) + 0.5) * cell}; };
  c.begin_group("plan-pipes", "");
  std::set<std::pair<std::pair<long, long>, std::pair<long, long>>> drawn;
  for (std::size_t i = 0; i < net.conduits.size(); ++i) {
    const auto& p = net.conduits[i];
    if (p.vertices.size() < 2) continue;
    const std::string status = conduit_status(run, i);
    const auto& col = conduit_colour(status);
    const Pen pen{status == "surcharged" ? 0.7 : 0.35, status == "not_checked" ? std::vector<double>{1.2, 0.8} : std::vector<double>{},
                  rgb(col)};
    if (grouped) {
      Pt a = snap(at(p.vertices.front())), b = snap(at(p.vertices.back()));
      auto key = std::make_pair(std::make_pair(std::lround(a.x * 10), std::lround(a.y * 10)),
                                std::make_pair(std::lround(b.x * 10), std::lround(b.y * 10)));
      if (key.first == key.second || !drawn.insert(key).second) continue;
      c.polyline({a, b}, pen);
      continue;
    }
    std::vector<Pt> pts;
    for (const auto& v : p.vertices) pts.push_back(at(v));
    c.polyline(simplified_polyline(pts, 0.1), pen);
  }
  c.end_group();
  c.begin_group("plan-structures", "");
  for (std::size_t s = 0; s < net.structures.size(); ++s) {
    const auto& st = net.structures[s];
    const bool key = st.kind == model::StructureKind::outfall || st.kind == model::StructureKind::pump_station;
    if (grouped && !key) continue;
    const std::string status = structure_status(run, s);
    const Rgb fill = rgb(structure_colour(status));
    const Pt p = at(st.location);
    if (st.kind == model::StructureKind::outfall) c.polygon(square(p, 1.6), fill, Pen{0.3, {}, black});
    else if (st.kind == model::StructureKind::pump_station)
      c.polygon({{p.x, p.y - 2.0}, {p.x + 2.0, p.y}, {p.x, p.y + 2.0}, {p.x - 2.0, p.y}}, fill, Pen{0.3, {}, black});
    else c.polygon(circle(p, status == "flooded" || status == "freeboard" ? 1.3 : 0.8), fill, Pen{0.15, {}, black});
    if (key || status == "flooded" || status == "freeboard")
      c.text({p.x + 2.6, p.y - 1.6}, st.id + (st.kind == model::StructureKind::outfall ? " (outfall)"
                                                : st.kind == model::StructureKind::pump_station ? " (pump station)" : ""),
             TextStyle{txt, Anchor::start, true, 0.0, black});
  }
  c.end_group();
  // Rings where the warnings and errors are, one per place.
  const FeatureLocator where(run);
  std::map<std::pair<long, long>, Severity> rings;
  for (const auto& f : run.findings) {
    if (f.severity == Severity::info) continue;
    const auto p = where.place(f);
    if (!p) continue;
    Pt q = at(*p);
    if (grouped) q = snap(q);
    auto& sev = rings.try_emplace({std::lround(q.x * 10), std::lround(q.y * 10)}, f.severity).first->second;
    sev = std::max(sev, f.severity);
  }
  c.begin_group("plan-findings", "");
  for (const auto& [xy, sev] : rings) {
    const bool error = sev == Severity::error;
    c.polygon(circle({static_cast<double>(xy.first) / 10.0, static_cast<double>(xy.second) / 10.0}, 2.4, 24), std::nullopt,
              Pen{error ? 0.45 : 0.3, error ? std::vector<double>{} : std::vector<double>{0.9, 0.6},
                  error ? Rgb{0.56, 0.07, 0.07} : Rgb{0.54, 0.35, 0.0}});
  }
  c.end_group();

  // Legend along the top, north arrow and scale bar at the right.
  c.begin_group("plan-legend", "");
  const double ly = panel.top_mm + 4.0;
  double lx = panel.left_mm;
  c.text({lx, ly}, "PLAN OF THE NETWORK", TextStyle{3.5, Anchor::start, true, 0.0, black});
  lx += 62.0;
  for (const auto* list : {&structure_palette}) {
    for (const auto& s : *list) {
      c.polygon(circle({lx + 1.0, ly - 1.0}, 1.0), rgb(s), Pen{0.15, {}, black});
      c.text({lx + 3.0, ly}, std::string(s.label), TextStyle{txt, Anchor::start, false, 0.0, black});
      lx += 6.0 + 0.55 * txt * static_cast<double>(s.label.size());
    }
  }
  lx = panel.left_mm + 62.0;
  const double ly2 = ly + 5.0;
  for (const auto& s : conduit_palette) {
    c.polyline({{lx, ly2 - 1.0}, {lx + 5.0, ly2 - 1.0}}, Pen{0.6, {}, rgb(s)});
    c.text({lx + 6.0, ly2}, "Pipe: " + std::string(s.label), TextStyle{txt, Anchor::start, false, 0.0, black});
    lx += 10.0 + 0.55 * txt * static_cast<double>(s.label.size() + 6);
  }
  c.polyline({{lx, ly2 - 1.0}, {lx + 5.0, ly2 - 1.0}}, Pen{0.6, {}, rgb(force_main_colour)});
  c.text({lx + 6.0, ly2}, "Force main", TextStyle{txt, Anchor::start, false, 0.0, black});
  lx += 24.0;
  c.polygon(circle({lx + 2.0, ly2 - 1.0}, 2.0, 24), std::nullopt, Pen{0.45, {}, Rgb{0.56, 0.07, 0.07}});
  c.text({lx + 5.0, ly2}, "ring: warning (dashed) or error at the feature", TextStyle{txt, Anchor::start, false, 0.0, black});
  c.end_group();

  const double right = panel.left_mm + panel.width_mm, bottom = panel.top_mm + panel.height_mm;
  c.begin_group("plan-north", "");
  const Pt na{right - 8.0, panel.top_mm + legend_h + 10.0};
  c.polygon({{na.x, na.y - 8.0}, {na.x + 3.5, na.y + 4.0}, {na.x, na.y + 1.5}}, black, std::nullopt);
  c.polygon({{na.x, na.y - 8.0}, {na.x - 3.5, na.y + 4.0}, {na.x, na.y + 1.5}}, Rgb{1, 1, 1}, Pen{0.2, {}, black});
  c.text({na.x, na.y + 8.5}, "N (grid)", TextStyle{txt, Anchor::middle, true, 0.0, black});
  c.end_group();
  c.begin_group("plan-scale-bar", "");
  const bool us = sys == units::System::us;
  const double per_unit = us ? units::metres_per_foot : 1.0;
  const double len = scale_bar_length(0.2 * panel.width_mm / k / per_unit);
  const double w = len * per_unit * k, sx = right - w - 14.0, sy = bottom - 4.0;
  for (int q = 0; q < 4; ++q)
    c.polygon({{sx + q * w / 4, sy - 1.5}, {sx + (q + 1) * w / 4, sy - 1.5}, {sx + (q + 1) * w / 4, sy}, {sx + q * w / 4, sy}},
              q % 2 ? Rgb{1, 1, 1} : black, Pen{0.2, {}, black});
  c.text({sx, sy - 2.8}, "0", TextStyle{txt, Anchor::middle, false, 0.0, black});
  c.text({sx + w, sy - 2.8}, fixed_text(len, 0), TextStyle{txt, Anchor::middle, false, 0.0, black});
  c.text({sx + w + 3.0, sy}, us ? "ft" : "m", TextStyle{txt, Anchor::start, false, 0.0, black});
  c.text({sx - 4.0, sy}, "1:" + fixed_text(n, 0), TextStyle{txt, Anchor::end, true, 0.0, black});
  if (grouped)
    c.text({panel.left_mm, bottom - 1.0},
           "Simplified: too many features to draw one by one; pipes drawn between 1.5 mm cells, structures other than "
           "outfalls and pump stations left out; rings one per cell. results.gpkg holds every feature.",
           TextStyle{txt, Anchor::start, false, 0.0, black});
  c.end_group();
  return "1:" + fixed_text(n, 0) + " (plan)";
}

}  // namespace rimline::report
