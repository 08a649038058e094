# `gapmark fill` tells the truth: a column left unfilled is an exit-2 error
# naming the column, the reason and a hint that fits the method and the
# command line; --allow-unfilled writes anyway and says how many points were
# left; counts say points and gaps; --step places an irregular file on its
# grid; --variance writes the method's predictive variance where it gives one.
source "$(dirname "$0")/lib/common.bash"

# 5 missing points in 3 gaps: a leading one, three in a row, one alone
cat >one.csv <<'CSV'
time,ozone
2026-01-01,
2026-01-02,5
2026-01-03,
2026-01-04,
2026-01-05,
2026-01-06,8
2026-01-07,
2026-01-08,9
CSV

"$GAPMARK" fill one.csv --method linear --out ok.csv 2>ok.log
check "counts say points and gaps" grep -qx "ozone: filled 5 of 5 points in 3 gaps" ok.log

expect_fail 2 "one.csv: column 'ozone': low-rank left 5 of the 5 points in 3 gaps unfilled \(it failed: needs sibling series on the same time axis\); select several columns .*--allow-unfilled" \
  -- "$GAPMARK" fill one.csv --method low-rank --out lr.csv
check "nothing written when a column stays unfilled" test ! -e lr.csv
"$GAPMARK" fill one.csv --method low-rank --out lr.csv --allow-unfilled 2>lr.log
check "--allow-unfilled writes the file" test -s lr.csv
check "--allow-unfilled says how many points were left" grep -q "with 5 points left unfilled" lr.log

expect_fail 2 "pchip:edges=leave left 1 of the 5 points in 3 gaps unfilled; edges=nearest fills" \
  -- "$GAPMARK" fill one.csv --method pchip:edges=leave --out x.csv
expect_fail 2 "window-mean:reach=1 left 1 of .*; a larger reach=N" \
  -- "$GAPMARK" fill one.csv --method window-mean:reach=1 --out x.csv
check "no edges hint for a method without edges" bash -c '! grep -q edges err.txt'
expect_fail 2 "needs a seasonal period of at least 2\); give the seasonal period with --period N" \
  -- "$GAPMARK" fill one.csv --method seasonal-mean --period 1 --out x.csv
check "no spec hint on the command line" bash -c '! grep -q spec err.txt'

# --step: a missing row is a time on the grid with missing values
grep -v 2026-01-06 one.csv >irregular.csv
expect_fail 2 "irregular.csv:7: irregular time step.*give --step" -- "$GAPMARK" fill irregular.csv --method linear --out x.csv
"$GAPMARK" fill irregular.csv --method linear --step P1D --out stepped.csv 2>stepped.log
check "--step adds the missing row" grep -q "^2026-01-06,7.66666666666666[67],1$" stepped.csv
check "--step keeps every grid time" test "$(wc -l <stepped.csv)" -eq 9
check "--step says how many rows it added" grep -q "added 1 row for the P1D step the file had no row for" stepped.log
expect_fail 2 "irregular.csv:3: time 2026-01-02 is not on the P2D grid" \
  -- "$GAPMARK" fill irregular.csv --method linear --step P2D --out x.csv

# --variance: kalman gives a variance at each filled point; linear gives none
"$GAPMARK" fill one.csv --method kalman:model=level --variance --out var.csv 2>var.log
check "a variance column" test "$(head -1 var.csv)" = "time,ozone,ozone_filled,ozone_variance"
check "variance at filled points only" test "$(awk -F, 'NR>1 && (($3==1) != ($4!=""))' var.csv | wc -l)" -eq 0
check "variance is positive" test "$(awk -F, 'NR>1 && $3==1 && !($4>0)' var.csv | wc -l)" -eq 0
"$GAPMARK" fill one.csv --method linear --variance --out novar.csv 2>novar.log
check "an empty variance column for a method without one" test "$(cut -d, -f4 novar.csv | sort -u | tr '\n' '|')" = "|ozone_variance|"
check "and it says so" grep -q "linear gives no variance" novar.log

# fills outside the observed range: a note with the generic ways to keep them
# in. The natural cubic spline through (1,0) (2,5) (3,10) (5,10) (6,5) (7,0)
# is 370/31 = 11.935... at t = 4 (scipy.interpolate.CubicSpline, bc_type="natural").
printf 'time,level\n2026-01-01,0\n2026-01-02,5\n2026-01-03,10\n2026-01-04,\n2026-01-05,10\n2026-01-06,5\n2026-01-07,0\n' >peak.csv
"$GAPMARK" fill peak.csv --method natural-spline --out peak_ns.csv 2>peak_ns.log
check "the spline overshoots the peak" grep -q "^2026-01-04,11.9354838709677[0-9]*,1$" peak_ns.csv
check "a note names the range and the way out" \
  grep -q "^note: column 'level': the one fill of natural-spline lies outside the observed range 0 to 10 (fills 11.94); the method parameter bounds=0,10 keeps" peak_ns.log
"$GAPMARK" fill peak.csv --method natural-spline:bounds=0,10 --out peak_b.csv 2>peak_b.log
check "bounds=0,10 clips the fill to 10" grep -q "^2026-01-04,10,1$" peak_b.csv
check "and no note then" bash -c '! grep -q "^note:" peak_b.log'
"$GAPMARK" fill peak.csv --method linear --out peak_l.csv 2>peak_l.log
check "no note for fills inside the range" bash -c '! grep -q "^note:" peak_l.log'

# draws outside the observed range get the note too: kalman draws for ozone
# (R's airquality, reference/airquality/export_airquality.R; observed 1 to 168)
# fall below zero here and there; on the log scale they cannot.
AQ=$SRC/reference/airquality/airquality.csv
"$GAPMARK" fill "$AQ" --column ozone --method kalman --draws 5 --seed 7 --out aq_draws.csv 2>aq_draws.log
below=$(awk -F, 'NR==1 {for (i = 1; i <= NF; i++) if ($i ~ /^ozone_draw_/) d[i] = 1; next} {for (i in d) if ($i != "" && $i < 1) n++} END {print n + 0}' aq_draws.csv)
check "some kalman draws fall below the observed minimum" test "$below" -gt 0
check "the note counts the drawn values outside the range" \
  grep -q "^note: column 'ozone': $below of the 185 drawn values of kalman:draws=5 lie outside the observed range 1 to 168" aq_draws.log
"$GAPMARK" fill "$AQ" --column ozone --method kalman:transform=log --draws 5 --seed 7 --out aq_log.csv 2>aq_log.log
check "no draw below zero on the log scale" \
  test "$(awk -F, 'NR == 1 {for (i = 1; i <= NF; i++) if ($i ~ /^ozone_draw_/) d[i] = 1; next} {for (i in d) if ($i != "" && $i <= 0) n++} END {print n + 0}' aq_log.csv)" -eq 0
check "no transform advice for a method that has one" bash -c '! grep -q "transform=log (values" aq_log.log'
finish
