# End to end, raw data in: `profile` tells missing records from missing
# values, `regularize` puts event rows and sensor logs on a grid with a
# policy per variable, groups work in mask, fill and run, and `quick` gives a
# recommendation and writes a spec that `run` accepts.
source "$(dirname "$0")/lib/common.bash"
RAW=$SRC/experiments/raw

# ---- profile: a hand-built log with known counts ---------------------------
# 00:00..07:00 hourly; absent rows at 02, 05, 06; a duplicate at 01; b empty
# at 03; one off-grid row at 02:30 that also arrives out of order.
cat >hand.csv <<'EOF'
time,a,b
2026-03-01T00:00,1,5
2026-03-01T01:00,,6
2026-03-01T01:00,2,6
2026-03-01T03:00,4,
2026-03-01T02:30,9,9
2026-03-01T04:00,5,7
2026-03-01T07:00,8,8
EOF
"$GAPMARK" profile hand.csv >hand.txt
check "profile infers the hourly step" grep -q "^Step PT1H (inferred" hand.txt
check "profile counts records per group" grep -qE "^  all rows +2026-03-01T00:00 +2026-03-01T07:00 +7 +8 +5 +3 +1 \(1 differ\) +1 +1$" hand.txt
check "profile counts b's missing value apart from its missing records" grep -qE "^  b +8 +4 +1 +3 +50% +2 +2$" hand.txt
check "profile shows the gap make-up" grep -qE "^  b +2×2 \(r1 m1\)$" hand.txt
"$GAPMARK" profile hand.csv --json >hand.json
check "JSON: missing records" grep -q '"missing_records": 3' hand.json
check "JSON: duplicates" grep -q '"duplicates": 1' hand.json
"$GAPMARK" profile hand.csv --step PT30M --json >half.json
check "a given step" grep -q '"step": "PT30M"' half.json

# ---- profile of the invented sensor log, with its picture -------------------
"$GAPMARK" profile "$RAW/water_quality.csv" --group pen --svg wq.svg >wq.txt
check "three pens profiled" test "$(grep -cE '^  pen=P[124] ' wq.txt)" -eq 3
check "missing records noted" grep -q "missing records. Whether an absent row means" wq.txt
check "the picture is an SVG with a legend" grep -q "missing record (no row at that time)" wq.svg
check "one picture row per series" test "$(grep -c 'text-anchor="end">[a-z_]*\[pen=P[124]\]</text>' wq.svg)" -eq 9
check "the oxygen screen flags values next to gaps" grep -qE "^  oxygen_mg_l\[pen=P4\].*lower next to gaps" wq.txt

"$GAPMARK" profile "$RAW/feeder_events.csv" --group pen >feed_profile.txt
check "profile says events need a grid first" grep -q "these look like events at" feed_profile.txt

# ---- regularize events: sums per hour, zero where nothing happened ----------
"$GAPMARK" regularize "$RAW/feeder_events.csv" --group pen --step PT1H --agg feed_kg=sum --empty feed_kg=zero \
  --out feed.csv 2>reg.log
first=$(awk -F, 'NR>1 {print substr($2, 1, 13)}' "$RAW/feeder_events.csv" | sort | sed -n 1p)
last=$(awk -F, 'NR>1 {print substr($2, 1, 13)}' "$RAW/feeder_events.csv" | sort | tail -1)
check "each pen starts at the hour of the first event" test "$(grep -c ",${first}:00Z," feed.csv)" -eq 3
check "each pen ends at the hour of the last event" test "$(grep -c ",${last}:00Z," feed.csv)" -eq 3
hours=$(( ($(date -ud "${last}:00" +%s) - $(date -ud "${first}:00" +%s)) / 3600 + 1 ))
check "one row per pen and hour ($hours hours)" test "$(wc -l <feed.csv)" -eq $((3 * hours + 1))
raw_total=$(awk -F, 'NR>1 && $3!="" {s+=$3} END {printf "%.2f", s}' "$RAW/feeder_events.csv")
grid_total=$(awk -F, 'NR>1 && $3!="" {s+=$3} END {printf "%.2f", s}' feed.csv)
check "sums keep the total ($raw_total vs $grid_total)" test "$raw_total" = "$grid_total"
check "hours without rows are 0" test "$(awk -F, 'NR>1 && $2 ~ /T02:00/ && $3!="0"' feed.csv | wc -l)" -eq 0
check "hours with rows but no weight are empty" test "$(awk -F, 'NR>1 && $3==""' feed.csv | wc -l)" -gt 0
check "regularize reports per variable" grep -q "feed_kg (sum, empty intervals zero)" reg.log
expect_fail 2 "feed.csv: exists already; give --force to replace it" -- "$GAPMARK" regularize "$RAW/feeder_events.csv" \
  --group pen --step PT1H --out feed.csv
"$GAPMARK" regularize "$RAW/feeder_events.csv" --group pen --step P1D --agg sum --empty zero --out feed.csv --force 2>/dev/null
check "--force replaces; daily bins start at midnight" grep -q "^P2,2026-03-02T00:00Z," feed.csv
"$GAPMARK" regularize "$RAW/feeder_events.csv" --group pen --step P1W --agg sum --layout wide --out weekly.csv 2>/dev/null
check "wide layout: a column per group" test "$(head -1 weekly.csv)" = "time,feed_kg[pen=P2],feed_kg[pen=P4],feed_kg[pen=P1]"
check "weeks start on Monday" test "$(cut -d, -f1 weekly.csv | tr '\n' ' ')" = "time 2026-03-02T00:00Z 2026-03-09T00:00Z 2026-03-16T00:00Z "
check "three weeks" test "$(wc -l <weekly.csv)" -eq 4

