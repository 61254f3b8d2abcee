#!/bin/sh
# Survey the demo campaign (tracesift survey) and take a screenshot of the
# first screen of its HTML report with headless Chromium — how
# docs/survey-report.png is made.
#
#   scripts/render-survey.sh [OUTDIR] [CAMPAIGN.csv]
#
# Writes OUTDIR/report.html (with the survey's other outputs) and
# OUTDIR/report.png (OUTDIR defaults to /tmp/tracesift-survey). Needs Go;
# the screenshot needs Chromium (Debian: apt-get install chromium) and is
# skipped with a message without it. The browser is kept off the network:
# every URL goes to a closed port on the loopback interface and no host
# name resolves. CI does not run this script (report/chromium_test.go
# checks the page in the browser).
set -eu

root=$(cd "$(dirname "$0")/.." && pwd)
out=${1:-/tmp/tracesift-survey}
campaign=${2:-$root/testdata/demo/campaign.csv}
mkdir -p "$out"
out=$(cd "$out" && pwd)
case $campaign in /*) ;; *) campaign=$(pwd)/$campaign ;; esac

cd "$root"
echo "surveying ${campaign#"$root"/}..."
go run ./cmd/tracesift survey "${campaign#"$root"/}" -o "$out" 2>/dev/null
if [ ! -s "$out/report.html" ]; then
	echo "render-survey: no report was written" >&2
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
	echo "render-survey: Chromium not found; skipping the screenshot (report at $out/report.html)"
	exit 0
fi

profile=$(mktemp -d)
trap 'rm -rf "$profile"' EXIT
sandbox=""
if [ "$(id -u)" = 0 ]; then
	sandbox="--no-sandbox" # Chromium refuses to run as root with its sandbox
fi
"$browser" --headless $sandbox --disable-gpu --disable-background-networking \
	--disable-component-update --disable-sync --disable-extensions --no-first-run \
	--proxy-server=http://127.0.0.1:1 --proxy-bypass-list='<-loopback>' \
	--host-resolver-rules='MAP * ~NOTFOUND' \
	--user-data-dir="$profile" --hide-scrollbars \
	--screenshot="$out/report.png" --window-size=1200,${HEIGHT:-1500} \
	"file://$out/report.html" >/dev/null 2>&1
echo "report:     $out/report.html"
echo "screenshot: $out/report.png"
