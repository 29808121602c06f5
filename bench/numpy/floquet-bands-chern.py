"""numpy twin of bench/workloads/floquet-bands-chern.ts.

Quasienergy bands of the five-step checkerboard drive (J tau = pi/2,
Delta tau = 0.5, tau = 1) on a 100 x 100 grid, batched over the grid:
each step exp(-i H tau) from np.linalg.eigh of the (K, 2, 2) stack, the
Floquet operator by batched matmul, its eigen-decomposition by np.linalg.eig,
then the Fukui-Hatsugai-Suzuki sum for each band (links by np.roll).
"""
import numpy as np

from _checkerboard import exp_from_eigh, step_hamiltonians
from _measure import measure

J, DELTA, TAU, N = np.pi / 2, 0.5, 1.0, 100


def work():
    s = np.arange(N) / N
    s1, s2 = (x.ravel() for x in np.meshgrid(s, s, indexing="ij"))
    k = s1.size
    hs = step_hamiltonians(s1, s2, J, DELTA)
    u = np.broadcast_to(np.eye(2, dtype=complex), (k, 2, 2)).copy()
    for h in hs:
        w, q = np.linalg.eigh(h)
        u = exp_from_eigh(w, q, TAU) @ u
    lam, vec = np.linalg.eig(u)
    vec = vec / np.linalg.norm(vec, axis=1, keepdims=True)
    eps = np.mod(-np.angle(lam) / np.pi + 1, 2) - 1  # units pi/T, in [-1, 1)
    eps = np.where(eps == -1, 1.0, eps)
    order = np.argsort(eps, axis=1)
    eps = np.take_along_axis(eps, order, axis=1)
    vec = np.take_along_axis(vec, order[:, None, :], axis=2)
    bands = []
    for lower, upper, col in ((1, 0, 0), (0, 1, 1)):
        u_k = vec[:, :, col].reshape(N, N, 2)
        link1 = np.sum(np.conj(u_k) * np.roll(u_k, -1, axis=0), axis=-1)
        link2 = np.sum(np.conj(u_k) * np.roll(u_k, -1, axis=1), axis=-1)
        flux = np.angle(link1 * np.roll(link2, -1, axis=0) * np.conj(np.roll(link1, -1, axis=1)) * np.conj(link2))
        bands.append({"between": [lower, upper], "chern": float(flux.sum() / (2 * np.pi)), "maxFlux": float(np.abs(flux).max())})
    return {"grid": [N, N], "quasienergyRange": [float(eps.min()), float(eps.max())], "bands": bands}


measure("floquet-bands-chern", work)
