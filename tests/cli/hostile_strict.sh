# Strict parsing: duplicates, unknown names and out-of-range numbers are
# refused with one line, instead of counting a replicate twice, being ignored
# or wrapping round. Each check is the command a user would type.
source "$(dirname "$0")/lib/common.bash"
printf 'time,a,b\n' >d.csv
for i in $(seq 0 39); do printf '%d,%d,%d\n' "$i" $(( (i * 7) % 13 )) $(( (i * 5) % 11 )) >>d.csv; done
spec() {  # spec NAME BODY: writes NAME.json from the shared parts and BODY
  printf '{"replicates": 2, "metrics": ["error"], "output": "out_%s", %s}\n' "$1" "$2" >"$1.json"
}
spec rates '"data": ["d.csv"], "schemes": [{"name": "random", "rates": [0.1, 0.1, 0.1]}], "methods": ["linear"]'
expect_fail 2 "rates.json: /schemes/0/rates/1: rate 0.1 is listed twice" -- "$GAPMARK" run rates.json
spec schemes '"data": ["d.csv"], "schemes": ["random:rate=0.1", "random:rate=0.2"], "methods": ["linear"]'
expect_fail 2 "schemes.json: /schemes/1: scheme 'random' is listed twice" -- "$GAPMARK" run schemes.json
spec data '"data": ["d.csv", "./d.csv"], "schemes": ["random:rate=0.1"], "methods": ["linear"]'
expect_fail 2 "data.json: /data/1: the data file './d.csv' is listed twice" -- "$GAPMARK" run data.json
spec columns '"data": [{"file": "d.csv", "columns": ["a", "a"]}], "schemes": ["random:rate=0.1"], "methods": ["linear"]'
expect_fail 2 "columns.json: /data/0/columns/1: column 'a' is listed twice" -- "$GAPMARK" run columns.json
spec periods '"data": [{"file": "d.csv", "periods": {"typo": 5}}], "schemes": ["random:rate=0.1"], "methods": ["linear"]'
expect_fail 2 "periods.json: /data/0/periods/typo: no series column 'typo' in" -- "$GAPMARK" run periods.json
spec units '"data": ["d.csv"], "units": {"typo": "mg/L"}, "schemes": ["random:rate=0.1"], "methods": ["linear"]'
expect_fail 2 "units.json: /units/typo: no series column 'typo' in the data" -- "$GAPMARK" run units.json
spec unitlen '"data": ["d.csv"], "units": {"a": ""}, "schemes": ["random:rate=0.1"], "methods": ["linear"]'
expect_fail 2 "unitlen.json: /units/a: expected units as short text" -- "$GAPMARK" run unitlen.json
spec unitsok '"data": ["d.csv"], "units": {"a": "m3/s"}, "schemes": ["random:rate=0.1"], "methods": ["linear", "mean"]'
"$GAPMARK" run unitsok.json --quiet
check "units reach the report's table headings" grep -q "rmse (m3/s)" out_unitsok/report.html
check "and ranking.md" grep -q "rmse (m3/s)" out_unitsok/ranking.md
check "a column without units keeps bare names" grep -q "<th title=\"[^\"]*\">rmse</th>" out_unitsok/report.html
printf '{"seed": 1, "seed": 2, "data": ["d.csv"], "schemes": ["random:rate=0.1"], "methods": ["linear"]}\n' >keys.json
expect_fail 2 "keys.json: duplicate key 'seed' in one JSON object" -- "$GAPMARK" run keys.json

expect_fail 2 "--column: 'a' is given twice" -- "$GAPMARK" fill d.csv --column a --column a -m linear -o f.csv
expect_fail 2 "--seed: expected a whole number in \[0, 9223372036854775807\], found '-1'" -- \
  "$GAPMARK" mask d.csv -s random:rate=0.1 --seed -1 -o m.csv
expect_fail 2 "--replicate: expected a whole number in \[0, 99999\], found '-5'" -- \
  "$GAPMARK" mask d.csv -s random:rate=0.1 --replicate -5 -o m.csv
expect_fail 2 "--period: expected a whole number in \[0, 1000000\], found '18446744073709551616'" -- \
  "$GAPMARK" fill d.csv -m seasonal-mean --period 18446744073709551616 -o f.csv

spec ok '"data": ["d.csv"], "schemes": ["random:rate=0.2"], "methods": ["linear", "mean"]'
"$GAPMARK" run ok.json --quiet
cp -r out_ok base
expect_fail 2 "--tolerance: no metric 'zzz' in the results" -- "$GAPMARK" compare base/results.json out_ok/results.json --tolerance zzz=5%
expect_fail 2 "--tolerance: the tolerance of 'rmse' is given twice" -- \
  "$GAPMARK" compare base/results.json out_ok/results.json --tolerance rmse=5%,rmse=1%

# Out-of-range values in a checkpoint: refused by --resume, naming the line.
cp -r out_ok cp1
sed -i '2s/"masked":[0-9]*/"masked":-4/' cp1/trials.jsonl
check "the edit took" grep -q '"masked":-4' cp1/trials.jsonl
expect_fail 2 "cp1/trials.jsonl:2: masked: expected a whole number >= 0, found '-4'" -- \
  "$GAPMARK" run ok.json --resume cp1 --quiet
cp -r out_ok cp2
sed -i '2s/"status":"ok"/"status":"weird"/' cp2/trials.jsonl
expect_fail 2 "cp2/trials.jsonl:2: unknown trial status 'weird'" -- \
  "$GAPMARK" run ok.json --resume cp2 --quiet
# ... and in a results file: a metric that is not a number.
awk '/^ "trials": \[/ {t = 1} t && !done && /"rmse": [0-9]/ {sub(/"rmse": [^,]*/, "\"rmse\": \"abc\""); done = 1} {print}' \
  out_ok/results.json >abc.json
check "the edit took" grep -q '"rmse": "abc"' abc.json
expect_fail 2 "abc.json: /trials/0: metrics/rmse: expected a number or null, found '\"abc\"'" -- \
  "$GAPMARK" compare base/results.json abc.json

# A non-finite mean ranks last, never first: "linear" has no RMSE in any
# trial (each overflowed, recorded as null), "mean" has RMSEs of 1e308 whose
# mean overflows to infinity; neither may rank ahead of a finite one, and the
# one without values comes last.
awk '/"method": "linear"/ {m = "linear"} /"method": "mean"/ {m = "mean"}
     /^ "trials": \[/ {t = 1} /^ "warnings": / {t = 0}
     t && /"rmse": / {sub(/"rmse": [^,]*/, m == "linear" ? "\"rmse\": null" : "\"rmse\": 1e308")} {print}' \
  out_ok/results.json >overflow.json
check "the edit took" grep -q '"rmse": 1e308' overflow.json
"$GAPMARK" report overflow.json --out overflow --quiet
first=$(awk -F, 'NR == 2 {print $5}' overflow/ranking.csv)
check "the method with values ranks first, not the one without (first: $first)" test "$first" = mean
finish
