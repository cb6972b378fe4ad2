#!/usr/bin/env python3
"""Prints one line per output of a `rimline check --out DIR` run: a SHA-256 of its content with
what legitimately changes between two runs of the same data taken out (the run date, the version,
the input paths and their hashes, PDF creation stamps). Two runs whose lines agree wrote the same
outputs byte for byte in every other respect. Used by tests/scale/identical_outputs.sh.
Usage: output_digest.py OUTDIR"""
import hashlib
import json
import pathlib
import re
import sys

from osgeo import ogr

ogr.UseExceptions()
out = pathlib.Path(sys.argv[1])


def digest(data: bytes) -> str:
    return hashlib.sha256(data).hexdigest()


def text_without_dates(path: pathlib.Path) -> bytes:
    text = path.read_text(encoding="utf-8")
    text = re.sub(r"\b20\d\d-\d\d-\d\d( \d\d:\d\d(:\d\d)?( UTC)?)?", "DATE", text)
    # The inputs' SHA-256 (a GeoPackage written twice differs in its timestamps).
    return re.sub(r'<code class="hash">[0-9a-f]{64}</code>', "HASH", text).encode()


def summary(path: pathlib.Path) -> bytes:
    d = json.loads(path.read_text(encoding="utf-8"))
    for key in ("version", "inputs", "run_at", "date"):
        d.pop(key, None)
    return json.dumps(d, sort_keys=True).encode()


def gpkg(path: pathlib.Path) -> bytes:
    ds = ogr.Open(str(path))
    h = hashlib.sha256()
    for i in range(ds.GetLayerCount()):
        layer = ds.GetLayerByIndex(i)
        h.update(layer.GetName().encode())
        defn = layer.GetLayerDefn()
        h.update("|".join(defn.GetFieldDefn(k).GetName() for k in range(defn.GetFieldCount())).encode())
        for f in layer:
            h.update(str(f.GetFID()).encode())
            for k in range(defn.GetFieldCount()):
                h.update(repr(f.GetField(k)).encode())
            g = f.GetGeometryRef()
            if g is not None:
                h.update(g.ExportToWkb())
    return h.hexdigest().encode()


rows = []
for p in sorted(out.rglob("*")):
    if not p.is_file():
        continue
    name = p.relative_to(out).as_posix()
    if p.suffix == ".pdf":
        continue  # cairo stamps the creation time; the same drawings are compared as SVG
    if name == "summary.json":
        rows.append((name, digest(summary(p))))
    elif p.suffix == ".gpkg":
        rows.append((name, digest(gpkg(p))))
    elif p.suffix in (".html", ".svg", ".csv"):
        rows.append((name, digest(text_without_dates(p))))
    else:
        rows.append((name, digest(p.read_bytes())))
for name, d in rows:
    print(f"{d}  {name}")
