"""Reference for tests/reference/planning-discrimination.test.ts: one next sample to tell a
first-order decay from a second-order decay (batch, liquid, A -> B, 300 K, C0 = 1000 mol/m3).

Invented data: six samples of C_A(t) from a rate of order 1.5 (between the rivals) with seeded
Gaussian noise, sigma = 80 mol/m3 known (absolute).
Rival 1: C = C0 exp(-k1 t).                Rival 2: C = C0 / (1 + k2 C0 t).
Fits: scipy.optimize.curve_fit(sigma, absolute_sigma=True) in ln k (covariance (J'J/sigma^2)^-1).
Today's probabilities: Akaike weights with known sigma, AIC = chi2 + 2p, AICc = AIC + 2p(p+1)/(n-p-1)
(Burnham & Anderson 2002).
Box-Hill criterion for one sample at time t (Box & Hill 1967, Technometrics 9, 57-71):
  D(t) = P1 P2 [ (s1^2 - s2^2)^2 / ((s^2 + s1^2)(s^2 + s2^2)) + (y1 - y2)^2 (1/(s^2 + s1^2) + 1/(s^2 + s2^2)) ]
with s_i^2 = g_i^2 var(ln k_i) the prediction variance, in units of sigma^2 (s = 1).
Hunter-Reiner (Hunter & Reiner 1965, Technometrics 7, 307-323): H(t) = (y1 - y2)^2 / sigma^2.
Maxima over t in [0, 10000] s: dense grid then scipy.optimize.minimize_scalar (bounded) around it.
Expected posterior probability of rival j when rival i is true after the sample at t*_BH:
  E[P_j | i] = integral N(y; y_i, s^2 + s_i^2) P_j N(y; y_j, s^2 + s_j^2) / sum_k P_k N(y; y_k, ...) dy
by scipy.integrate.quad.

Run: python3 tests/reference/scipy/discrimination.py  (writes discrimination.json).
"""
import json
import os

import numpy as np
import scipy
from scipy.integrate import quad
from scipy.optimize import curve_fit, minimize_scalar
from scipy.stats import norm

SEED = 20261205
C0 = 1000.0  # mol/m3
SIGMA = 80.0  # mol/m3
K15 = 2.0e-5  # (m3/mol)^0.5 / s, order 1.5: C = (C0^-0.5 + 0.5 k t)^-2
T_MAX = 10000.0  # s, the design space [0, T_MAX]
times = np.array([60.0, 120.0, 240.0, 360.0, 480.0, 600.0])  # s
rng = np.random.default_rng(SEED)
truth = (C0 ** -0.5 + 0.5 * K15 * times) ** -2
data = truth + SIGMA * rng.standard_normal(times.size)


def first(t, lnk):
    return C0 * np.exp(-np.exp(lnk) * t)


def second(t, lnk):
    return C0 / (1.0 + np.exp(lnk) * C0 * t)


def g_first(t, lnk):  # d C / d ln k
    k = np.exp(lnk)
    return -C0 * k * t * np.exp(-k * t)


def g_second(t, lnk):
    k = np.exp(lnk)
    return -C0 * C0 * k * t / (1.0 + k * C0 * t) ** 2


rivals = []
for name, f, g, start in [("first", first, g_first, np.log(1e-3)), ("second", second, g_second, np.log(1e-6))]:
    popt, pcov = curve_fit(f, times, data, p0=[start], sigma=np.full(times.size, SIGMA), absolute_sigma=True, xtol=1e-14, ftol=1e-14, gtol=1e-14)
    chi2 = float(np.sum(((data - f(times, *popt)) / SIGMA) ** 2))
    p, n = 1, times.size
    aicc = chi2 + 2 * p + 2 * p * (p + 1) / (n - p - 1)
    rivals.append({"name": name, "f": f, "g": g, "lnk": float(popt[0]), "var": float(pcov[0, 0]), "chi2": chi2, "aicc": aicc})

best = min(r["aicc"] for r in rivals)
rel = [np.exp(-(r["aicc"] - best) / 2) for r in rivals]
prior = [float(v / sum(rel)) for v in rel]


def pred(r, t):
    """Whitened prediction and prediction variance (units of sigma)."""
    return r["f"](t, r["lnk"]) / SIGMA, (r["g"](t, r["lnk"]) / SIGMA) ** 2 * r["var"]


def box_hill(t):
    (y1, v1), (y2, v2) = pred(rivals[0], t), pred(rivals[1], t)
    a, b = 1 + v1, 1 + v2
    return prior[0] * prior[1] * ((v1 - v2) ** 2 / (a * b) + (y1 - y2) ** 2 * (1 / a + 1 / b))


def hunter_reiner(t):
    return (pred(rivals[0], t)[0] - pred(rivals[1], t)[0]) ** 2


def maximise(fun):
    grid = np.linspace(0.0, T_MAX, 50001)
    vals = np.array([fun(t) for t in grid])
    i = int(np.argmax(vals))
    lo, hi = grid[max(i - 1, 0)], grid[min(i + 1, grid.size - 1)]
    res = minimize_scalar(lambda t: -fun(t), bounds=(lo, hi), method="bounded", options={"xatol": 1e-8})
    return float(res.x), float(-res.fun)


t_bh, d_bh = maximise(box_hill)
t_hr, d_hr = maximise(hunter_reiner)


def expected_posterior(t):
    ps = [pred(r, t) for r in rivals]
    out = []
    for i in range(2):
        yi, vi = ps[i]
        row = []
        for j in range(2):
            def integrand(y):
                dens = [prior[k] * norm.pdf(y, ps[k][0], np.sqrt(1 + ps[k][1])) for k in range(2)]
                return norm.pdf(y, yi, np.sqrt(1 + vi)) * dens[j] / sum(dens)
            s = np.sqrt(1 + vi)
            val, _ = quad(integrand, yi - 12 * s, yi + 12 * s, epsabs=1e-12, limit=200)
            row.append(float(val))
        out.append(row)
    return out


result = {
    "source": "scipy " + scipy.__version__ + " (curve_fit, minimize_scalar, quad)",
    "C0_mol_m3": C0,
    "tMax_s": T_MAX,
    "sigma_mol_m3": SIGMA,
    "times_s": times.tolist(),
    "data_mol_m3": [float(v) for v in data],
    "rivals": [{"name": r["name"], "k": float(np.exp(r["lnk"])), "var_lnk": r["var"], "chi2": r["chi2"], "aicc": r["aicc"]} for r in rivals],
    "prior": prior,
    "boxHill": {"t_s": t_bh, "value": d_bh},
    "hunterReiner": {"t_s": t_hr, "value": d_hr},
    "expectedPosteriorAtBoxHill": expected_posterior(t_bh),
}
with open(os.path.join(os.path.dirname(os.path.abspath(__file__)), "discrimination.json"), "w") as fh:
    json.dump(result, fh, indent=2)
    fh.write("\n")
print(json.dumps(result, indent=2))
