# Outputs never clobber: gapmark writes only regular files, never through a
# symbolic link, never over its own inputs, never over an earlier output
# without --force, and one process at a time per output folder. Each check is
# the command a user would type.
source "$(dirname "$0")/lib/common.bash"
printf 'time,level\n' >data.csv
for i in $(seq 0 59); do
  if [ $((i % 9)) -eq 4 ]; then printf '%d,\n' "$i"; else printf '%d,%s\n' "$i" "$(( (i * 7) % 13 + 20 ))"; fi
done >>data.csv
cat >spec.json <<'JSON'
{"name": "small", "seed": 2, "replicates": 2, "data": ["data.csv"],
 "schemes": [{"name": "random", "rates": [0.2]}], "methods": ["linear", "mean"], "metrics": ["error"],
 "output": "out"}
JSON

# --- not a regular file: a device, a FIFO, a symbolic link
expect_fail 2 "/dev/null: is a device, not a regular file" -- "$GAPMARK" fill data.csv -m linear -o /dev/null --force
check "/dev/null is still a device" test -c /dev/null
mkfifo pipe.csv
expect_fail 2 "pipe.csv: is a FIFO" -- "$GAPMARK" mask data.csv -s random:rate=0.1 -o pipe.csv --force
check "the FIFO is still a FIFO" test -p pipe.csv
echo keep >victim.txt
ln -s victim.txt link.csv
expect_fail 2 "link.csv: is a symbolic link" -- "$GAPMARK" fill data.csv -m linear -o link.csv --force
check "the link is still a link" test -L link.csv
check "its target is untouched" test "$(cat victim.txt)" = keep
expect_fail 2 "is a folder, not a regular file" -- "$GAPMARK" fill data.csv -m linear -o . --force

# --- a link planted at the temporary name the previous build used (OUT.tmp-PID)
sh -c 'ln -s victim.txt filled.csv.tmp-$$; exec "$0" fill data.csv -m linear -o filled.csv' "$GAPMARK" 2>/dev/null
check "a planted link at OUT.tmp-PID is not followed" test "$(cat victim.txt)" = keep
check "the output was written" grep -q level_filled filled.csv
rm -f filled.csv.tmp-*

# --- a checkpoint that is a symbolic link is not followed
mkdir -p planted
ln -s ../victim.txt planted/trials.jsonl
expect_fail 2 "trials.jsonl: is a symbolic link" -- "$GAPMARK" run spec.json --out planted --force --quiet
check "the link's target is untouched" test "$(cat victim.txt)" = keep

# --- one rule for every command that writes: refuse an existing output unless --force
"$GAPMARK" fill data.csv -m linear -o f.csv 2>/dev/null
expect_fail 2 "f.csv: exists already; give --force to replace it" -- "$GAPMARK" fill data.csv -m linear -o f.csv
check "fill --force replaces it" "$GAPMARK" fill data.csv -m mean -o f.csv --force
"$GAPMARK" mask data.csv -s random:rate=0.1 -o m.csv 2>/dev/null
expect_fail 2 "m.csv: exists already; give --force" -- "$GAPMARK" mask data.csv -s random:rate=0.1 -o m.csv
check "mask --force replaces it" "$GAPMARK" mask data.csv -s random:rate=0.1 -o m.csv --force
"$GAPMARK" regularize data.csv --out r.csv --step 1 >/dev/null 2>&1
expect_fail 2 "r.csv: exists already; give --force" -- "$GAPMARK" regularize data.csv --out r.csv --step 1
"$GAPMARK" run spec.json --quiet
expect_fail 2 "out: holds an earlier output \(trials.jsonl\); give --force to replace it, or --resume" -- \
  "$GAPMARK" run spec.json --quiet
