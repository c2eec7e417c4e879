#!/usr/bin/env python3
# -*- coding: utf-8 -*-
"""
process_endf.py -- turn ENDF-6 evaluated nuclear data (incident-proton and
incident-neutron sublibraries of ENDF/B-VIII.1) into compact secondary-particle
production tables for crewdose, and those tables into the compiled-in C++ data
of exposure/endf_production_data.cpp.

Python 3 standard library only.  Written from the ENDF-6 format description
(ENDF-102); it does not reuse any existing ENDF processing code.  See
scripts/data/README.md for the provenance of the data and how to regenerate.

WHAT IT PRODUCES (per element and projectile, see write_element_table()):
  * non-elastic (reaction) cross section, mb
  * for each light ejectile n, p, d, t, He-3, alpha:
      production cross section (mb), mean lab energy,
      angle-integrated LAB emission spectrum dsigma/dE' (mb/MeV) on a fixed
      log grid, and the fraction of each outgoing bin emitted forward
      (cos theta_lab > 0)
  * energy carried by heavy residuals/recoils (ZAP > 2004), mb*MeV
  * energy carried by photons, mb*MeV (needed for the energy balance)
  * mass-balance Q value per reaction and an energy-balance check

SUB-COMMANDS
  inventory   list sublibrary files for the requested elements (MAT, EMAX,
              MF3/MF6 sections, absent files) -> <out>/INVENTORY.md
  masses      build <out>/masses.json from the decay sublibrary (done
              automatically by `process` when missing)
  process     build the per-element tables <out>/{p,n}_<El>.txt plus
              balance_{p,n}.txt and coverage_{p,n}.txt
  check       re-read the tables (reference reader read_table()) and write
              <out>/CHECKS.txt: Letaw-1983 comparison, spectrum integrals,
              energy-balance digest
  emit-cpp    read the tables of --tables DIR and write the C++ data file
              (--out FILE, e.g. exposure/endf_production_data.cpp): incident
              energies regridded to 10 per decade, outgoing energies rebinned
              to 10 per decade (see emit_cpp())

  e.g.  python3 scripts/data/process_endf.py inventory
        python3 scripts/data/process_endf.py process
        python3 scripts/data/process_endf.py check
        python3 scripts/data/process_endf.py emit-cpp --out exposure/endf_production_data.cpp
  (inventory/process/check write to --out, default build/endf-data/ of the
  repository, which git ignores; emit-cpp reads --tables, same default.)

DATA SOURCE
  Either a directory holding the *.endf files (--endf-dir DIR, laid out as
  DIR/<sublib>/<file>.endf with the names of the ENDF/B distribution, e.g.
  DIR/protons-version.VIII.1/p-013_Al_027.endf) or a bare git directory
  (--git-dir DIR [--ref HEAD] --lib-root ENDF-B-VIII.1), read through the
  `git` command line.

PHYSICS CONVENTIONS (also written into every output header)
  * Energies in MeV in the output (ENDF uses eV internally).
  * Kinematics are non-relativistic, as in the ENDF-6 CM<->lab relations.
  * Centre-of-mass (CM) distributions (LCT=2; LCT=3 for A<=4) are
    transformed to the lab frame exactly in angle at each CM outgoing
    energy point: E_lab = E' + E_c + 2 mu sqrt(E' E_c),
    E_c = E_in*AWI*AWP/(AWR+AWI)^2, mu_lab > 0  <=>  mu_cm > -sqrt(E_c/E');
    CM energy histograms are cut into pieces < ~1/3 of an output bin.
  * Kalbach-Mann slope a(E,E') for LANG=2, NA=1 from the Kalbach (1988)
    systematics (Phys. Rev. C 37, 2350), constants as in TALYS
    source/kalbach.f and OpenMC openmc/data/kalbach_mann.py (see kalbach_a()).
  * LAW=2/3 two-body, LAW=4 recoil and LAW=6 phase space from kinematics
    with MF3 QI; two-body MTs given only through MF3+MF4 (discrete levels)
    are treated the same way, with level photons of energy QM-QI.
  * Residuals missing from a two-body MT are added from kinematics.
  * Leading "dummy" LAW=1 distributions (emission below 1 keV) mark energies
    below a product's threshold; their (non-zero) yields are gated to zero.
  * Natural-element tables weight isotopes by abundance (IUPAC 2013 via
    OpenMC, see ABUNDANCE), renormalised over the isotopes whose file covers
    the energy (COVER column).
"""

import argparse
import bisect
import datetime
import json
import math
import os
import re
import subprocess
import sys

# ---------------------------------------------------------------------------
# Physical constants: CODATA 2018 recommended values
# (https://physics.nist.gov/cuu/Constants/).  Used only to turn the AWR of the
# ENDF/B-VIII.1 decay sublibrary (mass / neutron mass) into mass excesses.
# ---------------------------------------------------------------------------
# Neutron mass in u, CODATA 2018: 1.00866491595(49) u.  Read in OpenMC
# openmc/data/data.py (NEUTRON_MASS) and include/openmc/constants.h
# (MASS_NEUTRON), both "CODATA 2018", repository openmc-dev/openmc, commit
# 3f06a42abb89a9b09cb3f2e86680a31bae90cc08.
NEUTRON_AMU = 1.00866491595
# Atomic mass constant energy equivalent, CODATA 2018: 931.49410242(28) MeV.
# Value from memory; checked against the same OpenMC constants.h:
# MASS_NEUTRON_EV / MASS_NEUTRON = 939.56542052e6 / 1.00866491595 eV
# = 931.4941024 MeV (agrees to 1e-10).
AMU_MEV = 931.49410242

# Light ejectiles we tabulate: ZA -> label
LIGHT = [(1, "n"), (1001, "p"), (1002, "d"), (1003, "t"), (2003, "he3"), (2004, "alpha")]
LIGHT_ZA = dict(LIGHT)

ELEMENT_SYMBOLS = [
    "n", "H", "He", "Li", "Be", "B", "C", "N", "O", "F", "Ne", "Na", "Mg", "Al", "Si", "P", "S",
    "Cl", "Ar", "K", "Ca", "Sc", "Ti", "V", "Cr", "Mn", "Fe", "Co", "Ni", "Cu", "Zn", "Ga", "Ge",
    "As", "Se", "Br", "Kr", "Rb", "Sr", "Y", "Zr", "Nb", "Mo", "Tc", "Ru", "Rh", "Pd", "Ag", "Cd",
    "In", "Sn", "Sb", "Te", "I", "Xe", "Cs", "Ba", "La", "Ce", "Pr", "Nd", "Pm", "Sm", "Eu", "Gd",
    "Tb", "Dy", "Ho", "Er", "Tm", "Yb", "Lu", "Hf", "Ta", "W", "Re", "Os", "Ir", "Pt", "Au", "Hg",
    "Tl", "Pb", "Bi"]

# Elements requested by crewdose.
DEFAULT_ELEMENTS = ["H", "He", "Li", "Be", "B", "C", "N", "O", "F", "Ne", "Na", "Mg", "Al", "Si",
                    "P", "S", "Cl", "Ar", "K", "Ca", "Ti", "Cr", "Mn", "Fe", "Ni", "Cu", "W", "Pb"]

# Natural isotopic abundances (atom fraction), IUPAC 2013: J. Meija, T.B. Coplen
# et al., "Isotopic compositions of the elements 2013 (IUPAC Technical Report)",
# Pure Appl. Chem. 88 (2016) 293-306.  Transcribed from the public table
# NATURAL_ABUNDANCE in openmc/data/data.py of openmc-dev/openmc, commit
# 3f06a42abb89a9b09cb3f2e86680a31bae90cc08 (2025-12-23), which takes the
# "representative isotopic abundance" and, where IUPAC gives an interval, the
# "best measurement".  (An older OpenMC version of that file, commit
# 02bb6d7d1295df56963739410809fd32371b2fd5, used interval averages instead; they
# differ for H, Li, B, C, N, O, Mg, Si, S, Cl.)  Earlier versions of this script
# had the IUPAC 1997 values typed from memory.
ABUNDANCE = {
    "H": {1: 0.99984426, 2: 0.00015574},
    "He": {3: 0.000002, 4: 0.999998},
    "Li": {6: 0.07589, 7: 0.92411},
    "Be": {9: 1.0},
    "B": {10: 0.1982, 11: 0.8018},
    "C": {12: 0.988922, 13: 0.011078},
    "N": {14: 0.996337, 15: 0.003663},
    "O": {16: 0.9976206, 17: 0.000379, 18: 0.0020004},
    "F": {19: 1.0},
    "Ne": {20: 0.9048, 21: 0.0027, 22: 0.0925},
    "Na": {23: 1.0},
    "Mg": {24: 0.78951, 25: 0.1002, 26: 0.11029},
    "Al": {27: 1.0},
    "Si": {28: 0.9222968, 29: 0.0468316, 30: 0.0308716},
    "P": {31: 1.0},
    "S": {32: 0.9504074, 33: 0.0074869, 34: 0.0419599, 36: 0.0001458},
    "Cl": {35: 0.757647, 37: 0.242353},
    "Ar": {36: 0.003336, 38: 0.000629, 40: 0.996035},
    "K": {39: 0.932581, 40: 0.000117, 41: 0.067302},
    "Ca": {40: 0.96941, 42: 0.00647, 43: 0.00135, 44: 0.02086, 46: 0.00004, 48: 0.00187},
    "Ti": {46: 0.0825, 47: 0.0744, 48: 0.7372, 49: 0.0541, 50: 0.0518},
    "Cr": {50: 0.04345, 52: 0.83789, 53: 0.09501, 54: 0.02365},
    "Mn": {55: 1.0},
    "Fe": {54: 0.05845, 56: 0.91754, 57: 0.02119, 58: 0.00282},
    "Ni": {58: 0.680769, 60: 0.262231, 61: 0.011399, 62: 0.036345, 64: 0.009256},
    "Cu": {63: 0.6915, 65: 0.3085},
    "W": {180: 0.0012, 182: 0.2650, 183: 0.1431, 184: 0.3064, 186: 0.2843},
    "Pb": {204: 0.014, 206: 0.241, 207: 0.221, 208: 0.524},
}
ABUNDANCE_SOURCE = ("IUPAC 2013 isotopic compositions (Meija et al., Pure Appl. Chem. 88 (2016) 293), "
                    "as transcribed in openmc-dev/openmc openmc/data/data.py, commit 3f06a42abb89")

# Default output folder of inventory/process/check (and input of emit-cpp):
# build/endf-data/ of the repository (git ignores build*/).
DEFAULT_OUT = os.path.join(os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__)))),
                           "build", "endf-data")

PROJECTILES = {"p": {"za": 1001, "prefix": "p", "sub": "protons-version.VIII.1"},
               "n": {"za": 1, "prefix": "n", "sub": "neutrons-version.VIII.1"}}


# ---------------------------------------------------------------------------
# Data sources (directory of files, or a bare git repository)
# ---------------------------------------------------------------------------
class DirSource:
    """ENDF files in a plain directory tree: <root>/<sublib>/<file>."""

    def __init__(self, root):
        self.root = root
        self.describe = "directory " + os.path.abspath(root)

    def listing(self, sublib):
        """Return {filename: size or None(absent)}."""
        d = os.path.join(self.root, sublib)
        out = {}
        if os.path.isdir(d):
            for f in os.listdir(d):
                if f.endswith(".endf"):
                    out[f] = os.path.getsize(os.path.join(d, f))
        return out

    def read(self, sublib, fname):
        with open(os.path.join(self.root, sublib, fname), "r", errors="replace") as fh:
            return fh.read()

    def path_of(self, sublib, fname):
        return os.path.join(self.root, sublib, fname)


class GitSource:
    """ENDF files inside a (possibly partial) bare git repository.

    Blobs missing from the object store (e.g. large files left out of a
    snapshot) are reported with size None and cannot be read."""

    def __init__(self, git_dir, ref="HEAD", lib_root="ENDF-B-VIII.1", repo_name=None):
        self.git_dir = git_dir
        self.ref = ref
        self.lib_root = lib_root.rstrip("/")
        self.repo_name = repo_name or git_dir
        self.commit = self._git("rev-parse", ref).strip()
        self.describe = "git repository %s, commit %s" % (self.repo_name, self.commit)

    def _git(self, *args, binary=False):
        r = subprocess.run(["git", "--git-dir=" + self.git_dir] + list(args),
                           stdout=subprocess.PIPE, stderr=subprocess.PIPE)
        if r.returncode != 0:
            raise IOError(r.stderr.decode(errors="replace").strip())
        return r.stdout if binary else r.stdout.decode(errors="replace")

    def listing(self, sublib):
        txt = self._git("ls-tree", "-l", self.ref, self.lib_root + "/" + sublib + "/")
        out = {}
        for line in txt.splitlines():
            meta, path = line.split("\t", 1)
            parts = meta.split()
            name = path.rsplit("/", 1)[-1]
            if not name.endswith(".endf"):
                continue
            try:
                out[name] = int(parts[3])
            except ValueError:          # size shown as "BAD": blob absent
                out[name] = None
        return out

    def read(self, sublib, fname):
        return self._git("cat-file", "blob", "%s:%s/%s/%s" % (self.ref, self.lib_root, sublib, fname))

    def path_of(self, sublib, fname):
        return "%s/%s/%s" % (self.lib_root, sublib, fname)


