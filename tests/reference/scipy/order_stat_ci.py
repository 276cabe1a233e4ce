"""Coverage of order-statistic intervals for quantiles: P(l <= K <= u - 1) for K ~ Binomial(n, q),
computed with scipy.stats.binom. Reference values for src/design/order-statistics.ts
(tests/reference/order-statistics.test.ts). Run: python3 tests/reference/scipy/order_stat_ci.py
"""
import json
import os

import scipy
from scipy.stats import binom

CASES = [
    (100, 0.5, 40, 61),
    (100, 0.95, 90, 100),
    (100, 0.9, 84, 96),
    (1000, 0.95, 936, 964),
    (20, 0.5, 6, 15),
    (4000, 0.05, 175, 226),
]

out = {
    "source": "scipy.stats.binom.cdf, scipy " + scipy.__version__,
    "cases": [
        {"n": n, "q": q, "l": l, "u": u, "coverage": float(binom.cdf(u - 1, n, q) - binom.cdf(l - 1, n, q))}
        for n, q, l, u in CASES
    ],
}
path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "order_stat_ci.json")
with open(path, "w") as f:
    json.dump(out, f, indent=2)
    f.write("\n")
