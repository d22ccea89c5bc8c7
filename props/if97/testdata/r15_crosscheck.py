#!/usr/bin/python3
"""Cross-check helper for props/if97 (run by TestSaturatedConductivityPythonIAPWS).

Reads lines "T_K rho_kg_m3 p_Pa region" from standard input, where region is the IF97 basic
equation the state lies on (1, 2 or 3), and prints per line the thermal conductivity in W/(m K)
from Debian's python3-iapws: _ThCond (IAPWS R15-11, industrial form of the critical
enhancement) with cp, cv and (d rho/d p)_T from its own IF97 region functions (_Region1 or
_Region2 at (T, p), _Region3 at (rho, T)) and mu from its _Viscosity (R12-08 without the
critical enhancement). Prints "nan" where it fails. Exit status 3 if the module cannot be
imported.
"""
import sys

try:
    from iapws import iapws97
    from iapws._iapws import _ThCond, _Viscosity
except Exception:
    sys.exit(3)


class Phase:
    """The phase properties _ThCond reads for its critical enhancement."""


for line in sys.stdin:
    f = line.split()
    T, rho, p, region = float(f[0]), float(f[1]), float(f[2]), int(f[3])
    try:
        if region == 3:
            r = iapws97._Region3(rho, T)
        elif region == 1:
            r = iapws97._Region1(T, p * 1e-6)
        else:
            r = iapws97._Region2(T, p * 1e-6)
        fase = Phase()
        fase.cp = r["cp"]
        fase.cp_cv = r["cp"] / r["cv"]
        fase.drhodP_T = rho * r["kt"]
        fase.mu = _Viscosity(rho, T)
        print("%.17g" % _ThCond(rho, T, fase))
    except Exception:
        print("nan")
