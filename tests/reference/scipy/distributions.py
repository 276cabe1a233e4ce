"""Reference values of Student t, F, chi-square and normal distribution functions from SciPy.

Run: /usr/bin/python3 tests/reference/scipy/distributions.py  (writes distributions.json beside it).
"""
import json
import os

import scipy
from scipy import stats

out = {"scipy": scipy.__version__, "t": [], "f": [], "chi2": [], "norm": []}
for dof in [1, 2, 3, 5, 7.5, 10, 30, 100, 1000]:
    for p in [0.5, 0.6, 0.9, 0.95, 0.975, 0.995, 0.9995, 0.025, 1e-6]:
        out["t"].append({"dof": dof, "p": p, "ppf": stats.t.ppf(p, dof)})
    for x in [-4.0, -1.0, 0.3, 2.0, 12.7]:
        out["t"].append({"dof": dof, "x": x, "cdf": stats.t.cdf(x, dof)})
for d1, d2 in [(1, 1), (1, 4), (1, 12), (2, 7), (3, 20), (5, 50), (10, 3), (1, 200)]:
    for p in [0.05, 0.5, 0.9, 0.95, 0.99]:
        out["f"].append({"d1": d1, "d2": d2, "p": p, "ppf": stats.f.ppf(p, d1, d2)})
    for x in [0.1, 1.0, 3.5, 20.0, 300.0]:
        out["f"].append({"d1": d1, "d2": d2, "x": x, "cdf": stats.f.cdf(x, d1, d2), "sf": stats.f.sf(x, d1, d2)})
for k in [1, 2, 3, 4.5, 10, 40, 150]:
    for p in [0.01, 0.5, 0.9, 0.95, 0.99]:
        out["chi2"].append({"k": k, "p": p, "ppf": stats.chi2.ppf(p, k)})
    for x in [0.01, 1.0, 5.0, 30.0, 200.0]:
        out["chi2"].append({"k": k, "x": x, "cdf": stats.chi2.cdf(x, k)})
for p in [1e-9, 0.001, 0.025, 0.3, 0.5, 0.8, 0.975, 0.999]:
    out["norm"].append({"p": p, "ppf": stats.norm.ppf(p)})
for x in [-6.0, -1.96, 0.0, 0.5, 3.0]:
    out["norm"].append({"x": x, "cdf": stats.norm.cdf(x)})

with open(os.path.join(os.path.dirname(os.path.abspath(__file__)), "distributions.json"), "w") as fh:
    json.dump(out, fh, indent=1)
