"""numpy twin of bench/workloads/gap-winding.ts.

Rudner-Lindner-Berg-Levin winding numbers in the gaps 0 and pi of the five-step
checkerboard drive (J tau = 0.4 pi, Delta tau = 0.3, tau = 1), with the same
method as src/numerics/winding*.ts: central differences of order 8 in momentum,
Gauss-Legendre nodes on each step, V = U Q_F diag(e^{i theta t/T}) Q_F^dagger,
A_t = i(X - V^dagger H V), and the same grid placement (a 24 x 24 probe of the
distance from each cut to the spectrum, compass/Newton polishing of its local
minima, a ladder of wrapped-Cauchy foci w, 8w, ... per axis). Every grid-wide
operation is batched over the momentum grid ((K, 2, 2) stacks, np.linalg.eigh /
eig, matmul). Grids grow 16, 24, 36, ... until two successive levels lie within
1e-3 of the same integer, as in the TypeScript engine.
"""
import numpy as np

from _checkerboard import dagger, exp_from_eigh, step_hamiltonians
from _measure import measure

J, DELTA, TAU = 0.4 * np.pi, 0.3, 1.0
T = 5 * TAU
CUTS = [0.0, 1.0]
TOL = 1e-3
RADIUS = 4


def central_difference(r):
    from math import factorial
    rr = factorial(r) ** 2
    return [(1 if j % 2 else -1) * rr / (j * factorial(r - j) * factorial(r + j)) for j in range(1, r + 1)]


def nodes_per_step(spreads, length):
    return [int(np.ceil(4 + 0.6 * TAU * (sp + 2 * np.pi / length))) for sp in spreads]


def floquet(s1, s2):
    u = np.broadcast_to(np.eye(2, dtype=complex), (s1.size, 2, 2)).copy()
    for h in step_hamiltonians(s1, s2, J, DELTA):
        w, q = np.linalg.eigh(h)
        u = exp_from_eigh(w, q, TAU) @ u
    return u


def distance_to_cut(s1, s2, cut):
    """Distance (units pi/T) from the cut to the nearest quasienergy, batched."""
    phi = np.angle(np.linalg.eigvals(floquet(np.atleast_1d(s1), np.atleast_1d(s2))))
    eps = -phi / np.pi
    diff = np.mod(eps - cut + 1, 2) - 1
    return np.min(np.abs(diff), axis=-1)


def polish(f, x, h, floor):
    fx = float(f(x)[0])
    for _ in range(200):
        if h <= 1e-11 or fx <= floor * floor:
            break
        pts = np.array([[x[0] + h, x[1]], [x[0] - h, x[1]], [x[0], x[1] + h], [x[0], x[1] - h], [x[0] + h, x[1] + h]])
        vals = f(pts.T)
        p1, m1, p2, m2, pp = vals
        g = np.array([(p1 - m1) / (2 * h), (p2 - m2) / (2 * h)])
        h11, h22 = (p1 - 2 * fx + m1) / h ** 2, (p2 - 2 * fx + m2) / h ** 2
        h12 = (pp - p1 - p2 + fx) / h ** 2
        det = h11 * h22 - h12 * h12
        cand, cval = list(pts), list(vals)
        if h11 > 0 and det > 0:
            step = -np.array([h22 * g[0] - h12 * g[1], h11 * g[1] - h12 * g[0]]) / det
            if np.hypot(*step) <= 4 * h:
                cand.append(x + step)
                cval.append(float(f(x + step)[0]))
        b = int(np.argmin(cval))
        if cval[b] < fx:
            moved = np.hypot(*(cand[b] - x))
            x, fx = np.asarray(cand[b], float), float(cval[b])
            if moved < h:
                h = max(moved, h / 4)
        else:
            curv = max(h11, h22, 0) / 2
            if curv > 0 and h * np.sqrt(curv) < 0.02 * np.sqrt(fx):
                break
            h /= 4
    return np.mod(x, 1), fx


