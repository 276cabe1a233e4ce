"""Reference solution of the Robertson (1966) chemical kinetics problem for rateloom tests.

    y1' = -0.04 y1 + 1e4 y2 y3
    y2' =  0.04 y1 - 1e4 y2 y3 - 3e7 y2^2
    y3' =  3e7 y2^2,            y(0) = (1, 0, 0)

Solved with SciPy solve_ivp(method='Radau') at rtol 1e-12 and tiny absolute tolerances, with
the analytic Jacobian. Also Van der Pol (mu = 1000) at t = 3000 with the same solver, rtol 1e-10.
Run with Debian's python3-scipy: /usr/bin/python3 robertson.py  (writes robertson.json)
"""
import json
import numpy as np
import scipy
from scipy.integrate import solve_ivp


def rob(t, y):
    a = 0.04 * y[0]
    b = 1e4 * y[1] * y[2]
    c = 3e7 * y[1] ** 2
    return [-a + b, a - b - c, c]


def rob_jac(t, y):
    return [
        [-0.04, 1e4 * y[2], 1e4 * y[1]],
        [0.04, -1e4 * y[2] - 6e7 * y[1], -1e4 * y[1]],
        [0.0, 6e7 * y[1], 0.0],
    ]


times = [0.4, 4.0, 40.0, 400.0]
sol = solve_ivp(rob, (0.0, 400.0), [1.0, 0.0, 0.0], method="Radau", rtol=1e-12,
                atol=[1e-16, 1e-20, 1e-16], jac=rob_jac, t_eval=times)
assert sol.success, sol.message

MU = 1000.0


def vdp(t, y):
    return [y[1], MU * (1 - y[0] ** 2) * y[1] - y[0]]


def vdp_jac(t, y):
    return [[0.0, 1.0], [-2 * MU * y[0] * y[1] - 1.0, MU * (1 - y[0] ** 2)]]


vsol = solve_ivp(vdp, (0.0, 3000.0), [2.0, 0.0], method="Radau", rtol=1e-10, atol=1e-12, jac=vdp_jac)
assert vsol.success, vsol.message

out = {
    "source": "SciPy %s solve_ivp Radau, tests/reference/scipy/robertson.py" % scipy.__version__,
    "robertson": {
        "rtol": 1e-12,
        "atol": [1e-16, 1e-20, 1e-16],
        "t": times,
        "y": [[float(v) for v in sol.y[:, i]] for i in range(len(times))],
    },
    "vanDerPol": {
        "mu": MU,
        "rtol": 1e-10,
        "atol": 1e-12,
        "t": 3000.0,
        "y": [float(v) for v in vsol.y[:, -1]],
    },
}
with open("robertson.json", "w") as fh:
    json.dump(out, fh, indent=2)
    fh.write("\n")
print(json.dumps(out, indent=2))
