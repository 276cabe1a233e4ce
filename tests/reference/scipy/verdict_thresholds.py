"""Reference values for the thresholds of the fit verdict and the influence warnings
(src/estimation/verdict.ts, src/estimation/influence.ts), from scipy.stats.

Run with a python3 that has SciPy:  python3 tests/reference/scipy/verdict_thresholds.py
Writes verdict_thresholds.json beside this script; tests/reference/verdict-thresholds.test.ts
reads it (no Python at test time).
"""
import json
import os

import scipy
from scipy import stats

# (n, p) pairs of fits the tests and the demo run: small synthetic models, the study fixture,
# the batch and packed-bed demo studies, and a large study.
SHAPES = [(10, 2), (27, 2), (40, 2), (40, 3), (84, 3), (200, 6), (2000, 6)]
OUTLIER_LEVEL = 0.01
MISFIT_P = 0.001

out = {"scipy": scipy.__version__, "misfitPValue": MISFIT_P, "outlierLevel": OUTLIER_LEVEL}

# Chi-square: the misfit boundary (upper 0.1 % point) and survival values around it.
out["chi2_misfit"] = []
for k in [1, 5, 25, 81, 194, 1000]:
    x = float(stats.chi2.ppf(1 - MISFIT_P, k))
    out["chi2_misfit"].append({
        "k": k,
        "ppf_0999": x,
        "sf_at_0.9x": float(stats.chi2.sf(0.9 * x, k)),
        "sf_at_1.1x": float(stats.chi2.sf(1.1 * x, k)),
        "sf_at_k": float(stats.chi2.sf(k, k)),
    })

# F: the misfit boundary of the lack-of-fit test, and the median used for Cook's distance.
out["f_misfit"] = [
    {"d1": d1, "d2": d2, "ppf_0999": float(stats.f.ppf(1 - MISFIT_P, d1, d2))}
    for (d1, d2) in [(22, 3), (182, 12), (10, 40), (3, 5)]
]
out["cook_median"] = [{"p": p, "dof": n - p, "median": float(stats.f.ppf(0.5, p, n - p))} for (n, p) in SHAPES]

# Bonferroni outlier bounds: t(1 - alpha/(2n); n - p - 1) and z(1 - alpha/(2n)).
out["outlier_bound"] = [
    {
        "n": n,
        "p": p,
        "t": float(stats.t.ppf(1 - OUTLIER_LEVEL / (2 * n), n - p - 1)),
        "z": float(stats.norm.ppf(1 - OUTLIER_LEVEL / (2 * n))),
    }
    for (n, p) in SHAPES
]

here = os.path.dirname(os.path.abspath(__file__))
with open(os.path.join(here, "verdict_thresholds.json"), "w") as f:
    json.dump(out, f, indent=1)
    f.write("\n")
