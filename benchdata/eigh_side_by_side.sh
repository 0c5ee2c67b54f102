#!/usr/bin/env bash
# Side-by-side timing of dense diagonalisation with eigenvectors:
# ampwalk spectra.SymEigen (Go) against numpy.linalg.eigh (LAPACK via the
# Debian numpy) on the same seeded matrix, alternating A B A B.
#
#   bash benchdata/eigh_side_by_side.sh            # n = 3000, 3 rounds
#   N=1000 ROUNDS=3 bash benchdata/eigh_side_by_side.sh
#   COMPLEX=1 N=2000 bash benchdata/eigh_side_by_side.sh   # HermEigen, random bond phases
#
# Prints both times per round, the ratio Go/numpy, the median ratio and the
# largest eigenvalue deviation relative to max|λ|.
set -euo pipefail
N=${N:-3000}
ROUNDS=${ROUNDS:-3}
SEED=${SEED:-1}
GOFLAGS_BENCH=()
DTYPE='<f8'
if [[ "${COMPLEX:-0}" == 1 ]]; then
	GOFLAGS_BENCH=(-complex)
	DTYPE='<c16'
fi
cd "$(dirname "$0")/.."

if ! /usr/bin/python3 -c 'import numpy' 2>/dev/null; then
	apt-get install -y python3-numpy
fi
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
go build -o "$tmp/eighbench" ./benchdata/eighbench
"$tmp/eighbench" "${GOFLAGS_BENCH[@]}" -n "$N" -seed "$SEED" -matrix "$tmp/a.bin"

cat >"$tmp/eigh.py" <<'PY'
import sys, time
import numpy as np
n, mfile, vfile, dtype = int(sys.argv[1]), sys.argv[2], sys.argv[3], sys.argv[4]
a = np.fromfile(mfile, dtype=dtype).reshape(n, n)
t0 = time.perf_counter()
w, v = np.linalg.eigh(a)
print("numpy_seconds %.3f" % (time.perf_counter() - t0))
w.astype('<f8').tofile(vfile)
PY

echo "n=$N seed=$SEED complex=${COMPLEX:-0} date=$(date -u +%FT%TZ) $(go version) nproc=$(nproc)"
grep -m1 'model name' /proc/cpuinfo || true
/usr/bin/python3 -c 'import numpy; print("numpy", numpy.__version__)'
ratios=()
for r in $(seq "$ROUNDS"); do
	g=$("$tmp/eighbench" "${GOFLAGS_BENCH[@]}" -n "$N" -seed "$SEED" -values "$tmp/wgo.bin" | awk '/go_seconds/{print $2}')
	# OpenBLAS tuning variables of this environment are unset for numpy only.
	p=$(env -u OPENBLAS_CORETYPE -u OPENBLAS_L2_SIZE /usr/bin/python3 "$tmp/eigh.py" "$N" "$tmp/a.bin" "$tmp/wnp.bin" "$DTYPE" | awk '/numpy_seconds/{print $2}')
	ratio=$(awk -v g="$g" -v p="$p" 'BEGIN{printf "%.2f", g/p}')
	ratios+=("$ratio")
	echo "round $r: go ${g}s numpy ${p}s ratio ${ratio} (load average $(cut -d' ' -f1-3 /proc/loadavg))"
done
/usr/bin/python3 - "$tmp/wgo.bin" "$tmp/wnp.bin" <<'PY'
import sys
import numpy as np
g = np.fromfile(sys.argv[1], dtype='<f8'); p = np.fromfile(sys.argv[2], dtype='<f8')
print("max |λ_go − λ_numpy| / max|λ| = %.3g" % (np.max(np.abs(g - p)) / np.max(np.abs(p))))
PY
printf '%s\n' "${ratios[@]}" | sort -n | awk '{a[NR]=$1} END{m=(NR%2)?a[(NR+1)/2]:(a[NR/2]+a[NR/2+1])/2; print "median ratio go/numpy:", m}'
if command -v /usr/bin/time >/dev/null; then
	/usr/bin/time -v "$tmp/eighbench" "${GOFLAGS_BENCH[@]}" -n "$N" -seed "$SEED" 2>&1 | awk '/go_seconds|Maximum resident/'
	env -u OPENBLAS_CORETYPE -u OPENBLAS_L2_SIZE /usr/bin/time -v /usr/bin/python3 "$tmp/eigh.py" "$N" "$tmp/a.bin" "$tmp/wnp.bin" "$DTYPE" 2>&1 | awk '/numpy_seconds|Maximum resident/'
fi
