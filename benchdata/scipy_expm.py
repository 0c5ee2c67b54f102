#!/usr/bin/python3
"""The reference side of benchdata/side_by_side.sh.

Reads the graph that propbench wrote (PREFIX.bonds.i32: little-endian int32
pairs, one per bond; PREFIX.pos.f64: little-endian float64 positions, site by
site) and the job (propbench's -out JSON: sites, dim, start, times), builds the
adjacency H (hopping 1) in scipy.sparse CSR form, and steps
scipy.sparse.linalg.expm_multiply from one reported time to the next,
psi(t_k) = expm(-i H (t_k - t_{k-1})) psi(t_{k-1}), starting from the same
basis state. It writes the MSD, sum_j |psi_j|^2 |r_j - r_start|^2, at every
reported time and the seconds spent, as JSON.

    /usr/bin/python3 benchdata/scipy_expm.py --graph /tmp/g10 --job job.json --out scipy.json
"""
import argparse
import json
import time

import numpy as np
import scipy
import scipy.sparse as sp
from scipy.sparse.linalg import expm_multiply


def main():
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--graph", required=True, help="prefix of the .bonds.i32 and .pos.f64 files")
    ap.add_argument("--job", required=True, help="propbench's JSON (sites, dim, start, times)")
    ap.add_argument("--out", required=True, help="JSON file for times, msd and seconds")
    a = ap.parse_args()

    t0 = time.perf_counter()
    with open(a.job) as f:
        job = json.load(f)
    n, dim, start, times = job["sites"], job["dim"], job["start"], job["times"]
    bonds = np.fromfile(a.graph + ".bonds.i32", dtype="<i4").reshape(-1, 2)
    pos = np.fromfile(a.graph + ".pos.f64", dtype="<f8").reshape(n, dim)
    i = np.concatenate([bonds[:, 0], bonds[:, 1]])
    j = np.concatenate([bonds[:, 1], bonds[:, 0]])
    h = sp.csr_matrix((np.ones(len(i)), (i, j)), shape=(n, n))
    a_mat = (-1j * h).tocsr()
    d2 = ((pos - pos[start]) ** 2).sum(axis=1)
    psi = np.zeros(n, dtype=complex)
    psi[start] = 1
    build = time.perf_counter() - t0

    t1 = time.perf_counter()
    msd = []
    prev = 0.0
    for t in times:
        dt = t - prev
        if dt > 0:
            psi = expm_multiply(a_mat * dt, psi)
            prev = t
        msd.append(float(np.dot(np.abs(psi) ** 2, d2)))
    prop = time.perf_counter() - t1
    out = {"sites": n, "bonds": int(len(bonds)), "start": start, "times": times, "msd": msd,
           "build_seconds": build, "propagate_seconds": prop,
           "norm_drift": float(abs(np.linalg.norm(psi) - 1)),
           "scipy": scipy.__version__, "numpy": np.__version__}
    with open(a.out, "w") as f:
        json.dump(out, f)
    print(f"scipy {scipy.__version__}: {n} sites, {len(times)} times, build {build:.3f} s, "
          f"propagate {prop:.3f} s")


if __name__ == "__main__":
    main()
