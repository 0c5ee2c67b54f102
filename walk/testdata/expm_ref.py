#!/usr/bin/python3
"""Reference states for walk/reference_test.go, made offline with SciPy.

Builds two small graphs from the formulas below (no random numbers, so the
Go test rebuilds them exactly from the bond lists stored in the output),
and propagates a basis state with scipy.linalg.expm (Pade approximation with
scaling and squaring; Al-Mohy & Higham, SIAM J. Matrix Anal. Appl. 31, 970
(2009)) on the dense matrices:

  quantum:   psi(t) = expm(-1j * t * H) psi0,  H = W + diag(eps), W Hermitian
             with Peierls phases, H[i][j] = w e^{i phi}, H[j][i] = conj
  classical: p(t)   = expm(-t * L) p0,         L = D - W (weights only)

Run:  /usr/bin/python3 walk/testdata/expm_ref.py > walk/testdata/expm_ref.json
"""
import json
import math

import numpy as np
import scipy
import scipy.linalg


def graph(n):
    bonds = []
    seen = set()
    for i in range(n):
        for j, w, ph in (((i + 1) % n, 1.0 + 0.1 * (i % 7), 0.0),
                         ((7 * i + 3) % n, 0.5 + 0.05 * (i % 5), 0.3 * (i % 4))):
            a, b = min(i, j), max(i, j)
            if a == b or (a, b) in seen:
                continue
            seen.add((a, b))
            bonds.append([i, j, w, ph])
    onsite = [0.2 * math.sin(i) for i in range(n)]
    return bonds, onsite


def hamiltonian(n, bonds, onsite):
    h = np.zeros((n, n), dtype=complex)
    for i, j, w, ph in bonds:
        h[i, j] += w * np.exp(1j * ph)
        h[j, i] += w * np.exp(-1j * ph)
    h += np.diag(onsite)
    return h


def laplacian(n, bonds):
    l = np.zeros((n, n))
    for i, j, w, _ in bonds:
        l[i, j] -= w
        l[j, i] -= w
        l[i, i] += w
        l[j, j] += w
    return l


out = {"generator": "scipy.linalg.expm, scipy %s, numpy %s" % (scipy.__version__, np.__version__),
       "cases": []}
for n, start, times in ((50, 0, [0.3, 2.0, 17.5]), (64, 20, [1.0, 6.0, 40.0])):
    bonds, onsite = graph(n)
    h = hamiltonian(n, bonds, onsite)
    l = laplacian(n, bonds)
    psi0 = np.zeros(n, dtype=complex)
    psi0[start] = 1
    q, c = [], []
    for t in times:
        psi = scipy.linalg.expm(-1j * t * h) @ psi0
        p = scipy.linalg.expm(-t * l) @ psi0.real
        q.append([[float(z.real), float(z.imag)] for z in psi])
        c.append([float(v) for v in p])
    out["cases"].append({"sites": n, "bonds": bonds, "onsite": onsite, "start": start,
                         "times": times, "quantum": q, "classical": c})
print(json.dumps(out))
