#!/usr/bin/python3
"""Reference for TestFixClassicalRoundingFloor: the classical walk of
stiff_classical.jsonl (a 40-site chain, rates 1e-3 and 1e3 alternating,
gamma = 0.8, start at site 13) at t = 1000, by uniformisation in numpy long
double (80-bit on x86): p(t) = sum_k Poisson(k; Lam t) (I - L/Lam)^k p(0) with
Lam just above the largest degree, so I - L/Lam is non-negative and the sum
has no cancellation (Jensen, Skand. Aktuarietidskr. 36, 87 (1953); from
memory). Prints the populations the test compares and sum(p) - 1.

    /usr/bin/python3 walk/testdata/audit/stiff_classical_ref.py
"""
import json
import math
import os

import numpy as np

job = json.loads(open(os.path.join(os.path.dirname(__file__), "stiff_classical.jsonl")).readline())
n = job["lattice"]["sites"]
gamma = job["hopping"]
w = np.zeros(n - 1, np.longdouble)
for i, j, x in job["lattice"]["bonds"]:
    w[min(i, j)] = np.longdouble(gamma) * np.longdouble(x)
deg = np.zeros(n, np.longdouble)
deg[:-1] += w
deg[1:] += w
lam_rate = np.longdouble(float(deg.max()) * 1.0001)


def populations(t, start):
    lam = lam_rate * np.longdouble(t)
    K = int(float(lam) + 12 * math.sqrt(float(lam)) + 50)
    m = int(float(lam))
    wts = np.zeros(K + 1, np.longdouble)  # Poisson weights from the mode outwards
    wts[m] = 1
    for k in range(m, K):
        wts[k + 1] = wts[k] * lam / (k + 1)
    for k in range(m, 0, -1):
        wts[k - 1] = wts[k] * k / lam
    wts /= wts.sum()
    v = np.zeros(n, np.longdouble)
    v[start] = 1
    acc = np.zeros(n, np.longdouble)
    for k in range(K + 1):
        if wts[k] > 1e-40:
            acc += wts[k] * v
        lv = deg * v
        lv[:-1] -= w * v[1:]
        lv[1:] -= w * v[:-1]
        v = v - lv / lam_rate
    return acc


p = populations(1000.0, job["start"]["site"])
print("sum - 1 = %.1e" % float(p.sum() - 1))
for site in (12, 13):
    print("p[%d](1000) = %r" % (site, float(p[site])))
