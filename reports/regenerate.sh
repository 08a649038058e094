#!/usr/bin/env bash
# Rewrites the demo's reports in this folder from a fresh run of
# experiments/demo.json, so that anyone can see what gapmark produces without
# building it. Run after any change that alters the demo's outputs, and commit
# the result with the change:
#   bash reports/regenerate.sh build/gapmark
# The test `cli_reports_match_demo` checks that these copies equal a fresh
# run's outputs, with the version and source commit set aside.
set -euo pipefail
gapmark=$(realpath "${1:?usage: regenerate.sh path/to/gapmark}")
here=$(cd "$(dirname "$0")" && pwd)
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
"$gapmark" run "$here/../experiments/demo.json" --out "$work/demo" --quiet
for f in report.html ranking.md methods.md references.bib; do
  cp "$work/demo/$f" "$here/$f"
done
echo "reports/: report.html ranking.md methods.md references.bib rewritten from a fresh demo run"
