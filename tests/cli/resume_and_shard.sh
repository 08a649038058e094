# End to end, with separate processes: a run killed with SIGKILL midway and
# resumed, a run stopped with Ctrl-C (SIGINT) and resumed with the command it
# prints, and three shards merged all give results.json byte for byte equal
# (outside "timing") to one uninterrupted run. Wrong shard sets, another
# spec, an impossible output folder and infinite input fail in one line.
source "$(dirname "$0")/lib/common.bash"
DATA=$SRC/experiments/demo/pen3_hourly.csv
spec() {  # spec FILE SEED: a spec over the invented demo data
  cat >"$1" <<JSON
{
  "name": "resume and shard test (invented demo data)", "seed": $2, "replicates": 12, "holdout": 24,
  "data": [{"file": "$DATA", "period": 24,
            "columns": ["dissolved_oxygen_mg_l", "water_level_m", "pump_energy_kwh"]}],
  "schemes": [{"name": "random", "rates": [0.1, 0.3]}, {"name": "blocks", "length_mean": 6, "rates": [0.2]}],
  "methods": ["mean", "carry-forward", "linear", "pchip", "seasonal-mean", "kalman:model=level"],
  "metrics": ["error", "acf"]
}
JSON
}
spec run.json 5
spec other.json 6
TOTAL=$((3 * 3 * 12))
# results.json without its top-level "timing" member (wall-clock facts).
strip_timing() { sed '/^ "timing": {/,/^ }/d' "$1"; }
same_results() { cmp -s <(strip_timing "$1/results.json") <(strip_timing "$2/results.json"); }
lines() { if [ -f "$1/trials.jsonl" ]; then wc -l <"$1/trials.jsonl"; else echo 0; fi; }
# wait_lines DIR N: until the checkpoint holds N lines (header + tasks)
wait_lines() {
  for _ in $(seq 1 600); do
    [ "$(lines "$1")" -ge "$2" ] && return 0
    sleep 0.05
  done
  return 1
}

"$GAPMARK" run run.json --out single --threads 2 --quiet
check "single run wrote results.json" test -s single/results.json
check "single run kept its checkpoint, one line per task" test "$(lines single)" -eq $((TOTAL + 1))
check "strip_timing removes the timing member and nothing else" \
  test "$(($(wc -l <single/results.json) - $(strip_timing single/results.json | wc -l)))" -lt 20
check "timing is there to strip" grep -q '^ "timing": {' single/results.json

# --- three shards as separate processes, merged
for k in 1 2 3; do "$GAPMARK" run run.json --shard $k/3 --out shard$k --threads 1 --quiet & done
wait
for k in 1 2 3; do
  check "shard $k wrote its marker" test -s shard$k/shard.json
  check "shard $k wrote no results.json" test ! -e shard$k/results.json
done
check "the shards' tasks add up to the grid" \
  test $(($(lines shard1) + $(lines shard2) + $(lines shard3) - 3)) -eq $TOTAL
"$GAPMARK" merge shard2 shard3 shard1 --out merged --spec run.json --quiet
check "merged results.json equals the single run's" same_results single merged
for f in ranking.md ranking.csv methods.md; do
  check "merged $f equals the single run's" cmp -s single/$f merged/$f
done
expect_fail 2 "missing shard 3/3" -- "$GAPMARK" merge shard1 shard2 --out bad
expect_fail 2 "shard 2/3 is given twice" -- "$GAPMARK" merge shard1 shard2 shard2 shard3 --out bad
"$GAPMARK" run other.json --shard 3/3 --out other3 --threads 1 --quiet
expect_fail 2 "other3: a run of another spec" -- "$GAPMARK" merge shard1 shard2 other3 --out bad
expect_fail 2 "different splits" -- "$GAPMARK" merge shard1 single --out bad
check "failed merges wrote nothing" test ! -e bad/results.json

# --- SIGKILL midway, a partial line, resume
"$GAPMARK" run run.json --out killed --threads 1 --quiet &
pid=$!
check "the run got going" wait_lines killed 11
kill -KILL $pid
wait $pid 2>/dev/null || true
done_before=$(($(lines killed) - 1))
check "killed midway ($done_before of $TOTAL tasks done)" test "$done_before" -lt "$TOTAL"
check "a killed run leaves no results.json" test ! -e killed/results.json
printf '{"task": 3, "trials": [{"status": "o' >>killed/trials.jsonl  # cut short by the crash
"$GAPMARK" run run.json --resume killed --threads 2 --quiet
check "resumed after SIGKILL: same results.json as the single run" same_results single killed
check "resumed checkpoint: one whole line per task" test "$(lines killed)" -eq $((TOTAL + 1))

# --- Ctrl-C: flush, say how to resume, exit 130; the printed command finishes the run
status=0
"$GAPMARK" run run.json --out stopped --threads 1 --quiet 2>stopped.txt &
pid=$!
wait_lines stopped 6
kill -INT $pid
wait $pid || status=$?
check "SIGINT exits with 130 (got $status)" test "$status" -eq 130
check "SIGINT prints how to resume" grep -qE "^interrupted: [0-9]+ of $TOTAL tasks done; resume with: gapmark run run.json --resume stopped$" stopped.txt
check "the count printed is the checkpoint's" grep -q "^interrupted: $(($(lines stopped) - 1)) of" stopped.txt
resume_command=$(sed -n 's/.*resume with: gapmark //p' stopped.txt)
# shellcheck disable=SC2086
"$GAPMARK" $resume_command --quiet
check "resumed after SIGINT: same results.json as the single run" same_results single stopped

# --- refusals, one line each
expect_fail 2 "another spec" -- "$GAPMARK" run other.json --resume killed
expect_fail 2 "nothing to resume" -- "$GAPMARK" run run.json --resume nowhere
expect_fail 2 "^gapmark: /dev/null/out: cannot create the output folder" -- "$GAPMARK" run run.json --out /dev/null/out
expect_fail 2 "shard 4/3: K must be between 1 and N" -- "$GAPMARK" run run.json --shard 4/3
printf 'time,a\n1,1\n2,2\n3,inf\n4,4\n' >infinite.csv
printf '{"data": ["infinite.csv"], "schemes": [{"name": "random", "rates": [0.2]}], "methods": ["linear"]}' >inf.json
expect_fail 2 "infinite.csv:4" -- "$GAPMARK" run inf.json --out inf_out
check "infinite input: nothing written" test ! -e inf_out/results.json

# --- progress: a plain line when stderr is not a terminal, silence with --quiet
"$GAPMARK" run run.json --shard 1/9 --out progress >/dev/null 2>progress.txt
check "plain progress line when not a terminal" grep -qE "^progress: 12/12 tasks \(100%\)" progress.txt
"$GAPMARK" run run.json --shard 1/9 --out quiet --quiet >/dev/null 2>quiet.txt
check "--quiet prints nothing" test ! -s quiet.txt
# A whole run says when its tasks are done and the reports are being written
# (on a large grid that takes a while after 100%), then what it wrote.
"$GAPMARK" run run.json --out announced >/dev/null 2>announced.txt
check "a whole run announces the reports" test "$(grep -E '^(all tasks done|wrote )' announced.txt | cut -c1-14 | tr '\n' '|')" = "all tasks done|wrote 6 files |"
check "the announcement names the folder" grep -qx "all tasks done; summarising and writing the reports to announced" announced.txt
finish
