"""numpy twin of bench/workloads/chain-open-spectrum.ts: Floquet spectrum of an
open two-step chain of L cells at (theta1, theta2) = (1.5, 2.0) and the number
of states within 0.1 x clearance of 0 and of pi (units pi/T)."""
import json, os, time
import numpy as np
from scipy.linalg import expm

L = int(os.environ.get("CHAIN_CELLS", "400"))
t1, t2 = 1.5, 2.0
start = time.perf_counter()
n = 2 * L
h1 = np.zeros((n, n))
h2 = np.zeros((n, n))
for c in range(L):
    h1[2 * c, 2 * c + 1] = h1[2 * c + 1, 2 * c] = 1.0
    if c + 1 < L:
        h2[2 * c + 1, 2 * c + 2] = h2[2 * c + 2, 2 * c + 1] = 1.0
u = expm(-1j * t2 * h2) @ expm(-1j * t1 * h1)
w, v = np.linalg.eig(u)
eps = -np.angle(w) / np.pi
seconds = time.perf_counter() - start
clear0, clearpi = abs(t2 - t1) / np.pi, abs(np.pi - t1 - t2) / np.pi
near0 = int(np.sum(np.abs(eps) < 0.1 * clear0))
nearpi = int(np.sum(1 - np.abs(eps) < 0.1 * clearpi))
print(json.dumps({"workload": "chain-open-spectrum", "cells": L, "states": n, "seconds": seconds, "statesNear0": near0, "statesNearPi": nearpi, "numpy": np.__version__}))
