"""Reference fit for bench/run.ts: the synthetic packed-bed study (bench/synthetic-study.ts) fitted by
plain SciPy: scipy.optimize.least_squares (default 'trf', default 2-point finite-difference
Jacobian) over scipy.integrate.solve_ivp (default RK45 = Dormand-Prince 5(4), rtol 1e-8).

Model (same as rateloom's packed bed, isothermal gas phase, Ergun pressure drop):
  dF_j/dW = nu_j r,  r = k (C_A C_B - C_C / K),  C_j = C_T0 (F_j / F_T) p,  C_T0 = P0 / (R T)
  dp/dW = -alpha / (2 p) (F_T / F_T0)
  k = k1 exp(-E1/R (1/T - 1/T_ref)),  K = K1 exp(-dH1/R (1/T - 1/T_ref))
Estimation space: (ln k1, E1, ln K1, dH1), as rateloom. Residuals (y - model) / sigma.

Usage: /usr/bin/python3 bench/scipy_fit.py data.json   (prints one JSON document)
"""
import json
import math
import sys
import time

import numpy as np
from scipy.integrate import solve_ivp
from scipy.optimize import least_squares

NU = np.array([-1.0, -1.0, 1.0, 0.0])


def main() -> None:
    with open(sys.argv[1], encoding="utf8") as fh:
        d = json.load(fh)
    R = d["R"]
    t_ref = d["referenceTemperature"]
    alpha = d["alpha"]
    runs = d["runs"]
    obs = d["observations"]
    y_meas = np.array([o["value"] for o in obs])
    sigma = np.array([o["sigma"] for o in obs])
    obs_run = [o["run"] for o in obs]
    obs_sp = [o["species"] for o in obs]
    s = d["start"]
    x0 = np.array([math.log(s["k1"]), s["E1"], math.log(s["K1"]), s["dH1"]])

    def solve_run(run, x):
        T, P0, W = run["T"], run["P"], run["W"]
        F0 = np.array(run["feed"], dtype=float)
        FT0 = F0.sum()
        ct0 = P0 / (R * T)
        inv = 1.0 / T - 1.0 / t_ref
        k = math.exp(x[0]) * math.exp(-x[1] / R * inv)
        K = math.exp(x[2]) * math.exp(-x[3] / R * inv)

        def f(_w, y):
            F = y[:4]
            p = y[4]
            FT = F.sum()
            C = ct0 * F / FT * p
            r = k * (C[0] * C[1] - C[2] / K)
            out = np.empty(5)
            out[:4] = NU * r
            out[4] = -alpha / (2.0 * max(p, 1e-12)) * (FT / FT0)
            return out

        y0 = np.concatenate([F0, [1.0]])
        atol = np.concatenate([np.full(4, 1e-12 * FT0), [1e-12]])
        sol = solve_ivp(f, (0.0, W), y0, rtol=1e-8, atol=atol)
        return sol.y[:, -1], sol.nfev

    counters = {"solves": 0, "rhs": 0}

    def residuals(x):
        pred = np.empty(len(obs))
        cache = {}
        for i, (r, j) in enumerate(zip(obs_run, obs_sp)):
            if r not in cache:
                yend, nfev = solve_run(runs[r], x)
                counters["solves"] += 1
                counters["rhs"] += nfev
                cache[r] = yend
            pred[i] = cache[r][j]
        return (y_meas - pred) / sigma

    t0 = time.perf_counter()
    res = least_squares(residuals, x0, ftol=1e-12, xtol=1e-12, gtol=1e-10, x_scale="jac")
    elapsed = time.perf_counter() - t0
    x = res.x
    print(json.dumps({
        "seconds": elapsed,
        "status": int(res.status),
        "message": res.message,
        "nfev": int(res.nfev),
        "njev": int(res.njev) if res.njev is not None else None,
        "solves": counters["solves"],
        "rhsEvaluations": counters["rhs"],
        "ssr": float(2.0 * res.cost),
        "estimates": {"k1": math.exp(x[0]), "E1": x[1], "K1": math.exp(x[2]), "dH1": x[3]},
    }))


if __name__ == "__main__":
    main()