# ---------------------------------------------------------------------------
# ENDF-6 record level parsing
# ---------------------------------------------------------------------------
def endf_float(s):
    """Parse an ENDF 11-column real, e.g. ' 1.302700+4', '-8.438000+5', '1.0E+6'."""
    s = s.strip()
    if not s:
        return 0.0
    try:
        return float(s)
    except ValueError:
        pass
    # exponent written without 'E': find a sign that is not the leading one
    for i in range(len(s) - 1, 0, -1):
        if s[i] in "+-" and s[i - 1] not in "eEdD":
            return float(s[:i] + "e" + s[i:])
    return float(s.replace("D", "E").replace("d", "e"))


def endf_int(s):
    s = s.strip()
    if not s:
        return 0
    try:
        return int(s)
    except ValueError:
        return int(round(endf_float(s)))


def split_sections(text):
    """Split an ENDF-6 material into sections.

    Returns (mat, {(mf, mt): [66-column data strings]}).  Only the first
    material of the tape is read."""
    sections = {}
    mat = None
    for raw in text.splitlines():
        line = raw.rstrip("\n").ljust(80)
        try:
            m = int(line[66:70])
            mf = int(line[70:72])
            mt = int(line[72:75])
        except ValueError:
            continue
        if m <= 0 or mf == 0 or mt == 0:
            continue             # TPID, SEND, FEND, MEND, TEND
        if mat is None:
            mat = m
        elif m != mat:
            break
        sections.setdefault((mf, mt), []).append(line[:66])
    return mat, sections


class Records:
    """Sequential reader of ENDF-6 records (CONT, LIST, TAB1, TAB2) in a section."""

    def __init__(self, lines):
        self.lines = lines
        self.i = 0

    def cont(self):
        s = self.lines[self.i]
        self.i += 1
        return (endf_float(s[0:11]), endf_float(s[11:22]), endf_int(s[22:33]),
                endf_int(s[33:44]), endf_int(s[44:55]), endf_int(s[55:66]))

    def values(self, n):
        out = []
        while len(out) < n:
            s = self.lines[self.i]
            self.i += 1
            for k in range(6):
                if len(out) >= n:
                    break
                out.append(endf_float(s[11 * k:11 * k + 11]))
        return out

    def list_record(self):
        c = self.cont()
        return c, self.values(c[4])

    def _interp_table(self, nr):
        v = self.values(2 * nr)
        return [int(round(x)) for x in v[0::2]], [int(round(x)) for x in v[1::2]]

    def tab1(self):
        c = self.cont()
        nbt, ints = self._interp_table(c[4])
        xy = self.values(2 * c[5])
        return c, Tab1(xy[0::2], xy[1::2], nbt, ints)

    def tab2(self):
        c = self.cont()
        nbt, ints = self._interp_table(c[4])
        return c, nbt, ints


def interp_pair(x1, y1, x2, y2, x, scheme):
    """ENDF interpolation law INT=1..5 between two points (ENDF-102 section 0, from memory)."""
    if x2 == x1:
        return y1
    if scheme == 1:
        return y1
    t = (x - x1) / (x2 - x1)
    if scheme == 2:
        return y1 + t * (y2 - y1)
    if scheme == 3 and x1 > 0 and x > 0:              # y linear in ln x
        return y1 + (y2 - y1) * math.log(x / x1) / math.log(x2 / x1)
    if scheme == 4 and y1 > 0 and y2 > 0:             # ln y linear in x
        return y1 * math.exp(t * math.log(y2 / y1))
    if scheme == 5 and x1 > 0 and x > 0 and y1 > 0 and y2 > 0:   # log-log
        return y1 * math.exp(math.log(y2 / y1) * math.log(x / x1) / math.log(x2 / x1))
    return y1 + t * (y2 - y1)                         # fallback: lin-lin


class Tab1:
    """A TAB1 function y(x) with ENDF interpolation regions."""

    def __init__(self, x, y, nbt, ints):
        self.x, self.y, self.nbt, self.ints = list(x), list(y), list(nbt), list(ints)

    def scheme(self, i):
        """Interpolation law for the interval between points i and i+1 (0-based)."""
        for nb, it in zip(self.nbt, self.ints):
            if i + 2 <= nb:
                return it
        return self.ints[-1] if self.ints else 2

    def __call__(self, x):
        xs = self.x
        if not xs or x < xs[0] or x > xs[-1]:
            return 0.0
        if x == xs[-1]:
            return self.y[-1]
        i = bisect.bisect_right(xs, x) - 1
        return interp_pair(xs[i], self.y[i], xs[i + 1], self.y[i + 1], x, self.scheme(i))

    def __repr__(self):
        return "Tab1(%d pts, %g..%g)" % (len(self.x), self.x[0], self.x[-1])


# ---------------------------------------------------------------------------
# ENDF-6 file level: MF1/MT451, MF3, MF6
# ---------------------------------------------------------------------------
class EndfMaterial:
    def __init__(self, text, name=""):
        self.name = name
        self.mat, self.sections = split_sections(text)
        r = Records(self.sections[(1, 451)])
        c1 = r.cont()
        c2 = r.cont()
        c3 = r.cont()
        c4 = r.cont()
        self.za = int(round(c1[0]))
        self.awr = c1[1]
        self.lis, self.liso = c2[2], c2[3]
        self.awi = c3[0]
        self.emax = c3[1]              # eV
        self.nsub = c3[4]
        self.nver = c3[5]
        nwd = c4[4]
        self.text = [r.lines[r.i + k] for k in range(nwd)]
        self.z = self.za // 1000
        self.a = self.za % 1000

    def mts(self, mf):
        return sorted(mt for (f, mt) in self.sections if f == mf)

    def mf3(self, mt):
        """Return (QM, QI, Tab1 sigma(E) in barns vs eV) for MF3/MT."""
        r = Records(self.sections[(3, mt)])
        r.cont()
        c, tab = r.tab1()
        return c[0], c[1], tab

    def mf6(self, mt):
        return MF6Section(self.sections[(6, mt)])


class Product:
    """One product subsection of an MF6 section."""

    def __init__(self):
        self.zap = 0
        self.awp = 0.0
        self.lip = 0
        self.law = 0
        self.yld = None
        self.lang = None
        self.lep = None
        self.energies = []     # incident energies (eV) of the distributions
        self.dists = []        # law dependent per-energy data
        self.apsx = None
        self.npsx = None


class MF6Section:
    """Parsed MF6 section: LCT and the list of products."""

    def __init__(self, lines):
        r = Records(lines)
        c = r.cont()
        self.za, self.awr, self.jp, self.lct, nk = c[0], c[1], c[2], c[3], c[4]
        self.products = []
        for _ in range(nk):
            p = Product()
            c, p.yld = r.tab1()
            p.zap, p.awp, p.lip, p.law = int(round(c[0])), c[1], c[2], c[3]
            if p.zap == 0:
                p.awp = 0.0     # photons: AWP field is not a mass (some files store E_gamma)
            if p.law == 1:
                c2, _, _ = r.tab2()
                p.lang, p.lep, ne = c2[2], c2[3], c2[5]
                for _ in range(ne):
                    c3, v = r.list_record()
                    e, nd, na, nep = c3[1], c3[2], c3[3], c3[5]
                    w = na + 2
                    rows = [v[j * w:(j + 1) * w] for j in range(nep)]
                    p.energies.append(e)
                    p.dists.append({"nd": nd, "na": na, "rows": rows})
            elif p.law == 2:
                c2, _, _ = r.tab2()
                for _ in range(c2[5]):
                    c3, v = r.list_record()
                    p.energies.append(c3[1])
                    p.dists.append({"lang": c3[2], "nl": c3[5], "v": v})
            elif p.law == 5:
                c2, _, _ = r.tab2()
                for _ in range(c2[5]):
                    c3, v = r.list_record()
                    p.energies.append(c3[1])
                    p.dists.append({"lidp": c3[2], "ltp": c3[3], "nl": c3[5], "v": v})
            elif p.law == 6:
                c2 = r.cont()
                p.apsx, p.npsx = c2[0], c2[5]
            elif p.law == 7:
                c2, _, _ = r.tab2()
                for _ in range(c2[5]):
                    c3, _, _ = r.tab2()
                    mus = []
                    for _ in range(c3[5]):
                        c4, t = r.tab1()
                        mus.append((c4[1], t))
                    p.energies.append(c3[1])
                    p.dists.append({"mu": mus})
            elif p.law in (0, 3, 4):
                pass
            else:
                raise ValueError("MF6 LAW=%d not supported" % p.law)
            self.products.append(p)


# ---------------------------------------------------------------------------
# Atomic masses: taken from the ENDF/B decay sublibrary (AWR in MF1/MT451 of
# each dec-ZZZ_Sy_AAA.endf, ground states only).  Mass excess in MeV.
# ---------------------------------------------------------------------------
DECAY_SUB = "decay-version.VIII.1"


def build_mass_table(src):
    """Return {za: {"awr":..., "delta_MeV":..., "file":...}} from the decay sublibrary."""
    listing = src.listing(DECAY_SUB)
    table = {}
    names = sorted(f for f, size in listing.items() if size is not None and "m" not in f.split("_")[-1])
    if isinstance(src, GitSource):
        # stream all blobs through one `git cat-file --batch` process
        req = "".join("%s:%s\n" % (src.ref, src.path_of(DECAY_SUB, f)) for f in names).encode()
        r = subprocess.run(["git", "--git-dir=" + src.git_dir, "cat-file", "--batch"],
                           input=req, stdout=subprocess.PIPE, check=True)
        data = r.stdout
        pos = 0
        texts = []
        for f in names:
            nl = data.index(b"\n", pos)
            hdr = data[pos:nl].split()
            if len(hdr) < 3 or hdr[1] == b"missing":
                pos = nl + 1
                texts.append((f, None))
                continue
            size = int(hdr[2])
            texts.append((f, data[nl + 1:nl + 1 + size].decode(errors="replace")))
            pos = nl + 1 + size + 1
    else:
        texts = [(f, src.read(DECAY_SUB, f)) for f in names]
    for f, txt in texts:
        if not txt:
            continue
        for raw in txt.splitlines()[:3]:
            line = raw.ljust(80)
            if line[70:75] == " 1451":
                za = int(round(endf_float(line[0:11])))
                awr = endf_float(line[11:22])
                a = za % 1000
                m_u = awr * NEUTRON_AMU
                table[za] = {"awr": awr, "delta_MeV": (m_u - a) * AMU_MEV, "file": f}
                break
    return table


class Masses:
    """Mass excesses (MeV) by ZA; falls back to an AWR given in the evaluation."""

    def __init__(self, table):
        self.table = {int(k): v for k, v in table.items()}
        self.table[1] = {"awr": 1.0, "delta_MeV": (NEUTRON_AMU - 1.0) * AMU_MEV, "file": "CODATA"}
        self.fallbacks = set()

    def delta(self, za, awr_fallback=None):
        if za == 0:
            return 0.0
        e = self.table.get(za)
        if e is not None:
            return e["delta_MeV"]
        self.fallbacks.add(za)
        if awr_fallback:
            return (awr_fallback * NEUTRON_AMU - za % 1000) * AMU_MEV
        return 0.0


# ---------------------------------------------------------------------------
# Outgoing-energy grid of the intermediate tables (lab frame; a design choice):
# bin 0 = [0, 0.1 MeV) underflow, then 24 equal-log bins per decade from 0.1 MeV
# up to 0.1*10**(77/24) = 160.3 MeV.  Emission above the last edge is counted in
# the last bin.  emit-cpp rebins to 10 per decade (CPP_PER_DECADE).
# ---------------------------------------------------------------------------
EOUT_MIN = 0.1
PER_DECADE = 24
N_LOG_EDGES = 78
EOUT_EDGES = [0.0] + [EOUT_MIN * 10 ** (k / PER_DECADE) for k in range(N_LOG_EDGES)]
NBIN = len(EOUT_EDGES) - 1


def bin_of(e):
    if e < EOUT_MIN:
        return 0
    k = int(math.floor(PER_DECADE * math.log10(e / EOUT_MIN))) + 1
    return min(max(k, 1), NBIN - 1)


# ---------------------------------------------------------------------------
# Angular distributions (in the frame of the data), each with cdf(mu), mean
# ---------------------------------------------------------------------------
class AngIso:
    mean = 0.0

    def cdf(self, mu):
        return 0.5 * (mu + 1.0)


ISO = AngIso()


class AngKM:
    """Kalbach-Mann: p(mu) = a/(2 sinh a) [cosh(a mu) + r sinh(a mu)]."""

    def __init__(self, a, r):
        self.a = min(max(a, 1e-6), 300.0)     # numerical guard (sinh overflow), not physics
        self.r = r
        a = self.a
        # <mu> = r (coth a - 1/a); series r a/3 for small a (numerical choice)
        self.mean = r * (1.0 / math.tanh(a) - 1.0 / a) if a > 1e-3 else r * a / 3.0

    def cdf(self, mu):
        a, r = self.a, self.r
        return (math.sinh(a * mu) + math.sinh(a) + r * (math.cosh(a * mu) - math.cosh(a))) / (2.0 * math.sinh(a))


