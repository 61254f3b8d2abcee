# Sourced by render-report.sh and render-survey.sh: finds Chromium and
# defines headless, which runs it headless on a page with the given flags
# (a fresh profile, no sandbox when root) and off the network: every URL
# goes to a closed port on the loopback interface and no host name
# resolves, the browser's own services included.
#
#   name=render-x page=/tmp/x/report.html   # name prefixes messages
#   . scripts/headless.sh
#   headless --screenshot=out.png --window-size=1200,1500 "file://$page"
#
# Without Chromium it says so and exits 0 (the page is still there).

browser=""
for b in chromium chromium-browser google-chrome; do
	if command -v "$b" >/dev/null 2>&1; then
		browser=$b
		break
	fi
done
if [ -z "$browser" ]; then
	echo "$name: Chromium not found; skipping the screenshot (page at $page)"
	exit 0
fi

profile=$(mktemp -d)
trap 'rm -rf "$profile"' EXIT
sandbox=""
if [ "$(id -u)" = 0 ]; then
	sandbox="--no-sandbox" # Chromium refuses to run as root with its sandbox
fi

headless() {
	"$browser" --headless $sandbox --disable-gpu --disable-background-networking \
		--disable-component-update --disable-sync --disable-extensions --no-first-run \
		--proxy-server=http://127.0.0.1:1 --proxy-bypass-list='<-loopback>' \
		--host-resolver-rules='MAP * ~NOTFOUND' \
		--user-data-dir="$profile" "$@" >/dev/null 2>&1
}
