"""Steady states of a first-order exothermic liquid stirred tank (A -> B in a solvent S) for
tests/reference/thermal-cstr.test.ts, found independently of rateloom with SciPy brentq.

  X(T) = tau k(T) / (1 + tau k(T)),  k(T) = k_ref exp(-E/R (1/T - 1/T_ref)),  tau = V / v0
  G(T) = (-dH) F_A0 X(T)                       (dH constant: all heat capacities equal dCp = 0)
  R(T) = (sum_j F_j0 Cp_j) (T - T0) + UA (T - Ta)
Every sign change of G - R on a fine grid (20,000 intervals over [T_lo, T_hi]) is refined by brentq
(xtol 1e-12); the slope condition dR/dT > dG/dT marks the stable states.
Run: python3 tests/reference/scipy/cstr_heat.py   (writes cstr_heat.json beside it)
"""
import json
import os

import numpy as np
import scipy
from scipy.optimize import brentq

R = 8.314462618
P = {
    "T0": 300.0, "Ta": 300.0, "UA": 2000.0, "V": 1.0, "v0": 1.0e-3, "FA0": 2.0, "FS0": 50.0,
    "cpA": 150.0, "cpB": 150.0, "cpS": 75.0, "dH": -1.5e5, "E": 1.0e5, "T_ref": 300.0, "k_ref": 5.0e-5,
    "range": [299.0, 1100.0],
}


def h_parts(T):
    tau = P["V"] / P["v0"]
    k = P["k_ref"] * np.exp(-P["E"] / R * (1.0 / T - 1.0 / P["T_ref"]))
    X = tau * k / (1.0 + tau * k)
    G = -P["dH"] * P["FA0"] * X
    cpF = P["FA0"] * P["cpA"] + P["FS0"] * P["cpS"]
    Rm = cpF * (T - P["T0"]) + P["UA"] * (T - P["Ta"])
    return G, Rm, X


def h(T):
    G, Rm, _ = h_parts(T)
    return G - Rm


def main():
    grid = np.linspace(P["range"][0], P["range"][1], 20001)
    vals = [h(t) for t in grid]
    roots = []
    for a, b, fa, fb in zip(grid[:-1], grid[1:], vals[:-1], vals[1:]):
        if fa == 0.0:
            roots.append(float(a))
        elif fa * fb < 0.0:
            roots.append(brentq(h, a, b, xtol=1e-12))
    states = []
    for T in roots:
        d = 1e-4 * T
        gu, ru, _ = h_parts(T + d)
        gd, rd, _ = h_parts(T - d)
        _, _, X = h_parts(T)
        states.append({"T": T, "X": X, "stable": bool((ru - rd) > (gu - gd))})
    out = {"scipy": scipy.__version__, "R": R, "params": P, "steady_states": states}
    path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "cstr_heat.json")
    with open(path, "w") as fh:
        json.dump(out, fh, indent=1)
    print(states)


if __name__ == "__main__":
    main()
