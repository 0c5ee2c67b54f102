#!/usr/bin/env python3
"""Reference for observables' square-corner test (run offline; tests never run Python).

Quantum walk H = A (adjacency of the open 48x48 square lattice, hbar = 1),
started on the corner site (0, 0). Propagates with scipy.sparse.linalg.expm_multiply
on a fine log-spaced grid t in [0.5, 6] and takes the local exponent
d ln MSD / d ln t by numpy.gradient (second-order central differences).
Writes the peak value and its time to square_corner_peak.txt.
"""
import numpy as np
import scipy
import scipy.sparse as sp
from scipy.sparse.linalg import expm_multiply

w = 48
n = w * w
rows, cols = [], []
for y in range(w):
    for x in range(w):
        i = x + w * y
        if x + 1 < w:
            rows += [i, i + 1]; cols += [i + 1, i]
        if y + 1 < w:
            rows += [i, i + w]; cols += [i + w, i]
A = sp.csr_matrix((np.ones(len(rows)), (rows, cols)), shape=(n, n)).astype(complex)
xs = np.array([i % w for i in range(n)], float)
ys = np.array([i // w for i in range(n)], float)
r2 = xs**2 + ys**2
psi0 = np.zeros(n, complex); psi0[0] = 1
ts = np.exp(np.linspace(np.log(0.5), np.log(6.0), 801))
psi = psi0
msd = []
tprev = 0.0
for t in ts:
    psi = expm_multiply(-1j * (t - tprev) * A, psi)
    tprev = t
    msd.append(float(np.sum(np.abs(psi)**2 * r2)))
le = np.gradient(np.log(msd), np.log(ts))
k = int(np.argmax(le))
with open("square_corner_peak.txt", "w") as f:
    f.write("# scipy %s numpy %s: peak of d ln MSD/d ln t, 48x48 open square, corner start\n" % (scipy.__version__, np.__version__))
    f.write("%.6f %.6f\n" % (le[k], ts[k]))
print(le[k], ts[k])
