#!/usr/bin/python3
"""Writes a synthetic dendritic storm network of N pipes as a GeoPackage and a rimline project.

    /usr/bin/python3 scripts/make_network.py --pipes 100000 --seed 1 --out bench/data/n100000

Writes OUT/network.gpkg (layers `pipes`, `structures`) and OUT/project.toml.

Invented data only, for benchmarking; nothing in it is a check value. The layout:
- several outfall trees (one per ~2500 pipes, at least 3), each in its own square cell;
- each tree is a random spanning tree grown from its outfall (randomised Prim) over a grid of
  manholes 75 m apart, each jittered by up to 18 m, so pipes are 39-117 m long and no two
  manholes are closer than 39 m (nothing snaps by accident);
- a pipe's slope is drawn from 0.3-1.0 % (0.1-0.4 % for 900 mm and up); its size is the smallest
  of a usual metric series whose Manning full capacity (n 0.013) carries 1.25 x the accumulated
  inflow, never smaller than a pipe arriving upstream, and 4 % of pipes one size short (they
  surcharge);
- inverts fall downstream with crowns matched at each manhole; rims sit 1.2-3.0 m above the
  crown of the pipe leaving the manhole; half the outfalls have a tailwater level;
- 1 % of pipes are digitised against the flow (inverts in digitising order, as such exports
  carry them), 10 % have a bend vertex.
- with --loops F (e.g. 0.05): extra pipes join neighbouring manholes of the same tree that the tree
  joins only a few pipes apart (relief and cross connections), until a share F of the structures
  lies on a loop; each is the smaller of the sizes at its ends, its inverts 5 cm above the sumps,
  digitised either way. The N pipes of the tree stay as they are (N counts the tree pipes; the
  loop pipes come on top, about F x N / 4 of them). They draw from their own random stream, so
  without --loops the network is the same as before.
Deterministic for a given seed and N (Python's random.Random, Mersenne Twister).
"""
import argparse
import heapq
import math
import os
import random
import sys
import time

from osgeo import ogr, osr

ogr.UseExceptions()
osr.UseExceptions()

SPACING_M = 75.0
JITTER_M = 18.0
MANNING_N = 0.013
SIZES_MM = [225, 300, 375, 450, 525, 600, 675, 750, 825, 900, 1050, 1200, 1350, 1500, 1650, 1800, 2100,
            2400, 2700, 3000, 3300, 3600]
EPSG = 32755  # WGS 84 / UTM zone 55S: a projected CRS in metres
ORIGIN = (300000.0, 5800000.0)
BATCH = 50000  # features per transaction


def full_capacity_m3s(d_m, slope):
    # Manning, full circular pipe: Q = (1/n) A R^(2/3) S^(1/2), R = D/4.
    area = math.pi * d_m * d_m / 4.0
    return area * (d_m / 4.0) ** (2.0 / 3.0) * math.sqrt(slope) / MANNING_N


def grow_tree(rng, n_pipes):
    """Random spanning tree over a grid, grown from (0, 0). Returns (cells, parent) in growth order:
    cells[0] is the outfall; parent[k] is the index of the cell downstream of cell k."""
    side = int(math.ceil(math.sqrt(n_pipes + 1))) + 1
    index = {(0, 0): 0}
    cells = [(0, 0)]
    parent = [-1]
    frontier = []

    def push(k):
        i, j = cells[k]
        for di, dj in ((1, 0), (0, 1), (-1, 0), (0, -1)):
            c = (i + di, j + dj)
            if 0 <= c[0] < side and 0 <= c[1] < side and c not in index:
                heapq.heappush(frontier, (rng.random(), c, k))

    push(0)
    while len(cells) < n_pipes + 1 and frontier:
        _, c, k = heapq.heappop(frontier)
        if c in index:
            continue
        index[c] = len(cells)
        cells.append(c)
        parent.append(k)
        push(len(cells) - 1)
    return cells, parent, side


