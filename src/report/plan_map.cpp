#include "report/plan_map.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <sstream>
#include <nlohmann/json.hpp>

#include "base/number_text.hpp"
#include "report/feature_locator.hpp"
#include "report/feature_values.hpp"
#include "report/status_palette.hpp"
#include "rimline/report/outputs.hpp"
#include "rimline/report/profile_svg.hpp"

namespace rimline::report {
namespace {

using units::Dimension;

std::string esc(std::string_view s) { return xml_escape(s); }
std::string num(double v) { return fixed_text(v, 1); }


// Worst first: a group of features takes the status of its worst member.
int structure_rank(std::string_view s) {
  return s == "flooded" ? 0 : s == "freeboard" ? 1 : s == "not_checked" ? 2 : s == "unknown_rim" ? 3 : 4;
}
int conduit_rank(std::string_view s) { return s == "surcharged" ? 0 : s == "not_checked" ? 1 : s == "force_main" ? 2 : 3; }

// A grouped map's cell, in drawing units (about 1/125 of the map's width).
constexpr double group_cell = 8.0;

bool failing(std::string_view structure_status) { return structure_status == "flooded" || structure_status == "freeboard"; }

std::string scale_bar(const PlanGeometry& g, units::System sys) {
  const double per_unit_m = sys == units::System::us ? units::metres_per_foot : 1.0;
  const std::string unit = sys == units::System::us ? "ft" : "m";
  const double len = scale_bar_length(0.25 * (g.width - 2 * g.margin) / g.scale / per_unit_m);
  const double w = len * per_unit_m * g.scale;
  const double x = g.margin, y = g.height - 14.0;
  std::string h = "<g id=\"scale-bar\" font-size=\"11\">";
  for (int k = 0; k < 4; ++k)
    h += "<rect x=\"" + num(x + k * w / 4) + "\" y=\"" + num(y - 5) + "\" width=\"" + num(w / 4) +
         "\" height=\"5\" fill=\"" + (k % 2 ? "#fff" : "#1d232b") + "\" stroke=\"#1d232b\" stroke-width=\"0.8\"/>";
  auto label = [&](double at, double value) {
    std::string t = fixed_text(value, value < 10 && std::fmod(value, 1.0) != 0.0 ? 1 : 0);
    return "<text x=\"" + num(at) + "\" y=\"" + num(y - 8) + "\" text-anchor=\"middle\">" + t + "</text>";
  };
  h += label(x, 0) + label(x + w / 2, len / 2) + label(x + w, len);
  h += "<text x=\"" + num(x + w + 8) + "\" y=\"" + num(y) + "\">" + unit + "</text></g>";
  return h;
}

std::string north_arrow(const PlanGeometry& g) {
  const double x = g.width - g.margin + 12, y = g.margin - 6;
  return "<g id=\"north-arrow\"><path d=\"M" + num(x) + " " + num(y - 16) + " L" + num(x + 7) + " " + num(y + 8) + " L" +
         num(x) + " " + num(y + 3) + " Z\" fill=\"#1d232b\"/><path d=\"M" + num(x) + " " + num(y - 16) + " L" +
         num(x - 7) + " " + num(y + 8) + " L" + num(x) + " " + num(y + 3) + " Z\" fill=\"#fff\" stroke=\"#1d232b\" "
         "stroke-width=\"0.8\"/><text x=\"" + num(x) + "\" y=\"" + num(y + 21) + "\" font-size=\"11\" "
         "text-anchor=\"middle\" font-weight=\"bold\">N</text></g>";
}

std::string label(double x, double y, const std::string& text, const char* anchor = "start") {
  return "<text class=\"map-label\" x=\"" + num(x) + "\" y=\"" + num(y) + "\" text-anchor=\"" + anchor + "\">" +
         esc(text) + "</text>";
}

}  // namespace

PlanExtent network_extent(const model::Network& net) {
  double x0 = INFINITY, y0 = INFINITY, x1 = -INFINITY, y1 = -INFINITY;
  auto take = [&](const model::Point2& p) {
    if (!std::isfinite(p.x) || !std::isfinite(p.y)) return;
    x0 = std::min(x0, p.x), y0 = std::min(y0, p.y), x1 = std::max(x1, p.x), y1 = std::max(y1, p.y);
  };
  for (const auto& s : net.structures) take(s.location);
  for (const auto& c : net.conduits)
    for (const auto& v : c.vertices) take(v);
  if (!(x1 >= x0)) return {};
  return {x0, y0, x1, y1};
}

PlanGeometry plan_geometry(const model::Network& net, double width, double max_height) {
  PlanGeometry g;
  g.width = width;
  const PlanExtent e = network_extent(net);
  const double dx = e.dx(), dy = e.dy();
  g.scale = std::min((width - 2 * g.margin) / dx, (max_height - 2 * g.margin) / dy);
  g.min_x = e.x0 - ((width - 2 * g.margin) / g.scale - dx) / 2;  // centred across
  g.min_y = e.y0;
  g.max_x = e.x1, g.max_y = e.y1;
  g.height = dy * g.scale + 2 * g.margin;
  return g;
}

double scale_bar_length(double max_units) {
  if (!(max_units > 0.0)) return 1.0;
  const double p = std::pow(10.0, std::floor(std::log10(max_units)));
  for (double m : {5.0, 2.0, 1.0})
    if (m * p <= max_units) return m * p;
  return p;
}

PlanMap plan_map(const run::CheckRun& run, const FeatureLinks& links) {
  const auto& net = run.read.network;
  const auto sys = run.report_units;
  PlanMap out;
  const PlanGeometry g = plan_geometry(net, 1000.0, 760.0);
  out.simplified = !links.detailed();
  std::vector<std::string> s_status(net.structures.size()), c_status(net.conduits.size());
  for (std::size_t s = 0; s < net.structures.size(); ++s) s_status[s] = structure_status(run, s);
  for (std::size_t c = 0; c < net.conduits.size(); ++c) c_status[c] = conduit_status(run, c);

  std::string svg = "<svg id=\"plan-svg\" xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 " + num(g.width) + " " +
                    num(g.height) + "\" role=\"img\" aria-label=\"Plan of the network coloured by result\" data-structures=\"" +
                    std::to_string(net.structures.size()) + "\" data-conduits=\"" + std::to_string(net.conduits.size()) +
                    "\" font-family=\"DejaVu Sans, Arial, sans-serif\">\n<rect width=\"100%\" height=\"100%\" fill=\"#fff\"/>\n";
  nlohmann::json data = nlohmann::json::object();
  const auto s_cols = structure_columns(sys), c_cols = conduit_columns(sys);
  auto feature_data = [&](const std::string& k, const std::string& title, const std::vector<ValueColumn>& cols,
                          const std::vector<std::string>& values, LayerRole layer, const std::string& id) {
    nlohmann::json v = nlohmann::json::array();
    for (std::size_t i = 1; i < cols.size() && i < values.size(); ++i)
      if (!values[i].empty()) v.push_back({cols[i].heading, values[i]});
    nlohmann::json f{{"t", title}, {"v", v}};
    if (const auto p = links.profile(layer, id, static_cast<std::size_t>(-1))) f["p"] = p->href, f["pl"] = p->name;
    nlohmann::json x = nlohmann::json::array(), xc = nlohmann::json::array();
    for (std::size_t e : links.findings_of(layer, id)) {
      x.push_back("exc-" + std::to_string(e));
      xc.push_back(run.findings[e].code);
    }
    if (!x.empty()) f["x"] = x, f["xc"] = xc;
    data[k] = std::move(f);
  };

  if (!out.simplified) {
    // Pipes first (beneath the structures), then structures, then the rings of the findings.
    svg += "<g id=\"map-pipes\" fill=\"none\" stroke-linecap=\"round\" stroke-linejoin=\"round\">\n";
    for (std::size_t c = 0; c < net.conduits.size(); ++c) {
      const auto& p = net.conduits[c];
      if (p.vertices.size() < 2) continue;
      const auto& col = conduit_colour(c_status[c]);
      std::string pts;
      for (const auto& v : p.vertices) pts += (pts.empty() ? "" : " ") + num(g.sx(v.x)) + "," + num(g.sy(v.y));
      const std::string k = "c" + std::to_string(c);
      svg += "<polyline id=\"map-" + k + "\" class=\"feat pipe\" data-key=\"" + k + "\" data-status=\"" + c_status[c] +
             "\" points=\"" + pts + "\" stroke=\"" + std::string(col.hex) + "\" stroke-width=\"" +
             (c_status[c] == "surcharged" ? "4" : "2.6") + "\"" +
             (c_status[c] == "not_checked" ? " stroke-dasharray=\"6 4\"" : "") +
             (p.force_main ? " stroke-dasharray=\"10 3 2 3\"" : "") + "><title>" +
             esc((p.force_main ? "Force main " : "Pipe ") + p.id + ": " + std::string(col.label)) + "</title></polyline>\n";
      ++out.conduits_drawn;
      feature_data(k, (p.force_main ? "Force main " : "Pipe ") + p.id, c_cols, conduit_values(run, c),
                   LayerRole::conduits, p.id);
    }
    svg += "</g>\n<g id=\"map-structures\" stroke=\"#1d232b\">\n";
    for (std::size_t s = 0; s < net.structures.size(); ++s) {
      const auto& st = net.structures[s];
      const auto& col = structure_colour(s_status[s]);
      const double x = g.sx(st.location.x), y = g.sy(st.location.y);
      const std::string k = "s" + std::to_string(s);
      const std::string common = "id=\"map-" + k + "\" class=\"feat structure\" data-key=\"" + k + "\" data-status=\"" +
                                 s_status[s] + "\" fill=\"" + std::string(col.hex) + "\"";
      const std::string title = "<title>" + esc("Structure " + st.id + " (" + std::string(model::structure_kind_name(st.kind)) +
                                                "): " + std::string(col.label)) + "</title>";
      if (st.kind == model::StructureKind::outfall)
        svg += "<rect " + common + " x=\"" + num(x - 6) + "\" y=\"" + num(y - 6) + "\" width=\"12\" height=\"12\" stroke-width=\"1.5\">" + title + "</rect>\n";
      else if (st.kind == model::StructureKind::pump_station)
        svg += "<path " + common + " d=\"M" + num(x) + " " + num(y - 8) + " L" + num(x + 8) + " " + num(y) + " L" + num(x) +
               " " + num(y + 8) + " L" + num(x - 8) + " " + num(y) + " Z\" stroke-width=\"1.5\">" + title + "</path>\n";
      else
        svg += "<circle " + common + " cx=\"" + num(x) + "\" cy=\"" + num(y) + "\" r=\"" + (failing(s_status[s]) ? "6" : "4") +
               "\" stroke-width=\"" + (failing(s_status[s]) ? "1.5" : "0.8") + "\">" + title + "</circle>\n";
      ++out.structures_drawn;
      feature_data(k, "Structure " + st.id, s_cols, structure_values(run, s), LayerRole::structures, st.id);
    }
    svg += "</g>\n";
  } else {
    // Grid cells of 8 drawing units: one marker per cell, one segment per pair of cells.
    const double cell = group_cell;
    auto cell_of = [&](const model::Point2& p) {
      return std::make_pair(static_cast<int>(std::floor(g.sx(p.x) / cell)), static_cast<int>(std::floor(g.sy(p.y) / cell)));
    };
    std::map<std::pair<int, int>, std::pair<int, std::size_t>> cells;  // worst rank, count
    for (std::size_t s = 0; s < net.structures.size(); ++s) {
      auto& e = cells.try_emplace(cell_of(net.structures[s].location), 9, 0).first->second;
      e.first = std::min(e.first, structure_rank(s_status[s]));
      ++e.second;
    }
    std::map<std::pair<std::pair<int, int>, std::pair<int, int>>, int> segments;
    for (std::size_t c = 0; c < net.conduits.size(); ++c) {
      const auto& p = net.conduits[c];
      if (p.vertices.size() < 2) continue;
      auto a = cell_of(p.vertices.front()), b = cell_of(p.vertices.back());
      if (a == b) continue;
      if (b < a) std::swap(a, b);
      auto& r = segments.try_emplace({a, b}, 9).first->second;
      r = std::min(r, conduit_rank(c_status[c]));
    }
    const char* c_by_rank[] = {"surcharged", "not_checked", "force_main", "ok"};
    const char* s_by_rank[] = {"flooded", "freeboard", "not_checked", "unknown_rim", "ok"};
    svg += "<g id=\"map-pipes\" fill=\"none\" stroke-linecap=\"round\">\n";
    for (const auto& [ab, rank] : segments) {
      const auto& col = conduit_colour(c_by_rank[rank]);
      svg += "<line x1=\"" + num((ab.first.first + 0.5) * cell) + "\" y1=\"" + num((ab.first.second + 0.5) * cell) +
             "\" x2=\"" + num((ab.second.first + 0.5) * cell) + "\" y2=\"" + num((ab.second.second + 0.5) * cell) +
             "\" stroke=\"" + std::string(col.hex) + "\" stroke-width=\"" + (rank == 0 ? "3" : "1.6") + "\"/>\n";
    }
    svg += "</g>\n<g id=\"map-groups\" stroke=\"#1d232b\" stroke-width=\"0.6\">\n";
    std::size_t n = 0;
    for (const auto& [xy, e] : cells) {
      const auto& col = structure_colour(s_by_rank[e.first]);
      const std::string k = "g" + std::to_string(n++);
      svg += "<circle class=\"feat group\" data-key=\"" + k + "\" data-status=\"" + s_by_rank[e.first] + "\" cx=\"" +
             num((xy.first + 0.5) * cell) + "\" cy=\"" + num((xy.second + 0.5) * cell) + "\" r=\"" +
             (e.first <= 1 ? "4.5" : "2.8") + "\" fill=\"" + std::string(col.hex) + "\"><title>" +
             std::to_string(e.second) + " structures, the worst: " + esc(col.label) + "</title></circle>\n";
      data[k] = {{"t", std::to_string(e.second) + " structures in one cell"}, {"v", {{"Worst status", std::string(col.label)}}}};
    }
    svg += "</g>\n";
    out.structures_drawn = cells.size();
    out.conduits_drawn = segments.size();
    out.note = "This export has " + std::to_string(net.structures.size()) + " structures and " +
               std::to_string(net.conduits.size()) + " pipes, too many to draw one by one: the map groups the structures into " +
               std::to_string(cells.size()) + " cells of " +
               fixed_text(units::from_si(cell / g.scale, sys == units::System::us ? units::Unit::ft : units::Unit::m), 0) +
               (sys == units::System::us ? " ft" : " m") + " (each in the worst status of its members) and draws the pipes as " +
               std::to_string(segments.size()) + " straight segments between cells. Outfalls, pump stations and the findings "
               "are drawn one by one; every feature is in the tables below and in results.gpkg.";
    // Outfalls and pump stations are few: one by one, always.
    svg += "<g id=\"map-structures\" stroke=\"#1d232b\">\n";
    for (std::size_t s = 0; s < net.structures.size(); ++s) {
      const auto& st = net.structures[s];
      if (st.kind != model::StructureKind::outfall && st.kind != model::StructureKind::pump_station) continue;
      const double x = g.sx(st.location.x), y = g.sy(st.location.y);
      svg += "<rect x=\"" + num(x - 5) + "\" y=\"" + num(y - 5) + "\" width=\"10\" height=\"10\" fill=\"" +
             std::string(structure_colour(s_status[s]).hex) + "\"><title>" + esc(st.id) + "</title></rect>\n";
    }
    svg += "</g>\n";
  }

  // Rings where the findings are (warnings and errors; notes are left to the tables), one per feature.
  const FeatureLocator where(run);
  std::map<std::pair<int, int>, std::pair<Severity, std::string>> rings;  // at 0.1 drawing units
  for (const auto& f : run.findings) {
    if (f.severity == Severity::info) continue;
    const auto p = where.place(f);
    if (!p) continue;
    // At the feature, or at the centre of its cell on a grouped map (one ring per cell).
    double x = g.sx(p->x), y = g.sy(p->y);
    if (out.simplified) x = (std::floor(x / group_cell) + 0.5) * group_cell, y = (std::floor(y / group_cell) + 0.5) * group_cell;
    const std::pair<int, int> at{static_cast<int>(std::lround(x * 10)), static_cast<int>(std::lround(y * 10))};
    auto [it, fresh] = rings.try_emplace(
        at, f.severity, out.simplified ? std::string("warnings or errors at structures or pipes in this cell") : f.feature_id + ": " + f.code);
    if (!fresh && out.simplified) {
      it->second.first = std::max(it->second.first, f.severity);
    } else if (!fresh) {
      it->second.first = std::max(it->second.first, f.severity);
      if (it->second.second.find(f.code) == std::string::npos) it->second.second += ", " + f.code;
    }
  }
  svg += "<g id=\"map-findings\" fill=\"none\" pointer-events=\"none\">\n";
  for (const auto& [at, e] : rings) {
    const bool error = e.first == Severity::error;
    svg += "<circle class=\"finding-ring\" cx=\"" + num(at.first / 10.0) + "\" cy=\"" + num(at.second / 10.0) +
           "\" r=\"11\" stroke=\"" + (error ? "#8f1313" : "#8a5a00") + "\" stroke-width=\"" + (error ? "2.4" : "1.6") +
           "\"" + (error ? "" : " stroke-dasharray=\"4 2.5\"") + "><title>" + esc(e.second) + "</title></circle>\n";
  }
  svg += "</g>\n<g id=\"map-labels\" font-size=\"12\">\n";
  // Labels: outfalls, pump stations, and (on a detailed map) the structures short of freeboard.
  for (std::size_t s = 0; s < net.structures.size(); ++s) {
    const auto& st = net.structures[s];
    const bool key = st.kind == model::StructureKind::outfall || st.kind == model::StructureKind::pump_station;
    if (!key && (out.simplified || !failing(s_status[s]))) continue;
    const double x = g.sx(st.location.x), y = g.sy(st.location.y);
    const bool right = x < g.width - 120;
    std::string text = st.id;
    if (st.kind == model::StructureKind::outfall) text += " (outfall)";
    if (st.kind == model::StructureKind::pump_station) text += " (pump station)";
    svg += label(right ? x + 14 : x - 14, y - 8, text, right ? "start" : "end") + "\n";
  }
  svg += "</g>\n" + north_arrow(g) + scale_bar(g, sys) + "\n</svg>\n";
  out.svg = std::move(svg);
  // The JSON sits in a <script type="application/json"> of a page that is also well-formed XML: no
  // '<', '>' or '&' in it (they occur only inside JSON strings, where \uXXXX stands for them). Ids
  // that are not UTF-8 (Latin-1 exports) get U+FFFD there; the tables keep their bytes.
  const std::string dumped = data.dump(-1, ' ', false, nlohmann::json::error_handler_t::replace);
  std::string json;
  json.reserve(dumped.size());
  for (char ch : dumped) {
    if (ch == '<') json += "\\u003c";
    else if (ch == '>') json += "\\u003e";
    else if (ch == '&') json += "\\u0026";
    else json += ch;
  }
  out.data_json = std::move(json);
  return out;
}

namespace {

// Shows a clicked feature (or the one a #map-... link names) in the panel beside the map.
constexpr const char* plan_script = R"js(
(function () {
  var data = JSON.parse(document.getElementById('plan-data').textContent);
  var box = document.getElementById('map-info'), chosen = null;
  function add(parent, tag, text, href) {
    var e = document.createElement(tag);
    if (text !== undefined) e.textContent = text;
    if (href) e.setAttribute('href', href);
    parent.appendChild(e);
    return e;
  }
  function show(k) {
    var f = data[k];
    if (!f) return;
    if (chosen) chosen.classList.remove('chosen');
    chosen = document.getElementById('map-' + k);
    if (chosen) chosen.classList.add('chosen');
    box.textContent = '';
    add(box, 'h3', f.t);
    var table = add(box, 'table');
    table.className = 'kv';
    f.v.forEach(function (r) { var tr = add(table, 'tr'); add(tr, 'td', r[0]); add(tr, 'td', r[1]); });
    var p = add(box, 'p');
    if (f.p) { add(p, 'a', 'Profile ' + f.pl, f.p); p.appendChild(document.createTextNode(' ')); }
    (f.x || []).forEach(function (x, i) {
      if (!document.getElementById(x)) return;
      add(p, 'a', f.xc[i] + ' in the exception list', '#' + x);
      p.appendChild(document.createTextNode(' '));
    });
  }
  document.getElementById('plan-svg').addEventListener('click', function (e) {
    var t = e.target.closest('[data-key]');
    if (t) show(t.getAttribute('data-key'));
  });
  function fromHash() { var m = /^#map-(.+)$/.exec(location.hash); if (m) show(m[1]); }
  window.addEventListener('hashchange', fromHash);
  fromHash();
})();
)js";

std::string legend() {
  std::string h = "<ul class=\"legend\">";
  for (const auto& c : structure_palette)
    h += "<li><span class=\"swatch dot\" style=\"background:" + std::string(c.hex) + "\"></span>" + esc(c.label) + "</li>";
  for (const auto& c : conduit_palette)
    h += "<li><span class=\"swatch bar\" style=\"background:" + std::string(c.hex) + "\"></span>Pipe: " + esc(c.label) + "</li>";
  h += "<li><span class=\"swatch bar\" style=\"background:" + std::string(force_main_colour.hex) + "\"></span>Force main</li>";
  h += "<li><span class=\"swatch square\"></span>Outfall</li><li><span class=\"swatch diamond\"></span>Pump station</li>";
  h += "<li><span class=\"swatch ring error\"></span>Error at this feature</li><li><span class=\"swatch ring warning\"></span>"
       "Warning at this feature</li></ul>";
  return h;
}

}  // namespace

void write_plan_map_section(std::ostream& out, const run::CheckRun& run, const FeatureLinks& links) {
  const PlanMap m = plan_map(run, links);
  const auto& net = run.read.network;
  out << "<section id=\"plan\"><h2>Plan</h2>\n<p>The whole network from above (grid north up; "
      << esc(net.crs_description.empty() ? std::string("run CRS") : net.crs_description)
      << "), each structure and pipe in its result over the tailwater cases (the case that governs it); a ring marks a "
         "feature with a warning or an error. "
      << std::to_string(m.structures_drawn) << " of " << std::to_string(net.structures.size()) << " structures and "
      << std::to_string(m.conduits_drawn) << " of " << std::to_string(net.conduits.size()) << " pipes drawn" << (m.simplified ? " (simplified)" : "")
      << ". Hover a feature for its name; click it for its figures and links to its profile and exception rows.</p>\n";
  if (m.simplified) out << "<p class=\"note\" id=\"plan-simplified\">" << esc(m.note) << "</p>\n";
  // The map and its data go out as they are: at 10^6 pipes they are tens of MB each, and joining
  // them into one string first held a second copy at the run's peak of memory.
  out << "<div class=\"plan-wrap\"><figure id=\"plan-map\">" << m.svg
      << "</figure>\n<aside id=\"map-info\" aria-live=\"polite\">"
         "<p>Click a structure or pipe on the map to see its figures here (the tables below list every feature).</p></aside></div>\n";
  out << legend() << "\n<script type=\"application/json\" id=\"plan-data\">" << m.data_json << "</script>\n<script>"
      << plan_script << "</script>\n</section>\n";
}

std::string plan_map_section(const run::CheckRun& run, const FeatureLinks& links) {
  std::ostringstream out;
  write_plan_map_section(out, run, links);
  return std::move(out).str();
}

}  // namespace rimline::report