# ---- regularize the sensor log: means per hour, missing where no rows -------
"$GAPMARK" regularize "$RAW/water_quality.csv" --group pen --step PT1H --out wq_hourly.csv 2>wq_reg.log
check "the sensor log on an hourly grid" test "$(wc -l <wq_hourly.csv)" -eq $((3 * 21 * 24 + 1))
"$GAPMARK" profile wq_hourly.csv --group pen --json >wq_hourly.json
check "no missing records after regularize" test "$(grep -c '"missing_records": 0' wq_hourly.json)" -eq 12

# ---- one-line errors ---------------------------------------------------------
printf 'time,v\n2026-03-01T00:00,1\nyesterday,2\n' >badtime.csv
expect_fail 2 "badtime.csv:3: column 'time': not a time: 'yesterday'" -- "$GAPMARK" regularize badtime.csv --step PT1H --out x.csv
printf 'time,v\n2026-03-01T00:00+01:00,1\n2026-03-01T03:00+02:00,2\n' >offsets.csv
expect_fail 2 "offsets.csv:3: column 'time': mixed UTC offsets: \+02:00 here, \+01:00 on line 2" -- \
  "$GAPMARK" regularize offsets.csv --step PT1H --out x.csv
"$GAPMARK" regularize offsets.csv --step PT1H --agg sum --utc-offset Z --out utc.csv 2>/dev/null
check "--utc-offset converts" test "$(sed -n 2p utc.csv)" = "2026-02-28T23:00+00:00,1"
printf 'time,v\n2026-03-01T00:00,1\n2026-03-01T00:10,lots\n' >text.csv
expect_fail 2 "text.csv:3: column 'v': aggregation 'sum' does not fit the value 'lots'" -- \
  "$GAPMARK" regularize text.csv --step PT1H --agg v=sum --out x.csv
"$GAPMARK" regularize text.csv --step PT1H --agg v=count --out counted.csv 2>/dev/null
check "text can be counted" test "$(sed -n 2p counted.csv)" = "2026-03-01T00:00,2"
expect_fail 2 "feeder_events.csv:1: no group column 'site'" -- "$GAPMARK" regularize "$RAW/feeder_events.csv" --group site \
  --step PT1H --out x.csv
expect_fail 2 "step PT7H does not divide a day" -- "$GAPMARK" regularize text.csv --step PT7H --out x.csv
expect_fail 2 "unknown aggregation 'median'" -- "$GAPMARK" regularize text.csv --step PT1H --agg v=median --out x.csv
expect_fail 2 "hand.csv:1: no group column 'pen'" -- "$GAPMARK" profile hand.csv --group pen

# ---- groups in mask, fill and run ----------------------------------------------
"$GAPMARK" mask wq_hourly.csv --group pen --column salinity_psu --scheme random:rate=0.1 --seed 3 --out masked.csv 2>mask.log
check "mask works per group" grep -q "in 'salinity_psu\[pen=P4\]'" mask.log
"$GAPMARK" fill wq_hourly.csv --group pen --column salinity_psu --method linear --out filled.csv 2>fill.log
check "fill works per group" grep -q "^salinity_psu\[pen=P2\]: filled" fill.log
cat >groups.json <<EOF
{"name": "groups", "seed": 5, "replicates": 2,
 "data": [{"file": "wq_hourly.csv", "groups": ["pen"], "columns": ["salinity_psu"]}],
 "schemes": [{"name": "replay", "rates": [0.1]}, {"name": "random", "rates": [0.1]}],
 "methods": ["linear", "carry-forward"]}
EOF
"$GAPMARK" run groups.json --out run_out --quiet -j 1
check "run: a series per group" grep -q '"salinity_psu\[pen=P2\]"' run_out/results.json
check "run: replay masks the real-gap pattern" grep -q '"replay"' run_out/results.json

# ---- quick: a recommendation per variable, and a spec to rerun ----------------
"$GAPMARK" quick wq_hourly.csv --group pen --column salinity_psu --kind level --replicates 2 --out quick_sal -j 1 \
  >quick_sal.txt 2>quick_sal.err
check "quick prints the verdict per series" grep -q "^salinity_psu.*: recommended " quick_sal.txt
check "quick benchmarked the level methods" grep -q ',carry-forward,' quick_sal/results/ranking.csv
check "quick states the caution for levels" grep -q "an unknown value, not a zero" quick_sal.txt
check "quick writes its spec" test -s quick_sal/spec.json
check "the spec replays the real gaps" grep -q '"replay"' quick_sal/spec.json
"$GAPMARK" run quick_sal/spec.json --out rerun --quiet -j 1
check "the spec reruns with run" test -s rerun/results.json
"$GAPMARK" regularize "$RAW/feeder_events.csv" --group pen --step PT1H --agg feed_kg=sum --empty feed_kg=zero \
  --out feed_hourly.csv 2>/dev/null
"$GAPMARK" quick feed_hourly.csv --group pen --kind count --replicates 2 --out quick_feed -j 1 >quick_feed.txt 2>/dev/null
check "quick on counts ranks zero" grep -q ',zero,' quick_feed/results/ranking.csv
check "quick states the caution for counts" grep -q -- "--empty feed_kg=zero" quick_feed.txt
expect_fail 2 "missing records.*gapmark regularize" -- "$GAPMARK" quick "$RAW/water_quality.csv" --group pen \
  --column oxygen_mg_l --out q_raw
expect_fail 2 "--column: the file has 3 value columns" -- "$GAPMARK" quick wq_hourly.csv --group pen --out q_many
finish
