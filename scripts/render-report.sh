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

browser=""
for b in chromium chromium-browser google-chrome; do
	if command -v "$b" >/dev/null 2>&1; then
		browser=$b
		break
	fi
done
if [ -z "$browser" ]; then
	echo "render-report: Chromium not found; skipping the screenshot (report at $out/report.html)"
	exit 0
fi

profile=$(mktemp -d)
trap 'rm -rf "$profile"' EXIT
sandbox=""
if [ "$(id -u)" = 0 ]; then
	sandbox="--no-sandbox" # Chromium refuses to run as root with its sandbox
fi
# Off the network: every URL goes to a closed port on the loopback
# interface and no host name resolves (the browser's own services
# included).
offline="--proxy-server=http://127.0.0.1:1 --proxy-bypass-list=<-loopback>"
"$browser" --headless $sandbox --disable-gpu --disable-background-networking \
	--disable-component-update --disable-sync --no-first-run $offline \
	--host-resolver-rules='MAP * ~NOTFOUND' \
	--user-data-dir="$profile" --hide-scrollbars \
	--screenshot="$out/report.png" --window-size=1200,${HEIGHT:-9000} \
	"file://$out/report.html" >/dev/null 2>&1
"$browser" --headless $sandbox --disable-gpu --disable-background-networking \
	--disable-component-update --disable-sync --no-first-run $offline \
	--host-resolver-rules='MAP * ~NOTFOUND' \
	--user-data-dir="$profile" --no-pdf-header-footer \
	--print-to-pdf="$out/report.pdf" \
	"file://$out/report.html" >/dev/null 2>&1 || echo "render-report: PDF print failed (screenshot kept)"
echo "report:     $out/report.html"
echo "screenshot: $out/report.png"
[ -s "$out/report.pdf" ] && echo "print view: $out/report.pdf"
exit 0
