#!/usr/bin/env python3
"""Writes the invented demo network (data/demo/metric and data/demo/us).

Scenario (invented, no real place): the Quillfen Heights development drains through a storm
trunk to an outfall on the (invented) Tarrowby Brook. A 1500 mm trunk of 20 manholes rises
west from the outfall; three branches join it. Seeded data defects: pipe C-02 is digitised
against the flow (its inverts were entered in digitising order), manhole B-05 has no rim level.
The US variant is the same network in US survey feet (EPSG:2277 coordinates), inches, feet and cfs.
Catchments (catchments.geojson): a rectangle beside each inlet that takes a local inflow, on the
left of the pipe leaving it, and an upland catchment beyond the trunk head that names T-20 in its
OUTLET field; land_use.geojson holds a park and a commercial block for the composite C.
project-rational.toml runs the same network with the Rational Method (seeded: catchment K-C03 is
drawn off its inlet, so the nearest structure takes it).
A pump station (wet well WW-1) south of the trunk lifts its inflow through the 150 mm force main
FM-1 over a ridge into T-12 (pump_station() below); with one pump running the HGL passes under the
ridge, a sub-atmospheric high point.
project-relief.toml runs the same network with a relief sewer beside the lower trunk (files
pipes-relief.geojson and structures-relief.geojson: the demo's layers plus the relief): a 900 mm
sewer leaves T-09 0.60 m above the trunk invert, runs beside the trunk 20 m to its south through
R-01..R-03 and rejoins it at T-02, with a 450 mm cross connection from T-05 to R-02. The network
is no longer a tree: the network solve splits the flow by the levels (relief() below).
Deterministic: no random numbers.
"""
import json, math, os, sys

HERE = os.path.dirname(os.path.abspath(__file__))
OUT = os.path.join(HERE, "..", "data", "demo")
ORIGIN_M = (452300.0, 5385200.0)            # arbitrary easting/northing in the metric CRS
ORIGIN_US = (2300000.0, 13900000.0)         # arbitrary, US survey feet
FT_PER_M_US = 3937.0 / 1200.0              # US survey feet per metre (NIST SP 811 B.6)
FT_PER_M = 1.0 / 0.3048                    # international feet per metre

def build():
    nodes = []   # dict(id, type, x, y, invert, rim, inflow_lps)
    pipes = []   # dict(id, up, down, dia_mm, material)
    def node(nid, kind, x, y, invert, cover, inflow, dia_mm):
        rim = invert + dia_mm / 1000.0 + cover
        nodes.append(dict(id=nid, type=kind, x=x, y=y, invert=round(invert, 3), rim=round(rim, 3), inflow=inflow))
        return nodes[-1]

    # Outfall headwall: invert 2.00 m, bank level 4.60 m.
    of = node("OF-1", "OUTFALL", 0.0, 0.0, 2.00, 1.10, 0.0, 1500)
    # Trunk T-01..T-18 rising west-north-west; slopes 0.20 % near the outfall to 0.55 % at the head.
    x, y, inv = 0.0, 0.0, 2.00
    prev = of
    trunk = []
    for i in range(1, 21):
        length = 72.0 + 3.0 * (i % 5)
        heading = math.radians(170.0 + 8.0 * math.sin(i / 2.0))
        x += length * math.cos(heading); y += length * math.sin(heading)
        slope = 0.0020 + 0.00020 * i
        dia = 1500 if i <= 5 else 1350 if i <= 9 else 1050 if i <= 13 else 900 if i <= 17 else 675
        inv = inv + slope * length + 0.03   # pipe rise plus a 30 mm drop across each manhole
        # A low spot in the ground at T-04..T-06 (shallow cover) makes the freeboard tight there.
        cover = 0.35 if i in (4, 5) else 0.55 if i == 6 else 1.4 + 0.1 * (i % 3)
        n = node(f"T-{i:02d}", "MH" if i % 3 else "INLET", x, y, inv, cover, 0.0 if i % 3 else 70.0, dia)
        # pipe inverts are set from the manholes in fix_trunk_inverts()
        pipes.append(dict(id=f"P-T{i:02d}", up=n["id"], down=prev["id"], dia=dia, mat="RCP"))
        trunk.append(n); prev = n

    def branch(tag, at, count, heading_deg, dia_list, slopes, inflows, spacing=68.0):
        px, py, pinv = at["x"], at["y"], at["invert"] + 0.25   # branch enters 0.25 m above the trunk invert
        down = at
        for k in range(1, count + 1):
            h = math.radians(heading_deg + 6.0 * math.cos(k))
            length = spacing + 4.0 * (k % 3)
            px += length * math.cos(h); py += length * math.sin(h)
            dia = dia_list[k - 1]
            inv_down = pinv if k == 1 else down["invert"] + 0.02
            inv_up = inv_down + slopes[k - 1] * length
            n = node(f"{tag}-{k:02d}", "INLET", px, py, inv_up, 1.3 + 0.15 * (k % 2), inflows[k - 1], dia)
            pipes.append(dict(id=f"{tag}-{k:02d}", up=n["id"], down=down["id"], dia=dia, mat="RCP",
                              inv_up=round(inv_up, 3), inv_down=round(inv_down, 3)))
            down = n

    branch("B", trunk[4], 8, 250.0, [900, 825, 750, 675, 600, 525, 450, 375],
           [0.0030, 0.0035, 0.0040, 0.0045, 0.0050, 0.0060, 0.0070, 0.0100],
           [110, 105, 95, 95, 90, 80, 70, 65])
    branch("C", trunk[9], 7, 95.0, [750, 675, 600, 525, 450, 450, 375],
           [0.0040, 0.0045, 0.0050, 0.0060, 0.1200, 0.0080, 0.0100],
           [95, 90, 80, 70, 110, 65, 55])
    branch("D", trunk[13], 6, 215.0, [600, 525, 450, 375, 375, 300],
           [0.0045, 0.0050, 0.0060, 0.0070, 0.0008, 0.0100],
           [80, 70, 65, 55, 10, 50])
    # The trunk head collects the upland inflow.
    for n in nodes:
        if n["id"] == "T-20": n["inflow"] = 240.0
    return nodes, pipes

