#!/usr/bin/python3
"""Every layout that solves must build (issue 12): a seeded generator of plausible band-brake
layouts, each run through `bandforge solve` and `bandforge build` exactly as a user would.

The layouts are drawn the way a designer draws them: the band leaves the drum at two tangent
points either side of a gap below the drum (wrap 180°–330°, the gap turned up to ±20° off the
vertical), runs straight to its pins (short runs of a few eye sizes up to about a drum radius),
and the lever lies below the drum with the pivot near the pins and the handle 2–3.5 drum radii
from the pivot. Kinds: simple (one end on the frame, the pivot from on that pin to far from it),
differential (pivot between the two lever pins), summing (pivot outside them). Both band senses,
both drum rotations, drums Ø150–1000 mm, designs written in millimetres or in inches, with and
without lining. The stock (band, pins, lever plate) is sized from the drum as a designer would
(common practice, no source); the load puts the tight-side tension at 30–90 % of the band's
allowable, so that the generated hardware sees realistic loads.

  layout_sweep.py --bandforge EXE --work DIR [--count N] [--seed S] [--jobs J] [--keep]
      prints the figure: layouts generated, solved, built, and every refusal with its reason.
      Exit status 0 when every layout that solves builds, else 1 (`--target 0.99`: when at least
      that share builds and every refusal says which key to change and by how much).
"""
import argparse
import concurrent.futures
import math
import os
import random
import re
import shutil
import subprocess
import sys

INCH = 25.4


def fmt(v_mm, inches):
    return f'"{v_mm / INCH:.4f} in"' if inches else f'"{v_mm:.2f} mm"'


def point(p, inches):
    return f"[{fmt(p[0], inches)}, {fmt(p[1], inches)}]"


def plate_distance(p, centres, radius):
    """Distance from p to the convex hull of `centres` grown by `radius` (negative inside)."""
    pts = sorted(set(centres))
    def cross(o, a, b):
        return (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0])
    hull = []
    for seq in (pts, pts[::-1]):
        part = []
        for q in seq:
            while len(part) >= 2 and cross(part[-2], part[-1], q) <= 0:
                part.pop()
            part.append(q)
        hull += part[:-1]
    def seg(a, b):
        vx, vy = b[0] - a[0], b[1] - a[1]
        l2 = vx * vx + vy * vy
        f = 0.0 if l2 == 0 else max(0.0, min(1.0, ((p[0] - a[0]) * vx + (p[1] - a[1]) * vy) / l2))
        return math.hypot(p[0] - a[0] - f * vx, p[1] - a[1] - f * vy)
    edges = [(hull[i], hull[(i + 1) % len(hull)]) for i in range(len(hull))] or [(pts[0], pts[0])]
    d = min(seg(a, b) for a, b in edges)
    inside = len(hull) >= 3 and all(cross(a, b, p) >= 0 for a, b in edges)
    return (-d if inside else d) - radius


