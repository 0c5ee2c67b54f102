#!/usr/bin/python3
"""Reference data for spectra's dense tests, made offline with numpy.

Run: /usr/bin/python3 make_reference.py > reference_random_graph.json
(numpy 1.24.2, Debian python3-numpy). Tests read the JSON; they never run Python.

A random graph of 40 sites with complex (Peierls-phase) bonds and on-site
energies; H = gamma*W + diag(eps) with H[i][j] = gamma*w*exp(i*phase) for each
listed bond (i, j) and its conjugate at [j][i]. numpy.linalg.eigh gives the
eigenvalues, the inverse participation ratio of every eigenstate, and the
energy-window map sum_{E_n in [-1, 1]} |psi_n(r)|^2.
"""
import json
import numpy as np

rng = np.random.default_rng(20261201)
n, gamma = 40, 0.8
bonds = set()
while len(bonds) < 120:
    i, j = rng.integers(0, n, size=2)
    if i != j:
        bonds.add((int(min(i, j)), int(max(i, j))))
bonds = sorted(bonds)
w = rng.normal(size=len(bonds))
ph = rng.uniform(-np.pi, np.pi, size=len(bonds))
eps = rng.normal(size=n) * 0.5
H = np.diag(eps).astype(complex)
for (i, j), wk, pk in zip(bonds, w, ph):
    H[i, j] += gamma * wk * np.exp(1j * pk)
    H[j, i] += gamma * wk * np.exp(-1j * pk)
vals, vecs = np.linalg.eigh(H)
p = np.abs(vecs) ** 2
ipr = (p ** 2).sum(axis=0)
win = p[:, (vals >= -1) & (vals <= 1)].sum(axis=1)
json.dump({
    "source": "numpy %s linalg.eigh" % np.__version__,
    "n": n, "gamma": gamma,
    "bonds": [[i, j, float(wk), float(pk)] for (i, j), wk, pk in zip(bonds, w, ph)],
    "onsite": [float(x) for x in eps],
    "values": [float(x) for x in vals],
    "ipr": [float(x) for x in ipr],
    "window": [-1.0, 1.0],
    "window_map": [float(x) for x in win],
}, __import__("sys").stdout, indent=1)
