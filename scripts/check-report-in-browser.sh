#!/usr/bin/env bash
# Open a report.html in a real browser (Debian's headless Chromium) and save a screenshot of it, to see
# that the self-contained report renders its figures outside coeval. Optional: not part of CI.
#
#   scripts/check-report-in-browser.sh RUN_DIR/report.html [OUT.png] [WIDTH] [HEIGHT]
#
# Needs `chromium` (apt-get install -y chromium). Network access is blocked for the page (every host
# name resolves to nothing), so the screenshot also shows that the report needs no network. The page is
# laid out WIDTH pixels wide (default 1200) and HEIGHT tall (default 12000: the whole report); the
# screenshot is cut at HEIGHT. Prints the screenshot's path.
set -euo pipefail

if [ $# -lt 1 ]; then
  echo "usage: $0 REPORT.html [OUT.png] [WIDTH] [HEIGHT]" >&2
  exit 2
fi
html=$(realpath "$1")
out=$(realpath -m "${2:-${html%.html}.png}")
width=${3:-1200}
height=${4:-12000}

browser=$(command -v chromium || command -v chromium-browser || true)
if [ -z "$browser" ]; then
  echo "chromium is not installed: apt-get install -y chromium" >&2
  exit 2
fi

profile=$(mktemp -d)
trap 'rm -rf "$profile"' EXIT

"$browser" --headless --no-sandbox --disable-gpu --disable-background-networking --disable-component-update \
  --disable-sync --no-first-run --user-data-dir="$profile" \
  --host-resolver-rules="MAP * ~NOTFOUND" --hide-scrollbars \
  --window-size="${width},${height}" --virtual-time-budget=5000 \
  --screenshot="$out" "file://${html}" 2> "${profile}/chromium.log" || {
  cat "${profile}/chromium.log" >&2
  exit 1
}
[ -s "$out" ] || { echo "chromium wrote no screenshot" >&2; cat "${profile}/chromium.log" >&2; exit 1; }
echo "$out"
