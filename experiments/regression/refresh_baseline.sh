#!/bin/bash
# Rewrites baseline.json from the current build, after a change that is meant
# to alter results. Review `gapmark compare` output first, then commit the new
# baseline with a message that says why the numbers moved.
# Usage: bash experiments/regression/refresh_baseline.sh path/to/gapmark
set -eu
gapmark=${1:?usage: refresh_baseline.sh path/to/gapmark}
here=$(cd "$(dirname "$0")" && pwd)
out=$(mktemp -d)
trap 'rm -rf "$out"' EXIT
"$gapmark" run "$here/regression.json" --out "$out" --quiet
"$gapmark" compare "$here/baseline.json" "$out/results.json" || true
cp "$out/results.json" "$here/baseline.json"
echo "wrote $here/baseline.json"
