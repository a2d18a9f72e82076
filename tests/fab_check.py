#!/usr/bin/python3
"""Independent check of the fabrication pack (issue 5) with ezdxf (Debian python3-ezdxf).

For every example with a pin layout it runs `bandforge build` (R2000 and --dxf-version r12),
reads every DXF in OUTDIR/fab/ with ezdxf and checks: DXF version, units, layer names, entity
types (no splines), every cut contour closed, no duplicate or overlapping cut entities, all holes
inside the outline, ASCII text; then the geometry against values computed here from the design
file (tomllib), `bandforge solve --json` and `bandforge build --json` (solid volumes):
  band blank   length = solve centreline + 2 eyes (2*pi - 1)*rho + 2 laps (stated rule),
               area = length x width - holes, hole count by the stated rivet rules;
  lining blank length = wrap x (r + t_lining/2), area = length x width - holes;
  lever plate  area x thickness = LEVER solid volume, stadium area and perimeter by hand;
  anchor plate area x thickness = ANCHOR solid volume, stadium by hand;
the cut list against the solids, byte-identical files from two processes, a design whose
lining cannot be rolled flat: exit status 3, a message naming lining.thickness, no files; and
welded end blocks: profile area x band width = block solid, cut-list rows, the band blank without
eyes and laps.

Usage: fab_check.py --bandforge EXE --examples DIR --work DIR
Run with /usr/bin/python3 (TOOLCHAIN.md: the python3 on PATH may not see Debian's ezdxf).
"""
import argparse
import csv
import filecmp
import json
import math
import os
import re
import shutil
import subprocess
import sys
import tomllib

import ezdxf

LAYERS = {"0", "CUT", "BEND", "MARK", "NOTES"}
ALLOWED = {  # entity type -> layers it may sit on
    "LWPOLYLINE": {"CUT"}, "POLYLINE": {"CUT"}, "CIRCLE": {"CUT"},
    "LINE": {"BEND", "MARK"}, "TEXT": {"NOTES"},
}
failures = []


def check(ok, what):
    if not ok:
        failures.append(what)
        print("FAIL:", what)
    return ok


def close(a, b, rel=1e-9, abs_=1e-9):
    return abs(a - b) <= max(abs_, rel * max(abs(a), abs(b)))


def mm(text):
    """A length from the design file ("80 mm", "0.08 m", "3 in") in millimetres."""
    m = re.fullmatch(r"\s*([-+0-9.eE]+)\s*(mm|m|cm|in)\s*", text)
    if not m:
        raise ValueError(f"cannot read the length {text!r} here")
    return float(m.group(1)) * {"mm": 1.0, "cm": 10.0, "m": 1000.0, "in": 25.4}[m.group(2)]


def run(args, expect=0):
    p = subprocess.run(args, capture_output=True, text=True)
    if expect is not None:
        check(p.returncode == expect,
              f"{' '.join(args)}: exit {p.returncode}, expected {expect}\n{p.stderr}")
    return p


# --- plane geometry of bulge polylines, written here independently of the C++ code -------------

def segments(pts):
    """(x, y, bulge) closed polyline -> list of (p, q, bulge)."""
    return [(pts[i], pts[(i + 1) % len(pts)], pts[i][2]) for i in range(len(pts))]


def arc(p, q, bulge):
    """Included angle, radius and centre of a bulge arc from p to q."""
    theta = 4 * math.atan(bulge)
    chord = math.dist(p[:2], q[:2])
    r = chord / (2 * math.sin(abs(theta) / 2))
    mx, my = (p[0] + q[0]) / 2, (p[1] + q[1]) / 2
    ux, uy = (q[0] - p[0]) / chord, (q[1] - p[1]) / chord
    h = r * math.cos(theta / 2) * (1 if theta > 0 else -1)  # centre left of a CCW arc's chord
    return theta, r, (mx - uy * h, my + ux * h)


def area(pts):
    a = 0.0
    for p, q, b in segments(pts):
        a += (p[0] * q[1] - q[0] * p[1]) / 2
        if abs(b) > 0:
            theta, r, _ = arc(p, q, b)
            a += r * r / 2 * (theta - math.sin(theta))
    return a