check "run --force replaces it" "$GAPMARK" run spec.json --quiet --force
"$GAPMARK" report out/results.json --out rep --quiet
expect_fail 2 "rep: holds an earlier output \(results.json\); give --force" -- "$GAPMARK" report out/results.json --out rep
check "report --force replaces it" "$GAPMARK" report out/results.json --out rep --quiet --force
"$GAPMARK" run spec.json --shard 1/2 --out sh1 --quiet
"$GAPMARK" run spec.json --shard 2/2 --out sh2 --quiet
"$GAPMARK" merge sh1 sh2 --out mer --quiet
expect_fail 2 "mer: holds an earlier output \(results.json\); give --force" -- "$GAPMARK" merge sh1 sh2 --out mer
check "merge --force replaces it" "$GAPMARK" merge sh1 sh2 --out mer --quiet --force
"$GAPMARK" compare out/results.json rep/results.json --json cmp.json >/dev/null
expect_fail 2 "cmp.json: exists already; give --force" -- "$GAPMARK" compare out/results.json rep/results.json --json cmp.json
check "compare --json --force replaces it" "$GAPMARK" compare out/results.json rep/results.json --json cmp.json --force
expect_fail 2 "is an input of this command" -- \
  "$GAPMARK" compare out/results.json rep/results.json --json rep/results.json --force
check "compare never wrote over its input" grep -q '"verdict"' rep/results.json
expect_fail 2 "sh1: the output folder holds an input of the run, sh1/trials.jsonl" -- \
  "$GAPMARK" merge sh1 sh2 --out sh1 --force

# --- an output folder never holds an input of the run
mkdir -p here
cp data.csv here/ranking.csv
printf '{"data": ["ranking.csv"], "schemes": ["random:rate=0.2"], "methods": ["linear"], "replicates": 2, "output": "."}\n' \
  >here/results.json
expect_fail 2 "the output folder holds an input of the run, here/results.json" -- "$GAPMARK" run here/results.json --quiet
printf '{"data": ["here/ranking.csv"], "schemes": ["random:rate=0.2"], "methods": ["linear"], "replicates": 2, "output": "here"}\n' \
  >datahere.json
expect_fail 2 "the output folder holds an input of the run, ./here/ranking.csv" -- "$GAPMARK" run datahere.json --quiet
check "the data file called ranking.csv is untouched" cmp -s data.csv here/ranking.csv
cp out/results.json results.json
expect_fail 2 "the output folder holds an input of the run, results.json" -- "$GAPMARK" report results.json --out . --force
expect_fail 2 "data.csv: is an input of this command" -- "$GAPMARK" fill data.csv -m linear -o data.csv --force

# --- one run per folder
mkdir -p slow
cat >slow/fill.sh <<'SH'
#!/bin/sh
sleep 3
exec "$(dirname "$0")/linear.sh"
SH
cp "$SRC/tests/fill_external/linear_fill.sh" slow/linear.sh
chmod +x slow/*.sh
cat >slowspec.json <<JSON
{"data": ["data.csv"], "schemes": ["random:rate=0.2"], "replicates": 2,
 "methods": ["external:command=$PWD/slow/fill.sh"], "metrics": ["error"], "output": "busy"}
JSON
"$GAPMARK" run slowspec.json --allow-external --quiet -j 1 &
first=$!
for _ in $(seq 100); do [ -s busy/trials.jsonl ] && break; sleep 0.1; done
expect_fail 2 "busy: in use by another gapmark process \(pid $first\)" -- \
  "$GAPMARK" run slowspec.json --allow-external --quiet --force
expect_fail 2 "busy: in use by another gapmark process \(pid $first\)" -- \
  "$GAPMARK" run slowspec.json --allow-external --quiet --resume
wait "$first"
check "the first run finished undisturbed" test -s busy/results.json
check "its checkpoint resumes cleanly" "$GAPMARK" run slowspec.json --allow-external --quiet --resume

# --- ulimit -f: the ordinary one-line error, no temporary file left
{ cat data.csv; for i in $(seq 60 3000); do printf '%d,%s\n' "$i" "$(( (i * 7) % 13 + 20 ))"; done; } >long.csv
status=0
(ulimit -f 8; exec "$GAPMARK" fill long.csv -m linear -o big.csv) >/dev/null 2>err.txt || status=$?
check "a write over ulimit -f exits 2" test "$status" -eq 2
check "with one line naming the file" grep -q "big.csv: cannot write: File too large" err.txt
check "one line only" test "$(wc -l <err.txt)" -eq 1
check "no temporary file left" test -z "$(ls | grep gapmark-tmp || true)"

# --- --resume removes its own stale temporary files
touch out/results.json.gapmark-tmp-0a1b2c3d out/ranking.md.gapmark-tmp-deadbeef
"$GAPMARK" run spec.json --resume --quiet
check "--resume removed the stale temporary files" test -z "$(ls out | grep gapmark-tmp || true)"
finish
