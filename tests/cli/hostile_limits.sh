# Limits instead of exhaustion, and no input that ends in an internal error
# (exit 3): devices as data, grids too large to allocate, very wide headers,
# integer times that would overflow, years gapmark cannot write, out-of-range
# values in results files.
source "$(dirname "$0")/lib/common.bash"
printf '{"data": [{"file": "/dev/zero"}], "schemes": ["random:rate=0.2"], "methods": ["linear"], "output": "o"}\n' >zero.json
expect_fail 2 "/dev/zero: is not a regular file" -- timeout 60 "$GAPMARK" run zero.json --quiet
mkfifo fifo.csv
expect_fail 2 "fifo.csv: is not a regular file" -- timeout 60 "$GAPMARK" profile fifo.csv

# A span from year 1 to 9999 at one minute: refused before allocating.
printf 'time,v\n0001-01-01T00:00,1\n9999-12-31T23:00,2\n' >span.csv
expect_fail 2 "would have [0-9]+ points, more than the limit of 50000000" -- \
  "$GAPMARK" regularize span.csv --step PT1M --out r.csv
expect_fail 2 "would have [0-9]+ points, more than the limit of 50000000" -- "$GAPMARK" profile span.csv --step PT1M

# A header of 200,000 columns and a malformed second line: the duplicate
# check is linear, so the error comes at once (a quadratic one takes minutes).
/usr/bin/python3 -c "
import sys
sys.stdout.write('time,' + ','.join('c%d' % i for i in range(200000)) + '\n0,1\n')" >wide.csv 2>/dev/null ||
  awk 'BEGIN { printf "time"; for (i = 0; i < 200000; i++) printf ",c%d", i; printf "\n0,1\n" }' >wide.csv
expect_fail 2 "wide.csv:2: expected 200001 fields, found 2" -- timeout 60 "$GAPMARK" profile wide.csv

# Integer times that would overflow.
printf 'time,v\n-9223372036854775807,1\n1,2\n' >overflow.csv
expect_fail 2 "overflow.csv:2: column 'time': not a time" -- "$GAPMARK" fill overflow.csv -m linear -o f.csv
printf 'time,v\n-1000000000000000000,1\n1000000000000000000,2\n' >far.csv
status=0
"$GAPMARK" fill far.csv -m linear -o far_out.csv 2>err.txt || status=$?
check "times at the ends of the allowed range do not overflow (exit $status)" test "$status" -le 2

# Years gapmark cannot read back are never written.
printf 'time,v\n0001-01-01T00:30+01:00,1\n0001-01-01T01:30+01:00,2\n' >early.csv
expect_fail 2 "year 0 cannot be written: times must stay within the years 0001-9999" -- \
  "$GAPMARK" regularize early.csv --step PT1H --utc-offset Z --out early_out.csv
check "no file written" test ! -e early_out.csv

# Out-of-range values in a results file.
printf 'time,v\n' >d.csv
for i in $(seq 0 39); do printf '%d,%d\n' "$i" $(( (i * 7) % 13 )) >>d.csv; done
printf '{"data": ["d.csv"], "schemes": ["random:rate=0.2"], "replicates": 2, "methods": ["linear", "mean"], "metrics": ["error"], "output": "run"}\n' >d.json
"$GAPMARK" run d.json --quiet
sed 's/^ "alpha": 0.05/ "alpha": 5/' run/results.json >alpha.json
check "the edit took" grep -q '"alpha": 5' alpha.json
expect_fail 2 "alpha.json: /alpha: alpha: expected a number in \(0, 0.5\), found '5'" -- "$GAPMARK" report alpha.json --out rep
finish
