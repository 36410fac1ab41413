#!/usr/bin/env bash
# Measures the hot-rock demo beside the reservoir demo, whole processes,
# interleaved so that both see the same machine, and prints medians of
# wall time, CPU time and peak memory, and the ratio of hot rock to
# reservoir: of whole processes, and per trial, the time of a 1000-trial
# run of each (start-up, reading, summaries) taken off first.
#
#   testdata/bench/kinds.sh [reps] [trials]
#
# Needs python3 (for its clock and wait4).
set -euo pipefail
cd "$(dirname "$0")/../.."
reps=${1:-9}
trials=${2:-1000000}
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
go build -o "$tmp/rockheat" ./cmd/rockheat
python3 - "$tmp/rockheat" "$reps" "$trials" <<'PY'
import collections, os, statistics as st, subprocess, sys, time
binary, reps, n = sys.argv[1], int(sys.argv[2]), int(sys.argv[3])
runs = collections.defaultdict(list)
for _ in range(reps):
    for kind in ("demo", "hot-rock-demo"):
        for t in (1000, n):
            t0 = time.perf_counter()
            p = subprocess.Popen([binary, "run", kind, "--trials", str(t)], stdout=subprocess.DEVNULL)
            _, status, ru = os.wait4(p.pid, 0)
            wall = time.perf_counter() - t0
            if status != 0:
                sys.exit(f"rockheat run {kind} --trials {t} failed")
            runs[(kind, t)].append((wall, ru.ru_utime + ru.ru_stime, ru.ru_maxrss / 1024))
med = {k: [st.median(x[i] for x in v) for i in range(3)] for k, v in runs.items()}
for kind in ("demo", "hot-rock-demo"):
    for t in (1000, n):
        w, c, m = med[(kind, t)]
        print(f"{kind:14s} {t:>11,} trials  wall {w:6.3f} s  cpu {c:6.3f} s  peak {m:5.0f} MB  ({reps} runs)")
whole = med[("hot-rock-demo", n)][0] / med[("demo", n)][0]
per = (med[("hot-rock-demo", n)][0] - med[("hot-rock-demo", 1000)][0]) / (med[("demo", n)][0] - med[("demo", 1000)][0])
print(f"hot rock / reservoir at {n:,} trials: {whole:.2f}x whole processes, {per:.2f}x per trial")
PY
