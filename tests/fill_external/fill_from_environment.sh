#!/bin/sh
# Test helper: fills every gap with GAPMARK_PERIOD * 1000 + GAPMARK_LENGTH and
# adds a variance column (2.5 at gaps, empty elsewhere); reports the
# protocol version and step on standard error.
echo "protocol $GAPMARK_PROTOCOL step $GAPMARK_STEP" >&2
fill=$((GAPMARK_PERIOD * 1000 + GAPMARK_LENGTH))
exec awk -F, -v fill="$fill" '
NR == 1 { print "time,value,variance"; next }
$2 == "" { print $1 "," fill ",2.5"; next }
{ print $1 "," $2 "," }' "$@"