def probe_foci(cut, n=24, sharp=4 / 16, floor=1e-7):
    s = np.arange(n) / n
    g1, g2 = np.meshgrid(s, s, indexing="ij")
    d = distance_to_cut(g1.ravel(), g2.ravel(), cut).reshape(n, n)
    better = np.zeros((n, n), bool)
    idx = np.arange(n * n).reshape(n, n)
    for a in (-1, 0, 1):
        for b in (-1, 0, 1):
            if a == 0 and b == 0:
                continue
            nb, ni = np.roll(d, (-a, -b), (0, 1)), np.roll(idx, (-a, -b), (0, 1))
            better |= (nb < d) | ((nb == d) & (ni < idx))
    minima = sorted(zip(d[~better], idx[~better]))
    slope = np.max([(np.roll(d, sh, ax) - d) * n for sh in (1, -1) for ax in (0, 1)], axis=0)
    foci = []
    f = lambda x: distance_to_cut(np.atleast_1d(x[0]), np.atleast_1d(x[1]), cut) ** 2
    for rank, (dv, i) in enumerate(minima):
        if len(foci) >= 6:
            break
        i1, i2 = divmod(int(i), n)
        if rank > 0 and not dv < 2 * sharp * slope[i1, i2]:
            continue
        at, fx = polish(f, np.array([i1 / n, i2 / n]), 1 / n, floor)
        dist = np.sqrt(fx)
        dw = 0.25 / n
        widths = []
        for e in ((dw, 0), (0, dw)):
            plus, minus = (float(distance_to_cut(at[0] + sg * e[0], at[1] + sg * e[1], cut)[0]) for sg in (1, -1))
            v2 = ((plus ** 2 + minus ** 2) / 2 - dist ** 2) / dw ** 2
            widths.append(dist / np.sqrt(v2) if v2 > 0 else np.inf)
        if any(np.hypot(*(np.abs(fo[0] - at) - np.round(np.abs(fo[0] - at)))) < 1e-6 for fo in foci):
            continue
        foci.append((at, dist, widths))
    return foci


def graded_axis(n, foci):
    """Inverse cumulative of (1 - a) + a * mean of wrapped Cauchy densities, by vectorised bisection."""
    if not foci:
        return np.arange(n) / n
    c = np.array([f[0] for f in foci])[:, None]
    r = np.exp(-2 * np.pi * np.maximum(np.array([f[1] for f in foci]), 1e-12))[:, None]

    def part(x):
        th = 2 * np.pi * (x[None, :] - c)
        return x[None, :] - c + np.arctan2(r * np.sin(th), 1 - r * np.cos(th)) / np.pi

    def cdf(x):
        return 0.5 * x + 0.5 * np.mean(part(x) - part(np.zeros_like(x)), axis=0)

    target = np.arange(n) / n
    lo, hi = np.zeros(n), np.ones(n)
    for _ in range(60):
        mid = 0.5 * (lo + hi)
        below = cdf(mid) < target
        lo, hi = np.where(below, mid, lo), np.where(below, hi, mid)
    out = 0.5 * (lo + hi)
    out[0] = 0.0
    return out


def winding_on_grid(n, level, axes_foci):
    a1, a2 = graded_axis(n, axes_foci[0]), graded_axis(n, axes_foci[1])
    s1, s2 = (x.ravel() for x in np.meshgrid(a1, a2, indexing="ij"))
    count = s1.size
    hs = step_hamiltonians(s1, s2, J, DELTA)
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
    axes_foci = ([], [])
    for cut in CUTS:
        for at, _dist, widths in probe_foci(cut):
            for axis in (0, 1):
                w = widths[axis]
                while w < 4 / 16:
                    axes_foci[axis].append((at[axis], w))
                    w *= 8
    history = [[] for _ in CUTS]
    done = [False] * len(CUTS)
    n, level = 16, 0
    while not all(done) and n <= 129:
        size = n + (n % 2)
        values, tnodes = winding_on_grid(size, level, axes_foci)
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
