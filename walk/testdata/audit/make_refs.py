#!/usr/bin/python3
"""Offline reference data for walk/audit_test.go (acceptance audit of the JSON
bridge against ../shared/spec/job-format.md).

Run with the Debian python3 (numpy 1.24.2, scipy 1.10.1):

    /usr/bin/python3 walk/testdata/audit/make_refs.py > walk/testdata/audit/refs.json

Every lattice is built here independently from the contract's text (site
order and positions as the contract fixes them; where the contract leaves the
order open only order-free quantities are compared). Quantum states are
exp(-iHt) psi0 with H = gamma*W + diag(onsite) (numpy.linalg.eigh, and
scipy.linalg.expm as a cross-check on small graphs); classical states are
exp(-gamma*L*t) p0 with L = D - W (scipy.linalg.expm / expm_multiply).
Closed forms are used where the literature gives them:
  chain, quantum:  MSD = 2 g^2 t^2, p0 = J0(2 g t)^2  (Childs, Farhi, Gutmann,
                   Quantum Inf. Process. 1, 35 (2002), from memory)
  chain, classical: MSD = 2 g t, p_n = exp(-2 g t) I_n(2 g t) (textbook
                   continuous-time random walk, from memory)
  complete graph:  p0 = 1 - 4(N-1)/N^2 sin^2(N g t/2) (Muelken & Blumen,
                   Phys. Rep. 502, 37 (2011), from memory)
  hypercube:       perfect transfer 0 -> 2^d-1 at g t = pi/2, MSD = d sin^2(g t)
                   (Christandl et al., PRL 92, 187902 (2004), from memory)
  cycle average:   (2N-1)/N^2 for odd N, (2N-2)/N^2 for even N (spectral
                   degeneracy count of the cycle, from memory)
"""
import json, math, sys
import numpy as np
import scipy
import scipy.linalg as sla
import scipy.special as sps
from scipy.sparse import csr_matrix
from scipy.sparse.linalg import expm_multiply

SQ3 = math.sqrt(3.0)


# ---------------------------------------------------------------- lattices
def chain(n, periodic=False):
    pos = [(float(i), 0.0) for i in range(n)]
    bonds = [(i, i + 1, 1.0) for i in range(n - 1)]
    if periodic and n > 2:
        bonds.append((n - 1, 0, 1.0))
    return pos, bonds


def square(w, h, periodic=False):
    pos = [(float(x), float(y)) for y in range(h) for x in range(w)]
    s = set()
    for y in range(h):
        for x in range(w):
            i = x + w * y
            if x + 1 < w or (periodic and w > 2):
                s.add(tuple(sorted((i, (x + 1) % w + w * y))))
            if y + 1 < h or (periodic and h > 2):
                s.add(tuple(sorted((i, x + w * ((y + 1) % h)))))
    return pos, [(a, b, 1.0) for a, b in sorted(s)]


def by_distance(pos, d=1.0):
    """bonds between sites at distance d (unit nearest-neighbour spacing)."""
    P = np.array(pos)
    out = []
    for i in range(len(P)):
        dd = np.linalg.norm(P[i + 1:] - P[i], axis=1)
        for j in np.nonzero(np.abs(dd - d) < 1e-9)[0]:
            out.append((i, i + 1 + int(j), 1.0))
    return out


def triangle(L):
    pos = [(i + j / 2.0, j * SQ3 / 2.0) for j in range(L + 1) for i in range(L + 1 - j)]
    return pos, by_distance(pos)


def gasket(g):
    tri = [((0.0, 0.0), 2.0 ** g)]  # lower-left corner, side
    for _ in range(g):
        nt = []
        for (x, y), s in tri:
            h = s / 2
            nt += [((x, y), h), ((x + h, y), h), ((x + h / 2, y + h * SQ3 / 2), h)]
        tri = nt
    idx, pos, bonds = {}, [], set()

    def site(p):
        k = (round(p[0] * 4), round(p[1] / SQ3 * 4))
        if k not in idx:
            idx[k] = len(pos)
            pos.append(p)
        return idx[k]
    for (x, y), s in tri:
        a = site((x, y)); b = site((x + s, y)); c = site((x + s / 2, y + s * SQ3 / 2))
        for u, v in ((a, b), (b, c), (a, c)):
            bonds.add(tuple(sorted((u, v))))
    return pos, [(a, b, 1.0) for a, b in sorted(bonds)]


def gasket_doc_order(g):
    """the site order documented by lattice.Gasket: recursive, copies
    bottom-left, bottom-right (without its left corner), top (without its two
    bottom corners)."""
    P = [(0.0, 0.0), (1.0, 0.0), (0.5, SQ3 / 2)]
    for k in range(g):
        sz = 2.0 ** k
        B = [(x + sz, y) for x, y in P[1:]]
        C = [(x + sz / 2, y + sz * SQ3 / 2) for x, y in P if not (abs(y) < 1e-9 and (abs(x) < 1e-9 or abs(x - sz) < 1e-9))]
        P = P + B + C
    pos, bonds = gasket(g)
    key = lambda p: (round(p[0] * 4), round(p[1] / SQ3 * 4))
    idx = {key(p): i for i, p in enumerate(P)}
    assert len(idx) == len(pos)
    perm = [idx[key(p)] for p in pos]  # old index -> documented index
    return P, sorted((min(perm[a], perm[b]), max(perm[a], perm[b]), w) for a, b, w in bonds)


def carpet_kept(g):
    n = 3 ** g
    keep = set()
    for y in range(n):
        for x in range(n):
            ok, xx, yy = True, x, y
            for _ in range(g):
                if xx % 3 == 1 and yy % 3 == 1:
                    ok = False
                xx //= 3; yy //= 3
            if ok:
                keep.add((x, y))
    return keep


def carpet_cells(g):
    keep = sorted(carpet_kept(g), key=lambda c: (c[1], c[0]))  # row-major, documented by lattice.Carpet
    idx = {c: i for i, c in enumerate(keep)}
    pos = [(x + 0.5, y + 0.5) for x, y in keep]
    bonds = []
    for (x, y), i in idx.items():
        for nb in ((x + 1, y), (x, y + 1)):
            if nb in idx:
                bonds.append((i, idx[nb], 1.0))
    return pos, bonds