def legendre_all(n, x):
    """P_0..P_n at x."""
    p = [1.0, x]
    for l in range(2, n + 1):
        p.append(((2 * l - 1) * x * p[l - 1] - (l - 1) * p[l - 2]) / l)
    return p[:n + 1]


class AngLegendre:
    """p(mu) = sum_l (2l+1)/2 c_l P_l(mu), c_0 = 1."""

    def __init__(self, coeffs):          # coeffs = [c_1, c_2, ...]
        self.c = list(coeffs)
        self.mean = self.c[0] if self.c else 0.0

    def cdf(self, mu):
        n = len(self.c)
        p = legendre_all(n + 1, mu)
        s = 0.5 * (mu + 1.0)
        for l in range(1, n + 1):
            s += 0.5 * self.c[l - 1] * (p[l + 1] - p[l - 1])
        return s


class AngTab:
    """Tabulated p(mu), linear-linear (LANG=12; LANG=14 treated as lin-lin)."""

    def __init__(self, mus, ps):
        self.mu, self.p = list(mus), list(ps)
        tot = 0.0
        self.cum = [0.0]
        m1 = 0.0
        for i in range(len(self.mu) - 1):
            w = self.mu[i + 1] - self.mu[i]
            tot += 0.5 * (self.p[i] + self.p[i + 1]) * w
            self.cum.append(tot)
            m1 += w * (self.p[i] * (2 * self.mu[i] + self.mu[i + 1]) + self.p[i + 1] * (self.mu[i] + 2 * self.mu[i + 1])) / 6.0
        self.tot = tot if tot > 0 else 1.0
        self.mean = m1 / self.tot

    def cdf(self, mu):
        if mu <= self.mu[0]:
            return 0.0
        if mu >= self.mu[-1]:
            return 1.0
        i = bisect.bisect_right(self.mu, mu) - 1
        x0, x1, p0, p1 = self.mu[i], self.mu[i + 1], self.p[i], self.p[i + 1]
        t = mu - x0
        slope = (p1 - p0) / (x1 - x0) if x1 > x0 else 0.0
        return (self.cum[i] + p0 * t + 0.5 * slope * t * t) / self.tot


class AngMirror:
    """Distribution of -mu (recoil partner of a two-body reaction)."""

    def __init__(self, ang):
        self.ang = ang
        self.mean = -ang.mean

    def cdf(self, mu):
        return 1.0 - self.ang.cdf(-mu)


# ---------------------------------------------------------------------------
# Kalbach (1988) systematics for the Kalbach-Mann slope a(E, E'):
# C. Kalbach, Phys. Rev. C 37, 2350 (1988), Eqs. 4 and 10; ENDF-6 Formats Manual
# (ENDF-102) section 6.2.3.2.  The paper and the manual were not read; every
# constant below was read in two public transcriptions that agree:
#   [T] TALYS source/kalbach.f, repository abby6677/Talys, commit
#       c82b94289e1477d35fe0b9660d6001cba1fe3772: Et1=130, Et3=41, C1=0.04,
#       C2=1.8e-6, C3=6.7e-7, Cmin (M_a) and Cmout (m_b) for n,p,d,t,3He,alpha;
#   [O] OpenMC openmc/data/kalbach_mann.py, repository openmc-dev/openmc, commit
#       3f06a42abb89a9b09cb3f2e86680a31bae90cc08: _separation_energy() (mass
#       formula 15.68, 28.07, 18.56, 33.22, 0.717, 1.211 and the breakup
#       energies I_a, "ENDF-6 Formats Manual, Appendix H, Table 3") and
#       kalbach_slope() (same a(e_a, e_b) as [T]).
# Notes: [O] approximates the channel-energy masses by mass numbers and says the
# manual uses AWR; this script uses the AWR values of the file, as the manual.
# ---------------------------------------------------------------------------
KALBACH_I = {1: 0.0, 1001: 0.0, 1002: 2.224566, 1003: 8.481798, 2003: 7.718043,
             2004: 28.29566}                                         # MeV, [O]
KALBACH_MA = {1: 1.0, 1001: 1.0, 1002: 1.0, 1003: 1.0, 2003: 1.0, 2004: 0.0}  # [T] Cmin
KALBACH_MB = {1: 0.5, 1001: 1.0, 1002: 1.0, 1003: 1.0, 2003: 1.0, 2004: 2.0}  # [T] Cmout, [O]
KALBACH_ET1, KALBACH_ET3 = 130.0, 41.0                               # MeV, [T], [O]
KALBACH_C1, KALBACH_C2, KALBACH_C3 = 0.04, 1.8e-6, 6.7e-7            # MeV^-1, ^-3, ^-4, [T], [O]


def kalbach_sep(za_light, za_small, za_comp):
    """Separation energy (MeV) of light particle from compound za_comp -> za_small.

    Kalbach 1988 Eq. 4 (ENDF-102 6.2.3.2); coefficients (MeV) as read in [O]
    _separation_energy()."""
    ac, zc = za_comp % 1000, za_comp // 1000
    aa, za = za_small % 1000, za_small // 1000
    nc, na = ac - zc, aa - za
    return (15.68 * (ac - aa)
            - 28.07 * ((nc - zc) ** 2 / ac - (na - za) ** 2 / aa)
            - 18.56 * (ac ** (2.0 / 3.0) - aa ** (2.0 / 3.0))
            + 33.22 * ((nc - zc) ** 2 / ac ** (4.0 / 3.0) - (na - za) ** 2 / aa ** (4.0 / 3.0))
            - 0.717 * (zc * zc / ac ** (1.0 / 3.0) - za * za / aa ** (1.0 / 3.0))
            + 1.211 * (zc * zc / ac - za * za / aa)
            - KALBACH_I.get(za_light, 0.0))


def kalbach_a(e_in, e_out, za_proj, za_targ, za_prod, awi, awr, awp):
    """Kalbach slope a.  e_in: lab incident energy, e_out: CM emission energy (MeV)."""
    za_comp = za_targ + za_proj
    za_res = za_comp - za_prod
    if za_res % 1000 <= 0 or za_res // 1000 < 0 or za_targ % 1000 <= 0:
        return 1e-6                          # no residual: isotropic (numerical guard)
    sa = kalbach_sep(za_proj, za_targ, za_comp)
    sb = kalbach_sep(za_prod, za_res, za_comp)
    ea = e_in * awr / (awr + awi) + sa
    eb = e_out * (awr + awi) / max(awr + awi - awp, 1e-6) + sb
    if ea <= 0:
        return 1e-6
    r1 = min(ea, KALBACH_ET1)
    r3 = min(ea, KALBACH_ET3)
    x1 = r1 * eb / ea
    x3 = r3 * eb / ea
    ma = KALBACH_MA.get(za_proj, 1.0)
    mb = KALBACH_MB.get(za_prod, 1.0)
    return KALBACH_C1 * x1 + KALBACH_C2 * x1 ** 3 + KALBACH_C3 * ma * mb * x3 ** 4


# ---------------------------------------------------------------------------
# Accumulation of CM points into lab bins
# ---------------------------------------------------------------------------
class Shape:
    """Normalised lab-frame description of one product at one incident energy.

    spec[i]: probability in output bin i;  fwd[i]: part of it with mu_lab > 0
    emean:   mean lab kinetic energy (MeV);  norm: integral of the source pdf."""
    __slots__ = ("spec", "fwd", "emean", "norm", "binned")

    def __init__(self, binned=True):
        self.binned = binned
        self.spec = [0.0] * NBIN if binned else None
        self.fwd = [0.0] * NBIN if binned else None
        self.emean = 0.0
        self.norm = 0.0

    def add_point(self, e_cm, w, ang, ec):
        """Deposit weight w emitted with CM energy e_cm (MeV), angular law ang;
        ec = CM-motion energy of the product (MeV); ec = 0 means data in lab."""
        if w == 0.0:
            return
        self.norm += w
        if ec <= 0.0:
            self.emean += w * e_cm
            if self.binned:
                b = bin_of(e_cm)
                self.spec[b] += w
                self.fwd[b] += w * (1.0 - ang.cdf(0.0))
            return
        e_cm = max(e_cm, 0.0)
        se, sc = math.sqrt(e_cm), math.sqrt(ec)
        self.emean += w * (e_cm + ec + 2.0 * se * sc * ang.mean)
        if not self.binned:
            return
        if se == 0.0:
            b = bin_of(ec)
            self.spec[b] += w
            self.fwd[b] += w
            return
        k = 2.0 * se * sc
        base = e_cm + ec
        elo, ehi = (se - sc) ** 2, (se + sc) ** 2
        mu0 = -sc / se                                 # mu_lab = 0 here
        cuts = [-1.0, 1.0]
        if -1.0 < mu0 < 1.0:
            cuts.append(mu0)
        blo, bhi = bin_of(elo), bin_of(ehi)
        for b in range(blo + 1, bhi + 1):
            cuts.append((EOUT_EDGES[b] - base) / k)
        cuts = sorted(c for c in cuts if -1.0 <= c <= 1.0)
        prev_mu, prev_c = cuts[0], ang.cdf(cuts[0])
        for mu in cuts[1:]:
            if mu <= prev_mu:
                continue
            c = ang.cdf(mu)
            p = w * (c - prev_c)
            mm = 0.5 * (mu + prev_mu)
            b = bin_of(base + k * mm)
            self.spec[b] += p
            if mm > mu0:
                self.fwd[b] += p
            prev_mu, prev_c = mu, c

    def scaled(self, f):
        s = Shape(self.binned)
        if self.binned:
            s.spec = [x * f for x in self.spec]
            s.fwd = [x * f for x in self.fwd]
        s.emean = self.emean * f
        s.norm = self.norm * f
        return s

    def normalise(self):
        if self.norm > 0:
            f = 1.0 / self.norm
            if self.binned:
                self.spec = [x * f for x in self.spec]
                self.fwd = [x * f for x in self.fwd]
            self.emean *= f
        return self


def blend(s1, s2, t):
    """(1-t)*s1 + t*s2 for normalised shapes."""
    if t <= 0.0:
        return s1
    if t >= 1.0:
        return s2
    s = Shape(s1.binned)
    if s1.binned:
        s.spec = [a + t * (b - a) for a, b in zip(s1.spec, s2.spec)]
        s.fwd = [a + t * (b - a) for a, b in zip(s1.fwd, s2.fwd)]
    s.emean = s1.emean + t * (s2.emean - s1.emean)
    s.norm = s1.norm + t * (s2.norm - s1.norm)
    return s


def sub_count(e1, e2):
    """Number of pieces so that each piece is < ~1/3 of the local output bin.

    Numerical choice (1/3 of a bin, at most 40 pieces), checked by the
    spectrum-integral column of CHECKS.txt."""
    em = max(0.5 * (e1 + e2), EOUT_MIN)
    dw = em * (10 ** (1.0 / PER_DECADE) - 1.0)
    return max(1, min(40, int(math.ceil((e2 - e1) / (dw / 3.0)))))


# ---------------------------------------------------------------------------
# Product models: give a normalised lab Shape for one product of one MT
# ---------------------------------------------------------------------------
def frame_is_cm(lct, zap):
    """ENDF LCT: 1 lab; 2 CM; 3 CM for A<=4 products, lab for heavier ones (ENDF-102 MF6, from memory)."""
    if lct == 1:
        return False
    if lct == 2:
        return True
    return zap <= 2004          # LCT=3 (and 4, treated alike)


