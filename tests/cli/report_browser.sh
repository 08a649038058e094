#!/bin/bash
# report.html: references nothing outside itself, and opens in headless
# Chromium (Debian's chromium) without console errors, showing its content;
# a screenshot is kept in the work folder for a person to look at.
# Usage: bash report_browser.sh GAPMARK_BINARY SOURCE_DIR WORK_DIR
set -u
gapmark=$1 src=$2 work=$3
fail() { echo "FAIL: $*"; exit 1; }
rm -rf "$work" && mkdir -p "$work" || fail "cannot make $work"

"$gapmark" run "$src/experiments/regression/regression.json" --out "$work/run" --quiet || fail "gapmark run"
html="$work/run/report.html"
[ -s "$html" ] || fail "no report.html written"

# `gapmark report` writes the same page again from results.json.
"$gapmark" report "$work/run/results.json" --out "$work/again" --quiet || fail "gapmark report"
cmp -s "$html" "$work/again/report.html" || fail "report re-rendered from results.json differs from the run's"
for f in results.json ranking.md ranking.csv methods.md references.bib; do
  [ -s "$work/again/$f" ] || fail "gapmark report did not write $f"
done

# No network resource: no URLs, no external sources or imports, no scripts.
if grep -n -E 'https?:|="//|src=|@import|url\(|<script|<link' "$html" > "$work/network.txt"; then
  cat "$work/network.txt"
  fail "report.html references something outside itself"
fi

chromium=/usr/bin/chromium
if [ ! -x "$chromium" ]; then
  echo "skipped: chromium not installed"
  exit 77  # ctest reports a skip (SKIP_RETURN_CODE), not a pass
fi
profile=$(mktemp -d)
trap 'rm -rf "$profile"' EXIT
# Any host lookup fails, so a load from the network would show as an error.
flags=(--headless --no-sandbox --disable-gpu --disable-quic --no-first-run --disable-background-networking
       --disable-component-update --disable-sync --user-data-dir="$profile"
       --host-resolver-rules="MAP * ~NOTFOUND")

timeout 180 "$chromium" "${flags[@]}" --enable-logging=stderr --v=0 --dump-dom "file://$html" \
  > "$work/dom.html" 2> "$work/chromium.log" || fail "chromium --dump-dom failed (see $work/chromium.log)"
if grep -E 'Uncaught|ERROR:CONSOLE|Failed to load resource|net::ERR' "$work/chromium.log"; then
  fail "console errors while loading report.html"
fi
grep -q 'Recommended on this evidence' "$work/dom.html" || fail "the page did not render its recommendations"
grep -q '<svg class="chart"' "$work/dom.html" || fail "the page has no charts"

timeout 180 "$chromium" "${flags[@]}" --hide-scrollbars --window-size=1100,2400 \
  --screenshot="$work/report.png" "file://$html" > /dev/null 2>> "$work/chromium.log" || fail "chromium --screenshot failed"
[ -s "$work/report.png" ] || fail "no screenshot"
[ "$(head -c 8 "$work/report.png" | od -An -tx1 | tr -d ' \n')" = "89504e470d0a1a0a" ] || fail "screenshot is not a PNG"
echo "ok: report.html loads offline without console errors; screenshot $work/report.png"
