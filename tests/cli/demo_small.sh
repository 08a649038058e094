# End to end: a reduced demo experiment runs, writes its results and ranked
# tables, and gives the same results.json at any thread count.
source "$(dirname "$0")/lib/common.bash"
cat >small.json <<JSON
{
  "name": "small demo", "seed": 5, "replicates": 4, "holdout": 48,
  "data": [{"file": "$SRC/experiments/demo/pen3_hourly.csv", "period": 24,
            "columns": ["dissolved_oxygen_mg_l", "feed_dispensed_kg", "water_level_m"]}],
  "schemes": [{"name": "random", "rates": [0.1, 0.3]}, {"name": "blocks", "length_mean": 6, "rates": [0.2]}],
  "methods": ["zero", "mean", "carry-forward", "linear", "pchip", "seasonal-mean"],
  "metrics": ["error"],
  "rank_by": "rmse"
}
JSON
"$GAPMARK" run small.json --out out1 --threads 1 --quiet
"$GAPMARK" run small.json --out out2 --threads 2 2>progress.txt
for f in results.json ranking.md ranking.csv; do check "$f written" test -s out1/$f; done
check "progress reported when not quiet" grep -q "tasks" progress.txt
strip_timing() { sed '/"timing"/,$d' "$1"; }
check "results.json identical for 1 and 2 threads" cmp -s <(strip_timing out1/results.json) <(strip_timing out2/results.json)
check "ranking.md identical for 1 and 2 threads" cmp -s out1/ranking.md out2/ranking.md
for s in dissolved_oxygen_mg_l feed_dispensed_kg water_level_m; do
  check "ranking.md has a section for $s" grep -q "^## $s" out1/ranking.md
done
check "spec hash recorded" grep -q "\"spec_sha256\": \"$(sha256sum small.json | cut -d' ' -f1)\"" out1/results.json
# 3 series x 3 (scheme, rate) cells x 6 methods
check "ranking.csv has one row per cell and method" test "$(($(wc -l <out1/ranking.csv) - 1))" -eq 54
# the variables do not all share one winner
winners=$(awk -F, 'NR>1 && $4==1 {print $5}' out1/ranking.csv | sort -u | wc -l)
check "more than one winning method across variables ($winners)" test "$winners" -gt 1
finish
