#!/usr/bin/env python3
"""The helium interstellar spectrum of crewdose's GCR model, fitted to measured helium.

crewdose's protons follow the Burger et al. 2000 LIS (as given by Usoskin et al. 2005) with the
force field (Gleeson & Axford 1968); see exposure/gcr.cpp. Helium takes the proton LIS per unit
rigidity divided by a ratio r(R) = r0 (R / 10 GV)^(-delta). This script

  extract GITDIR   copies the measured spectra out of a snapshot of the public repository
                   carmeloevoli/crams (git objects, no work tree) into tests/data/crdb/ with
                   their provenance:
                     AMS-02 proton and helium fluxes per rigidity (SSDC export, Aguilar et al.
                     2021, Physics Reports 894, 1), commit fd0ab879, data/H_AMS-02_R.txt and
                     data/He_AMS-02_R.txt;
                     PAMELA helium flux per rigidity (Adriani et al. 2011, Science 332, 69),
                     commit 369abea0, data/He_PAMELA_rig.txt (and the protons of the same file
                     set, data/H_PAMELA_rig.txt, to check the file against our CRDB export).
  fit              fits phi to the AMS-02 protons (1-20 GV, least squares in log flux), then
                   r0 and delta to the AMS-02 helium at that phi (2-100 GV, the same measure),
                   and prints them with the residuals; then shows the PAMELA helium at the phi
                   of PAMELA's protons (501 MV, tests/unit/gcr_test.cpp), which the fit does
                   not see.

Python 3, standard library only. Units: rigidity GV, flux per (m2 s sr GV).
"""
import math
import os
import subprocess
import sys

ROOT = os.path.normpath(os.path.join(os.path.dirname(__file__), "..", ".."))
OUT = os.path.join(ROOT, "tests", "data", "crdb")

M_P = 0.93827208816  # proton rest energy, GeV (CODATA 2018)
# He-4 nucleus: AME2016 atomic mass 4.00260325413 u less two electrons (as exposure/particle.cpp)
M_HE = 4.00260325413 * 0.93149410242 - 2 * 0.00051099895
Z_HE, A_HE = 2, 4

SOURCES = {
    "ams02_2011_2018_protons_rigidity.csv": (
        "fd0ab879bb33d92bafd70f79ad5ea033f25a4955", "data/H_AMS-02_R.txt",
        "Proton flux, AMS-02, Aguilar et al. 2021, Physics Reports 894, 1 "
        "(doi:10.1016/j.physrep.2020.09.003), as exported by the SSDC cosmic-ray database"),
    "ams02_2011_2018_helium_rigidity.csv": (
        "fd0ab879bb33d92bafd70f79ad5ea033f25a4955", "data/He_AMS-02_R.txt",
        "Helium flux, AMS-02, Aguilar et al. 2021, Physics Reports 894, 1 "
        "(doi:10.1016/j.physrep.2020.09.003), as exported by the SSDC cosmic-ray database"),
    "pamela_2006_2008_helium_rigidity.csv": (
        "369abea036e785a0c564b02ac02cb908f7746ded", "data/He_PAMELA_rig.txt",
        "Helium flux, PAMELA, Adriani et al. 2011, Science 332, 69 (doi:10.1126/science.1199172); "
        "the file names no source: its proton companion data/H_PAMELA_rig.txt of the same commit "
        "agrees with the CRDB export of that paper's protons (tests/data/crdb/"
        "pamela_2006_2008_protons.csv) within 0.5 % (this script's 'extract' checks it)"),
}
PERIODS = {
    "ams02_2011_2018_protons_rigidity.csv": "the report's first seven years of AMS-02 "
    "(2011/05-2018/05, from memory; the file gives no period)",
    "ams02_2011_2018_helium_rigidity.csv": "the report's first seven years of AMS-02 "
    "(2011/05-2018/05, from memory; the file gives no period)",
    "pamela_2006_2008_helium_rigidity.csv": "2006/07-2008/12 (the paper's period, as for the "
    "protons)",
}