def length(pts):
    s = 0.0
    for p, q, b in segments(pts):
        if abs(b) > 0:
            theta, r, _ = arc(p, q, b)
            s += abs(theta) * r
        else:
            s += math.dist(p[:2], q[:2])
    return s


def sample(pts, step=0.5):
    """Points along the polyline, arcs included, for inside/distance tests."""
    out = []
    for p, q, b in segments(pts):
        if abs(b) > 0:
            theta, r, c = arc(p, q, b)
            a0 = math.atan2(p[1] - c[1], p[0] - c[0])
            n = max(8, int(abs(theta) * r / step))
            out += [(c[0] + r * math.cos(a0 + theta * k / n), c[1] + r * math.sin(a0 + theta * k / n))
                    for k in range(n)]
        else:
            n = max(1, int(math.dist(p[:2], q[:2]) / step))
            out += [(p[0] + (q[0] - p[0]) * k / n, p[1] + (q[1] - p[1]) * k / n) for k in range(n)]
    return out


def inside(poly, x, y):
    """Even-odd test against the sampled outline."""
    c = False
    for (x1, y1), (x2, y2) in zip(poly, poly[1:] + poly[:1]):
        if (y1 > y) != (y2 > y) and x < x1 + (y - y1) * (x2 - x1) / (y2 - y1):
            c = not c
    return c


# --- one DXF file --------------------------------------------------------------------------------

def read_dxf(path, version):
    """Structure checks; returns (outline, holes, notes text, bend-line xs)."""
    raw = open(path, "rb").read()
    check(raw.isascii(), f"{path}: non-ASCII bytes")
    header = raw.split(b"ENDSEC", 1)[0]
    doc = ezdxf.readfile(path)
    name = os.path.basename(path)
    if version == "r2000":
        check(doc.dxfversion == "AC1015", f"{name}: version {doc.dxfversion}, expected AC1015")
        check(doc.header.get("$INSUNITS") == 4, f"{name}: $INSUNITS is not 4 (millimetres)")
    else:
        check(doc.dxfversion == "AC1009", f"{name}: version {doc.dxfversion}, expected AC1009")
        check(b"$INSUNITS" not in header, f"{name}: R12 has no $INSUNITS header variable")
    # ezdxf adds the "Defpoints" layer itself when it loads a file; it is not in ours.
    layers = {l.dxf.name for l in doc.layers} - {"Defpoints"}
    check(layers == LAYERS, f"{name}: layers {sorted(layers)}, expected {sorted(LAYERS)}")
    contours, holes, notes, bends, seen = [], [], [], [], set()
    for e in doc.modelspace():
        t, layer = e.dxftype(), e.dxf.layer
        check(t in ALLOWED and layer in ALLOWED[t], f"{name}: {t} on layer {layer}")
        if t == "LWPOLYLINE":
            check(e.closed, f"{name}: open LWPOLYLINE")
            pts = [(x, y, b) for x, y, _, _, b in e.get_points("xyseb")]
        elif t == "POLYLINE":
            check(e.is_closed, f"{name}: open POLYLINE")
            pts = [(v.dxf.location.x, v.dxf.location.y, v.dxf.bulge) for v in e.vertices]
        if t in ("LWPOLYLINE", "POLYLINE"):
            key = (t, tuple((round(x, 6), round(y, 6), round(b, 9)) for x, y, b in pts))
            contours.append(pts)
        elif t == "CIRCLE":
            c = e.dxf.center
            key = (t, round(c.x, 6), round(c.y, 6), round(e.dxf.radius, 6))
            holes.append((c.x, c.y, e.dxf.radius))
        elif t == "LINE":
            a, b = e.dxf.start, e.dxf.end
            key = (t, layer, tuple(sorted([(round(a.x, 6), round(a.y, 6)), (round(b.x, 6), round(b.y, 6))])))
            if layer == "BEND":
                bends.append(a.x)
        else:
            key = (t, round(e.dxf.insert.x, 6), round(e.dxf.insert.y, 6), e.dxf.text)
            notes.append(e.dxf.text)
        check(key not in seen, f"{name}: duplicate {t}")
        seen.add(key)

    # Audited after reading (the audit may repair what the loop above must see). dxflib writes
    # the R2000 OBJECTS dictionaries without owner handles (group 330); ezdxf fills those in and
    # says so. Any other repair, and any error, is a defect of ours.
    audit = doc.audit()
    check(not audit.has_errors, f"{name}: ezdxf audit errors {[e.message for e in audit.errors]}")
    known = re.compile(r"Fixed invalid owner handle in (DICTIONARY|ACDBDICTIONARYWDFLT|ACDBPLACEHOLDER|"
                       r"MLINESTYLE|LAYOUT|DICTIONARYVAR)\(#[0-9A-F]+\)")
    other = [f.message for f in audit.fixes if not known.fullmatch(f.message)]
    check(not other, f"{name}: ezdxf audit repairs {other}")
    check(version == "r2000" or not audit.fixes, f"{name}: R12 file needed repairs")

    check(len(contours) == 1, f"{name}: {len(contours)} cut contours, expected one outline")
    outline = contours[0]
    if area(outline) < 0:
        outline = [(x, y, -b) for x, y, b in reversed(outline)]  # not expected, but measure it
    poly = sample(outline)
    for i, (x, y, r) in enumerate(holes):
        clear = min(math.dist((x, y), p) for p in poly)
        check(inside(poly, x, y) and clear > r, f"{name}: hole at ({x:.3f}, {y:.3f}) not inside")
        for (x2, y2, r2) in holes[i + 1:]:
            check(math.dist((x, y), (x2, y2)) > r + r2, f"{name}: holes overlap at ({x:.2f}, {y:.2f})")
    return outline, holes, notes, sorted(bends)


