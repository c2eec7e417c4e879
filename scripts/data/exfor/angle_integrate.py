#!/usr/bin/env python3
"""Angle- and energy-integrate measured (p,xn) double-differential cross sections.

Input : p-*.txt in this folder, transcribed from arjankoning1/exfortables (YANDF-0.2 files built
        from the IAEA-NDS EXFOR C5 file).  Format:
          '# meta: target=.. A=.. Ein=.. author=.. entry=..'
          'A <angle_deg>'  starts a block for one emission angle (file column 5)
          '<E_out MeV> <xs> <dxs>'  (file columns 1, 3, 4 as printed)
Units : the printed xs column is labelled [mb/MeV.sr] but is numerically
        mb/(eV sr) (see SUMMARY.md); XS_TO_MB_PER_MEV_SR converts it.
Output: tests/data/exfor/<set>.csv (angle-integrated dsigma/dE, read by the tests and by
        scripts/data/fit_nucleon_spectra.py) and summary.json there

Python 3.11 standard library only.
"""
import json
import math
import os
import sys

XS_TO_MB_PER_MEV_SR = 1.0e6  # mb/(eV sr) -> mb/(MeV sr)
PARTIAL_EMIN = 20.0  # MeV: an angle measured only above this is used only where it exists
HERE = os.path.dirname(os.path.abspath(__file__))

# Outgoing-energy grid used by all Meier/Amian (LANL WNR) sets read here, as printed in
# the exfortables files (bin centres, MeV).
STD_GRID = ([round(0.525 + 0.05 * i, 4) for i in range(10)] + [1.075] +
            [round(1.15 + 0.1 * i, 4) for i in range(9)] +
            [round(2.1 + 0.2 * i, 4) for i in range(15)] +
            [round(5.25 + 0.5 * i, 4) for i in range(10)] + [10.75] +
            [11.5 + i for i in range(9)] + [21.0 + 2 * i for i in range(15)] +
            [52.5 + 5 * i for i in range(10)] + [107.5] + [115.0 + 10 * i for i in range(9)] +
            [210.0 + 20 * i for i in range(15)] + [525.0 + 50 * i for i in range(6)])


def read_set(path):
    meta, blocks, cur = {}, {}, None
    sblock = None
    with open(path) as fh:
        for line in fh:
            line = line.strip()
            if not line:
                continue
            if line.startswith('# meta:'):
                for tok in line[len('# meta:'):].split():
                    k, v = tok.split('=', 1)
                    meta[k] = v
                continue
            if line.startswith('#'):
                continue
            if line.startswith('A '):
                cur = float(line.split()[1])
                blocks.setdefault(cur, [])
                sblock = None
                continue
            if line.startswith('S '):
                # compact block: 'S angle E_first E_step' followed by xs values only
                _, a, e0, de = line.split()
                cur = float(a)
                blocks.setdefault(cur, [])
                sblock = [float(e0), float(de), 0]
                continue
            if line.startswith('G '):
                # 'G angle E_first': xs values on the standard LANL/WNR energy grid (STD_GRID)
                _, a, e0 = line.split()
                cur = float(a)
                blocks.setdefault(cur, [])
                i0 = min(range(len(STD_GRID)), key=lambda i: abs(STD_GRID[i] - float(e0)))
                assert abs(STD_GRID[i0] - float(e0)) < 1e-6, line
                sblock = ['G', i0]
                continue
            if sblock is not None and sblock[0] == 'G':
                for tok in line.split():
                    e = STD_GRID[sblock[1]]
                    sblock[1] += 1
                    blocks[cur].append((e, float(tok) * XS_TO_MB_PER_MEV_SR, 0.0))
                continue
            if sblock is not None:
                for tok in line.split():
                    e = sblock[0] + sblock[2] * sblock[1]
                    sblock[2] += 1
                    blocks[cur].append((e, float(tok) * XS_TO_MB_PER_MEV_SR, 0.0))
                continue
            tok = [float(x) for x in line.split()[:3]]
            e, xs = tok[0], tok[1]
            dxs = tok[2] if len(tok) > 2 else 0.0
            blocks[cur].append((e, xs * XS_TO_MB_PER_MEV_SR, dxs * XS_TO_MB_PER_MEV_SR))
    for a in blocks:
        blocks[a].sort()
        # leading exact zeros mark energies below the detection threshold: not measured
        while blocks[a] and blocks[a][0][1] == 0.0:
            blocks[a].pop(0)
    return meta, blocks


