# `gapmark fill --fit FILE.json`: the fit of a one-off fill, per column, also
# when a column has nothing to fill. Checks on the Nile flow (R's
# datasets::Nile, exported with R's own fits by reference/kalman/nile_fit.R):
#  - full series (nothing to fill): the local level's ML variances are the
#    published 15099 (irregular) and 1469.1 (level) within 0.1% (Durbin &
#    Koopman, Time Series Analysis by State Space Methods, 2nd ed. 2012;
#    figures quoted from memory);
#  - 16 years removed: the variances are R's StructTS(type = "level") on the
#    same data within 0.1% (reference/kalman/nile_fit/structts.json).
source "$(dirname "$0")/lib/common.bash"
REF=$SRC/reference/kalman/nile_fit

# value KEY FILE: the first number written after "KEY": in FILE
value() { grep -o "\"$1\": [-0-9.e+]*" "$2" | head -1 | awk '{print $2}'; }
# within GOT WANT REL: |GOT - WANT| <= REL * |WANT|
within() { awk -v g="$1" -v w="$2" -v r="$3" 'BEGIN { d = g - w; if (d < 0) d = -d; if (w < 0) w = -w; exit !(g != "" && d <= r * w) }'; }

"$GAPMARK" fill "$REF/nile.csv" --method kalman --out full.csv --fit full.json 2>full.log
check "the fit file is written" test -s full.json
check "it says what it is" grep -q '"format": "gapmark-fit"' full.json
check "nothing to fill: 0 gaps" grep -q '"gaps": 0' full.json
check "the model is named" grep -q '"model": "level"' full.json
irr=$(value variance_irregular full.json)
lev=$(value variance_level full.json)
check "full Nile: irregular variance $irr within 0.1% of 15099" within "$irr" 15099 0.001
check "full Nile: level variance $lev within 0.1% of 1469.1" within "$lev" 1469.1 0.001
check "the screen shows the fit" grep -q "fit: level, variance_irregular 1.51e+04, variance_level 1469" full.log
check "converged, inside the bounds" grep -q '"converged": true' full.json
check "a likelihood on record" test -n "$(value log_likelihood full.json)"

"$GAPMARK" fill "$REF/nile_gaps.csv" --method kalman --out gaps.csv --fit gaps.json 2>/dev/null
irr=$(value variance_irregular gaps.json)
lev=$(value variance_level gaps.json)
want_irr=$(grep '"nile_gaps"' "$REF/structts.json" | grep -o '"variance_irregular": [-0-9.e+]*' | awk '{print $2}')
want_lev=$(grep '"nile_gaps"' "$REF/structts.json" | grep -o '"variance_level": [-0-9.e+]*' | awk '{print $2}')
check "16 years removed: 16 gaps, 16 filled" grep -q '"filled": 16' gaps.json
check "Nile with gaps: irregular $irr within 0.1% of StructTS's $want_irr" within "$irr" "$want_irr" 0.001
check "Nile with gaps: level $lev within 0.1% of StructTS's $want_lev" within "$lev" "$want_lev" 0.001

# a method without a model: the column is listed with a null fit
"$GAPMARK" fill "$REF/nile_gaps.csv" --method linear --out lin.csv --fit lin.json 2>/dev/null
check "a method without a model has a null fit" grep -q '"fit": null' lin.json
# arima records its order and coefficients
"$GAPMARK" fill "$REF/nile_gaps.csv" --method "arima:order=1,0,0" --out ar.csv --fit ar.json 2>/dev/null
check "arima's order on record" grep -q '"model": "ARIMA(1,0,0) with mean"' ar.json
check "arima's coefficient on record" test -n "$(value ar1 ar.json)"
# the usual output rules: no overwrite without --force, never onto an input or the CSV output
expect_fail 2 "exists" "an existing fit file is kept" \
  "$GAPMARK" fill "$REF/nile_gaps.csv" --method kalman --out other.csv --fit gaps.json
check "nothing written after the refusal" test ! -e other.csv
expect_fail 2 "." "the fit file cannot be the CSV output" \
  "$GAPMARK" fill "$REF/nile_gaps.csv" --method kalman --out same.csv --fit same.csv
finish
