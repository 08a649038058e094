# End to end: one run's outputs all name the same recommendation per series
# (results.json's verdict, ranking.md, ranking.csv, methods.md, report.html),
# the under-powered warning reaches every output, a condition that could not
# be masked is left out with a note, and `gapmark quick` prints the verdict
# its own results.json holds.
source "$(dirname "$0")/lib/common.bash"
py() { /usr/bin/python3 -c "$@"; }
# Two invented series without gaps (so replay has nothing to learn from and
# that condition cannot be masked).
awk 'BEGIN { print "step,smooth,wavy"
  for (i = 0; i < 400; i++)
    printf "%d,%.6f,%.6f\n", i, 10 + 3 * sin(i / 9.0) + 0.02 * i, 5 + 2 * sin(i / 4.0) + ((i * 7919) % 13) / 10.0 }' >two.csv
cat >spec.json <<JSON
{
  "name": "verdict check", "seed": 11, "replicates": 5,
  "data": [{"file": "two.csv", "columns": ["smooth", "wavy"]}],
  "schemes": [{"name": "blocks", "length_mean": 5, "rates": [0.1]}, {"name": "replay", "rates": [0.1]}],
  "methods": ["mean", "carry-forward", "linear", "pchip"],
  "metrics": ["error"], "rank_by": "rmse"
}
JSON
"$GAPMARK" run spec.json --out out --threads 2 --quiet
for s in smooth wavy; do
  rec=$(py "import json; v=json.load(open('out/results.json'))['verdict']; print([x['recommended'] for x in v['series'] if x['series']=='$s'][0])")
  check "$s has a recommendation ($rec)" test -n "$rec" -a "$rec" != None
  check "ranking.md names $rec for $s" grep -q "^\*\*$s\*\*: recommended \`$rec\`" out/ranking.md
  check "methods.md names $rec for $s" grep -q "^\*\*$s\*\*\. \`$rec\` is recommended" out/methods.md
  check "report.html names $rec for $s" grep -q "Recommended on this evidence: <span class=\"best\">$rec</span>" out/report.html
  csv=$(awk -F, -v s="$s" 'NR>1 && $1==s && $6=="recommended" {print $5}' out/ranking.csv | sort -u)
  check "ranking.csv marks $rec for $s (got '$csv')" test "$csv" = "$rec"
done
# Five replicates cannot separate four methods (3 * 2 / 2^5 > 0.05): warned everywhere.
check "results.json warns: under-powered" grep -q '"code": "under-powered"' out/results.json
check "ranking.md warns: under-powered" grep -q "under-powered" out/ranking.md
check "report.html warns: under-powered" grep -q "under-powered" out/report.html
check "methods.md says so" grep -q "cannot find any difference" out/methods.md
# replay on series without gaps: left out with one note each, in no table.
check "results.json lists the left-out conditions" test "$(py "import json; print(len(json.load(open('out/results.json'))['summary']['excluded']))")" -eq 2
check "no replay table in ranking.md" test "$(grep -c '^### replay' out/ranking.md)" -eq 0
check "no replay row in ranking.csv" test "$(grep -c ',replay' out/ranking.csv)" -eq 0
check "ranking.md notes the left-out conditions" test "$(grep -c 'Left out of every table' out/ranking.md)" -eq 2
# quick prints the verdict of its own results.
"$GAPMARK" quick two.csv --column wavy --kind level --replicates 4 --out q --threads 2 >screen.txt 2>/dev/null
qrec=$(py "import json; print(json.load(open('q/results/results.json'))['verdict']['series'][0]['recommended'])")
check "quick's screen names its verdict ($qrec)" grep -q "^wavy: recommended $qrec" screen.txt
check "quick's screen names the under-powered conditions" grep -q "too few for the paired tests" screen.txt
finish
