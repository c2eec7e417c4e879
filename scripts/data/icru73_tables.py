#!/usr/bin/env python3
"""ICRU Report 73 stopping powers of ions Z = 3-18, as tables for crewdose's tests and fits.

Reads the ICRU 73 tables as distributed in libdEdx (public repository APTG/libdedx):
  data/raw/ICRU73_NEW.dat  the revised water (and air) table, ICRU 73 with its errata
                           (labelled 'ICRU73_NEW (icru table with errata)' in libdEdx);
  data/raw/ICRU73.dat      ICRU 73 as first printed, 25 targets;
  data/raw/icru73Eng.dat   their common energy grid, MeV per nucleon (0.025-1000).
Each block is '#<target>:<Z>:<n>' followed by n stopping powers, MeV cm2/g; target numbers
follow the NIST (ESTAR/PSTAR) material numbering: 276 liquid water, 13 aluminium, 14 silicon,
221 polyethylene.

Writes tests/data/icru73/icru73_ions_<target>.csv with columns T_MeV_per_u, Z, S_MeV_cm2_g
and a header naming the source file and commit.

Usage:
  python3 scripts/data/icru73_tables.py --git-dir /path/to/libdedx.git [--out tests/data/icru73]
"""
import argparse
import os
import subprocess

TARGETS = [  # (libdEdx target number, file, crewdose material, which table)
    (276, "water", "water", "ICRU73_NEW.dat"),
    (13, "aluminium", "aluminium", "ICRU73.dat"),
    (14, "silicon", "silicon", "ICRU73.dat"),
    (221, "polyethylene", "polyethylene", "ICRU73.dat"),
]


def git_show(git_dir, ref, path):
    return subprocess.run(["git", "--git-dir=" + git_dir, "show", "%s:%s" % (ref, path)],
                          check=True, stdout=subprocess.PIPE).stdout.decode()


def blocks(text):
    out, cur = {}, None
    for line in text.splitlines():
        line = line.strip()
        if not line:
            continue
        if line.startswith("#"):
            target, z, n = line[1:].split(":")
            cur = (int(target), int(z))
            out[cur] = []
        else:
            out[cur].append(float(line))
    return out


def main():
    ap = argparse.ArgumentParser(description=__doc__,
                                 formatter_class=argparse.RawDescriptionHelpFormatter)
    ap.add_argument("--git-dir", required=True)
    ap.add_argument("--ref", default="HEAD")
    ap.add_argument("--out", default=os.path.join(os.path.dirname(__file__), "..", "..",
                                                  "tests", "data", "icru73"))
    a = ap.parse_args()
    commit = subprocess.run(["git", "--git-dir=" + a.git_dir, "rev-parse", a.ref], check=True,
                            stdout=subprocess.PIPE).stdout.decode().strip()
    energies = [float(x) for x in git_show(a.git_dir, a.ref, "data/raw/icru73Eng.dat").split()[1:]]
    tables = {name: blocks(git_show(a.git_dir, a.ref, "data/raw/" + name))
              for name in ("ICRU73_NEW.dat", "ICRU73.dat")}
    for target, fname, material, table in TARGETS:
        rows = []
        for z in range(3, 19):
            values = tables[table][(target, z)]
            if len(values) != len(energies):
                raise ValueError("%s target %d Z %d: %d values for %d energies"
                                 % (table, target, z, len(values), len(energies)))
            rows += [(e, z, s) for e, s in zip(energies, values)]
        path = os.path.join(a.out, "icru73_ions_%s.csv" % fname)
        with open(path, "w") as f:
            f.write("# Electronic mass stopping power of %s (libdEdx / NIST material %d) for ions\n"
                    "# Z = 3-18: ICRU Report 73 (2005), 'Stopping of Ions Heavier than Helium',\n"
                    "# J. ICRU 5(1)%s.\n"
                    "# Read from github.com/APTG/libdedx commit %s, data/raw/%s and\n"
                    "# data/raw/icru73Eng.dat, by scripts/data/icru73_tables.py.\n"
                    "# T: kinetic energy per nucleon, MeV/u; S: MeV cm2/g.\n"
                    % (material, target,
                       ", revised after its errata (libdEdx's ICRU73_NEW)" if table ==
                       "ICRU73_NEW.dat" else ", as first printed (libdEdx's ICRU73)",
                       commit, table))
            f.write("T_MeV_per_u,Z,S_MeV_cm2_g\n")
            for e, z, s in rows:
                f.write("%g,%d,%g\n" % (e, z, s))
        print("wrote %s (%d rows)" % (path, len(rows)))


if __name__ == "__main__":
    main()