def generate(rng, index, seed=0):
    """One plausible layout as design-file text, and a one-line description."""
    D = rng.uniform(150, 1000)
    R = D / 2
    kind = rng.choice(["simple", "simple", "differential", "summing"])
    inches = rng.random() < 0.3
    lined = rng.random() < 0.8
    lining_t = rng.choice([3, 4, 5, 6, 8]) if lined else 0
    lining_t = min(lining_t, max(3, round(0.015 * D))) if lined else 0
    band_t = min([1.5, 2, 2.5, 3, 4, 5, 6], key=lambda t: abs(t - 0.0075 * D))
    band_b = 5 * round(rng.uniform(0.15, 0.28) * D / 5)
    drum_w = band_b + 5 * round(rng.uniform(2, 8))
    pin_d = max(8, 2 * round(rng.uniform(0.03, 0.05) * D / 2), 2 * math.ceil(1.5 * band_t))
    lever_w = pin_d + 2 * max(8, pin_d * 0.6)
    lever_w = 5 * math.ceil(lever_w / 5)
    lever_t = max(8, 2 * round(rng.uniform(0.6, 1.0) * pin_d / 2))
    bore = 5 * round(rng.uniform(0.12, 0.22) * D / 5)
    r_b = R + lining_t + band_t / 2

    wrap = math.radians(rng.uniform(180, 330))
    g = (2 * math.pi - wrap) / 2             # half the gap below the drum
    tilt = math.radians(rng.uniform(-20, 20))
    beta_l = -math.pi / 2 - g + tilt         # left tangent point
    beta_r = -math.pi / 2 + g + tilt         # right tangent point
    u_l = (-math.sin(beta_l), math.cos(beta_l))   # runs leave toward the gap
    u_r = (math.sin(beta_r), -math.cos(beta_r))
    eye = pin_d / 2 + band_t
    # The shortest run that keeps the eye clear of the band line (what `solve` asks for, with
    # the 1.5 mm release clearance), and runs that would meet below the drum stop short.
    need = eye + 1.5
    l_min = 1.05 * math.sqrt((r_b + need) ** 2 - r_b ** 2)
    cross = r_b * math.tan(g) if g < math.radians(89) else 10 * R
    l_max = max(1.5 * l_min, min(1.1 * r_b, 0.8 * cross))
    def run():
        return rng.choice([rng.uniform(l_min, 1.6 * l_min), rng.uniform(l_min, l_max)])
    t_l = (r_b * math.cos(beta_l), r_b * math.sin(beta_l))
    t_r = (r_b * math.cos(beta_r), r_b * math.sin(beta_r))
    l_l, l_r = run(), run()
    p_l = (t_l[0] + l_l * u_l[0], t_l[1] + l_l * u_l[1])
    p_r = (t_r[0] + l_r * u_r[0], t_r[1] + l_r * u_r[1])

    # Which pin is A: the band runs cw from the left pin over the top to the right one.
    sense = rng.choice(["cw", "ccw"])
    pa, pb = (p_l, p_r) if sense == "cw" else (p_r, p_l)
    side = 1 if rng.random() < 0.5 else -1    # the handle to the right (+1) or left (-1)
    near, far = (p_l, p_r) if side == 1 else (p_r, p_l)
    dx, dy = far[0] - near[0], far[1] - near[1]
    span = math.hypot(dx, dy)
    along = (dx / span, dy / span)
    normal = (-along[1], along[0])
    jitter = lambda s: rng.uniform(-s, s)
    mounts = {"near": "lever", "far": "lever"}
    if kind == "simple":
        # The frame end is the near pin; the pivot from on it to far from it.
        mounts["near"] = "frame"
        choice = rng.random()
        if choice < 0.2:
            pivot = near
        else:
            off = rng.uniform(pin_d * 1.5, 40) if choice < 0.6 else rng.uniform(40, 0.6 * R + 60)
            ang = rng.uniform(-0.6, 0.6)
            d = (-along[0] * math.cos(ang) - normal[0] * math.sin(ang),
                 -along[1] * math.cos(ang) - normal[1] * math.sin(ang))
            pivot = (near[0] + off * d[0], near[1] + off * d[1])
    elif kind == "differential" and span < 5 * pin_d:
        kind = "summing"  # no room between the pins for the pivot's hole: a summing lever
        off = rng.uniform(pin_d * 2, 0.5 * R + 40)
        pivot = (near[0] - off * along[0] + jitter(pin_d), near[1] - off * along[1] + jitter(pin_d))
    elif kind == "differential":
        # Between the pins, at least two pin diameters from each (a designer leaves room for the
        # holes), a quarter to a half of the way from the near pin.
        lo, hi = max(0.2, 2 * pin_d / span), min(0.45, 1 - 2 * pin_d / span)
        f = rng.uniform(lo, max(lo, hi))
        pivot = (near[0] + f * dx + jitter(pin_d / 2), near[1] + f * dy + jitter(pin_d / 2))
    else:  # summing: the pivot outside the two pins, on the near side
        off = rng.uniform(pin_d * 2, 0.5 * R + 40)
        pivot = (near[0] - off * along[0] + jitter(pin_d), near[1] - off * along[1] + jitter(pin_d))
    L = rng.uniform(2.0, 3.5) * R
    reach = max(L, math.hypot(far[0] - pivot[0], far[1] - pivot[1]) + 60 + lever_w)
    ang = math.atan2(far[1] - pivot[1], far[0] - pivot[0]) + math.radians(rng.uniform(-12, 12))
    handle = (pivot[0] + reach * math.cos(ang), pivot[1] + reach * math.sin(ang))
    end_a_mount = mounts["near"] if pa == near else mounts["far"]
    end_b_mount = mounts["near"] if pb == near else mounts["far"]

    allow = rng.choice([55, 60, 80, 100])
    f_min = 0.25
    e = math.exp(f_min * wrap)
    p1 = allow * band_b * band_t * rng.uniform(0.3, 0.9)  # N (MPa × mm²)
    torque = p1 * (1 - 1 / e) * R / 1000                   # N·m at f_min
    number = f"SWEEP-{index:04d}"
    lining = (f'[lining]\nmaterial = "{rng.choice(["woven", "molded"])}"\nthickness = {fmt(lining_t, inches)}\n'
              if lined else f'[lining]\nmaterial = "iron"\nthickness = "0 mm"\n')
    text = f"""# generated by tests/layout_sweep.py: {kind}, wrap {math.degrees(wrap):.0f} deg
[project]
title = "Sweep layout {index}"
number = "{number}"
date = "2026-12-01"

[drum]
diameter = {fmt(D, inches)}
width = {fmt(drum_w, inches)}
bore = {fmt(bore, inches)}
rotation = "{rng.choice(["cw", "ccw"])}"
material = "cast-iron"

{lining}
[band]
width = {fmt(band_b, inches)}
thickness = {fmt(band_t, inches)}
allowable_stress = "{allow} MPa"
sense = "{sense}"
end_a = {{ mount = "{end_a_mount}", at = {point(pa, inches)} }}
end_b = {{ mount = "{end_b_mount}", at = {point(pb, inches)} }}
pin_diameter = {fmt(pin_d, inches)}

[lever]
pivot = {point(pivot, inches)}
handle = {point(handle, inches)}
width = {fmt(lever_w, inches)}
thickness = {fmt(lever_t, inches)}
allowable_stress = "120 MPa"

[load]
torque = "{torque:.1f} N*m"
"""
    # How it is applied: by
    # hand, or a spring or a weight somewhere along the lever's outer part, as a designer puts
    # them. The spring stands square to the lever, its lever end 8–30 mm off the lever's edge, its
    # seat 120–250 mm further; a designer who chose the side that releases the brake flips it
    # (one() does, on solve's message).
    # A generator of its own, so that the layouts of a seed are the same with or without this.
    rng = random.Random(f"apply-{seed}-{index}")
    how = rng.random()
    other = None
    t = rng.uniform(0.55, 1.0)
    mass = rng.uniform(5, 60)
    # A designer hangs the weight clear of the drum: its steel block (height = diameter) beside
    # the drum or below it.
    def weight_clears(p, m):
        dw = (4 * m / (math.pi * 7850)) ** (1 / 3) * 1000
        top = p[1] - lever_w / 2 - max(20, dw / 4)
        r_out = R + lining_t + band_t + 10
        return abs(p[0]) - dw / 2 > r_out or top < -r_out
    at = (pivot[0] + t * (handle[0] - pivot[0]), pivot[1] + t * (handle[1] - pivot[1]))
    if how < 0.25:
        ux, uy = handle[0] - pivot[0], handle[1] - pivot[1]
        ul = math.hypot(ux, uy)
        side = rng.choice([-1, 1])
        nx, ny = -uy / ul * side, ux / ul * side
        off = lever_w / 2 + rng.uniform(8, 30)
        length = rng.uniform(120, 250)
        # The spring's end clear of the lever plate by 5 mm over a seat up to 120 mm across: a
        # designer stands it off the plate where the plate slants or rounds (its pins and ends).
        centres = [handle, pivot] + [q for q, mnt in ((pa, end_a_mount), (pb, end_b_mount)) if mnt == "lever"]
        def seated(k, o):
            return all(plate_distance((at[0] + k * o * nx + q * ny, at[1] + k * o * ny - q * nx), centres,
                                      lever_w / 2) >= 5 for q in range(-60, 61, 10))
        offs = {}
        for k in (1, -1):
            o = off
            while not seated(k, o) and o < off + 300:
                o += 2
            offs[k] = o
        # A designer keeps the spring and its seats off the drum: its axis at least the band's
        # outer radius + 60 mm from the drum's centre (room for the coils and seats, common
        # practice, no source), shortening it (down to 80 mm) on the drum's side.
        def clear(k, length):
            ax, ay = at[0] + k * offs[k] * nx, at[1] + k * offs[k] * ny
            bx, by = ax + k * length * nx, ay + k * length * ny
            vx, vy = bx - ax, by - ay
            f = max(0.0, min(1.0, -(ax * vx + ay * vy) / (vx * vx + vy * vy)))
            return math.hypot(ax + f * vx, ay + f * vy) >= R + lining_t + band_t + 60
        def fitted(k):
            l = length
            while l >= 80 and not clear(k, l):
                l *= 0.85
            return l if l >= 80 else None
        def spring(k, l):
            s_at = (at[0] + k * offs[k] * nx, at[1] + k * offs[k] * ny)
            seat = (s_at[0] + k * l * nx, s_at[1] + k * l * ny)
            return f"""
[apply]
by = "spring"
at = {point(s_at, inches)}
seat = {point(seat, inches)}
"""
        sides = [(k, fitted(k)) for k in (1, -1) if fitted(k) is not None]
        if sides:
            other = text + spring(*sides[1]) if len(sides) == 2 else None
            text += spring(*sides[0])
            kind += ", spring"
    elif how < 0.35 and weight_clears(at, mass):
        text += f"""
[apply]
by = "weight"
at = {point(at, inches)}
mass = "{mass:.1f} kg"
"""
        kind += ", weight"
    desc = (f"{kind}, D {D:.0f} mm, wrap {math.degrees(wrap):.0f}°, runs {l_l:.0f}/{l_r:.0f} mm, "
            f"{'in' if inches else 'mm'}, {'lined' if lined else 'bare'}")
    return number, text, desc, other


