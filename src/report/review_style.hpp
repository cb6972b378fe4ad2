#pragma once
// The review report's own styles beyond the base sheet (html_style.hpp): the verdict, the plan map
// and its legend, the sortable results tables, print (landscape A3, budgets open) and narrow screens.
namespace rimline::report {

inline constexpr const char* review_css = R"css(
p.verdict-head { font-size: 16px; padding: 8px 12px; border: 2px solid var(--ink); background: #fff; }
p.verdict-head.fails { border-left: 12px solid var(--error); }
p.verdict-head.meets { border-left: 12px double var(--ink); }
ul.verdict li { margin: 4px 0; }
.plan-wrap { display: flex; gap: 14px; align-items: flex-start; }
figure#plan-map { flex: 1 1 auto; margin: 0; border: 1px solid var(--rule); background: #fff; min-width: 0; }
figure#plan-map svg { display: block; width: 100%; height: auto; }
#plan-svg .feat { cursor: pointer; }
#plan-svg .chosen { stroke: #000; stroke-width: 3; }
#plan-svg polyline.chosen { stroke-width: 6; }
#plan-svg .map-label { paint-order: stroke; stroke: #fff; stroke-width: 3px; fill: var(--ink); }
aside#map-info { flex: 0 0 300px; font-size: 13px; border: 1px solid var(--rule); background: #fff; padding: 6px 10px; }
aside#map-info h3 { margin: 4px 0; }
ul.legend { list-style: none; padding: 0; margin: 6px 0; font-size: 12px; display: flex; flex-wrap: wrap; gap: 4px 16px; }
.swatch { display: inline-block; width: 14px; height: 14px; margin-right: 5px; vertical-align: -2px; border: 1px solid var(--ink);
          -webkit-print-color-adjust: exact; print-color-adjust: exact; }
.swatch.dot { border-radius: 50%; }
.swatch.bar { height: 5px; vertical-align: 3px; border: 0; }
.swatch.square { background: #fff; }
.swatch.diamond { transform: rotate(45deg) scale(0.8); background: #fff; }
.swatch.ring { border-radius: 50%; background: none; border-width: 2px; }
.swatch.ring.error { border-color: var(--error); }
.swatch.ring.warning { border-color: var(--warning); border-style: dashed; }
p.note { font-size: 13px; border-left: 4px solid var(--accent); padding-left: 8px; }
tr:target { outline: 3px solid var(--accent); }
div.scroll { overflow-x: auto; max-width: 100%; }
table.results td { white-space: nowrap; font-variant-numeric: tabular-nums; }
table.sortable th button { font: inherit; font-weight: bold; background: none; border: 0; padding: 0; cursor: pointer; color: var(--ink); text-align: left; }
table.sortable th[aria-sort="ascending"] button::after { content: " \2191"; }
table.sortable th[aria-sort="descending"] button::after { content: " \2193"; }
td.st-flooded, td.st-freeboard { color: var(--error); font-weight: bold; }
td.st-surcharged { color: var(--warning); font-weight: bold; }

/* Print: a landscape A3 document, the size of the profile sheets, so the drawings print at their scales
   and the tables at full width; every energy budget printed open; the map's panel and the filters left out. */
@media print {
  @page { size: A3 landscape; margin: 12mm; }
  body { font-size: 10pt; }
  header, main, footer { padding-left: 0; padding-right: 0; }
  main { max-width: none; }
  nav, p.filter, aside#map-info { display: none; }
  table.grid, table.findings, table.budget, table.results { width: 100%; }
  thead { display: table-header-group; }
  tr { break-inside: avoid; }
  h2, h3 { break-after: avoid; }
  details::details-content { content-visibility: visible; display: block; }
  details > summary { list-style: none; font-weight: bold; color: var(--ink); }
  div.scroll { overflow: visible; }
  table.results { font-size: 8pt; }
  table.results td { white-space: normal; }
  .plan-wrap { display: block; }
  figure#plan-map, figure.profile-figure { break-inside: avoid; }
  a { color: inherit; text-decoration: none; }
  * { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
}
/* A narrow screen (800 px): one column, tables scroll sideways inside their box rather than the page. */
@media (max-width: 900px) {
  header, main, footer { padding-left: 10px; padding-right: 10px; }
  .plan-wrap { flex-direction: column; }
  aside#map-info { flex-basis: auto; width: 100%; }
  table.findings, table.budget, table.grid { display: block; overflow-x: auto; max-width: 100%; }
  table.findings td:nth-child(8) { min-width: 18em; }
  figure.profile-figure { overflow-x: auto; }
  figure.profile-figure svg { min-width: 760px; }
}
)css";

}  // namespace rimline::report
