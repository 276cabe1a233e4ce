"""Non-isothermal lab reactors for tests/study/simulate-heat.test.ts, solved independently of
rateloom with SciPy solve_ivp (Radau, rtol 1e-11): a first-order exothermic liquid reaction
A -> B in an inert solvent S,

  k(T)   = k_ref exp(-E/R (1/T - 1/T_ref))
  dH(T)  = dH_ref + (cp_B - cp_A) (T - T_h)              (Kirchhoff, constant heat capacities)

1. Plug flow in volume V with the coolant at a constant temperature and with co-current coolant:
     dF_A/dV = -k C_A,  dF_B/dV = k C_A,  C_A = F_A / v0
     dT/dV   = [Ua (Ta - T) - dH(T) k C_A] / (F_A cp_A + F_B cp_B + F_S cp_S),  Ua = 4 U / D
     dTa/dV  = Ua (T - Ta) / (m_c cp_c)                 (co-current only)
2. Batch vessel of volume V0 with a jacket at Ta (UA = U times the area):
     dN_A/dt = -k N_A,  dT/dt = [UA (Ta - T) - dH(T) k N_A] / (N_A cp_A + N_B cp_B + N_S cp_S)
The hottest point is found on a 20,001-point grid of the dense output and refined where dT/dx = 0
by brentq on the dense solution.
Run: python3 tests/reference/scipy/simulate_heat.py   (writes simulate_heat.json beside it)
"""
import json
import os

import numpy as np
import scipy
from scipy.integrate import solve_ivp
from scipy.optimize import brentq

R = 8.314462618
P = {
    "k_ref": 5.0e-5, "E": 1.0e5, "T_ref": 300.0, "dH": -1.5e5, "T_h": 298.15,
    "cpA": 150.0, "cpB": 160.0, "cpS": 75.0,
    "tube": {"FA0": 2.0, "FS0": 50.0, "v0": 1.0e-3, "T0": 330.0, "Ta": 320.0, "U": 500.0, "D": 0.05,
             "V": 1.0, "mc": 1.0, "cpc": 4180.0},
    "batch": {"V0": 1.0, "CA0": 2000.0, "CS0": 50000.0, "T0": 330.0, "Ta": 320.0, "U": 500.0,
              "area": 10.0, "t_end": 1800.0},
}


def k(T):
    return P["k_ref"] * np.exp(-P["E"] / R * (1.0 / T - 1.0 / P["T_ref"]))


def dH(T):
    return P["dH"] + (P["cpB"] - P["cpA"]) * (T - P["T_h"])


def tube_rhs(_V, y, co):
    t = P["tube"]
    FA, FB, T = y[0], y[1], y[2]
    Ta = y[3] if co else t["Ta"]
    r = k(T) * FA / t["v0"]
    Ua = 4.0 * t["U"] / t["D"]
    cp = FA * P["cpA"] + FB * P["cpB"] + t["FS0"] * P["cpS"]
    d = [-r, r, (Ua * (Ta - T) - dH(T) * r) / cp]
    if co:
        d.append(Ua * (T - Ta) / (t["mc"] * t["cpc"]))
    return d


def batch_rhs(_t, y):
    b = P["batch"]
    NA, NB, T = y
    r = k(T) * NA
    UA = b["U"] * b["area"]
    cp = NA * P["cpA"] + NB * P["cpB"] + b["CS0"] * b["V0"] * P["cpS"]
    return [-r, r, (UA * (b["Ta"] - T) - dH(T) * r) / cp]


def hottest(sol, rhs, end, iT=2):
    x = np.linspace(0.0, end, 20001)
    T = sol.sol(x)[iT]
    i = int(np.argmax(T))
    if 0 < i < len(x) - 1:
        g = lambda s: rhs(s, sol.sol(s))[iT]
        xs = brentq(g, x[i - 1], x[i + 1], xtol=1e-14)
        return xs, float(sol.sol(xs)[iT])
    return float(x[i]), float(T[i])


def profile(sol, end, n, iT=2):
    x = np.linspace(0.0, end, n)
    Y = sol.sol(x)
    return {"x": x.tolist(), "T": Y[iT].tolist(), "FA": Y[0].tolist()}


def solve_tube(co):
    t = P["tube"]
    y0 = [t["FA0"], 0.0, t["T0"]] + ([t["Ta"]] if co else [])
    s = solve_ivp(tube_rhs, [0.0, t["V"]], y0, args=(co,), method="Radau", rtol=1e-11, atol=1e-12, dense_output=True)
    pos, hot = hottest(s, lambda v, y: tube_rhs(v, y, co), t["V"])
    out = {"FA": float(s.y[0, -1]), "T_out": float(s.y[2, -1]), "hot": {"x": pos, "T": hot}, "profile": profile(s, t["V"], 51)}
    if co:
        out["Ta_out"] = float(s.y[3, -1])
    return out


def solve_batch():
    b = P["batch"]
    y0 = [b["CA0"] * b["V0"], 0.0, b["T0"]]
    s = solve_ivp(batch_rhs, [0.0, b["t_end"]], y0, method="Radau", rtol=1e-11, atol=1e-13, dense_output=True)
    pos, hot = hottest(s, batch_rhs, b["t_end"])
    return {"NA": float(s.y[0, -1]), "T_end": float(s.y[2, -1]), "hot": {"x": pos, "T": hot}, "profile": profile(s, b["t_end"], 51)}


def main():
    out = {"scipy": scipy.__version__, "R": R, "params": P,
           "constant_coolant": solve_tube(False), "co_current": solve_tube(True), "batch": solve_batch()}
    path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "simulate_heat.json")
    with open(path, "w") as fh:
        json.dump(out, fh, indent=1)
    for key in ("constant_coolant", "co_current", "batch"):
        print(key, {k2: v for k2, v in out[key].items() if k2 != "profile"})


if __name__ == "__main__":
    main()
