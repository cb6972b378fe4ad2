#!/usr/bin/env python3
"""Writes data/demo/metric/ground.tif: an invented ground model (DEM) of the Quillfen Heights demo.

The ground passes through the demo's recorded rims (inverse-distance weighting of the rims of
structures/geojson, so the rims and the ground agree where they are recorded), with two invented
features a reviewer should see when data/demo/metric/project-ground.toml runs:
  - B-05 has no recorded rim (a seeded defect of the demo): its rim comes from this ground;
  - a mound of fill raises the ground 1.2 m around C-04: its recorded rim lies below the ground
    (RIM_GROUND_MISMATCH).
A float32 GeoTIFF in EPSG:32631 (the demo's CRS), 15 m pixels, metres, written without any library
(TIFF 6.0 baseline tags plus the GeoTIFF 1.0 tags ModelPixelScale, ModelTiepoint and GeoKeyDirectory).
Deterministic: no random numbers. Run after scripts/make_demo.py.
"""
import json, math, os, struct

HERE = os.path.dirname(os.path.abspath(__file__))
DEMO = os.path.join(HERE, "..", "data", "demo", "metric")
PIXEL = 15.0          # m
PAD = 60.0            # m around the structures
MOUND = ("C-04", 1.2, 45.0)  # structure, height [m], radius [m] of the invented fill
EPSG = 32631

GROUND = """
# An invented ground model (scripts/make_ground.py): B-05, which has no recorded rim, takes the ground
# level there; every recorded rim is compared with the ground (a mound of fill around C-04).
[ground]
source = "ground.tif"
unit = "m"
offset = "0 m"
fill_rims = true
compare_rims = true
rim_tolerance = "0.3 m"
"""

def load_rims():
    with open(os.path.join(DEMO, "structures.geojson")) as f:
        feats = json.load(f)["features"]
    pts = [(f["geometry"]["coordinates"][0], f["geometry"]["coordinates"][1], f["properties"]["RIM"],
            f["properties"]["NODE_ID"]) for f in feats]
    return pts

def ground_at(x, y, rims, mound_xy):
    num = den = 0.0
    for (px, py, rim, _id) in rims:
        if rim is None:
            continue
        d2 = (x - px) ** 2 + (y - py) ** 2
        if d2 < 1e-6:
            return rim
        w = 1.0 / d2
        num += w * rim; den += w
    z = num / den
    mx, my = mound_xy
    r = math.hypot(x - mx, y - my)
    if r < MOUND[2]:
        z += MOUND[1] * 0.5 * (1.0 + math.cos(math.pi * r / MOUND[2]))
    return z

def write_geotiff(path, width, height, x0, y0, values):
    data = struct.pack("<%df" % len(values), *values)
    nodata = b"-9999\x00"
    # (tag, type, count, value-or-bytes); types: 3 SHORT, 4 LONG, 12 DOUBLE, 2 ASCII
    geokeys = [1, 1, 0, 3, 1024, 0, 1, 1, 1025, 0, 1, 1, 3072, 0, 1, EPSG]
    entries = [
        (256, 4, 1, width), (257, 4, 1, height), (258, 3, 1, 32), (259, 3, 1, 1), (262, 3, 1, 1),
        (273, 4, 1, None), (277, 3, 1, 1), (278, 4, 1, height), (279, 4, 1, len(data)), (284, 3, 1, 1),
        (339, 3, 1, 3),
        (33550, 12, 3, struct.pack("<3d", PIXEL, PIXEL, 0.0)),
        (33922, 12, 6, struct.pack("<6d", 0.0, 0.0, 0.0, x0, y0, 0.0)),
        (34735, 3, len(geokeys), struct.pack("<%dH" % len(geokeys), *geokeys)),
        (42113, 2, len(nodata), nodata),
    ]
    ifd_size = 2 + 12 * len(entries) + 4
    extra_at = 8 + ifd_size
    extra = b""
    fields = []
    for tag, typ, count, value in entries:
        if isinstance(value, bytes):
            fields.append((tag, typ, count, extra_at + len(extra)))
            extra += value + (b"\x00" if len(value) % 2 else b"")
        else:
            fields.append((tag, typ, count, value))
    data_at = extra_at + len(extra)
    out = bytearray(b"II*\x00" + struct.pack("<I", 8) + struct.pack("<H", len(fields)))
    for tag, typ, count, value in fields:
        if tag == 273:
            value = data_at
        if typ == 3 and count == 1:
            out += struct.pack("<HHIHH", tag, typ, count, value, 0)
        else:
            out += struct.pack("<HHII", tag, typ, count, value)
    out += struct.pack("<I", 0) + extra + data
    with open(path, "wb") as f:
        f.write(out)

def main():
    rims = load_rims()
    mound_xy = next((x, y) for (x, y, _r, i) in rims if i == MOUND[0])
    xs = [p[0] for p in rims]; ys = [p[1] for p in rims]
    x0 = math.floor((min(xs) - PAD) / PIXEL) * PIXEL
    y1 = math.ceil((max(ys) + PAD) / PIXEL) * PIXEL
    width = int(math.ceil((max(xs) + PAD - x0) / PIXEL))
    height = int(math.ceil((y1 - (min(ys) - PAD)) / PIXEL))
    values = []
    for row in range(height):
        y = y1 - (row + 0.5) * PIXEL
        for col in range(width):
            x = x0 + (col + 0.5) * PIXEL
            values.append(round(ground_at(x, y, rims, mound_xy), 3))
    path = os.path.join(DEMO, "ground.tif")
    write_geotiff(path, width, height, x0, y1, values)
    with open(os.path.join(DEMO, "project.toml")) as f:
        text = f.read()
    text = text.replace("(invented demo, metric)", "(invented demo, metric, rims checked against a ground model)")
    text = text.replace("\n[flows]", GROUND + "\n[flows]", 1)
    with open(os.path.join(DEMO, "project-ground.toml"), "w") as f:
        f.write(text)
    print(f"{width} x {height} pixels of {PIXEL:g} m written to {os.path.normpath(path)} ({os.path.getsize(path)} bytes)")

if __name__ == "__main__":
    main()
