"""Reference descriptive statistics from NumPy for the Monte Carlo summaries and the replicate pure
error: percentiles by numpy.percentile (method 'linear', type 7), the mean by math.fsum (exactly
rounded sum) and the sum of squared deviations from it.

Data: fixed seeded samples (numpy.random.default_rng(7)) including one with a large common offset,
where a plain left-to-right sum loses digits.

Run: python3 tests/reference/scipy/descriptive.py  (writes descriptive.json beside it).
"""
import json
import math
import os

import numpy as np

rng = np.random.default_rng(7)
samples = {
    "lognormal-1000": rng.lognormal(mean=8.0, sigma=0.3, size=1000),
    "normal-offset-10000": 1e9 + rng.normal(0.0, 1e-3, size=10000),
    "small-5": np.array([3.0, 1.0, 4.0, 1.0, 5.0]),
}
levels = [0.0, 0.05, 0.1, 0.5, 0.9, 0.95, 1.0]
out = {"numpy": np.__version__, "samples": []}
for name, x in samples.items():
    xs = [float(v) for v in x]
    mean = math.fsum(xs) / len(xs)
    out["samples"].append({
        "name": name,
        "values": xs,
        "percentiles": [{"p": p, "value": float(np.percentile(x, 100 * p, method="linear"))} for p in levels],
        "mean": mean,
        "sumSquaredDeviations": math.fsum((v - mean) ** 2 for v in xs),
    })
with open(os.path.join(os.path.dirname(__file__), "descriptive.json"), "w", encoding="utf8") as fh:
    json.dump(out, fh)
