# End to end: `gapmark mask` hides values reproducibly, `gapmark fill` fills
# the gaps, keeps every row, column and observed cell, and flags what it filled.
source "$(dirname "$0")/lib/common.bash"
DATA=$SRC/experiments/demo/pen3_hourly.csv

"$GAPMARK" mask "$DATA" --scheme random:rate=0.2 --seed 7 --out masked.csv --flags 2>mask.log
"$GAPMARK" mask "$DATA" --scheme random:rate=0.2 --seed 7 --out masked2.csv --flags 2>/dev/null
"$GAPMARK" mask "$DATA" --scheme random:rate=0.2 --seed 8 --out masked3.csv 2>/dev/null
check "same seed, same masks" cmp -s masked.csv masked2.csv
check "another seed, other masks" bash -c '! cmp -s masked.csv masked3.csv'
check "mask keeps the row count" test "$(wc -l <masked.csv)" -eq "$(wc -l <"$DATA")"
check "mask adds one flag column per column" test "$(head -1 masked.csv | tr ',' '\n' | grep -c '_masked$')" -eq 5
# the rate is honoured: about 20% of the observed oxygen values hidden
hidden=$(awk -F, 'NR>1 && $7==1' masked.csv | wc -l)
check "about 20% hidden (got $hidden of ~2146)" test "$hidden" -gt 360 -a "$hidden" -lt 500
check "mask reports counts" grep -q "masked $hidden values in 'dissolved_oxygen_mg_l'" mask.log
# --holdout: nothing hidden in the last 48 rows
"$GAPMARK" mask "$DATA" --scheme blocks:rate=0.3,length_mean=12 --holdout 48 --out held.csv --flags 2>/dev/null
check "holdout never masked" test "$(tail -48 held.csv | awk -F, '{for (i=7;i<=11;i++) s+=$i} END {print s+0}')" -eq 0

# replay learns gaps from a sibling column: pump energy (complete) gets blocks
# shaped like oxygen's two real outages (6 and 8 hours; the block placed last
# may be cut to fit); learning from its own (absent) gaps, or from an unknown
# name, is a one-line error
"$GAPMARK" mask "$DATA" --scheme replay:rate=0.05,from=dissolved_oxygen_mg_l --column pump_energy_kwh --seed 3 \
  --out replayed.csv --flags 2>/dev/null
odd=$(awk -F, 'NR>1 {print $7}' replayed.csv | uniq -c | awk '$2==1 && $1!=6 && $1!=8' | wc -l)
runs=$(awk -F, 'NR>1 {print $7}' replayed.csv | uniq -c | awk '$2==1' | wc -l)
check "replay from a sibling: $runs blocks, $odd not 6 or 8 long" test "$runs" -ge 10 -a "$odd" -le 1
expect_fail 2 "no gaps between observed values" "replay needs gaps to learn from" \
  "$GAPMARK" mask "$DATA" --scheme replay:rate=0.05 --column pump_energy_kwh --out r.csv
expect_fail 2 "no series 'oxygen' beside this one" "replay from an unknown series" \
  "$GAPMARK" mask "$DATA" --scheme replay:rate=0.05,from=oxygen --column pump_energy_kwh --out r.csv

# fill the masked copy (without flag columns) with linear interpolation
"$GAPMARK" mask "$DATA" --scheme random:rate=0.2 --seed 7 --out plain.csv 2>/dev/null
"$GAPMARK" fill plain.csv --method linear --out filled.csv 2>fill.log
check "fill keeps the row count" test "$(wc -l <filled.csv)" -eq "$(wc -l <plain.csv)"
check "fill adds one flag column per column" test "$(head -1 filled.csv | tr ',' '\n' | grep -c '_filled$')" -eq 5
check "no empty cell left" test "$(awk -F, 'NR>1 {for (i=2;i<=6;i++) if ($i=="") n++} END {print n+0}' filled.csv)" -eq 0
# observed cells unchanged, filled cells flagged exactly where the input was empty
bad=$(paste -d, plain.csv filled.csv | awk -F, 'NR>1 {for (i=2;i<=6;i++) { f=$(6+i+5); if ($i!="" && ($i!=$(6+i) || f!=0)) n++; if ($i=="" && f!=1) n++ }} END {print n+0}')
check "observed cells unchanged and flags right ($bad mismatches)" test "$bad" -eq 0
check "fill reports per column" grep -q "dissolved_oxygen_mg_l: filled" fill.log
# one column only, with --column
"$GAPMARK" fill plain.csv --method carry-forward --column salinity_psu --out one.csv 2>/dev/null
check "only the chosen column is flagged" test "$(head -1 one.csv | tr ',' '\n' | grep -c '_filled$')" -eq 1
finish
