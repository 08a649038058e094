# `gapmark fill --draws M`: M conditional sample paths per column, each the
# column filled anew from the method's model (COLUMN_draw_1 .. _M), for a
# multiple-imputation analysis; reproducible from --seed. Data: the Nile
# flow with 16 years removed (R's datasets::Nile, reference/kalman/nile_fit.R).
source "$(dirname "$0")/lib/common.bash"
DATA=$SRC/reference/kalman/nile_fit/nile_gaps.csv

"$GAPMARK" fill "$DATA" --method kalman --draws 5 --out d.csv 2>d.log
check "five draw columns after the flag" test "$(head -1 d.csv)" = "year,flow,flow_filled,flow_draw_1,flow_draw_2,flow_draw_3,flow_draw_4,flow_draw_5"
check "every row kept" test "$(wc -l <d.csv)" -eq 101
# observed rows: every draw equals the observed value; filled rows: the draws differ from each other
bad=$(awk -F, 'NR>1 && $3==0 {for (i=4;i<=8;i++) if ($i!=$2) n++} END {print n+0}' d.csv)
check "observed cells the same in every draw ($bad differ)" test "$bad" -eq 0
spread=$(awk -F, 'NR>1 && $3==1 {if ($4!=$5 && $5!=$6 && $4!="" ) n++} END {print n+0}' d.csv)
check "the 16 filled cells differ between draws ($spread do)" test "$spread" -eq 16
"$GAPMARK" fill "$DATA" --method kalman --draws 5 --out d2.csv 2>/dev/null
"$GAPMARK" fill "$DATA" --method kalman --draws 5 --seed 2 --out d3.csv 2>/dev/null
check "same seed, same draws" cmp -s d.csv d2.csv
check "another seed, other draws" bash -c '! cmp -s d.csv d3.csv'
"$GAPMARK" fill "$DATA" --method "arima:order=1,1,1" --draws 3 --out a.csv 2>/dev/null
check "arima draws too" test "$(head -1 a.csv | tr ',' '\n' | grep -c '_draw_')" -eq 3
expect_fail 2 "gives no draws" "a method without draws is refused" \
  "$GAPMARK" fill "$DATA" --method linear --draws 3 --out l.csv
expect_fail 2 "already asks for draws=4" "two numbers of draws are refused" \
  "$GAPMARK" fill "$DATA" --method kalman:draws=4 --draws 3 --out l.csv
check "nothing written after a refusal" test ! -e l.csv
finish