def carpet_corners(g):
    keep = carpet_kept(g)
    edges = set()
    for x, y in keep:
        c = [(x, y), (x + 1, y), (x + 1, y + 1), (x, y + 1)]
        for k in range(4):
            edges.add(tuple(sorted((c[k], c[(k + 1) % 4]))))
    pts = sorted({p for e in edges for p in e}, key=lambda c: (c[1], c[0]))  # row-major
    idx = {p: i for i, p in enumerate(pts)}
    return [(float(x), float(y)) for x, y in pts], [(idx[a], idx[b], 1.0) for a, b in sorted(edges)]


def hypercube(d):
    pos = [tuple(float((i >> k) & 1) for k in range(d)) for i in range(2 ** d)]
    bonds = [(i, i ^ (1 << k), 1.0) for i in range(2 ** d) for k in range(d) if i < i ^ (1 << k)]
    return pos, bonds


# ---------------------------------------------------------------- dynamics
def wmatrix(n, bonds):
    W = np.zeros((n, n))
    for a, b, w in bonds:
        W[a, b] += w; W[b, a] += w
    return W


def quantum_pops(n, bonds, onsite, gamma, s, times):
    H = gamma * wmatrix(n, bonds) + np.diag(onsite if onsite is not None else np.zeros(n))
    lam, V = np.linalg.eigh(H)
    c = V[s, :].conj()
    out = []
    for t in times:
        psi = V @ (np.exp(-1j * lam * t) * c)
        out.append(np.abs(psi) ** 2)
    return np.array(out)


def quantum_pops_expm(n, bonds, onsite, gamma, s, times):
    H = gamma * wmatrix(n, bonds) + np.diag(onsite if onsite is not None else np.zeros(n))
    e = np.zeros(n, complex); e[s] = 1
    return np.array([np.abs(sla.expm(-1j * H * t) @ e) ** 2 for t in times])


def classical_pops(n, bonds, gamma, s, times):
    W = wmatrix(n, bonds)
    L = np.diag(W.sum(1)) - W
    e = np.zeros(n); e[s] = 1
    return np.array([sla.expm(-gamma * L * t) @ e for t in times])


def sparse_quantum_pops(n, bonds, gamma, s, times):
    rows = [a for a, b, w in bonds] + [b for a, b, w in bonds]
    cols = [b for a, b, w in bonds] + [a for a, b, w in bonds]
    vals = [gamma * w for a, b, w in bonds] * 2
    H = csr_matrix((np.array(vals, complex), (rows, cols)), shape=(n, n))
    e = np.zeros(n, complex); e[s] = 1
    return np.array([np.abs(expm_multiply(-1j * H * t, e)) ** 2 if t > 0 else np.abs(e) ** 2 for t in times])


def observables(P, pos, s, times):
    X = np.array(pos, float)
    d2 = ((X - X[s]) ** 2).sum(1)
    msd = P @ d2
    cen = P @ X
    spread = np.array([(p * ((X - c) ** 2).sum(1)).sum() for p, c in zip(P, cen)])
    ipr = (P ** 2).sum(1)
    ent = np.array([-(p[p > 0] * np.log(p[p > 0])).sum() for p in P])
    ret = P[:, s]
    pol = 1 - np.prod([1 - r for r, t in zip(ret, times) if t > 0])
    return dict(msd=msd, ret=ret, spread=spread, ipr=ipr, entropy=ent, polya=pol)


def nearest(pos, pt):
    X = np.array(pos, float)
    d = ((X - np.array(pt)) ** 2).sum(1)
    return int(np.flatnonzero(d == d.min())[0])


# ---------------------------------------------------------------- cases
cases = []


def L(x):
    return [float(v) for v in x]


def add(name, req, expect, atol=1e-7, source=""):
    req = dict(req); req["id"] = name
    cases.append(dict(name=name, request=req, expect=expect, atol=atol, source=source))


def walk_case(name, lat, pos, bonds, s, times, gamma=1.0, dyn="quantum", onsite=None,
              method=None, report=("msd", "return"), start=None, atol=1e-7, tol=None, source="",
              P=None, check_sites=True):
    n = len(pos)
    if P is None:
        if dyn == "quantum":
            P = quantum_pops(n, bonds, onsite, gamma, s, times)
        else:
            P = classical_pops(n, bonds, gamma, s, times)
    o = observables(P, pos, s, times)
    req = {"lattice": lat, "start": start or {"site": s}, "times": times}
    if gamma != 1.0:
        req["hopping"] = gamma
    if dyn != "quantum":
        req["dynamics"] = dyn
    if method:
        req["method"] = method
    if tol:
        req["tolerance"] = tol
    if list(report) != ["msd", "return"]:
        req["report"] = list(report)
    exp = {"times": L(times)}
    if check_sites:
        exp["sites"] = n; exp["bonds"] = len(bonds)
    for r in report:
        if r == "msd": exp["msd"] = L(o["msd"])
        if r == "return": exp["return"] = L(o["ret"])
        if r == "populations": exp["populations"] = [L(p) for p in P]
        if r == "spread": exp["spread"] = L(o["spread"])
        if r == "ipr": exp["ipr"] = L(o["ipr"])
        if r == "entropy": exp["entropy"] = L(o["entropy"])
        if r == "polya": exp["polya"] = float(o["polya"])
    add(name, req, exp, atol, source or "numpy.linalg.eigh / scipy.linalg.expm %s" % scipy.__version__)
    return P


