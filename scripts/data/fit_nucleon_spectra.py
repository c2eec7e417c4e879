#!/usr/bin/env python3
"""Fits crewdose's high-energy neutron-emission model to measured (p,xn) spectra and writes
the fitted constants as exposure/nucleon_fit_data.hpp.

Data: the angle-integrated neutron production spectra in tests/data/exfor/*.csv (made from
EXFOR double-differential data by scripts/data/exfor/angle_integrate.py; each file names its
EXFOR entry and authors: Meier et al. 1989/1992, Amian et al. 1992/1993, Leray et al. 2002,
Ishibashi et al. 1997, Stamer et al. 1993).

Model (ours), neutrons per reaction per MeV of outgoing energy E' for a proton of kinetic
energy E (MeV) on a nucleus of mass number A:

    nu(E') = M1 E'/T1^2 exp(-E'/T1)                 evaporation
           + M2 E'/T2^2 exp(-E'/T2)                 pre-equilibrium
           + M3 exp(-E'/T3) / (T3 (1 - exp(-E/T3)))  cascade, E' < E

    T1 = t1 A^t1b, T2 = t2, T3 = t3 (E/1 GeV)^g3, Mk = ck A^ak (E/1 GeV)^bk.

Reactions per unit path come from the reaction cross section of Letaw, Silberberg & Tsao
1983 (ApJS 51, 271), as in exposure/nuclear.cpp. The fit minimises the mean over training
sets of the mean squared log ratio model/data for E' from 2 MeV (20 MeV for Stamer, whose
low-energy points show detector-threshold artefacts) to 0.85 E. Training: the sets at and
above 256 MeV except Amian 597 MeV (Al), Leray 1.2 GeV (Fe) and Stamer 256 MeV (Al), which
are held out as checks, as are the 113 MeV sets (below the model's range).

The forward share of emission (cos theta_lab > 0) by outgoing energy is the mean, over the
sets at and above 256 MeV, of each set's forward share in six bands of E'.

Python 3 standard library only; deterministic (Nelder-Mead from a fixed start). Run:
    python3 scripts/data/fit_nucleon_spectra.py            (about 3 minutes on one core)
"""
import csv
import datetime
import glob
import math
import os

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.normpath(os.path.join(HERE, '..', '..'))
DATA = os.path.join(ROOT, 'tests', 'data', 'exfor')
OUT = os.path.join(ROOT, 'exposure', 'nucleon_fit_data.hpp')

# Natural atomic masses (g/mol), as exposure/element.cpp.
MASS = {'C': 12.0107, 'Al': 26.981538, 'Fe': 55.845, 'Pb': 207.2}
NAMES = ['t1', 't1b', 't2', 't3', 'g3', 'c1', 'a1', 'b1', 'c2', 'a2', 'b2', 'c3', 'a3', 'b3']
BANDS = [(2, 7), (7, 20), (20, 50), (50, 150), (150, 400), (400, 3000)]


def letaw_mb(A, E):
    """Letaw, Silberberg & Tsao 1983 proton reaction cross section (as exposure/nuclear.cpp)."""
    return (45.0 * A ** 0.7 * (1 + 0.016 * math.sin(5.3 - 2.63 * math.log(A))) *
            (1 - 0.62 * math.exp(-E / 200) * math.sin(10.9 * E ** -0.28)))


def load():
    sets = []
    for f in sorted(glob.glob(os.path.join(DATA, 'p-*.csv'))):
        name = os.path.basename(f)
        target = name.split('-')[1].rstrip('0123456789')
        E = float(name.split('-E')[-1][:-4])
        rows = list(csv.reader(l for l in open(f) if not l.startswith('#')))
        head = rows[0]
        data = [[float(x) for x in r] for r in rows[1:]]
        col = {c: i for i, c in enumerate(head)}
        Ep = [r[col['E_MeV']] for r in data]
        s = [(r[col['dsig_dE_lin']] + r[col['dsig_dE_exp']]) / 2 for r in data]
        fwd = [(r[col['fwd_dsig_dE_lin']] + r[col['fwd_dsig_dE_exp']]) / 2 for r in data]
        held = E < 200 or 'Stamer' in name or ('Amian' in name and E < 700) or 'Leray' in name
        sets.append(dict(name=name, target=target, A=MASS[target], E=E, Ep=Ep, s=s, fwd=fwd,
                         train=not held, lo=20.0 if 'Stamer' in name else 2.0))
    return sets


def nu(p, A, E, x):
    t1, t1b, t2, t3, g3, c1, a1, b1, c2, a2, b2, c3, a3, b3 = p
    r = E / 1000.0
    T1, T2, T3 = t1 * A ** t1b, t2, t3 * r ** g3
    v = (c1 * A ** a1 * r ** b1 * x / T1 ** 2 * math.exp(-x / T1) +
         c2 * A ** a2 * r ** b2 * x / T2 ** 2 * math.exp(-x / T2))
    if x < E:
        v += c3 * A ** a3 * r ** b3 * math.exp(-x / T3) / (T3 * -math.expm1(-E / T3))
    return v


def set_cost(p, d):
    acc, n = 0.0, 0
    sig = letaw_mb(d['A'], d['E'])
    for x, y in zip(d['Ep'], d['s']):
        if x < d['lo'] or x > 0.85 * d['E'] or y <= 0:
            continue
        m = sig * nu(p, d['A'], d['E'], x)
        if not m > 0:
            return 1e9
        acc += math.log(m / y) ** 2
        n += 1
    return acc / n


def cost(p, sets):
    t = [set_cost(p, d) for d in sets if d['train']]
    return sum(t) / len(t)


