# A spec is data, not a program: a spec (or a shard folder) received from
# someone else starts no outside program unless the command line says so,
# and a checkpoint cannot send gapmark to another folder. Each check is the
# command a user would type.
source "$(dirname "$0")/lib/common.bash"
mkdir -p project/methods
printf 'time,level\n' >project/data.csv
for i in $(seq 0 59); do printf '%d,%s\n' "$i" "$(( (i * 7) % 13 + 20 ))" >>project/data.csv; done
# The "program" a hostile spec names: it would leave a mark if it ran.
cat >project/methods/mark.sh <<'SH'
#!/bin/sh
touch "$MARK_FILE"
exec "$(dirname "$0")/fill.sh"
SH
cp "$SRC/tests/fill_external/linear_fill.sh" project/methods/fill.sh
chmod +x project/methods/*.sh
export MARK_FILE=$PWD/ran
cat >project/spec.json <<JSON
{"name": "received", "seed": 2, "replicates": 2,
 "data": [{"file": "data.csv"}],
 "schemes": [{"name": "random", "rates": [0.2]}],
 "methods": ["linear", "external:command='./methods/mark.sh' --quiet"],
 "metrics": ["error"], "output": "out"}
JSON

# run without consent: exit 2 before any task, each command listed.
status=0
"$GAPMARK" run project/spec.json --quiet >out.txt 2>err.txt || status=$?
check "run without --allow-external exits 2" test "$status" -eq 2
check "it says why, naming the spec" grep -q "project/spec.json: the spec starts 1 outside program" err.txt
check "it prints the command it would run" grep -qF "'./methods/mark.sh' --quiet" err.txt
check "it names the option" grep -q -- "--allow-external" err.txt
check "no program ran" test ! -e ran
check "no task ran (no checkpoint)" test ! -e project/out/trials.jsonl

# With consent it runs.
"$GAPMARK" run project/spec.json --quiet --allow-external
check "with --allow-external the program ran" test -e ran
check "and the run finished" test -s project/out/results.json

# Shards of the spec, merged: no program without consent; examples from the spec named.
rm -f ran
"$GAPMARK" run project/spec.json --allow-external --shard 1/2 --out s1 --quiet
"$GAPMARK" run project/spec.json --allow-external --shard 2/2 --out s2 --quiet
rm -f ran
"$GAPMARK" merge s1 s2 --out merged --spec project/spec.json --quiet
check "merge started no program without --allow-external" test ! -e ran
check "merge wrote the results" test -s merged/results.json
check "merge says the external method's example window is left out" \
  grep -q "examples-without-external" merged/results.json
check "the example lists the external method as not run" grep -q '"status": "not run"' merged/results.json
"$GAPMARK" merge s1 s2 --out merged2 --spec project/spec.json --allow-external --quiet
check "merge --allow-external draws the external example" test -e ran
check "merged with consent equals the single run's examples" \
  cmp -s <(sed -n '/^ "examples"/,/^ "format"/p' merged2/results.json) \
         <(sed -n '/^ "examples"/,/^ "format"/p' project/out/results.json)

# A checkpoint's spec_dir never sends the merge elsewhere: a planted
# spec_dir pointing at another folder is not read.
rm -f ran
mkdir -p elsewhere/methods
cp project/data.csv elsewhere/
cp project/methods/fill.sh elsewhere/methods/
printf '#!/bin/sh\ntouch "$MARK_FILE.elsewhere"\nexec "$(dirname "$0")/fill.sh"\n' >elsewhere/methods/mark.sh
chmod +x elsewhere/methods/mark.sh
sed -i "1s|\"spec_dir\":\"[^\"]*\"|\"spec_dir\":\"$PWD/elsewhere\"|" s1/trials.jsonl s2/trials.jsonl
check "the planted spec_dir is in the checkpoint" grep -q "$PWD/elsewhere" s1/trials.jsonl
"$GAPMARK" merge s1 s2 --out merged3 --allow-external --quiet
check "merge without --spec ran no program from the checkpoint's folder" test ! -e ran.elsewhere
check "and says why there are no example windows" grep -q '"no-examples"' merged3/results.json
printf '{"name": "other", "data": ["data.csv"], "schemes": ["random:rate=0.1"], "methods": ["linear"]}\n' >elsewhere/spec.json
expect_fail 2 "elsewhere/spec.json: is not the spec of s1" -- "$GAPMARK" merge s1 s2 --out merged4 --spec elsewhere/spec.json

# --resume reads the data from the spec named, not the checkpoint's spec_dir.
"$GAPMARK" run project/spec.json --allow-external --out r --quiet --force
sed -i "1s|\"spec_dir\":\"[^\"]*\"|\"spec_dir\":\"$PWD/elsewhere\"|" r/trials.jsonl
rm -f r/results.json ran
"$GAPMARK" run project/spec.json --allow-external --resume r --quiet
check "a resumed run's example programs ran in the spec's folder, not the checkpoint's" test ! -e ran.elsewhere
check "in the spec's folder" test -e ran

# A spec's output stays inside its folder unless --out says otherwise.
for out in / /tmp/x ../x ../../x; do
  sed "s|\"output\": \"out\"|\"output\": \"$out\"|" project/spec.json >project/escape.json
  expect_fail 2 "escape.json: /output: .* is not a folder inside the spec's folder" -- \
    "$GAPMARK" run project/escape.json --allow-external --quiet
done
"$GAPMARK" run project/escape.json --allow-external --quiet --out named
check "--out overrides an outside \"output\"" test -s named/results.json
finish
