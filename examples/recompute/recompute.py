#!/usr/bin/python3
"""Independent recomputation of the worked examples' key results.

Reads the givens (the input lines `NAME = NUMBER UNIT`, and `NAME = DATA.KEY`
for a value of a YAML data file read by `DATA = yaml("PATH")`) of each
example calc in examples/, recomputes the cycle with IAPWS-IF97 from python3-iapws
(iapws.IAPWS97), written out here without vouch, and prints one JSON object:
{example: {result name: value in SI}}. examples/examples_test.go compares
these values with vouch's own results.

Usage: /usr/bin/python3 examples/recompute/recompute.py [EXAMPLE ...]
"""

import csv
import json
import math
import os
import re
import sys

from iapws import IAPWS97

HERE = os.path.dirname(os.path.abspath(__file__))
EXAMPLES = os.path.dirname(HERE)

# SI factor of every unit the examples' givens use; degC is handled apart.
UNITS = {
    "": 1.0,
    "%": 0.01,
    "MPa": 1e6,
    "kPa": 1e3,
    "MW": 1e6,
    "kg/s": 1.0,
    "K": 1.0,
    "m": 1.0,
    "mm": 1e-3,
    "m/s": 1.0,
    "m/s^2": 1.0,
    "MJ/kg": 1e6,
}

YAML_LINE = re.compile(r'^([A-Za-z]\w*)\s*=\s*yaml\("([^"]+)"\)')
DATA_LINE = re.compile(r"^([A-Za-z]\w*)\s*=\s*([A-Za-z]\w*)\.([A-Za-z]\w*)\s*(?://.*)?$")
YAML_PAIR = re.compile(r"^([A-Za-z]\w*):\s*([^#]*?)\s*(?:#.*)?$")


def read_yaml(path):
    """Return a flat YAML file of key: NUMBER UNIT lines as {key: text}."""
    out = {}
    with open(os.path.join(EXAMPLES, path), encoding="utf-8") as f:
        for line in f:
            m = YAML_PAIR.match(line.strip())
            if m:
                out[m.group(1)] = m.group(2)
    return out


def si(name, key, num, unit):
    """A given in SI."""
    if unit == "degC":
        return num + 273.15
    if unit in UNITS:
        return num * UNITS[unit]
    raise SystemExit("%s: %s: unit %r is not in recompute.py's table" % (name, key, unit))


GIVEN = re.compile(r"^([A-Za-z]\w*)\s*=\s*([-+]?[0-9][0-9.]*(?:[eE][-+]?[0-9]+)?)\s*((?:[^/\s]|/(?!/))*)\s*(?://.*)?$")


def givens(name):
    """Return the calc's input lines as {name: value in SI}."""
    out = {}
    files = {}
    in_calc = False
    with open(os.path.join(EXAMPLES, name + ".calc.md"), encoding="utf-8") as f:
        for line in f:
            line = line.strip()
            if line.startswith("```"):
                in_calc = line == "```calc"
                continue
            if not in_calc:
                continue
            m = YAML_LINE.match(line)
            if m:
                files[m.group(1)] = read_yaml(m.group(2))
                continue
            m = DATA_LINE.match(line)
            if m and m.group(2) in files:
                text = files[m.group(2)][m.group(3)]
                num, _, unit = text.partition(" ")
                out[m.group(1)] = si(name, m.group(1), float(num), unit.strip())
                continue
            m = GIVEN.match(line)
            if not m:
                continue
            key, num, unit = m.group(1), float(m.group(2)), m.group(3)
            out[key] = si(name, key, num, unit)
    return out


class State:
    """A water/steam state in SI units (Pa, K, J/kg, J/(kg K), m^3/kg)."""

    def __init__(self, w):
        self.p = w.P * 1e6
        self.T = w.T
        self.h = w.h * 1e3
        self.s = w.s * 1e3
        self.v = w.v
        self.rho = w.rho
        self.x = w.x


def pT(p, T):
    return State(IAPWS97(P=p / 1e6, T=T))


def ps(p, s):
    return State(IAPWS97(P=p / 1e6, s=s / 1e3))


def ph(p, h):
    return State(IAPWS97(P=p / 1e6, h=h / 1e3))


def px(p, x):
    return State(IAPWS97(P=p / 1e6, x=x))


def a_ideal_rankine(g):
    s1 = pT(g["p_1"], g["T_1"])
    s2 = ps(g["p_2"], s1.s)
    s3 = px(g["p_2"], 0)
    s4 = ps(g["p_1"], s3.s)
    w_t = s1.h - s2.h
    w_p = s4.h - s3.h
    q_in = s1.h - s4.h
    q_out = s2.h - s3.h
    w_net = w_t - w_p
    m = g["W_net"] / w_net
    return {"eta_th": w_net / q_in, "w_net": w_net, "w_p": w_p, "m_dot": m, "x_2": s2.x,
            "Q_in": m * q_in, "Q_out": m * q_out}