def rows_of(text):
    out = []
    for line in text.splitlines():
        line = line.strip()
        if not line or line.startswith("#") or line.startswith("data size"):
            continue
        cols = [float(c) for c in line.split()]
        out.append(cols)
    return out


def extract(gitdir):
    for name, (commit, path, what) in SOURCES.items():
        text = subprocess.run(["git", "--git-dir", gitdir, "show", f"{commit}:{path}"],
                              check=True, capture_output=True, text=True).stdout
        rows = rows_of(text)
        header = [f"# {what}",
                  f"# Data-taking period: {PERIODS[name]}",
                  f"# Source: github.com/carmeloevoli/crams commit {commit} path {path}",
                  "# Written by scripts/data/helium_lis.py extract; values copied unchanged.",
                  "# Original header lines follow (if any):"]
        header += ["#   " + l for l in text.splitlines() if l.startswith("#") or
                   l.startswith("data size")]
        ncol = len(rows[0])
        if ncol == 6:
            cols = "R_GV,flux_per_m2_s_sr_GV,err_a_lo,err_a_up,err_b_lo,err_b_up"
            header.append("# err_a, err_b: source columns 3-4 and 5-6 (statistical and "
                          "systematic by magnitude; the file does not label them)")
        else:
            cols = "R_GV,flux_per_m2_s_sr_GV,err_lo,err_up"
            header.append("# err: source columns 3-4 (total, by magnitude; unlabelled)")
        with open(os.path.join(OUT, name), "w") as f:
            f.write("\n".join(header) + "\n" + cols + "\n")
            for r in rows:
                f.write(",".join(f"{v:g}" for v in r) + "\n")
        print(f"wrote {name}: {len(rows)} rows")
    # The PAMELA file set's protons against our CRDB export of the same paper's protons.
    text = subprocess.run(["git", "--git-dir", gitdir, "show",
                           "369abea036e785a0c564b02ac02cb908f7746ded:data/H_PAMELA_rig.txt"],
                          check=True, capture_output=True, text=True).stdout
    by_R = rows_of(text)
    crdb = read_csv(os.path.join(OUT, "pamela_2006_2008_protons.csv"))
    worst = 0.0
    for T, J in crdb:
        R = math.sqrt(T * (T + 2 * M_P))
        per_R = J * R / math.sqrt(R * R + M_P * M_P)  # dT/dR = beta
        near = min(by_R, key=lambda r: abs(math.log(r[0] / R)))
        if abs(math.log(near[0] / R)) < 0.01:
            worst = max(worst, abs(near[1] / per_R - 1))
    print(f"PAMELA protons, rigidity file against the CRDB export: worst {100 * worst:.2f} %")
    if worst > 0.005:
        sys.exit("the PAMELA rigidity files do not match the CRDB export: not the same data")


def read_csv(path):
    out = []
    for line in open(path):
        if line.startswith("#") or line[0].isalpha():
            continue
        c = line.split(",")
        out.append((float(c[0]), float(c[1])))
    return out


def burger_shape(P):
    """Burger et al. 2000 LIS as in Usoskin et al. 2005, per (m2 s sr GeV/n), P in GV."""
    return 1.9e4 * P ** -2.78 / (1.0 + 0.4866 * P ** -2.51)


def beta_p(R):
    return R / math.sqrt(R * R + M_P * M_P)


def beta_he(R):
    pc = Z_HE * R
    return pc / math.sqrt(pc * pc + M_HE * M_HE)


def proton_per_R(R, phi_GV):
    """Modulated proton flux per unit rigidity at 1 AU (force field)."""
    T = math.sqrt(R * R + M_P * M_P) - M_P
    Ts = T + phi_GV
    Ps = math.sqrt(Ts * (Ts + 2 * M_P))
    J_T = burger_shape(Ps) * T * (T + 2 * M_P) / (Ts * (Ts + 2 * M_P))
    return J_T * beta_p(R)