def fix_trunk_inverts(nodes, pipes):
    """Trunk pipe inverts: upstream = the manhole invert, downstream = 30 mm above the next manhole."""
    by_id = {n["id"]: n for n in nodes}
    for p in pipes:
        if p["id"].startswith("P-T"):
            p["inv_up"] = by_id[p["up"]]["invert"]
            p["inv_down"] = round(by_id[p["down"]]["invert"] + (0.0 if p["down"] == "OF-1" else 0.03), 3)

def features(nodes, pipes, units):
    by_id = {n["id"]: n for n in nodes}
    def xy(n):
        if units == "si": return [round(ORIGIN_M[0] + n["x"], 3), round(ORIGIN_M[1] + n["y"], 3)]
        return [round(ORIGIN_US[0] + n["x"] * FT_PER_M_US, 3), round(ORIGIN_US[1] + n["y"] * FT_PER_M_US, 3)]
    def elev(v):
        return round(v, 3) if units == "si" else round(v * FT_PER_M, 3)
    sf = []
    for n in nodes:
        rim = None if n["id"] == "B-05" else elev(n["rim"])                   # seeded defect: missing rim
        props = {"NODE_ID": n["id"], "NODE_TYPE": n["type"], "RIM": rim, "SUMP": elev(n["invert"])}
        props["Q_LOCAL"] = n["inflow"] if units == "si" else round(n["inflow"] / 1000.0 * FT_PER_M ** 3, 3)
        sf.append({"type": "Feature", "properties": props, "geometry": {"type": "Point", "coordinates": xy(n)}})
    pf = []
    for p in pipes:
        a, b = xy(by_id[p["up"]]), xy(by_id[p["down"]])
        coords = [a, [round((a[0] + b[0]) / 2 + 0.0, 3), round((a[1] + b[1]) / 2, 3)], b]
        inv_up, inv_down = elev(p["inv_up"]), elev(p["inv_down"])
        if p["id"] == "C-02":                  # seeded defect: digitised against the flow,
            coords.reverse()                   # inverts entered in digitising order
            inv_up, inv_down = inv_down, inv_up
        size = p["dia"] if units == "si" else round(p["dia"] / 25.4)
        props = {"PIPE_ID": p["id"], "MATERIAL": p["mat"], "SIZE": size, "US_INV": inv_up, "DS_INV": inv_down}
        pf.append({"type": "Feature", "properties": props, "geometry": {"type": "LineString", "coordinates": coords}})
    crs = "urn:ogc:def:crs:EPSG::32631" if units == "si" else "urn:ogc:def:crs:EPSG::2277"
    wrap = lambda name, f: {"type": "FeatureCollection", "name": name,
                            "crs": {"type": "name", "properties": {"name": crs}}, "features": f}
    return wrap("structures", sf), wrap("pipes", pf)