def interp_e(pts, e, tail=0.0):
    """Linear interpolation of one angle's spectrum at energy e.
    Below the first point: None (not measured).  Above the last point: 0
    (measurement stops where the spectrum has fallen below sensitivity or
    above the kinematic limit)."""
    if e < pts[0][0] - 1e-9:
        return None
    if e > pts[-1][0] + 1e-9:
        return tail
    for (e0, y0, _), (e1, y1, _) in zip(pts, pts[1:]):
        if e0 - 1e-9 <= e <= e1 + 1e-9:
            if e1 == e0:
                return y0
            t = (e - e0) / (e1 - e0)
            return y0 + t * (y1 - y0)
    return pts[-1][1]


def interp_e_err(pts, e):
    if e < pts[0][0] - 1e-9 or e > pts[-1][0] + 1e-9:
        return 0.0
    best = min(pts, key=lambda p: abs(p[0] - e))
    return best[2]


def integrate_mu(angles, vals, method):
    """Integrate 2*pi * f(mu) dmu over mu in [-1, 1] and over [0, 1].
    angles in degrees (ascending), vals f(theta) in mb/(MeV sr).
    method 'lin'  : f piecewise linear in mu between measured angles,
                    held constant beyond the first/last angle.
    method 'exp'  : ln f piecewise linear in mu (f exponential in mu between
                    angles) and the outermost segments extrapolated to
                    mu = +1 and mu = -1 with their own slopes."""
    mus = [math.cos(math.radians(a)) for a in angles]
    pts = sorted(zip(mus, vals))  # ascending mu (backward angles first)
    nodes = [(-1.0, None)] + pts + [(1.0, None)]
    xs = [p[0] for p in pts]
    ys = [max(p[1], 0.0) for p in pts]

    def seg_integral(m0, f0, m1, f1, kind):
        if m1 <= m0:
            return 0.0
        if kind == 'lin' or f0 <= 0 or f1 <= 0:
            return 0.5 * (f0 + f1) * (m1 - m0)
        # exponential between (m0,f0) and (m1,f1)
        if abs(f1 - f0) < 1e-14 * max(f0, f1):
            return f0 * (m1 - m0)
        return (f1 - f0) * (m1 - m0) / math.log(f1 / f0)

    def value_at(m):
        # value used at mu = +-1 for extrapolation
        if method == 'lin' or len(xs) < 2:
            return ys[0] if m < xs[0] else ys[-1]
        if m < xs[0]:
            i0, i1 = 0, 1
        else:
            i0, i1 = len(xs) - 2, len(xs) - 1
        if ys[i0] <= 0 or ys[i1] <= 0:
            return ys[0] if m < xs[0] else ys[-1]
        slope = (math.log(ys[i1]) - math.log(ys[i0])) / (xs[i1] - xs[i0])
        ref = i0 if m < xs[0] else i1
        return math.exp(math.log(ys[ref]) + slope * (m - xs[ref]))

    full = [(-1.0, value_at(-1.0))] + list(zip(xs, ys)) + [(1.0, value_at(1.0))]
    tot = fwd = 0.0
    for (m0, f0), (m1, f1) in zip(full, full[1:]):
        seg = seg_integral(m0, f0, m1, f1, method)
        tot += seg
        # forward part (mu > 0)
        if m0 >= 0:
            fwd += seg
        elif m1 > 0:
            # split at mu = 0
            if method == 'lin' or f0 <= 0 or f1 <= 0:
                fz = f0 + (f1 - f0) * (0 - m0) / (m1 - m0)
            else:
                fz = math.exp(math.log(f0) + (math.log(f1) - math.log(f0)) * (0 - m0) / (m1 - m0))
            fwd += seg_integral(0.0, fz, m1, f1, method)
    return 2 * math.pi * tot, 2 * math.pi * fwd


