"""numpy twin of bench/workloads/gap-winding.ts.

Rudner-Lindner-Berg-Levin winding numbers in the gaps 0 and pi of the five-step
checkerboard drive (J tau = 0.4 pi, Delta tau = 0.3, tau = 1), with the same
discretisation as src/numerics/winding-integral.ts: central differences of
order 8 in momentum, Gauss-Legendre nodes on each step, V = U Q_F diag(e^{i theta t/T}) Q_F^dagger,
A_t = i(X - V^dagger H V). Every operation is batched over the whole momentum
grid ((K, 2, 2) stacks, np.linalg.eigh / eig, matmul). Grids grow 16, 24, 36, ...
uniformly (this twin has no probe for small gaps) until two successive levels
lie within 1e-3 of the same integer, as in the TypeScript engine.
"""
import numpy as np

from _measure import measure

J, DELTA, TAU = 0.4 * np.pi, 0.3, 1.0
BONDS = [(0, 0), (0, 1), (-1, 1), (-1, 0)]
T = 5 * TAU
CUTS = [0.0, 1.0]
TOL = 1e-3
RADIUS = 4


def step_hamiltonians(s1, s2):
    k = s1.size
    hs = []
    for n1, n2 in BONDS:
        h = np.zeros((k, 2, 2), complex)
        h[:, 1, 0] = J * np.exp(-2j * np.pi * (s1 * n1 + s2 * n2))
        h[:, 0, 1] = np.conj(h[:, 1, 0])
        hs.append(h)
    h = np.zeros((k, 2, 2), complex)
    h[:, 0, 0], h[:, 1, 1] = DELTA, -DELTA
    hs.append(h)
    return hs


def dagger(a):
    return np.conj(np.swapaxes(a, -1, -2))


def exp_from_eigh(w, q, t):
    return (q * np.exp(-1j * w * t)[:, None, :]) @ dagger(q)


def central_difference(r):
    from math import factorial
    rr = factorial(r) ** 2
    return [(1 if j % 2 else -1) * rr / (j * factorial(r - j) * factorial(r + j)) for j in range(1, r + 1)]


def nodes_per_step(spreads, length):
    return [int(np.ceil(4 + 0.6 * TAU * (sp + 2 * np.pi / length))) for sp in spreads]


def winding_on_grid(n, level):
    s = np.arange(n) / n
    s1, s2 = (x.ravel() for x in np.meshgrid(s, s, indexing="ij"))
    count = s1.size
    hs = step_hamiltonians(s1, s2)
    eig = [np.linalg.eigh(h) for h in hs]
    spreads = [float(np.max(w[:, -1] - w[:, 0])) for w, _ in eig]
    nodes = [m + 2 * level for m in nodes_per_step(spreads, T)]
    u = np.broadcast_to(np.eye(2, dtype=complex), (count, 2, 2)).copy()
    for w, q in eig:
        u = exp_from_eigh(w, q, TAU) @ u
    lam, qf = np.linalg.eig(u)
    qf = qf / np.linalg.norm(qf, axis=1, keepdims=True)
    phi = np.angle(lam)
    thetas, xs = [], []
    for cut in CUTS:
        c = cut * np.pi
        th = c - np.mod(c + phi, 2 * np.pi)
        thetas.append(th)
        xs.append((qf * (th / T)[:, None, :]) @ dagger(qf))
    qfh = dagger(qf)
    coef = central_difference(RADIUS)
    sums = np.zeros(len(CUTS))
    start = np.broadcast_to(np.eye(2, dtype=complex), (count, 2, 2)).copy()
    t0 = 0.0
    for p, (w, q) in enumerate(eig):
        h = hs[p]
        xg, wg = np.polynomial.legendre.leggauss(nodes[p])
        for xi, wi in zip(xg, wg):
            tau = TAU / 2 * (1 + xi)
            weight = TAU / 2 * wi
            tp = t0 + tau
            wmat = exp_from_eigh(w, q, tau) @ start @ qf
            for g in range(len(CUTS)):
                v = (wmat * np.exp(1j * thetas[g] * tp / T)[:, None, :]) @ qfh
                grid = v.reshape(n, n, 2, 2)
                d1 = np.zeros_like(grid)
                d2 = np.zeros_like(grid)
                for j, c in enumerate(coef, start=1):
                    d1 += c * n * (np.roll(grid, -j, axis=0) - np.roll(grid, j, axis=0))
                    d2 += c * n * (np.roll(grid, -j, axis=1) - np.roll(grid, j, axis=1))
                vh = dagger(v)
                a1 = vh @ d1.reshape(count, 2, 2)
                a2 = vh @ d2.reshape(count, 2, 2)
                comm = a1 @ a2 - a2 @ a1
                y = xs[g] - vh @ (h @ v)
                tr = np.einsum("kij,kji->k", y, comm)
                sums[g] += weight * float(-tr.imag.sum()) / count
        start = exp_from_eigh(w, q, TAU) @ start
        t0 += TAU
    return sums / (8 * np.pi ** 2), sum(nodes)


def work():
    history = [[] for _ in CUTS]
    done = [False] * len(CUTS)
    n, level = 16, 0
    while not all(done) and n <= 129:
        size = n + (n % 2)
        values, tnodes = winding_on_grid(size, level)
        for g, value in enumerate(values):
            if done[g]:
                continue
            history[g].append(([size, size, tnodes], float(value)))
            if len(history[g]) > 1:
                prev = history[g][-2][1]
                if abs(value - round(value)) <= TOL and abs(value - prev) <= TOL and round(prev) == round(value):
                    done[g] = True
        n = int(round(n * 1.5))
        level += 1
    return [
        {"gap": cut, "winding": round(h[-1][1]), "raw": h[-1][1], "converged": done[g], "grids": [x[0] for x in h]}
        for g, (cut, h) in enumerate(zip(CUTS, history))
    ]


measure("gap-winding", work)
