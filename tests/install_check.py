#!/usr/bin/python3
"""The installed bandforge works on its own (issue 9).

  install_check.py tree --build BUILD --source SRC --work WORK
      `cmake --install BUILD --prefix /usr` into DESTDIR=WORK/root; checks the installed files
      (bin/bandforge, libexec/bandforge/bandforge-cad and bandforge-step.so, the man page, README and examples under
      share/doc/bandforge/); then, from a working folder outside both trees, runs the installed
      `bandforge --version`, `solve`, `solve --json` and `build` of an installed example and
      requires every output to equal, byte for byte, what the build tree's bandforge writes for
      the same design; and checks that the man page describes every option that each command's
      --help lists.
  install_check.py deb --build BUILD --source SRC --work WORK
      `cpack -G DEB`: the package's name and version, its Depends computed from the shared
      libraries (dpkg-shlibdeps) plus the font, its file list; unpacked with dpkg-deb, the
      executable runs from another folder.
"""
import argparse
import filecmp
import os
import re
import shutil
import subprocess
import sys

failures = []


def expect(ok, what):
    print(("ok:   " if ok else "FAIL: ") + what)
    if not ok:
        failures.append(what)


def run(cmd, cwd=None, env=None, stdin=None):
    return subprocess.run(cmd, cwd=cwd, env=env, capture_output=True, text=True, input=stdin)


def project_version(source):
    m = re.search(r"project\(bandforge VERSION ([0-9.]+)", open(os.path.join(source, "CMakeLists.txt")).read())
    return m.group(1)


def same_tree(a, b):
    """Relative paths of files that differ (or exist in one tree only)."""
    diffs = []
    names = set()
    for top in (a, b):
        for d, _, files in os.walk(top):
            names.update(os.path.relpath(os.path.join(d, f), top) for f in files)
    for n in sorted(names):
        pa, pb = os.path.join(a, n), os.path.join(b, n)
        if not (os.path.isfile(pa) and os.path.isfile(pb) and filecmp.cmp(pa, pb, shallow=False)):
            diffs.append(n)
    return diffs, len(names)


def man_covers_help(exe, man_text):
    plain = man_text.replace("\\-", "-")
    for cmd in ([], ["solve"], ["build"], ["propose"], ["new"], ["materials"]):
        r = run([exe] + cmd + ["--help"])
        opts = sorted(set(re.findall(r"(?<![\w-])(--[a-z][a-z0-9-]*)", r.stdout)))
        expect(r.returncode == 0 and "--help" in opts, f"`bandforge {' '.join(cmd)} --help` lists its options")
        missing = [o for o in opts if o not in plain]
        expect(not missing, f"man page describes every option of `bandforge {' '.join(cmd)}`"
                            + (f" (missing: {', '.join(missing)})" if missing else f" ({', '.join(opts)})"))
    for cmd in ("solve", "build", "propose", "new", "materials"):
        expect(re.search(rf'^\.BI? "?{cmd}( |"|$)', man_text, re.M) is not None,
               f"man page has an entry for `{cmd}` under COMMANDS")


