#!/usr/bin/env bash
# Side-by-side propagation benchmark: ampwalk (benchdata/propbench, Chebyshev)
# against scipy.sparse.linalg.expm_multiply (benchdata/scipy_expm.py) on the
# same gasket, same site order, same start (the corner (0, 0)), same reported
# times. Runs Go, Python, Go, Python (A B A B) under /usr/bin/time -v, checks
# that the MSDs agree (max relative deviation ≤ 1e-8), and prints the time
# ratio, the products and the peak resident set of each side.
#
#   bash benchdata/side_by_side.sh                       # g=10, 60 log times 0.1…500
#   GEN=12 TMAX=100 COUNT=30 bash benchdata/side_by_side.sh
#
# Environment: GEN, TMIN, TMAX, COUNT, TOL, WORKERS (0: all cores), ROUNDS
# (pairs of runs, default 2), WORK (scratch directory).
set -euo pipefail
cd "$(dirname "$0")/.."

GEN=${GEN:-10}
TMIN=${TMIN:-0.1}
TMAX=${TMAX:-500}
COUNT=${COUNT:-60}
TOL=${TOL:-1e-10}
WORKERS=${WORKERS:-0}
ROUNDS=${ROUNDS:-2}
WORK=${WORK:-$(mktemp -d)}
PY=/usr/bin/python3

need=()
"$PY" -c 'import numpy, scipy' 2>/dev/null || need+=(python3-numpy python3-scipy)
[ -x /usr/bin/time ] || need+=(time)
if [ ${#need[@]} -gt 0 ]; then
  echo "== installing ${need[*]}"
  apt-get update -qq && apt-get install -y -qq "${need[@]}" >/dev/null
fi

echo "== $(date -u '+%Y-%m-%d %H:%M UTC'), $(go version), nproc $(nproc), $(grep -m1 'model name' /proc/cpuinfo)"
echo "== scipy $("$PY" -c 'import scipy; print(scipy.__version__)'), numpy $("$PY" -c 'import numpy; print(numpy.__version__)')"
go build -o "$WORK/propbench" ./benchdata/propbench
args=(-generation "$GEN" -tmin "$TMIN" -tmax "$TMAX" -count "$COUNT" -tol "$TOL" -workers "$WORKERS")
"$WORK/propbench" "${args[@]}" -graph "$WORK/graph" -graph-only -out "$WORK/job.json"

for r in $(seq 1 "$ROUNDS"); do
  echo "== round $r: Go"
  /usr/bin/time -v "$WORK/propbench" "${args[@]}" -out "$WORK/go_$r.json" 2>"$WORK/go_$r.time"
  echo "== round $r: scipy"
  /usr/bin/time -v "$PY" benchdata/scipy_expm.py --graph "$WORK/graph" --job "$WORK/job.json" \
    --out "$WORK/py_$r.json" 2>"$WORK/py_$r.time"
done

"$PY" - "$WORK" "$ROUNDS" <<'PYEOF'
import json, re, sys
work, rounds = sys.argv[1], int(sys.argv[2])

def timev(path):
    txt = open(path).read()
    rss = int(re.search(r"Maximum resident set size \(kbytes\): (\d+)", txt).group(1)) * 1024
    w = re.search(r"Elapsed \(wall clock\) time \(h:mm:ss or m:ss\): (\S+)", txt).group(1)
    secs = 0.0
    for part in w.split(":"):
        secs = secs * 60 + float(part)
    return rss, secs

rows, worst = [], 0.0
for r in range(1, rounds + 1):
    g = json.load(open(f"{work}/go_{r}.json"))
    p = json.load(open(f"{work}/py_{r}.json"))
    dev = max(abs(a - b) / abs(b) for a, b in zip(g["msd"], p["msd"]) if b != 0)
    worst = max(worst, dev)
    grss, gwall = timev(f"{work}/go_{r}.time")
    prss, pwall = timev(f"{work}/py_{r}.time")
    rows.append((r, g, p, grss, gwall, prss, pwall, dev))

MiB = 1 << 20
print(f"sites {rows[0][1]['sites']}, bonds {rows[0][1]['bonds']}, {len(rows[0][1]['times'])} times to "
      f"{rows[0][1]['times'][-1]:g}, tol {rows[0][1]['tolerance']:g}")
print("round  go_prop_s  go_wall_s  scipy_prop_s  scipy_wall_s  ratio_prop  ratio_wall  go_MiB  scipy_MiB  mem_ratio  products  a*tmax  prod/(a*tmax)  max_rel_dev")
for r, g, p, grss, gwall, prss, pwall, dev in rows:
    print(f"{r:5d}  {g['propagate_seconds']:9.3f}  {gwall:9.2f}  {p['propagate_seconds']:12.3f}  {pwall:12.2f}  "
          f"{p['propagate_seconds'] / g['propagate_seconds']:10.1f}  {pwall / gwall:10.1f}  "
          f"{grss / MiB:6.1f}  {prss / MiB:9.1f}  {prss / grss:9.1f}  {g['products']:8d}  {g['a_tmax']:6.0f}  "
          f"{g['products_over_a_tmax']:13.3f}  {dev:11.2e}")
ok = worst <= 1e-8
print(f"MSD agreement: max relative deviation {worst:.2e} ({'ok' if ok else 'FAILS'} against 1e-8)")
sys.exit(0 if ok else 1)
PYEOF