class ProductModel:
    def __init__(self, iso, mt, sect, prod):
        self.iso, self.mt, self.sect, self.p = iso, mt, sect, prod
        self.zap = prod.zap
        self.binned = prod.zap in LIGHT_ZA
        self.cm = frame_is_cm(sect.lct, prod.zap)
        self.partner = None
        self.synthetic = False
        self._cache = {}
        # Leading "dummy" LAW=1 distributions (all emission below 1 keV, <= 2
        # points) mark energies below the product's threshold; the LA150-type
        # files carry non-zero yields there (often the first real value held
        # constant down to the lowest energy).  Yields are gated to zero there.
        # The 1 keV / 2-point test is a heuristic chosen by inspecting those files.
        self.first_real = 0
        if prod.law == 1:
            for k, d in enumerate(prod.dists):
                rows = d["rows"][d["nd"]:]
                if d["nd"] == 0 and len(rows) <= 2 and (not rows or rows[-1][0] <= 1000.0):
                    self.first_real = k + 1
                else:
                    break
            if self.first_real >= len(prod.dists):
                self.first_real = len(prod.dists)   # all dummy: product never emitted
        self.max_norm_dev = 0.0

    # ---- kinematic helpers -------------------------------------------------
    def ec(self, e_in, awp=None):
        """Energy of the CM motion carried by a product of mass AWP (MeV):
        E_c = E AWI AWP / (AWR + AWI)^2 (non-relativistic kinematics)."""
        iso = self.iso
        m = self.p.awp if awp is None else awp
        return e_in * iso.awi * m / (iso.awi + iso.awr) ** 2

    def e_avail(self, e_in):
        iso = self.iso
        return e_in * iso.awr / (iso.awr + iso.awi) + iso.qi.get(self.mt, 0.0)

    # ---- law 1 -------------------------------------------------------------
    def _law1_shape(self, k):
        p, iso = self.p, self.iso
        d = p.dists[k]
        e_in = p.energies[k] / 1e6
        ec = self.ec(e_in) if self.cm and p.awp > 0 else 0.0
        rows, nd, na = d["rows"], d["nd"], d["na"]
        s = Shape(self.binned)
        lang = p.lang

        def ang_of(e_out, b):
            # b = [b0, b1, ...] (values at the point); e_out in MeV (CM)
            if lang == 2:
                r = b[1] if len(b) > 1 else 0.0
                if na >= 2:
                    a = b[2]
                else:
                    a = kalbach_a(e_in, e_out, iso.za_proj, iso.za, self.zap, iso.awi, iso.awr, p.awp)
                return AngKM(a, r)
            if lang == 1:
                if na == 0 or b[0] <= 0:
                    return ISO
                return AngLegendre([x / b[0] for x in b[1:]])
            raise ValueError("LAW=1 LANG=%d not supported" % lang)

        # discrete lines
        for j in range(min(nd, len(rows))):
            row = rows[j]
            s.add_point(row[0] / 1e6, row[1], ang_of(row[0] / 1e6, row[1:]), ec)
        cont = rows[nd:]
        for j in range(len(cont) - 1):
            e1, e2 = cont[j][0] / 1e6, cont[j + 1][0] / 1e6
            if e2 <= e1:
                continue
            b1, b2 = cont[j][1:], cont[j + 1][1:]
            width = e2 - e1
            if p.lep == 1:                       # histogram
                if b1[0] == 0.0:
                    continue
                if not self.binned:
                    s.add_point(0.5 * (e1 + e2), b1[0] * width * 1e6, ang_of(0.5 * (e1 + e2), b1), ec)
                    continue
                n = sub_count(e1, e2)
                h = width / n
                w = b1[0] * h * 1e6
                for i in range(n):
                    em = e1 + (i + 0.5) * h
                    s.add_point(em, w, ang_of(em, b1), ec)
            else:                                # LEP=2 linear (others: treated linear)
                f1, f2 = b1[0], b2[0]
                if f1 == 0.0 and f2 == 0.0:
                    continue
                if not self.binned:
                    tot = 0.5 * (f1 + f2) * width * 1e6
                    cen = (f1 * (2 * e1 + e2) + f2 * (e1 + 2 * e2)) / (3.0 * (f1 + f2))
                    t = (cen - e1) / width
                    bm = [x + t * (y - x) for x, y in zip(b1, b2)]
                    s.add_point(cen, tot, ang_of(cen, bm), ec)
                    continue
                n = sub_count(e1, e2)
                h = width / n
                for i in range(n):
                    t = (i + 0.5) / n
                    bm = [x + t * (y - x) for x, y in zip(b1, b2)]
                    em = e1 + (i + 0.5) * h
                    s.add_point(em, bm[0] * h * 1e6, ang_of(em, bm), ec)
        self.max_norm_dev = max(self.max_norm_dev, abs(s.norm - 1.0))
        return s.normalise()

    # ---- law 2/3/4: two-body ----------------------------------------------
    def _two_body_ang(self, e_ev, model):
        """Angular law of a LAW=2/3 product at incident energy e_ev (CM)."""
        p = model.p
        if p.law == 3 or not p.energies:
            return ISO
        es = p.energies
        if e_ev <= es[0]:
            k, t = 0, 0.0
        elif e_ev >= es[-1]:
            k, t = len(es) - 1, 0.0
        else:
            k = bisect.bisect_right(es, e_ev) - 1
            t = (e_ev - es[k]) / (es[k + 1] - es[k])
        d1 = p.dists[k]
        if d1["lang"] == 0:
            c1 = list(d1["v"])
            if t > 0:
                c2 = list(p.dists[k + 1]["v"])
                n = max(len(c1), len(c2))
                c1 += [0.0] * (n - len(c1))
                c2 += [0.0] * (n - len(c2))
                c1 = [x + t * (y - x) for x, y in zip(c1, c2)]
            return AngLegendre(c1)
        v = d1["v"] if t < 0.5 or t == 0 else p.dists[k + 1]["v"]
        return AngTab(v[0::2], v[1::2])

    def _two_body_shape(self, e_in):
        iso, p = self.iso, self.p
        ea = self.e_avail(e_in)
        if ea <= 0:
            return None
        s = Shape(self.binned)
        if p.law in (2, 3):
            mb = p.awp
            mB = self.partner.p.awp if self.partner else iso.awr + iso.awi - mb
            e_b = ea * mB / (mb + mB)
            ang = self._two_body_ang(e_in * 1e6, self)
            s.add_point(e_b, 1.0, ang, self.ec(e_in) if mb > 0 else 0.0)
        else:                                    # LAW 4: recoil partner
            if self.partner is None:
                return None
            mb = self.partner.p.awp
            mB = p.awp
            e_B = ea * mb / (mb + mB)
            ang = AngMirror(self._two_body_ang(e_in * 1e6, self.partner))
            s.add_point(e_B, 1.0, ang, self.ec(e_in))
        return s.normalise()

    # ---- law 6: N-body phase space -----------------------------------------
    def _phase_space_shape(self, e_in):
        p = self.p
        ea = self.e_avail(e_in)
        if ea <= 0 or not p.apsx:
            return None
        emax = (p.apsx - p.awp) / p.apsx * ea
        # LAW=6 (ENDF-102 6.2.7, from memory): P(E') ~ sqrt(E') (Emax - E')^(3n/2 - 4),
        # Emax = (APSX - AWP)/APSX * (E AWR/(AWR+AWI) + QI)
        expo = 1.5 * p.npsx - 4.0
        s = Shape(self.binned)
        n = 80                      # numerical choice: midpoint rule, 80 points
        h = emax / n
        ec = self.ec(e_in)          # LAW=6 is always given in the CM system
        for i in range(n):
            e = (i + 0.5) * h
            s.add_point(e, math.sqrt(e) * (emax - e) ** expo * h, ISO, ec)
        return s.normalise()

    # ---- public --------------------------------------------------------------
    def yield_at(self, e_in):
        """Multiplicity at e_in (MeV), gated to zero below the first real LAW=1 distribution."""
        y = self.p.yld(e_in * 1e6)
        if y == 0.0 or self.p.law != 1 or self.first_real == 0:
            return y
        es = self.p.energies
        if self.first_real >= len(es):
            return 0.0
        e0, e1 = es[self.first_real - 1] / 1e6, es[self.first_real] / 1e6
        if e_in <= e0:
            return 0.0
        if e_in >= e1:
            return y
        return y * (e_in - e0) / (e1 - e0)

    def has_energy_info(self):
        if self.p.law in (1, 2, 3, 6):
            return True
        return self.p.law == 4 and self.partner is not None

    def shape_at(self, e_in):
        """Normalised Shape at incident energy e_in (MeV), or None."""
        p = self.p
        if p.law == 1:
            es = p.energies
            ev = e_in * 1e6
            if not es or ev < es[0] * (1 - 1e-9) or ev > es[-1] * (1 + 1e-9):
                return None
            k = bisect.bisect_right(es, ev) - 1
            k = min(max(k, 0), len(es) - 1)
            if k < self.first_real:                  # below threshold: first real shape
                if self.first_real >= len(es):
                    return None
                k = self.first_real
                ev = es[k]
            if k not in self._cache:
                self._cache[k] = self._law1_shape(k)
            if k == len(es) - 1 or ev <= es[k]:
                return self._cache[k]
            if k + 1 not in self._cache:
                self._cache[k + 1] = self._law1_shape(k + 1)
            t = (ev - es[k]) / (es[k + 1] - es[k])
            return blend(self._cache[k], self._cache[k + 1], t)
        key = round(e_in, 9)
        if key in self._cache:
            return self._cache[key]
        if p.law in (2, 3, 4):
            s = self._two_body_shape(e_in)
        elif p.law == 6:
            s = self._phase_space_shape(e_in)
        else:
            s = None
        self._cache[key] = s
        return s


# ---------------------------------------------------------------------------
# One target isotope + projectile
# ---------------------------------------------------------------------------
def mf4_as_law2(lines):
    """Read an MF4 section into (LCT, energies[eV], dists) in the LAW=2 layout.

    LTT=1 Legendre -> {"lang": 0, "v": [a_1..a_NL]}; LTT=2 tabulated ->
    {"lang": 12, "v": [mu1, f1, mu2, f2, ...]}; LTT=3 both ranges; LI=1
    isotropic -> no distributions (LAW=3 equivalent)."""
    r = Records(lines)
    h = r.cont()
    ltt = h[3]
    c = r.cont()
    li, lct = c[2], c[3]
    energies, dists = [], []
    if li == 1 or ltt == 0:
        return lct, energies, dists
    if ltt in (1, 3):
        c2, _, _ = r.tab2()
        for _ in range(c2[5]):
            c3, v = r.list_record()
            energies.append(c3[1])
            dists.append({"lang": 0, "v": v})
    if ltt in (2, 3):
        c2, _, _ = r.tab2()
        for _ in range(c2[5]):
            c3, t = r.tab1()
            energies.append(c3[1])
            v = []
            for x, y in zip(t.x, t.y):
                v += [x, y]
            dists.append({"lang": 12, "v": v})
    return lct, energies, dists


# MT numbers (ENDF-6 Formats Manual, Appendix B), as read in REACTION_NAME of
# openmc/data/reaction.py and SUM_RULES of openmc/data/endf.py, repository
# openmc-dev/openmc, commit 3f06a42abb89a9b09cb3f2e86680a31bae90cc08:
# 50-90 (z,n_i), 91 (z,n) continuum; 600-648 (z,p_i), 649 continuum; 650-698 d,
# 700-748 t, 750-798 3He, 800-848 alpha levels (649, 699, 749, 799, 849 continua);
# 4 = sum 50-91, 103-107 = sums of 600-649 ... 800-849; 1 total, 2 elastic,
# 3 non-elastic, 27 absorption, 101 disappearance (sums); 201-599 derived
# quantities (gas production 203-207, heating 301, damage 444, 451-458);
# 875-891 (z,2n_i) levels of MT 16.  MT 10 (continuum total) and 151
# (resonance parameters) are from memory of ENDF-102.
def discrete_ejectile(mt):
    """ZA of the ejectile of a discrete two-body MT (level reactions), else None."""
    for lo, hi, za in ((50, 90, 1), (600, 648, 1001), (650, 698, 1002), (700, 748, 1003),
                       (750, 798, 2003), (800, 848, 2004)):
        if lo <= mt <= hi:
            return za
    return None


class _Sect:
    def __init__(self, lct):
        self.lct = lct


class LevelGamma(ProductModel):
    """De-excitation photons of a discrete level (energy QM-QI), used only when
    the file gives the level through MF3+MF4 without photon data in MF6."""

    def __init__(self, iso, mt, ex, partner):
        p = Product()
        p.zap, p.awp, p.law, p.yld = 0, 0.0, 0, partner.p.yld
        ProductModel.__init__(self, iso, mt, _Sect(1), p)
        self.ex = ex
        self.partner = partner
        self.synthetic = True

    def has_energy_info(self):
        return True

    def shape_at(self, e_in):
        s = Shape(False)
        s.add_point(self.ex, 1.0, ISO, 0.0)
        return s.normalise()


NON_REACTION = {1, 2, 3, 10, 27, 101, 151}     # sums / not reactions (see discrete_ejectile)


def reaction_mts(mf3_mts):
    """Non-elastic, non-redundant MTs (ENDF-6 summation rules)."""
    s = set(mf3_mts)
    out = []
    for mt in sorted(s):
        if mt in NON_REACTION or mt >= 201 and mt < 600 or mt >= 850:
            continue
        if mt == 4 and any(50 <= x <= 91 for x in s):
            continue
        red = {103: (600, 649), 104: (650, 699), 105: (700, 749), 106: (750, 799), 107: (800, 849)}
        if mt in red and any(red[mt][0] <= x <= red[mt][1] for x in s):
            continue
        out.append(mt)
    return out