def bbox(outline):
    pts = sample(outline, 0.05) + [(x, y) for x, y, _ in outline]
    xs, ys = [p[0] for p in pts], [p[1] for p in pts]
    return max(xs) - min(xs), max(ys) - min(ys)


def net(outline, holes):
    return area(outline) - sum(math.pi * r * r for _, _, r in holes)


def rim(outline, holes):
    return length(outline) + sum(2 * math.pi * r for _, _, r in holes)


# --- the stated rules, recomputed from the design and the solve output ---------------------------

def joint_rule(t, b, tension, tau):
    """Eye joint (band blank NOTES): rivet d = max(5, ceil(2t)); edge 2d; pitch 3d; columns that
    fit across b; at least 2 rows, more until single shear at tau carries the tension."""
    d = max(5.0, math.ceil(2 * t - 1e-9))
    e, p = 2 * d, 3 * d
    cols = int(math.floor((b - 2 * e) / p + 1e-9)) + 1
    need = math.ceil(tension / (tau * math.pi * d * d / 4 * 1e-6))
    rows = max(2, -(-need // cols))
    return {"d": d, "lap": 2 * e + (rows - 1) * p, "per_end": rows * cols}


def lining_rule(t_lining, b, arc):
    """Lining rivets: none below 3 mm lining (bonded); 1/2/3 rows below 50/120 mm width/above;
    20 mm from each end, pitch at most 80 mm."""
    if t_lining < 3.0:
        return 0
    along = max(2, math.ceil((arc - 40) / 80 - 1e-9) + 1)
    return along * (1 if b < 50 else 2 if b < 120 else 3)


# --- one example ---------------------------------------------------------------------------------

def check_example(exe, design_path, work):
    stem = os.path.splitext(os.path.basename(design_path))[0]
    design = tomllib.load(open(design_path, "rb"))
    if "concept" in design:
        print(f"{stem}: [concept] design, no solids to flatten: skipped")
        return
    print(f"{stem}:")
    solved = json.loads(run([exe, "solve", design_path, "--json"]).stdout)
    band, lining, lever = design["band"], design.get("lining", {}), design["lever"]
    t, b = mm(band["thickness"]), mm(band["width"])
    d_pin = mm(band["pin_diameter"])
    t_lining = mm(lining.get("thickness", "0 mm"))
    r = mm(design["drum"]["diameter"]) / 2
    wrap = math.radians(solved["wrap_angle_deg"])
    tension = max(f["tension_tight_N"] for k in ("a_tight", "b_tight")
                  for f in solved["directions"][k]["by_friction"])
    tau = next(c["limit"] for c in solved["checks"] if c["id"] == "pin_shear")

    outs = {}
    for version in ("r2000", "r12"):
        out = os.path.join(work, stem, version)
        shutil.rmtree(out, ignore_errors=True)
        args = [exe, "build", design_path, "-o", out, "--json"]
        if version == "r12":
            args += ["--dxf-version", "r12"]
        built = json.loads(run(args).stdout or "{}")
        parts = {p["name"]: p for p in built.get("parts", [])}
        outs[version] = out
        fab = os.path.join(out, "fab")
        files = sorted(os.listdir(fab))
        expect = sorted(["band-blank.dxf", "lever-plate.dxf", "anchor-plate.dxf", "cutlist.csv"] +
                        (["lining-blank.dxf"] if t_lining > 0 else []))
        check(files == expect, f"{stem}: fab/ holds {files}, expected {expect}")
        check(not [f for f in os.listdir(out) if f.startswith(".")], f"{stem}: staging left behind")

        # Band blank.
        outline, holes, notes, bends = read_dxf(os.path.join(fab, "band-blank.dxf"), version)
        rho = d_pin / 2 + t / 2
        eye = (2 * math.pi - 1) * rho
        joint = joint_rule(t, b, tension, tau)
        centreline = solved["band_length_m"] * 1000
        L = centreline + 2 * eye + 2 * joint["lap"]
        Lm, W = bbox(outline)
        check(close(Lm, L, 1e-9), f"{stem} band: length {Lm:.6f}, expected {L:.6f} = centreline "
              f"{centreline:.6f} + 2 eyes {eye:.6f} + 2 laps {joint['lap']}")
        check(close(W, b), f"{stem} band: width {W}, expected {b}")
        n_lining = lining_rule(t_lining, b, (r + t_lining / 2) * wrap)
        check(len(holes) == n_lining + 4 * joint["per_end"],
              f"{stem} band: {len(holes)} holes, expected {n_lining} + 4 x {joint['per_end']}")
        check(close(net(outline, holes), L * b - n_lining * math.pi * 2.5 ** 2 -
                    4 * joint["per_end"] * math.pi * joint["d"] ** 2 / 4, 1e-9),
              f"{stem} band: net area {net(outline, holes)}")
        check(close(rim(outline, holes), 2 * (L + b) + n_lining * math.pi * 5 +
                    4 * joint["per_end"] * math.pi * joint["d"], 1e-9), f"{stem} band: perimeter")
        check(len(bends) == 6 and close(bends[3] - bends[2], solved["band_radius_m"] * 1000 * wrap),
              f"{stem} band: roll lines {bends}")
        text = "\n".join(notes)
        # The stated pieces, as printed, agree with the independent values.
        m = re.search(r"centreline pin A to pin B ([0-9.]+)", text)
        check(m and abs(float(m.group(1)) - centreline) < 6e-4, f"{stem} band: stated centreline")
        for end in "AB":  # one line per end: "+ eye A 50.190: ...", "+ lap A 42.000: ..."
            m = re.search(rf"\+ eye {end} ([0-9.]+)", text)
            check(m and abs(float(m.group(1)) - eye) < 6e-4, f"{stem} band: stated eye allowance {end}")
            m = re.search(rf"\+ lap {end} ([0-9.]+)", text)
            check(m and float(m.group(1)) == joint["lap"], f"{stem} band: stated lap {end}")
        check(("$INSUNITS = 4" in text) == (version == "r2000") and
              (("R12 has no $INSUNITS" in text) == (version == "r12")), f"{stem}: units note")

        # Lining blank.
        if t_lining > 0:
            outline, holes, notes, _ = read_dxf(os.path.join(fab, "lining-blank.dxf"), version)
            L = wrap * (r + t_lining / 2)
            Lm, W = bbox(outline)
            check(close(Lm, L, 1e-9) and close(W, b), f"{stem} lining: {Lm} x {W}, expected {L} x {b}")
            check(len(holes) == n_lining, f"{stem} lining: {len(holes)} holes, expected {n_lining}")
            check(close(net(outline, holes), L * b - len(holes) * math.pi * 2.5 ** 2, 1e-9),
                  f"{stem} lining: area")
            filled = area(outline) * t_lining
            check(close(filled, parts["LINING"]["volume_mm3"], 1e-6),
                  f"{stem} lining: blank x thickness {filled} vs solid {parts['LINING']['volume_mm3']}")

        # Lever plate: the face of the lever solid.
        outline, holes, notes, _ = read_dxf(os.path.join(fab, "lever-plate.dxf"), version)
        t_lever, w = mm(lever["thickness"]), mm(lever["width"])
        vol = parts["LEVER"]["volume_mm3"]
        check(close(net(outline, holes) * t_lever, vol, 1e-6),
              f"{stem} lever: area x t {net(outline, holes) * t_lever} vs solid {vol}")
        pivot = [mm(v) for v in lever["pivot"]]
        pts = [pivot, [mm(v) for v in lever["handle"]]]
        pts += [[mm(v) for v in band[e]["at"]] for e in ("end_a", "end_b") if band[e]["mount"] == "lever"]
        n_holes = 1 + sum(band[e]["mount"] == "lever" for e in ("end_a", "end_b"))
        check(len(holes) == n_holes and all(close(h[2], d_pin / 2) for h in holes),
              f"{stem} lever: holes {holes}")
        cross = [abs((pts[1][0] - pts[0][0]) * (p[1] - pts[0][1]) - (pts[1][1] - pts[0][1]) * (p[0] - pts[0][0]))
                 for p in pts[2:]]
        if all(c < 1e-9 for c in cross):  # collinear: a stadium
            span = max(math.dist(p, q) for p in pts for q in pts)
            check(close(net(outline, holes), span * w + math.pi * w * w / 4 - n_holes * math.pi * d_pin ** 2 / 4, 1e-9),
                  f"{stem} lever: stadium area")
            check(close(rim(outline, holes), 2 * span + math.pi * w + n_holes * math.pi * d_pin, 1e-9),
                  f"{stem} lever: stadium perimeter")

        # Anchor plate.
        outline, holes, notes, _ = read_dxf(os.path.join(fab, "anchor-plate.dxf"), version)
        vol = parts["ANCHOR"]["volume_mm3"]
        # The frame plates' thickness and width are the plan's (solve --json "hardware"): the
        # lightest stock plate that carries the pin loads; the lug is a stadium of width w and
        # centre distance equal to the lever width.
        lug = next(b for b in solved["hardware"]["brackets"] if len(b["pins"]) == 1)
        t_plate, w_plate = lug["thickness_m"] * 1000, lug["half_width_m"] * 2000
        check(close(net(outline, holes) * t_plate, vol, 1e-6), f"{stem} anchor: area x t vs solid")
        check(close(net(outline, holes), w * w_plate + math.pi * w_plate * w_plate / 4 - math.pi * d_pin ** 2 / 4, 1e-9),
              f"{stem} anchor: stadium area")

        # Cut list against the solids.
        rows = {row["part"]: row for row in csv.DictReader(open(os.path.join(fab, "cutlist.csv"), newline=""))}
        for name, part in parts.items():
            if name.startswith("PIN-") or name == "GRIP":
                row = rows.get(name)
                if check(row is not None, f"{stem} cut list: no row for {name}"):
                    check(int(row["quantity"]) == len(part["instances"]), f"{stem} cut list: {name} quantity")
                    check(abs(float(row["mass_each_kg"]) - part["mass_kg"]) <= 5e-4, f"{stem} cut list: {name} mass")
        check(abs(float(rows["LEVER-PLATE"]["mass_each_kg"]) - parts["LEVER"]["mass_kg"]) <= 5e-4,
              f"{stem} cut list: lever mass")
        check(int(rows["ANCHOR-PLATE"]["quantity"]) == len(parts["ANCHOR"]["instances"]),
              f"{stem} cut list: anchor quantity")
        for row in rows.values():
            if row["file"]:
                check(os.path.exists(os.path.join(fab, row["file"])), f"{stem} cut list: {row['file']}")

    # The same design built again in another process gives the same bytes.
    again = os.path.join(work, stem, "again")
    shutil.rmtree(again, ignore_errors=True)
    run([exe, "build", design_path, "-o", again])
    cmp = filecmp.dircmp(os.path.join(outs["r2000"], "fab"), os.path.join(again, "fab"))
    _, mismatch, errors = filecmp.cmpfiles(os.path.join(outs["r2000"], "fab"), os.path.join(again, "fab"),
                                           cmp.common_files, shallow=False)
    check(not mismatch and not errors and not cmp.left_only and not cmp.right_only,
          f"{stem}: second build differs: {mismatch + errors}")


def with_lining_thickness(design_path, thickness, path):
    """Writes the design with its [lining] thickness set to `thickness` to `path`; False if it has none."""
    text = open(design_path, encoding="utf-8").read()
    new, n = re.subn(r'(\[lining\][^\[]*?thickness\s*=\s*)"[^"]*"', lambda m: m.group(1) + f'"{thickness}"', text)
    if not check(n == 1, f"{design_path}: no [lining] thickness to replace"):
        return False
    open(path, "w", encoding="utf-8").write(new)
    return True


def check_refusal(exe, design_path, work):
    """A lining that cannot be rolled flat: exit 3, a clear message, and no output at all."""
    design = tomllib.loads(open(design_path, encoding="utf-8").read())
    r = mm(design["drum"]["diameter"]) / 2
    # 0.1 r thick: face strain 0.1r / (2 * 1.05r) = 4.8 % > the stated 3 % limit.
    bad = os.path.join(work, "thick-lining.toml")
    if not with_lining_thickness(design_path, f"{0.1 * r:.3f} mm", bad):
        return
    out = os.path.join(work, "thick-lining")
    shutil.rmtree(out, ignore_errors=True)
    p = run([exe, "build", bad, "-o", out], expect=3)
    check("cannot flatten the lining" in p.stderr and "lining.thickness" in p.stderr,
          f"refusal message: {p.stderr!r}")
    left = os.listdir(out) if os.path.isdir(out) else []
    check(left == [], f"refused build left {left} in {out}")
    print("thick lining refused:", p.stderr.strip())


def check_stale(exe, design_path, work):
    """Rebuilding into the same folder a design without a lining drops the old lining blank."""
    bare = os.path.join(work, "bare-band.toml")
    if not with_lining_thickness(design_path, "0 mm", bare):
        return
    out = os.path.join(work, "rebuilt")
    shutil.rmtree(out, ignore_errors=True)
    run([exe, "build", design_path, "-o", out])
    check(os.path.exists(os.path.join(out, "fab", "lining-blank.dxf")), "first build: no lining blank")
    run([exe, "build", bare, "-o", out])
    files = sorted(os.listdir(os.path.join(out, "fab")))
    check(files == ["anchor-plate.dxf", "band-blank.dxf", "cutlist.csv", "lever-plate.dxf"],
          f"rebuild without a lining left {files}")


def with_end_joint(design_path, kind, work):
    """The design with `[band] end_joint = kind`, written to WORK/<kind>.toml; and a fresh output
    folder WORK/<kind>."""
    text = open(design_path, encoding="utf-8").read()
    check("pin_diameter = " in text, f"{design_path}: no pin_diameter line to put end_joint before")
    path = os.path.join(work, kind + ".toml")
    open(path, "w", encoding="utf-8").write(
        text.replace("pin_diameter = ", f'end_joint = "{kind}"\npin_diameter = ', 1))
    out = os.path.join(work, kind)
    shutil.rmtree(out, ignore_errors=True)
    return path, out


def check_welded_blocks(exe, design_path, work):
    """Welded end blocks (issue 12): each has a DXF profile (closed outline, bore as a circle,
    1:1 mm) whose area times the band width is the block solid's volume, a cut-list row, and the
    band blank loses its eyes and laps: length = centreline - 2 x (bore wall + pin radius)."""
    welded, out = with_end_joint(design_path, "welded-block", work)
    built = json.loads(run([exe, "build", welded, "-o", out, "--json"]).stdout)
    solved = json.loads(run([exe, "solve", welded, "--json"]).stdout)
    parts = {p["name"]: p for p in built["parts"]}
    design = tomllib.loads(open(welded, encoding="utf-8").read())
    b = mm(design["band"]["width"])
    d_pin = mm(design["band"]["pin_diameter"])
    rows = {row["part"]: row for row in csv.DictReader(open(os.path.join(out, "fab", "cutlist.csv"), newline=""))}
    for end in "AB":
        name = f"END-BLOCK-{end}"
        path = os.path.join(out, "fab", f"end-block-{end.lower()}.dxf")
        if not check(os.path.exists(path) and name in parts, f"welded: {name} has a solid and a DXF"):
            continue
        outline, holes, notes, _ = read_dxf(path, "r2000")
        check(len(holes) == 1 and close(holes[0][2] * 2, d_pin, 1e-9), f"welded: {name} bore dia {d_pin}")
        check(close(net(outline, holes) * b, parts[name]["volume_mm3"], 1e-6),
              f"welded: {name} profile area x band width vs solid")
        joint = solved["hardware"]["joints"][end.lower()]["block"]
        width, height = bbox(outline)
        check(close(width, (joint["front_m"] + joint["back_m"]) * 1000, 1e-9) and
              close(height, joint["height_m"] * 1000, 1e-9), f"welded: {name} outline size")
        check(name in rows and int(rows[name]["quantity"]) == 1, f"welded: {name} cut-list row")
    band_outline, _, _, _ = read_dxf(os.path.join(out, "fab", "band-blank.dxf"), "r2000")
    band_length, _ = bbox(band_outline)
    cut = {e: (solved["hardware"]["joints"][e]["block"]["back_m"] -
               solved["hardware"]["joints"][e]["block"]["slot_depth_m"]) * 1000 for e in "ab"}
    check(close(band_length, solved["band_length_m"] * 1000 - cut["a"] - cut["b"], 1e-9),
          "welded: band blank = centreline less the two slot ends")


def check_compact_rivets(exe, design_path, work):
    """The compact riveted lap (issue 12): the band blank's joint holes are the rivet diameter the
    plan chose (solve --json), rows x columns in each tail and each run, besides the lining's."""
    compact, out = with_end_joint(design_path, "riveted-compact", work)
    run([exe, "build", compact, "-o", out])
    solved = json.loads(run([exe, "solve", compact, "--json"]).stdout)
    design = tomllib.loads(open(compact, encoding="utf-8").read())
    _, holes, notes, _ = read_dxf(os.path.join(out, "fab", "band-blank.dxf"), "r2000")
    joints = solved["hardware"]["joints"]
    check(all(joints[e]["kind"] == "riveted-compact" for e in "ab"), "compact: both ends riveted-compact")
    b, t_lining = mm(design["band"]["width"]), mm(design["lining"]["thickness"])
    r = mm(design["drum"]["diameter"]) / 2
    n_lining = lining_rule(t_lining, b, (r + t_lining / 2) * math.radians(solved["wrap_angle_deg"]))
    for e in "ab":
        rv = joints[e]["rivets"]
        d = rv["diameter_m"] * 1000
        n = sum(1 for h in holes if close(2 * h[2], d, 1e-9))
        # Lining rivet holes are 5 mm: when the joint rivet is 5 mm too, count them with it.
        expect = 2 * rv["rows"] * rv["columns"] * (2 if joints["a"]["rivets"]["diameter_m"] == joints["b"]["rivets"]["diameter_m"] else 1)
        expect += n_lining if close(d, 5.0, 1e-9) else 0
        check(n == expect, f"compact: {n} holes of dia {d} in the band blank, expected {expect}")
        # EN 1993-1-8 Table 3.3 least spacings, as the plan states: edge 1.2 d, pitch 2.2 d.
        check(close(rv["edge_m"], 1.2 * rv["diameter_m"], 1e-9) and close(rv["pitch_m"], 2.2 * rv["diameter_m"], 1e-9),
              f"compact: end {e} spacing 1.2 d / 2.2 d")
    check(len(holes) == n_lining + sum(2 * joints[e]["rivets"]["rows"] * joints[e]["rivets"]["columns"] for e in "ab"),
          f"compact: {len(holes)} holes in all")


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--bandforge", required=True)
    ap.add_argument("--examples", required=True)
    ap.add_argument("--work", required=True)
    a = ap.parse_args()
    os.makedirs(a.work, exist_ok=True)
    designs = sorted(os.path.join(a.examples, f) for f in os.listdir(a.examples) if f.endswith(".toml"))
    pin_designs = []
    for d in designs:
        check_example(a.bandforge, d, a.work)
        if "concept" not in tomllib.load(open(d, "rb")):
            pin_designs.append(d)
    check(len(pin_designs) >= 1, "no example with a pin layout")
    if pin_designs:
        check_refusal(a.bandforge, pin_designs[0], a.work)
        check_stale(a.bandforge, pin_designs[0], a.work)
        check_welded_blocks(a.bandforge, pin_designs[0], a.work)
        check_compact_rivets(a.bandforge, pin_designs[0], a.work)
    print(f"{len(failures)} failure(s)")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
