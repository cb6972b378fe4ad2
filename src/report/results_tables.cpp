#include "report/results_tables.hpp"

#include <algorithm>
#include <functional>
#include <numeric>

#include "report/feature_values.hpp"
#include "report/html_cells.hpp"
#include "report/inputs_detail.hpp"
#include "rimline/report/profile_svg.hpp"

namespace rimline::report {
namespace {

std::string esc(std::string_view s) { return xml_escape(s); }

int status_rank(std::string_view s) {
  return s == "flooded" ? 0 : s == "freeboard" ? 1 : s == "surcharged" ? 2 : s == "not_checked" ? 3 : s == "unknown_rim" ? 4 : 5;
}

// Rows in the network's order, or, past max_result_rows, the worst status first.
std::vector<std::size_t> row_order(std::size_t n, const std::function<std::string(std::size_t)>& status) {
  std::vector<std::size_t> order(n);
  std::iota(order.begin(), order.end(), std::size_t{0});
  if (n <= max_result_rows) return order;
  std::vector<int> rank(n);
  for (std::size_t k = 0; k < n; ++k) rank[k] = status_rank(status(k));
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return rank[a] < rank[b]; });
  order.resize(max_result_rows);
  return order;
}

std::string table(const std::string& id, const std::string& what, const std::vector<ValueColumn>& columns,
                  const std::vector<std::size_t>& order, std::size_t total,
                  const std::function<std::vector<std::string>(std::size_t)>& values,
                  const std::function<std::string(std::size_t, const std::string&)>& links) {
  std::string h = "<p class=\"filter\" id=\"" + id + "-filter\" hidden=\"hidden\"><label>Show only " + what +
                  " whose row contains <input type=\"search\" size=\"18\"/></label> (click a heading to sort)</p>\n";
  if (order.size() < total)
    h += "<p class=\"note\">The first " + std::to_string(order.size()) + " of " + std::to_string(total) + " " + what +
         ", the worst status first; results.gpkg holds every one.</p>\n";
  h += "<div class=\"scroll\"><table class=\"grid sortable results\" id=\"" + id + "\">\n<thead><tr>";
  for (const auto& c : columns) h += std::string("<th") + (c.number ? " data-num=\"1\"" : "") + ">" + esc(c.heading) + "</th>";
  h += "<th>Shown</th></tr></thead>\n<tbody>\n";
  for (std::size_t k : order) {
    const auto v = values(k);
    h += "<tr>";
    for (std::size_t i = 0; i < v.size(); ++i) {
      if (i == 2 || (i == 3 && id == "pipe-table")) h += "<td class=\"st st-" + esc(v[i]) + "\">" + esc(v[i]) + "</td>";
      else h += "<td>" + esc(v[i]) + "</td>";
    }
    h += "<td>" + links(k, v.front()) + "</td></tr>\n";
  }
  h += "</tbody></table></div>\n";
  return h;
}

std::string shown(const FeatureLinks& links, LayerRole layer, const std::string& id) {
  std::string h;
  const std::string map = links.map_id(layer, id);
  if (!map.empty()) h += "<a href=\"#" + esc(map) + "\">map</a>";
  if (const auto p = links.profile(layer, id, static_cast<std::size_t>(-1)))
    h += (h.empty() ? "" : " ") + std::string("<a href=\"") + esc(p->href) + "\">" + esc(p->name) + "</a>";
  return h;
}

}  // namespace

const char* const sortable_script = R"js(
(function () {
  function key(td, num) {
    var t = td ? td.textContent.trim() : '';
    if (!num) return t.toLowerCase();
    var v = parseFloat(t);
    return isNaN(v) ? -Infinity : v;
  }
  document.querySelectorAll('table.sortable').forEach(function (table) {
    var body = table.tBodies[0], heads = table.querySelectorAll('thead th');
    heads.forEach(function (th, col) {
      var num = th.hasAttribute('data-num');
      var button = document.createElement('button');
      button.type = 'button';
      button.textContent = th.textContent;
      th.textContent = '';
      th.appendChild(button);
      button.addEventListener('click', function () {
        var dir = th.getAttribute('aria-sort') === 'ascending' ? -1 : 1;
        heads.forEach(function (o) { o.removeAttribute('aria-sort'); });
        th.setAttribute('aria-sort', dir === 1 ? 'ascending' : 'descending');
        var rows = Array.prototype.slice.call(body.rows);
        rows.sort(function (a, b) {
          var x = key(a.cells[col], num), y = key(b.cells[col], num);
          return dir * ((x > y) - (y > x));
        });
        rows.forEach(function (r) { body.appendChild(r); });
      });
    });
    var filter = document.getElementById(table.id + '-filter');
    if (!filter) return;
    filter.hidden = false;
    filter.querySelector('input').addEventListener('input', function (e) {
      var q = e.target.value.toLowerCase();
      Array.prototype.forEach.call(body.rows, function (r) {
        r.hidden = q !== '' ? r.textContent.toLowerCase().indexOf(q) === -1 : false;
      });
    });
  });
})();
)js";

std::string results_tables_section(const run::CheckRun& run, const FeatureLinks& links) {
  const auto& net = run.read.network;
  const auto sys = run.report_units;
  std::string h = "<section id=\"results\"><h2>Results of every structure and pipe</h2>\n<p>Each figure from the "
                  "tailwater case that governs it (named in the last column); levels in " + esc(vertical_datum_text(run)) +
                  ". The design flow of every pipe is its own column.</p>\n<h3>Structures</h3>\n";
  h += table("structure-table", "structures", structure_columns(sys),
             row_order(net.structures.size(), [&](std::size_t s) { return structure_status(run, s); }),
             net.structures.size(), [&](std::size_t s) { return structure_values(run, s); },
             [&](std::size_t, const std::string& id) { return shown(links, LayerRole::structures, id); });
  h += "<h3>Pipes</h3>\n";
  h += table("pipe-table", "pipes", conduit_columns(sys),
             row_order(net.conduits.size(), [&](std::size_t c) { return conduit_status(run, c); }), net.conduits.size(),
             [&](std::size_t c) { return conduit_values(run, c); },
             [&](std::size_t, const std::string& id) { return shown(links, LayerRole::conduits, id); });
  h += "</section>\n";
  return h;
}

}  // namespace rimline::report
