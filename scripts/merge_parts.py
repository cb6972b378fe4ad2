#!/usr/bin/python3
"""Merges the output folders of a check split into parts (README, "Past one machine").

    /usr/bin/python3 scripts/merge_parts.py --out MERGED PART_DIR [PART_DIR ...]

Each PART_DIR is the --out folder of one `rimline check` over one part of the network (the same
project file, a different --where filter). The parts must not share a pipe or structure.

- exceptions.csv: one header, the rows of every part in the order rimline writes them: severity
  (error, warning, info), then code, then layer (conduits, structures, force_mains, catchments,
  project, pump_stations), then feature id (byte order), a part's own order kept among equals
  (src/base/finding.cpp, finding_before and its stable sort);
- results.gpkg: every layer's rows appended (parts in the order given), layer_styles once (the first
  part's);
- summary.json: counts summed, extremes taken with their feature (worst_freeboard), lists
  concatenated, what must be the same in every part (tool, methods, criteria, units, CRS ...) checked
  equal; fields that cannot be merged exactly are listed under "merge.not_merged" with the rule used;
- budgets.csv: each budget's rows kept together, the budgets in the order of their structures in the
  merged exceptions.csv; every other CSV (headroom.csv, changes.csv ...): one header, rows concatenated.
report.html, profiles/ and profiles.pdf are not merged: they stay in each part's folder.
"""
import argparse
import csv
import json
import os
import shutil
import sys

from osgeo import gdal, ogr

gdal.UseExceptions()
ogr.UseExceptions()

SEVERITY_RANK = {"error": 0, "warning": 1, "info": 2}  # rimline writes the most severe first
LAYER_RANK = {n: i for i, n in enumerate(["conduits", "structures", "force_mains", "catchments", "project",
                                          "pump_stations"])}  # enum LayerRole's order
PER_PART_FILES = {"report.html", "profiles", "profiles.pdf"}

# summary.json fields summed over the parts, by dotted path ("*" for any list item).
SUMMED = {"network.structures", "network.conduits", "network.outfalls", "network.outfalls_assumed", "network.trees",
          "network.diversions", "network.total_length", "network_solve.networks", "network_solve.structures",
          "network_solve.pipes", "network_solve.loops", "network_solve.diversions", "network_solve.levels_by_newton",
          "network_solve.newton_pieces", "network_solve.pipes_against_source", "network_solve.networks_not_converged",
          "network_solve.cases.*.profiles_computed", "network_solve.cases.*.pipes_other_way_than_first_case",
          "cases.*.structures_solved", "cases.*.criteria_findings"}
MAXIMA = {"network_solve.design_flow_rounds", "network_solve.cases.*.largest_continuity_error"}
ALL_TRUE = {"network_solve.design_flows_settled", "network_solve.cases.*.converged"}
ANY_TRUE = set()
# The largest of the parts is taken, but a single run's figure is not that: listed as not merged.
NOT_EXACT = {"network_solve.cases.*.newton_steps": "the largest of the parts (a single run counts the steps of its "
                                                   "slowest component the same way only when components are solved "
                                                   "together)",
             "network_solve.cases.*.last_level_change": "the largest of the parts"}


def read_csv(path):
    with open(path, newline="", encoding="utf-8") as f:
        return list(csv.reader(f))


def write_csv(path, header, rows):
    with open(path, "w", newline="", encoding="utf-8") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(header)
        w.writerows(rows)


def finding_key(col):
    def key(row):
        return (SEVERITY_RANK.get(row[col["severity"]], 3), row[col["code"]].encode(),
                LAYER_RANK.get(row[col["layer"]], len(LAYER_RANK)), row[col["feature_id"]].encode())
    return key


def merge_exceptions(parts, out):
    header, rows = None, []
    for p in parts:
        table = read_csv(os.path.join(p, "exceptions.csv"))
        if header is None:
            header = table[0]
        elif table[0] != header:
            sys.exit("merge_parts: %s/exceptions.csv has other columns than the first part's" % p)
        rows.extend(table[1:])
    col = {name: i for i, name in enumerate(header)}
    rows.sort(key=finding_key(col))  # Python's sort is stable, as std::stable_sort
    write_csv(os.path.join(out, "exceptions.csv"), header, rows)
    return header, rows


