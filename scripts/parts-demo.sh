#!/usr/bin/env bash
# A check split into parts over PostGIS (README, "Past one machine"), shown on this machine: loads an
# invented network of several outfall trees (scripts/make_network.py --pipes 300 --seed 5 --loops 0.05:
# three trees, with loops) into the database, lists its parts with scripts/parts.sql, checks the parts
# in two rimline processes at once (each reading its parts through GDAL's PostGIS driver with
# --where), merges their folders with scripts/merge_parts.py, checks the whole network in one run and
# compares: exceptions.csv byte for byte, every layer of results.gpkg row for row (attributes and
# geometry), summary.json in every field the merge sums, takes or concatenates.
# Usage: scripts/parts-demo.sh RIMLINE_BINARY "PG connection string" WORK_DIR
# Called by scripts/postgis-test.sh with its server. Prints "ok"/"FAIL" lines and
# "parts-demo: N passed, N failed"; exits non-zero on any difference.
set -uo pipefail
rimline=${1:?usage: parts-demo.sh RIMLINE_BINARY PG_CONNECTION WORK_DIR}
pg=${2:?usage: parts-demo.sh RIMLINE_BINARY PG_CONNECTION WORK_DIR}
work=${3:?usage: parts-demo.sh RIMLINE_BINARY PG_CONNECTION WORK_DIR}
here=$(cd "$(dirname "$0")/.." && pwd)
py=/usr/bin/python3
passed=0 failed=0
pass() { echo "  ok   $1"; passed=$((passed + 1)); }
fail() { echo "  FAIL $1"; failed=$((failed + 1)); }
finish() { echo "parts-demo: $passed passed, $failed failed"; [ "$failed" -eq 0 ]; exit $?; }
mkdir -p "$work"
start=$(date +%s)

# The network, in the database as the export would be (tables net_pipes, net_structures).
$py "$here/scripts/make_network.py" --pipes 300 --seed 5 --loops 0.05 --out "$work/net" >"$work/make.log" 2>&1 \
  || { fail "make_network.py"; cat "$work/make.log"; finish; }
for layer in pipes structures; do
  ogr2ogr -f PostgreSQL "PG:$pg" "$work/net/network.gpkg" "$layer" -nln "net_$layer" -lco LAUNDER=NO \
    -lco GEOMETRY_NAME=geom -lco FID=ogc_fid -overwrite 2>"$work/ogr.log" || { fail "ogr2ogr $layer"; cat "$work/ogr.log"; finish; }
done
pass "network loaded: $(psql "$pg" -Atc 'SELECT count(*) FROM net_pipes') pipes, $(psql "$pg" -Atc 'SELECT count(*) FROM net_structures') structures"

# The parts, by one query.
psql "$pg" -q -v pipes=net_pipes -v structures=net_structures -v tol=0.5 -f "$here/scripts/parts.sql" \
  >"$work/parts.txt" 2>&1 || { fail "scripts/parts.sql"; cat "$work/parts.txt"; finish; }
nparts=$(psql "$pg" -Atc 'SELECT count(DISTINCT part) FROM rimline_parts')
trees=$(psql "$pg" -Atc "SELECT count(*) FROM net_structures WHERE \"NODE_TYPE\" = 'OUTFALL'")
if [ "$nparts" -ge 2 ] && [ "$nparts" = "$trees" ]; then pass "scripts/parts.sql: $nparts parts, one per outfall tree"
else fail "scripts/parts.sql: $nparts parts for $trees outfall trees"; cat "$work/parts.txt"; fi

# One project file for every run: both layers in the database; a freeboard of 2 m (instead of 0.3 m)
# so that structures fail and budgets.csv has budgets to merge, and two tailwater cases (the outfalls'
# own levels where higher).
sed -e 's|^freeboard = "0.3 m"|freeboard = "2.0 m"|' -e "s|^source = \"network.gpkg\"|source = \"PG:$pg\"|" -e 's|^layer = "pipes"|layer = "net_pipes"|' \
    -e 's|^layer = "structures"|layer = "net_structures"|' "$work/net/project.toml" >"$work/project.toml"

# Two processes: even parts and odd parts (a batch scheduler would hand out parts the same way).
filter() {  # filter LAYER SHARE
  echo "$1=ogc_fid IN (SELECT fid FROM rimline_parts WHERE layer = '$1' AND part % 2 = $2)"
}
cases=(--tailwater "3.5 m" --tailwater "8 m")
t0=$(date +%s.%N)
for share in 0 1; do
  "$rimline" check "$work/project.toml" --out "$work/part-$share" --quiet "${cases[@]}" \
    --where "$(filter pipes $share)" --where "$(filter structures $share)" >"$work/part-$share.log" 2>&1 &
  pids[$share]=$!
