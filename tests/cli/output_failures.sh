# Outputs that cannot be written. Every command that writes files, given a
# place where nothing can be created (a path under /dev/null, refused even
# to root), fails in one line naming that path, exit 2, and writes nothing.
# A full disk is stood in for by a file-size limit (ulimit -f, with SIGXFSZ
# ignored so that a write past it fails with EFBIG, as writes on a full disk
# fail with ENOSPC): the command fails in one line, leaves no output file and
# no temporary file behind; a run so stopped leaves no results.json, and
# --resume, once there is room, finishes it with the same results as a run
# that was never stopped.
source "$(dirname "$0")/lib/common.bash"
DATA=$SRC/experiments/demo/pen3_hourly.csv
NOWHERE=/dev/null/gapmark-out
cat >run.json <<JSON
{
  "name": "output failure test (invented demo data)", "seed": 3, "replicates": 4, "holdout": 24,
  "data": [{"file": "$DATA", "period": 24, "columns": ["dissolved_oxygen_mg_l", "water_level_m"]}],
  "schemes": [{"name": "random", "rates": [0.1]}, {"name": "blocks", "length_mean": 6, "rates": [0.2]}],
  "methods": ["mean", "linear", "pchip"],
  "metrics": ["error", "acf"]
}
JSON
"$GAPMARK" run run.json --out whole --threads 2 --quiet
check "a run with room writes results.json" test -s whole/results.json
# results.json without its top-level "timing" member (wall-clock facts).
strip_timing() { sed '/^ "timing": {/,/^ }/d' "$1"; }
leftovers() { find "$@" -name '*tmp-*' 2>/dev/null | wc -l; }  # *.gapmark-tmp-*

# --- nowhere to write: one line naming the place, nothing written
expect_fail 2 "^gapmark: $NOWHERE" -- "$GAPMARK" run run.json --out $NOWHERE --quiet
expect_fail 2 "^gapmark: $NOWHERE" -- "$GAPMARK" report whole/results.json --out $NOWHERE --quiet
expect_fail 2 "^gapmark: $NOWHERE" -- "$GAPMARK" merge whole --out $NOWHERE --quiet
expect_fail 2 "^gapmark: $NOWHERE/x.csv" -- "$GAPMARK" fill "$DATA" --method linear --out $NOWHERE/x.csv
expect_fail 2 "^gapmark: $NOWHERE/x.csv" -- "$GAPMARK" mask "$DATA" --scheme random:rate=0.1 --out $NOWHERE/x.csv
expect_fail 2 "^gapmark: $NOWHERE/x.csv" -- "$GAPMARK" regularize "$DATA" --step PT1H --out $NOWHERE/x.csv
expect_fail 2 "^gapmark: $NOWHERE/x.svg" -- "$GAPMARK" profile "$DATA" --svg $NOWHERE/x.svg
expect_fail 2 "^gapmark: $NOWHERE/x.json" -- "$GAPMARK" compare whole/results.json whole/results.json --json $NOWHERE/x.json
expect_fail 2 "^gapmark: $NOWHERE" -- "$GAPMARK" quick "$DATA" --column water_level_m --replicates 2 --out $NOWHERE
check "nothing written in the working folder" test -z "$(ls -A | grep -v -e '^whole$' -e '^run.json$' -e '^out.txt$' -e '^err.txt$')"

# --- a full disk, stood in for by a file-size limit of KB kilobytes
limited() {  # limited KB command...: runs the command with writes past KB failing
  local kb=$1
  shift
  (ulimit -f "$kb" && trap '' XFSZ && exec "$@")
}
expect_fail 2 "^gapmark: full/x.csv: cannot write: File too large" -- limited 16 "$GAPMARK" fill "$DATA" --method linear --out full/x.csv
check "fill on a full disk: no output file" test ! -e full/x.csv
check "fill on a full disk: no temporary file" test "$(leftovers full)" -eq 0
expect_fail 2 "^gapmark: full/m.csv: cannot write: File too large" -- limited 16 "$GAPMARK" mask "$DATA" --scheme random:rate=0.1 --out full/m.csv
check "mask on a full disk: no output file" test ! -e full/m.csv

# The checkpoint fills the limit first: the run stops at once.
expect_fail 2 "trials.jsonl.*File too large" -- limited 8 "$GAPMARK" run run.json --out stopped --threads 2 --quiet
check "run stopped by a full disk: no results.json" test ! -e stopped/results.json
check "run stopped by a full disk: no report" test -z "$(ls stopped | grep -v '^trials.jsonl$')"
"$GAPMARK" run run.json --resume stopped --threads 2 --quiet
check "resumed once there is room: same results.json as a run never stopped" \
  cmp -s <(strip_timing whole/results.json) <(strip_timing stopped/results.json)

# The checkpoint fits but the reports do not: every report is staged and
# none is put in place, so nothing looks finished.
checkpoint_kb=$(( $(stat -c %s whole/trials.jsonl) / 1024 + 2 ))
results_kb=$(( $(stat -c %s whole/results.json) / 1024 ))
check "the test's sizes leave room between checkpoint and results ($checkpoint_kb KB < $results_kb KB)" \
  test "$checkpoint_kb" -lt "$results_kb"
expect_fail 2 "File too large" -- limited "$checkpoint_kb" "$GAPMARK" run run.json --out late --threads 2 --quiet
check "reports on a full disk: the checkpoint holds every task" test "$(wc -l <late/trials.jsonl)" -eq "$(wc -l <whole/trials.jsonl)"
check "reports on a full disk: no results.json, no report" test -z "$(ls late | grep -v '^trials.jsonl$')"
check "reports on a full disk: no temporary file" test "$(leftovers late)" -eq 0
"$GAPMARK" run run.json --resume late --threads 2 --quiet
check "resumed once there is room: same results.json" \
  cmp -s <(strip_timing whole/results.json) <(strip_timing late/results.json)
finish
