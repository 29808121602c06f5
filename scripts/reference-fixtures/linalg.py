"""Reference values for the complex linear algebra tests.

Writes test/fixtures/reference/linalg.json: seeded random matrices together with
results computed by numpy / scipy (eigvalsh, eigvals of unitaries, expm, det,
solve). The tests read the JSON and never need Python. Re-run after changing the
cases:  python3 scripts/reference-fixtures/linalg.py
"""
import json
import pathlib
import sys

import numpy as np
import scipy
import scipy.linalg

SEED = 20240611
OUT = pathlib.Path(__file__).resolve().parents[2] / "test" / "fixtures" / "reference" / "linalg.json"


def split(m):
    m = np.asarray(m, dtype=complex)
    return {"rows": int(m.shape[0]), "cols": int(m.shape[1]), "re": m.real.ravel().tolist(), "im": m.imag.ravel().tolist()}


def random_hermitian(rng, n):
    a = rng.uniform(-1, 1, (n, n)) + 1j * rng.uniform(-1, 1, (n, n))
    return (a + a.conj().T) / 2


def main():
    rng = np.random.default_rng(SEED)
    hermitian = []
    for n in (3, 8, 20, 45):
        h = random_hermitian(rng, n)
        hermitian.append({"name": f"random-hermitian-{n}", "matrix": split(h), "eigenvalues": np.linalg.eigvalsh(h).tolist()})
    # Wilkinson's W21+ (tridiagonal, diagonal |10 - i|, off-diagonal 1): nearly
    # degenerate eigenvalue pairs, a classic test of symmetric eigensolvers.
    w = np.diag(np.abs(np.arange(21) - 10.0)) + np.diag(np.ones(20), 1) + np.diag(np.ones(20), -1)
    hermitian.append({"name": "wilkinson-w21plus", "matrix": split(w), "eigenvalues": np.linalg.eigvalsh(w).tolist()})
    exponential = []
    for n, t in ((2, 0.7), (4, 1.3), (9, -2.1), (16, 5.0)):
        h = random_hermitian(rng, n)
        exponential.append({"name": f"expm-{n}", "matrix": split(h), "t": t, "expMinusIHt": split(scipy.linalg.expm(-1j * t * h))})
    unitary = []
    for n in (3, 10, 30):
        h = random_hermitian(rng, n) * 3.0
        u = scipy.linalg.expm(-1j * h)
        phases = np.sort(np.angle(np.linalg.eigvals(u)))
        unitary.append({"name": f"unitary-{n}", "matrix": split(u), "phases": phases.tolist()})
    lu = []
    for n in (2, 5, 12):
        a = rng.uniform(-1, 1, (n, n)) + 1j * rng.uniform(-1, 1, (n, n))
        b = rng.uniform(-1, 1, (n, 2)) + 1j * rng.uniform(-1, 1, (n, 2))
        det = np.linalg.det(a)
        lu.append({"name": f"lu-{n}", "matrix": split(a), "rhs": split(b), "solution": split(np.linalg.solve(a, b)), "determinant": [det.real, det.imag]})
    data = {
        "generator": "scripts/reference-fixtures/linalg.py",
        "seed": SEED,
        "numpy": np.__version__,
        "scipy": scipy.__version__,
        "python": sys.version.split()[0],
        "hermitian": hermitian,
        "exponential": exponential,
        "unitary": unitary,
        "lu": lu,
    }
    OUT.parent.mkdir(parents=True, exist_ok=True)
    OUT.write_text(json.dumps(data, indent=1) + "\n")
    print(f"wrote {OUT}")


if __name__ == "__main__":
    main()
