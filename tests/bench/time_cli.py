#!/usr/bin/env python3
"""Wall time and peak memory of whole bandforge commands, process start included.

Usage: tests/bench/time_cli.py BUILD_DIR [RUNS]
Prints the median and maximum wall time of `solve --json` and `build` on the bundled example and
of `propose` on every example brief, and
the peak resident memory measured by /usr/bin/time -v. Targets (README "Performance"): solve --json
under 30 ms, build under 400 ms and 250 MB; propose under 5 s and 200 MB.
"""
import os
import re
import shutil
import subprocess
import sys
import tempfile
import time

build = sys.argv[1] if len(sys.argv) > 1 else "build"
runs = int(sys.argv[2]) if len(sys.argv) > 2 else 21
exe = os.path.join(build, "bin", "bandforge")
root = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))
example = os.path.join(root, "examples", "bin-hoist.toml")


def wall(args):
    times = []
    for _ in range(runs):
        t = time.perf_counter()
        subprocess.run(args, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL, check=True)
        times.append(time.perf_counter() - t)
    times.sort()
    return times[len(times) // 2] * 1000, times[-1] * 1000


def peak_kb(args):
    if not os.path.exists("/usr/bin/time"):
        return None
    r = subprocess.run(["/usr/bin/time", "-v"] + args, stdout=subprocess.DEVNULL,
                       stderr=subprocess.PIPE, text=True, check=True)
    m = re.search(r"Maximum resident set size \(kbytes\): (\d+)", r.stderr)
    return int(m.group(1)) if m else None


def report(name, args):
    med, worst = wall(args)
    kb = peak_kb(args)
    mem = f"{kb / 1024:.1f} MB" if kb else "n/a (install the 'time' package)"
    print(f"{name:<28} median {med:7.1f} ms   max {worst:7.1f} ms   peak memory {mem}")


print(f"bandforge command timings, {runs} runs each, {os.cpu_count()} cores")
report("solve --json bin-hoist", [exe, "solve", "--json", example])
probe = subprocess.run([exe, "build", "--help"], stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
if probe.returncode == 0:
    out = tempfile.mkdtemp(prefix="bandforge-bench-")
    try:
        report("build bin-hoist", [exe, "build", example, "-o", out])
    finally:
        shutil.rmtree(out, ignore_errors=True)

# propose on every example brief (issue 8 target: 5 proposals in ≤ 5 s on 2 cores, ≤ 200 MB).
briefs_dir = os.path.join(root, "examples", "briefs")
for brief in sorted(f for f in os.listdir(briefs_dir) if f.endswith(".toml")):
    out = tempfile.mkdtemp(prefix="bandforge-bench-")
    try:
        report(f"propose {os.path.splitext(brief)[0]}",
               [exe, "propose", os.path.join(briefs_dir, brief), "-o", out, "--quiet"])
    finally:
        shutil.rmtree(out, ignore_errors=True)
