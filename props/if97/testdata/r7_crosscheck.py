#!/usr/bin/python3
"""Cross-check helper for props/if97 (run by TestCrossCheckPythonIAPWS).

Reads lines "p_Pa T_K" from standard input and prints, per line, "v h s cp w" in SI units
computed by Debian's python3-iapws (module iapws, class IAPWS97), or "nan" fields where it
fails. Exit status 3 if the module cannot be imported.
"""
import sys

try:
    from iapws import IAPWS97
except Exception:
    sys.exit(3)

for line in sys.stdin:
    p, T = (float(x) for x in line.split())
    try:
        st = IAPWS97(P=p * 1e-6, T=T)
        print("%.17g %.17g %.17g %.17g %.17g" % (st.v, st.h * 1e3, st.s * 1e3, st.cp * 1e3, st.w))
    except Exception:
        print("nan nan nan nan nan")
