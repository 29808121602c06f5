"""numpy twin of bench/workloads/ribbon-honeycomb.ts.

Ribbon of the three-step honeycomb drive (J tau = 0.45 pi, sublattice
potential delta tau = 0.3, tau = 1), finite along a1 with 60 cells, 400 momenta
s = (j + 1/2)/400 along a2. Each step is a set of disjoint dimers plus the
potential, so its exponential is written in closed form for all dimers and
momenta at once; the three steps are multiplied as dense (400, 120, 120)
stacks; the Floquet operators are diagonalised through the Cayley transform
A = i(1 - W)(1 + W)^{-1} and batched np.linalg.eigh (the route of
src/numerics/linalg/unitary-eigen.ts), eigenphases as Rayleigh quotients;
edge weights over 15 cells on each side.
"""
import numpy as np

from _honeycomb import BONDS
from _honeycomb import step_operator as honeycomb_step
from _measure import measure

J, DELTA, TAU = 0.45 * np.pi, 0.3, 1.0
WIDTH, MOMENTA, EDGE = 60, 400, 15
SIZE = 2 * WIDTH


def step_operator(s, n1, n2):
    """exp(-i H tau) for the step with bond (n1, n2), finite along a1 (bench/numpy/_honeycomb.py)."""
    return honeycomb_step(s, n1, n2, WIDTH, J, DELTA, TAU)


def unitary_eigh(u):
    cut = np.pi * (3 - np.sqrt(5))
    w = np.exp(-1j * (cut - np.pi)) * u
    eye = np.eye(u.shape[-1])
    a = 2j * np.linalg.solve(eye + w, np.broadcast_to(eye, w.shape)) - 1j * eye
    a = 0.5 * (a + np.conj(np.swapaxes(a, -1, -2)))
    _, v = np.linalg.eigh(a)
    uv = u @ v
    phases = np.angle(np.einsum("kij,kij->kj", np.conj(v), uv))
    return phases, v


def work():
    s = (np.arange(MOMENTA) + 0.5) / MOMENTA
    u = np.broadcast_to(np.eye(SIZE, dtype=complex), (MOMENTA, SIZE, SIZE)).copy()
    for n1, n2 in BONDS:
        u = step_operator(s, n1, n2) @ u
    phases, v = unitary_eigh(u)
    weight = (np.abs(v) ** 2).reshape(MOMENTA, WIDTH, 2, SIZE).sum(axis=2)
    low, high = weight[:, :EDGE, :].sum(axis=1), weight[:, -EDGE:, :].sum(axis=1)
    eps = np.sort(np.mod(-phases / np.pi + 1, 2) - 1, axis=1)
    return {
        "states": int(eps.size),
        "statesAbove80PercentOnOneEdge": int(np.sum((low > 0.8) | (high > 0.8))),
        "quasienergiesAtFirstMomentum": [float(eps[0, 0]), float(eps[0, -1])],
    }


measure("ribbon-honeycomb", work)
