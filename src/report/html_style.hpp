#pragma once
// The report's stylesheet, inlined into report.html. A plain engineering look: ink on paper,
// one accent, severity shown by a labelled stripe (readable in greyscale), numbers in tabular figures.
namespace rimline::report {

inline constexpr const char* report_css = R"css(
:root { --ink: #1d232b; --muted: #5b6570; --rule: #c9ced4; --paper: #fbfaf7; --accent: #23527c;
        --error: #8f1313; --warning: #8a5a00; --info: #4a5561; }
* { box-sizing: border-box; }
body { margin: 0; background: var(--paper); color: var(--ink);
       font: 15px/1.45 "DejaVu Sans", "Liberation Sans", Arial, sans-serif; }
header { padding: 18px 32px 12px; border-bottom: 3px double var(--ink); background: #fff; }
header .mark { font-weight: bold; letter-spacing: 0.18em; text-transform: uppercase; font-size: 12px; color: var(--accent); }
h1 { font-size: 24px; margin: 4px 0 8px; }
h2 { font-size: 19px; margin: 28px 0 8px; padding-bottom: 3px; border-bottom: 1px solid var(--rule); }
h3 { font-size: 15px; margin: 18px 0 6px; }
main { padding: 0 32px 24px; max-width: 1700px; }
nav { margin: 12px 0; font-size: 13px; }
nav a { margin-right: 14px; color: var(--accent); }
.caution { border-left: 6px solid var(--ink); background: #f0eee8; padding: 8px 12px; margin: 8px 0; font-size: 13px; }
table { border-collapse: collapse; font-size: 13px; margin: 6px 0; }
td, th { padding: 3px 8px; vertical-align: top; text-align: left; border-bottom: 1px solid var(--rule); }
th { background: #eceae4; font-weight: bold; }
table.kv td:first-child { color: var(--muted); width: 13em; }
code { font-family: "DejaVu Sans Mono", "Liberation Mono", monospace; font-size: 12px; }
code.hash { word-break: break-all; }
.used { display: inline-block; white-space: nowrap; border: 1px solid var(--accent); color: var(--accent); padding: 0 5px; border-radius: 3px; }
table.findings { width: 100%; }
table.findings td:nth-child(5), table.findings td:nth-child(6) { font-variant-numeric: tabular-nums; text-align: right; }
tr.group th { font-size: 13px; text-transform: uppercase; letter-spacing: 0.06em; background: #fff; border-bottom: 2px solid var(--ink); }
tbody.sev-error td:first-child { border-left: 8px solid var(--error); }
tbody.sev-warning td:first-child { border-left: 8px dashed var(--warning); }
tbody.sev-info td:first-child { border-left: 8px dotted var(--info); }
tbody.sev-error tr.group th { color: var(--error); }
tbody.sev-warning tr.group th { color: var(--warning); }
tr.budget-row td { border-bottom: 1px solid var(--rule); background: #f6f5f1; }
details summary { cursor: pointer; color: var(--accent); }
table.budget td:nth-child(3), table.budget td:nth-child(4) { text-align: right; font-variant-numeric: tabular-nums; }
table.budget tr.total td { font-weight: bold; border-top: 2px solid var(--ink); }
figure.profile-figure { margin: 14px 0 22px; background: #fff; border: 1px solid var(--rule); padding: 8px; }
figure.profile-figure svg { display: block; width: 100%; height: auto; }
figcaption { font-size: 13px; color: var(--muted); margin-top: 4px; }
footer { padding: 4px 32px 28px; }
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
@media print { body { background: #fff; } nav { display: none; } details { display: block; } }
)css";

}  // namespace rimline::report