def merge_budgets(parts, out, exception_header, exception_rows):
    col = {name: i for i, name in enumerate(exception_header)}
    order = {}
    for r in exception_rows:
        if r[col["layer"]] == "structures":
            order.setdefault(r[col["feature_id"]], len(order))
    header, blocks = None, []
    for p in parts:
        path = os.path.join(p, "budgets.csv")
        if not os.path.exists(path):
            continue
        table = read_csv(path)
        header = header or table[0]
        for r in table[1:]:
            if blocks and blocks[-1][0] == r[0]:
                blocks[-1][1].append(r)
            else:
                blocks.append((r[0], [r]))
    if header is None:
        return
    blocks.sort(key=lambda b: order.get(b[0], len(order)))
    write_csv(os.path.join(out, "budgets.csv"), header, [r for _, rows in blocks for r in rows])


def merge_other_csv(parts, out, name):
    header, rows = None, []
    for p in parts:
        path = os.path.join(p, name)
        if os.path.exists(path):
            table = read_csv(path)
            header = header or table[0]
            rows.extend(table[1:])
    write_csv(os.path.join(out, name), header, rows)


def merge_gpkg(parts, out):
    target = os.path.join(out, "results.gpkg")
    shutil.copyfile(os.path.join(parts[0], "results.gpkg"), target)
    for p in parts[1:]:
        src = gdal.OpenEx(os.path.join(p, "results.gpkg"), gdal.OF_VECTOR)
        names = [src.GetLayer(i).GetName() for i in range(src.GetLayerCount())]
        src = None
        for name in names:
            if name == "layer_styles":
                continue
            gdal.VectorTranslate(target, os.path.join(p, "results.gpkg"), format="GPKG", accessMode="append",
                                 layers=[name], layerName=name)


def path_match(path, patterns):
    parts = path.split(".")
    for pat in patterns:
        pp = pat.split(".")
        if len(pp) == len(parts) and all(a == "*" or a == b for a, b in zip(pp, parts)):
            return pat
    return None


