#!/usr/bin/env bash
# Large runs: a default experiment (default metrics, 10 replicates) with a
# cheap method set over 1k, 2k, 5k and 10k invented series of 1,000 points.
# Prints wall time, CPU time and peak memory (/usr/bin/time -v) per size and
# the least-squares slopes of wall and CPU time against the number of series, with
# each size's seconds per 1,000 series to show how close to linear it is.
# Target: under 1 GiB peak at 10,000 series.
#
#   experiments/perf/large_run.sh [GAPMARK] [WORK_DIR] [SIZES...]
# The data come from make_workload.py, 1,000 series per file.
set -euo pipefail
HERE=$(cd "$(dirname "$0")" && pwd)
GAPMARK=$(realpath "${1:-$HERE/../../build/gapmark}")
WORK=${2:-/tmp/gapmark-large-run}
shift $(($# > 2 ? 2 : $#))
SIZES=${*:-1000 2000 5000 10000}
THREADS=${THREADS:-$(nproc)}
mkdir -p "$WORK"
cd "$WORK"

peak_mb() { awk -F': ' '/Maximum resident set size/ {printf "%.0f", $2 / 1024}' "$1"; }
wall_s() { awk -F': ' '/Elapsed \(wall clock\)/ {n = split($2, p, ":"); s = 0; for (i = 1; i <= n; i++) s = s * 60 + p[i]; printf "%.2f", s}' "$1"; }
cpu_s() { awk -F': ' '/User time/ {u = $2} /System time/ {s = $2} END {printf "%.2f", u + s}' "$1"; }

table=()
for n in $SIZES; do
  files=$(( (n + 999) / 1000 ))
  if [ ! -s "rooms${n}_$(printf %02d "$files").csv" ] && [ ! -s "rooms${n}.csv" ]; then
    /usr/bin/python3 "$HERE/make_workload.py" --series "$n" --points 1000 --files "$files" --out "rooms${n}.csv"
  fi
  data=""
  if [ "$files" -eq 1 ]; then
    data="{\"file\": \"rooms${n}.csv\", \"period\": 24}"
  else
    for k in $(seq 1 "$files"); do
      data+="${data:+, }{\"file\": \"rooms${n}_$(printf %02d "$k").csv\", \"period\": 24}"
    done
  fi
  cat >"large${n}.json" <<JSON
{
  "name": "large run, $n invented series",
  "seed": 7, "output": "out${n}",
  "data": [$data],
  "schemes": [{"name": "random", "rates": [0.1]}, {"name": "blocks", "length_mean": 8, "rates": [0.1]}],
  "methods": ["zero", "mean", "carry-forward", "linear"]
}
JSON
  echo "== $n series x 1000 points: $(( n * 2 * 10 )) tasks, $(( n * 2 * 10 * 4 )) trials, $THREADS threads"
  /usr/bin/time -v "$GAPMARK" run "large${n}.json" --threads "$THREADS" --quiet 2>"time${n}.txt" || { cat "time${n}.txt"; exit 1; }
  w=$(wall_s "time${n}.txt"); c=$(cpu_s "time${n}.txt"); p=$(peak_mb "time${n}.txt")
  printf "   wall %8.1f s   CPU %8.1f s   peak %6s MB   checkpoint %s   results.json %s\n" "$w" "$c" "$p" \
    "$(du -h "out${n}/trials.jsonl" | cut -f1)" "$(du -h "out${n}/results.json" | cut -f1)"
  table+=("$n $w $c $p")
done

echo
echo "== slope (least squares, wall seconds against series)"
printf '%s\n' "${table[@]}" | awk '
  { n[NR] = $1; w[NR] = $2; c[NR] = $3; p[NR] = $4; sx += $1; sy += $2; sc += $3; sxx += $1 * $1; sxy += $1 * $2; sxc += $1 * $3 }
  END {
    k = NR; d = k * sxx - sx * sx
    if (k < 2 || d == 0) { print "   (give two sizes or more for a slope)" } else {
      slope = (k * sxy - sx * sy) / d; icept = (sy - slope * sx) / k
      cslope = (k * sxc - sx * sc) / d; cicept = (sc - cslope * sx) / k
      printf "   wall = %.1f s + %.2f s per 1000 series\n", icept, 1000 * slope
      printf "   CPU  = %.1f s + %.2f s per 1000 series\n", cicept, 1000 * cslope
    }
    for (i = 1; i <= k; i++)
      printf "   %6d series: %7.2f s wall per 1000 series, %7.2f s CPU per 1000 series, peak %5d MB\n",
             n[i], 1000 * w[i] / n[i], 1000 * c[i] / n[i], p[i]
  }'
