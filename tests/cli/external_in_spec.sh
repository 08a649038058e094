# End to end: an outside program named by a relative path in a spec runs in
# the spec's folder, whatever folder gapmark is started from; its fills are a
# straight line (tests/fill_external/linear_fill.sh), so every trial scores
# exactly as the built-in `linear` does.
source "$(dirname "$0")/lib/common.bash"
mkdir -p project/methods elsewhere
cp "$SRC/tests/fill_external/linear_fill.sh" project/methods/
chmod +x project/methods/linear_fill.sh
cat >project/spec.json <<JSON
{
  "name": "outside program in a spec", "seed": 3, "replicates": 2, "holdout": 0,
  "data": [{"file": "$SRC/experiments/demo/pen3_hourly.csv", "period": 24, "columns": ["salinity_psu"]}],
  "schemes": [{"name": "random", "rates": [0.2]}],
  "methods": ["linear", "external:command=./methods/linear_fill.sh"],
  "metrics": ["error"],
  "output": "out"
}
JSON
(cd elsewhere && "$GAPMARK" run ../project/spec.json --quiet --allow-external)
check "the run wrote its results beside the spec" test -s project/out/results.json
check "every trial succeeded (2 methods x 2 replicates)" test "$(grep -c '"status": "ok"' project/out/results.json)" -ge 4
check "no trial failed" test "$(grep -c '"status": "failed"' project/out/results.json)" -eq 0
rmse() {  # the rmse_mean column of a method's row
  awk -v m="$1" -F, 'NR == 1 {for (i = 1; i <= NF; i++) if ($i == "rmse_mean") c = i; next} $5 == m {print $c}' \
    project/out/ranking.csv
}
check "the RMSE column is read" test -n "$(rmse linear)"
check "same RMSE as the built-in linear fill" test "$(rmse linear)" = "$(rmse external:command=./methods/linear_fill.sh)"
finish