class Isotope:
    def __init__(self, mat, proj, masses, src_desc, e_lo=0.0, e_hi=150.0):
        self.mat = mat
        self.proj = proj
        self.za_proj = PROJECTILES[proj]["za"]
        self.za, self.awr, self.awi = mat.za, mat.awr, mat.awi
        self.masses = masses
        self.src_desc = src_desc
        self.e_lo, self.e_hi = e_lo, e_hi
        self.emax = mat.emax / 1e6
        self.rx = reaction_mts(mat.mts(3))
        self.xs, self.qm, self.qi = {}, {}, {}
        self.lr = {}
        for mt in self.rx:
            qm, qi, tab = mat.mf3(mt)
            self.xs[mt] = tab
            self.qm[mt], self.qi[mt] = qm / 1e6, qi / 1e6
            r = Records(mat.sections[(3, mt)])
            r.cont()
            self.lr[mt] = r.cont()[3]
        self.from_mf4 = []
        self.models = {}
        self.lct = {}
        self.unsupported = []
        self.synthetic = []
        for mt in self.rx:
            if (6, mt) in mat.sections:
                sect = mat.mf6(mt)
                ms = [ProductModel(self, mt, sect, p) for p in sect.products]
            elif (4, mt) in mat.sections and discrete_ejectile(mt) is not None:
                # discrete two-body level given by MF3 + MF4 only
                lct4, es, ds = mf4_as_law2(mat.sections[(4, mt)])
                p = Product()
                p.zap = discrete_ejectile(mt)
                ent = masses.table.get(p.zap)
                p.awp = 1.0 if p.zap == 1 else (ent["awr"] if ent else p.zap % 1000)
                p.law = 2 if ds else 3
                p.energies, p.dists = es, ds
                tab = self.xs[mt]
                p.yld = Tab1([tab.x[0], tab.x[-1]], [1.0, 1.0], [2], [2])
                sect = _Sect(2)
                ms = [ProductModel(self, mt, sect, p)]
                self.from_mf4.append(mt)
                if lct4 == 1:
                    self.unsupported.append((mt, p.zap, -4))   # lab-frame MF4: treated as CM
            else:
                continue
            self.lct[mt] = sect.lct
            two = [m for m in ms if m.p.law in (2, 3)]
            massive = [m for m in ms if m.zap != 0]
            if len(two) == 1 and massive == two and two[0].p.awp > 0:
                # two-body reaction whose residual is not listed: add it
                # (kinematics of LAW=4, ground-state mass from the mass table)
                b = two[0]
                zar = self.za + self.za_proj - b.zap
                if zar % 1000 > 0:
                    rp = Product()
                    rp.zap, rp.law, rp.yld = zar, 4, b.p.yld
                    ent = masses.table.get(zar)
                    rp.awp = ent["awr"] if ent else self.awr + self.awi - b.p.awp
                    rm = ProductModel(self, mt, sect, rp)
                    rm.synthetic = True
                    rm.partner = b
                    ms.append(rm)
                    self.synthetic.append((mt, zar))
            if mt in self.from_mf4 and self.lr.get(mt, 0) == 0 and self.qm[mt] - self.qi[mt] > 0:
                ms.append(LevelGamma(self, mt, self.qm[mt] - self.qi[mt], ms[0]))
            for m in ms:
                if isinstance(m, LevelGamma):
                    continue
                if m.p.law == 4 and two:
                    m.partner = two[0]
                if m.p.law in (2, 3):
                    others = [o for o in ms if o is not m and o.p.awp > 0 and o.zap != 0]
                    if others:
                        m.partner = others[0]
                if not m.has_energy_info():
                    self.unsupported.append((mt, m.zap, m.p.law))
            self.models[mt] = ms
        self.top = min(self.emax, e_hi)
        self.delta_t = masses.delta(self.za, self.awr)
        self.delta_p = masses.delta(self.za_proj)

    def grid(self):
        """Incident energies (MeV) at which the file gives distributions."""
        g = set()
        for mt, ms in self.models.items():
            for m in ms:
                if m.p.law == 1 or m.p.law == 2:
                    g.update(e / 1e6 for e in m.p.energies)
                elif m.p.law in (3, 6):
                    g.update(x / 1e6 for x in self.xs[mt].x)
        if self.emax >= self.e_hi and any(e > self.e_hi for e in g):
            g.add(self.e_hi)
        return sorted(e for e in g if self.e_lo < e <= self.top * (1 + 1e-9))

    def evaluate(self, e):
        """All tabulated quantities at incident energy e (MeV); cross sections in mb."""
        res = {"sigma": 0.0, "light": {}, "e_recoil": 0.0, "e_gamma": 0.0, "e_other": 0.0,
               "q_sum": 0.0, "q_mf3_sum": 0.0, "a_bal": 0.0, "z_bal": 0.0, "unresolved": 0.0,
               "unknown_energy": 0.0, "per_mt": []}
        za_t, za_p = self.za, self.za_proj
        a_in = za_t % 1000 + za_p % 1000
        z_in = za_t // 1000 + za_p // 1000
        for mt in self.rx:
            sig = self.xs[mt](e * 1e6) * 1000.0           # b -> mb
            if sig <= 0.0:
                continue
            res["sigma"] += sig
            if mt not in self.models:
                res["unresolved"] += sig
                res["q_sum"] += sig * self.qm[mt]
                res["q_mf3_sum"] += sig * self.qm[mt]
                res["per_mt"].append({"mt": mt, "sigma": sig, "q": self.qm[mt], "eout": None})
                continue
            q_mass = self.delta_t + self.delta_p
            a_out = z_out = 0.0
            eout = 0.0
            complete = True
            for m in self.models[mt]:
                y = m.partner.yield_at(e) if m.synthetic else m.yield_at(e)
                if y == 0.0:
                    continue
                zap = m.zap
                if zap != 0:
                    q_mass -= y * self.masses.delta(zap, m.p.awp)
                    a_out += y * (zap % 1000)
                    z_out += y * (zap // 1000)
                s = m.shape_at(e)
                if s is None:
                    if m.p.law not in (5,):
                        res["unknown_energy"] += sig * y
                        complete = False
                    continue
                eout += y * s.emean
                if zap in LIGHT_ZA:
                    lab = LIGHT_ZA[zap]
                    L = res["light"].setdefault(lab, {"sigma": 0.0, "esum": 0.0,
                                                      "spec": [0.0] * NBIN, "fwd": [0.0] * NBIN})
                    f = sig * y
                    L["sigma"] += f
                    L["esum"] += f * s.emean
                    sp, fw = L["spec"], L["fwd"]
                    for i in range(NBIN):
                        if s.spec[i]:
                            sp[i] += f * s.spec[i]
                            fw[i] += f * s.fwd[i]
                elif zap == 0:
                    res["e_gamma"] += sig * y * s.emean
                elif zap > 2004:
                    res["e_recoil"] += sig * y * s.emean
                else:
                    res["e_other"] += sig * y * s.emean
            res["a_bal"] += sig * (a_out - a_in)
            res["z_bal"] += sig * (z_out - z_in)
            res["q_sum"] += sig * q_mass
            res["q_mf3_sum"] += sig * self.qm[mt]
            res["per_mt"].append({"mt": mt, "sigma": sig, "q": q_mass, "q_mf3": self.qm[mt],
                                  "eout": eout, "complete": complete,
                                  "a_out": a_out, "z_out": z_out})
        return res


# ---------------------------------------------------------------------------
# Element assembly (abundance weighting) and output
# ---------------------------------------------------------------------------
SCRIPT_VERSION = "1.1"   # 1.1: sourced abundances and Kalbach constants; emit-cpp


def file_name(proj, z, a, sym):
    return "%s-%03d_%s_%03d.endf" % (PROJECTILES[proj]["prefix"], z, sym, a)


def thin_grid(energies, rel=0.04):
    """Drop incident energies closer than rel (numerical choice: 4 %) to the previous one."""
    out = []
    for e in sorted(energies):
        if not out or e > out[-1] * (1.0 + rel):
            out.append(e)
    return out


def mt_summary(mts):
    """Compact text for a list of MT numbers: 5,16,51-91,..."""
    mts = sorted(mts)
    parts, i = [], 0
    while i < len(mts):
        j = i
        while j + 1 < len(mts) and mts[j + 1] == mts[j] + 1:
            j += 1
        parts.append(str(mts[i]) if i == j else "%d-%d" % (mts[i], mts[j]))
        i = j + 1
    return ",".join(parts)


class ElementResult:
    def __init__(self, sym, proj):
        self.sym, self.proj = sym, proj
        self.z = ELEMENT_SYMBOLS.index(sym)
        self.isotopes = []       # dicts: a, abundance, file, mat, iso (Isotope or None), note
        self.rows = []           # per incident energy
        self.balance = []        # per isotope per energy


def assemble_element(src, sym, proj, masses, emin, emax, n_emin, min_cover, log):
    sub = PROJECTILES[proj]["sub"]
    listing = src.listing(sub)
    res = ElementResult(sym, proj)
    z = res.z
    e_lo = n_emin if proj == "n" else emin
    for a, ab in sorted(ABUNDANCE[sym].items()):
        fn = file_name(proj, z, a, sym)
        entry = {"a": a, "abundance": ab, "file": fn, "mat": None, "iso": None, "note": ""}
        if fn not in listing:
            entry["note"] = "not in library"
        elif listing[fn] is None:
            entry["note"] = "absent from snapshot (>= 4 MiB)"
        else:
            mat = EndfMaterial(src.read(sub, fn), fn)
            entry["mat"] = mat.mat
            entry["emax"] = mat.emax / 1e6
            entry["path"] = src.path_of(sub, fn)
            if mat.emax / 1e6 <= e_lo:
                entry["note"] = "EMAX %.3g MeV <= %.3g MeV" % (mat.emax / 1e6, e_lo)
            else:
                entry["iso"] = Isotope(mat, proj, masses, src.describe, e_lo=e_lo, e_hi=emax)
                entry["mf3"] = mat.mts(3)
                entry["mf6"] = mat.mts(6)
        res.isotopes.append(entry)
    isos = [e for e in res.isotopes if e["iso"] is not None]
    if not isos:
        return res
    grid = set()
    for e in isos:
        grid.update(x for x in e["iso"].grid() if x >= e_lo)
    grid = thin_grid(sorted(x for x in grid if e_lo <= x <= emax))
    for E in grid:
        cover = sum(e["abundance"] for e in isos if E <= e["iso"].top * (1 + 1e-9))
        if cover < min_cover:
            continue
        row = {"E": E, "cover": cover, "sigma": 0.0, "q": 0.0, "e_recoil": 0.0, "e_gamma": 0.0,
               "e_other": 0.0, "e_light": 0.0, "light": {}, "unres": 0.0, "unknown": 0.0}
        for e in isos:
            iso = e["iso"]
            if E > iso.top * (1 + 1e-9):
                continue
            w = e["abundance"] / cover
            r = iso.evaluate(E)
            s = r["sigma"]
            el = sum(L["esum"] for L in r["light"].values())
            eout = el + r["e_recoil"] + r["e_gamma"] + r["e_other"]
            if s > 0:
                res.balance.append({"a": e["a"], "E": E, "sigma": s, "q": r["q_sum"] / s,
                                    "q_mf3": r["q_mf3_sum"] / s, "eout": eout / s,
                                    "a_bal": r["a_bal"] / s, "z_bal": r["z_bal"] / s,
                                    "e_recoil": r["e_recoil"] / s, "e_gamma": r["e_gamma"] / s,
                                    "unres": r["unresolved"], "unknown": r["unknown_energy"],
                                    "per_mt": r["per_mt"]})
            row["sigma"] += w * s
            row["q"] += w * r["q_sum"]
            row["e_recoil"] += w * r["e_recoil"]
            row["e_gamma"] += w * r["e_gamma"]
            row["e_other"] += w * r["e_other"]
            row["e_light"] += w * el
            row["unres"] += w * r["unresolved"]
            row["unknown"] += w * r["unknown_energy"]
            for lab, L in r["light"].items():
                T = row["light"].setdefault(lab, {"sigma": 0.0, "esum": 0.0, "spec": [0.0] * NBIN,
                                                  "fwd": [0.0] * NBIN})
                T["sigma"] += w * L["sigma"]
                T["esum"] += w * L["esum"]
                for i in range(NBIN):
                    T["spec"][i] += w * L["spec"][i]
                    T["fwd"][i] += w * L["fwd"][i]
        row["q"] = row["q"] / row["sigma"] if row["sigma"] > 0 else 0.0
        res.rows.append(row)
    log("%s %s: %d isotopes used, %d incident energies" % (proj, sym, len(isos), len(res.rows)))
    return res


def fmt(x):
    return ("%.4e" % x) if x != 0.0 else "0"


def write_element_table(res, path, src, masses_note, cmdline):
    isos = [e for e in res.isotopes if e["iso"] is not None]
    today = datetime.date.today().isoformat()
    L = []
    L.append("# crewdose secondary-particle production table (format crewdose-secondaries 1)")
    L.append("# Processed %s by process_endf.py %s: %s" % (today, SCRIPT_VERSION, cmdline))
    L.append("# Source library: ENDF/B-VIII.1, %s sublibrary, read from %s" % (PROJECTILES[res.proj]["sub"], src.describe))
    for e in res.isotopes:
        if e["iso"] is not None:
            iso = e["iso"]
            L.append("# %s: path=%s MAT=%d EMAX=%.4g MeV MF1/MT451; MF3 MT=%s; MF6 MT=%s; LCT=%s" % (
                e["file"], e["path"], e["mat"], e["emax"], mt_summary(iso.rx), mt_summary(sorted(iso.models)),
                ",".join(str(v) for v in sorted(set(iso.lct.values())))))
            if iso.from_mf4:
                L.append("#   discrete levels read from MF3+MF4 (two-body kinematics, level photons E=QM-QI): MT %s" %
                         mt_summary(iso.from_mf4))
            if iso.synthetic:
                L.append("#   two-body residuals not listed in MF6, added from kinematics: %s" %
                         " ".join("MT%d:%d" % t for t in iso.synthetic))
            if iso.unsupported:
                L.append("#   products without energy information (not counted in energies): %s" %
                         " ".join("MT%d:ZAP%d:LAW%d" % t for t in iso.unsupported[:20]))
        else:
            L.append("# %s: NOT USED (%s), natural abundance %.6g" % (e["file"], e["note"], e["abundance"]))
    L.append("# Natural abundances: %s;" % ABUNDANCE_SOURCE)
    L.append("#   weights renormalised over isotopes covering each energy (column COVER = covered abundance).")
    L.append("# Masses for Q values: %s" % masses_note)
    L.append("# Frames: ENDF CM data (LCT=2, and LCT=3 for A<=4) converted to lab per CM energy point (non-relativistic);")
    L.append("#   Kalbach-Mann a(E,E') from Kalbach 1988 systematics (PRC 37, 2350; ENDF-102 6.2.3.2), constants as in")
    L.append("#   TALYS source/kalbach.f (abby6677/Talys c82b942) and OpenMC openmc/data/kalbach_mann.py (3f06a42).")
    L.append("# Units: energies MeV, cross sections mb, dsigma/dE mb/MeV, energy-weighted cross sections mb*MeV.")
    L.append("# Layout (whitespace separated; lines starting with # are comments):")
    L.append("#  TARGET sym Z  PROJECTILE p|n")
    L.append("#  ISOTOPE ZA abundance_used file MAT EMAX_MeV           (one line per isotope used)")
    L.append("#  QVALUE ZA MT QM_MeV QI_MeV                             (ENDF MF3 Q values of the MTs used)")
    L.append("#  EOUT_EDGES nbins e0 e1 ... e_nbins                     (lab outgoing-energy bin edges; bin 0 = [0,0.1))")
    L.append("#  NEIN n                                                 (number of incident-energy blocks)")
    L.append("#  EIN E sigma_nonel COVER Q_mass E_recoil E_gamma E_light balance")
    L.append("#     Q_mass: mass-balance Q per reaction (MeV); E_recoil: energy of residuals ZA>2004 (mb*MeV, deposited locally);")
    L.append("#     E_gamma: photon energy (mb*MeV); E_light: kinetic energy of n,p,d,t,he3,alpha (mb*MeV);")
    L.append("#     balance = (E_light+E_recoil+E_gamma)/(sigma_nonel*(E+Q_mass)), 1 = energy conserved")
    L.append("#  SPEC particle sigma_prod mean_E_lab i0 n v_i0 .. v_(i0+n-1)   (lab dsigma/dE' in mb/MeV for bins i0..)")
    L.append("#  FWD  particle i0 n f_i0 .. f_(i0+n-1)                          (fraction of each bin with cos(theta_lab)>0)")
    L.append("#  particles: n p d t he3 alpha; a particle with zero production has no SPEC/FWD line")
    L.append("TARGET %s %d PROJECTILE %s" % (res.sym, res.z, res.proj))
    totab = sum(e["abundance"] for e in isos)
    for e in isos:
        L.append("ISOTOPE %d %.6g %s %d %.6g" % (res.z * 1000 + e["a"], e["abundance"] / totab, e["file"], e["mat"], e["emax"]))
    for e in isos:
        iso = e["iso"]
        for mt in iso.rx:
            L.append("QVALUE %d %d %.6g %.6g" % (iso.za, mt, iso.qm[mt], iso.qi[mt]))
    L.append("EOUT_EDGES %d %s" % (NBIN, " ".join("%.6g" % x for x in EOUT_EDGES)))
    L.append("NEIN %d" % len(res.rows))
    widths = [EOUT_EDGES[i + 1] - EOUT_EDGES[i] for i in range(NBIN)]
    for row in res.rows:
        s = row["sigma"]
        eout = row["e_light"] + row["e_recoil"] + row["e_gamma"] + row["e_other"]
        avail = s * (row["E"] + row["q"])
        bal = eout / avail if avail > 0 and s > 0 else 0.0
        L.append("EIN %.6g %s %.4f %.4f %s %s %s %.4f" % (row["E"], fmt(s), row["cover"], row["q"],
                                                           fmt(row["e_recoil"]), fmt(row["e_gamma"]),
                                                           fmt(row["e_light"]), bal))
        for _, lab in LIGHT:
            T = row["light"].get(lab)
            if not T or T["sigma"] <= 0:
                continue
            sp = T["spec"]
            tot = sum(sp)
            idx = [i for i in range(NBIN) if sp[i] > 1e-6 * tot]   # trim bins < 1e-6 of total (choice)
            if not idx:
                continue
            i0, i1 = idx[0], idx[-1]
            vals = [sp[i] / widths[i] for i in range(i0, i1 + 1)]
            fw = [(T["fwd"][i] / sp[i]) if sp[i] > 0 else 0.0 for i in range(i0, i1 + 1)]
            L.append("SPEC %s %s %.4f %d %d %s" % (lab, fmt(T["sigma"]), T["esum"] / T["sigma"], i0, len(vals),
                                                  " ".join(fmt(v) for v in vals)))
            L.append("FWD %s %d %d %s" % (lab, i0, len(fw), " ".join("%.3f" % min(max(f, 0.0), 1.0) for f in fw)))
    with open(path, "w") as fh:
        fh.write("\n".join(L) + "\n")


def write_balance(results, path, src):
    L = ["# Energy balance per isotope and incident energy (process_endf.py %s, %s)" % (SCRIPT_VERSION, datetime.date.today().isoformat()),
         "# source: %s" % src.describe,
         "# ratio = (sum of lab kinetic energies of all products incl. photons and residuals) / (E + Q_mass)",
         "# Q_mass from decay-sublibrary masses and MF6 yields; Q_mf3 = sigma-weighted MF3 QM;",
         "# A_bal/Z_bal = (sum of yields*A (Z) of listed products) - (A,Z in): non-zero means products missing from MF6",
         "# columns: ZA E_MeV sigma_mb Q_mass Q_mf3 Eout_per_rx E+Q ratio A_bal Z_bal E_recoil E_gamma unresolved_mb unknownE_mb"]
    summary = []
    for res in results:
        for b in res.balance:
            za = res.z * 1000 + b["a"]
            avail = b["E"] + b["q"]
            ratio = b["eout"] / avail if avail > 0 else float("nan")
            b["ratio"] = ratio
            L.append("%d %.5g %.5g %.3f %.3f %.3f %.3f %.4f %.3f %.3f %.3f %.3f %.3g %.3g" % (
                za, b["E"], b["sigma"], b["q"], b["q_mf3"], b["eout"], avail, ratio, b["a_bal"], b["z_bal"],
                b["e_recoil"], b["e_gamma"], b["unres"], b["unknown"]))
    with open(path, "w") as fh:
        fh.write("\n".join(L) + "\n")


# ---------------------------------------------------------------------------
# Inventory
# ---------------------------------------------------------------------------
def inventory(src, elements, out_path, log):
    today = datetime.date.today().isoformat()
    L = ["# ENDF/B-VIII.1 inventory for crewdose secondary-particle tables", "",
         "Generated %s by `process_endf.py inventory` from %s." % (today, src.describe), "",
         "Columns: file (path under `%s`), size in bytes (ABSENT = blob missing from the snapshot, "
         "i.e. a file of >= 4 MiB), MAT, EMAX (MF1/MT451), MF3 MTs, MF6 MTs, LCT of the MF6 sections, "
         "and whether MF6/MT5 exists. Natural abundance: %s." %
         (getattr(src, "lib_root", src.describe), ABUNDANCE_SOURCE), ""]
    for proj in ("p", "n"):
        sub = PROJECTILES[proj]["sub"]
        listing = src.listing(sub)
        L.append("## %s sublibrary (`%s`)" % ("PROTON" if proj == "p" else "NEUTRON", sub))
        L.append("")
        L.append("| element | file | abund. | size | MAT | EMAX MeV | MF3 MTs | MF6 MTs | LCT | MF6 MT5 |")
        L.append("|---|---|---|---|---|---|---|---|---|---|")
        for sym in elements:
            z = ELEMENT_SYMBOLS.index(sym)
            files = sorted(f for f in listing if f.split("_")[0] == "%s-%03d" % (PROJECTILES[proj]["prefix"], z))
            nat = ABUNDANCE.get(sym, {})
            seen = set()
            for f in files:
                a = int(re.sub(r"m\d*$", "", f.split("_")[2].split(".")[0]))
                seen.add(a)
                ab = nat.get(a, 0.0) if "m" not in f.split("_")[2] else 0.0
                size = listing[f]
                if size is None:
                    L.append("| %s | %s | %.4g | ABSENT | | | | | | |" % (sym, f, ab))
                    continue
                m = EndfMaterial(src.read(sub, f), f)
                lcts = set()
                for mt in m.mts(6):
                    try:
                        lcts.add(MF6Section(m.sections[(6, mt)]).lct)
                    except Exception:
                        lcts.add("?")
                L.append("| %s | %s | %.4g | %d | %d | %.4g | %s | %s | %s | %s |" % (
                    sym, f, ab, size, m.mat, m.emax / 1e6, mt_summary(m.mts(3)), mt_summary(m.mts(6)),
                    ",".join(str(x) for x in sorted(lcts)), "yes" if (6, 5) in m.sections else "no"))
            for a, ab in sorted(nat.items()):
                if a not in seen:
                    L.append("| %s | (no %s file for A=%d) | %.4g | NOT IN LIBRARY | | | | | | |" % (
                        sym, PROJECTILES[proj]["prefix"], a, ab))
            if not files and not nat:
                L.append("| %s | (none) | | | | | | | | |" % sym)
        L.append("")
    # ---- per-element summary: natural abundance covered by readable files ----
    S = ["## Summary: natural abundance covered by readable files", "",
         "p: fraction of the natural element whose proton file is readable, and the part reaching 150 MeV; "
         "n: same for neutron files, and the part reaching above 20 MeV (EMAX > 20 MeV). "
         "`route?` marks element/projectile pairs for which this snapshot cannot give a table "
         "(readable coverage above the tabulation threshold < 0.9).", "",
         "| element | p readable | p to 150 MeV | p status | n readable | n > 20 MeV | n absent (>= 4 MiB) | n status |",
         "|---|---|---|---|---|---|---|---|"]
    info = {}
    for proj in ("p", "n"):
        sub = PROJECTILES[proj]["sub"]
        listing = src.listing(sub)
        for sym in elements:
            z = ELEMENT_SYMBOLS.index(sym)
            cov = hi = absent = 0.0
            for a, ab in ABUNDANCE.get(sym, {}).items():
                fn = file_name(proj, z, a, sym)
                if fn not in listing:
                    continue
                if listing[fn] is None:
                    absent += ab
                    continue
                cov += ab
                txt = src.read(sub, fn)
                emax = endf_float(txt.splitlines()[3][11:22]) / 1e6 if len(txt.splitlines()) > 3 else 0.0
                if (proj == "p" and emax >= 150.0 - 1e-6) or (proj == "n" and emax > 20.0):
                    hi += ab
            info[(proj, sym)] = (cov, hi, absent)
    for sym in elements:
        pc, ph, _ = info[("p", sym)]
        nc, nh, na = info[("n", sym)]
        S.append("| %s | %.4f | %.4f | %s | %.4f | %.4f | %.4f | %s |" % (
            sym, pc, ph, "ok" if ph >= 0.9 else ("partial (<150 MeV)" if pc >= 0.9 else "route?"),
            nc, nh, na, "ok" if nh >= 0.9 else "route?"))
    S.append("")
    L = L[:6] + S + L[6:]
    with open(out_path, "w") as fh:
        fh.write("\n".join(L) + "\n")
    log("wrote " + out_path)


# ---------------------------------------------------------------------------
# Sanity checks on written tables
# ---------------------------------------------------------------------------
def letaw(a, e):
    """Letaw et al. 1983 proton non-elastic cross section (mb), E in MeV (< 5 GeV).

    J.R. Letaw, R. Silberberg, C.H. Tsao, ApJS 51, 271 (1983).  Constants as read
    in XS4GCR src/inelastic/Letaw1983.cpp, repository carmeloevoli/XS4GCR, commit
    b0d3497b79f7ae398815cc7e7a9688f4bde7bf33 (there with T in GeV:
    sin(1.58 / T^0.28), exp(-T / 0.2 GeV)).  Used only by `check`."""
    e_gev = e / 1000.0
    return (45.0 * a ** 0.7 * (1.0 + 0.016 * math.sin(5.3 - 2.63 * math.log(a)))
            * (1.0 - 0.62 * math.exp(-e_gev / 0.2) * math.sin(1.58 / e_gev ** 0.28)))


def read_table(path):
    """Minimal reader of the table format (the same logic a C++ loader needs)."""
    t = {"isotopes": [], "isotope_info": [], "blocks": [], "source": "", "files": []}
    in_file = False
    with open(path) as fh:
        for line in fh:
            if line.startswith("# Source library:"):
                t["source"] = line[len("# Source library:"):].strip()
            elif line.startswith("# ") and ".endf: path=" in line:
                t["files"].append({"line": line[2:].strip(), "notes": []})
                in_file = True
                continue
            elif line.startswith("#   ") and in_file:
                t["files"][-1]["notes"].append(line[4:].strip())
                continue
            in_file = False
            if line.startswith("#") or not line.strip():
                continue
            w = line.split()
            if w[0] == "TARGET":
                t["sym"], t["z"], t["proj"] = w[1], int(w[2]), w[4]
            elif w[0] == "ISOTOPE":
                t["isotopes"].append((int(w[1]), float(w[2])))
                t["isotope_info"].append({"za": int(w[1]), "file": w[3], "mat": int(w[4]),
                                          "emax": float(w[5])})
            elif w[0] == "EOUT_EDGES":
                t["edges"] = [float(x) for x in w[2:]]
            elif w[0] == "EIN":
                t["blocks"].append({"E": float(w[1]), "sigma": float(w[2]), "cover": float(w[3]),
                                    "q": float(w[4]), "e_recoil": float(w[5]), "e_gamma": float(w[6]),
                                    "e_light": float(w[7]), "balance": float(w[8]), "spec": {}, "fwd": {}})
            elif w[0] == "SPEC":
                i0, n = int(w[4]), int(w[5])
                t["blocks"][-1]["spec"][w[1]] = (float(w[2]), float(w[3]), i0, [float(x) for x in w[6:6 + n]])
            elif w[0] == "FWD":
                i0, n = int(w[2]), int(w[3])
                t["blocks"][-1]["fwd"][w[1]] = (i0, [float(x) for x in w[4:4 + n]])
    return t


def balance_summary(outdir):
    """Per-isotope digest of balance_<proj>.txt (points with sigma > 1% of the isotope maximum)."""
    out = []
    for proj in ("p", "n"):
        path = os.path.join(outdir, "balance_%s.txt" % proj)
        if not os.path.exists(path):
            continue
        rows = {}
        for line in open(path):
            if line.startswith("#"):
                continue
            w = line.split()
            rows.setdefault(int(w[0]), []).append([float(x) for x in w[1:]])
        out.append("== energy balance, projectile %s: ratio = E_out/(E+Q_mass); points with sigma > 1%% of max" % proj)
        out.append("   ZA      E-range      ratio<10MeV (min..max)  ratio>=10MeV (min..max)  ratio@100  ratio@150  max|A_bal|")
        for za, rs in sorted(rows.items()):
            smax = max(r[1] for r in rs)
            good = [r for r in rs if r[1] > 0.01 * smax]
            lo = [r[6] for r in good if r[0] < 10]
            hi = [r[6] for r in good if r[0] >= 10]
            at = lambda e: next(("%.3f" % r[6] for r in good if abs(r[0] - e) < 1e-6), "-")
            out.append("   %-6d %6.3g-%-6.3g  %s  %s  %9s  %9s  %.3f" % (
                za, rs[0][0], rs[-1][0],
                ("%.3f..%.3f" % (min(lo), max(lo))).ljust(22) if lo else "-".ljust(22),
                ("%.3f..%.3f" % (min(hi), max(hi))).ljust(22) if hi else "-".ljust(22),
                at(100.0), at(150.0), max(abs(r[7]) for r in good)))
    return out


def check_tables(outdir, log):
    lines = []
    for fn in sorted(os.listdir(outdir)):
        if not re.match(r"[pn]_[A-Za-z]+\.txt$", fn):
            continue
        t = read_table(os.path.join(outdir, fn))
        if not t["blocks"]:
            continue
        abar = sum(za % 1000 * w for za, w in t["isotopes"])
        lines.append("== %s  (<A> = %.2f)" % (fn, abar))
        lines.append("   E_MeV  sigma_nonel  Letaw83  ratio | sigma_prod n  p  d  t  he3  alpha (mb) | spectrum-integral/sigma_prod (n) | balance")
        for b in t["blocks"]:
            if b["E"] not in (10, 20, 30, 50, 100, 150) and not abs(b["E"] - 150) < 1e-6:
                continue
            lt = letaw(abar, b["E"]) if t["proj"] == "p" else float("nan")
            prods = []
            for lab in ("n", "p", "d", "t", "he3", "alpha"):
                prods.append("%.1f" % b["spec"][lab][0] if lab in b["spec"] else "0")
            integ = "-"
            if "n" in b["spec"]:
                sig, _, i0, vals = b["spec"]["n"]
                integ = "%.4f" % (sum(v * (t["edges"][i0 + k + 1] - t["edges"][i0 + k]) for k, v in enumerate(vals)) / sig)
            lines.append("   %6.1f  %9.1f  %7.1f  %5.3f | %s | %s | %.3f" % (
                b["E"], b["sigma"], lt, b["sigma"] / lt if lt == lt and lt > 0 else float("nan"),
                " ".join(prods), integ, b["balance"]))
    lines += balance_summary(outdir)
    txt = "\n".join(lines) + "\n"
    with open(os.path.join(outdir, "CHECKS.txt"), "w") as fh:
        fh.write(txt)
    log(txt)


# ---------------------------------------------------------------------------
# emit-cpp: the compiled-in C++ tables (exposure/endf_production_data.cpp),
# read by exposure/endf_production.hpp.  Grids (design choices of crewdose):
#   * outgoing (lab) energy: bin 0 = [0, 0.1) MeV, then CPP_PER_DECADE bins per
#     decade from 0.1 MeV up to the first edge >= CPP_EOUT_TOP (158.5 MeV);
#   * incident energy: CPP_EIN_PER_DECADE points per decade from CPP_EIN_MIN,
#     plus the lowest and the highest energy of each table.
# ---------------------------------------------------------------------------
CPP_PER_DECADE = 10          # must equal kEndfBinsPerDecade of endf_production.hpp
CPP_EIN_PER_DECADE = 10
CPP_EIN_MIN = 1.0            # MeV
CPP_EOUT_TOP = 150.0         # MeV
CPP_NEAR = 0.01              # grid points within 1 % of a table's end energies are dropped
CPP_PARTICLES = ["n", "p", "d", "t", "he3", "alpha"]   # order of enum LightParticle


def cpp_edges():
    """Outgoing-energy edges of the C++ tables (MeV)."""
    edges = [0.0]
    k = 0
    while True:
        e = EOUT_MIN * 10 ** (k / CPP_PER_DECADE)
        edges.append(e)
        if e >= CPP_EOUT_TOP:
            return edges
        k += 1


def rebin_matrix(old, new):
    """For each old bin j: [(i, share of bin j's integral that falls in new bin i)].

    dsigma/dE' is taken as constant inside an old bin (the tables give bin
    averages).  The part of an old bin above the last new edge is counted in the
    last new bin."""
    out = []
    last = len(new) - 2
    for j in range(len(old) - 1):
        lo, hi = old[j], old[j + 1]
        parts = {}
        for i in range(len(new) - 1):
            a, b = max(lo, new[i]), min(hi, new[i + 1])
            if b > a:
                parts[i] = parts.get(i, 0.0) + (b - a)
        if hi > new[-1]:
            parts[last] = parts.get(last, 0.0) + (hi - max(lo, new[-1]))
        tot = sum(parts.values())
        out.append([(i, w / tot) for i, w in sorted(parts.items())])
    return out


def cpp_incident_grid(e_first, e_top):
    g = [e_first]
    k = 0
    while True:
        e = CPP_EIN_MIN * 10 ** (k / CPP_EIN_PER_DECADE)
        k += 1
        if e >= e_top * (1.0 - CPP_NEAR):
            break
        if e > e_first * (1.0 + CPP_NEAR):
            g.append(e)
    if e_top > g[-1] * (1.0 + 1e-9):
        g.append(e_top)
    return g


def cpp_float(x, sig):
    """Shortest C++ float literal (suffix f) for x rounded to sig significant digits."""
    if x == 0.0:
        return "0.f"
    t = "%.*g" % (sig, x)
    if "e" in t:
        m, ex = t.split("e")
        ex = int(ex)
        t = "%se%d" % (m, ex)
        # fixed notation when it is not longer
        f = ("%.*f" % (max(0, sig - 1 - ex), x)) if ex < 0 else None
        if f is not None and "." in f:
            f = f.rstrip("0").rstrip(".") if "." in f else f
            if len(f) <= len(t):
                t = f
    if "." in t and "e" not in t:
        t = t.rstrip("0")
    if "." not in t and "e" not in t:
        t += "."
    if t.startswith("0."):
        t = t[1:]
    elif t.startswith("-0."):
        t = "-" + t[2:]
    return t + "f"


def cpp_double(x, sig=7):
    t = "%.*g" % (sig, x)
    if "e" in t:
        m, ex = t.split("e")
        t = "%se%d" % (m, int(ex))
    elif "." not in t:
        t += ".0"
    return t


def table_cover(t, e, min_cover_abund):
    """Share of the natural element whose files cover e (as in assemble_element)."""
    nat = ABUNDANCE[t["sym"]]
    return sum(nat[iso["za"] % 1000] for iso in t["isotope_info"]
               if e <= min(iso["emax"], min_cover_abund) * (1 + 1e-9))


def regrid_table(t, emax, min_cover):
    """Rebin and regrid one table.  Returns (rows, stats): rows with E, sigma,
    q, e_recoil, e_gamma, cover, and per particle the integral I[i] (mb) and
    the forward part F[i] (mb) per C++ bin."""
    old, new = t["edges"], cpp_edges()
    M = rebin_matrix(old, new)
    nb = len(new) - 1
    blocks = []
    for b in t["blocks"]:
        per = {}
        for lab in CPP_PARTICLES:
            I, F = [0.0] * nb, [0.0] * nb
            if lab in b["spec"]:
                _, _, i0, vals = b["spec"][lab]
                f0, fw = b["fwd"][lab]
                assert f0 == i0 and len(fw) == len(vals)
                for k, v in enumerate(vals):
                    j = i0 + k
                    integ = v * (old[j + 1] - old[j])
                    for i, w in M[j]:
                        I[i] += integ * w
                        F[i] += integ * w * fw[k]
            per[lab] = (I, F)
        blocks.append({"E": b["E"], "sigma": b["sigma"], "sq": b["sigma"] * b["q"], "q": b["q"],
                       "e_recoil": b["e_recoil"], "e_gamma": b["e_gamma"], "cover": b["cover"],
                       "per": per})
    es = [b["E"] for b in blocks]
    grid = cpp_incident_grid(es[0], es[-1])
    rows = []
    for e in grid:
        k = bisect.bisect_right(es, e * (1 + 1e-12)) - 1
        k = min(max(k, 0), len(es) - 1)
        if k == len(es) - 1 or abs(e - es[k]) <= 1e-9 * e:
            b1, b2, x = blocks[k], blocks[k], 0.0
        else:
            b1, b2 = blocks[k], blocks[k + 1]
            x = (e - b1["E"]) / (b2["E"] - b1["E"])
        lin = lambda a, c: a + x * (c - a)
        cover = table_cover(t, e, emax)
        if cover < min_cover:
            continue
        sig = lin(b1["sigma"], b2["sigma"])
        row = {"E": e, "sigma": sig, "q": lin(b1["sq"], b2["sq"]) / sig if sig > 0 else b1["q"],
               "e_recoil": lin(b1["e_recoil"], b2["e_recoil"]), "e_gamma": lin(b1["e_gamma"], b2["e_gamma"]),
               "cover": cover, "per": {}}
        for lab in CPP_PARTICLES:
            I1, F1 = b1["per"][lab]
            I2, F2 = b2["per"][lab]
            row["per"][lab] = ([lin(a, c) for a, c in zip(I1, I2)], [lin(a, c) for a, c in zip(F1, F2)])
        rows.append(row)
    # self-check of the rebinning at the table energies (double precision)
    worst = 0.0
    for b in t["blocks"]:
        for lab, (_, _, i0, vals) in b["spec"].items():
            tot = sum(v * (old[i0 + k + 1] - old[i0 + k]) for k, v in enumerate(vals))
            if tot > 0:
                blk = next(x for x in blocks if x["E"] == b["E"])
                worst = max(worst, abs(sum(blk["per"][lab][0]) - tot) / tot)
    for b in t["blocks"]:                # COVER recomputed from the abundances must match the table
        c = table_cover(t, b["E"], emax)
        if abs(c - b["cover"]) > 6e-5:
            raise ValueError("%s: COVER %.4f at %g MeV, recomputed %.4f (abundances changed since "
                             "`process`?)" % (t["sym"], b["cover"], b["E"], c))
    return rows, worst


def emit_cpp(tables_dir, out_path, emax, min_cover, date, log):
    edges = cpp_edges()
    nb = len(edges) - 1
    widths = [edges[i + 1] - edges[i] for i in range(nb)]
    tables = []
    for proj in ("p", "n"):
        for sym in ELEMENT_SYMBOLS[1:]:
            path = os.path.join(tables_dir, "%s_%s.txt" % (proj, sym))
            if os.path.exists(path):
                t = read_table(path)
                if t["blocks"]:
                    tables.append(t)
    if not tables:
        raise SystemExit("emit-cpp: no tables in %s (run `process` first)" % tables_dir)
    sources = sorted(set(t["source"] for t in tables))
    H = []
    H.append("// Generated by scripts/data/process_endf.py emit-cpp on %s from ENDF/B-VIII.1." % date)
    H.append("// DO NOT EDIT BY HAND: change the script and regenerate (scripts/data/README.md).")
    H.append("//")
    H.append("// Evaluated data: ENDF/B-VIII.1 incident-proton and incident-neutron sublibraries,")
    for src in sources:
        H.append("//   %s" % src)
    H.append("// Files used (path in that repository, MAT, sections read: MF1/MT451 header, MF3 cross")
    H.append("// sections and MF6 product yields/distributions of the MTs listed; MF4 where noted):")
    for t in tables:
        H.append("//  %s + %s:" % (t["proj"], t["sym"]))
        for f in t["files"]:
            line = f["line"].split(": ", 1)[1].replace("path=", "")
            if "; MF3 MT=;" in line:
                line = line.split(" MF1/MT451")[0] + " (no non-elastic reaction in the file: adds 0)"
            H.append("//    %s" % line)
            for n in f["notes"]:
                if n.startswith("discrete levels"):
                    H.append("//      %s" % n)
    H.append("// Masses for Q values: ENDF/B-VIII.1 decay sublibrary (decay-version.VIII.1, AWR of MF1/MT451),")
    H.append("// with the CODATA 2018 neutron mass and atomic mass unit.")
    H.append("// Natural abundances: %s." % ABUNDANCE_SOURCE)
    H.append("// Isotopes weighted by abundance, renormalised over the isotopes whose file covers the energy")
    H.append("// (covered_share); energies where covered_share < %.2f are left out." % min_cover)
    H.append("//")
    H.append("// Regridding (emit-cpp) of the intermediate tables of `process_endf.py process`:")
    H.append("//  * incident energies: %d per decade, 10^(k/%d) MeV from %g MeV, plus the lowest and the"
             % (CPP_EIN_PER_DECADE, CPP_EIN_PER_DECADE, CPP_EIN_MIN))
    H.append("//    highest energy of each table exactly (grid points within %d %% of those are dropped);"
             % round(CPP_NEAR * 100))
    H.append("//    every quantity is interpolated linearly in incident energy between the two")
    H.append("//    neighbouring tabulated (ENDF) incident energies: the non-elastic cross section, the")
    H.append("//    recoil and photon energies, sigma*Q, and per outgoing bin d sigma/dE' and its")
    H.append("//    forward-emitted part; q_mass = (sigma*Q)/sigma, forward_share = forward/total per bin.")
    H.append("//  * outgoing energies: bin 0 = [0, 0.1) MeV, then %d bins per decade, edges 0.1*10^(k/%d)"
             % (CPP_PER_DECADE, CPP_PER_DECADE))
    H.append("//    MeV up to %.4g MeV, rebinned from 24 bins per decade by integration (d sigma/dE'"
             % edges[-1])
    H.append("//    constant inside a source bin): the integral of d sigma/dE' over every new bin and its")
    H.append("//    forward-emitted part are conserved; emission above %.4g MeV is counted in the last bin."
             % edges[-1])
    H.append("//    Values are rounded to 5 significant digits, forward shares to 4 decimals.")
    H.append("// Frames: ENDF centre-of-mass distributions (LCT=2, and LCT=3 for A <= 4) converted to the")
    H.append("// laboratory frame per outgoing-energy point (non-relativistic, exact in angle); outgoing")
    H.append("// energies and forward shares (cos theta_lab > 0) are laboratory quantities. Kalbach-Mann")
    H.append("// slopes from the Kalbach 1988 systematics where a file gives none.")
    H.append("// Units: MeV, mb, mb/MeV, mb*MeV.")
    C = []
    C.append('#include "endf_production.hpp"')
    C.append("")
    C.append("#include <array>")
    C.append("#include <cstddef>")
    C.append("#include <optional>")
    C.append("#include <span>")
    C.append("#include <string_view>")
    C.append("")
    C.append("namespace crewdose::exposure {")
    C.append("")
    C.append("namespace {")
    C.append("")
    C.append("constexpr std::size_t kBins = %d;" % nb)
    C.append("constexpr double kEdges[kBins + 1] = {%s};" % ", ".join(repr(x) for x in edges))
    C.append("constexpr float kZeroRow[kBins] = {};")
    C.append("constexpr std::span<const float> Z0{kZeroRow};")
    C.append("")
    C.append("// Row r (kBins values) of a pool of rows.")
    C.append("constexpr std::span<const float> R(std::span<const float> pool, std::size_t r) {")
    C.append("    return pool.subspan(r * kBins, kBins);")
    C.append("}")
    C.append("")
    reg = []
    stats = []
    for t in tables:
        rows, worst = regrid_table(t, emax, min_cover)
        name = "%s%d" % (t["proj"].upper(), t["z"])
        files = ", ".join("%s MAT %d" % (i["file"], i["mat"]) for i in t["isotope_info"])
        sub = PROJECTILES[t["proj"]]["sub"]
        src_text = "ENDF/B-VIII.1 %s: %s" % (sub, files)
        D, F, E = [], [], []
        for r in rows:
            dref, fref = [], []
            for lab in CPP_PARTICLES:
                I, Fw = r["per"][lab]
                if not any(v > 0 for v in I):
                    dref.append("Z0")
                    fref.append("Z0")
                    continue
                ds = [I[i] / widths[i] for i in range(nb)]
                sh = [min(max(Fw[i] / I[i], 0.0), 1.0) if I[i] > 0 else 0.0 for i in range(nb)]
                dref.append("R(k%sD, %d)" % (name, len(D)))
                D.append(",".join(cpp_float(v, 5) for v in ds))
                fref.append("R(k%sF, %d)" % (name, len(F)))
                F.append(",".join(cpp_float(round(v, 4), 5) for v in sh))
            E.append("    {%s, %s, %s, %s, %s, %s,\n     {{%s}},\n     {{%s}}}," % (
                cpp_double(r["E"]), cpp_double(r["sigma"], 6), cpp_double(r["q"], 6),
                cpp_double(r["e_recoil"], 6), cpp_double(r["e_gamma"], 6), cpp_double(r["cover"], 6),
                ", ".join(dref), ", ".join(fref)))
        C.append("// %s + %s (Z = %d): %s" % (t["proj"], t["sym"], t["z"], src_text))
        C.append("// d sigma/dE' (mb/MeV), one row of kBins per incident energy and particle")
        if D:
            C.append("constexpr float k%sD[] = {\n%s};" % (name, ",\n".join(D)))
            C.append("// forward shares (cos theta_lab > 0) of the same rows")
            C.append("constexpr float k%sF[] = {\n%s};" % (name, ",\n".join(F)))
        C.append("constexpr EndfIncident k%s[] = {\n%s\n};" % (name, "\n".join(E)))
        C.append("")
        reg.append('    EndfTable{%d, %s,\n              "%s",\n              k%s},' % (
            t["z"], "true" if t["proj"] == "n" else "false", src_text, name))
        stats.append("%s_%s: %d energies %.4g-%.4g MeV, rebin worst |dI|/I = %.1e" % (
            t["proj"], t["sym"], len(rows), rows[0]["E"], rows[-1]["E"], worst))
    C.append("constexpr EndfTable kTables[] = {")
    C.extend(reg)
    C.append("};")
    C.append("")
    C.append("} // namespace")
    C.append("")
    C.append("std::span<const double> endf_outgoing_edges_MeV() {")
    C.append("    return kEdges;")
    C.append("}")
    C.append("")
    C.append("std::optional<EndfTable> endf_table(int Z, bool neutron_projectile) {")
    C.append("    for (const EndfTable& t : kTables) {")
    C.append("        if (t.Z == Z && t.neutron_projectile == neutron_projectile) {")
    C.append("            return t;")
    C.append("        }")
    C.append("    }")
    C.append("    return std::nullopt;")
    C.append("}")
    C.append("")
    C.append("} // namespace crewdose::exposure")
    text = "\n".join(H) + "\n" + "\n".join(C) + "\n"
    with open(out_path, "w") as fh:
        fh.write(text)
    for line in stats:
        log(line)
    log("wrote %s (%d bytes, %d tables)" % (out_path, len(text.encode()), len(tables)))


# ---------------------------------------------------------------------------
# Command line
# ---------------------------------------------------------------------------
def make_source(args):
    if args.endf_dir:
        return DirSource(args.endf_dir)
    return GitSource(args.git_dir, args.ref, args.lib_root, args.repo_name)


def main(argv=None):
    ap = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    ap.add_argument("command", choices=["inventory", "masses", "process", "check", "emit-cpp"])
    ap.add_argument("--git-dir", default=os.environ.get("CREWDOSE_ENDF_GIT_DIR"),
                    help="git directory (bare or not) of a copy of the public repository "
                         "github.com/nothinwillbewong/cycle, the snapshot holding the library "
                         "(default: the environment variable CREWDOSE_ENDF_GIT_DIR)")
    ap.add_argument("--repo-name", default="github.com/nothinwillbewong/cycle")
    ap.add_argument("--ref", default="HEAD")
    ap.add_argument("--lib-root", default="ENDF-B-VIII.1")
    ap.add_argument("--endf-dir", default=None, help="directory with <sublib>/<file>.endf instead of git")
    ap.add_argument("--out", default=None,
                    help="output directory (default %s); for emit-cpp: the C++ file to write" % DEFAULT_OUT)
    ap.add_argument("--tables", default=DEFAULT_OUT, help="emit-cpp: directory of the tables of `process`")
    ap.add_argument("--date", default=None, help="emit-cpp: date written into the header (default today)")
    ap.add_argument("--elements", default=",".join(DEFAULT_ELEMENTS))
    ap.add_argument("--projectiles", default="p,n")
    ap.add_argument("--emin", type=float, default=1.0, help="lowest proton incident energy, MeV")
    ap.add_argument("--emax", type=float, default=150.0, help="highest incident energy, MeV")
    ap.add_argument("--n-emin", type=float, default=20.0, help="neutrons: tabulate only above this energy, MeV")
    ap.add_argument("--min-cover", type=float, default=0.9,
                    help="drop incident energies where covered natural abundance is below this")
    ap.add_argument("--masses", default=None, help="mass table JSON (default <out>/masses.json)")
    args = ap.parse_args(argv)
    log = lambda s: print(s, file=sys.stderr)
    if args.command == "emit-cpp":
        if not args.out:
            ap.error("emit-cpp needs --out FILE (e.g. exposure/endf_production_data.cpp)")
        emit_cpp(args.tables, args.out, args.emax, args.min_cover,
                 args.date or datetime.date.today().isoformat(), log)
        return
    if args.out is None:
        args.out = DEFAULT_OUT
    os.makedirs(args.out, exist_ok=True)
    if args.command == "check":
        check_tables(args.out, lambda s: print(s))
        return
    src = make_source(args)
    elements = [e.strip() for e in args.elements.split(",") if e.strip()]
    if args.command == "inventory":
        inventory(src, elements, os.path.join(args.out, "INVENTORY.md"), log)
        return
    mpath = args.masses or os.path.join(args.out, "masses.json")
    if args.command == "masses" or not os.path.exists(mpath):
        table = build_mass_table(src)
        with open(mpath, "w") as fh:
            json.dump({"source": "%s, %s/%s, AWR of MF1/MT451 (ground states)" % (src.describe, args.lib_root, DECAY_SUB),
                       "neutron_mass_u": NEUTRON_AMU, "u_MeV": AMU_MEV, "table": table}, fh, indent=0)
        log("wrote %s (%d nuclides)" % (mpath, len(table)))
        if args.command == "masses":
            return
    with open(mpath) as fh:
        mj = json.load(fh)
    masses = Masses(mj["table"])
    masses_note = "ENDF/B-VIII.1 decay sublibrary AWR (MF1/MT451), %s" % mj["source"]
    cmdline = "process_endf.py " + " ".join(argv if argv is not None else sys.argv[1:])
    for proj in [p.strip() for p in args.projectiles.split(",")]:
        results = []
        for sym in elements:
            res = assemble_element(src, sym, proj, masses, args.emin, args.emax, args.n_emin, args.min_cover, log)
            if res.rows:
                write_element_table(res, os.path.join(args.out, "%s_%s.txt" % (proj, sym)), src, masses_note, cmdline)
            else:
                log("%s %s: no table (%s)" % (proj, sym, "; ".join("%s: %s" % (e["file"], e["note"] or "used")
                                                                   for e in res.isotopes)))
            results.append(res)
        write_balance(results, os.path.join(args.out, "balance_%s.txt" % proj), src)
        with open(os.path.join(args.out, "coverage_%s.txt" % proj), "w") as fh:
            for res in results:
                fh.write("%s %s table=%s isotopes: %s\n" % (proj, res.sym, "yes" if res.rows else "NO",
                         "; ".join("A=%d ab=%.4g %s" % (e["a"], e["abundance"], e["note"] or "used") for e in res.isotopes)))
    if masses.fallbacks:
        log("masses taken from evaluation AWP (not in decay sublibrary): %s" % sorted(masses.fallbacks))


if __name__ == "__main__":
    main()
