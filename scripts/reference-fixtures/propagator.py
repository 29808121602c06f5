"""Reference time evolution for the propagator tests.

Writes test/fixtures/reference/propagator.json: a three-level drive with harmonic
modulations, integrated with scipy's solve_ivp (DOP853, rtol = atol = 1e-13) —
an integrator independent of ours. The drive is stated in the model convention:
a term (from a, to b, amplitude c, modulation f) puts c·f(t) at element (b, a) and
its conjugate at (a, b); onsite terms add c·f(t) once.
Re-run:  python3 scripts/reference-fixtures/propagator.py
"""
import json
import pathlib
import sys

import numpy as np
import scipy
from scipy.integrate import solve_ivp

OUT = pathlib.Path(__file__).resolve().parents[2] / "test" / "fixtures" / "reference" / "propagator.json"
PERIOD = 2.0
OMEGA = 2 * np.pi / PERIOD

# (from, to, amplitude re, amplitude im, mean, [(amplitude, harmonic, phase), ...]); mean None = constant.
TERMS = [
    (0, 0, 0.35, 0.0, None, []),
    (2, 2, -0.5, 0.0, None, []),
    (0, 1, 0.6, 0.2, 0.0, [(1.0, 1, 0.0)]),
    (1, 2, 0.8, 0.0, 0.5, [(0.3, 2, 0.7)]),
    (0, 2, 0.0, 0.4, None, []),
    (1, 1, 1.0, 0.0, 0.0, [(0.9, 1, -1.1)]),
]
TIMES = [0.0, 0.3, 0.7, 1.25, PERIOD]


def modulation(mean, comps, t):
    if mean is None:
        return 1.0
    return mean + sum(a * np.cos(h * OMEGA * t + p) for a, h, p in comps)


def hamiltonian(t):
    h = np.zeros((3, 3), dtype=complex)
    for a, b, re, im, mean, comps in TERMS:
        c = (re + 1j * im) * modulation(mean, comps, t)
        if a == b:
            h[a, a] += c
        else:
            h[b, a] += c
            h[a, b] += np.conj(c)
    return h


def rhs(t, y):
    u = y.reshape(3, 3)
    return (-1j * hamiltonian(t) @ u).ravel()


def main():
    sol = solve_ivp(rhs, (0.0, PERIOD), np.eye(3, dtype=complex).ravel(), method="DOP853", rtol=1e-13, atol=1e-13, t_eval=TIMES)
    ops = [sol.y[:, k].reshape(3, 3) for k in range(len(TIMES))]
    data = {
        "generator": "scripts/reference-fixtures/propagator.py",
        "numpy": np.__version__,
        "scipy": scipy.__version__,
        "python": sys.version.split()[0],
        "integrator": "scipy.integrate.solve_ivp DOP853 rtol=1e-13 atol=1e-13",
        "period": PERIOD,
        "terms": [
            {"from": a, "to": b, "amplitude": [re, im], "mean": mean, "components": [{"amplitude": x, "harmonic": h, "phase": p} for x, h, p in comps]}
            for a, b, re, im, mean, comps in TERMS
        ],
        "times": TIMES,
        "operators": [{"rows": 3, "cols": 3, "re": u.real.ravel().tolist(), "im": u.imag.ravel().tolist()} for u in ops],
        "unitarityDefect": max(float(np.linalg.norm(u.conj().T @ u - np.eye(3))) for u in ops),
    }
    OUT.parent.mkdir(parents=True, exist_ok=True)
    OUT.write_text(json.dumps(data, indent=1) + "\n")
    print(f"wrote {OUT}; max unitarity defect {data['unitarityDefect']:.2e}")


if __name__ == "__main__":
    main()
