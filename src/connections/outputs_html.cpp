// The report sections of a proposal's comparison and of a headroom search, with their plan maps
// and the profile with both HGLs (include/rimline/connections/outputs.hpp).
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <functional>
#include <unordered_map>

#include "rimline/connections/outputs.hpp"
#include "rimline/report/outputs.hpp"
#include "rimline/report/profile_svg.hpp"

namespace rimline::connections {
namespace {

using units::Dimension;

std::string esc(const std::string& s) { return report::xml_escape(s); }

std::string num(double v, int decimals = 1) {
  char buf[48];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  return buf;
}

std::string shown(double si, Dimension d, units::System sys) {
  return std::isfinite(si) ? render_message(q(si, d), sys) : "";
}

std::string row(std::initializer_list<std::string> cells, const char* tag = "td") {
  std::string r = "<tr>";
  for (const auto& c : cells) r += std::string("<") + tag + ">" + c + "</" + tag + ">";
  return r + "</tr>\n";
}

// Five classes, darkest the most critical (the labelled legend keeps it readable in greyscale).
constexpr const char* class_colour[] = {"#8f1313", "#c0562b", "#d9a03f", "#9bb56a", "#3f7f55"};
constexpr const char* no_value_colour = "#b8bec5";

// A plan of the network: pipes as lines, structures as dots coloured by `klass` (0-4; -1: no value).
std::string plan_map(const run::CheckRun& run, const std::function<int(std::size_t)>& klass,
                     const std::vector<std::string>& legend, const std::string& title) {
  const auto& net = run.read.network;
  if (net.structures.empty()) return "";
  double x0 = INFINITY, x1 = -INFINITY, y0 = INFINITY, y1 = -INFINITY;
  for (const auto& s : net.structures) {
    x0 = std::min(x0, s.location.x), x1 = std::max(x1, s.location.x);
    y0 = std::min(y0, s.location.y), y1 = std::max(y1, s.location.y);
  }
  const double w = 760.0, h = 460.0, pad = 20.0;
  const double k = std::min((w - 2 * pad) / std::max(x1 - x0, 1.0), (h - 2 * pad) / std::max(y1 - y0, 1.0));
  auto X = [&](double x) { return num(pad + (x - x0) * k); };
  auto Y = [&](double y) { return num(h - pad - (y - y0) * k); };
  std::string svg = "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"" + num(w + 200, 0) + "\" height=\"" + num(h, 0) +
                    "\" role=\"img\" aria-label=\"" + esc(title) + "\"><rect width=\"100%\" height=\"100%\" fill=\"#fff\"/>\n";
  const bool many = net.structures.size() > 20000;  // a city: dots only, the lines would be a grey sheet
  if (!many)
    for (const auto& c : net.conduits) {
      if (c.from == model::no_index || c.to == model::no_index) continue;
      const auto& a = net.structures[c.from].location;
      const auto& b = net.structures[c.to].location;
      svg += "<line x1=\"" + X(a.x) + "\" y1=\"" + Y(a.y) + "\" x2=\"" + X(b.x) + "\" y2=\"" + Y(b.y) +
             "\" stroke=\"#8a939c\" stroke-width=\"1.2\"/>\n";
    }
  for (int pass = -1; pass < 5; ++pass)  // the most critical drawn last, on top
    for (std::size_t s = 0; s < net.structures.size(); ++s) {
      const int c = klass(s);
      if (c != (pass < 0 ? -1 : 4 - pass)) continue;
      svg += "<circle cx=\"" + X(net.structures[s].location.x) + "\" cy=\"" + Y(net.structures[s].location.y) +
             "\" r=\"" + (c < 0 ? "2" : "4") + "\" fill=\"" + (c < 0 ? no_value_colour : class_colour[c]) +
             "\"><title>" + esc(net.structures[s].id) + "</title></circle>\n";
    }
  double ly = 30;
  svg += "<text x=\"" + num(w + 10, 0) + "\" y=\"16\" font-size=\"12\" font-weight=\"bold\">" + esc(title) + "</text>\n";
  for (std::size_t i = 0; i < legend.size() && i < 5; ++i, ly += 18)
    svg += "<circle cx=\"" + num(w + 16, 0) + "\" cy=\"" + num(ly, 0) + "\" r=\"5\" fill=\"" + class_colour[i] +
           "\"/><text x=\"" + num(w + 28, 0) + "\" y=\"" + num(ly + 4, 0) + "\" font-size=\"11\">" + esc(legend[i]) +
           "</text>\n";
  svg += "<circle cx=\"" + num(w + 16, 0) + "\" cy=\"" + num(ly, 0) + "\" r=\"3\" fill=\"" + no_value_colour +
         "\"/><text x=\"" + num(w + 28, 0) + "\" y=\"" + num(ly + 4, 0) + "\" font-size=\"11\">no value</text>\n";
  return svg + "</svg>\n";
}

// The path from a structure down its governing outflows to the outfall, in the proposed run.
std::vector<std::size_t> path_down(const run::CheckRun& run, std::size_t s) {
  std::vector<std::size_t> conduits;
  const auto& net = run.read.network;
  for (std::size_t guard = 0; guard <= net.conduits.size() && !run.cases.empty(); ++guard) {
    const auto& r = run.cases[run.envelope_structure_case[s]].march.structures[s];
    const std::size_t ci = r.governing_outflow != model::no_index ? r.governing_outflow : run.topology.nodes[s].main_outflow;
    if (ci == model::no_index || r.outfall) break;
    conduits.push_back(ci);
    s = net.conduits[ci].to;
  }
  return conduits;
}

// Rim, invert, crown and both HGLs (the envelope over the cases) from the connection to the outfall.
std::string both_hgl_profile(const run::CheckRun& base, const run::CheckRun& proposed, std::size_t start) {
  const auto conduits = path_down(proposed, start);
  if (conduits.empty()) return "";
  const auto& net = proposed.read.network;
  std::unordered_map<std::string, std::size_t> base_index;
  for (std::size_t s = 0; s < base.read.network.structures.size(); ++s) base_index.emplace(base.read.network.structures[s].id, s);
  auto hgl = [](const run::CheckRun& run, std::size_t s) {
    const auto& r = run.cases[run.envelope_structure_case[s]].march.structures[s];
    return r.solved ? r.hgl_m : NAN;
  };
  // Stations from the outfall (0) upstream, as the profiles are drawn.
  struct Point { double station, rim, invert, crown, before, after; std::string id; };
  std::vector<Point> pts;
  double total = 0.0;
  for (std::size_t ci : conduits) total += net.conduits[ci].length_m;
  double st = total;
  std::size_t s = start;
  auto add = [&](std::size_t at, double station, double invert, double rise) {
    const auto b = base_index.find(net.structures[at].id);
    pts.push_back({station, net.structures[at].rim_m.value_or(NAN), invert, invert + rise,
                   b == base_index.end() ? NAN : hgl(base, b->second), hgl(proposed, at), net.structures[at].id});
  };
  for (std::size_t ci : conduits) {
    const auto& c = net.conduits[ci];
    const double rise = hydraulics::rise_m(c.section);
    add(s, st, c.invert_up_m.value_or(NAN), rise);
    st -= c.length_m;
    add(c.to, st, c.invert_down_m.value_or(NAN), rise);
    s = c.to;
  }
  double z0 = INFINITY, z1 = -INFINITY;
  for (const auto& p : pts)
    for (double z : {p.rim, p.invert, p.before, p.after})
      if (std::isfinite(z)) z0 = std::min(z0, z), z1 = std::max(z1, z);
  if (!std::isfinite(z0) || total <= 0.0) return "";
  const double w = 860.0, h = 300.0, pad = 36.0;
  auto X = [&](double x) { return num(pad + x / total * (w - 2 * pad)); };
  auto Y = [&](double z) { return num(h - pad - (z - z0) / std::max(z1 - z0, 0.1) * (h - 2 * pad)); };
  auto polyline = [&](double Point::*m, const char* colour, const char* dash, double width) {
    std::string d;
    for (const auto& p : pts)
      if (std::isfinite(p.*m)) d += X(p.station) + "," + Y(p.*m) + " ";
    return "<polyline points=\"" + d + "\" fill=\"none\" stroke=\"" + colour + "\" stroke-width=\"" + num(width) +
           "\"" + (dash[0] ? std::string(" stroke-dasharray=\"") + dash + "\"" : "") + "/>\n";
  };
  std::string svg = "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"" + num(w, 0) + "\" height=\"" + num(h, 0) +
                    "\" role=\"img\" aria-label=\"profile with the HGL before and after\"><rect width=\"100%\" "
                    "height=\"100%\" fill=\"#fff\"/>\n";
  svg += polyline(&Point::rim, "#5b3a1a", "", 1.5) + polyline(&Point::invert, "#1d232b", "", 1.5) +
         polyline(&Point::crown, "#1d232b", "", 0.8) + polyline(&Point::before, "#23527c", "6 3", 1.6) +
         polyline(&Point::after, "#8f1313", "", 1.8);
  for (std::size_t i = 0; i < pts.size(); i += 2)
    svg += "<text x=\"" + X(pts[i].station) + "\" y=\"" + num(h - 8, 0) + "\" font-size=\"10\" text-anchor=\"middle\">" +
           esc(pts[i].id) + "</text>\n";
  svg += "<text x=\"" + num(w - 330, 0) + "\" y=\"16\" font-size=\"11\"><tspan fill=\"#5b3a1a\">rim</tspan>, invert and "
         "crown; <tspan fill=\"#23527c\">HGL before (dashed)</tspan>, <tspan fill=\"#8f1313\">HGL after</tspan></text>\n";
  return svg + "</svg>\n";
}

}  // namespace

std::string comparison_html(const Comparison& cmp, const run::CheckRun& base, const run::CheckRun& proposed,
                            const std::vector<std::string>& connection_ids) {
  const auto sys = proposed.report_units;
  std::string h = "<section id=\"proposal\"><h2>Proposal: " + esc(cmp.proposal_name.empty() ? "unnamed" : cmp.proposal_name) +
                  "</h2>\n<p>The proposed network was checked with the existing one in the same run: the exceptions "
                  "(the worst of each over the tailwater cases) and the HGL at every structure are compared. A change "
                  "of less than " + shown(cmp.settings.level_tolerance_m, Dimension::length, sys) + " of level, " +
                  shown(cmp.settings.velocity_tolerance_m_s, Dimension::velocity, sys) + " of velocity or " +
                  num(cmp.settings.ratio_tolerance, 2) +
                  " of the capacity ratio counts as none ([comparison]; common practice, no source).</p>\n";
  h += "<p class=\"verdict\"><strong>Verdict: " + esc(render_message(cmp.verdict, sys)) + ".</strong></p>\n";
  if (!cmp.added_pipes.empty() || !cmp.added_structures.empty()) {
    // Which features exist only in the proposal: their exceptions count as new.
    auto listed = [](const std::vector<std::string>& ids) {
      std::string s;
      for (std::size_t i = 0; i < ids.size() && i < 30; ++i) s += (i ? ", " : "") + ids[i];
      if (ids.size() > 30) s += ", ... (" + std::to_string(ids.size() - 30) + " more)";
      return s;
    };
    h += "<p>The proposal adds " + std::to_string(cmp.added_pipes.size()) + " pipe(s)" +
         (cmp.added_pipes.empty() ? "" : " (" + esc(listed(cmp.added_pipes)) + ")") + " and " +
         std::to_string(cmp.added_structures.size()) + " structure(s)" +
         (cmp.added_structures.empty() ? "" : " (" + esc(listed(cmp.added_structures)) + ")") +
         "; they have no figures before, and each exception on them counts as new (unless [comparison] "
         "ignore_codes leaves its code out).</p>\n";
  }
  h += "<table class=\"grid\">" + row({"new", "worsened", "unchanged", "improved", "resolved"}, "th");
  auto n = [&cmp](Change c) {
    const auto it = cmp.counts.find(c);
    return std::to_string(it == cmp.counts.end() ? 0 : it->second);
  };
  h += row({n(Change::new_exception), n(Change::worsened), n(Change::unchanged), n(Change::improved), n(Change::resolved)}) +
       "</table>\n";
  h += "<h3>Exceptions that changed</h3>\n<table class=\"grid\">" +
       row({"change", "feature", "criterion", "before", "after"}, "th");
  std::size_t listed = 0;
  for (const auto& e : cmp.exceptions) {
    if (e.change == Change::unchanged) continue;
    if (++listed > 200) break;
    auto side = [&](const std::optional<Exception>& x) {
      if (!x) return std::string("none");
      return esc(x->finding.code) + " " + shown(x->finding.value, x->finding.dimension, sys) + " (" +
             esc(render_message(x->case_label, sys)) + ")";
    };
    h += row({std::string(change_name(e.change)), esc(std::string(layer_role_name(e.layer)) + " " + e.feature_id),
              esc(e.question), side(e.before), side(e.after)});
  }
  if (listed == 0) h += row({"none", "", "", "", ""});
  h += "</table>\n<p>Every exception of either run, unchanged ones included: changes.csv and the layer "
       "exception_changes of results.gpkg.</p>\n";
  std::vector<const StructureChange*> risen;
  for (const auto& s : cmp.structures)
    if (std::isfinite(s.hgl_change_m()) && s.hgl_change_m() > cmp.settings.level_tolerance_m) risen.push_back(&s);
  std::stable_sort(risen.begin(), risen.end(), [](auto* a, auto* b) { return a->hgl_change_m() > b->hgl_change_m(); });
  h += "<h3>Largest HGL rises</h3>\n<table class=\"grid\">" +
       row({"structure", "HGL before", "HGL after", "rise", "freeboard after"}, "th");
  for (std::size_t i = 0; i < risen.size() && i < 20; ++i)
    h += row({esc(risen[i]->id), shown(risen[i]->hgl_before_m, Dimension::length, sys),
              shown(risen[i]->hgl_after_m, Dimension::length, sys), shown(risen[i]->hgl_change_m(), Dimension::length, sys),
              shown(risen[i]->freeboard_after_m, Dimension::length, sys)});
  if (risen.empty()) h += row({"none above the tolerance", "", "", "", ""});
  h += "</table>\n<p>Every structure: structure_changes.csv and the layer structure_changes.</p>\n";
  const double tol = cmp.settings.level_tolerance_m;
  std::unordered_map<std::size_t, double> rise;
  for (const auto& s : cmp.structures) rise[s.structure] = s.hgl_change_m();
  const double u = report::to_report(1.0, Dimension::length, sys);
  auto lbl = [&](double a, double b) {
    return b > 1e9 ? "rise over " + num(a * u, 3) : "rise " + num(a * u, 3) + " to " + num(b * u, 3);
  };
  const std::vector<double> edge{tol, 0.01, 0.05, 0.2};
  h += plan_map(proposed,
                [&](std::size_t s) {
                  const double r = rise.count(s) ? rise[s] : NAN;
                  if (!std::isfinite(r)) return -1;
                  if (r > edge[3]) return 0;
                  if (r > edge[2]) return 1;
                  if (r > edge[1]) return 2;
                  if (r > edge[0]) return 3;
                  return 4;
                },
                {lbl(edge[3], 1e10), lbl(edge[2], edge[3]), lbl(edge[1], edge[2]), lbl(edge[0], edge[1]),
                 "no change (within " + num(tol * u, 3) + ")"},
                "HGL change (" + std::string(units::unit_symbol(units::display_unit(Dimension::length, sys))) + ")");
  for (const auto& id : connection_ids) {
    const std::size_t s = model::find_structure(proposed.read.network, id);
    if (s == model::no_index) continue;
    const std::string svg = both_hgl_profile(base, proposed, s);
    if (!svg.empty()) h += "<h3>Profile from " + esc(id) + " to its outfall</h3>\n" + svg;
  }
  return h + "</section>\n";
}

std::string headroom_html(const std::vector<Headroom>& headroom, const run::CheckRun& run,
                          const config::ConnectionSettings& settings) {
  const auto sys = run.report_units;
  const auto& hs = settings.headroom;
  std::string h = "<section id=\"headroom\"><h2>Connection headroom</h2>\n<p>At each structure, the largest inflow "
                  "that can be added there before any criterion anywhere in the network fails, under every tailwater "
                  "case. ";
  h += hs.existing == config::ExistingExceptions::none
           ? "Rule ([headroom] existing = \"none\"): no exception may stand on the part the added flow reaches. "
           : "Rule (the default, [headroom] existing = \"no_worse\"): the added flow creates no new exception and "
             "worsens no existing one by more than the tolerance (" +
                 shown(settings.comparison.level_tolerance_m, Dimension::length, sys) + " of level). ";
  h += "Found by bracketing and bisection to within " + shown(hs.precision_m3_s, Dimension::flow, sys) + " or " +
       num(hs.relative_precision * 100.0, 1) + " %, whichever is larger; the pump stations keep their operating "
       "points. Every structure: headroom.csv and the layer headroom of results.gpkg.</p>\n";
  std::vector<const Headroom*> sorted;
  for (const auto& x : headroom)
    if (std::isfinite(x.headroom_m3_s)) sorted.push_back(&x);
  std::stable_sort(sorted.begin(), sorted.end(), [](auto* a, auto* b) { return a->headroom_m3_s < b->headroom_m3_s; });
  if (const std::size_t n = not_searched_for_the_solve(headroom))
    h += "<p class=\"warn\">" + std::to_string(n) + " structure" + (n == 1 ? " was" : "s were") +
         " not searched: the added flow there would reach pipes the network solve settles (loops, diversions "
         "split by the levels, several outlets), which a trial re-solve along the tree cannot stand for; "
         "headroom.csv names them. Split diversions by capacity, field or fixed shares ([flows] split) to "
         "search them with the march.</p>\n";
  h += "<table class=\"grid\">" + row({"structure", "headroom", "fails first at", "criterion", "how", "case"}, "th");
  for (std::size_t i = 0; i < sorted.size() && i < 25; ++i) {
    const auto& x = *sorted[i];
    h += row({esc(x.id), esc(headroom_text(x, sys)),
              x.governing_id.empty() ? "" : esc(std::string(layer_role_name(x.governing_layer)) + " " + x.governing_id),
              esc(x.criterion), esc(x.change), esc(render_message(x.case_label, sys))});
  }
  h += "</table>\n";
  // Classes by quintile of the headroom found, lowest (most critical) first.
  std::vector<double> values;
  for (auto* x : sorted) values.push_back(x->headroom_m3_s);
  std::unordered_map<std::size_t, int> klass;
  std::vector<std::string> legend;
  if (!values.empty()) {
    std::vector<double> edge;
    for (int k = 1; k < 5; ++k) edge.push_back(values[values.size() * static_cast<std::size_t>(k) / 5]);
    for (auto* x : sorted)
      klass[x->structure] = static_cast<int>(std::upper_bound(edge.begin(), edge.end(), x->headroom_m3_s) - edge.begin());
    double lo = values.front();
    for (int k = 0; k < 5; ++k) {
      const double hi = k < 4 ? edge[static_cast<std::size_t>(k)] : values.back();
      legend.push_back(display_number(lo, Dimension::flow, sys) + " to " + display_number(hi, Dimension::flow, sys));
      lo = hi;
    }
  }
  h += plan_map(run, [&](std::size_t s) { return klass.count(s) ? klass[s] : -1; }, legend,
                "headroom (" + std::string(units::unit_symbol(units::display_unit(Dimension::flow, sys))) + ")");
  return h + "</section>\n";
}

}  // namespace rimline::connections
