#!/bin/sh
# Test helper for the external method: reads the series as CSV "time,value"
# (standard input, or the file named by the first argument) and writes it
# back with each gap filled on a straight line between the observations on
# either side; gaps at the ends take the nearest observed value. Values are
# printed with 17 significant digits, which read back to the same double.
exec awk -F, '
NR == 1 {
  if ($0 != "time,value") { print "unexpected header: " $0 > "/dev/stderr"; bad = 1; exit 2 }
  next
}
{ n++; t[n] = $1; if ($2 == "") miss[n] = 1; else { miss[n] = 0; v[n] = $2 + 0 } }
END {
  if (bad) exit 2
  first = 0; last = 0
  for (i = 1; i <= n; i++) if (!miss[i]) { if (!first) first = i; last = i }
  left = 0
  for (i = 1; i <= n; i++) {
    if (miss[i]) continue
    if (left && i - left > 1) {
      a = v[left]; b = v[i]; span = i - left
      for (j = left + 1; j < i; j++) { s = (j - left) / span; v[j] = (1.0 - s) * a + s * b }
    }
    left = i
  }
  print "time,value"
  for (i = 1; i <= n; i++) {
    if (!first) { print t[i] ","; continue }
    if (i < first) v[i] = v[first]
    if (i > last) v[i] = v[last]
    printf "%s,%.17g\n", t[i], v[i]
  }
}' "$@"