# 1. chain closed forms, every method, hopping scaling
N = 241; mid = 120
ts = [0.25, 0.5, 1.0, 2.0, 5.0, 10.0]
for g in (1.0, 0.5, 2.0):
    for m in ("auto", "exact", "krylov", "chebyshev"):
        if m == "exact" and g != 1.0:
            continue
        pos, bonds = chain(N)
        tt = ts if g <= 1 else ts[:-1]
        add("chain-closed-g%g-%s" % (g, m),
            {"lattice": {"kind": "chain", "sites": N}, "hopping": g, "start": {"site": mid},
             "times": tt, "method": m},
            {"sites": N, "bonds": N - 1, "times": tt,
             "msd": [2 * g * g * t * t for t in tt],
             "return": [float(sps.jv(0, 2 * g * t) ** 2) for t in tt]},
            1e-7, "MSD = 2g^2t^2, p0 = J0(2gt)^2 (Childs, Farhi, Gutmann 2002, from memory); scipy.special.jv")
# start by near on the chain, same physics
add("chain-closed-near", {"lattice": {"kind": "chain", "sites": N}, "start": {"near": [mid + 0.2, 0.3]}, "times": ts},
    {"msd": [2 * t * t for t in ts], "return": [float(sps.jv(0, 2 * t) ** 2) for t in ts]},
    1e-7, "Childs, Farhi, Gutmann 2002 (from memory)")
# tie between sites 3 and 4 goes to 3 (contract: ties to the lowest index)
pos, bonds = chain(9)
walk_case("chain-near-tie", {"kind": "chain", "sites": 9}, pos, bonds, 3, [0.0, 0.7, 1.3],
          start={"near": [3.5, 0.0]}, report=("msd", "return", "populations"))
pos, bonds = square(4, 4)
walk_case("square-near-tie", {"kind": "square", "width": 4, "height": 4}, pos, bonds, 5, [0.0, 0.9],
          start={"near": [1.5, 1.5]}, report=("msd", "return", "populations"))

# 2. classical chain closed form
for g in (1.0, 0.5):
    tt = [0.5, 1.0, 3.0, 8.0]
    n = [0, 1, 2, 5]
    add("chain-classical-g%g" % g,
        {"lattice": {"kind": "chain", "sites": N}, "hopping": g, "start": {"site": mid},
         "dynamics": "classical", "times": tt, "report": ["msd", "return", "populations"]},
        {"msd": [2 * g * t for t in tt], "return": [float(sps.ive(0, 2 * g * t)) for t in tt],
         "populations_at": {"offsets": [mid + k for k in n],
                            "values": [[float(sps.ive(k, 2 * g * t)) for k in n] for t in tt]}},
        # MSD weighs the far tail by up to 120^2, so a 2-norm state error of
        # 1e-11 (within the default tolerance 1e-10) moves it by ~1e-7.
        1e-6, "MSD = 2gt, p_n = exp(-2gt) I_n(2gt) (from memory); scipy.special.ive")

# 3. complete graph as an explicit graph
for Nc, g in ((7, 1.0), (6, 0.5)):
    bonds = [[i, j] for i in range(Nc) for j in range(i + 1, Nc)]
    tt = [0.0, 0.3, 0.8, 1.7, 4.0]
    add("complete-graph-N%d-g%g" % (Nc, g),
        {"lattice": {"kind": "graph", "sites": Nc, "bonds": bonds}, "hopping": g,
         "start": {"site": 2}, "times": tt, "report": ["return"]},
        {"sites": Nc, "bonds": len(bonds),
         "return": [1 - 4 * (Nc - 1) / Nc ** 2 * math.sin(Nc * g * t / 2) ** 2 for t in tt]},
        1e-8, "p0 = 1 - 4(N-1)/N^2 sin^2(N g t/2) (Muelken & Blumen 2011, from memory)")

# 4. hypercube transfer at pi/2, MSD = d sin^2 t
for d in (3, 5):
    tt = [0.3, 1.0, math.pi / 2]
    add("hypercube-d%d" % d,
        {"lattice": {"kind": "hypercube", "dimension": d}, "start": {"site": 0}, "times": tt,
         "report": ["msd", "return", "populations"]},
        {"sites": 2 ** d, "bonds": d * 2 ** (d - 1),
         "msd": [d * math.sin(t) ** 2 for t in tt], "return": [math.cos(t) ** (2 * d) for t in tt],
         "populations_at": {"offsets": [2 ** d - 1], "values": [[math.sin(t) ** (2 * d)] for t in tt]}},
        1e-8, "Christandl et al., PRL 92, 187902 (2004), from memory")
pos, bonds = hypercube(4)
walk_case("hypercube-d4-start5", {"kind": "hypercube", "dimension": 4}, pos, bonds, 5, [0.4, 1.1],
          report=("msd", "return", "populations", "spread"))
walk_case("hypercube-d4-near", {"kind": "hypercube", "dimension": 4}, pos, bonds, 6, [0.4, 1.1],
          start={"near": [0.1, 0.9, 0.8, 0.2]}, report=("msd", "return", "populations"))

# 5. small weighted graphs with onsite energies and arbitrary positions
rng = np.random.default_rng(20261201)
for k, dim in enumerate((3, 1, 2, 5)):
    n = 7 + k
    bl = set()
    while len(bl) < n + 3:
        a, b = sorted(rng.choice(n, 2, replace=False).tolist())
        bl.add((a, b))
    bl = sorted(bl)
    w = rng.uniform(0.3, 1.7, len(bl))
    bonds = [(a, b, float(x)) for (a, b), x in zip(bl, w)]
    onsite = rng.uniform(-1, 1, n)
    pos = [tuple(float(v) for v in rng.uniform(-2, 2, dim)) for _ in range(n)]
    lat = {"kind": "graph", "sites": n, "bonds": [[a, b, x] for a, b, x in bonds],
           "positions": [list(p) for p in pos], "onsite": [float(e) for e in onsite]}
    tt = [0.0, 0.37, 1.0, 2.5, 7.0]
    rep = ("msd", "return", "populations", "spread", "ipr", "entropy", "polya")
    for m in ("auto", "exact", "krylov", "chebyshev"):
        P = walk_case("graph%d-q-%s-g0.7" % (k, m), lat, pos, bonds, k % n, tt, gamma=0.7,
                      onsite=onsite, method=m, report=rep)
    P2 = quantum_pops_expm(n, [(a, b, 0.7 * x) for a, b, x in bonds], onsite, 1.0, k % n, tt)
    assert np.abs(P - P2).max() < 1e-10, "eigh vs expm"
    latc = {kk: v for kk, v in lat.items() if kk != "onsite"}
    for m in ("auto", "exact", "krylov", "chebyshev"):
        walk_case("graph%d-c-%s-g1.3" % (k, m), latc, pos, bonds, (k + 1) % n, tt, gamma=1.3,
                  dyn="classical", method=m, report=rep)

