#!/usr/bin/env bash
# Measures rockheat beside the numpy script of the same demo model
# (numpy_demo.py), whole processes, interleaved so that both see the same
# machine, and prints medians of wall time, CPU time and peak memory.
#
#   testdata/bench/side_by_side.sh [reps] [trials ...]
#
# Needs GNU time (/usr/bin/time) and a python3 with numpy (Debian:
# apt-get install time python3-numpy); set PYTHON to choose the python.
set -euo pipefail
cd "$(dirname "$0")/../.."
reps=${1:-5}
shift || true
if [ $# -gt 0 ]; then sizes=("$@"); else sizes=(1000000 10000000); fi
python=${PYTHON:-/usr/bin/python3}
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
bin=$tmp/rockheat
go build -o "$bin" ./cmd/rockheat
log=$tmp/times.log
for n in "${sizes[@]}"; do
	for _ in $(seq "$reps"); do
		/usr/bin/time -a -o "$log" -f "numpy $n %e %U %S %M" "$python" testdata/bench/numpy_demo.py "$n" >/dev/null
		/usr/bin/time -a -o "$log" -f "rockheat $n %e %U %S %M" "$bin" run demo --trials "$n" >/dev/null
	done
done
"$python" - "$log" <<'PY'
import collections, statistics as st, sys
runs = collections.defaultdict(list)
for line in open(sys.argv[1]):
    f = line.split()
    if len(f) == 6 and f[0] in ("numpy", "rockheat"):
        runs[(int(f[1]), f[0])].append((float(f[2]), float(f[3]) + float(f[4]), float(f[5]) / 1024))
for n in sorted({k[0] for k in runs}):
    med = {}
    for tool in ("numpy", "rockheat"):
        r = runs[(n, tool)]
        med[tool] = [st.median(x[i] for x in r) for i in range(3)]
        print(f"{n:>11,} trials  {tool:8s}  wall {med[tool][0]:6.2f} s  cpu {med[tool][1]:6.2f} s  peak {med[tool][2]:5.0f} MB  ({len(r)} runs)")
    w, m = med["numpy"][0] / med["rockheat"][0], med["numpy"][2] / med["rockheat"][2]
    print(f"{'':11s}         rockheat {w:.1f}× faster, {m:.1f}× less memory")
PY