def b_rankine_efficiencies(g):
    s1 = pT(g["p_1"], g["T_1"])
    h2s = ps(g["p_2"], s1.s).h
    h2 = s1.h - g["eta_t"] * (s1.h - h2s)
    s3 = px(g["p_2"], 0)
    h4s = ps(g["p_1"], s3.s).h
    h4 = s3.h + (h4s - s3.h) / g["eta_p"]
    w_t, w_p = s1.h - h2, h4 - s3.h
    w_net = w_t - w_p
    m = g["W_net"] / w_net
    eta_ideal = ((s1.h - h2s) - (h4s - s3.h)) / (s1.h - h4s)
    return {"eta_th": w_net / (s1.h - h4), "w_net": w_net, "m_dot": m, "x_2": ph(g["p_2"], h2).x,
            "Q_cond": m * (h2 - s3.h), "P_p": m * w_p, "eta_ideal": eta_ideal}


def c_reheat(g):
    s1 = pT(g["p_1"], g["T_1"])
    h2 = s1.h - g["eta_HP"] * (s1.h - ps(g["p_2"], s1.s).h)
    p3 = g["p_2"] * (1 - g["dp_rh"])
    s3 = pT(p3, g["T_3"])
    h4 = s3.h - g["eta_LP"] * (s3.h - ps(g["p_4"], s3.s).h)
    s5 = px(g["p_4"], 0)
    h6 = s5.h + (ps(g["p_1"], s5.s).h - s5.h) / g["eta_p"]
    w_p = h6 - s5.h
    q_in = (s1.h - h6) + (s3.h - h2)
    w_net = (s1.h - h2) + (s3.h - h4) - w_p
    m = g["W_net"] / w_net
    h4n = s1.h - g["eta_LP"] * (s1.h - ps(g["p_4"], s1.s).h)
    eta_nr = (s1.h - h4n - w_p) / (s1.h - h6)
    return {"eta_th": w_net / q_in, "w_net": w_net, "m_dot": m, "x_4": ph(g["p_4"], h4).x,
            "Q_in": m * q_in, "Q_rh": m * (s3.h - h2), "Q_cond": m * (h4 - s5.h),
            "x_4n": ph(g["p_4"], h4n).x, "eta_nr": eta_nr}


def d_open_feedwater_heater(g):
    s1 = pT(g["p_1"], g["T_1"])
    h2 = s1.h - g["eta_t1"] * (s1.h - ps(g["p_2"], s1.s).h)
    s2 = ph(g["p_2"], h2)
    h3 = h2 - g["eta_t2"] * (h2 - ps(g["p_3"], s2.s).h)
    s4 = px(g["p_3"], 0)
    h5 = s4.h + (ps(g["p_DA"], s4.s).h - s4.h) / g["eta_cp"]
    s6 = px(g["p_DA"], 0)
    h7 = s6.h + (ps(g["p_1"], s6.s).h - s6.h) / g["eta_fp"]
    y = (s6.h - h5) / (h2 - h5)  # deaerator: y h2 + (1 - y) h5 = h6
    w_t = (s1.h - h2) + (1 - y) * (h2 - h3)
    w_p = (1 - y) * (h5 - s4.h) + (h7 - s6.h)
    w_net = w_t - w_p
    m = g["W_net"] / w_net
    hfw0 = s4.h + (ps(g["p_1"], s4.s).h - s4.h) / g["eta_fp"]
    eta_0 = ((s1.h - h3) - (hfw0 - s4.h)) / (s1.h - hfw0)
    return {"y": y, "eta_th": w_net / (s1.h - h7), "w_net": w_net, "m_dot": m, "m_bleed": y * m,
            "x_3": ph(g["p_3"], h3).x, "T_7": ph(g["p_1"], h7).T,
            "Q_cond": (1 - y) * m * (h3 - s4.h), "eta_0": eta_0}


