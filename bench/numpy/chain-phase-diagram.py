"""numpy twin of bench/workloads/chain-phase-diagram.ts: (nu_0, nu_pi) of the
two-step chain on an N x N grid of (theta1, theta2) in (0, pi)^2.

Same method: symmetric frames t0 = T/4 and 3T/4 (known analytically here),
H_eff = (i/T) log U with the cut at pi/T, winding of the lower-left block of
H_eff in the sigma_z basis on a uniform k grid of 256 points (the TypeScript
engine refines adaptively); points where a step exceeds pi/2 are counted as
unresolved instead of classified.
"""
import json, os, time
import numpy as np

N = int(os.environ.get("CHAIN_GRID", "201"))
K = 256
ks = 2 * np.pi * np.arange(K) / K


def rot(theta, nx, ny):
    """exp(-i theta (nx sx + ny sy)) for arrays nx, ny over k: shape (K, 2, 2)."""
    c, s = np.cos(theta), np.sin(theta)
    m = np.empty((len(nx), 2, 2), complex)
    m[:, 0, 0] = c
    m[:, 1, 1] = c
    m[:, 0, 1] = -1j * s * (nx - 1j * ny)
    m[:, 1, 0] = -1j * s * (nx + 1j * ny)
    return m


def winding(u):
    w, v = np.linalg.eig(u)
    eps = -np.angle(w)  # quasienergy * T in (-pi, pi]
    h = np.einsum("kij,kj,kjl->kil", v, eps, np.linalg.inv(v))
    z = h[:, 1, 0]
    d = np.angle(np.roll(z, -1) / z)
    return int(np.rint(d.sum() / (2 * np.pi))), bool(np.max(np.abs(d)) >= np.pi / 2)


ones, zeros = np.ones(K), np.zeros(K)
start = time.perf_counter()
counts = {}
unresolved = 0
for i in range(N):
    for j in range(N):
        t1, t2 = (i + 0.5) / N * np.pi, (j + 0.5) / N * np.pi
        a_half = rot(t1 / 2, ones, zeros)
        b_half = rot(t2 / 2, np.cos(ks), np.sin(ks))
        u1 = a_half @ rot(t2, np.cos(ks), np.sin(ks)) @ a_half
        u2 = b_half @ rot(t1, ones, zeros) @ b_half
        (n1, c1), (n2, c2) = winding(u1), winding(u2)
        if c1 or c2:
            unresolved += 1
            continue
        key = f"{abs((n1 + n2) // 2)},{abs((n1 - n2) // 2)}"
        counts[key] = counts.get(key, 0) + 1
seconds = time.perf_counter() - start
print(json.dumps({"workload": "chain-phase-diagram", "grid": [N, N], "seconds": seconds, "pointsPerSecond": N * N / seconds, "phases": counts, "unresolved": unresolved, "numpy": np.__version__}))