def helium_per_R(R, phi_GV, r0, delta, old=False):
    """Modulated helium flux per unit rigidity: LIS per R = proton LIS per R / r(R). With
    old=True the model before this fit: LIS per GeV/n = (A/Z) / 7 times the Burger shape."""
    mn = M_HE / A_HE
    Tn = (math.sqrt((Z_HE * R) ** 2 + M_HE ** 2) - M_HE) / A_HE
    Tns = Tn + Z_HE / A_HE * phi_GV
    Rs = A_HE / Z_HE * math.sqrt(Tns * (Tns + 2 * mn))
    lis_per_R = burger_shape(Rs) * beta_p(Rs) / (r0 * (Rs / 10.0) ** -delta)
    lis_per_Tn = lis_per_R * (A_HE / Z_HE) / beta_he(Rs)
    if old:
        lis_per_Tn = A_HE / Z_HE / 7.0 * burger_shape(Rs)
    J_Tn = lis_per_Tn * Tn * (Tn + 2 * mn) / (Tns * (Tns + 2 * mn))
    return J_Tn * (Z_HE / A_HE) * beta_he(R)


def sse(model, data):
    return sum(math.log(model(R) / J) ** 2 for R, J in data)


def golden(f, a, b, tol=1e-7):
    g = (math.sqrt(5) - 1) / 2
    c, d = b - g * (b - a), a + g * (b - a)
    while b - a > tol:
        if f(c) < f(d):
            b, d = d, c
            c = b - g * (b - a)
        else:
            a, c = c, d
            d = a + g * (b - a)
    return (a + b) / 2


def fit():
    p = [(R, J) for R, J in read_csv(os.path.join(OUT, "ams02_2011_2018_protons_rigidity.csv"))
         if 1.0 <= R <= 20.0]
    he = [(R, J) for R, J in read_csv(os.path.join(OUT, "ams02_2011_2018_helium_rigidity.csv"))
          if 2.0 <= R <= 100.0]
    phi = golden(lambda x: sse(lambda R: proton_per_R(R, x), p), 0.2, 1.5)
    print(f"phi fitted to the AMS-02 protons, 1-20 GV: {1e3 * phi:.0f} MV")
    worst = max(abs(proton_per_R(R, phi) / J - 1) for R, J in p)
    print(f"  protons: worst residual {100 * worst:.1f} %")
    # r0 for a given delta is a closed form (log least squares); delta by golden section.
    def r0_of(delta):
        s = sum(math.log(helium_per_R(R, phi, 1.0, delta) / J) for R, J in he)
        return math.exp(s / len(he))
    delta = golden(lambda d: sse(lambda R: helium_per_R(R, phi, r0_of(d), d), he), -0.3, 0.5)
    r0 = r0_of(delta)
    print(f"helium LIS: r(R) = {r0:.4f} (R / 10 GV)^-{delta:.4f}  (fit, AMS-02 2-100 GV)")
    for R, J in he[::6]:
        print(f"  AMS-02 He {R:8.3f} GV: model/data {helium_per_R(R, phi, r0, delta) / J:.3f}")
    worst = max(abs(helium_per_R(R, phi, r0, delta) / J - 1) for R, J in he)
    print(f"  worst {100 * worst:.1f} %")
    pam = read_csv(os.path.join(OUT, "pamela_2006_2008_helium_rigidity.csv"))
    print("PAMELA helium 2006-08 at phi = 501 MV (held out):")
    for R, J in pam[::8]:
        print(f"  {R:8.3f} GV: model/data {helium_per_R(R, 0.501, r0, delta) / J:.3f}")
    print("the model before (p/He = 7 on the Burger shape per GeV/n) on the same points:")
    for R, J in pam[::8]:
        print(f"  {R:8.3f} GV: model/data {helium_per_R(R, 0.501, 1, 0, old=True) / J:.3f}")
    print("and on the AMS-02 helium at the fitted phi:")
    for R, J in he[::6]:
        print(f"  {R:8.3f} GV: model/data {helium_per_R(R, phi, 1, 0, old=True) / J:.3f}")


if __name__ == "__main__":
    if len(sys.argv) == 3 and sys.argv[1] == "extract":
        extract(sys.argv[2])
    elif len(sys.argv) == 2 and sys.argv[1] == "fit":
        fit()
    else:
        print(__doc__)
        sys.exit(2)
