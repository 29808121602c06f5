"""Step exponentials of a ribbon of the three-step honeycomb drive, shared by the numpy twins.

Kitagawa, Berg, Rudner, Demler, PRB 82, 235114 (2010): in step n only bond delta_n hops
(amplitude J) and a sublattice potential +-delta acts throughout. On a ribbon the states are
A(c) = 2c, B(c) = 2c + 1 for cells c = 0 ... width-1; each step is a set of disjoint A-B dimers
plus the potential, so its exponential has a closed form: for H = [[delta, J conj(p)], [J p,
-delta]] on a dimer, exp(-i H tau) = cos(r tau) - i sin(r tau) H / r with r = |(J, delta)|.
"""
import numpy as np

# Cells (along a1, along a2) of the B neighbour of A in cell 0 for the three bonds.
BONDS = [(0, 0), (0, -1), (1, -1)]


def step_operator(s, finite, periodic, width, hopping, delta, tau):
    """exp(-i H tau) of one step at reduced momenta s (array): bond offset `finite` cells across the
    ribbon and `periodic` cells along it (Bloch phase e^{-2 pi i s periodic}); shape (len(s), 2w, 2w)."""
    size = 2 * width
    out = np.zeros((len(s), size, size), complex)
    paired = np.zeros(size, bool)
    r = np.hypot(hopping, delta)
    c, sn = np.cos(r * tau), np.sin(r * tau) / r
    phase = np.exp(-2j * np.pi * s * periodic)
    for cell in range(width):
        target = cell + finite
        if not 0 <= target < width:
            continue
        a, b = 2 * cell, 2 * target + 1
        paired[a] = paired[b] = True
        out[:, a, a] = c - 1j * sn * delta
        out[:, b, b] = c + 1j * sn * delta
        out[:, b, a] = -1j * sn * hopping * phase
        out[:, a, b] = -1j * sn * hopping * np.conj(phase)
    for i in np.flatnonzero(~paired):
        out[:, i, i] = np.exp(-1j * tau * (delta if i % 2 == 0 else -delta))
    return out