# 6. lattices vs numpy (order-free where the contract leaves the order open)
tt = [0.5, 1.5, 4.0]
pos, bonds = square(6, 5)
walk_case("square-6x5", {"kind": "square", "width": 6, "height": 5}, pos, bonds, 6 + 6 * 2, tt,
          report=("msd", "return", "populations"))
pos, bonds = square(5, 4, True)
walk_case("square-5x4-periodic", {"kind": "square", "width": 5, "height": 4, "periodic": True},
          pos, bonds, 7, tt, report=("msd", "return", "populations"))
pos, bonds = chain(9, True)
walk_case("ring-9", {"kind": "chain", "sites": 9, "periodic": True}, pos, bonds, 4, tt,
          report=("msd", "return", "populations"))
pos, bonds = chain(12)
walk_case("chain-12-classical", {"kind": "chain", "sites": 12}, pos, bonds, 2, tt, dyn="classical",
          report=("msd", "return", "populations"))
for Lt in (1, 4, 7):
    pos, bonds = triangle(Lt)
    for corner in ((0, 0), (Lt, 0), (Lt / 2, Lt * SQ3 / 2)):
        s = nearest(pos, corner)
        walk_case("triangle-L%d-corner%g,%g" % (Lt, corner[0], corner[1]), {"kind": "triangle", "side": Lt},
                  pos, bonds, s, tt, start={"near": [corner[0] + 0.01, corner[1] + 0.01]})
for g in (0, 1, 3, 5):
    pos, bonds = gasket(g)
    assert len(pos) == (3 ** (g + 1) + 3) // 2 and len(bonds) == 3 ** (g + 1)
    for corner in ((0, 0), (2 ** g, 0), (2 ** (g - 1), 2 ** (g - 1) * SQ3)):
        s = nearest(pos, corner)
        walk_case("gasket-g%d-corner%g,%g" % (g, corner[0], corner[1]), {"kind": "gasket", "generation": g},
                  pos, bonds, s, tt, start={"near": [corner[0] + 0.01, corner[1] + 0.01]},
                  report=("msd", "return", "spread", "ipr", "entropy"))
    c = (2 ** (g - 1), 2 ** (g - 1) / SQ3)
    if g >= 1:
        s = nearest(pos, (2 ** (g - 1) * 1.0, 0.0))
        walk_case("gasket-g%d-midbase-classical" % g, {"kind": "gasket", "generation": g}, pos, bonds, s,
                  tt, dyn="classical", start={"near": [2 ** (g - 1), 0.02]})
pos, bonds = gasket(7)
s = nearest(pos, (0, 0))
tt7 = [1.0, 4.0, 10.0]
P = sparse_quantum_pops(len(pos), bonds, 1.0, s, tt7)
# (method "exact" on these sizes takes tens of seconds: checked once by hand,
# exact is covered on smaller graphs below)
for m in ("auto", "krylov", "chebyshev"):
    walk_case("gasket-g7-corner-expm_multiply-%s" % m, {"kind": "gasket", "generation": 7}, pos, bonds, s, tt7,
              start={"near": [0, 0]}, P=P, atol=1e-6, method=m,
              source="scipy.sparse.linalg.expm_multiply %s" % scipy.__version__)
pos, bonds = gasket(5)
s = nearest(pos, (0, 0))
P = sparse_quantum_pops(len(pos), bonds, 1.0, s, tt7)
for m in ("exact", "krylov", "chebyshev"):
    walk_case("gasket-g5-corner-expm_multiply-%s" % m, {"kind": "gasket", "generation": 5}, pos, bonds, s, tt7,
              start={"near": [0, 0]}, P=P, atol=1e-6, method=m,
              report=("msd", "return", "populations"), check_sites=True,
              source="scipy.sparse.linalg.expm_multiply %s (site order: the bridge's; only order-free outputs compared)" % scipy.__version__)
    del cases[-1]["expect"]["populations"]
pos, bonds = square(40, 40)
s = 20 + 40 * 20
P = sparse_quantum_pops(len(pos), bonds, 1.0, s, tt7)
for m in ("auto", "krylov", "chebyshev"):
    walk_case("square-40-centre-expm_multiply-%s" % m, {"kind": "square", "width": 40, "height": 40}, pos, bonds,
              s, tt7, P=P, atol=1e-6, method=m, source="scipy.sparse.linalg.expm_multiply %s" % scipy.__version__)
for g in (1, 2):
    for var, f in (("cells", carpet_cells), ("corners", carpet_corners)):
        pos, bonds = f(g)
        s = nearest(pos, (0.4, 0.4))
        walk_case("carpet-g%d-%s" % (g, var), {"kind": "carpet", "generation": g, "variant": var}, pos, bonds,
                  s, tt, start={"near": [0.4, 0.4]}, report=("msd", "return", "spread"))
        if g == 2:
            s = nearest(pos, (4.5, 3.2))
            walk_case("carpet-g%d-%s-inner" % (g, var), {"kind": "carpet", "generation": g, "variant": var},
                      pos, bonds, s, tt, start={"near": [4.5, 3.2]}, report=("msd", "return", "spread"))

# positions that distinguish conventions: carpet cell centres at half-integers
# (lower-left corner of the square at (0,0)), triangle rows, gasket interior
for g in (1, 2):
    pos, bonds = carpet_cells(g)
    for pt in ((0.9, 0.9), (2.2, 1.1), (3 ** g - 0.2, 0.7)):
        s = nearest(pos, pt)
        walk_case("carpet-g%d-cells-near%g,%g" % (g, pt[0], pt[1]), {"kind": "carpet", "generation": g, "variant": "cells"},
                  pos, bonds, s, tt, start={"near": list(pt)}, report=("msd", "return", "spread"))
    pos, bonds = carpet_corners(g)
    for pt in ((1.1, 0.9), (2.2, 1.4)):
        s = nearest(pos, pt)
        walk_case("carpet-g%d-corners-near%g,%g" % (g, pt[0], pt[1]), {"kind": "carpet", "generation": g, "variant": "corners"},
                  pos, bonds, s, tt, start={"near": list(pt)}, report=("msd", "return", "spread"))
