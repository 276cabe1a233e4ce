"""Reference sizes for a gas-phase packed bed with pressure drop (invented case).

A + B -> C on a catalyst, r' = k C_A C_B (mol/(kg s)), isothermal, Ergun pressure drop
dp/dW = -alpha/(2 p) (F_T/F_T0), C_j = C_T0 (F_j/F_T) p. Integrated with SciPy solve_ivp (DOP853,
rtol 1e-12) with a terminal event at the target conversion of A; a second case with a larger alpha
where the pressure runs out first (event on p^2 = 0, integrating u = p^2 there).
Run: /usr/bin/python3 tests/reference/scipy/design_pbr_event.py > tests/reference/scipy/design_pbr_event.json
"""
import json
import numpy as np
import scipy
from scipy.integrate import solve_ivp

R = 8.314462618
T = 480.0
P0 = 5e5
FT0 = 20.0
y0 = np.array([0.4, 0.4, 0.0, 0.2])
F0 = FT0 * y0
CT0 = P0 / (R * T)
k = 1e-4
X_target = 0.6


def rhs_p(W, s, alpha):
    F = s[:4]
    p = s[4]
    FT = F.sum()
    C = CT0 * F / FT * p
    r = k * C[0] * C[1]
    return [-r, -r, r, 0.0, -alpha / (2 * p) * FT / FT0]


def size(alpha):
    ev = lambda W, s, alpha: (F0[0] - s[0]) / F0[0] - X_target
    ev.terminal = True
    ev.direction = 1
    sol = solve_ivp(rhs_p, (0, 1e4), np.append(F0, 1.0), method='DOP853', rtol=1e-12, atol=1e-14,
                    events=ev, args=(alpha,))
    W = sol.t_events[0][0]
    s = sol.y_events[0][0]
    return {'alpha': alpha, 'W': W, 'outletFlows': list(s[:4]), 'pressureRatio': s[4]}


def rhs_u(W, s, alpha):
    F = s[:4]
    u = max(s[4], 0.0)
    FT = F.sum()
    C = CT0 * F / FT * np.sqrt(u)
    r = k * C[0] * C[1]
    return [-r, -r, r, 0.0, -alpha * FT / FT0]


def exhausted(alpha):
    ev = lambda W, s, alpha: s[4]
    ev.terminal = True
    ev.direction = -1
    sol = solve_ivp(rhs_u, (0, 1e4), np.append(F0, 1.0), method='DOP853', rtol=1e-12, atol=1e-14,
                    events=ev, args=(alpha,))
    s = sol.y_events[0][0]
    return {'alpha': alpha, 'exhaustedAt': sol.t_events[0][0], 'conversionThere': (F0[0] - s[0]) / F0[0]}


out = {
    'source': 'SciPy solve_ivp DOP853, rtol 1e-12, atol 1e-14, scipy ' + scipy.__version__,
    'case': {'T': T, 'P0': P0, 'FT0': FT0, 'moleFractions': list(y0), 'k': k, 'targetConversion': X_target},
    'sized': [size(0.0), size(0.005), size(0.012)],
    'exhausted': exhausted(0.05),
}
print(json.dumps(out, indent=2))