def add_loops(rng, cells, parent, share, max_cycle=8):
    """Pairs (a, b) of grid neighbours in one tree, not parent and child, whose tree path is at
    most max_cycle pipes, until a share of the cells lies on a cycle."""
    m = len(cells)
    depth = [0] * m
    for k in range(1, m):
        depth[k] = depth[parent[k]] + 1
    index = {c: k for k, c in enumerate(cells)}
    on_cycle = [False] * m
    covered = 0
    links = []
    order = list(range(1, m))
    rng.shuffle(order)
    for a in order:
        if covered >= share * m:
            break
        i, j = cells[a]
        for di, dj in ((1, 0), (0, 1), (-1, 0), (0, -1)):
            b = index.get((i + di, j + dj))
            if b is None or b == 0 or parent[a] == b or parent[b] == a:
                continue
            path, x, y = [], a, b
            while x != y and len(path) <= max_cycle + 1:
                if depth[x] >= depth[y]:
                    path.append(x)
                    x = parent[x]
                else:
                    path.append(y)
                    y = parent[y]
            if x != y or len(path) > max_cycle:
                continue
            path.append(x)
            for k in path:
                if not on_cycle[k]:
                    on_cycle[k] = True
                    covered += 1
            links.append((a, b))
            break
    return links


def build(n_total, seed, loop_share=0.0):
    rng = random.Random(seed)
    n_trees = max(3, n_total // 2500)
    base = n_total // n_trees
    sizes = [base] * n_trees
    for t in range(n_total - base * n_trees):
        sizes[t] += 1
    # Vary the tree sizes by moving pipes between neighbouring trees, keeping the total.
    for t in range(0, n_trees - 1, 2):
        d = int(base * 0.3 * rng.random())
        sizes[t] += d
        sizes[t + 1] -= d
    cols = int(math.ceil(math.sqrt(n_trees)))
    cell_m = (int(math.ceil(math.sqrt(max(sizes) + 1))) + 3) * SPACING_M

    nodes = []  # (id, type, x, y, rim, sump, inflow_lps, tailwater or None)
    pipes = []  # (id, us_id, ds_id, dia_mm, material, inv_up, inv_dn, coords)
    for t, n_pipes in enumerate(sizes):
        ox = ORIGIN[0] + (t % cols) * cell_m
        oy = ORIGIN[1] + (t // cols) * cell_m
        cells, parent, side = grow_tree(rng, n_pipes)
        m = len(cells)
        xy = []
        for k, (i, j) in enumerate(cells):
            jx = 0.0 if k == 0 else rng.uniform(-JITTER_M, JITTER_M)
            jy = 0.0 if k == 0 else rng.uniform(-JITTER_M, JITTER_M)
            xy.append((ox + i * SPACING_M + jx, oy + j * SPACING_M + jy))
        inflow = [0.0] + [round(rng.uniform(1.0, 6.0), 2) for _ in range(m - 1)]
        # Pipe k (k >= 1) runs from cell k down to parent[k].
        length = [0.0] * m
        slope = [0.0] * m
        for k in range(1, m):
            p = parent[k]
            length[k] = math.hypot(xy[k][0] - xy[p][0], xy[k][1] - xy[p][1])
            slope[k] = rng.uniform(0.003, 0.010)
        # Accumulate flows and sizes upstream to downstream (growth order reversed is a valid order:
        # every cell is added after its parent).
        q_lps = inflow[:]
        size_ix = [0] * m
        max_in = [0] * m
        for k in range(m - 1, 0, -1):
            need = q_lps[k] / 1000.0 * 1.25
            s = max_in[k]
            while s < len(SIZES_MM) - 1 and full_capacity_m3s(SIZES_MM[s] / 1000.0, slope[k]) < need:
                s += 1
            if SIZES_MM[s] >= 900 and slope[k] > 0.004:  # large pipes are laid flatter
                slope[k] = 0.001 + (slope[k] - 0.003) * (0.003 / 0.007)
                while s < len(SIZES_MM) - 1 and full_capacity_m3s(SIZES_MM[s] / 1000.0, slope[k]) < need:
                    s += 1
            if s > max_in[k] and rng.random() < 0.04:
                s -= 1  # undersized: surcharges
            size_ix[k] = s
            p = parent[k]
            q_lps[p] += q_lps[k]
            max_in[p] = max(max_in[p], s)
        # Inverts from the outfall upstream; crowns matched at each manhole.
        sump = [0.0] * m
        sump[0] = round(rng.uniform(2.0, 10.0), 3)
        inv_dn = [0.0] * m
        inv_up = [0.0] * m
        for k in range(1, m):
            p = parent[k]
            d_out = SIZES_MM[size_ix[p]] / 1000.0 if p != 0 else SIZES_MM[size_ix[k]] / 1000.0
            d_in = SIZES_MM[size_ix[k]] / 1000.0
            inv_dn[k] = sump[p] + max(0.0, d_out - d_in) + (0.0 if p == 0 else 0.02)
            inv_up[k] = inv_dn[k] + slope[k] * length[k]
            sump[k] = inv_up[k]
        for k in range(m):
            if k == 0:
                d0 = max(SIZES_MM[size_ix[c]] for c in range(1, m) if parent[c] == 0) / 1000.0
                rim = sump[0] + d0 + 1.0
                tw = round(sump[0] + rng.uniform(0.1, 0.8) * d0, 3) if rng.random() < 0.5 else None
                nodes.append(("OF-%d" % t, "OUTFALL", xy[0][0], xy[0][1], round(rim, 3), sump[0], 0.0, tw))
            else:
                d = SIZES_MM[size_ix[k]] / 1000.0
                rim = sump[k] + d + rng.uniform(1.2, 3.0)
                kind = "INLET" if rng.random() < 0.2 else "MH"
                nodes.append(("S%d-%d" % (t, k), kind, xy[k][0], xy[k][1], round(rim, 3), round(sump[k], 3),
                              inflow[k], None))
        for k in range(1, m):
            p = parent[k]
            us = "S%d-%d" % (t, k)
            ds = "OF-%d" % t if p == 0 else "S%d-%d" % (t, p)
            coords = [xy[k], xy[p]]
            if rng.random() < 0.10:  # a slight bend part way along
                f = rng.uniform(0.3, 0.7)
                mx = xy[k][0] + f * (xy[p][0] - xy[k][0])
                my = xy[k][1] + f * (xy[p][1] - xy[k][1])
                off = rng.uniform(-3.0, 3.0)
                coords.insert(1, (mx + off, my - off))
            iu, idn = round(inv_up[k], 3), round(inv_dn[k], 3)
            if rng.random() < 0.01:  # digitised against the flow, inverts entered in digitising order
                coords.reverse()
                iu, idn = idn, iu
            mat = "RCP" if SIZES_MM[size_ix[k]] >= 450 else "PVC"
            pipes.append(("P%d-%d" % (t, k), us, ds, SIZES_MM[size_ix[k]], mat, iu, idn, coords))
        if loop_share > 0.0:
            lrng = random.Random(seed * 1000003 + t)
            for n_link, (a, b) in enumerate(add_loops(lrng, cells, parent, loop_share)):
                if lrng.random() < 0.5:
                    a, b = b, a
                dia = min(SIZES_MM[size_ix[a]], SIZES_MM[size_ix[b]])
                pipes.append(("L%d-%d" % (t, n_link), "S%d-%d" % (t, a), "S%d-%d" % (t, b), dia,
                              "RCP" if dia >= 450 else "PVC", round(sump[a] + 0.05, 3), round(sump[b] + 0.05, 3),
                              [xy[a], xy[b]]))
    return nodes, pipes, n_trees


def write_layer(ds, name, geom_type, fields, rows, fill):
    srs = osr.SpatialReference()
    srs.ImportFromEPSG(EPSG)
    # The R-tree is built once at the end (CreateSpatialIndex) rather than by triggers per row.
    lyr = ds.CreateLayer(name, srs, geom_type, ["FID=fid", "SPATIAL_INDEX=NO"])
    for fname, ftype in fields:
        lyr.CreateField(ogr.FieldDefn(fname, ftype))
    defn = lyr.GetLayerDefn()
    for start in range(0, len(rows), BATCH):
        lyr.StartTransaction()
        for row in rows[start:start + BATCH]:
            f = ogr.Feature(defn)
            fill(f, row)
            lyr.CreateFeature(f)
        lyr.CommitTransaction()
    ds.ExecuteSQL("SELECT CreateSpatialIndex('%s', '%s')" % (name, lyr.GetGeometryColumn()))


def fill_node(f, r):
    f.SetField(0, r[0])
    f.SetField(1, r[1])
    f.SetField(2, r[4])
    f.SetField(3, r[5])
    f.SetField(4, r[6])
    if r[7] is not None:
        f.SetField(5, r[7])
    g = ogr.Geometry(ogr.wkbPoint)
    g.AddPoint_2D(r[2], r[3])
    f.SetGeometryDirectly(g)


def fill_pipe(f, r):
    for i in range(7):
        f.SetField(i, r[i])
    g = ogr.Geometry(ogr.wkbLineString)
    for x, y in r[7]:
        g.AddPoint_2D(x, y)
    f.SetGeometryDirectly(g)


PROJECT = """# rimline benchmark project: a synthetic network written by scripts/make_network.py
# (N = {n} pipes, seed {seed}, {trees} outfall trees{loops}). Invented data; nothing here is a check value.
[project]
name = "Synthetic dendritic network, {n} pipes (invented, seed {seed})"
units = "si"

[pipes]
source = "network.gpkg"
layer = "pipes"
snap_tolerance = "0.5 m"

[pipes.fields]
id = "PIPE_ID"
material = "MATERIAL"
diameter = {{ field = "DIA_MM", unit = "mm" }}
invert_up = {{ field = "US_INV", unit = "m" }}
invert_down = {{ field = "DS_INV", unit = "m" }}

[pipes.defaults]
manning_n = 0.013

[pipes.defaults.manning_n_by_material]
RCP = 0.013
PVC = 0.010

[structures]
source = "network.gpkg"
layer = "structures"

[structures.fields]
id = "NODE_ID"
type = "NODE_TYPE"
rim = {{ field = "RIM", unit = "m" }}
invert = {{ field = "SUMP", unit = "m" }}
inflow = {{ field = "Q_LOCAL", unit = "L/s" }}
tailwater = {{ field = "TW", unit = "m" }}

[structures.types]
outfall = ["OUTFALL"]
inlet = ["INLET"]
manhole = ["MH"]

[flows]
mode = "structure_inflows"

[tailwater]
mode = "higher"

[methods]
friction = "manning"
structure_loss = "constant_k"

[methods.k_by_type]
manhole = 0.5
inlet = 0.5
outfall = 0.0

[criteria]
freeboard = "0.3 m"
velocity_min = "0.6 m/s"
velocity_max = "6.0 m/s"
capacity_ratio_max = 1.0
"""


def main():
    ap = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    ap.add_argument("--pipes", type=int, required=True, help="number of pipes N")
    ap.add_argument("--seed", type=int, default=1)
    ap.add_argument("--out", required=True, help="output directory")
    ap.add_argument("--loops", type=float, default=0.0,
                    help="share of structures on loops (0.05: 5 %%), by extra cross pipes; default none")
    a = ap.parse_args()
    if a.pipes < 3:
        sys.exit("make_network.py: --pipes must be at least 3")
    t0 = time.time()
    nodes, pipes, trees = build(a.pipes, a.seed, a.loops)
    t1 = time.time()
    os.makedirs(a.out, exist_ok=True)
    path = os.path.join(a.out, "network.gpkg")
    if os.path.exists(path):
        os.remove(path)
    ds = ogr.GetDriverByName("GPKG").CreateDataSource(path)
    write_layer(ds, "structures", ogr.wkbPoint,
                [("NODE_ID", ogr.OFTString), ("NODE_TYPE", ogr.OFTString), ("RIM", ogr.OFTReal),
                 ("SUMP", ogr.OFTReal), ("Q_LOCAL", ogr.OFTReal), ("TW", ogr.OFTReal)], nodes, fill_node)
    write_layer(ds, "pipes", ogr.wkbLineString,
                [("PIPE_ID", ogr.OFTString), ("US_NODE", ogr.OFTString), ("DS_NODE", ogr.OFTString),
                 ("DIA_MM", ogr.OFTInteger), ("MATERIAL", ogr.OFTString), ("US_INV", ogr.OFTReal),
                 ("DS_INV", ogr.OFTReal)], pipes, fill_pipe)
    ds = None
    with open(os.path.join(a.out, "project.toml"), "w") as f:
        loops = ", %g %% of structures on loops" % (100 * a.loops) if a.loops > 0 else ""
        f.write(PROJECT.format(n=a.pipes, seed=a.seed, trees=trees, loops=loops))
    print("make_network: %d pipes, %d structures, %d outfall trees -> %s (build %.1f s, write %.1f s)"
          % (len(pipes), len(nodes), trees, a.out, t1 - t0, time.time() - t1))


if __name__ == "__main__":
    main()