def trapz(xs, ys, lo=None, hi=None):
    s = 0.0
    for (x0, y0), (x1, y1) in zip(zip(xs, ys), zip(xs[1:], ys[1:])):
        a, b = x0, x1
        if lo is not None and b <= lo:
            continue
        if hi is not None and a >= hi:
            continue
        ya, yb = y0, y1
        if lo is not None and a < lo:
            ya = y0 + (y1 - y0) * (lo - x0) / (x1 - x0)
            a = lo
        if hi is not None and b > hi:
            yb = y0 + (y1 - y0) * (hi - x0) / (x1 - x0)
            b = hi
        s += 0.5 * (ya + yb) * (b - a)
    return s


def letaw(A, E):
    """Letaw, Silberberg & Tsao 1983 proton-nucleus inelastic cross section (mb), as given in the brief."""
    return (45.0 * A ** 0.7 * (1 + 0.016 * math.sin(5.3 - 2.63 * math.log(A)))
            * (1 - 0.62 * math.exp(-E / 200.0) * math.sin(10.9 * E ** -0.28)))


def process(path, outdir):
    meta, blocks = read_set(path)
    angles = sorted(blocks)
    # common energy grid: union of all measured energies, restricted to
    # [max over angles of the lowest measured energy, max energy]
    # angles measured only at low energy (last point below PARTIAL_EMIN, e.g. a separate
    # low-energy detector) are not extrapolated to zero above their range: they are
    # simply not used there.
    lowonly = [a for a in angles if blocks[a][-1][0] < PARTIAL_EMIN]
    tail = {a: (None if a in lowonly else 0.0) for a in angles}
    full = [a for a in angles if blocks[a][0][0] <= PARTIAL_EMIN and a not in lowonly]
    partial = [a for a in angles if a not in full]
    ecut = max(blocks[a][0][0] for a in full)
    emax = max(blocks[a][-1][0] for a in angles)
    grid = sorted({round(p[0], 6) for a in angles for p in blocks[a] if p[0] >= ecut - 1e-9})
    rows = []
    for e in grid:
        use = [a for a in angles if interp_e(blocks[a], e, tail[a]) is not None]
        vals = [interp_e(blocks[a], e, tail[a]) for a in use]
        errs = [interp_e_err(blocks[a], e) for a in use]
        tl, fl = integrate_mu(use, vals, 'lin')
        tx, fx = integrate_mu(use, vals, 'exp')
        # statistical/quoted error: propagate the quoted dxs with the 'lin' weights
        # (independent errors assumed) -> approximate
        mus = [math.cos(math.radians(a)) for a in use]
        # weight of each angle in the lin rule
        order = sorted(range(len(mus)), key=lambda i: mus[i])
        w = [0.0] * len(mus)
        ms = [mus[i] for i in order]
        for k, i in enumerate(order):
            left = ms[k - 1] if k > 0 else -1.0
            right = ms[k + 1] if k < len(ms) - 1 else 1.0
            lo = (ms[k] - left) / 2 if k > 0 else (ms[k] + 1.0)
            hi = (right - ms[k]) / 2 if k < len(ms) - 1 else (1.0 - ms[k])
            w[i] = 2 * math.pi * (lo + hi)
        err = math.sqrt(sum((w[i] * errs[i]) ** 2 for i in range(len(mus))))
        row = dict(E=e, lin=tl, exp=tx, fwd_lin=fl, fwd_exp=fx, stat=err, nang=len(use))
        for a in angles:
            v = interp_e(blocks[a], e, tail[a])
            row[f'ddx_{a:g}'] = v if v is not None else float('nan')
        rows.append(row)
    es = [r['E'] for r in rows]
    res = {}
    for m in ('lin', 'exp'):
        tot = [r[m] for r in rows]
        fwd = [r['fwd_' + m] for r in rows]
        res[m] = dict(sig_cut=trapz(es, tot), sig_20=trapz(es, tot, lo=20.0),
                      fwd_cut=trapz(es, fwd), fwd_20=trapz(es, fwd, lo=20.0))
    stat_cut = math.sqrt(sum((r['stat'] * 1.0) ** 2 for r in rows))  # rough, per-point
    # Uncorrelated quoted errors integrated with trapezoid weights
    wts = []
    for i in range(len(es)):
        lo = (es[i] - es[i - 1]) / 2 if i > 0 else 0.0
        hi = (es[i + 1] - es[i]) / 2 if i < len(es) - 1 else 0.0
        wts.append(lo + hi)
    stat_cut = math.sqrt(sum((wts[i] * rows[i]['stat']) ** 2 for i in range(len(es))))
    A = int(meta['A'])
    Ein = float(meta['Ein'])
    sr = letaw(A, Ein)
    mean = {k: 0.5 * (res['lin'][k] + res['exp'][k]) for k in res['lin']}
    half = {k: 0.5 * abs(res['lin'][k] - res['exp'][k]) for k in res['lin']}
    summary = dict(file=os.path.basename(path), **meta, angles=angles, partial_angles=partial, lowonly_angles=lowonly,
                   E_cut=ecut, E_max=emax, sigma_R_letaw=sr,
                   lin=res['lin'], exp=res['exp'], mean=mean, method_halfdiff=half,
                   stat_err_sig_cut=stat_cut,
                   mult_cut=mean['sig_cut'] / sr, mult_20=mean['sig_20'] / sr,
                   fwd_share_cut=mean['fwd_cut'] / mean['sig_cut'],
                   fwd_share_20=mean['fwd_20'] / mean['sig_20'] if mean['sig_20'] > 0 else None)
    name = os.path.splitext(os.path.basename(path))[0]
    with open(os.path.join(outdir, name + '.csv'), 'w') as fh:
        fh.write('# angle-integrated neutron production spectrum from %s\n' % os.path.basename(path))
        fh.write('# target=%s E_in=%s MeV author=%s EXFOR=%s angles(deg)=%s\n' % (
            meta['target'], meta['Ein'], meta['author'], meta['entry'], ' '.join('%g' % a for a in angles)))
        fh.write('# dsig_dE in mb/MeV; lin = piecewise-linear in cos(theta), flat extrapolation to 0/180 deg;'
                 ' exp = piecewise-exponential in cos(theta), outer slopes extrapolated; stat = quoted dxs propagated (uncorrelated)\n')
        fh.write('# ddx_<angle> columns: interpolated measured DDX in mb/(MeV sr); 0 above the last measured energy of that angle; nan where that angle was not measured (not used at that energy). stat = 0 where dxs was not transcribed\n')
        cols = ['E', 'lin', 'exp', 'stat', 'fwd_lin', 'fwd_exp'] + [f'ddx_{a:g}' for a in angles]
        fh.write('E_MeV,dsig_dE_lin,dsig_dE_exp,dsig_dE_stat,fwd_dsig_dE_lin,fwd_dsig_dE_exp,' +
                 ','.join(f'ddx_{a:g}deg' for a in angles) + '\n')
        for r in rows:
            fh.write(','.join('%.6g' % r[c] for c in cols) + '\n')
    return summary