def e_closed_feedwater_heaters(g):
    eta_t = g["eta_t"]
    s1 = pT(g["p_1"], g["T_1"])
    hb1 = s1.h - eta_t * (s1.h - ps(g["p_b1"], s1.s).h)
    sb1 = ph(g["p_b1"], hb1)
    hb2 = hb1 - eta_t * (hb1 - ps(g["p_b2"], sb1.s).h)
    sb2 = ph(g["p_b2"], hb2)
    hb3 = hb2 - eta_t * (hb2 - ps(g["p_b3"], sb2.s).h)
    sb3 = ph(g["p_b3"], hb3)
    hex_ = hb3 - eta_t * (hb3 - ps(g["p_c"], sb3.s).h)
    sc = px(g["p_c"], 0)
    hci = sc.h + (ps(g["p_cp"], sc.s).h - sc.h) / g["eta_cp"]
    sat3 = px(g["p_b3"] * (1 - g["dp_b"]), 0)
    hco = pT(g["p_cp"], sat3.T - g["TTD"]).h
    hd3 = sat3.h
    hd3p = hd3 + (ps(g["p_cp"], sat3.s).h - hd3) / g["eta_dp"]
    r3 = (hco - hci) / ((hb3 - hd3) + (hco - hci))
    hmix = (1 - r3) * hco + r3 * hd3p
    sDA = px(g["p_DA"], 0)
    hfp = sDA.h + (ps(g["p_1"], sDA.s).h - sDA.h) / g["eta_fp"]
    sfp = ph(g["p_1"], hfp)
    sat1 = px(g["p_b1"] * (1 - g["dp_b"]), 0)
    sfw = pT(g["p_1"], sat1.T - g["TTD"])
    hd1 = pT(sat1.p, sfp.T + g["DCA"]).h
    y1 = (sfw.h - hfp) / (hb1 - hd1)
    # Deaerator: y2 hb2 + y1 hd1 + (1 - y1 - y2) hmix = hDA, solved for y2.
    y2 = (sDA.h - y1 * hd1 - (1 - y1) * hmix) / (hb2 - hmix)
    y3 = r3 * (1 - y1 - y2)
    yc = 1 - y1 - y2 - y3
    w_t = (s1.h - hb1) + (1 - y1) * (hb1 - hb2) + (1 - y1 - y2) * (hb2 - hb3) + yc * (hb3 - hex_)
    w_p = (hfp - sDA.h) + yc * (hci - sc.h) + y3 * (hd3p - hd3)
    w_net = w_t - w_p
    m = g["W_net"] / w_net
    return {"y_1": y1, "y_2": y2, "y_3": y3, "y_c": yc, "eta_th": w_net / (s1.h - sfw.h), "w_net": w_net,
            "m_dot": m, "x_ex": ph(g["p_c"], hex_).x, "T_fw": sfw.T, "Q_cond": m * yc * (hex_ - sc.h)}


def f_supercritical_reheat(g):
    def cycle(p1):
        s1 = pT(p1, g["T_1"])
        h2 = s1.h - g["eta_HP"] * (s1.h - ps(g["p_2"], s1.s).h)
        s3 = pT(g["p_2"] * (1 - g["dp_rh"]), g["T_3"])
        h4 = s3.h - g["eta_LP"] * (s3.h - ps(g["p_4"], s3.s).h)
        s5 = px(g["p_4"], 0)
        h6 = s5.h + (ps(p1, s5.s).h - s5.h) / g["eta_p"]
        w_net = (s1.h - h2) + (s3.h - h4) - (h6 - s5.h)
        q_in = (s1.h - h6) + (s3.h - h2)
        return w_net, q_in, h4 - s5.h, h6 - s5.h, ph(g["p_4"], h4).x, ph(g["p_2"], h2).T

    w_net, q_in, q_out, w_p, x4, T2 = cycle(g["p_1"])
    m = g["W_net"] / w_net
    w_sub, q_sub = cycle(g["p_sub"])[:2]
    return {"eta_th": w_net / q_in, "w_net": w_net, "m_dot": m, "x_4": x4, "T_2": T2, "Q_in": m * q_in,
            "Q_cond": m * q_out, "P_p": m * w_p, "eta_sub": w_sub / q_sub}


def interp_curve(path, xname, x, yname):
    """Linear interpolation in a CSV whose header names columns as 'NAME [UNIT]'."""
    with open(path, encoding="utf-8") as f:
        rows = [r for r in csv.reader(line for line in f if not line.startswith("#"))]
    names = [h.split("[")[0].strip() for h in rows[0]]
    xs = [float(r[names.index(xname)]) for r in rows[1:]]
    ys = [float(r[names.index(yname)]) for r in rows[1:]]
    for i in range(len(xs) - 1):
        if xs[i] <= x <= xs[i + 1]:
            return ys[i] + (ys[i + 1] - ys[i]) * (x - xs[i]) / (xs[i + 1] - xs[i])
    raise SystemExit("%s: %s = %g is outside the table" % (path, xname, x))


