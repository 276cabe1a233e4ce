"""Reference effectiveness factors of an isothermal spherical pellet for two non-linear rate laws.

Balance in x = r/R (sphere): C'' + (2/x) C' = (R^2/De) r(C), C'(0) = 0, C(1) = Cs, with
  second order       r = k C^2                 (mol/(m3 pellet s))
  Langmuir-Hinshelwood  r = k C / (1 + K C)^2
Solved with SciPy solve_bvp (its singular term S/x handles 2/x at the centre), tolerance 1e-10;
eta = 3 De C'(1) / (R^2 r(Cs)) (flux through the surface over the rate at surface conditions).
Run: python3 tests/reference/scipy/pellet_eta.py > tests/reference/scipy/pellet_eta.json
"""
import json
import numpy as np
import scipy
from scipy.integrate import solve_bvp

R = 2.5e-3      # m
DE = 2e-6       # m2/s
CS = 20.0       # mol/m3


def rates(kind, k, K):
    if kind == 'second-order':
        return lambda c: k * np.maximum(c, 0) ** 2
    return lambda c: k * np.maximum(c, 0) / (1 + K * np.maximum(c, 0)) ** 2


def eta(kind, k, K):
    r = rates(kind, k, K)
    x = np.linspace(0, 1, 2001)
    y = np.vstack([np.full_like(x, CS), np.zeros_like(x)])
    S = np.array([[0.0, 0.0], [0.0, -2.0]])
    f = lambda x, y: np.vstack([y[1], R * R / DE * r(y[0])])
    bc = lambda ya, yb: np.array([ya[1], yb[0] - CS])
    sol = solve_bvp(f, bc, x, y, S=S, tol=1e-10, max_nodes=2000000)
    assert sol.success, sol.message
    return 3 * DE * sol.sol(1.0)[1] / (R * R * r(CS)), float(sol.sol(0.0)[0])


cases = []
for k in [1e-2, 1e-1, 1.0, 5.0]:
    e, c0 = eta('second-order', k, 0.0)
    cases.append({'rate': 'second-order', 'k': k, 'K': 0.0, 'eta': float(e), 'centre': c0})
for k in [1.0, 10.0, 100.0]:
    e, c0 = eta('lhhw', k, 0.1)
    cases.append({'rate': 'lhhw', 'k': k, 'K': 0.1, 'eta': float(e), 'centre': c0})
print(json.dumps({'source': 'scipy.integrate.solve_bvp', 'scipy': scipy.__version__,
                  'R': R, 'De': DE, 'Cs': CS, 'cases': cases}, indent=1))