def nelder_mead(f, x0, step, iters):
    n = len(x0)
    pts = [list(x0)] + [[x0[j] + (step[j] if j == i else 0) for j in range(n)] for i in range(n)]
    vals = [f(q) for q in pts]
    for _ in range(iters):
        order = sorted(range(n + 1), key=lambda i: vals[i])
        pts, vals = [pts[i] for i in order], [vals[i] for i in order]
        c = [sum(pts[i][j] for i in range(n)) / n for j in range(n)]
        xr = [2 * c[j] - pts[-1][j] for j in range(n)]
        fr = f(xr)
        if fr < vals[0]:
            xe = [3 * c[j] - 2 * pts[-1][j] for j in range(n)]
            fe = f(xe)
            pts[-1], vals[-1] = (xe, fe) if fe < fr else (xr, fr)
        elif fr < vals[-2]:
            pts[-1], vals[-1] = xr, fr
        else:
            xc = [(c[j] + pts[-1][j]) / 2 for j in range(n)]
            fc = f(xc)
            if fc < vals[-1]:
                pts[-1], vals[-1] = xc, fc
            else:
                for i in range(1, n + 1):
                    pts[i] = [(pts[0][j] + pts[i][j]) / 2 for j in range(n)]
                    vals[i] = f(pts[i])
    i = min(range(n + 1), key=lambda k: vals[k])
    return pts[i], vals[i]


def integrals(p, d):
    """Model and measured neutron production (mb) above the set's lowest energy and above 20 MeV."""
    sig = letaw_mb(d['A'], d['E'])
    Ep, s = d['Ep'], d['s']
    out = {}
    for key, lo in (('low', max(Ep[0], d['lo'])), ('20', 20.0)):
        meas = model = 0.0
        for i in range(len(Ep) - 1):
            a, b = Ep[i], Ep[i + 1]
            if a < lo or b > 0.95 * d['E']:
                continue
            meas += 0.5 * (s[i] + s[i + 1]) * (b - a)
            model += 0.5 * sig * (nu(p, d['A'], d['E'], a) + nu(p, d['A'], d['E'], b)) * (b - a)
        out[key] = (model, meas)
    return out


def forward_shares(sets):
    shares = []
    for lo, hi in BANDS:
        vals = []
        for d in sets:
            if d['E'] < 200 or 'Stamer' in d['name']:
                continue
            num = den = 0.0
            for i in range(len(d['Ep']) - 1):
                a, b = d['Ep'][i], d['Ep'][i + 1]
                if a < lo or b > hi:
                    continue
                num += 0.5 * (d['fwd'][i] + d['fwd'][i + 1]) * (b - a)
                den += 0.5 * (d['s'][i] + d['s'][i + 1]) * (b - a)
            if den > 0:
                vals.append(num / den)
        shares.append((math.sqrt(lo * hi), sum(vals) / len(vals)))
    return shares


def main():
    sets = load()
    p = [4.0, -0.2, 10.0, 100.0, 0.5, 0.1, 1.0, 0.2, 0.05, 0.8, 0.3, 0.2, 0.5, 0.5]
    step = [0.5, 0.05, 2, 20, 0.1, 0.05, 0.1, 0.1, 0.02, 0.1, 0.1, 0.05, 0.1, 0.1]
    best = cost(p, sets)
    for rnd in range(4):
        q, v = nelder_mead(lambda x: cost(x, sets), p, [s * 0.5 ** rnd for s in step], 3000)
        if v < best:
            p, best = q, v
    print('fit: mean squared log ratio %.4f' % best)
    lines = []
    for d in sets:
        ints = integrals(p, d)
        lines.append('%-44s %s rms log %.3f | >E_lo %7.0f / %7.0f = %.2f | >20 MeV %7.0f / %7.0f = %.2f' % (
            d['name'], 'fit  ' if d['train'] else 'check', math.sqrt(set_cost(p, d)),
            ints['low'][0], ints['low'][1], ints['low'][0] / ints['low'][1],
            ints['20'][0], ints['20'][1], ints['20'][0] / ints['20'][1]))
    print('\n'.join(lines))
    fwd = forward_shares(sets)
    today = datetime.date.today().isoformat()
    with open(OUT, 'w') as fh:
        fh.write('#pragma once\n')
        fh.write('// Generated by scripts/data/fit_nucleon_spectra.py on %s: do not edit by hand.\n' % today)
        fh.write('// The constants of the high-energy neutron-emission model of nucleon_production.cpp,\n')
        fh.write('// fitted to measured (p,xn) spectra (tests/data/exfor; the script says how).\n')
        fh.write('// Mean squared log ratio over the fitted sets: %.4f. Per set (model / measured\n' % best)
        fh.write('// production above the lowest measured energy, and above 20 MeV):\n')
        for l in lines:
            fh.write('//   %s\n' % l)
        fh.write('namespace crewdose::exposure::nucleon_fit {\n')
        for name, v in zip(NAMES, p):
            fh.write('inline constexpr double %s = %.9g;\n' % (name, v))
        fh.write('/// Forward share of emission (cos theta_lab > 0) by outgoing energy (MeV): band centres\n')
        fh.write('/// and the mean share over the sets at and above 256 MeV.\n')
        fh.write('inline constexpr double kForwardEnergy_MeV[] = {%s};\n' % ', '.join('%.6g' % e for e, _ in fwd))
        fh.write('inline constexpr double kForwardShare[] = {%s};\n' % ', '.join('%.4f' % s for _, s in fwd))
        fh.write('} // namespace crewdose::exposure::nucleon_fit\n')
    print('wrote', OUT)


if __name__ == '__main__':
    main()
