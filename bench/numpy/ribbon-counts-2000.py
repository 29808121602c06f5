"""numpy twin of bench/workloads/ribbon-counts-2000.ts, timed on a few momenta and extrapolated.

A dense count diagonalises the ribbon's Floquet operator at every momentum of
its grid. Here the dense operator of the 2,000-cell ribbon (three-step
honeycomb drive, J tau = 0.45 pi, delta tau = 0.3, finite along a2; 4,000
states) is built from the closed-form dimer exponentials of each step and
diagonalised through the Cayley transform and eigh (the route of
src/numerics/linalg/unitary-eigen.ts) at SAMPLE momenta; the compute time is
that of the samples scaled to DENSE_MOMENTA momenta (the dense route's
default grid), and the sampled time is reported beside it.
"""
import json
import os
import sys
import time

import numpy as np

from _honeycomb import BONDS
from _honeycomb import step_operator as honeycomb_step

J, DELTA, TAU = 0.45 * np.pi, 0.3, 1.0
WIDTH = int(os.environ.get("RIBBON_CELLS", "2000"))
SAMPLE = int(os.environ.get("RIBBON_SAMPLE_MOMENTA", "2"))
DENSE_MOMENTA = 200
SIZE = 2 * WIDTH


def step(s, n1, n2):
    """exp(-i H tau) of the step with bond (n1, n2), finite along a2 (bench/numpy/_honeycomb.py)."""
    return honeycomb_step(np.array([s]), n2, n1, WIDTH, J, DELTA, TAU)[0]


def spectrum(s):
    u = np.eye(SIZE, dtype=complex)
    for n1, n2 in BONDS:
        u = step(s, n1, n2) @ u
    cut = np.pi * (3 - np.sqrt(5))
    w = np.exp(-1j * (cut - np.pi)) * u
    eye = np.eye(SIZE)
    a = 2j * np.linalg.solve(eye + w, eye) - 1j * eye
    a = 0.5 * (a + a.conj().T)
    _, v = np.linalg.eigh(a)
    return np.angle(np.einsum("ij,ij->j", v.conj(), u @ v)), v


def work():
    t0 = time.perf_counter()
    for j in range(SAMPLE):
        phases, v = spectrum((j + 0.5) / SAMPLE)
    sampled = time.perf_counter() - t0
    return {
        "states": SIZE,
        "sampledMomenta": SAMPLE,
        "sampledSeconds": sampled,
        "extrapolatedTo": DENSE_MOMENTA,
        "extrapolatedSeconds": sampled * DENSE_MOMENTA / SAMPLE,
    }


# The harness compares computeMs: report the extrapolated time as the compute time.
result = work()
sys.stdout.write(json.dumps({"workload": "ribbon-counts-2000", "computeMs": result["extrapolatedSeconds"] * 1e3, "numpy": np.__version__, "result": result}) + "\n")