PROJECT = """# rimline demo project ({label}). Invented scenario: Quillfen Heights storm trunk to Tarrowby Brook.
# Every value here is invented for the demo; nothing in it is a check value.
[project]
name = "Quillfen Heights storm trunk (invented demo, {label})"
units = "{units}"
vertical_datum = "QH local survey datum (invented)"

[pipes]
source = "pipes.geojson"
snap_tolerance = "{snap}"

[pipes.fields]
id = "PIPE_ID"
material = "MATERIAL"
diameter = {{ field = "SIZE", unit = "{dia_unit}" }}
invert_up = {{ field = "US_INV", unit = "{elev_unit}" }}
invert_down = {{ field = "DS_INV", unit = "{elev_unit}" }}

[pipes.defaults]
manning_n = 0.013

[pipes.defaults.manning_n_by_material]
RCP = 0.013
PVC = 0.010

[structures]
source = "structures.geojson"

[structures.fields]
id = "NODE_ID"
type = "NODE_TYPE"
rim = {{ field = "RIM", unit = "{elev_unit}" }}
invert = {{ field = "SUMP", unit = "{elev_unit}" }}
inflow = {{ field = "Q_LOCAL", unit = "{flow_unit}" }}

[structures.types]
outfall = ["OUTFALL"]
inlet = ["INLET"]
manhole = ["MH"]

[flows]
mode = "structure_inflows"

[tailwater]
mode = "higher"
levels = [{levels}]

[methods]
friction = "manning"
structure_loss = "constant_k"

[methods.k_by_type]
manhole = 0.5
inlet = 0.5
outfall = 0.0

[criteria]
freeboard = "{freeboard}"
velocity_min = "{vmin}"
velocity_max = "{vmax}"
capacity_ratio_max = 1.0

# Development connections (rimline check --proposal / --headroom): the invented agency accepts a
# surcharged pipe as long as the freeboard at the structures holds.
[comparison]
ignore_codes = ["SURCHARGED"]
"""

def catchments(nodes, pipes):
    """Invented catchment polygons (metres, relative to the origin) and land-use polygons."""
    by_id = {n["id"]: n for n in nodes}
    out = []
    k = 0
    for p in pipes:
        n, down = by_id[p["up"]], by_id[p["down"]]
        if n["type"] != "INLET" or n["id"] == "T-20":
            continue
        k += 1
        dx, dy = down["x"] - n["x"], down["y"] - n["y"]
        ln = math.hypot(dx, dy); ux, uy = dx / ln, dy / ln   # along the pipe
        vx, vy = -uy, ux                                     # to its left
        off = 40.0 if n["id"] == "C-03" else 0.0             # seeded: drawn off its inlet
        def corner(a, b):
            return (n["x"] + ux * a + vx * (b + off), n["y"] + uy * a + vy * (b + off))
        ring = [corner(-28, -12), corner(28, -12), corner(28, 52), corner(-28, 52)]
        out.append(dict(id="K-" + n["id"], ring=ring, c=round(0.45 + 0.05 * (k % 5), 2),
                        inlet_min=8.0 + 2.0 * (k % 3), pop=120 + 15 * (k % 7), outlet=None))
    head = by_id["T-20"]
    x0, y0 = head["x"] - 230.0, head["y"] - 100.0
    out.append(dict(id="K-UPLAND", ring=[(x0, y0), (x0 + 200.0, y0), (x0 + 200.0, y0 + 200.0), (x0, y0 + 200.0)],
                    c=0.35, inlet_min=20.0, pop=300, outlet="T-20"))
    b3, c6 = by_id["B-03"], by_id["C-06"]
    land = [dict(id="LU-PARK", c=0.20, ring=[(b3["x"] - 120, b3["y"] - 60), (b3["x"] + 60, b3["y"] - 60),
                                             (b3["x"] + 60, b3["y"] + 140), (b3["x"] - 120, b3["y"] + 140)]),
            dict(id="LU-COMMERCIAL", c=0.85, ring=[(c6["x"] - 80, c6["y"] - 80), (c6["x"] + 80, c6["y"] - 80),
                                                   (c6["x"] + 80, c6["y"] + 80), (c6["x"] - 80, c6["y"] + 80)])]
    return out, land

