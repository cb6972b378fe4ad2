#include "report/profile_draw.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <map>

#include "base/number_text.hpp"

namespace rimline::report {
namespace {

constexpr double legend_h = 10.0;
constexpr double axis_margin = 24.0;  // elevation labels and band row names
constexpr double station_row_h = 6.0;
constexpr double value_row_h = 11.0;
constexpr double pipe_row_h = 16.0;
constexpr double list_gap = 3.0;
constexpr double list_row_h = 3.2;
constexpr double headroom_mm = 20.0;  // structure ids above the highest rim
constexpr double char_w = 0.55;       // average glyph width / size for a sans font (common practice, no source)
constexpr double label_gap_mm = 2.6;  // rotated 2.2 mm text plus a little air
constexpr int max_stack = 4;          // markers drawn at one station; the rest are counted

const Rgb black{0, 0, 0};
const Rgb grid_grey{0.82, 0.82, 0.82};
const Rgb pipe_fill{0.90, 0.90, 0.90};
const Rgb label_grey{0.35, 0.35, 0.35};

std::string fixed(double v, int decimals) {
  if (!std::isfinite(v)) return "-";
  return fixed_text(v, decimals);
}

double text_width(const std::string& s, double size) { return char_w * size * static_cast<double>(s.size()); }

std::string clip_text(const std::string& s, double size, double width) {
  const auto n = static_cast<std::size_t>(std::max(0.0, width / (char_w * size)));
  if (s.size() <= n) return s;
  return n > 3 ? s.substr(0, n - 3) + "..." : "";
}

double plot_height(const Panel& p) {
  const double list_h = std::max(4.0 * list_row_h, 0.17 * p.height_mm);
  return p.height_mm - legend_h - station_row_h - 3.0 * value_row_h - pipe_row_h - list_gap - list_h;
}

void marker_symbol(Canvas& c, Pt at, Severity sev) {
  const double r = 1.5;
  if (sev == Severity::info) {
    std::vector<Pt> ring;
    for (int k = 0; k < 16; ++k) {
      const double a = 2.0 * M_PI * k / 16.0;
      ring.push_back({at.x + r * std::cos(a), at.y + r * std::sin(a)});
    }
    c.polygon(ring, Rgb{1, 1, 1}, Pen{0.25, {}, black});
    return;
  }
  // Errors are solid, warnings hollow: a difference of fill, not only of colour.
  const std::vector<Pt> tri{{at.x - r, at.y - r}, {at.x + r, at.y - r}, {at.x, at.y + r}};
  if (sev == Severity::error)
    c.polygon(tri, Rgb{0.65, 0.05, 0.05}, Pen{0.25, {}, black});
  else
    c.polygon(tri, Rgb{1, 1, 1}, Pen{0.4, {}, Rgb{0.55, 0.30, 0.0}});
}

void draw_legend(const ProfileScene& s, const PlotFrame& f, const Panel& p, Canvas& c) {
  double x = p.left_mm + axis_margin;
  const double y = p.top_mm + 5.0;
  const TextStyle t{2.2, Anchor::start, false, 0.0, black};
  c.begin_group("legend", "");
  for (Stroke k : {Stroke::ground, Stroke::freeboard, Stroke::crown, Stroke::invert, Stroke::hgl, Stroke::egl}) {
    c.polyline({{x, y - 0.7}, {x + 9.0, y - 0.7}}, pen_for(k));
    const std::string label = stroke_label(k, s);
    c.text({x + 10.5, y}, label, t);
    x += 14.0 + text_width(label, 2.2);
  }
  const std::pair<Severity, const char*> sev[] = {
      {Severity::error, "error"}, {Severity::warning, "warning"}, {Severity::info, "info"}};
  for (const auto& [sv, name] : sev) {
    marker_symbol(c, {x + 1.5, y - 0.9}, sv);
    c.text({x + 4.0, y}, name, t);
    x += 6.0 + text_width(name, 2.2);
  }
  c.polygon({{x, y - 3.0}, {x + 2.0, y - 3.0}, {x + 2.0, y + 1.0}, {x, y + 1.0}}, Rgb{1, 1, 1},
            Pen{0.3, {0.8, 0.6}, black});
  c.text({x + 3.5, y}, "structure, rim unknown", t);
  c.text({p.left_mm + p.width_mm, y}, scale_text(f), TextStyle{2.2, Anchor::end, true, 0.0, black});
  c.end_group();
}

void draw_grid_and_axes(const ProfileScene& s, const PlotFrame& f, Canvas& c) {
  const double right = f.left_mm + f.width_mm, bottom = f.top_mm + f.height_mm;
  const double ystep = nice_step(f.y1 - f.y0, std::max(2, static_cast<int>(f.height_mm / 15.0)));
  const double xstep = nice_step(f.x1 - f.x0, std::max(2, static_cast<int>(f.width_mm / 30.0)));
  const TextStyle yl{2.2, Anchor::end, false, 0.0, black};
  const TextStyle xl{2.2, Anchor::middle, false, 0.0, black};
  c.begin_group("grid", "");
  for (double y : ticks(f.y0, f.y1, ystep)) {
    const double py = f.py(y);
    c.polyline({{f.left_mm, py}, {right, py}}, Pen{0.1, {}, grid_grey});
    c.text({f.left_mm - 1.5, py + 0.8}, fixed(y, decimals_for(ystep)), yl);
  }
  for (double x : ticks(f.x0, f.x1, xstep)) {
    const double px = f.px(x);
    c.polyline({{px, f.top_mm}, {px, bottom}}, Pen{0.1, {}, grid_grey});
    c.text({px, bottom + 4.0}, station_label(x, s.system, decimals_for(xstep)), xl);
  }
  c.polygon({{f.left_mm, f.top_mm}, {right, f.top_mm}, {right, bottom}, {f.left_mm, bottom}}, std::nullopt,
            Pen{0.3, {}, black});
  c.text({f.left_mm - 17.0, f.top_mm + 0.5 * f.height_mm},
         "Elevation (" + s.length_unit + ")", TextStyle{2.2, Anchor::middle, false, 90.0, black});
  c.end_group();
}

void draw_pipes(const ProfileScene& s, const PlotFrame& f, Canvas& c) {
  c.begin_group("pipes", "");
  for (const auto& p : s.pipes) {
    if (!std::isfinite(p.invert_down) || !std::isfinite(p.invert_up)) continue;
    c.polygon({{f.px(p.station_down), f.py(p.invert_down)},
               {f.px(p.station_up), f.py(p.invert_up)},
               {f.px(p.station_up), f.py(p.invert_up + p.rise)},
               {f.px(p.station_down), f.py(p.invert_down + p.rise)}},
              pipe_fill, std::nullopt);
  }
  c.end_group();
}

void draw_line(const SceneLine& line, const PlotFrame& f, Canvas& c, const std::string& css) {
  c.begin_group(css, "");
  for (const auto& part : line.parts) {
    std::vector<Pt> pts;
    for (const auto& q : part) pts.push_back({f.px(q.x), f.py(q.y)});
    pts = simplified_polyline(pts, drawing_tolerance_mm);
    if (pts.size() == 1) pts.push_back({pts[0].x + 0.01, pts[0].y});
    c.polyline(pts, pen_for(line.stroke));
  }
  c.end_group();
}

// Structures whose ids and band values are drawn: the outfall, the head and those with a
// finding first, then the rest where a rotated label still fits beside its neighbours.
std::vector<bool> labelled_structures(const ProfileScene& s, const PlotFrame& f) {
  std::vector<double> x;
  std::vector<bool> priority;
  for (std::size_t i = 0; i < s.structures.size(); ++i) {
    const auto& st = s.structures[i];
    x.push_back(f.px(st.station));
    const bool flagged = std::any_of(s.markers.begin(), s.markers.end(), [&](const SceneMarker& m) {
      return m.feature_id == st.id && m.severity != Severity::info;
    });
    priority.push_back(i == 0 || i + 1 == s.structures.size() || flagged);
  }
  return thin_labels(x, priority, label_gap_mm);
}

void draw_structures(const ProfileScene& s, const PlotFrame& f, const std::vector<bool>& labelled, Canvas& c) {
  c.begin_group("structures", "");
  for (std::size_t i = 0; i < s.structures.size(); ++i) {
    const auto& st = s.structures[i];
    const double px = f.px(st.station);
    const double bottom = std::isfinite(st.bottom) ? st.bottom : f.y0;
    const bool rim_known = std::isfinite(st.rim);
    // Without a rim the structure is drawn as a short dashed box above the highest crown it meets.
    const double crown = std::isfinite(st.crown) ? st.crown : bottom;
    const double top_mm = rim_known ? f.py(st.rim) : f.py(crown) - 6.0;
    const double w = st.outfall ? 1.6 : 1.0;
    const std::vector<Pt> box{{px - w, top_mm}, {px + w, top_mm}, {px + w, f.py(bottom)}, {px - w, f.py(bottom)}};
    c.polygon(box, Rgb{1, 1, 1},
              Pen{st.outfall ? 0.45 : 0.3, rim_known ? std::vector<double>{} : std::vector<double>{0.8, 0.6}, black});
    if (!labelled[i]) continue;
    const std::string label = st.id + (st.outfall ? " (outfall)" : "");
    c.text({px + 0.8, top_mm - 1.5}, label, TextStyle{2.2, Anchor::start, true, 90.0, black});
  }
  c.end_group();
}

void draw_markers(const ProfileScene& s, const PlotFrame& f, Canvas& c) {
  std::map<long, int> stacked;  // markers at one station stack upwards, at most max_stack deep
  std::map<long, int> hidden;
  std::map<long, Pt> top;
  for (const auto& m : s.markers) {
    const long key = std::lround(f.px(m.station) * 2.0);
    const int k = stacked[key]++;
    if (k >= max_stack) {
      ++hidden[key];
      continue;
    }
    const Pt at{f.px(m.station) + 3.0, f.py(m.elevation) - 3.0 - 4.0 * k};
    top[key] = at;
    c.begin_group(std::string("finding finding-") + std::string(severity_name(m.severity)),
                  m.code + " " + m.feature_id + ": " + m.text);
    c.polyline({{f.px(m.station), f.py(m.elevation)}, {at.x, at.y + 1.5}}, Pen{0.15, {}, label_grey});
    marker_symbol(c, at, m.severity);
    c.text({at.x + 2.0, at.y + 0.9}, std::to_string(m.number), TextStyle{2.2, Anchor::start, true, 0.0, black});
    c.end_group();
  }
  for (const auto& [key, n] : hidden) {
    const Pt at = top[key];
    c.text({at.x - 1.5, at.y - 2.8}, "+" + std::to_string(n), TextStyle{2.0, Anchor::start, true, 0.0, black});
  }
}

// A hydraulic jump: a short upright bar through the HGL, labelled, where the profile changes regime.
void draw_jumps(const ProfileScene& s, const PlotFrame& f, Canvas& c) {
  c.begin_group("jumps", "");
  for (const auto& p : s.pipes) {
    if (!std::isfinite(p.jump_station) || !std::isfinite(p.jump_elevation)) continue;
    const double x = f.px(p.jump_station), y = f.py(p.jump_elevation);
    c.polyline({{x, y + 2.5}, {x, y - 2.5}}, Pen{0.5, {}, pen_for(Stroke::hgl).color});
    c.text({x, y - 3.2}, "jump", TextStyle{1.8, Anchor::middle, false, 0.0, black});
  }
  c.end_group();
}

void draw_band(const ProfileScene& s, const PlotFrame& f, const Panel& p, const std::vector<bool>& labelled,
               Canvas& c) {
  const double top = f.top_mm + f.height_mm + station_row_h;
  const double right = f.left_mm + f.width_mm;
  const TextStyle name{2.2, Anchor::start, true, 0.0, black};
  const TextStyle value{1.9, Anchor::start, false, 90.0, black};
  const char* rows[] = {"Rim", "Invert", "HGL"};
  c.begin_group("band", "");
  for (int r = 0; r <= 3; ++r) {
    const double y = top + r * value_row_h;
    c.polyline({{p.left_mm, y}, {right, y}}, Pen{0.15, {}, black});
    if (r < 3) c.text({p.left_mm, y + 6.0}, std::string(rows[r]) + " (" + s.length_unit + ")", name);
  }
  c.text({p.left_mm, top + 3 * value_row_h + 6.0}, "Pipe", name);
  const double bottom = top + 3 * value_row_h + pipe_row_h;
  c.polyline({{p.left_mm, bottom}, {right, bottom}}, Pen{0.15, {}, black});
  for (std::size_t i = 0; i < s.structures.size(); ++i) {
    if (!labelled[i]) continue;
    const auto& st = s.structures[i];
    const double px = f.px(st.station) + 0.7;
    const double v[] = {st.rim, st.invert, st.hgl};
    const int decimals = display_decimals(units::Dimension::length, s.system, 0.0);  // mm or 0.01 ft
    for (int r = 0; r < 3; ++r) c.text({px, top + (r + 1) * value_row_h - 1.0}, fixed(v[r], decimals), value);
  }
  // A pipe's two rotated lines need about two label gaps of width.
  std::vector<double> mids;
  for (const auto& pp : s.pipes) mids.push_back(f.px(0.5 * (pp.station_down + pp.station_up)));
  const auto pipe_drawn = thin_labels(mids, {}, 2.0 * label_gap_mm);
  for (std::size_t i = 0; i < s.pipes.size(); ++i) {
    if (!pipe_drawn[i]) continue;
    const auto& pp = s.pipes[i];
    const double y = top + 3 * value_row_h + pipe_row_h - 1.0;
    c.text({mids[i] - 0.3, y}, clip_text(pp.id, 1.7, pipe_row_h - 2.0), TextStyle{1.7, Anchor::start, true, 90.0, black});
    c.text({mids[i] + 2.0, y}, clip_text(pp.size_text + " " + pp.slope_text, 1.7, pipe_row_h - 2.0),
           TextStyle{1.7, Anchor::start, false, 90.0, black});
  }
  c.end_group();
}

void draw_finding_list(const ProfileScene& s, const PlotFrame& f, const Panel& p, Canvas& c) {
  const double top = f.top_mm + f.height_mm + station_row_h + 3 * value_row_h + pipe_row_h + list_gap;
  const double bottom = p.top_mm + p.height_mm;
  const int rows = std::max(1, static_cast<int>((bottom - top) / list_row_h) - 1);
  const double col_w = p.width_mm / 2.0;
  const TextStyle t{2.0, Anchor::start, false, 0.0, black};
  c.begin_group("finding-list", "");
  c.text({p.left_mm, top + 2.4}, s.markers.empty() ? "No findings on this path in this case."
                                                   : "Findings on this path (marked by number):",
         TextStyle{2.2, Anchor::start, true, 0.0, black});
  const std::size_t capacity = static_cast<std::size_t>(2 * rows);
  for (std::size_t i = 0; i < s.markers.size() && i < capacity; ++i) {
    const auto& m = s.markers[i];
    const double x = p.left_mm + static_cast<double>(i / static_cast<std::size_t>(rows)) * col_w;
    const double y = top + 2.4 + list_row_h * static_cast<double>(1 + i % rows);
    if (i + 1 == capacity && s.markers.size() > capacity) {
      c.text({x, y}, "... and " + std::to_string(s.markers.size() - i) + " more: see the exception list", t);
      break;
    }
    marker_symbol(c, {x + 1.5, y - 0.8}, m.severity);
    const std::string line = std::to_string(m.number) + "  " + m.code + "  " + m.feature_id + "  " + m.text;
    c.text({x + 4.0, y}, clip_text(line, 2.0, col_w - 6.0), t);
  }
  c.end_group();
}

}  // namespace

Pen pen_for(Stroke s) {
  switch (s) {
    case Stroke::ground: return Pen{0.55, {}, Rgb{0.42, 0.27, 0.12}};
    case Stroke::freeboard: return Pen{0.25, {0.5, 0.9}, Rgb{0.42, 0.27, 0.12}};
    case Stroke::invert: return Pen{0.35, {}, black};
    case Stroke::crown: return Pen{0.18, {}, black};
    case Stroke::hgl: return Pen{0.45, {3.0, 1.0}, Rgb{0.05, 0.25, 0.75}};
    case Stroke::egl: return Pen{0.3, {1.6, 0.8, 0.4, 0.8}, Rgb{0.70, 0.10, 0.45}};
  }
  return Pen{};
}

std::string stroke_label(Stroke s, const ProfileScene& scene) {
  switch (s) {
    case Stroke::ground: return "Ground / rim";
    case Stroke::freeboard:
      return "Required freeboard (rim - " + fixed(scene.freeboard, display_decimals(units::Dimension::length, scene.system, 0.0)) +
             " " + scene.length_unit + ")";
    case Stroke::invert: return "Pipe invert";
    case Stroke::crown: return "Pipe crown";
    case Stroke::hgl: return "HGL";
    case Stroke::egl: return "EGL";
  }
  return "";
}

std::string scale_text(const PlotFrame& f) {
  char buf[128];
  std::snprintf(buf, sizeof buf, "H 1:%.0f   V 1:%.0f   vertical exaggeration %.0f:1", f.horizontal_n, f.vertical_n,
                f.exaggeration);
  return buf;
}

PlotFrame profile_frame(const ProfileScene& scene, const Panel& panel) {
  const double h = plot_height(panel);
  const double usable_w = panel.width_mm - axis_margin - 4.0;
  PlotFrame f = fit_frame(scene.x_min, scene.x_max, scene.y_min, scene.y_max, scene.metres_per_unit,
                          panel.left_mm + axis_margin, panel.top_mm + legend_h, usable_w, h - headroom_mm);
  // Room above the data for the structure ids, at the scale just chosen.
  const double units_per_mm = (f.y1 - f.y0) / f.height_mm;
  f.y1 += headroom_mm * units_per_mm;
  f.height_mm = h;
  return f;
}

PlotFrame draw_profile(const ProfileScene& scene, const Panel& panel, Canvas& canvas) {
  const PlotFrame f = profile_frame(scene, panel);
  draw_legend(scene, f, panel, canvas);
  draw_grid_and_axes(scene, f, canvas);
  draw_pipes(scene, f, canvas);
  draw_line(scene.line(Stroke::ground), f, canvas, "ground");
  draw_line(scene.line(Stroke::freeboard), f, canvas, "freeboard");
  draw_line(scene.line(Stroke::crown), f, canvas, "crown");
  draw_line(scene.line(Stroke::invert), f, canvas, "invert");
  const auto labelled = labelled_structures(scene, f);
  draw_structures(scene, f, labelled, canvas);
  draw_line(scene.line(Stroke::egl), f, canvas, "egl");
  draw_line(scene.line(Stroke::hgl), f, canvas, "hgl");
  draw_jumps(scene, f, canvas);
  draw_markers(scene, f, canvas);
  draw_band(scene, f, panel, labelled, canvas);
  draw_finding_list(scene, f, panel, canvas);
  return f;
}

std::vector<Pt> simplified_polyline(const std::vector<Pt>& pts, double tolerance_mm) {
  if (pts.size() < 3) return pts;
  std::vector<bool> keep(pts.size(), false);
  keep.front() = keep.back() = true;
  std::vector<std::pair<std::size_t, std::size_t>> todo{{0, pts.size() - 1}};
  while (!todo.empty()) {
    const auto [a, b] = todo.back();
    todo.pop_back();
    const double dx = pts[b].x - pts[a].x, dy = pts[b].y - pts[a].y, len = std::hypot(dx, dy);
    double worst = -1.0;
    std::size_t at = a;
    for (std::size_t k = a + 1; k < b; ++k) {
      const double ex = pts[k].x - pts[a].x, ey = pts[k].y - pts[a].y;
      const double d = len > 0.0 ? std::abs(ex * dy - ey * dx) / len : std::hypot(ex, ey);
      if (d > worst) worst = d, at = k;
    }
    if (worst > tolerance_mm) {
      keep[at] = true;
      if (at - a > 1) todo.emplace_back(a, at);
      if (b - at > 1) todo.emplace_back(at, b);
    }
  }
  std::vector<Pt> out;
  for (std::size_t k = 0; k < pts.size(); ++k)
    if (keep[k]) out.push_back(pts[k]);
  return out;
}

}  // namespace rimline::report
