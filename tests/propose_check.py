#!/usr/bin/python3
"""`bandforge propose` through the executable (issue 8), checked with outside tools.

For every brief in examples/briefs/: `propose --build` exits 0; every <number>-Pn.toml named in
proposals.csv exists and `solve --json --strict` passes it (exit 0); the CSV's figures equal those
`solve --json` computes from the file (operator force at f_min, largest lining pressure and band
stress, wrap) and its positions equal the file's; each proposal was built (STEP, PDF, fab/); the
review sheet is a one-page PDF (poppler: pdfinfo, pdftotext) carrying the caution, the ranked
numbers and the plot's title; a second run writes the same bytes. Then: `--json` lists the same
proposals; an infeasible brief exits 7 naming the binding limit and leaves no files; a brief with
a misspelt key exits 2 naming file, line and column.

Usage: propose_check.py --bandforge EXE --briefs DIR --work DIR
"""
import argparse
import csv
import filecmp
import json
import os
import re
import shutil
import subprocess
import sys
import tomllib

failures = []


def check(ok, what):
    if not ok:
        failures.append(what)
        print("FAIL:", what)


def run(cmd, **kw):
    return subprocess.run(cmd, capture_output=True, text=True, **kw)


def mm(text):
    m = re.fullmatch(r"(-?[0-9.eE+-]+) mm", text)
    assert m, text
    return float(m.group(1))


def close(a, b, rel, abs_tol=0.0):
    return abs(a - b) <= rel * max(abs(a), abs(b)) + abs_tol


