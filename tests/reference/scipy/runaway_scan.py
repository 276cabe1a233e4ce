"""Critical coolant temperature of a cooled packed bed (first-order exothermic A -> B with inert I,
the "constant" case of thermal_tube.py) by the generalized parametric-sensitivity criterion,
computed independently of rateloom for tests/reference/thermal-runaway.test.ts.

For each coolant temperature Ta on a 0.05 K grid, the hot spot T* is the largest temperature along
the bed: solve_ivp (Radau, rtol 1e-10) with an event at dT/dW = 0 and the outlet value. The normalized
sensitivity S = (Ta/T*) dT*/dTa is taken by central differences on the grid; the critical coolant
temperature is the grid point of largest S.
Run: python3 tests/reference/scipy/runaway_scan.py   (writes runaway_scan.json beside it)
"""
import json
import os

import numpy as np
import scipy
from scipy.integrate import solve_ivp

R = 8.314462618
C = {"T0": 600.0, "P0": 2.0e5, "feed": [0.01, 0.0, 0.09], "Tref": 600.0, "k_ref": 1.2e-3, "E": 1.0e5,
     "dH_ref": -8.0e4, "T_refH": 298.15, "cp": [40.0, 50.0, 30.0], "Ua": 15.0, "W": 3.0}
SCAN = (560.0, 640.0, 0.05)


def hot_spot(Ta):
    cT0 = C["P0"] / (R * C["T0"])
    dcp = C["cp"][1] - C["cp"][0]

    def f(W, y):
        FA, FB, FI, T = y
        FT = FA + FB + FI
        CA = cT0 * FA / FT * C["T0"] / T
        r = C["k_ref"] * np.exp(-C["E"] / R * (1.0 / T - 1.0 / C["Tref"])) * CA
        dH = C["dH_ref"] + dcp * (T - C["T_refH"])
        cpF = FA * C["cp"][0] + FB * C["cp"][1] + FI * C["cp"][2]
        return [-r, r, 0.0, (C["Ua"] * (Ta - T) - dH * r) / cpF]

    def peak(W, y):
        return f(W, y)[3]

    peak.direction = -1
    s = solve_ivp(f, (0.0, C["W"]), C["feed"] + [C["T0"]], method="Radau", rtol=1e-10, atol=[1e-15, 1e-15, 1e-15, 1e-9], events=peak)
    assert s.success
    temps = [C["T0"], s.y[3, -1]] + [float(e[3]) for e in s.y_events[0]]
    return max(temps)


def main():
    grid = np.arange(SCAN[0], SCAN[1] + 1e-9, SCAN[2])
    hot = np.array([hot_spot(t) for t in grid])
    S = grid[1:-1] / hot[1:-1] * (hot[2:] - hot[:-2]) / (2 * SCAN[2])
    i = int(np.argmax(S))
    out = {"scipy": scipy.__version__, "case": C, "scan": SCAN, "critical_coolant_temperature": float(grid[1 + i]),
           "max_sensitivity": float(S[i]), "hot_spot_at_critical": float(hot[1 + i]),
           "sample": {"Ta": grid[::100].tolist(), "hot_spot": hot[::100].tolist()}}
    path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "runaway_scan.json")
    with open(path, "w") as fh:
        json.dump(out, fh, indent=1)
    print(out["critical_coolant_temperature"], out["max_sensitivity"])


if __name__ == "__main__":
    main()