def g_condenser_cooling_water(g):
    curve = os.path.join(EXAMPLES, "data", "ashcombe-condenser-curve.csv")
    p_cond = 1e3 * interp_curve(curve, "T_cw", g["T_cw_in"] - 273.15, "p_cond")  # columns in degC and kPa
    sat = px(p_cond, 0)
    sLP = pT(g["p_LP"], g["T_LP"])
    hex_ = sLP.h - g["eta_LP"] * (sLP.h - ps(p_cond, sLP.s).h)
    hdr = pT(g["p_dr"], g["T_dr"]).h
    Q_dr = g["m_dr"] * (hdr - sat.h)
    Q = g["m_ex"] * (hex_ - sat.h) + Q_dr
    T_out = g["T_cw_in"] + g["Delta_T_cw"]
    cin = pT(g["p_cw"], g["T_cw_in"])
    m_cw = Q / (pT(g["p_cw"], T_out).h - cin.h)
    V_cw = m_cw / cin.rho
    d_i = g["d_o"] - 2 * g["t_w"]
    v_tube = V_cw / (g["N_t"] * math.pi * d_i ** 2 / 4)
    ttd = sat.T - T_out
    itd = sat.T - g["T_cw_in"]
    lmtd = g["Delta_T_cw"] / math.log(itd / ttd)
    return {"p_cond": p_cond, "x_ex": ph(p_cond, hex_).x, "Q_dr": Q_dr, "Q_cond": Q, "m_cw": m_cw, "V_cw": V_cw,
            "v_tube": v_tube, "TTD": ttd, "LMTD": lmtd, "UA": Q / lmtd}


def h_unit_heat_rate(g):
    m = g["m_dot"]
    s1 = pT(g["p_1"], g["T_1"])
    h2 = s1.h - g["eta_HP"] * (s1.h - ps(g["p_2"], s1.s).h)
    s3 = pT(g["p_3"], g["T_3"])
    hb = s3.h - g["eta_IP"] * (s3.h - ps(g["p_b"], s3.s).h)
    sb = ph(g["p_b"], hb)
    h4 = hb - g["eta_LP"] * (hb - ps(g["p_4"], sb.s).h)
    s5 = px(g["p_4"], 0)
    h6 = s5.h + (ps(g["p_6"], s5.s).h - s5.h) / g["eta_cp"]
    s7 = px(g["p_DA"], 0)
    y = (s7.h - h6) / (hb - h6)  # deaerator: y hb + (1 - y) h6 = h7
    p7a = g["p_DA"] + s7.rho * g["g_n"] * g["H_suc"]
    s7a = ph(p7a, s7.h)
    w_fp = (ps(g["p_8"], s7a.s).h - s7.h) / g["eta_fp"]
    h8 = s7.h + w_fp
    H_fp = (g["p_8"] - p7a) / (s7a.rho * g["g_n"])
    P_fp_el = m * w_fp / (g["eta_vsd"] * g["eta_mot"])
    W_t = m * (s1.h - h2) + m * (s3.h - hb) + (1 - y) * m * (hb - h4)
    P_gross = g["eta_gen"] * W_t
    P_cp_el = (1 - y) * m * (h6 - s5.h) / g["eta_cpm"]
    P_net = P_gross - P_fp_el - P_cp_el - g["P_aux_other"]
    Q_steam = m * ((s1.h - h8) + (s3.h - h2))
    Q_fuel = Q_steam / g["eta_b"]
    return {"y": y, "x_4": ph(g["p_4"], h4).x, "p_7a": p7a, "w_fp": w_fp, "H_fp": H_fp, "P_fp_el": P_fp_el,
            "W_t": W_t, "P_gross": P_gross, "P_net": P_net, "Q_steam": Q_steam, "m_fuel": Q_fuel / g["NCV"],
            "HR_tc": Q_steam / P_gross, "HR_net": Q_fuel / P_net, "eta_net": P_net / Q_fuel,
            "Q_cond": (1 - y) * m * (h4 - s5.h)}


CASES = {
    "a-ideal-rankine": a_ideal_rankine,
    "b-rankine-efficiencies": b_rankine_efficiencies,
    "c-reheat": c_reheat,
    "d-open-feedwater-heater": d_open_feedwater_heater,
    "e-closed-feedwater-heaters": e_closed_feedwater_heaters,
    "f-supercritical-reheat": f_supercritical_reheat,
    "g-condenser-cooling-water": g_condenser_cooling_water,
    "h-unit-heat-rate": h_unit_heat_rate,
}


def main(argv):
    names = argv[1:] or sorted(CASES)
    out = {}
    for name in names:
        if name not in CASES:
            raise SystemExit("unknown example %s; known: %s" % (name, ", ".join(sorted(CASES))))
        out[name] = CASES[name](givens(name))
    json.dump(out, sys.stdout, indent=1, sort_keys=True)
    sys.stdout.write("\n")


if __name__ == "__main__":
    main(sys.argv)
