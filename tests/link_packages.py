#!/usr/bin/python3
"""Every library bandforge links against comes from a Debian package that ./forge installs.

A fresh Debian 12 machine has only what forge installs (and what those packages depend on), so a
library that this machine happens to have for another reason breaks the fresh build at link
time. This check reads the link lines CMake wrote (every CMakeFiles/<target>.dir/link.txt of the
build folder, Makefile generator), takes each library on them (`-lNAME` and absolute paths to
.so/.a files outside the build folder), finds the file the linker would use (the line's -L
folders, then the compiler's own library search path), asks dpkg which package owns that file,
and requires the package to be in forge's PACKAGES list or to be pulled in by one that is
(the installed packages' Depends and Pre-Depends, followed recursively; of alternatives "a | b"
only the first, which is what apt installs on a machine that has neither).

  link_packages.py --build BUILD --forge FORGE
      exit 0 when every library is covered, else 1 with one line per library that is not.
  link_packages.py --build BUILD --forge FORGE --expect-missing PKG
      the check of the check: drops PKG from forge's list and exits 0 only when the check then
      fails and names a library owned by PKG (e.g. libfontconfig-dev, issue 9).
"""
import argparse
import glob
import os
import re
import shlex
import subprocess
import sys


def forge_packages(forge_path):
    """The words of PACKAGES="..." in forge (a shell assignment that may span lines)."""
    text = open(forge_path, encoding="utf-8").read()
    m = re.search(r'^PACKAGES="([^"]*)"', text, re.M)
    if not m:
        sys.exit(f"link_packages: no PACKAGES=\"...\" list in {forge_path}")
    return set(m.group(1).split())


def link_lines(build):
    files = sorted(glob.glob(os.path.join(build, "**", "link.txt"), recursive=True))
    if not files:
        sys.exit(f"link_packages: no link.txt under {build} (build with the Makefile generator first)")
    return files


def compiler_search_dirs():
    out = subprocess.run(["g++", "-print-search-dirs"], capture_output=True, text=True, check=True).stdout
    for line in out.splitlines():
        if line.startswith("libraries: ="):
            return [os.path.normpath(d) for d in line[len("libraries: ="):].split(":") if d]
    return []


def libraries(build):
    """(library as written, file the linker uses or None, link.txt) for every library."""
    build = os.path.realpath(build)
    default_dirs = compiler_search_dirs()
    found = []
    for lt in link_lines(build):
        words = shlex.split(open(lt, encoding="utf-8").read())
        ldirs = [w[2:] for w in words if w.startswith("-L")]
        for w in words:
            if w.startswith("-l") and len(w) > 2:
                name = w[2:]
                path = None
                for d in ldirs + default_dirs:
                    for f in (f"lib{name}.so", f"lib{name}.a"):
                        if os.path.exists(os.path.join(d, f)):
                            path = os.path.join(d, f)
                            break
                    if path:
                        break
                found.append((w, path, lt))
            elif w.startswith("/") and re.search(r"\.(so(\.[0-9.]+)?|a)$", w):
                if not os.path.realpath(w).startswith(build + os.sep):
                    found.append((w, w if os.path.exists(w) else None, lt))
    return found


def owner(path):
    """The package that owns `path`; tries the path as written, then with and without /usr
    (Debian 12 is usr-merged: /lib is /usr/lib), then the file the symlink points at."""
    tries = [path]
    if path.startswith("/usr/lib/"):
        tries.append(path[len("/usr"):])
    elif path.startswith("/lib/"):
        tries.append("/usr" + path)
    real = os.path.realpath(path)
    if real not in tries:
        tries.append(real)
    for p in tries:
        r = subprocess.run(["dpkg", "-S", p], capture_output=True, text=True)
        if r.returncode == 0:
            for line in r.stdout.splitlines():
                pkgs, _, file = line.partition(": ")
                if file.strip() == p:
                    return pkgs.split(",")[0].strip().split(":")[0]
    return None


def installed_graph():
    """package -> list of dependency groups (each a list of alternatives), and provider map."""
    fmt = "${Package}\t${Status}\t${Pre-Depends}\t${Depends}\t${Provides}\n"
    out = subprocess.run(["dpkg-query", "-W", "-f", fmt], capture_output=True, text=True, check=True).stdout
    deps, providers = {}, {}
    for line in out.splitlines():
        pkg, status, pre, dep, prov = (line.split("\t") + [""] * 5)[:5]
        if "install ok installed" not in status:
            continue
        groups = []
        for field in (pre, dep):
            for group in filter(None, (g.strip() for g in field.split(","))):
                alts = [re.sub(r"\s*\(.*?\)|:\w+|\s*\[.*?\]", "", a).strip() for a in group.split("|")]
                groups.append([a for a in alts if a])
        deps[pkg] = groups
        for p in filter(None, (re.sub(r"\s*\(.*?\)", "", x).strip() for x in prov.split(","))):
            providers.setdefault(p, []).append(pkg)
    return deps, providers


def closure(roots, deps, providers):
    seen, todo = set(), list(roots)
    while todo:
        p = todo.pop()
        if p in seen:
            continue
        seen.add(p)
        for group in deps.get(p, []):
            first = group[0]
            if first in deps:
                todo.append(first)
            else:  # a virtual package: whichever installed package provides it
                todo.extend(providers.get(first, []))
    return seen


def check(build, packages):
    deps, providers = installed_graph()
    covered = closure(packages, deps, providers)
    problems, owners = [], {}
    libs = libraries(build)
    for lib, path, lt in libs:
        rel = os.path.relpath(lt, build)
        if path is None:
            problems.append((lib, None, f"{lib} (in {rel}): the linker would not find it on this machine"))
            continue
        if path not in owners:
            owners[path] = owner(path)
        pkg = owners[path]
        if pkg is None:
            problems.append((lib, None, f"{lib} -> {path} (in {rel}): no Debian package owns it"))
        elif pkg not in covered:
            problems.append((lib, pkg, f"{lib} -> {path} is in package {pkg}, which is not in forge's "
                                       f"list nor pulled in by a package that is (in {rel})"))
    return libs, owners, problems


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--build", required=True)
    ap.add_argument("--forge", required=True)
    ap.add_argument("--expect-missing")
    a = ap.parse_args()
    packages = forge_packages(a.forge)
    if a.expect_missing:
        if a.expect_missing not in packages:
            sys.exit(f"link_packages: {a.expect_missing} is not in forge's list to begin with")
        libs, owners, problems = check(a.build, packages - {a.expect_missing})
        hit = sorted({lib for lib, pkg, _ in problems if pkg == a.expect_missing})
        if not hit:
            print(f"FAIL: without {a.expect_missing} in forge's list the check still passes")
            return 1
        print(f"ok: without {a.expect_missing} the check fails for {', '.join(hit)}")
        return 0
    libs, owners, problems = check(a.build, packages)
    distinct = sorted(set(owners.values()) - {None})
    print(f"{len(libs)} library references on {len(link_lines(a.build))} link lines, "
          f"{len(owners)} files, from {len(distinct)} packages: {' '.join(distinct)}")
    for _, _, msg in problems:
        print("FAIL:", msg)
    return 1 if problems else 0


if __name__ == "__main__":
    sys.exit(main())