pos, bonds = triangle(5)
for pt in ((1.1, 0.0), (2.0, 1.6), (3.4, 0.9)):
    s = nearest(pos, pt)
    walk_case("triangle-L5-near%g,%g" % pt, {"kind": "triangle", "side": 5}, pos, bonds, s, tt,
              start={"near": list(pt)}, report=("msd", "return", "spread"))
pos, bonds = gasket(3)
for pt in ((3.1, 0.0), (2.9, 1.8), (5.2, 2.5), (100, -50)):
    s = nearest(pos, pt)
    walk_case("gasket-g3-near%g,%g" % pt, {"kind": "gasket", "generation": 3}, pos, bonds, s, tt,
              start={"near": list(pt)}, report=("msd", "return", "spread"))

# classical walks on moderate fractals and a larger triangle (scipy expm_multiply, real generator)
def sparse_classical_pops(n, bonds, gamma, s, times):
    W = csr_matrix((np.array([w for a, b, w in bonds] * 2), ([a for a, b, w in bonds] + [b for a, b, w in bonds],
                   [b for a, b, w in bonds] + [a for a, b, w in bonds])), shape=(n, n))
    Lp = csr_matrix(np.diag(np.asarray(W.sum(1)).ravel())) - W
    e = np.zeros(n); e[s] = 1
    return np.array([expm_multiply(-gamma * Lp * t, e) if t > 0 else e for t in times])


for lat, (pos, bonds), pt in (({"kind": "gasket", "generation": 6}, gasket(6), (0.0, 0.0)),
                              ({"kind": "gasket", "generation": 6}, gasket(6), (32.0, 0.0)),
                              ({"kind": "carpet", "generation": 3, "variant": "cells"}, carpet_cells(3), (13.5, 4.5)),
                              ({"kind": "triangle", "side": 20}, triangle(20), (7.0, 0.0))):
    s = nearest(pos, (pt[0] + 0.01, pt[1] + 0.01))
    ttc = [0.5, 3.0, 20.0]
    for dyn in ("classical", "quantum"):
        P = sparse_classical_pops(len(pos), bonds, 0.8, s, ttc) if dyn == "classical" else \
            sparse_quantum_pops(len(pos), [(a, b, 0.8 * w) for a, b, w in bonds], 1.0, s, ttc)
        walk_case("%s-%s-near%g,%g-%s-expm_multiply" % (lat["kind"], list(lat.values())[1], pt[0], pt[1], dyn), lat, pos,
                  bonds, s, ttc, gamma=0.8, dyn=dyn, start={"near": [pt[0] + 0.01, pt[1] + 0.01]}, P=P, atol=1e-6,
                  report=("msd", "return", "spread", "ipr", "entropy"),
                  source="scipy.sparse.linalg.expm_multiply %s" % scipy.__version__)

# documented site orders (lattice.Triangle, lattice.Carpet, lattice.Gasket):
# full populations compared index by index
for lat, (pos, bonds), pt in (({"kind": "triangle", "side": 6}, triangle(6), (2.2, 1.6)),
                              ({"kind": "carpet", "generation": 2, "variant": "cells"}, carpet_cells(2), (4.4, 1.3)),
                              ({"kind": "carpet", "generation": 2, "variant": "corners"}, carpet_corners(2), (4.2, 1.3)),
                              ({"kind": "gasket", "generation": 3}, gasket_doc_order(3), (3.1, 1.6)),
                              ({"kind": "gasket", "generation": 4}, gasket_doc_order(4), (0.0, 0.0))):
    s = nearest(pos, pt)
    walk_case("order-%s-%s" % (lat["kind"], list(lat.values())[1]) + ("-" + lat.get("variant", "") if "variant" in lat else ""),
              lat, pos, bonds, s, [0.0, 0.7, 2.0], start={"near": list(pt)}, report=("msd", "return", "populations"),
              source="numpy.linalg.eigh; site order as documented in lattice (go doc ./lattice)")

# 7. times edge cases
pos, bonds = chain(6)
walk_case("times-zero-repeated", {"kind": "chain", "sites": 6}, pos, bonds, 1, [0.0, 0.0, 0.5, 0.5, 2.0],
          report=("msd", "return", "populations", "polya"))
walk_case("times-single", {"kind": "chain", "sites": 6}, pos, bonds, 1, [1.25])
lat5 = {"kind": "graph", "sites": 5, "bonds": [[0, 1, 1.0], [1, 2, 0.8], [2, 3, 1.1], [3, 4, 0.9], [1, 4, 0.5]],
        "positions": [[0], [1], [2], [3], [4]], "onsite": [0.1, -0.2, 0.0, 0.3, 0.05]}
pos5 = [(0.0,), (1.0,), (2.0,), (3.0,), (4.0,)]
b5 = [tuple(b) for b in lat5["bonds"]]
for m in ("auto", "exact", "krylov", "chebyshev"):
    walk_case("long-time-1e4-%s" % m, lat5, pos5, b5, 0, [1.0, 1e3, 1e4], onsite=lat5["onsite"], method=m,
              report=("msd", "return", "populations"), atol=1e-6)
    walk_case("tol-1e-14-%s" % m, lat5, pos5, b5, 2, [0.3, 3.0], onsite=lat5["onsite"], method=m,
              tol=1e-14, report=("msd", "return", "populations"), atol=1e-11)
    walk_case("tol-1e-3-%s" % m, lat5, pos5, b5, 2, [0.3, 3.0], onsite=lat5["onsite"], method=m,
              tol=1e-3, report=("msd", "return", "populations"), atol=1e-2)
