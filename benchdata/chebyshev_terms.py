#!/usr/bin/python3
"""Lower bounds on the matrix-vector products of Chebyshev propagation.

For the benchmark jobs (gasket, log-spaced reported times), counts the terms a
Chebyshev expansion of exp(-iH dt) needs on each reporting interval when the
spectral half-width is a and the 2-norm error budget of the step is
tol*(0.5*dt/t_max + 0.5/steps) (the split walk.Propagate uses): the smallest K
with sum_{k>K} 2|J_k(a dt)| <= budget (Tal-Ezer & Kosloff, J. Chem. Phys. 81,
3967 (1984); J_k from scipy.special.jv). Summed over the intervals this is the
fewest products any restart-per-interval Chebyshev propagator can use.

It also evaluates grouping as walk/chebplan.go does it: one expansion from the
state at t_s serving the reported times t_{s+1..e} with one accumulator each,
costing K(a(t_e - t_s)) products plus omega*K_q per extra accumulator term,
omega = 0.02 (the accumulators take a ring of stored terms at once as one real
matrix product; BenchmarkChebGroupTerm), with at most 6 accumulators; the best
grouping by dynamic programming.

    /usr/bin/python3 benchdata/chebyshev_terms.py
"""
import numpy as np
from scipy.special import jv

JOBS = [("gasket10", 0.1, 500, 60), ("gasket12", 0.1, 100, 30), ("gasket14", 0.1, 200, 20)]


def terms(x, budget):
    """Smallest K with sum_{k>K} 2|J_k(x)| <= budget (0 when x = 0)."""
    if x <= 0:
        return 0
    ks = np.arange(0, int(x) + 200)
    tail = np.cumsum((2 * np.abs(jv(ks, x)))[::-1])[::-1]  # tail[k] = sum_{j>=k}
    return int(np.argmax(tail <= budget)) - 1


def restart(times, a, tol):
    tmax, n, prev, total = times[-1], len(times), 0.0, 0
    for t in times:
        dt, prev = t - prev, t
        total += terms(a * dt, tol * (0.5 * dt / tmax + 0.5 / n))
    return total


def grouped(times, a, tol, omega=0.02, maxacc=6):
    ts, n = [0.0] + list(times), len(times)
    tmax = times[-1]
    best, prods = [0.0] + [np.inf] * n, [0] * (n + 1)
    for e in range(1, n + 1):
        for s in range(max(0, e - maxacc), e):
            ks = [terms(a * (ts[q] - ts[s]), tol * (0.5 * (ts[q] - ts[s]) / tmax + 0.5 / n))
                  for q in range(s + 1, e + 1)]
            c = best[s] + ks[-1] + omega * sum(ks[:-1])
            if c < best[e]:
                best[e], prods[e] = c, prods[s] + ks[-1]
    return best[n], prods[n]


def main():
    a, tol = 3.0, 1e-10
    print(f"a = {a}, tol = {tol:g}")
    print("job       a*tmax  restart_products  ratio  grouped_products  ratio  grouped_cost  ratio")
    for name, tmin, tmax, count in JOBS:
        ts = tmin * (tmax / tmin) ** (np.arange(count) / (count - 1))
        r = restart(ts, a, tol)
        c, p = grouped(ts, a, tol)
        at = a * tmax
        print(f"{name:9s} {at:6.0f}  {r:16d}  {r / at:5.2f}  {p:16d}  {p / at:5.2f}  {c:12.0f}  {c / at:5.2f}")


if __name__ == "__main__":
    main()