def tree(a):
    version = project_version(a.source)
    root = os.path.join(a.work, "root")
    shutil.rmtree(a.work, ignore_errors=True)
    os.makedirs(a.work)
    env = dict(os.environ, DESTDIR=root)
    r = run(["cmake", "--install", a.build, "--prefix", "/usr"], env=env)
    expect(r.returncode == 0, "cmake --install into a DESTDIR" + ("" if r.returncode == 0 else ": " + r.stderr[-400:]))
    usr = os.path.join(root, "usr")
    exe = os.path.join(usr, "bin", "bandforge")
    cad = os.path.join(usr, "libexec", "bandforge", "bandforge-cad")
    man = os.path.join(usr, "share", "man", "man1", "bandforge.1")
    doc = os.path.join(usr, "share", "doc", "bandforge")
    for p in (exe, cad):
        expect(os.access(p, os.X_OK), f"installed and executable: {os.path.relpath(p, root)}")
    # The STEP writer module beside bandforge-cad (geometry/step_transfer.hpp).
    for p in (man, os.path.join(doc, "README.md"), os.path.join(os.path.dirname(cad), "bandforge-step.so")):
        expect(os.path.isfile(p), f"installed: {os.path.relpath(p, root)}")
    src_examples = sorted(os.path.relpath(os.path.join(d, f), os.path.join(a.source, "examples"))
                          for d, _, files in os.walk(os.path.join(a.source, "examples"))
                          for f in files if f.endswith(".toml"))
    for f in src_examples:
        p = os.path.join(doc, "examples", f)
        expect(os.path.isfile(p) and filecmp.cmp(p, os.path.join(a.source, "examples", f), shallow=False),
               f"installed example equals the source: {f}")
    if failures:
        return
    # Nothing of the build tree may be needed: no RUNPATH into it.
    for p in (exe, cad):
        d = run(["readelf", "-d", p]).stdout
        expect(os.path.realpath(a.build) not in d, f"{os.path.basename(p)} has no RUNPATH into the build tree")

    elsewhere = os.path.join(a.work, "elsewhere")
    os.makedirs(elsewhere)
    r = run([exe, "--version"], cwd=elsewhere)
    expect(r.returncode == 0 and r.stdout.strip() == f"bandforge {version}",
           f"installed `bandforge --version` prints 'bandforge {version}' (got {r.stdout.strip()!r})")

    design = os.path.join(doc, "examples", "bin-hoist.toml")
    build_exe = os.path.join(a.build, "bin", "bandforge")
    for args in (["solve"], ["solve", "--json"], ["solve", "--units", "us"]):
        inst = run([exe, args[0], design] + args[1:], cwd=elsewhere)
        ref = run([build_exe, args[0], design] + args[1:], cwd=a.work)
        expect(inst.returncode == 0 and inst.stdout == ref.stdout and inst.stdout,
               f"installed `bandforge {' '.join(args)}` prints what the build tree's prints")
    inst = run([exe, "build", design, "-o", "out"], cwd=elsewhere)
    expect(inst.returncode == 0, "installed `bandforge build` from another folder" +
           ("" if inst.returncode == 0 else ": " + inst.stderr[-400:]))
    ref = run([build_exe, "build", design, "-o", os.path.join(a.work, "ref")], cwd=a.work)
    expect(ref.returncode == 0, "build tree's `bandforge build`")
    diffs, n = same_tree(os.path.join(elsewhere, "out"), os.path.join(a.work, "ref"))
    expect(n >= 4 and not diffs, f"the installed build wrote the same {n} files, byte for byte"
                                 + (f" (differ: {', '.join(diffs)})" if diffs else ""))
    # propose from the installed tree (handed to the installed bandforge-cad for the review sheet):
    # the build tree's bytes.
    brief = os.path.join(doc, "examples", "briefs", "bin-hoist.toml")
    inst = run([exe, "propose", brief, "-o", "proposals", "--quiet"], cwd=elsewhere)
    expect(inst.returncode == 0, "installed `bandforge propose` from another folder" +
           ("" if inst.returncode == 0 else ": " + inst.stderr[-400:]))
    ref = run([build_exe, "propose", brief, "-o", os.path.join(a.work, "ref-proposals"), "--quiet"], cwd=a.work)
    diffs, n = same_tree(os.path.join(elsewhere, "proposals"), os.path.join(a.work, "ref-proposals"))
    expect(ref.returncode == 0 and n >= 3 and not diffs, f"the installed propose wrote the same {n} files"
                                 + (f" (differ: {', '.join(diffs)})" if diffs else ""))
    pdfinfo = run(["pdfinfo", os.path.join(elsewhere, "out", "KFW-2207-BR.pdf")]).stdout
    expect(re.search(rf"^Producer:\s+bandforge {re.escape(version)} ", pdfinfo, re.M) is not None,
           f"the PDF's producer names bandforge {version}")
    step = open(os.path.join(elsewhere, "out", "KFW-2207-BR.step"), encoding="utf-8").read()
    expect(f"'bandforge {version}'" in step, f"the STEP header's originating system is 'bandforge {version}'")
    man_covers_help(exe, open(man, encoding="utf-8").read())


def deb(a):
    version = project_version(a.source)
    shutil.rmtree(a.work, ignore_errors=True)
    os.makedirs(a.work)
    r = run(["cpack", "-G", "DEB", "--config", os.path.join(a.build, "CPackConfig.cmake"), "-B", a.work])
    expect(r.returncode == 0, "cpack -G DEB" + ("" if r.returncode == 0 else ": " + (r.stdout + r.stderr)[-600:]))
    arch = run(["dpkg", "--print-architecture"]).stdout.strip()
    pkg = os.path.join(a.work, f"bandforge_{version}_{arch}.deb")
    expect(os.path.isfile(pkg), f"the package is {os.path.basename(pkg)}")
    if failures:
        return
    field = lambda f: run(["dpkg-deb", "-f", pkg, f]).stdout.strip()
    expect(field("Package") == "bandforge" and field("Version") == version, "Package and Version fields")
    depends = field("Depends")
    print("      Depends:", depends)
    # dpkg-shlibdeps: the runtime packages of the libraries the executables link.
    for needed in ("libc6", "libstdc++6", "libudunits2-0", "libhpdf-2.3.0", "libocct-data-exchange-7.6",
                   "libocct-modeling-algorithms-7.6", "libdxflib", "fonts-dejavu-core"):
        expect(re.search(rf"(^|, ){re.escape(needed)}", depends) is not None, f"Depends names {needed}")
    files = run(["dpkg-deb", "-c", pkg]).stdout
    for f in ("./usr/bin/bandforge", "./usr/libexec/bandforge/bandforge-cad",
              "./usr/libexec/bandforge/bandforge-step.so",
              "./usr/share/man/man1/bandforge.1", "./usr/share/doc/bandforge/README.md",
              "./usr/share/doc/bandforge/examples/bin-hoist.toml"):
        expect(re.search(rf" {re.escape(f)}$", files, re.M) is not None, f"the package holds {f}")
    unpacked = os.path.join(a.work, "unpacked")
    run(["dpkg-deb", "-x", pkg, unpacked])
    r = run([os.path.join(unpacked, "usr", "bin", "bandforge"), "solve",
             os.path.join(unpacked, "usr", "share", "doc", "bandforge", "examples", "bin-hoist.toml")], cwd="/")
    expect(r.returncode == 0 and "KFW-2207-BR" in r.stdout,
           "the unpacked package's bandforge solves the example from /")


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("mode", choices=["tree", "deb"])
    ap.add_argument("--build", required=True)
    ap.add_argument("--source", required=True)
    ap.add_argument("--work", required=True)
    a = ap.parse_args()
    a.build, a.source, a.work = map(os.path.realpath, (a.build, a.source, a.work))
    (tree if a.mode == "tree" else deb)(a)
    print(f"{len(failures)} failure(s)")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