walk_case("long-time-1e4-classical", {k: v for k, v in lat5.items() if k != "onsite"}, pos5, b5, 0,
          [1.0, 1e4], dyn="classical", report=("msd", "return", "populations"), atol=1e-8)
# linear and log time grids (both include the end points)
add("times-linear-grid", {"lattice": {"kind": "chain", "sites": N}, "start": {"site": mid},
                          "times": {"from": 0, "to": 2, "count": 5, "spacing": "linear"}},
    {"times": [0, 0.5, 1, 1.5, 2], "msd": [2 * t * t for t in (0, 0.5, 1, 1.5, 2)]}, 1e-8,
    "contract: linear grid from..to, count points; MSD 2t^2 (Childs et al. 2002)")
lg = [10 ** (-1 + k * 0.5) for k in range(4)]
add("times-log-grid", {"lattice": {"kind": "chain", "sites": N}, "start": {"site": mid},
                       "times": {"from": 0.1, "to": 10 ** 0.5, "count": 4, "spacing": "log"}},
    {"times": lg, "msd": [2 * t * t for t in lg]}, 1e-8, "contract: log grid")
# hopping 0 is a static state, negative hopping on a non-bipartite graph differs from positive
pos, bonds = triangle(2)
walk_case("hopping-zero", {"kind": "triangle", "side": 2}, pos, bonds, 0, [0.5, 2.0], gamma=0.0,
          report=("msd", "return", "populations"))
walk_case("hopping-negative", {"kind": "triangle", "side": 2}, pos, bonds, 0, [0.5, 2.0], gamma=-0.8,
          report=("msd", "return", "populations"))

# 8. long-time average on cycles
for n in (5, 7, 8, 10):
    exp = (2 * n - 1) / n ** 2 if n % 2 else (2 * n - 2) / n ** 2
    add("cycle-average-N%d" % n, {"lattice": {"kind": "chain", "sites": n, "periodic": True},
                                  "start": {"site": 1}, "times": [1.0], "report": ["average"]},
        {"average": {"return": exp}}, 1e-9, "cycle infinite-time average (2N-1)/N^2 odd, (2N-2)/N^2 even")
# average on a weighted graph without degeneracies: sum over eigenprojections
H = 0.7 * wmatrix(5, b5) + np.diag(lat5["onsite"])
lam, V = np.linalg.eigh(H)
pbar = ((np.abs(V) ** 2) @ (np.abs(V[0, :]) ** 2))
add("graph-average", {"lattice": lat5, "hopping": 0.7, "start": {"site": 0}, "times": [1.0],
                      "report": ["average", "populations"]},
    {"average": {"return": float(pbar[0]), "populations": L(pbar)}}, 1e-9,
    "sum_k |<j|k>|^2 |<k|s>|^2 with numpy.linalg.eigh (no degeneracies)")

# infinite-time average populations with degenerate levels: sum over the
# eigenprojections P_E of |<j|P_E|s>|^2 (levels closer than 1e-8 grouped)
def average_pops(n, bonds, s, gamma=1.0, onsite=None):
    H = gamma * wmatrix(n, bonds) + np.diag(onsite if onsite is not None else np.zeros(n))
    lam, V = np.linalg.eigh(H)
    out = np.zeros(n)
    k = 0
    while k < n:
        m = k
        while m + 1 < n and lam[m + 1] - lam[k] < 1e-8:
            m += 1
        Q = V[:, k:m + 1]
        out += np.abs(Q @ Q[s, :].conj()) ** 2
        k = m + 1
    return out


for lat, (pos, bonds), s in (({"kind": "chain", "sites": 8, "periodic": True}, chain(8, True), 2),
                             ({"kind": "chain", "sites": 7, "periodic": True}, chain(7, True), 0),
                             ({"kind": "gasket", "generation": 2}, gasket(2), 0),
                             ({"kind": "hypercube", "dimension": 3}, hypercube(3), 0),
                             ({"kind": "square", "width": 4, "height": 4, "periodic": True}, square(4, 4, True), 5)):
    pb = average_pops(len(pos), bonds, s)
    start = {"site": s}
    if lat["kind"] == "gasket":
        start = {"near": [0, 0]}
        s = nearest(pos, (0, 0))
        pb = average_pops(len(pos), bonds, s)
        add("average-degenerate-%s" % lat["kind"],
            {"lattice": lat, "start": start, "times": [1.0], "report": ["average"]},
            {"average": {"return": float(pb[s])}}, 1e-9,
            "eigenprojections of degenerate levels, numpy.linalg.eigh")
        continue
    add("average-degenerate-%s-%d" % (lat["kind"], len(pos)),
        {"lattice": lat, "start": start, "times": [1.0], "report": ["average", "populations"]},
        {"average": {"return": float(pb[s]), "populations": L(pb)}}, 1e-9,
        "eigenprojections of degenerate levels, numpy.linalg.eigh")

# 9. remove + kept
pos, bonds = chain(8)
keep = [0, 1, 2, 4, 5, 7]
ren = {o: i for i, o in enumerate(keep)}
rb = [(ren[a], ren[b], w) for a, b, w in bonds if a in ren and b in ren]
rp = [pos[o] for o in keep]
walk_case("remove-chain", {"kind": "chain", "sites": 8}, rp, rb, 3, [0.5, 1.5],
          report=("msd", "return", "populations"))
cases[-1]["request"]["remove"] = [3, 6]
cases[-1]["expect"]["kept"] = keep
pos, bonds = square(4, 3)
keep = [i for i in range(12) if i not in (5, 10)]
ren = {o: i for i, o in enumerate(keep)}
rb = [(ren[a], ren[b], w) for a, b, w in bonds if a in ren and b in ren]
rp = [pos[o] for o in keep]
walk_case("remove-square-near", {"kind": "square", "width": 4, "height": 3}, rp, rb, nearest(rp, (1.05, 1.0)),
          [0.5, 1.5], start={"near": [1.05, 1.0]}, report=("msd", "return", "populations"), dyn="classical")
cases[-1]["request"]["remove"] = [10, 5]
cases[-1]["expect"]["kept"] = keep

