"""Generalised least squares with block-correlated errors (Aitken 1935), reference values for
tests/estimation/whiten.test.ts. The straight line y = a + b x is fitted to 7 invented points whose
errors have standard deviations sigma and a block-diagonal correlation matrix R; the estimate is
beta = (X' S^-1 X)^-1 X' S^-1 y with S = D R D, D = diag(sigma), its covariance (X' S^-1 X)^-1,
and the minimum of (y - X beta)' S^-1 (y - X beta). Computed with scipy.linalg (inv), independent of
rateloom's Cholesky whitening. Run: python3 tests/reference/scipy/gls_blocks.py (any python3 with scipy)"""
import json
import os

import numpy as np
from scipy import linalg

x = np.array([0.0, 1.0, 2.0, 3.0, 4.0, 5.0, 6.0])
y = np.array([1.02, 2.61, 4.45, 5.83, 7.71, 9.18, 10.95])
sigma = np.array([0.10, 0.12, 0.15, 0.10, 0.20, 0.15, 0.12])
R = np.eye(7)
# block 1: observations 0, 1, 2
R[0, 1] = R[1, 0] = 0.6
R[0, 2] = R[2, 0] = 0.3
R[1, 2] = R[2, 1] = 0.5
# block 2: observations 4, 5
R[4, 5] = R[5, 4] = -0.4
D = np.diag(sigma)
S = D @ R @ D
Si = linalg.inv(S)
X = np.column_stack([np.ones_like(x), x])
cov = linalg.inv(X.T @ Si @ X)
beta = cov @ X.T @ Si @ y
e = y - X @ beta
out = {
    "source": "scipy.linalg.inv, GLS normal equations (Aitken 1935)",
    "x": x.tolist(), "y": y.tolist(), "sigma": sigma.tolist(),
    "blocks": [{"index": [0, 1, 2], "R": R[np.ix_([0, 1, 2], [0, 1, 2])].tolist()},
               {"index": [4, 5], "R": R[np.ix_([4, 5], [4, 5])].tolist()}],
    "beta": beta.tolist(),
    "covariance": cov.tolist(),
    "gls_ssr": float(e @ Si @ e),
}
with open(os.path.join(os.path.dirname(os.path.abspath(__file__)), "gls_blocks.json"), "w") as f:
    json.dump(out, f, indent=1)