def polygon_features(items, units, props_of):
    def xy(pt):
        if units == "si": return [round(ORIGIN_M[0] + pt[0], 3), round(ORIGIN_M[1] + pt[1], 3)]
        return [round(ORIGIN_US[0] + pt[0] * FT_PER_M_US, 3), round(ORIGIN_US[1] + pt[1] * FT_PER_M_US, 3)]
    crs = "urn:ogc:def:crs:EPSG::32631" if units == "si" else "urn:ogc:def:crs:EPSG::2277"
    feats = []
    for it in items:
        ring = [xy(pt) for pt in it["ring"]]
        ring.append(ring[0])
        feats.append({"type": "Feature", "properties": props_of(it), "geometry": {"type": "Polygon", "coordinates": [ring]}})
    return {"type": "FeatureCollection", "crs": {"type": "name", "properties": {"name": crs}}, "features": feats}

RATIONAL = """
[catchments]
source = "catchments.geojson"
outlet_search = "{search}"

[catchments.fields]
id = "CATCH_ID"
structure = "OUTLET"
runoff_c = "RUNOFF_C"
population = "POP"
inlet_time = {{ field = "INLET_MIN", unit = "min" }}

[catchments.defaults]
runoff_c = 0.5
inlet_time = "10 min"

[land_use]
source = "land_use.geojson"
runoff_c = "C"

[rational]
return_period = "10yr"
travel_velocity = "normal_depth"
{idf}
"""

IDF_SI = """
[rational.idf.10yr]
a = 1650
b = "12 min"
c = 0.85
intensity_unit = "mm/h"
"""

def idf_table_us():
    """The same invented curve, tabulated in in/h for the US variant (exercises the table form)."""
    durations = [5, 10, 15, 30, 60]
    ins = [1650.0 / (t + 12.0) ** 0.85 / 25.4 for t in durations]
    return ("\n[rational.idf.10yr]\ndurations = [" + ", ".join(f'"{t} min"' for t in durations) + "]\n"
            "intensities = [" + ", ".join(f'"{i:.2f} in/h"' for i in ins) + "]\n")

def rational_project(text, units):
    text = text.replace("(invented demo,", "(invented demo, Rational Method,")
    text = "\n".join(l for l in text.split("\n") if not l.startswith("inflow = "))
    text = text.replace('mode = "structure_inflows"', 'mode = "rational"')
    extra = RATIONAL.format(search="30 m" if units == "si" else "100 ft", idf=IDF_SI if units == "si" else idf_table_us())
    return text.replace("\n[tailwater]", extra + "\n[tailwater]", 1)

# Pump station WW-1 and force main FM-1 (invented). The main runs 620 m north to T-12; its vertex Z
# (pipe invert, in the CRS's vertical unit) climbs to a ridge 400 m out, then falls to the outlet.
FORCE_MAIN_PROFILE = [  # (distance from WW-1 [m], pipe invert [m])
    (0.0, 6.00), (100.0, 6.80), (250.0, 7.60), (400.0, 8.12), (450.0, 7.95), (520.0, 7.30), (620.0, 6.60)]

def pump_station(nodes, pipes):
    """Adds the wet well WW-1 (local inflow 15 L/s) and the force main FM-1 to T-12."""
    t12 = next(n for n in nodes if n["id"] == "T-12")
    nodes.append(dict(id="WW-1", type="PS", x=t12["x"], y=t12["y"] - 620.0, invert=1.00, rim=8.00, inflow=15.0))
    pipes.append(dict(id="FM-1", up="WW-1", down="T-12", dia=150, mat="PVC", inv_up=6.00, inv_down=6.60))