# 10. spectrum jobs
pos, bonds = gasket(3)
ev = np.linalg.eigvalsh(wmatrix(len(pos), bonds))
add("spectrum-gasket3-eigenvalues", {"lattice": {"kind": "gasket", "generation": 3},
                                     "spectrum": {"eigenvalues": True}},
    {"sites": len(pos), "bonds": len(bonds), "eigenvalues": L(ev)}, 1e-9, "numpy.linalg.eigvalsh")
ev = np.linalg.eigvalsh(0.5 * wmatrix(5, b5) + np.diag(lat5["onsite"]))
add("spectrum-graph-eigenvalues", {"lattice": lat5, "hopping": 0.5, "spectrum": {"eigenvalues": True}},
    {"eigenvalues": L(ev)}, 1e-10, "numpy.linalg.eigvalsh, H = g W + diag(onsite)")
# ratio on a random weighted graph (no degeneracies)
n = 60
rb = set()
while len(rb) < 150:
    a, b = sorted(rng.choice(n, 2, replace=False).tolist()); rb.add((a, b))
rb = sorted(rb)
ww = rng.uniform(0.5, 1.5, len(rb))
ons = rng.uniform(-1, 1, n)
latr = {"kind": "graph", "sites": n, "bonds": [[a, b, float(x)] for (a, b), x in zip(rb, ww)],
        "onsite": [float(e) for e in ons]}
ev = np.linalg.eigvalsh(wmatrix(n, [(a, b, x) for (a, b), x in zip(rb, ww)]) + np.diag(ons))
s = np.diff(ev)
r = np.minimum(s[1:], s[:-1]) / np.maximum(s[1:], s[:-1])
add("spectrum-ratio-random", {"lattice": latr, "spectrum": {"ratio": True, "eigenvalues": True}},
    {"eigenvalues": L(ev), "ratio": {"mean": float(r.mean()), "used": len(r), "degenerate": 0}}, 1e-9,
    "numpy.linalg.eigvalsh; r = min/max of consecutive spacings")

# ratio with degenerate levels (gasket): zero spacings (below 1e-9 of the
# spectral width, walk/job_doc.go) are counted and left out, the remaining
# consecutive nonzero spacings are paired
for g in (3, 5):
    pos, bonds = gasket(g)
    ev = np.linalg.eigvalsh(wmatrix(len(pos), bonds))
    s = np.diff(ev)
    thr = 1e-9 * (ev[-1] - ev[0])
    nz = s[s > thr]
    r = np.minimum(nz[1:], nz[:-1]) / np.maximum(nz[1:], nz[:-1])
    add("spectrum-ratio-gasket%d" % g, {"lattice": {"kind": "gasket", "generation": g}, "spectrum": {"ratio": True}},
        {"ratio": {"mean": float(r.mean()), "used": len(r), "degenerate": int((s <= thr).sum())}}, 1e-9,
        "numpy.linalg.eigvalsh; contract ratio definition, degeneracies left out and counted")

# 11. site and bond counts of every contract kind (independent builders above)
for lat, (pos, bonds) in (
        [({"kind": "chain", "sites": n, "periodic": per}, chain(n, per)) for n in (1, 2, 3, 10) for per in (False, True)] +
        [({"kind": "square", "width": w, "height": h, "periodic": per}, square(w, h, per))
         for w, h in ((1, 1), (1, 4), (3, 3), (5, 2), (7, 6)) for per in (False, True)] +
        [({"kind": "triangle", "side": L}, triangle(L)) for L in (1, 2, 6, 10)] +
        [({"kind": "gasket", "generation": g}, gasket(g)) for g in range(0, 8)] +
        [({"kind": "carpet", "generation": g, "variant": v}, f(g)) for g in (0, 1, 2, 3)
         for v, f in (("cells", carpet_cells), ("corners", carpet_corners))] +
        [({"kind": "hypercube", "dimension": d}, hypercube(d)) for d in (1, 2, 6, 10)]):
    name = "count-" + "-".join("%s" % v for v in lat.values())
    add(name, {"lattice": lat, "start": {"site": 0}, "times": [0.0]},
        {"sites": len(pos), "bonds": len(bonds), "msd": [0.0], "return": [1.0]}, 0,
        "contract site/bond counts; builders in make_refs.py")