done
ok=1
for share in 0 1; do
  wait "${pids[$share]}"; rc=$?
  [ "$rc" -le 1 ] || { ok=0; cat "$work/part-$share.log"; }
done
t1=$(date +%s.%N)
[ $ok = 1 ] && pass "two rimline processes, one per share of the parts ($(awk "BEGIN { printf \"%.1f\", $t1 - $t0 }") s)" \
  || fail "two rimline processes"

$py "$here/scripts/merge_parts.py" --out "$work/merged" "$work/part-0" "$work/part-1" >"$work/merge.log" 2>&1 \
  && pass "$(cat "$work/merge.log")" || { fail "merge_parts.py"; cat "$work/merge.log"; }

"$rimline" check "$work/project.toml" --out "$work/whole" --quiet "${cases[@]}" >"$work/whole.log" 2>&1
[ $? -le 1 ] && pass "one whole run" || { fail "one whole run"; cat "$work/whole.log"; }

# exceptions.csv: the same bytes (both read the same tables, so the fids agree too).
n=$(($(wc -l <"$work/whole/exceptions.csv") - 1))
if [ "$n" -gt 0 ] && cmp -s "$work/whole/exceptions.csv" "$work/merged/exceptions.csv"; then
  pass "exceptions.csv identical ($n findings)"
else fail "exceptions.csv identical"; diff "$work/whole/exceptions.csv" "$work/merged/exceptions.csv" | head -20; fi

if cmp -s "$work/whole/budgets.csv" "$work/merged/budgets.csv"; then pass "budgets.csv identical ($(($(wc -l <"$work/whole/budgets.csv") - 1)) rows)"
else fail "budgets.csv identical"; diff "$work/whole/budgets.csv" "$work/merged/budgets.csv" | head -10; fi

# results.gpkg: every layer, its rows sorted, each row all attributes and the geometry as WKT.
$py - "$work/whole/results.gpkg" "$work/merged/results.gpkg" <<'EOF' >"$work/gpkg.log" 2>&1
import sys
from osgeo import ogr
ogr.UseExceptions()
def rows(path):
    ds = ogr.Open(path)
    out = {}
    for i in range(ds.GetLayerCount()):
        lyr = ds.GetLayer(i)
        n = lyr.GetLayerDefn().GetFieldCount()
        out[lyr.GetName()] = sorted(
            (tuple(str(f.GetField(j)) for j in range(n)), f.GetGeometryRef().ExportToWkt() if f.GetGeometryRef() else "")
            for f in lyr)
    return out
a, b = rows(sys.argv[1]), rows(sys.argv[2])
bad = [name for name in set(a) | set(b) if a.get(name) != b.get(name)]
print(", ".join("%s %d rows" % (name, len(a[name])) for name in sorted(a)))
if bad:
    print("differ:", ", ".join(sorted(bad)))
    sys.exit(1)
EOF
[ $? = 0 ] && pass "results.gpkg layers identical row for row: $(cat "$work/gpkg.log")" || { fail "results.gpkg layers identical"; cat "$work/gpkg.log"; }

# summary.json: every field but the merge's own notes, the fields it names as not merged exactly,
# and the output folder's paths.
$py - "$work/whole/summary.json" "$work/merged/summary.json" <<'EOF' >"$work/summary.log" 2>&1
import json, sys
whole, merged = (json.load(open(p)) for p in sys.argv[1:3])
skip = set(merged.pop("merge")["not_merged"])
def walk(a, b, path, diffs, compared):
    if any(all(x == "*" or x == y for x, y in zip(s.split("."), path.split("."))) and s.count(".") == path.count(".")
           for s in skip):
        return
    if isinstance(a, dict) and isinstance(b, dict):
        for k in set(a) | set(b):
            walk(a.get(k), b.get(k), path + "." + k if path else k, diffs, compared)
    elif isinstance(a, list) and isinstance(b, list) and len(a) == len(b) and all(isinstance(x, dict) for x in a):
        for x, y in zip(a, b):
            walk(x, y, path + ".*", diffs, compared)
    else:
        compared.append(path)
        if a != b:
            diffs.append("%s: whole %r, merged %r" % (path, a, b))
diffs, compared = [], []
walk(whole, merged, "", diffs, compared)
print("%d fields compared, not compared (not merged exactly): %s" % (len(compared), ", ".join(sorted(skip)) or "none"))
if diffs:
    print("\n".join(diffs))
    sys.exit(1)
EOF
[ $? = 0 ] && pass "summary.json equal: $(head -1 "$work/summary.log")" || { fail "summary.json equal"; cat "$work/summary.log"; }

psql "$pg" -q -c "DROP TABLE rimline_parts; DROP TABLE net_pipes; DROP TABLE net_structures" >/dev/null 2>&1
echo "  parts demo took $(($(date +%s) - start)) s"
finish
