#!/usr/bin/env bash
# Memory check: the estimate propbench prints (lattice.EstimateBytes for the
# graph and its CSR, walk.EstimateBytes for the Chebyshev workspace, plus the
# program's own vectors) against the peak resident set measured by
# /usr/bin/time -v, for several sizes. The estimate should be within 25%.
#
#   bash benchdata/memcheck.sh
set -euo pipefail
cd "$(dirname "$0")/.."
WORK=${WORK:-$(mktemp -d)}
go build -o "$WORK/propbench" ./benchdata/propbench
printf "%-22s %10s %12s %12s %7s\n" job sites estimate_MiB peak_RSS_MiB ratio
run() {
  local name=$1
  shift
  /usr/bin/time -v "$WORK/propbench" "$@" -out "$WORK/$name.json" >/dev/null 2>"$WORK/$name.time"
  /usr/bin/python3 - "$WORK/$name.json" "$WORK/$name.time" "$name" <<'PYEOF'
import json, re, sys
r = json.load(open(sys.argv[1]))
rss = int(re.search(r"Maximum resident set size \(kbytes\): (\d+)", open(sys.argv[2]).read()).group(1)) * 1024
est = r["estimate_bytes"]
print(f"{sys.argv[3]:22s} {r['sites']:10d} {est / 2**20:12.1f} {rss / 2**20:12.1f} {rss / est:7.2f}")
PYEOF
}
run gasket8 -generation 8 -tmax 20 -count 5
run gasket10 -generation 10 -tmax 20 -count 5
run gasket11 -generation 11 -tmax 20 -count 5
run gasket12 -generation 12 -tmax 20 -count 5
run gasket13 -generation 13 -tmax 10 -count 5
run square1000 -lattice square -width 1000 -tmin 1 -tmax 10 -count 5
# One reported time: no expansion group, so no group workspace.
run gasket12-one-time -generation 12 -tmin 20 -tmax 20 -count 1
