"""Reference profiles of isothermal gas-phase packed beds for tests/reference/reactors-scipy.test.ts.

Integrated by SciPy solve_ivp (Radau, rtol 1e-11, tight atol), segment by segment between the
profile points so every reported point is a step end (no dense-output interpolation error).
A second integration with LSODA is recorded as a cross-check of the reference itself.
The balances are written out here independently of rateloom:
  dF_j/dW = sum_i nu_ij r_i,  dp/dW = -alpha/(2p) F_T/F_T0,  C_j = C_T0 F_j/F_T p,  C_T0 = P0/(R T).
Run: /usr/bin/python3 tests/reference/scipy/reactors_multi.py   (writes reactors_multi.json beside it)
"""
import json
import os

import numpy as np
import scipy
from scipy.integrate import solve_ivp

R = 8.314462618

CASES = {
    # A + B <=> C (r1 = k1 (C_A C_B - C_C / K1)), C -> D (r2 = k2 C_C), inert I; pressure drop
    "multi": {
        "species": ["A", "B", "C", "D", "I"],
        "T": 500.0,
        "P0": 5.0e5,
        "feed": [1.0, 1.2, 0.0, 0.0, 0.8],
        "W": 50.0,
        "alpha": 0.012,
        "params": {"k1": 1.0e-5, "K1": 0.05, "k2": 5.0e-4},
    },
    # fast A <=> B (r1 = k1 (C_A - C_B / K1)) beside slow B -> C (r2 = k2 C_B), inert I; pressure drop
    "stiff": {
        "species": ["A", "B", "C", "I"],
        "T": 450.0,
        "P0": 3.0e5,
        "feed": [1.0, 0.0, 0.0, 1.0],
        "W": 100.0,
        "alpha": 0.004,
        "params": {"k1": 50.0, "K1": 1.5, "k2": 2.0e-4},
    },
}


def rates(name, C, prm):
    if name == "multi":
        A, B, Cc, D, I = C
        r1 = prm["k1"] * (max(A, 0) * max(B, 0) - max(Cc, 0) / prm["K1"])
        r2 = prm["k2"] * max(Cc, 0)
        return np.array([-r1, -r1, r1 - r2, r2, 0.0])
    A, B, Cc, I = C
    r1 = prm["k1"] * (max(A, 0) - max(B, 0) / prm["K1"])
    r2 = prm["k2"] * max(B, 0)
    return np.array([-r1, r1 - r2, r2, 0.0])


def make_rhs(name, case):
    cT0 = case["P0"] / (R * case["T"])
    FT0 = sum(case["feed"])
    n = len(case["species"])

    def rhs(_w, y):
        F = y[:n]
        p = y[n]
        FT = F.sum()
        C = cT0 * F / FT * p
        dF = rates(name, C, case["params"])
        dp = -case["alpha"] / (2 * p) * FT / FT0
        return np.concatenate([dF, [dp]])

    return rhs


def run(name, case, method, points):
    rhs = make_rhs(name, case)
    y = np.array(case["feed"] + [1.0])
    rows = [y.tolist()]
    atol = np.concatenate([np.full(len(case["feed"]), 1e-14 * sum(case["feed"])), [1e-14]])
    for a, b in zip(points[:-1], points[1:]):
        sol = solve_ivp(rhs, (a, b), y, method=method, rtol=1e-11, atol=atol)
        assert sol.success, sol.message
        y = sol.y[:, -1]
        rows.append(y.tolist())
    return rows


out = {"scipy": scipy.__version__, "numpy": np.__version__, "R": R, "cases": {}}
for name, case in CASES.items():
    points = np.linspace(0.0, case["W"], 21).tolist()
    radau = run(name, case, "Radau", points)
    lsoda = run(name, case, "LSODA", points)
    diff = max(abs(a - b) / max(abs(a), 1e-12) for ra, rl in zip(radau, lsoda) for a, b in zip(ra, rl) if abs(a) > 1e-9)
    out["cases"][name] = {
        **case,
        "W_points": points,
        "profile": [{"F": r[:-1], "p": r[-1]} for r in radau],
        "radau_vs_lsoda_max_rel_diff": diff,
    }

here = os.path.dirname(os.path.abspath(__file__))
with open(os.path.join(here, "reactors_multi.json"), "w") as fh:
    json.dump(out, fh, indent=1)
print(json.dumps({k: v["radau_vs_lsoda_max_rel_diff"] for k, v in out["cases"].items()}), out["scipy"])
