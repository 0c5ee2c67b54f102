#!/usr/bin/python3
"""Reference spectra of open lattices in a uniform magnetic field.

Makes flux_spectra.json for lattice/flux_test.go. The lattices are built here
independently of the Go code and the Peierls phases use the symmetric gauge
A = (B/2)(-y, x), not the Landau gauge of Graph.WithFlux, so agreement of the
(gauge-invariant) spectra checks the phase convention: phase of H[i][j] equal
to 2*pi*flux times the line integral of A from site j to site i.

Run offline with Debian's python3-numpy (numpy 1.24.2):
    /usr/bin/python3 lattice/testdata/make_flux_spectra.py > lattice/testdata/flux_spectra.json
"""
import json
import math

import numpy as np


def spectrum(pos, bonds, flux):
    n = len(pos)
    h = np.zeros((n, n), dtype=complex)
    for i, j in bonds:
        (xi, yi), (xj, yj) = pos[i], pos[j]
        # integral of (B/2)(-y dx + x dy) along the segment j -> i
        phase = 2 * math.pi * flux * 0.5 * (-(yi + yj) / 2 * (xi - xj) + (xi + xj) / 2 * (yi - yj))
        h[i, j] = np.exp(1j * phase)
        h[j, i] = np.conj(h[i, j])
    return sorted(np.linalg.eigvalsh(h).tolist())


def square(w, hgt):
    pos = [(x, y) for y in range(hgt) for x in range(w)]
    bonds = []
    for y in range(hgt):
        for x in range(w):
            i = x + w * y
            if x + 1 < w:
                bonds.append((i + 1, i))
            if y + 1 < hgt:
                bonds.append((i + w, i))
    return pos, bonds


def triangle(side):
    # all points a*(1,0) + r*(1/2, sqrt3/2) with a + r <= side; bond every
    # pair at unit distance
    pos = [(a + r / 2, r * math.sqrt(3) / 2) for r in range(side + 1) for a in range(side + 1 - r)]
    bonds = []
    for i in range(len(pos)):
        for j in range(i):
            if abs(math.dist(pos[i], pos[j]) - 1) < 1e-9:
                bonds.append((i, j))
    return pos, bonds


cases = []
for name, (pos, bonds), flux in [
    ("square 5x4", square(5, 4), 0.2),
    ("square 6x6", square(6, 6), 1 / 3),
    ("triangle 4", triangle(4), 0.15),
    ("triangle 5", triangle(5), -0.4),
]:
    cases.append({"name": name, "flux": flux, "eigenvalues": spectrum(pos, bonds, flux)})
print(json.dumps({"source": "numpy %s numpy.linalg.eigvalsh, symmetric gauge" % np.__version__, "cases": cases}, indent=1))
