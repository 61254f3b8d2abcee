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
# skipped with a message without it; the browser is kept off the network
# (scripts/headless.sh). CI does not run this script (report/chromium_test.go
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

name=render-survey page="$out/report.html"
. "$root/scripts/headless.sh"
headless --hide-scrollbars --screenshot="$out/report.png" --window-size=1200,${HEIGHT:-1500} \
	"file://$out/report.html"
echo "report:     $out/report.html"
echo "screenshot: $out/report.png"