class SummaryMerge:
    def __init__(self):
        self.not_merged = {}

    def values(self, path, values):
        present = [v for v in values if v is not None]
        if path_match(path, SUMMED):
            total = sum(present)
            return round(total, 6) if isinstance(total, float) else total
        if path_match(path, MAXIMA):
            return max(present) if present else None
        if path_match(path, ALL_TRUE):
            return all(present)
        pat = path_match(path, NOT_EXACT)
        if pat:
            self.not_merged[pat] = NOT_EXACT[pat]
            return max(present) if present else None
        if path == "cases.*.tailwater":  # the case's one level; per outfall (null) when the parts differ
            if all(v == values[0] for v in values):
                return values[0]
            return None  # as a single run over outfalls of different levels
        if path == "checked_nothing":
            return all(values)
        if path == "inputs":
            seen, out = set(), []
            for v in values:
                for item in v:
                    k = json.dumps(item, sort_keys=True)
                    if k not in seen:
                        seen.add(k)
                        out.append(item)
            return out
        if path == "worst_freeboard":
            return min((v for v in present if v.get("freeboard") is not None), key=lambda v: v["freeboard"],
                       default=values[0])
        if path == "cases":
            return self.cases(path, values)
        if path.startswith("counts."):
            if all(isinstance(v, dict) for v in values):
                return self.dicts(path, values, sum_missing=True)
            return sum(present)
        if all(isinstance(v, dict) for v in values):
            return self.dicts(path, values)
        if all(isinstance(v, list) for v in values) and all(len(v) == len(values[0]) for v in values) and \
                all(isinstance(i, dict) for v in values for i in v) and path == "network_solve.cases":
            return [self.dicts(path + ".*", list(items)) for items in zip(*values)]
        if all(v == values[0] for v in values):
            return values[0]
        if all(isinstance(v, list) for v in values):
            self.not_merged[path] = "lists concatenated"
            return [i for v in values for i in v]
        self.not_merged[path] = "differs between the parts; the first part's value is kept"
        return values[0]

    def dicts(self, path, values, sum_missing=False):
        keys = []
        for v in values:
            keys += [k for k in v if k not in keys]
        out = {}
        for k in keys:
            sub = path + "." + k if path else k
            got = [v.get(k) for v in values]
            if sum_missing:
                out[k] = self.values(sub, [g if g is not None else 0 for g in got]) if not all(
                    isinstance(g, dict) for g in got if g is not None) else self.dicts(sub, [g or {} for g in got], True)
            elif any(g is None for g in got) and not all(g is None for g in got) and sub != "cases.*.tailwater":
                present = [g for g in got if g is not None]
                out[k] = present[0] if all(g == present[0] for g in present) else self.values(sub, present)
            else:
                out[k] = self.values(sub, got)
        return out

    def cases(self, path, values):
        if any(len(v) != len(values[0]) for v in values):
            sys.exit("merge_parts: the parts ran different numbers of cases (give each the same --tailwater)")
        out = []
        for i in range(len(values[0])):
            items = [v[i] for v in values]  # the cases in the order run (the same options in every part)
            if any(it["label"] != items[0]["label"] for it in items):
                self.not_merged["cases.*.label"] = ("differs between the parts (it follows their outfalls' "
                                                    "tailwater fields); the first part's label is kept")
            merged = self.dicts(path + ".*", [{k: x for k, x in it.items() if k not in ("outfalls", "label",
                                                                                       "outfalls_by_source")}
                                              for it in items])
            merged = {"label": items[0]["label"], **merged}
            if "outfalls_by_source" in items[0]:
                merged["outfalls_by_source"] = self.dicts("counts", [it["outfalls_by_source"] for it in items], True)
            if "outfalls" in items[0]:
                merged["outfalls"] = sorted((o for it in items for o in it["outfalls"]), key=lambda o: o["outfall"])
            out.append(merged)
        return out


def merge_summary(parts, out):
    summaries = []
    for p in parts:
        with open(os.path.join(p, "summary.json"), encoding="utf-8") as f:
            summaries.append(json.load(f))
    m = SummaryMerge()
    merged = m.dicts("", summaries)
    merged["merge"] = {"parts": [os.path.abspath(p) for p in parts],
                       "not_merged": m.not_merged,
                       "per_part": "report.html, profiles/ and profiles.pdf stay in each part's folder"}
    with open(os.path.join(out, "summary.json"), "w", encoding="utf-8") as f:
        json.dump(merged, f, indent=2, ensure_ascii=False)
        f.write("\n")
    return m.not_merged


def main():
    ap = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    ap.add_argument("--out", required=True, help="folder for the merged outputs (created; must not exist)")
    ap.add_argument("parts", nargs="+", help="the parts' --out folders")
    a = ap.parse_args()
    for p in a.parts:
        for need in ("exceptions.csv", "results.gpkg", "summary.json"):
            if not os.path.exists(os.path.join(p, need)):
                sys.exit("merge_parts: %s has no %s (not a finished rimline check output?)" % (p, need))
    os.makedirs(a.out)
    header, rows = merge_exceptions(a.parts, a.out)
    merge_budgets(a.parts, a.out, header, rows)
    merge_gpkg(a.parts, a.out)
    not_merged = merge_summary(a.parts, a.out)
    others = sorted({n for p in a.parts for n in os.listdir(p)
                     if n.endswith(".csv") and n not in ("exceptions.csv", "budgets.csv")})
    for name in others:
        merge_other_csv(a.parts, a.out, name)
    print("merge_parts: %d parts -> %s: %d findings; not merged exactly: %s; per part: report.html, profiles"
          % (len(a.parts), a.out, len(rows), ", ".join(sorted(not_merged)) or "none"))


if __name__ == "__main__":
    main()