def one(args):
    exe, work, number, text, desc, other, keep = args
    path = os.path.join(work, number + ".toml")
    with open(path, "w", encoding="utf-8") as f:
        f.write(text)
    s = subprocess.run([exe, "solve", path], capture_output=True, text=True)
    if s.returncode != 0 and other is not None and "put the seat on the other side" in s.stderr:
        with open(path, "w", encoding="utf-8") as f:  # the designer moves the spring across
            f.write(other)
        s = subprocess.run([exe, "solve", path], capture_output=True, text=True)
    if s.returncode != 0:
        return number, desc, "unsolved", s.returncode, s.stderr.strip().splitlines()[-1:] or [""]
    out = os.path.join(work, number)
    b = subprocess.run([exe, "build", path, "-o", out], capture_output=True, text=True)
    if not keep:
        shutil.rmtree(out, ignore_errors=True)
    if b.returncode == 0:
        if not keep:
            os.remove(path)
        return number, desc, "built", 0, []
    return number, desc, "refused", b.returncode, b.stderr.strip().splitlines()[-1:] or [""]


def says_what_to_change(message):
    """A refusal a designer can act on: names a design key and by how much to change it."""
    return re.search(r"[a-z_]+\.[a-z_.]+", message) is not None and re.search(r"at least [0-9.]+ mm", message) is not None


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--bandforge", required=True)
    ap.add_argument("--work", required=True)
    ap.add_argument("--count", type=int, default=500)
    ap.add_argument("--seed", type=int, default=12)
    ap.add_argument("--jobs", type=int, default=os.cpu_count() or 1)
    ap.add_argument("--target", type=float, default=1.0, help="share of solved layouts that must build")
    ap.add_argument("--keep", action="store_true", help="keep every design file and output")
    a = ap.parse_args()
    shutil.rmtree(a.work, ignore_errors=True)
    os.makedirs(a.work)
    rng = random.Random(a.seed)
    jobs = []
    for i in range(1, a.count + 1):
        number, text, desc, other = generate(rng, i, a.seed)
        jobs.append((a.bandforge, a.work, number, text, desc, other, a.keep))
    with concurrent.futures.ThreadPoolExecutor(max_workers=a.jobs) as pool:
        results = list(pool.map(one, jobs))
    solved = [r for r in results if r[2] != "unsolved"]
    built = [r for r in results if r[2] == "built"]
    refused = [r for r in results if r[2] == "refused"]
    share = len(built) / len(solved) if solved else 0.0
    print(f"layout sweep, seed {a.seed}: {len(results)} layouts generated, {len(solved)} solved, "
          f"{len(built)} built ({100 * share:.1f} % of those that solve)")
    kinds = {}
    for r in results:
        k = r[1].split(",")[0]
        kinds.setdefault(k, [0, 0, 0])
        kinds[k][0] += 1
        kinds[k][1] += r[2] != "unsolved"
        kinds[k][2] += r[2] == "built"
    for r in results:
        k = "by spring" if ", spring," in r[1] else "by weight" if ", weight," in r[1] else "by hand"
        kinds.setdefault(k, [0, 0, 0])
        kinds[k][0] += 1
        kinds[k][1] += r[2] != "unsolved"
        kinds[k][2] += r[2] == "built"
    for k, (n, s, b) in sorted(kinds.items()):
        print(f"  {k:13s} {n:4d} generated, {s:4d} solved, {b:4d} built")
    for number, desc, _, rc, msg in refused:
        print(f"REFUSED {number} ({desc}): exit {rc}: {msg[0]}")
    unsolved = [r for r in results if r[2] == "unsolved"]
    for number, desc, _, rc, msg in unsolved[:10]:
        print(f"  not solved {number} ({desc}): exit {rc}: {msg[0]}")
    if len(unsolved) > 10:
        print(f"  ... and {len(unsolved) - 10} more not solved")
    ok = share >= a.target - 1e-12 and all(says_what_to_change(r[4][0]) for r in refused)
    if not solved:
        print("FAIL: no layout solved: the generator is broken")
        ok = False
    return 0 if ok else 1


if __name__ == "__main__":
    sys.exit(main())
