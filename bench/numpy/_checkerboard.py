"""Five-step checkerboard drive for the numpy twins, batched over momenta.

Same model as test/support/drives/checkerboard.ts (Rudner, Lindner, Berg, Levin,
PRX 3, 031005 (2013)): A at the origin, B neighbours in cells (0,0), (0,1),
(-1,1), (-1,0) for steps 1-4 (hopping J), step 5 the offset +Delta on A,
-Delta on B; Bloch convention H_ba = sum_n t e^{-2 pi i s.n} + h.c.
"""
import numpy as np

BONDS = [(0, 0), (0, 1), (-1, 1), (-1, 0)]


def dagger(a):
    return np.conj(np.swapaxes(a, -1, -2))


def step_hamiltonians(s1, s2, hopping, offset):
    """The five step Hamiltonians as (K, 2, 2) stacks for reduced momenta s1, s2 (flat arrays)."""
    k = s1.size
    hs = []
    for n1, n2 in BONDS:
        h = np.zeros((k, 2, 2), complex)
        h[:, 1, 0] = hopping * np.exp(-2j * np.pi * (s1 * n1 + s2 * n2))
        h[:, 0, 1] = np.conj(h[:, 1, 0])
        hs.append(h)
    h = np.zeros((k, 2, 2), complex)
    h[:, 0, 0], h[:, 1, 1] = offset, -offset
    hs.append(h)
    return hs


def exp_from_eigh(w, q, t):
    """exp(-i H t) from the batched eigen-decomposition H = q diag(w) q^dagger."""
    return (q * np.exp(-1j * w * t)[:, None, :]) @ dagger(q)
