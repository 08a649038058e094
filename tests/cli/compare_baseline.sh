#!/bin/bash
# The committed regression baseline: rerunning its spec must compare as
# "no change" (exit 0); results made worse must be named (exit 1); bad input
# exits 2.
# Usage: bash compare_baseline.sh GAPMARK_BINARY SOURCE_DIR WORK_DIR
set -u
gapmark=$1 src=$2 work=$3
fail() { echo "FAIL: $*"; exit 1; }
rm -rf "$work" && mkdir -p "$work" || fail "cannot make $work"
baseline="$src/experiments/regression/baseline.json"

"$gapmark" run "$src/experiments/regression/regression.json" --out "$work/run" --quiet || fail "gapmark run"
"$gapmark" compare "$baseline" "$work/run/results.json" --json "$work/compare.json" > "$work/out.txt"
status=$?
cat "$work/out.txt"
[ $status -eq 0 ] || fail "expected exit 0 against the committed baseline, got $status"
grep -q '^no change' "$work/out.txt" || fail "expected 'no change'"
grep -q '"no_change": true' "$work/compare.json" || fail "--json does not say no_change"

# Every rmse value made larger (a leading 9 added to each number): all cells regress.
sed -E 's/"rmse": ([0-9])/"rmse": 9\1/' "$work/run/results.json" > "$work/worse.json"
"$gapmark" compare "$baseline" "$work/worse.json" > "$work/worse.txt"
status=$?
[ $status -eq 1 ] || { cat "$work/worse.txt"; fail "expected exit 1 for worse results, got $status"; }
grep -q '^REGRESSION in 36 of 36 cells' "$work/worse.txt" || { cat "$work/worse.txt"; fail "expected 36 regressed cells"; }
grep -q '^  linear/chamber_humidity_pct/random@0.1: rmse worse by' "$work/worse.txt" || fail "regressed cell not named"

# The other way round it is an improvement.
"$gapmark" compare "$work/worse.json" "$baseline" > /dev/null || fail "an improvement must exit 0"

# A generous tolerance accepts it.
"$gapmark" compare "$baseline" "$work/worse.json" --tolerance 'rmse=100000%' > /dev/null ||
  fail "a generous tolerance must exit 0"

# Bad input: exit 2 with one line naming the problem.
"$gapmark" compare "$work/missing.json" "$baseline" 2> "$work/err.txt"
[ $? -eq 2 ] || fail "a missing file must exit 2"
grep -q 'missing.json' "$work/err.txt" || fail "the error must name the file"
"$gapmark" compare "$baseline" "$baseline" --tolerance 'rmse' 2> "$work/err.txt"
[ $? -eq 2 ] || fail "a bad tolerance must exit 2"
grep -q -- '--tolerance' "$work/err.txt" || fail "the error must name --tolerance"
echo "ok"
