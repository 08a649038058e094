#!/bin/bash
# The committed regression baseline: rerunning its spec must compare as
# "no change" (exit 0); results made worse must be named (exit 1), a summary
# first; another seed alone is no regression; unrelated files and bad input
# exit 2.
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
# The summary comes first, then at most 20 cells; --all names every one.
[ "$(grep -n '^REGRESSION' "$work/worse.txt" | cut -d: -f1)" -lt "$(grep -n '^Worst 20 cells' "$work/worse.txt" | cut -d: -f1)" ] ||
  fail "the summary must come before the worst cells"
grep -q 'more changed cells not shown; --all prints every change' "$work/worse.txt" || fail "the table must be cut at 20 cells"
grep -q 'Holm-corrected' "$work/worse.txt" || fail "the correction must be said"
"$gapmark" compare "$baseline" "$work/worse.json" --all > "$work/worse_all.txt"
grep -q '^  linear/chamber_humidity_pct/random@0.1: rmse worse by' "$work/worse_all.txt" || fail "regressed cell not named"
[ "$(wc -l < "$work/worse_all.txt")" -gt "$(wc -l < "$work/worse.txt")" ] || fail "--all must print more"

# Another seed alone is no regression, even with every metric watched.
sed 's/"seed": 31415/"seed": 27182/' "$src/experiments/regression/regression.json" > "$work/reseeded.json"
sed -i "s|\"file\": \"|\"file\": \"$src/experiments/regression/|" "$work/reseeded.json"
"$gapmark" run "$work/reseeded.json" --out "$work/reseeded" --quiet || fail "gapmark run (another seed)"
for tolerance in "" "*=0%"; do
  "$gapmark" compare "$baseline" "$work/reseeded/results.json" ${tolerance:+--tolerance "$tolerance"} > "$work/seed.txt"
  status=$?
  [ $status -eq 0 ] || { cat "$work/seed.txt"; fail "another seed (tolerance '$tolerance') must exit 0, got $status"; }
  grep -q '^no regression' "$work/seed.txt" || fail "another seed must say no regression"
  grep -q 'the seeds differ' "$work/seed.txt" || fail "another seed must be noted"
done

# Files with no cell in common are refused, saying what differs.
sed -E 's/"method": "/"method": "other-/' "$work/run/results.json" > "$work/unrelated.json"
"$gapmark" compare "$baseline" "$work/unrelated.json" > /dev/null 2> "$work/err.txt"
[ $? -eq 2 ] || fail "unrelated files must exit 2"
grep -q 'no cell in common with .*methods ' "$work/err.txt" || { cat "$work/err.txt"; fail "the error must say what differs"; }

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
