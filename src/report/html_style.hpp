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
@media print { body { background: #fff; } nav { display: none; } details { display: block; } }
)css";

}  // namespace rimline::report