def check_brief(exe, brief, work):
    name = os.path.splitext(os.path.basename(brief))[0]
    out = os.path.join(work, name)
    r = run([exe, "propose", brief, "-o", out, "--build", "--quiet"])
    check(r.returncode == 0, f"{name}: propose --build exit {r.returncode}: {r.stderr}")
    if r.returncode != 0:
        return
    with open(brief, "rb") as f:
        b = tomllib.load(f)
    both = b["load"].get("both_directions", False)
    with open(os.path.join(out, "proposals.csv"), newline="") as f:
        rows = list(csv.DictReader(f))
    wanted = b.get("goal", {}).get("proposals", 5)
    check(1 <= len(rows) <= wanted, f"{name}: {len(rows)} proposals (asked for {wanted})")
    for row in rows:
        number = row["number"]
        path = os.path.join(out, number + ".toml")
        check(os.path.isfile(path), f"{name}: {path} missing")
        s = run([exe, "solve", "--json", "--strict", path])
        check(s.returncode == 0, f"{number}: solve --strict exit {s.returncode}: {s.stderr}")
        if s.returncode != 0:
            continue
        j = json.loads(s.stdout)
        prim = j["primary"]
        other = "b_tight" if prim == "a_tight" else "a_tight"
        dirs = [prim, other] if both else [prim]
        force = max(j["directions"][d]["by_friction"][0]["lever_force_N"] for d in dirs)
        pressure = max(x["pressure_max_Pa"] for d in dirs for x in j["directions"][d]["by_friction"])
        stress = max(x["band_stress_Pa"] for d in dirs for x in j["directions"][d]["by_friction"])
        check(close(float(row["operator_force_N"]), force, 0, 6e-5), f"{number}: force csv {row['operator_force_N']} solve {force}")
        check(close(float(row["lining_pressure_MPa"]), pressure / 1e6, 0, 6e-7), f"{number}: pressure")
        check(close(float(row["band_stress_MPa"]), stress / 1e6, 0, 6e-7), f"{number}: band stress")
        check(close(float(row["wrap_deg"]), j["wrap_angle_deg"], 0, 6e-5), f"{number}: wrap")
        check(all(c["ok"] for c in j["checks"]), f"{number}: a check fails")
        check(force <= float(b["operator"]["max_force"].split()[0]) * (1 + 1e-9), f"{number}: force above max_force")
        with open(path, "rb") as f:
            d = tomllib.load(f)
        check(close(float(row["pivot_x_mm"]), mm(d["lever"]["pivot"][0]), 0, 1e-6), f"{number}: pivot x")
        check(close(float(row["handle_y_mm"]), mm(d["lever"]["handle"][1]), 0, 1e-6), f"{number}: handle y")
        check(close(float(row["end_b_x_mm"]), mm(d["band"]["end_b"]["at"][0]), 0, 1e-6), f"{number}: end_b x")
        check(close(float(row["band_thickness_mm"]), mm(d["band"]["thickness"]), 0, 1e-9), f"{number}: band t")
        with open(path, encoding="utf-8") as f:
            text = f.read()
        check("CAUTION" in text and "licensed engineer" in text, f"{number}: no caution in the header")
        check("Why:" in text and "Margins" in text, f"{number}: no reason or margins in the header")
        built = os.path.join(out, number)
        step = os.path.join(built, number + ".step")
        check(os.path.isfile(step), f"{number}: not built ({step})")
        if os.path.isfile(step):
            with open(step, encoding="ascii", errors="replace") as f:
                check(f.readline().startswith("ISO-10303-21;"), f"{number}: STEP header")
        check(os.path.isfile(os.path.join(built, number + ".pdf")), f"{number}: no drawing")
        check(os.path.isdir(os.path.join(built, "fab")), f"{number}: no fab/")

    print(f"{name}: {len(rows)} proposals solved, compared and built")
    pdf = os.path.join(out, "proposals.pdf")
    info = run(["pdfinfo", pdf])
    check(info.returncode == 0 and re.search(r"Pages:\s+1\b", info.stdout), f"{name}: pdfinfo {info.stdout}")
    text = run(["pdftotext", "-layout", pdf, "-"]).stdout
    check("CAUTION" in text, f"{name}: review sheet without the caution")
    check("Feasible layouts evaluated" in text, f"{name}: review sheet without the plot")
    check("Proposal review sheet" in text, f"{name}: review sheet title block")
    for row in rows:
        check(row["number"].rsplit("-", 1)[1] in text, f"{name}: {row['number']} not on the review sheet")

    # Same brief, same bytes (a second process, without --build).
    again = os.path.join(work, name + "-again")
    r2 = run([exe, "propose", brief, "-o", again, "--quiet"])
    check(r2.returncode == 0, f"{name}: second run exit {r2.returncode}")
    for f in sorted(os.listdir(again)):
        check(filecmp.cmp(os.path.join(out, f), os.path.join(again, f), shallow=False), f"{name}: {f} differs between runs")


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--bandforge", required=True)
    ap.add_argument("--briefs", required=True)
    ap.add_argument("--work", required=True)
    a = ap.parse_args()
    shutil.rmtree(a.work, ignore_errors=True)
    os.makedirs(a.work)
    briefs = sorted(os.path.join(a.briefs, f) for f in os.listdir(a.briefs) if f.endswith(".toml"))
    check(len(briefs) >= 4, "fewer than four example briefs")
    for brief in briefs:
        check_brief(a.bandforge, brief, a.work)

    # --json: the same proposals as the CSV.
    hoist = os.path.join(a.briefs, "bin-hoist.toml")
    r = run([a.bandforge, "propose", hoist, "-o", os.path.join(a.work, "json"), "--json", "--quiet"])
    check(r.returncode == 0, f"--json exit {r.returncode}")
    if r.returncode == 0:
        j = json.loads(r.stdout)
        with open(os.path.join(a.work, "json", "proposals.csv"), newline="") as f:
            rows = list(csv.DictReader(f))
        check([p["number"] for p in j["proposals"]] == [x["number"] for x in rows], "--json numbers")
        check(all(os.path.isfile(f) for f in j["files"]), "--json files")
        check(j["search"]["layouts_evaluated"] > 10000, "--json search figures")

    # Nothing feasible: exit 7, the binding limit, no files.
    with open(hoist, encoding="utf-8") as f:
        weak = f.read().replace('max_force = "250 N"', 'max_force = "20 N"')
    weak_path = os.path.join(a.work, "weak.toml")
    with open(weak_path, "w", encoding="utf-8") as f:
        f.write(weak)
    out = os.path.join(a.work, "weak-out")
    r = run([a.bandforge, "propose", weak_path, "-o", out, "--quiet"])
    check(r.returncode == 7, f"infeasible brief: exit {r.returncode}")
    check("operator force binds" in r.stderr and "the best needs" in r.stderr, f"infeasible message: {r.stderr}")
    check(not os.path.exists(out) or not os.listdir(out), "infeasible brief left files")

    # A misspelt key: exit 2 with file:line:column.
    bad_path = os.path.join(a.work, "bad.toml")
    with open(bad_path, "w", encoding="utf-8") as f:
        f.write(weak.replace("max_travel", "max_travle"))
    r = run([a.bandforge, "propose", bad_path, "-o", os.path.join(a.work, "bad-out")])
    check(r.returncode == 2, f"bad brief: exit {r.returncode}")
    check(re.search(r"bad\.toml:\d+:\d+: .*did you mean 'max_travel'", r.stderr) is not None, f"bad brief message: {r.stderr}")

    print(f"{len(failures)} failures")
    sys.exit(1 if failures else 0)


if __name__ == "__main__":
    main()
