#!/bin/sh
# Side-by-side timing of `tracesift graph` on 2·10^4-sample traces (white
# noise and Brownian motion, seed 1) against two references:
#
#   - scripts/bench/nvg_networkx.py: numpy builds the natural visibility
#     graph by a plain max-slope sweep and NetworkX computes its average
#     clustering; whole processes timed with /usr/bin/time, and the script's
#     --check compares the edge count and the average clustering with
#     tracesift's (the documented manual reference check);
#   - a plain O(n²) max-slope sweep in Go (BenchmarkSweepNatural20k) against
#     the library's builder (BenchmarkNatural20k), and the library calls of
#     the comparison (BenchmarkGraph20k: NVG + clustering, NVG + every
#     metric).
#
#   scripts/bench/graph20k.sh [OUTDIR] [RUNS]
#
# OUTDIR (default /tmp/tracesift-graph20k) receives the binary and the two
# traces; RUNS (default 5) is the number of timed runs of each process.
# Needs Go, /usr/bin/time and, for the Python reference, a Python with numpy
# and networkx: $PYTHON, else /usr/bin/python3 (Debian: apt-get install
# python3-numpy python3-networkx).
# Read the ratios from the lowest wall and CPU (user + sys) times: the
# machine may be shared. CI does not run this script.
set -eu

root=$(cd "$(dirname "$0")/../.." && pwd)
out=${1:-/tmp/tracesift-graph20k}
runs=${2:-5}
py=${PYTHON:-/usr/bin/python3}
mkdir -p "$out"
out=$(cd "$out" && pwd)
cd "$root"
go build -o "$out/tracesift" ./cmd/tracesift

for sys in white brownian; do
	"$out/tracesift" generate "$sys" --n 20000 --seed 1 -o "$out/$sys.csv"
	i=0
	while [ "$i" -lt "$runs" ]; do
		/usr/bin/time -f "tracesift graph $sys: %e s wall, %U s user, %S s sys, %M kB" \
			"$out/tracesift" graph "$out/$sys.csv" >/dev/null
		i=$((i + 1))
	done
	if "$py" -c 'import numpy, networkx' 2>/dev/null; then
		i=0
		while [ "$i" -lt "$runs" ]; do
			/usr/bin/time -f "numpy+networkx $sys: %e s wall, %U s user, %S s sys, %M kB" \
				"$py" scripts/bench/nvg_networkx.py "$out/$sys.csv" >/dev/null
			i=$((i + 1))
		done
		"$py" scripts/bench/nvg_networkx.py "$out/$sys.csv" --check "$out/tracesift"
	else
		echo "numpy or networkx missing: skipping the Python reference" >&2
	fi
done

go test ./networks/visibility -run '^$' -bench 'SweepNatural20k|Natural20k|Graph20k' \
	-benchtime 5x -count "$runs" -cpu 1
