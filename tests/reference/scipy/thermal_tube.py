"""Reference profiles of a cooled gas-phase packed bed (first-order exothermic A -> B with inert I)
for tests/reference/thermal-scipy.test.ts.

The balances are written out here independently of rateloom:
  C_A = C_T0 (F_A/F_T) p (T0/T),  C_T0 = P0/(R T0),  r' = k(T) C_A,  k(T) = k_ref exp(-E/R (1/T - 1/T_ref))
  dF_A/dW = -r',  dF_B/dW = r',  dF_I/dW = 0
  dT/dW  = [Ua (Ta - T) + (-dH(T)) r'] / sum_j F_j Cp_j,   dH(T) = dH_ref + dCp (T - T_refH)
  dTa/dW = +Ua (T - Ta)/(m_c Cp_c) (co-current), -Ua (T - Ta)/(m_c Cp_c) (counter-current)
  dp/dW  = -alpha/(2p) (F_T/F_T0) (T/T0)
Constant coolant and co-current: solve_ivp (Radau, rtol 1e-12), segment by segment between the
reported points. Counter-current (Ta(W_end) = Ta_in): solve_bvp (tol 1e-8), started from the
constant-coolant profile.
Run: python3 tests/reference/scipy/thermal_tube.py   (writes thermal_tube.json beside it)
"""
import json
import os

import numpy as np
import scipy
from scipy.integrate import solve_bvp, solve_ivp

R = 8.314462618
BASE = {
    "T0": 600.0, "P0": 2.0e5, "feed": [0.01, 0.0, 0.09], "Tref": 600.0,
    "k_ref": 1.2e-3, "E": 1.0e5, "dH_ref": -8.0e4, "T_refH": 298.15,
    "cp": [40.0, 50.0, 30.0], "Ua": 15.0, "W": 3.0,
}
CASES = {
    "constant": dict(BASE, mode="constant-coolant", Ta=590.0, alpha=0.0, mcp=None),
    "cocurrent": dict(BASE, mode="co-current", Ta=590.0, alpha=0.05, mcp=20.0),
    "counter": dict(BASE, mode="counter-current", Ta=590.0, alpha=0.0, mcp=20.0),
}


def rhs_factory(c):
    cT0 = c["P0"] / (R * c["T0"])
    FT0 = sum(c["feed"])
    dcp = c["cp"][1] - c["cp"][0]

    def f(W, y):
        FA, FB, FI, T, Ta, p = y
        FT = FA + FB + FI
        CA = cT0 * FA / FT * p * c["T0"] / T
        k = c["k_ref"] * np.exp(-c["E"] / R * (1.0 / T - 1.0 / c["Tref"]))
        r = k * CA
        dH = c["dH_ref"] + dcp * (T - c["T_refH"])
        cpF = FA * c["cp"][0] + FB * c["cp"][1] + FI * c["cp"][2]
        ta = c["Ta"] if c["mode"] == "constant-coolant" else Ta
        dT = (c["Ua"] * (ta - T) - dH * r) / cpF
        if c["mode"] == "constant-coolant":
            dTa = 0.0 * T
        else:
            dTa = c["Ua"] * (T - Ta) / c["mcp"] * (1.0 if c["mode"] == "co-current" else -1.0)
        dp = -c["alpha"] / (2.0 * p) * (FT / FT0) * (T / c["T0"])
        return np.array([-r, r, 0.0 * r, dT, dTa, dp])

    return f


def ivp(c, pts):
    f = rhs_factory(c)
    y = np.array(c["feed"] + [c["T0"], c["Ta"], 1.0])
    out = []
    w0 = 0.0
    for w in pts:
        if w > w0:
            s = solve_ivp(f, (w0, w), y, method="Radau", rtol=1e-12, atol=[1e-16, 1e-16, 1e-16, 1e-10, 1e-10, 1e-13])
            assert s.success
            y = s.y[:, -1]
            w0 = w
        out.append(y.tolist())
    return out


def bvp(c, pts):
    f = rhs_factory(c)

    def bc(ya, yb):
        return np.array([ya[0] - c["feed"][0], ya[1] - c["feed"][1], ya[2] - c["feed"][2], ya[3] - c["T0"], yb[4] - c["Ta"], ya[5] - 1.0])

    # initial guess: the constant-coolant profile (Ta held at its inlet value) on the mesh
    mesh = np.linspace(0.0, c["W"], 301)
    guess = np.array(ivp(dict(c, mode="constant-coolant"), mesh.tolist())).T
    s = solve_bvp(f, bc, mesh, guess, tol=1e-8, bc_tol=1e-10, max_nodes=100000)
    assert s.success, s.message
    return [s.sol(w).tolist() for w in pts], float(np.max(np.abs(s.rms_residuals)))


def main():
    pts = [round(0.1 * i, 10) for i in range(31)]
    out = {"scipy": scipy.__version__, "R": R, "W_points": pts, "cases": {}}
    for name, c in CASES.items():
        entry = {k: v for k, v in c.items()}
        if c["mode"] == "counter-current":
            prof, res = bvp(c, pts)
            entry["bvp_max_rms_residual"] = res
        else:
            prof = ivp(c, pts)
        entry["profile"] = prof
        out["cases"][name] = entry
    path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "thermal_tube.json")
    with open(path, "w") as fh:
        json.dump(out, fh, indent=1)


if __name__ == "__main__":
    main()