def force_main_features(pf, units):
    """Gives FM-1 its profile vertices with Z, a pipe class and the force-main flag; the rest GRAVITY."""
    for f in pf:
        p = f["properties"]
        p["KIND"] = "FM" if p["PIPE_ID"] == "FM-1" else "GRAVITY"
        if p["PIPE_ID"] != "FM-1":
            continue
        (x0, y0), (x1, y1) = f["geometry"]["coordinates"][0], f["geometry"]["coordinates"][-1]
        total = FORCE_MAIN_PROFILE[-1][0]
        z_scale = 1.0 if units == "si" else FT_PER_M_US   # the CRS's vertical unit (US survey feet)
        f["geometry"]["coordinates"] = [
            [round(x0 + (x1 - x0) * d / total, 3), round(y0 + (y1 - y0) * d / total, 3), round(z * z_scale, 3)]
            for d, z in FORCE_MAIN_PROFILE]
        p["PN"] = 1000 if units == "si" else 150     # PN10 (kPa) / 150 psi pipe class

PUMP_PROJECT = """
# Pump station WW-1 (invented): two duty pumps lift into T-12 through the force main FM-1.
[[pump_stations]]
id = "WW-1"
pump_on = "{on}"
pump_off = "{off}"
duty_pumps = 2
curve = [{curve}]
fittings = [{{ k = 0.5, count = 4 }}, {{ k = 0.3, count = 2 }}, {{ k = 0.4, count = 1 }}]

[force_mains]
friction = "hazen_williams"
hazen_c = 130
pressure_min = "0 m"
velocity_min = "{vmin}"
velocity_max = "{vmax}"
"""

def pump_project_text(units):
    """The project's force-main lines: the field mapping additions and the pump-station tables."""
    curve_si = [(0, 16.0), (5, 15.0), (10, 12.5), (15, 8.0), (20, 2.0)]   # L/s, m (one pump)
    if units == "si":
        curve = ", ".join(f'["{q} L/s", "{h} m"]' for q, h in curve_si)
        text = PUMP_PROJECT.format(on="3.00 m", off="1.80 m", curve=curve, vmin="0.6 m/s", vmax="2.5 m/s")
        return 'force_main = "KIND"\nrated_pressure = { field = "PN", unit = "kPa" }\n', text
    curve = ", ".join(f'["{round(q / 1000.0 * FT_PER_M ** 3, 3)} cfs", "{round(h * FT_PER_M, 2)} ft"]' for q, h in curve_si)
    text = PUMP_PROJECT.format(on=f"{round(3.0 * FT_PER_M, 2)} ft", off=f"{round(1.8 * FT_PER_M, 2)} ft", curve=curve,
                               vmin="2 ft/s", vmax="8 ft/s")
    return 'force_main = "KIND"\nrated_pressure = { field = "PN", unit = "psi" }\n', text

def with_pump_station(text, units):
    fields, tables = pump_project_text(units)
    text = text.replace('[pipes]\nsource = "pipes.geojson"\n', '[pipes]\nsource = "pipes.geojson"\nforce_main_values = ["FM"]\n')
    text = text.replace("[pipes.defaults]\n", fields + "\n[pipes.defaults]\n", 1)
    text = text.replace('manhole = ["MH"]\n', 'manhole = ["MH"]\npump_station = ["PS"]\n', 1)
    return text + tables

def relief(nodes):
    """The relief sewer (invented): new structures R-01..R-03 and five pipes; returns (nodes, pipes)."""
    by_id = {n["id"]: n for n in nodes}
    t9, t2, t5 = by_id["T-09"], by_id["T-02"], by_id["T-05"]
    rn, rp = [], []
    start = t9["invert"] + 0.60          # the relief leaves T-09 0.60 m above the trunk invert
    prev, prev_inv = t9, start
    for k, beside in enumerate(("T-08", "T-06", "T-04"), start=1):
        b = by_id[beside]
        x, y = b["x"], b["y"] - 20.0
        length = math.hypot(x - prev["x"], y - prev["y"])
        inv_down = prev_inv - 0.0030 * length
        n = dict(id=f"R-{k:02d}", type="MH", x=x, y=y, invert=round(inv_down - 0.02, 3),
                 rim=round(b["rim"] + 0.10, 3), inflow=0.0)
        rn.append(n)
        rp.append(dict(id=f"R-{k:02d}", up=prev["id"], down=n["id"], dia=900, mat="RCP",
                       inv_up=round(prev_inv, 3), inv_down=round(inv_down, 3)))
        prev, prev_inv = n, n["invert"]
    # Back into the trunk at T-02, 0.30 m above its invert.
    rp.append(dict(id="R-04", up=prev["id"], down="T-02", dia=900, mat="RCP", inv_up=round(prev_inv, 3),
                   inv_down=round(t2["invert"] + 0.30, 3)))
    # Cross connection from T-05 to R-02, level: the levels decide which way it runs.
    r2 = rn[1]
    rp.append(dict(id="X-01", up="T-05", down=r2["id"], dia=450, mat="RCP", inv_up=round(t5["invert"] + 0.45, 3),
                   inv_down=round(t5["invert"] + 0.45, 3)))
    return rn, rp

