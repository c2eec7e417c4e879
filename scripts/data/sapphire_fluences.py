#!/usr/bin/env python3
"""Integral fluences of the SAPPHIRE design events, independently of crewdose's C++ code.

The numbers tests/unit/event_library_test.cpp checks crewdose's `band-differential` spectra
against. Source of the form and the parameters: Jiggens et al. 2018, "Updated Model of the
Solar Energetic Proton Environment in Space", J. Space Weather Space Clim. 8, A31,
doi:10.1051/swsc/2018010, Table 8 (event-integrated fluence columns), as transcribed in the
public repository drflei/sapphire-event-spectra at commit
f7cc9a6e5eba56da9007cfc053a3ed2bc19de6ec (files sapphire_event_spectra/spectra.py and core.py;
read there, not checked against the paper). The form, differential in rigidity R (GV), per
steradian:
    dJ/dR = C R^-ga exp(-R/R0)                              R <= Rb = (gb - ga) R0
    dJ/dR = C R^-gb Rb^(gb - ga) exp(ga - gb)                R > Rb
with gb = 5.7 for every event. Omnidirectional = 4 pi x per steradian (isotropy).

J(>E) = 4 pi integral_{R(E)}^inf dJ/dR dR is evaluated two ways with mpmath (30 digits):
  closed form: C R0^(1-ga) [Gamma(1-ga, R/R0) - Gamma(1-ga, Rb/R0)] + C Rb^(1-ga) e^(ga-gb) / (gb-1)
  quadrature:  mpmath.quad of dJ/dR over [R, Rb] and [Rb, inf]
and the script stops if they differ by more than 1e-12. Proton rest energy 938.272 MeV, as in
the transcription; R = sqrt(E^2 + 2 E m) / 1000 GV.

Usage: python3 scripts/data/sapphire_fluences.py   (needs mpmath; prints a table)
"""
import mpmath as mp

mp.mp.dps = 30

M_P_MEV = mp.mpf("938.272")
GB = mp.mpf("5.7")
# (our id, return period in years, ga, R0 in GV, C per cm2 sr GV): Table 8, event-integrated
# fluence, as transcribed (see above).
EVENTS = [
    ("design-10yr", 10, "0.85", "7.22e-2", "1.33e10"),
    ("design-20yr", 20, "0.71", "7.01e-2", "2.81e10"),
    ("design-50yr", 50, "0.56", "6.81e-2", "5.85e10"),
    ("design-100yr", 100, "0.48", "6.71e-2", "8.73e10"),
    ("design-300yr", 300, "0.38", "6.58e-2", "1.45e11"),
    ("design-1000yr", 1000, "0.315", "6.50e-2", "2.14e11"),
    ("design-10000yr", 10000, "0.195", "6.36e-2", "3.95e11"),
]
ENERGIES_MEV = [10, 30, 100]


def rigidity_gv(e_mev):
    e = mp.mpf(e_mev)
    return mp.sqrt(e * e + 2 * e * M_P_MEV) / 1000


def per_sr_closed(r, ga, r0, c):
    rb = (GB - ga) * r0
    tail_from = max(r, rb)
    tail = c * rb ** (GB - ga) * mp.exp(ga - GB) * tail_from ** (1 - GB) / (GB - 1)
    if r >= rb:
        return tail
    low = c * r0 ** (1 - ga) * mp.gammainc(1 - ga, r / r0, rb / r0)
    return low + tail


def per_sr_quad(r, ga, r0, c):
    rb = (GB - ga) * r0

    def djdr(x):
        if x <= rb:
            return c * x ** (-ga) * mp.exp(-x / r0)
        return c * x ** (-GB) * rb ** (GB - ga) * mp.exp(ga - GB)

    if r >= rb:
        return mp.quad(djdr, [r, mp.inf])
    return mp.quad(djdr, [r, rb]) + mp.quad(djdr, [rb, 2 * rb, mp.inf])


def main():
    print("id,return_period_years,J_above_10MeV_per_cm2,J_above_30MeV_per_cm2,"
          "J_above_100MeV_per_cm2")
    for ident, years, ga, r0, c in EVENTS:
        ga, r0, c = mp.mpf(ga), mp.mpf(r0), mp.mpf(c)
        row = []
        for e in ENERGIES_MEV:
            r = rigidity_gv(e)
            a = per_sr_closed(r, ga, r0, c)
            b = per_sr_quad(r, ga, r0, c)
            if abs(a - b) > mp.mpf("1e-12") * abs(a):
                raise SystemExit(f"{ident} J(>{e} MeV): closed form {a} and quadrature {b} differ")
            row.append(4 * mp.pi * a)
        print(f"{ident},{years}," + ",".join(mp.nstr(j, 6) for j in row))


if __name__ == "__main__":
    main()
