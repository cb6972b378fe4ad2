#include "report/force_main_drawing.hpp"

#include <algorithm>
#include <cmath>

#include "base/number_text.hpp"
#include "report/svg_canvas.hpp"
#include "rimline/report/outputs.hpp"
#include "rimline/report/profile_svg.hpp"

namespace rimline::report {
namespace {

using units::Dimension;

constexpr double width = 400.0, height = 170.0;

// Pens by case: weight and dash carry the case so a greyscale print stays readable.
Pen case_pen(std::size_t k) {
  static const Rgb colors[] = {{0.1, 0.3, 0.8}, {0.0, 0.55, 0.3}, {0.75, 0.35, 0.0}, {0.5, 0.1, 0.6}};
  static const std::vector<double> dashes[] = {{}, {4.0, 1.5}, {1.2, 1.2}, {5.0, 1.2, 1.2, 1.2}};
  return Pen{0.35, dashes[k % 4], colors[k % 4]};
}

}  // namespace

std::string draw_force_main(const run::CheckRun& run, std::size_t station, const Panel& panel, Canvas& c) {
  const auto& st = run.pump_stations[station];
  if (!st.layout.ok) return "";
  // Room for the tick labels and axis titles inside the panel.
  const double left = panel.left_mm + 18.0, top = panel.top_mm, pw = panel.width_mm - 18.0, ph = panel.height_mm - 14.0;
  const auto sys = run.report_units;
  const auto L = Dimension::length;
  const auto& pts = st.layout.points;
  auto rep = [&](double si) { return to_report(si, L, sys); };
  double y_lo = INFINITY, y_hi = -INFINITY;
  for (std::size_t i = 0; i < pts.size(); ++i) {
    y_lo = std::min(y_lo, pts[i].centreline_m), y_hi = std::max(y_hi, pts[i].centreline_m);
    for (const auto& k : st.cases)
      if (k.exists) y_lo = std::min(y_lo, k.hgl_m[i]), y_hi = std::max(y_hi, k.egl_m[i]);
  }
  y_lo = rep(y_lo), y_hi = rep(y_hi);
  const double x_hi = rep(pts.back().station_m), pad = std::max(0.5, 0.05 * (y_hi - y_lo));
  y_lo -= pad, y_hi += pad;
  auto at = [&](double station_si, double elev_si) {
    return Pt{left + pw * rep(station_si) / x_hi, top + ph * (1.0 - (rep(elev_si) - y_lo) / (y_hi - y_lo))};
  };
  const Pen frame{0.25, {}, Rgb{0.2, 0.2, 0.2}}, grid{0.1, {}, Rgb{0.8, 0.8, 0.8}};
  const TextStyle small{min_text_mm, Anchor::middle, false, 0.0, Rgb{}};
  const std::string u(units::unit_symbol(units::display_unit(L, sys)));
  // Grid and axes.
  const double xs = nice_step(x_hi, 10), ys = nice_step(y_hi - y_lo, 6);
  for (double x = 0.0; x <= x_hi + 1e-9; x += xs) {
    const double px = left + pw * x / x_hi;
    c.polyline({{px, top}, {px, top + ph}}, grid);
    c.text({px, top + ph + 4.0}, fixed_text(x, 0), small);
  }
  for (double y = std::ceil(y_lo / ys) * ys; y <= y_hi; y += ys) {
    const double py = top + ph * (1.0 - (y - y_lo) / (y_hi - y_lo));
    c.polyline({{left, py}, {left + pw, py}}, grid);
    c.text({left - 1.5, py + 0.8}, fixed_text(y, ys < 1.0 ? 1 : 0), TextStyle{min_text_mm, Anchor::end, false, 0.0, Rgb{}});
  }
  c.polygon({{left, top}, {left + pw, top}, {left + pw, top + ph}, {left, top + ph}}, std::nullopt, frame);
  c.text({left + pw / 2, top + ph + 9.0}, "station from the pump (" + u + ")", small);
  c.text({left - 16.0, top + ph / 2}, "elevation (" + u + ")", TextStyle{min_text_mm, Anchor::middle, false, 90.0, Rgb{}});
  // Pressure envelope: the band between the lowest and highest HGL over the operating cases.
  std::vector<Pt> band, low;
  for (std::size_t i = 0; i < pts.size(); ++i) {
    double lo = INFINITY, hi = -INFINITY;
    for (const auto& k : st.cases)
      if (k.exists) lo = std::min(lo, k.hgl_m[i]), hi = std::max(hi, k.hgl_m[i]);
    if (!std::isfinite(lo)) continue;
    band.push_back(at(pts[i].station_m, hi));
    low.push_back(at(pts[i].station_m, lo));
  }
  band.insert(band.end(), low.rbegin(), low.rend());
  if (band.size() >= 3) {
    c.begin_group("pressure-envelope", "HGL envelope over the operating cases");
    c.polygon(band, Rgb{0.85, 0.92, 1.0}, std::nullopt);
    c.end_group();
  }
  // Pipe centreline.
  std::vector<Pt> pipe;
  for (const auto& p : pts) pipe.push_back(at(p.station_m, p.centreline_m));
  c.begin_group("pipe", "pipe centreline");
  c.polyline(pipe, Pen{0.6, {}, Rgb{}});
  c.end_group();
  // HGL per case, and the legend at the top right (the HGL is highest at the pump end, on the left).
  const double lx = left + pw - 128.0;
  double legend_y = top + 4.0;
  c.polyline({{lx + 3.0, legend_y - 0.8}, {lx + 13.0, legend_y - 0.8}}, Pen{0.6, {}, Rgb{}});
  c.text({lx + 15.0, legend_y}, "pipe centreline", TextStyle{min_text_mm, Anchor::start, true, 0.0, Rgb{}});
  for (std::size_t k = 0; k < st.cases.size(); ++k) {
    const auto& cs = st.cases[k];
    legend_y += 3.6;
    const std::string label = "HGL " + cs.label + (cs.exists ? ": Q " + render_message(q(cs.flow_m3_s, Dimension::flow), sys) + ", head " +
                                                                   render_message(q(cs.head_m, L), sys)
                                                             : ": no operating point");
    c.polyline({{lx + 3.0, legend_y - 0.8}, {lx + 13.0, legend_y - 0.8}}, case_pen(k));
    c.text({lx + 15.0, legend_y}, label, TextStyle{min_text_mm, Anchor::start, false, 0.0, Rgb{}});
    if (!cs.exists) continue;
    std::vector<Pt> line;
    for (std::size_t i = 0; i < pts.size(); ++i) line.push_back(at(pts[i].station_m, cs.hgl_m[i]));
    c.begin_group("hgl-case", "HGL, " + cs.label);
    c.polyline(line, case_pen(k));
    c.end_group();
    // Sub-atmospheric points of this case: a red mark on the pipe.
    for (std::size_t i = 0; i < pts.size(); ++i) {
      if (!(cs.pressure_head_m[i] < run.project.force_mains.pressure_min_m - 1e-3)) continue;
      const Pt p = at(pts[i].station_m, pts[i].centreline_m);
      c.begin_group("subatmospheric", "pressure head " + render_message(q(cs.pressure_head_m[i], Dimension::pressure_head), sys) +
                                          " (" + cs.label + ")");
      c.polygon({{p.x - 1.0, p.y - 2.6}, {p.x + 1.0, p.y - 2.6}, {p.x + 1.0, p.y - 0.6}, {p.x - 1.0, p.y - 0.6}},
                Rgb{0.85, 0.1, 0.1}, std::nullopt);  // a square: a downward triangle would read as a water surface
      c.end_group();
    }
  }
  legend_y += 3.6;
  c.polygon({{lx + 3.0, legend_y - 2.0}, {lx + 13.0, legend_y - 2.0}, {lx + 13.0, legend_y}, {lx + 3.0, legend_y}},
            Rgb{0.85, 0.92, 1.0}, std::nullopt);
  c.text({lx + 15.0, legend_y}, "HGL envelope over the cases; red marks: pressure head below the limit",
         TextStyle{min_text_mm, Anchor::start, false, 0.0, Rgb{}});
  // The scales the plot was fitted at (paper mm per ground metre), stated as the trade writes them.
  const double metres_per_unit = units::from_si(1.0, units::display_unit(L, sys)) > 0.0 ? 1.0 / units::from_si(1.0, units::display_unit(L, sys)) : 1.0;
  const double h_n = 1000.0 * x_hi * metres_per_unit / pw, v_n = 1000.0 * (y_hi - y_lo) * metres_per_unit / ph;
  return "H 1:" + fixed_text(h_n, 0) + "   V 1:" + fixed_text(v_n, 0) + "   vertical exaggeration " + fixed_text(h_n / v_n, 0) +
         ":1 (fitted to the sheet)";
}

std::string force_main_title(const run::CheckRun& run, std::size_t station) {
  const auto& st = run.pump_stations[station];
  return "Force main of pump station " + run.project.pump_stations[station].id + " to " +
         run.read.network.structures[st.layout.discharge].id + " (discharge: " + st.discharge_basis + ")";
}

std::string force_main_svg(const run::CheckRun& run, std::size_t station) {
  if (!run.pump_stations[station].layout.ok) return "";
  const std::string& id = run.project.pump_stations[station].id;
  const std::string title = force_main_title(run, station);
  constexpr double left = 10.0;
  SvgCanvas c;
  draw_force_main(run, station, Panel{left, 16.0, width - 2 * left, height - 40.0}, c);
  auto n = [](double v) { return fixed_text(v, 2); };
  std::string svg = "<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" class=\"profile force-main\" id=\"force-main-" +
                    xml_escape(id) + "\" width=\"" + n(width) + "mm\" height=\"" + n(height) + "mm\" viewBox=\"0 0 " +
                    n(width) + " " + n(height) + "\" font-family=\"DejaVu Sans, Liberation Sans, Arial, sans-serif\">\n";
  svg += "<title>" + xml_escape(title) + "</title>\n";
  svg += "<rect x=\"0\" y=\"0\" width=\"" + n(width) + "\" height=\"" + n(height) + "\" fill=\"#ffffff\"/>\n";
  SvgCanvas head;
  head.text({left, 8.0}, title, TextStyle{3.2, Anchor::start, true, 0.0, Rgb{}});
  head.text({left, height - 6.0}, caution, TextStyle{min_text_mm, Anchor::start, false, 0.0, Rgb{0.3, 0.3, 0.3}});
  return svg + head.body() + c.body() + "</svg>\n";
}

}  // namespace rimline::report
