#!/bin/sh
# Render the single-trace HTML report of a demo trace with the embedded
# default model (tracesift report), then take a full-page screenshot and a
# print view with headless Chromium for a visual check.
#
#   scripts/render-report.sh [OUTDIR] [TRACE.csv]
#
# Writes OUTDIR/report.html and OUTDIR/report.png (OUTDIR defaults to
# /tmp/tracesift-report). Needs Go; the screenshot needs Chromium (Debian:
# apt-get install chromium) and is skipped with a message without it.
# CI does not run this script.
set -eu

root=$(cd "$(dirname "$0")/.." && pwd)
out=${1:-/tmp/tracesift-report}
trace=${2:-$root/testdata/demo/stressed/D01_stressed_Vg1.20.csv}
mkdir -p "$out"
out=$(cd "$out" && pwd)
case $trace in /*) ;; *) trace=$(pwd)/$trace ;; esac

cd "$root"
echo "rendering $trace..."
go run ./cmd/tracesift report "${trace#"$root"/}" -o "$out/report.html"
if [ ! -s "$out/report.html" ]; then
	echo "render-report: no report was written" >&2
	exit 1
fi

name=render-report page="$out/report.html"
. "$root/scripts/headless.sh"
headless --hide-scrollbars --screenshot="$out/report.png" --window-size=1200,${HEIGHT:-9000} \
	"file://$out/report.html"
headless --no-pdf-header-footer --print-to-pdf="$out/report.pdf" \
	"file://$out/report.html" || echo "render-report: PDF print failed (screenshot kept)"
echo "report:     $out/report.html"
echo "screenshot: $out/report.png"
[ -s "$out/report.pdf" ] && echo "print view: $out/report.pdf"
exit 0
