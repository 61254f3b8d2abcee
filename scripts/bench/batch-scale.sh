#!/bin/sh
# Batch scale of `tracesift features` (BENCHMARKS.md, "Batches"): rate and
# peak memory against the number of traces, and what the journal and
# --resume cost.
#
#   scripts/bench/batch-scale.sh [DIR [COUNT...]]
#
# DIR (default /tmp/tracesift-batch) receives the binary, the generated
# traces (SAMPLES samples each, default 10000; six systems in turn: AR(1),
# white noise, Hénon, logistic, Lorenz, sine, seeds 1, 2, ...) and the
# outputs. COUNTs default to 300 1000 3000. For each count:
#   features --files-from LIST --format csv --all -o OUT   (with the journal)
# and for the middle count also: --no-journal; --resume on the complete
# journal (everything skipped); and a run killed (SIGKILL) once half the
# traces are in its journal, then resumed. Every run is timed by
# /usr/bin/time: wall and CPU seconds (user + sys) and the peak resident
# set. The resumed outputs are compared with cmp against the uninterrupted
# one. Prints one line per run.
set -eu

root=$(cd "$(dirname "$0")/../.." && pwd)
dir=${1:-/tmp/tracesift-batch}
[ $# -gt 0 ] && shift
counts=${*:-300 1000 3000}
samples=${SAMPLES:-10000}
mkdir -p "$dir/traces"
dir=$(cd "$dir" && pwd)
ts=$dir/tracesift
(cd "$root" && go build -o "$ts" ./cmd/tracesift)

most=0
for c in $counts; do
	[ "$c" -gt "$most" ] && most=$c
done
set -- ar1 white henon logistic lorenz sine
i=0
: >"$dir/all.txt"
while [ "$i" -lt "$most" ]; do
	sys=$(eval echo "\${$((i % 6 + 1))}")
	f=$dir/traces/d$((i % 50))/t$(printf %05d "$i").csv
	if [ ! -s "$f" ]; then
		mkdir -p "$(dirname "$f")"
		"$ts" generate "$sys" --n "$samples" --seed $((i + 1)) -o "$f"
	fi
	echo "$f" >>"$dir/all.txt"
	i=$((i + 1))
done

# timed NAME ARGS...: runs tracesift under /usr/bin/time and prints
# NAME, wall s, CPU s, peak RSS MB.
timed() {
	name=$1
	shift
	/usr/bin/time -f "%e %U %S %M" -o "$dir/time.txt" "$ts" "$@" -q || true
	read -r wall user sys rss <"$dir/time.txt"
	echo "$name wall ${wall}s cpu $(echo "$user + $sys" | bc)s peak $((rss / 1024))MB"
}

echo "# $(uname -m), $(nproc) cores, Go $(go env GOVERSION), $samples samples per trace, $(date -u +%Y-%m-%d)"
mid=$(echo "$counts" | awk '{print $(int((NF + 1) / 2))}')
for c in $counts; do
	head -n "$c" "$dir/all.txt" >"$dir/list$c.txt"
	rm -f "$dir/out$c.csv" "$dir/out$c.csv.journal"
	timed "journal n=$c" features --files-from "$dir/list$c.txt" --format csv --all -o "$dir/out$c.csv"
	if [ "$c" = "$mid" ]; then
		timed "no-journal n=$c" features --files-from "$dir/list$c.txt" --format csv --all --no-journal -o "$dir/nj$c.csv"
		cmp "$dir/out$c.csv" "$dir/nj$c.csv"
		timed "resume-complete n=$c" features --files-from "$dir/list$c.txt" --format csv --all --resume -o "$dir/out$c.csv"
		# Killed at half, then resumed.
		rm -f "$dir/kill$c.csv" "$dir/kill$c.csv.journal"
		/usr/bin/time -f "%e %U %S %M" -o "$dir/time.txt" "$ts" features --files-from "$dir/list$c.txt" --format csv --all -q -o "$dir/kill$c.csv" &
		tpid=$!
		while :; do
			done=$(grep -c '^{"file"' "$dir/kill$c.csv.journal" 2>/dev/null) || done=0
			[ "$done" -ge $((c / 2)) ] && break
			sleep 0.2
		done
		kill -KILL "$(pgrep -P "$tpid")"
		wait "$tpid" || true
		grep -v Command "$dir/time.txt" | {
			read -r wall user sys rss
			echo "killed-at-half n=$c wall ${wall}s cpu $(echo "$user + $sys" | bc)s peak $((rss / 1024))MB"
		}
		timed "resume-after-kill n=$c" features --files-from "$dir/list$c.txt" --format csv --all --resume -o "$dir/kill$c.csv"
		cmp "$dir/out$c.csv" "$dir/kill$c.csv" && echo "resumed output identical to the uninterrupted one (cmp)"
	fi
done
