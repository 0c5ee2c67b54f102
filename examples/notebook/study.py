"""A worked, notebook-style study: how fast does a quantum walk spread on a
Sierpinski gasket compared with a full square lattice of similar size?

Run it from anywhere (it builds the bridge with `go build` unless
$AMPWALK_BRIDGE names a built one):

    python3 examples/notebook/study.py            # table, and study.png with matplotlib

Each cell below is what you would type in a notebook.
"""

import os
import subprocess
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from ampwalk_client import Bridge  # noqa: E402

# --- Cell 1: the two graphs and the common schedule ----------------------
# A gasket of generation 7 has (3^8 + 3)/2 = 3282 sites; a 57 × 57 square
# has 3249. Both walks start on the corner at (0, 0). Times are in units of
# 1/γ, positions in nearest-neighbour spacings. The front moves at speed
# 2γ per axis, so t ≤ 20 keeps it off the square's far walls (57 spacings).
TIMES = {"from": 0.1, "to": 20, "count": 48, "spacing": "log"}
JOBS = [
    {"id": "gasket g=7", "lattice": {"kind": "gasket", "generation": 7}},
    {"id": "square 57x57", "lattice": {"kind": "square", "width": 57, "height": 57}},
]
for job in JOBS:
    job.update({"start": {"near": [0, 0]}, "times": TIMES,
                "report": ["msd", "return", "regimes"], "fit": {"segments": 3}})

# --- Cell 2: run both through the bridge ---------------------------------
with Bridge(log=subprocess.DEVNULL) as bridge:
    results = bridge.run_many(JOBS, raise_errors=True)

# --- Cell 3: the fitted regimes ------------------------------------------
for r in results:
    d = r["diagnostics"]
    print("%s: %d sites, %d bonds; %s, %d products, error bound %.1e"
          % (r["id"], r["sites"], r["bonds"], d["method"], d["products"], d["error_bound"]))
    for g in r["regimes"]:
        print("   t in [%7.3g, %7.3g]   MSD ~ t^%.3f +- %.3f   (%s)"
              % (g["from"], g["to"], g["exponent"], g["error"], g["kind"]))
    for c in r["crossovers"]:
        print("   crossover at t = %.3g  (95%%: %.3g ... %.3g)" % (c["time"], c["low"], c["high"]))

# --- Cell 4: MSD against t on log-log axes, with the fitted power laws ---
try:
    import matplotlib

    matplotlib.use("Agg")
    import matplotlib.pyplot as plt
except ImportError:
    plt = None

if plt is None:
    print("\nmatplotlib is not installed: the curves as a table")
    print("%10s" % "t" + "".join("%16s" % r["id"] for r in results))
    for k, t in enumerate(results[0]["times"]):
        print("%10.4g" % t + "".join("%16.6g" % r["msd"][k] for r in results))
else:
    fig, ax = plt.subplots(figsize=(6, 4.5))
    for r in results:
        t = list(r["times"])
        m = list(r["msd"])
        pts = [(a, b) for a, b in zip(t, m) if a > 0 and b > 0]
        ax.loglog([p[0] for p in pts], [p[1] for p in pts], "o", ms=3, label=r["id"])
        for g in r["regimes"]:
            ts = [g["from"], g["to"]]
            ax.loglog(ts, [g["prefactor"] * x ** g["exponent"] for x in ts], "-", lw=1.5,
                      label="  t^%.2f (%s)" % (g["exponent"], g["kind"]))
    ax.set_xlabel("t  [1/γ]")
    ax.set_ylabel("MSD  [spacing²]")
    ax.legend(fontsize=7)
    out = os.path.join(os.getcwd(), "study.png")
    fig.tight_layout()
    fig.savefig(out, dpi=120)
    print("\nwrote", out)
