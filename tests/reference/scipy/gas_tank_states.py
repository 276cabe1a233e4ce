"""Steady states and their stability of an isothermal gas stirred tank at constant pressure with a
mole-increasing reaction A -> 2 B, r = k C_A / (1 + K C_A)^2 (invented numbers), reference values
for tests/reactors/steady-states.test.ts.

Dynamics (ideal gas, constant T, P and V, so the holdup N = C_T V is constant and the outlet flow
adjusts): dn_j/dt = F_j0 - (n_j / N) F_out + V nu_j r(C), F_out = sum F_0 + V sum_j nu_j r, C = n / V.
Steady states: roots of the A balance F_A0 - F_A - V r(C_A) = 0 with F_T = 2 F_A0 - F_A and
C_A = C_T F_A / F_T, bracketed on a fine grid and refined with scipy.optimize.brentq. Stability:
each state is perturbed by +/- 1 % of F_A0 in n_A (n_B taking up the rest of N) and integrated with
scipy.integrate.solve_ivp (LSODA) over 200 residence times; stable when both perturbations return
to within 1e-6 relative. Run: python3 tests/reference/scipy/gas_tank_states.py (any python3 with scipy)."""
import json
import os

import numpy as np
from scipy.integrate import solve_ivp
from scipy.optimize import brentq

k, K, V, CT, FA0 = 0.8, 0.05, 0.1, 400.0, 0.4
N = CT * V


def rate(C):
    return k * C / (1 + K * C) ** 2


def balance(FA):
    FT = 2 * FA0 - FA
    return FA0 - FA - V * rate(CT * FA / FT)


grid = np.linspace(1e-9, FA0, 200001)
vals = np.array([balance(x) for x in grid])
roots = [brentq(balance, grid[i], grid[i + 1], xtol=1e-15) for i in range(len(grid) - 1) if vals[i] * vals[i + 1] < 0]


def rhs(t, n):
    C = n / V
    r = rate(C[0])
    Fout = FA0 + V * r  # sum of nu = -1 + 2 = +1
    return [FA0 - n[0] / N * Fout - V * r, 0.0 - n[1] / N * Fout + 2 * V * r]


states = []
tau = N / (2 * FA0)
for FA in roots:
    FT = 2 * FA0 - FA
    nA = N * FA / FT
    back = []
    for d in (+0.01, -0.01):
        n0 = [nA + d * N * FA0 / FT, N - nA - d * N * FA0 / FT]
        sol = solve_ivp(rhs, [0, 200 * tau], n0, method="LSODA", rtol=1e-10, atol=1e-12)
        back.append(abs(sol.y[0, -1] - nA) / nA < 1e-6)
    states.append({"FA": FA, "FB": 2 * (FA0 - FA), "CA": CT * FA / FT, "stability": "stable" if all(back) else "unstable"})

out = {"source": "scipy.optimize.brentq + scipy.integrate.solve_ivp (LSODA)", "k": k, "K": K, "V": V, "CT": CT, "FA0": FA0, "states": states}
with open(os.path.join(os.path.dirname(os.path.abspath(__file__)), "gas_tank_states.json"), "w") as f:
    json.dump(out, f, indent=1)
print(states)
