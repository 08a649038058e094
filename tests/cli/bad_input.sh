# Bad input ends in one line on stderr naming the file, line or field, and exit 2.
source "$(dirname "$0")/lib/common.bash"
DATA=$SRC/experiments/demo/pen3_hourly.csv
printf 'time,a,b\n1,1,2\n2,3\n3,4,5\n' >short_row.csv
printf 'time,a\n1,1\n2,abc\n3,4\n' >not_number.csv
printf 'time,a\n1,1\n1,2\n3,4\n' >duplicate.csv
printf 'time,a\n1,1\n3,2\n2,4\n' >unsorted.csv
printf 'time,a,b\n1,,1\n2,,2\n3,,3\n' >all_missing.csv
printf 'time,a\n1,1\n2,inf\n3,4\n' >infinite.csv

expect_fail 2 "no-such.csv" -- "$GAPMARK" fill no-such.csv --method linear --out x.csv
expect_fail 2 "short_row.csv:3" -- "$GAPMARK" fill short_row.csv --method linear --out x.csv
expect_fail 2 "not_number.csv:3.*'a'.*abc" -- "$GAPMARK" fill not_number.csv --method linear --out x.csv
expect_fail 2 "duplicate.csv:3.*duplicate" -- "$GAPMARK" fill duplicate.csv --method linear --out x.csv
expect_fail 2 "unsorted.csv:4" -- "$GAPMARK" fill unsorted.csv --method linear --out x.csv
expect_fail 2 "infinite.csv:3" -- "$GAPMARK" fill infinite.csv --method linear --out x.csv
expect_fail 2 "unknown method 'lineer' \(did you mean 'linear'\?\)" -- "$GAPMARK" fill "$DATA" --method lineer --out x.csv
expect_fail 2 "unknown parameter 'edge'" -- "$GAPMARK" fill "$DATA" --method linear:edge=leave --out x.csv
expect_fail 2 "unknown scheme 'randm'" -- "$GAPMARK" mask "$DATA" --scheme randm:rate=0.1 --out x.csv
expect_fail 2 "rate 1.5 is outside \(0, 1\)" -- "$GAPMARK" mask "$DATA" --scheme random:rate=1.5 --out x.csv
expect_fail 2 "give the rate" -- "$GAPMARK" mask "$DATA" --scheme random --out x.csv
expect_fail 2 "no column named 'oxygen'" -- "$GAPMARK" fill "$DATA" --column oxygen --method linear --out x.csv
check "no output written on failure" test ! -e x.csv

# experiment specs
cat >spec_bad_rate.json <<JSON
{"data": [{"file": "$DATA"}], "schemes": [{"name": "random", "rates": [0.1, 1.2]}], "methods": ["linear"]}
JSON
expect_fail 2 "spec_bad_rate.json: /schemes/0/rates/1: rate 1.2" -- "$GAPMARK" run spec_bad_rate.json --out out1
cat >spec_bad_json.json <<JSON
{"data": [{"file": "$DATA"}],
 "schemes": [{"name": "random", "rates": [0.1]}]
 "methods": ["linear"]}
JSON
expect_fail 2 "spec_bad_json.json:3: invalid JSON" -- "$GAPMARK" run spec_bad_json.json --out out2
cat >spec_all_missing.json <<JSON
{"data": [{"file": "all_missing.csv"}], "schemes": [{"name": "random", "rates": [0.1]}], "methods": ["linear"]}
JSON
expect_fail 2 "all_missing.csv: column 'a' has no observed values" -- "$GAPMARK" run spec_all_missing.json --out out3
cat >spec_bad_method.json <<JSON
{"data": [{"file": "$DATA"}], "schemes": [{"name": "random", "rates": [0.1]}], "methods": ["linear", {"name": "window-mean", "reach": 0}]}
JSON
expect_fail 2 "spec_bad_method.json: /methods/1.*reach.*outside" -- "$GAPMARK" run spec_bad_method.json --out out4
check "no results written on failure" test ! -e out1 -a ! -e out2 -a ! -e out3 -a ! -e out4
expect_fail 2 "missing.json" -- "$GAPMARK" run missing.json
expect_fail 2 "" -- "$GAPMARK" run
finish
