# `quick` cannot corrupt data: a whole-number concentration (ozone in R's
# airquality, reference/airquality/export_airquality.R) gets no zero advice
# and low-rank across the other columns; the risks are printed on stdout;
# a count with many exact zeros (invented here) still gets zero. `--period`
# reaches quick, run and profile; `period=N`, `bounds=` and `transform=` work
# in a spec.
source "$(dirname "$0")/lib/common.bash"
AQ=$SRC/reference/airquality/airquality.csv

# ---- a whole-number concentration --------------------------------------------
"$GAPMARK" quick "$AQ" --column ozone --replicates 12 --out q_ozone -j 1 >ozone.txt 2>ozone.err
check "ozone: the kind is unknown, not count" grep -q "^Kind: unknown (guessed: non-negative whole numbers, but whole numbers alone do not make a count" ozone.txt
check "ozone: no zero method" bash -c "! grep -q '\"zero\"' q_ozone/spec.json"
check "ozone: no zero advice" bash -c "! grep -q 'ozone=zero' ozone.txt"
check "ozone: the caution says how to set the kind" grep -q "rerun with --kind count" ozone.txt
check "ozone: the core candidates" grep -q "^Methods: mean, carry-forward, linear, pchip, kalman:model=level, seasonal-mean, low-rank$" ozone.txt
check "ozone: the other columns are siblings" grep -q "^Other columns: solar_r, wind, temp " ozone.txt
check "ozone: the spec lists them" grep -q '"solar_r"' q_ozone/spec.json
# Low-rank from the other columns beats every single-series method on ozone (replay masks).
check "ozone: low-rank ranks first on replay" test "$(awk -F, '$1 == "ozone" && $2 ~ /^replay/ && $4 == 1 {print $5}' q_ozone/results/ranking.csv)" = low-rank
check "ozone: the screen prints the verdict" grep -q "^ozone: recommended " ozone.txt
# Risks on stdout: June 1973 is 21 of 30 days without ozone.
check "risks are on stdout" grep -q "^Risks to this recommendation:" ozone.txt
check "the June cluster is named" grep -q "1973-06 is 70% missing (21 of 30)" ozone.txt

# ---- too few replicates for the methods --------------------------------------
"$GAPMARK" quick "$AQ" --column ozone --replicates 4 --out q_few -j 1 >few.txt 2>/dev/null
check "few replicates are a risk" grep -q "4 replicates for 7 methods: no paired difference can reach alpha" few.txt

# ---- a count with many exact zeros (invented: 1 to 3 events on every third day) ----
{
  echo "day,visits"
  for d in $(seq 1 120); do
    if [ $((d % 17)) -eq 5 ] || [ $((d % 23)) -eq 7 ]; then v=""
    elif [ $((d % 3)) -eq 0 ]; then v=$((1 + d % 3 + d % 2))
    else v=0; fi
    echo "$d,$v"
  done
} >counts.csv
"$GAPMARK" quick counts.csv --replicates 3 --out q_count -j 1 >count.txt 2>/dev/null
check "count: guessed from its zeros" grep -q "^Kind: count (guessed: non-negative, .* exact zeros" count.txt
check "count: zero is a candidate" grep -q "^Methods: zero, mean," count.txt
check "count: zero advice" grep -q -- "--empty visits=zero" count.txt

# ---- --period for quick, profile and run -------------------------------------
"$GAPMARK" quick counts.csv --kind level --period 6 --replicates 3 --out q_period -j 1 >period.txt 2>/dev/null
check "quick --period: given" grep -q "^Period: 6 (given)" period.txt
check "quick --period: seasonal-mean joins" grep -q "seasonal-mean" period.txt
check "quick --period: in the spec" grep -q '"period": 6' q_period/spec.json
"$GAPMARK" profile counts.csv --period 6 >profile.txt
check "profile --period: shown" grep -q "period 6 (given)" profile.txt
check "profile --period: missingness by its phase" grep -qE "phase: highest" profile.txt
"$GAPMARK" run q_period/spec.json --period 4 --out run4 --quiet -j 1
check "run --period: recorded" grep -q '"period": 4' run4/results.json

# ---- method parameters in a spec ----------------------------------------------
cat >params.json <<SPEC
{"name": "params", "seed": 3, "replicates": 2, "output": "params_out",
 "data": [{"file": "$AQ", "columns": ["ozone"]}],
 "schemes": [{"name": "random", "rates": [0.2]}],
 "methods": ["seasonal-mean:period=7", "seasonal-mean:period=30", "natural-spline:bounds=1,168",
             "linear:transform=log", {"name": "pchip", "bounds": [0, 100]}]}
SPEC
"$GAPMARK" run params.json --quiet -j 1
check "two periods are two methods" bash -c "grep -q 'seasonal-mean:period=7' params_out/ranking.md && grep -q 'seasonal-mean:period=30' params_out/ranking.md"
check "bounds and transform labels" bash -c "grep -q 'natural-spline:bounds=1,168' params_out/ranking.md && grep -q 'linear:transform=log' params_out/ranking.md"
check "clipped points are recorded" grep -q '"clipped"' params_out/results.json
"$GAPMARK" methods >methods.txt
check "methods lists period on seasonal methods" bash -c "grep -A4 '^seasonal-mean' methods.txt | grep -q 'period = 0'"
check "methods lists bounds and transform once" bash -c "grep -q '^Every method also takes:' methods.txt && grep -q 'transform = none' methods.txt"
expect_fail 2 "linear.*unknown parameter 'period'" -- "$GAPMARK" fill "$AQ" --column ozone --method linear:period=7 --out f.csv
expect_fail 2 "bounds.*LO must be below HI" -- "$GAPMARK" fill "$AQ" --column ozone --method linear:bounds=5,1 --out f.csv
finish
