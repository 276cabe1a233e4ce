"""Reference fit for tests/reference/estimation-scipy.test.ts.

Invented scenario: batch, liquid phase, 2 A -> products, rate -r_A = 2 k C_A^2 in mol/(m3 s), so
C_A(t) = C0 / (1 + 2 k(T) C0 t), with Arrhenius about T_ref: k(T) = k_ref exp(-E/R (1/T - 1/T_ref)).
Data: three isothermal runs, generated here from known values with Gaussian noise (seeded).
Fit: scipy.optimize.least_squares(method='lm', xtol=ftol=gtol=1e-15) in theta = (ln k_ref, E),
with the analytic Jacobian; standard errors s^2 (J'J)^-1, s^2 = SSR/(n - p).

Run: /usr/bin/python3 tests/reference/scipy/integrated_kinetics.py  (writes integrated_kinetics.json).
"""
import json
import os

import numpy as np
import scipy
from scipy.optimize import least_squares

R = 8.314462618  # J/(mol K)
SEED = 20261201
T_REF = 330.0  # K
TRUE = {"k_ref": 2.0e-6, "E": 62000.0}  # m3/(mol s), J/mol
SIGMA = 4.0  # mol/m3
runs = [
    {"T": 310.0, "C0": 520.0},
    {"T": 330.0, "C0": 480.0},
    {"T": 350.0, "C0": 505.0},
]
times = np.array([0.0, 120.0, 300.0, 600.0, 900.0, 1500.0, 2400.0, 3600.0])  # s

T = np.concatenate([np.full(times.size, r["T"]) for r in runs])
C0 = np.concatenate([np.full(times.size, r["C0"]) for r in runs])
t = np.concatenate([times for _ in runs])


def predict(theta):
    lnk, E = theta
    k = np.exp(lnk - E / R * (1.0 / T - 1.0 / T_REF))
    return C0 / (1.0 + 2.0 * k * C0 * t), k


def jac_pred(theta):
    lnk, E = theta
    c, k = predict(theta)
    # dC/dk = -2 C0^2 t / (1 + 2 k C0 t)^2; dk/dlnk = k; dk/dE = -k (1/T - 1/T_ref)/R
    dCdk = -2.0 * C0**2 * t / (1.0 + 2.0 * k * C0 * t) ** 2
    return np.column_stack([dCdk * k, dCdk * (-k * (1.0 / T - 1.0 / T_REF) / R)])


rng = np.random.default_rng(SEED)
truth = np.array([np.log(TRUE["k_ref"]), TRUE["E"]])
measured = predict(truth)[0] + rng.normal(0.0, SIGMA, size=t.size)
sigma = np.full(t.size, SIGMA)

start = np.array([np.log(1.0e-6), 50000.0])
res = least_squares(
    lambda th: (measured - predict(th)[0]) / sigma,
    start,
    jac=lambda th: -jac_pred(th) / sigma[:, None],
    method="lm",
    xtol=1e-15,
    ftol=1e-15,
    gtol=1e-15,
)
J = res.jac
n, p = J.shape
ssr = float(res.fun @ res.fun)
s2 = ssr / (n - p)
cov = s2 * np.linalg.inv(J.T @ J)
se = np.sqrt(np.diag(cov))

out = {
    "scipy": scipy.__version__,
    "seed": SEED,
    "R": R,
    "T_ref": T_REF,
    "truth": TRUE,
    "start": {"ln_k_ref": start[0], "E": start[1]},
    "data": {"T": T.tolist(), "C0": C0.tolist(), "t": t.tolist(), "measured": measured.tolist(), "sigma": sigma.tolist()},
    "status": int(res.status),
    "theta": {"ln_k_ref": res.x[0], "E": res.x[1]},
    "stdError": {"ln_k_ref": se[0], "E": se[1]},
    "k_ref": float(np.exp(res.x[0])),
    "k_ref_stdError_delta": float(np.exp(res.x[0]) * se[0]),
    "ssr": ssr,
    "correlation": float(cov[0, 1] / np.sqrt(cov[0, 0] * cov[1, 1])),
}
with open(os.path.join(os.path.dirname(os.path.abspath(__file__)), "integrated_kinetics.json"), "w") as fh:
    json.dump(out, fh, indent=1)
print(json.dumps({k: out[k] for k in ["status", "theta", "stdError", "ssr", "correlation"]}, indent=1))
