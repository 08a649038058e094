# Every text input is decoded or refused in one line: data that is not UTF-8
# is refused with its file, line and column (never an internal error), text
# an outside program prints is kept with bad bytes escaped, echoed input is
# cut short and escaped, and Markdown reports escape names.
source "$(dirname "$0")/lib/common.bash"
printf 'time,temp_\260C\n0,1\n1,2\n2,3\n3,4\n' >latin1.csv
printf '{"data": ["latin1.csv"], "schemes": ["random:rate=0.2"], "methods": ["linear"], "replicates": 2, "output": "o1"}\n' >latin1.json
expect_fail 2 "latin1.csv:1:11: not UTF-8 text \(byte 0xB0\); save the file as UTF-8" -- "$GAPMARK" run latin1.json --quiet
expect_fail 2 "latin1.csv:1:11: not UTF-8 text" -- "$GAPMARK" quick latin1.csv --out q1
expect_fail 2 "latin1.csv:1:11: not UTF-8 text" -- "$GAPMARK" profile latin1.csv --json
expect_fail 2 "latin1.csv:1:11: not UTF-8 text" -- "$GAPMARK" fill latin1.csv -m linear -o f.csv

# A Latin-1 group value (Z\374rich) in a long table.
{ printf 'city,time,load\n'; for i in 0 1 2 3 4 5; do printf 'Z\374rich,%d,%d\n' "$i" "$i"; done; } >groups.csv
expect_fail 2 "groups.csv:2:2: not UTF-8 text \(byte 0xFC\)" -- "$GAPMARK" profile groups.csv --group city --json
printf '{"data": [{"file": "groups.csv", "groups": ["city"]}], "schemes": ["random:rate=0.2"], "methods": ["linear"], "output": "o2"}\n' >groups.json
expect_fail 2 "groups.csv:2:2: not UTF-8 text" -- "$GAPMARK" run groups.json --quiet

# One byte that is not UTF-8 in an outside program's error line: the trial
# fails with the byte escaped; the run, the report and --resume all work.
printf 'time,level\n' >data.csv
for i in $(seq 0 39); do printf '%d,%s\n' "$i" "$(( (i * 7) % 13 + 20 ))" >>data.csv; done
printf '#!/bin/sh\nprintf "bad \\377 byte and a bell \\007\\n" >&2\nexit 1\n' >bad.sh
chmod +x bad.sh
printf '{"data": ["data.csv"], "schemes": ["random:rate=0.2"], "replicates": 2, "methods": ["linear", "external:command=%s/bad.sh"], "metrics": ["error"], "output": "o3"}\n' "$PWD" >ext.json
check "a run with a non-UTF-8 error line finishes" "$GAPMARK" run ext.json --allow-external --quiet
check "the reason keeps the byte as an escape" grep -qF 'bad \\xFF byte and a bell \\x07' o3/results.json
check "report reads it back" "$GAPMARK" report o3/results.json --out o3r --quiet
check "--resume reads the checkpoint back" "$GAPMARK" run ext.json --allow-external --quiet --resume
# Binary on standard output: the reason shows escapes, not raw bytes.
printf '#!/bin/sh\ncat >/dev/null\nprintf "\\033[2J\\001\\002\\377garbage\\n"\n' >binary.sh
chmod +x binary.sh
printf '{"data": ["data.csv"], "schemes": ["random:rate=0.2"], "replicates": 2, "methods": ["linear", "external:command=%s/binary.sh"], "metrics": ["error"], "output": "o4"}\n' "$PWD" >bin.json
check "a program printing binary fails its trials cleanly" "$GAPMARK" run bin.json --allow-external --quiet
check "its output is escaped in the reason" grep -qF '\\x1B[2J\\x01\\x02\\xFFgarbage' o4/results.json

# Echoed input is cut to a sensible length, with control bytes escaped.
{ printf 'time,v\n0,1\n1,'; head -c 10000000 /dev/zero | tr '\0' 'x'; printf '\n2,3\n'; } >huge_cell.csv
status=0
"$GAPMARK" fill huge_cell.csv -m linear -o h.csv 2>err.txt || status=$?
check "a 10 MB cell is an input error" test "$status" -eq 2
check "echoed in a short line ($(wc -c <err.txt) bytes)" test "$(wc -c <err.txt)" -lt 2000
check "which says how much was left out" grep -q "more bytes" err.txt
printf 'time,v\n0,1\n1,a\000b\n2,3\n' >nul.csv
expect_fail 2 "nul.csv:3: column 'v': not a number: 'a\\\\0b'" -- "$GAPMARK" fill nul.csv -m linear -o n.csv

# Markdown reports escape names: markup, table bars, line breaks.
printf 'time,"<script>alert(1)</script>",a|b,"two\nlines"\n' >names.csv
for i in $(seq 0 39); do printf '%d,%d,%d,%d\n' "$i" $((i % 7)) $((i % 5)) $((i % 3)) >>names.csv; done
printf '{"data": ["names.csv"], "schemes": ["random:rate=0.2"], "replicates": 2, "methods": ["linear", "mean"], "metrics": ["error"], "output": "o5"}\n' >names.json
"$GAPMARK" run names.json --quiet
check "ranking.md has no raw <script>" test "$(grep -c '<script>' o5/ranking.md)" -eq 0
check "ranking.md shows it escaped" grep -qF '&lt;script&gt;' o5/ranking.md
check "ranking.md escapes the bar in a heading" grep -qF '## a\|b' o5/ranking.md
check "a name with a line break stays on one line" grep -qF '## two lines' o5/ranking.md
check "methods.md has <script> only inside code spans" \
  test -z "$(grep '<script>' o5/methods.md | sed 's/`[^`]*`//g' | grep '<script>' || true)"
check "methods.md keeps a line-broken name on one line" test "$(grep -c '^lines' o5/methods.md)" -eq 0
finish
