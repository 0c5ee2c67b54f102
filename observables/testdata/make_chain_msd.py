#!/usr/bin/python3
"""Reference MSD curves of walks on an 801-site chain started at the middle
site, for the regime-analysis regression tests (regimes_fix_test.go).

Quantum: psi(t) = exp(-iHt) e_400 with H the chain adjacency (gamma = 1),
computed by dense diagonalisation (scipy.linalg.eigh); MSD = sum_j p_j (j-400)^2.
The chain is long enough that the front (speed 2) reaches the ends at t ~ 200,
so the MSD is 2t^2 (to rounding) up to about t = 180 and then bends down.
Classical: exact MSD = 2t for the infinite line; on the finite chain it agrees
to rounding up to t = 300 with 400 sites on each side, but the file records the
computed value of p(t) = exp(-Lt) e_400 for the same reason.
Times: 60 log-spaced points from 0.01 to 300.
Run offline: /usr/bin/python3 make_chain_msd.py > chain_msd.json
"""
import json
import numpy as np
import scipy
from scipy.linalg import eigh

n, s = 801, 400
A = np.zeros((n, n))
for i in range(n - 1):
    A[i, i + 1] = A[i + 1, i] = 1.0
L = np.diag(A.sum(axis=1)) - A
times = np.geomspace(0.01, 300, 60)
x2 = (np.arange(n) - s) ** 2.0
w, V = eigh(A)
wl, Vl = eigh(L)
q, c = [], []
for t in times:
    psi = V @ (np.exp(-1j * w * t) * V[s, :])
    q.append(float(np.sum(np.abs(psi) ** 2 * x2)))
    p = Vl @ (np.exp(-wl * t) * Vl[s, :])
    c.append(float(np.sum(p * x2)))
json.dump({"source": "numpy %s, scipy %s, dense eigh" % (np.__version__, scipy.__version__),
           "times": [float(t) for t in times], "quantum_msd": q, "classical_msd": c}, __import__("sys").stdout, indent=0)