RELIEF_NOTE = """# The demo network with a relief sewer beside the lower trunk (R-01..R-04 from T-09 to T-02, and
# the cross connection X-01 from T-05 to R-02): loops, so the network solve splits the flows by the
# levels. Layers: the demo's plus the relief (pipes-relief.geojson, structures-relief.geojson).
"""

def main():
    nodes, pipes = build()
    fix_trunk_inverts(nodes, pipes)
    pump_station(nodes, pipes)
    for units, folder in (("si", "metric"), ("us", "us")):
        d = os.path.join(OUT, folder); os.makedirs(d, exist_ok=True)
        s, p = features(nodes, pipes, units)
        force_main_features(p["features"], units)
        for name, obj in (("structures.geojson", s), ("pipes.geojson", p)):
            with open(os.path.join(d, name), "w") as f:
                json.dump(obj, f, indent=1); f.write("\n")
        if units == "si":
            text = PROJECT.format(label="metric", units="si", snap="0.5 m", dia_unit="mm", elev_unit="m",
                                  flow_unit="L/s", levels='"3.20 m", "3.90 m"', freeboard="0.3 m",
                                  vmin="0.9 m/s", vmax="4.6 m/s")
        else:
            text = PROJECT.format(label="US customary", units="us", snap="1.5 ft", dia_unit="in", elev_unit="ft",
                                  flow_unit="cfs", levels='"10.50 ft", "12.80 ft"', freeboard="1 ft",
                                  vmin="3 ft/s", vmax="15 ft/s")
        with open(os.path.join(d, "project.toml"), "w") as f:
            f.write(with_pump_station(text, units))
        ks, land = catchments(nodes, pipes)
        k_geo = polygon_features(ks, units, lambda k: {"CATCH_ID": k["id"], "RUNOFF_C": k["c"], "INLET_MIN": k["inlet_min"],
                                                       "POP": k["pop"], "OUTLET": k["outlet"]})
        lu_geo = polygon_features(land, units, lambda l: {"LU_ID": l["id"], "C": l["c"]})
        for name, obj in (("catchments.geojson", k_geo), ("land_use.geojson", lu_geo)):
            with open(os.path.join(d, name), "w") as f:
                json.dump(obj, f, indent=1); f.write("\n")
        with open(os.path.join(d, "project-rational.toml"), "w") as f:
            f.write(with_pump_station(rational_project(text, units), units))
        rn, rp = relief(nodes)
        s_r, p_r = features(nodes + rn, pipes + rp, units)
        force_main_features(p_r["features"], units)
        for name, obj in (("structures-relief.geojson", s_r), ("pipes-relief.geojson", p_r)):
            with open(os.path.join(d, name), "w") as f:
                json.dump(obj, f, indent=1); f.write("\n")
        relief_text = with_pump_station(text, units)
        relief_text = relief_text.replace('source = "pipes.geojson"', 'source = "pipes-relief.geojson"')
        relief_text = relief_text.replace('source = "structures.geojson"', 'source = "structures-relief.geojson"')
        relief_text = relief_text.replace("(invented demo,", "(invented demo, relief sewer,")
        with open(os.path.join(d, "project-relief.toml"), "w") as f:
            f.write(RELIEF_NOTE + relief_text)
    print(f"{len(nodes)} structures, {len(pipes)} pipes written to {os.path.normpath(OUT)}")
    import make_ground  # the invented ground model and project-ground.toml (scripts/make_ground.py)
    make_ground.main()

if __name__ == "__main__":
    main()
