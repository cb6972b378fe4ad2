#!/usr/bin/env bash
# A real database source: loads data/demo/metric into PostGIS on a throw-away loopback server,
# runs `rimline check` against the PG: connection and against the GeoJSON files, and compares
# exceptions.csv and every structure's HGL (results.gpkg); then scripts/parts-demo.sh checks a network
# split into parts in two processes against one run. Usage: scripts/postgis-test.sh RIMLINE_BINARY
# Needs root (installs postgresql postgresql-15-postgis-3 with apt-get when missing; runs the
# server as the postgres user). Prints "postgis-test: N passed, N failed"; exit 0 only if none failed.
set -uo pipefail
rimline=${1:?usage: postgis-test.sh RIMLINE_BINARY}
rimline=$(readlink -f "$rimline")
here=$(cd "$(dirname "$0")/.." && pwd)
demo=$here/data/demo/metric
passed=0 failed=0
pass() { echo "  ok   $1"; passed=$((passed + 1)); }
fail() { echo "  FAIL $1"; failed=$((failed + 1)); }
finish() { echo "postgis-test: $passed passed, $failed failed"; [ "$failed" -eq 0 ]; exit $?; }

pgbin=/usr/lib/postgresql/15/bin
if [ ! -f /usr/share/postgresql/15/extension/postgis.control ] || [ ! -x $pgbin/pg_ctl ]; then
  DEBIAN_FRONTEND=noninteractive apt-get install -y postgresql postgresql-15-postgis-3 >/dev/null 2>&1 \
    || { fail "apt-get install postgresql postgresql-15-postgis-3"; finish; }
fi

tmp=$(mktemp -d /tmp/rimline-postgis.XXXXXX)
chown postgres "$tmp"
port=$((20000 + RANDOM % 20000))
as_pg() { runuser -u postgres -- "$@"; }
stop_server() {
  [ -f "$tmp/data/postmaster.pid" ] && as_pg $pgbin/pg_ctl -D "$tmp/data" -m fast -w stop >/dev/null 2>&1
  rm -rf "$tmp"
}
trap stop_server EXIT

as_pg $pgbin/initdb -D "$tmp/data" -A trust -U postgres >"$tmp/initdb.log" 2>&1 || { fail "initdb"; cat "$tmp/initdb.log"; finish; }
as_pg $pgbin/pg_ctl -D "$tmp/data" -l "$tmp/server.log" -w \
  -o "-c listen_addresses=127.0.0.1 -p $port -k $tmp" start >/dev/null 2>&1 \
  || { fail "server start on 127.0.0.1:$port"; cat "$tmp/server.log"; finish; }
pass "server started on 127.0.0.1:$port"

pg="host=127.0.0.1 port=$port user=postgres dbname=rimline_demo"
as_pg $pgbin/createdb -h 127.0.0.1 -p "$port" rimline_demo && \
  psql "$pg" -q -c "CREATE EXTENSION postgis" >/dev/null 2>&1 && pass "database with postgis" || { fail "createdb + postgis"; finish; }

# LAUNDER=NO keeps the export's field names (PIPE_ID, US_INV ...) so the same mapping applies.
for layer in pipes structures; do
  if ogr2ogr -f PostgreSQL "PG:$pg" "$demo/$layer.geojson" -nln "$layer" -lco LAUNDER=NO -lco GEOMETRY_NAME=geom 2>"$tmp/ogr.log"; then
    pass "ogr2ogr $layer"
  else
    fail "ogr2ogr $layer"; cat "$tmp/ogr.log"
  fi
done

# The demo's project file, with both sources pointing at the database.
sed -e "s|^source = \"pipes.geojson\"|source = \"PG:$pg\"\nlayer = \"pipes\"|" \
    -e "s|^source = \"structures.geojson\"|source = \"PG:$pg\"\nlayer = \"structures\"|" \
    "$demo/project.toml" >"$tmp/project.toml"
if [ "$(grep -c '^source = "PG:' "$tmp/project.toml")" = 2 ]; then pass "project file with PG: sources"; else fail "project file with PG: sources"; fi

"$rimline" check "$demo/project.toml" --out "$tmp/out-file" --fail-on error >"$tmp/run-file.log" 2>&1; rc_file=$?
"$rimline" check "$tmp/project.toml" --out "$tmp/out-pg" --fail-on error >"$tmp/run-pg.log" 2>&1; rc_pg=$?
if [ "$rc_pg" -le 1 ] && [ "$rc_pg" = "$rc_file" ]; then pass "rimline check on PostGIS (exit $rc_pg, files $rc_file)"
else fail "rimline check on PostGIS (exit $rc_pg, files $rc_file)"; cat "$tmp/run-pg.log"; fi

# The database run read the database, not the demo's files.
if [ -s "$tmp/out-pg/summary.json" ] && ! grep -q 'geojson' "$tmp/out-pg/summary.json"; then pass "PostGIS run read no GeoJSON file"
else fail "PostGIS run read no GeoJSON file"; fi

# The fid column is the feature's id in its own source (GeoJSON counts from 0, the PostGIS table has its
# own key): every other column must be identical.
without_fid() {
  /usr/bin/python3 -c 'import csv, sys
rows = list(csv.reader(open(sys.argv[1], newline="")))
assert rows and rows[0][4] == "fid", "no fid column"
w = csv.writer(sys.stdout, lineterminator="\n")
for r in rows: w.writerow(r[:4] + r[5:])' "$1"
}
without_fid "$tmp/out-file/exceptions.csv" >"$tmp/file-nofid.csv" 2>&1 || true
without_fid "$tmp/out-pg/exceptions.csv" >"$tmp/pg-nofid.csv" 2>&1 || true
if [ -s "$tmp/out-file/exceptions.csv" ] && cmp -s "$tmp/file-nofid.csv" "$tmp/pg-nofid.csv"; then
  pass "exceptions.csv identical but for the sources' fids ($(($(wc -l <"$tmp/out-file/exceptions.csv") - 1)) findings)"
else
  fail "exceptions.csv identical but for the sources' fids"; diff "$tmp/file-nofid.csv" "$tmp/pg-nofid.csv" | head -20
fi

# Each structure's HGL, by id, from both result layers.
hgls() { ogr2ogr -f CSV /vsistdout/ "$1/results.gpkg" -sql "SELECT id, hgl FROM structures ORDER BY id" 2>/dev/null; }
hgls "$tmp/out-file" >"$tmp/hgl-file.csv"; hgls "$tmp/out-pg" >"$tmp/hgl-pg.csv"
n=$(($(wc -l <"$tmp/hgl-file.csv") - 1))
if [ "$n" -gt 0 ] && cmp -s "$tmp/hgl-file.csv" "$tmp/hgl-pg.csv"; then pass "structure HGLs identical ($n structures)"
else fail "structure HGLs identical"; diff "$tmp/hgl-file.csv" "$tmp/hgl-pg.csv" | head -20; fi

# A check split into parts (README, "Past one machine"): two processes over the same database, merged,
# against one whole run.
t_parts=$(date +%s)
if bash "$here/scripts/parts-demo.sh" "$rimline" "$pg" "$tmp/parts" 2>&1 | sed 's/^/  /'; then
  pass "parts demo: merged outputs of two processes equal one run's ($(($(date +%s) - t_parts)) s)"
else
  fail "parts demo: merged outputs of two processes equal one run's"
fi

stop_server; trap - EXIT
if [ ! -d "$tmp" ]; then pass "server stopped, temp dir removed"; else fail "server stopped"; fi
finish