def main():
    rawdir = HERE
    outdir = os.path.join(HERE, '..', '..', '..', 'tests', 'data', 'exfor')
    os.makedirs(outdir, exist_ok=True)
    files = sys.argv[1:] or sorted(os.path.join(rawdir, f) for f in os.listdir(rawdir) if f.endswith('.txt') and f.startswith('p-'))
    allsum = [process(f, outdir) for f in files]
    with open(os.path.join(outdir, 'summary.json'), 'w') as fh:
        json.dump(allsum, fh, indent=1)
    print('%-8s %6s %-7s %-9s %-22s %7s %6s | %8s %8s %5s %6s | %7s %7s | %6s %6s %5s' % (
        'target', 'Ein', 'author', 'entry', 'angles', 'Ecut', 'Emax', 'sig>cut', '+-meth', 'stat', 'sig>20',
        'lin', 'exp', 'sigR', 'M>cut', 'fwd'))
    for s in allsum:
        print('%-8s %6s %-7s %-9s %-22s %7.3g %6.4g | %8.1f %8.1f %5.1f %6.1f | %7.1f %7.1f | %6.1f %6.2f %5.2f' % (
            s['target'], s['Ein'], s['author'], s['entry'], ','.join('%g' % a for a in s['angles']),
            s['E_cut'], s['E_max'], s['mean']['sig_cut'], s['method_halfdiff']['sig_cut'], s['stat_err_sig_cut'],
            s['mean']['sig_20'], s['lin']['sig_cut'], s['exp']['sig_cut'], s['sigma_R_letaw'], s['mult_cut'],
            s['fwd_share_cut']))


if __name__ == '__main__':
    main()
