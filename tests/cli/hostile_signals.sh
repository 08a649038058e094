# Interruption and limits of outside programs: a program that starts a
# grandchild in a session of its own (setsid) leaves no process behind,
# neither after its timeout nor after Ctrl-C; the first Ctrl-C ends running
# programs at once and says so, and the interrupted tasks are left for --resume.
source "$(dirname "$0")/lib/common.bash"
if ! command -v setsid >/dev/null; then echo "setsid is missing: skipped"; exit 77; fi
printf 'time,level\n' >data.csv
for i in $(seq 0 39); do printf '%d,%s\n' "$i" "$(( (i * 7) % 13 + 20 ))" >>data.csv; done
cp "$SRC/tests/fill_external/linear_fill.sh" linear.sh
# The program: with SLOW set it starts a grandchild in its own session, notes
# both process ids, and waits far longer than any test.
cat >prog.sh <<'SH'
#!/bin/sh
if [ -n "$SLOW" ]; then
  setsid sleep 600 &
  echo "$! $$" >>"$PIDS"
  sleep 600
fi
exec "$(dirname "$0")/linear.sh"
SH
chmod +x prog.sh linear.sh
export PIDS=$PWD/pids
alive() {  # prints the noted processes still alive
  local p
  for p in $(cat "$PIDS" 2>/dev/null); do
    if kill -0 "$p" 2>/dev/null && ! grep -q '^Z' <(awk '{print $3}' "/proc/$p/stat" 2>/dev/null); then echo "$p"; fi
  done
}
spec() {  # spec TIMEOUT OUTPUT
  printf '{"data": ["data.csv"], "schemes": ["random:rate=0.2"], "replicates": 2, "seed": 5,
 "methods": ["linear", "external:command=%s/prog.sh,timeout=%s"], "metrics": ["error"], "output": "%s"}\n' \
    "$PWD" "$1" "$2"
}

# --- timeout: the program, its group and its setsid grandchild are all ended
spec 1 timed >timed.json
rm -f pids
SLOW=1 "$GAPMARK" run timed.json --allow-external --quiet -j 1
check "the grandchild was started (two per call)" test "$(wc -w <pids)" -ge 4
check "the trials record the timeout" grep -q "timed out after 1 s" timed/results.json
left=$(alive)
check "no process of the program is left after a timeout (left: $left)" test -z "$left"

# --- Ctrl-C: at once, said, nothing left, the interrupted task not recorded
spec 600 stopped >stopped.json
rm -f pids
SLOW=1 "$GAPMARK" run stopped.json --allow-external --quiet -j 1 2>err.txt &
run=$!
for _ in $(seq 200); do [ -s pids ] && break; sleep 0.05; done
check "the program is running" test -s pids
started=$(date +%s)
kill -INT "$run"
status=0
wait "$run" || status=$?
took=$(( $(date +%s) - started ))
check "Ctrl-C ends the run with 130" test "$status" -eq 130
check "at once, not after the program's timeout ($took s)" test "$took" -le 5
check "it says the outside programs are ended" grep -q "outside programs still running are ended now" err.txt
check "and how to resume" grep -q "resume with: gapmark run stopped.json --resume" err.txt
left=$(alive)
check "no process of the program is left after Ctrl-C (left: $left)" test -z "$left"
check "the interrupted task is not recorded as failed" test "$(grep -c 'interrupt' stopped/trials.jsonl)" -eq 0
"$GAPMARK" run stopped.json --allow-external --quiet --resume
check "--resume finishes it" test -s stopped/results.json
check "with no failed trial" test "$(grep -c '"status": "failed"' stopped/results.json)" -eq 0

# --- Ctrl-C during a merge whose example windows run the outside program
spec 600 merged >merged.json
"$GAPMARK" run merged.json --allow-external --quiet --shard 1/2 --out part1
"$GAPMARK" run merged.json --allow-external --quiet --shard 2/2 --out part2
rm -f pids
SLOW=1 "$GAPMARK" merge part1 part2 --spec merged.json --allow-external --out merged 2>err.txt &
run=$!
for _ in $(seq 200); do [ -s pids ] && break; sleep 0.05; done
check "the merge started the program" test -s pids
started=$(date +%s)
kill -INT "$run"
status=0
wait "$run" || status=$?
took=$(( $(date +%s) - started ))
check "Ctrl-C ends the merge with 130" test "$status" -eq 130
check "at once ($took s)" test "$took" -le 5
check "it says the merge writes nothing" grep -q "the merge writes nothing" err.txt
check "and wrote nothing" test ! -e merged/results.json
left=$(alive)
check "no process of the program is left after Ctrl-C during a merge (left: $left)" test -z "$left"
finish
