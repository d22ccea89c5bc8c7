#!/usr/bin/python3
"""Independent check of vouch's uncertainty propagation on a steam cycle.

A simple Rankine cycle with uncertain main steam pressure and temperature,
condenser pressure, turbine efficiency and steam flow (the same figures as
the calc in examples/uncert_test.go), computed with IAPWS-IF97 from
python3-iapws (iapws.IAPWS97), written out here without vouch. Sensitivity
coefficients by central differences (step: a hundredth of the standard
uncertainty), combined with the correlation of the two pressures by the law
of propagation (JCGM 100, 5.2.2). Prints one JSON object:
{"eta": [value, u], "P": [value, u]} in SI units.

Usage: /usr/bin/python3 examples/recompute/uncert_crosscheck.py
"""

import json
import math

from iapws import IAPWS97

# name: (value, standard uncertainty), SI-based units the library takes
# (MPa, K, kg/s); the calc states them as the comments say.
X = {
    "p_1": (12.0, 0.05),           # 12 MPa ± 0.05 MPa
    "T_1": (813.15, 1.0 / 2),      # 540 degC ± 1 K (k=2)
    "p_c": (0.008, 0.0001),        # 8 kPa ± 0.1 kPa
    "eta_t": (0.85, 0.01 / math.sqrt(3)),  # 0.85 ± 0.01 rect
    "m_dot": (100.0, 0.5),         # 100 kg/s ± 0.5 kg/s
}
CORR = {("p_1", "p_c"): 0.3}


def cycle(x):
    """Thermal efficiency and net power [W] of the cycle."""
    s1 = IAPWS97(P=x["p_1"], T=x["T_1"])
    s2s = IAPWS97(P=x["p_c"], s=s1.s)
    h2 = s1.h - x["eta_t"] * (s1.h - s2s.h)
    s3 = IAPWS97(P=x["p_c"], x=0)
    s4 = IAPWS97(P=x["p_1"], s=s3.s)
    w_net = (s1.h - h2) - (s4.h - s3.h)
    q_in = s1.h - s4.h
    return {"eta": w_net / q_in, "P": x["m_dot"] * w_net * 1e3}


def main():
    base = {k: v for k, (v, _) in X.items()}
    y0 = cycle(base)
    c = {}
    for k, (v, u) in X.items():
        h = u / 100
        up, dn = dict(base), dict(base)
        up[k], dn[k] = v + h, v - h
        yu, yd = cycle(up), cycle(dn)
        c[k] = {r: (yu[r] - yd[r]) / (2 * h) for r in y0}
    out = {}
    names = list(X)
    for r in y0:
        var = 0.0
        for i in names:
            for j in names:
                rij = 1.0 if i == j else CORR.get((i, j), CORR.get((j, i), 0.0))
                var += c[i][r] * c[j][r] * X[i][1] * X[j][1] * rij
        out[r] = [y0[r], math.sqrt(var)]
    print(json.dumps(out))


main()