# 12. seeded random sweep: weighted graphs (negative weights for quantum),
# on-site energies, 1-4D positions, hoppings, methods and tolerances vs
# scipy.linalg.expm; compared within max(10*tolerance, 1e-9) (the
# tolerance is a 2-norm bound on the state, common practice margin)
srng = np.random.default_rng(777)
for c in range(60):
    n = int(srng.integers(2, 30))
    m = int(srng.integers(1, n * (n - 1) // 2 + 1))
    pairs = set()
    while len(pairs) < m:
        a, b = sorted(srng.choice(n, 2, replace=False).tolist()); pairs.add((a, b))
    pairs = sorted(pairs)
    dyn = "classical" if srng.random() < 0.4 else "quantum"
    w = srng.uniform(0.1, 3, len(pairs)) if dyn == "classical" else srng.uniform(-3, 3, len(pairs))
    dim = int(srng.integers(1, 5))
    pos = [tuple(float(v) for v in srng.uniform(-5, 5, dim)) for _ in range(n)]
    ons = srng.uniform(-2, 2, n) if dyn == "quantum" and srng.random() < 0.7 else None
    gam = float(srng.choice([0.3, 1.0, 2.5]))
    nt = int(srng.integers(1, 6))
    ts = sorted(np.round(srng.exponential(3, nt), 6).tolist())
    if srng.random() < 0.2:
        ts = [0.0] + ts
    deg = np.zeros(n)
    for a, b in pairs:
        deg[a] += 1; deg[b] += 1
    s = int(srng.choice(np.flatnonzero(deg > 0)))  # an isolated start with on-site energy trips polya (audit finding)
    method = str(srng.choice(["auto", "exact", "krylov", "chebyshev"]))
    tol = float(srng.choice([1e-10, 1e-12, 1e-8, 1e-6]))
    bonds = [(a, b, float(x)) for (a, b), x in zip(pairs, w)]
    lat = {"kind": "graph", "sites": n, "bonds": [[a, b, x] for a, b, x in bonds], "positions": [list(p) for p in pos]}
    if ons is not None:
        lat["onsite"] = [float(e) for e in ons]
    P = quantum_pops_expm(n, bonds, ons, gam, s, ts) if dyn == "quantum" else classical_pops(n, bonds, gam, s, ts)
    walk_case("sweep%02d-%s-%s" % (c, dyn, method), lat, pos, bonds, s, ts, gamma=gam, dyn=dyn, onsite=ons,
              method=method, tol=tol, P=P, atol=max(10 * tol, 1e-9),
              report=("msd", "return", "populations", "spread", "ipr", "entropy", "polya"),
              source="scipy.linalg.expm %s, seeded sweep (numpy default_rng(777))" % scipy.__version__)

# spectrum after remove (vacancies), hopping scaling
pos, bonds = square(7, 6)
rem = [3, 10, 24, 40]
keep = [i for i in range(len(pos)) if i not in rem]
ren = {o: i for i, o in enumerate(keep)}
rb = [(ren[a], ren[b], w) for a, b, w in bonds if a in ren and b in ren]
ev = np.linalg.eigvalsh(1.7 * wmatrix(len(keep), rb))
add("spectrum-remove-square", {"lattice": {"kind": "square", "width": 7, "height": 6}, "hopping": 1.7, "remove": rem,
                               "spectrum": {"eigenvalues": True}},
    {"sites": len(keep), "bonds": len(rb), "kept": keep, "eigenvalues": L(ev)}, 1e-10,
    "numpy.linalg.eigvalsh of the graph with the removed sites deleted")

# positions with the largest allowed dimension (64) and start by "near"
r64 = np.random.default_rng(64)
pos = [tuple(float(v) for v in r64.uniform(-1, 1, 64)) for _ in range(6)]
bonds = [(0, 1, 1.0), (1, 2, 0.7), (2, 3, 1.2), (3, 4, 0.9), (4, 5, 1.1), (0, 5, 0.4)]
lat = {"kind": "graph", "sites": 6, "bonds": [[a, b, w] for a, b, w in bonds], "positions": [list(p) for p in pos]}
pt = [v + 0.01 for v in pos[4]]
for dyn in ("quantum", "classical"):
    walk_case("graph-64d-near-%s" % dyn, lat, pos, bonds, nearest(pos, pt), [0.3, 1.1, 2.9], dyn=dyn,
              start={"near": pt}, report=("msd", "return", "populations", "spread"))

# many reported times in one Chebyshev job (grouped expansions): linear,
# dense, log, repeated and random grids on a gasket with on-site energies
pos, bonds = gasket(5)
grng = np.random.default_rng(8)
ons = grng.uniform(-1, 1, len(pos))
latg = {"kind": "graph", "sites": len(pos), "bonds": [[a, b, 1.0] for a, b, w in bonds], "onsite": [float(e) for e in ons]}
grids = {"lin": list(np.linspace(0, 20, 41)), "dense": list(np.linspace(5, 5.5, 30)), "log": list(np.logspace(-3, 2, 40)),
         "rep": [0, 0, 1, 1, 1, 2.5, 2.5, 7, 7.000001, 30], "rand": sorted(grng.uniform(0, 50, 25).tolist())}
for gname, gts in grids.items():
    gts = [float(t) for t in gts]
    for tol in (1e-10, 1e-6):
        walk_case("grid-%s-%g-chebyshev" % (gname, tol), latg, pos, bonds, 7, gts, gamma=0.8, onsite=ons, method="chebyshev",
                  tol=tol, report=("return", "populations"), atol=2 * tol + 1e-12,
                  source="numpy.linalg.eigh; populations within 2·tolerance (|p−p'| ≤ 2‖ψ−ψ'‖, common practice)")

# 13. the contract's own example requests, literally
pos, bonds = gasket_doc_order(6)
s0 = nearest(pos, (0, 0))
P = quantum_pops(len(pos), bonds, None, 1.0, s0, [0.1, 0.2, 0.5, 1.0])
o = observables(P, pos, s0, [0.1, 0.2, 0.5, 1.0])
cases.append(dict(name="contract-example-walk",
                  request={"id": "contract-example-walk", "lattice": {"kind": "gasket", "generation": 6}, "hopping": 1.0,
                           "start": {"near": [0, 0]}, "dynamics": "quantum", "times": [0.1, 0.2, 0.5, 1.0],
                           "tolerance": 1e-10, "method": "auto", "report": ["msd", "return", "populations"]},
                  expect={"sites": 1095, "bonds": 2187, "times": [0.1, 0.2, 0.5, 1.0], "msd": L(o["msd"]),
                          "return": L(o["ret"]), "populations": [L(p) for p in P]},
                  atol=1e-8, source="contract example; numpy.linalg.eigh, site order as documented by lattice.Gasket"))
pos, bonds = gasket(5)
ev = np.linalg.eigvalsh(wmatrix(len(pos), bonds))
sp = np.diff(ev)
thr = 1e-9 * (ev[-1] - ev[0])
nz = sp[sp > thr]
rr = np.minimum(nz[1:], nz[:-1]) / np.maximum(nz[1:], nz[:-1])
cases.append(dict(name="contract-example-spectrum",
                  request={"id": "contract-example-spectrum", "lattice": {"kind": "gasket", "generation": 5},
                           "spectrum": {"eigenvalues": True, "dos": {"bins": 200, "method": "kpm", "moments": 512},
                                        "ratio": True, "box_dimension": True}},
                  expect={"sites": len(pos), "bonds": len(bonds), "eigenvalues": L(ev),
                          "ratio": {"mean": float(rr.mean()), "used": len(rr), "degenerate": int((sp <= thr).sum())}},
                  atol=1e-9, source="contract example; numpy.linalg.eigvalsh"))

json.dump(dict(generator="make_refs.py", numpy=np.__version__, scipy=scipy.__version__, cases=cases),
          sys.stdout, indent=None, separators=(",", ":"))
