#!/usr/bin/env bash
# gapmark against the hand-written Python pipeline (python_pipeline.py:
# pandas, scipy, statsmodels, run with Debian's /usr/bin/python3) on one
# standard workload, side by side:
#   200 invented series x 2,000 hourly points (make_workload.py),
#   random and blocks masks at rates 0.1, 0.2, 0.4, 10 replicates,
#   6 methods (linear, natural spline, PCHIP, carry-forward, seasonal mean,
#   Kalman local level), error metrics, per-cell means and ranks.
# Both sides use the same masks: gapmark draws them in `run`; the Python side
# reads them as exported by `gapmark mask --flags` (same seed, same keys). The
# script checks this: both sides must score the same points and the same RMSE
# in every trial (to 1e-9 relative; 1e-3 for the Kalman fill, whose variances
# come from two different optimisers), or it stops with an error.
#
# The Python side spends about 0.2 s per Kalman fit (a statsmodels ML fit),
# some 30-40 minutes on one core for the whole workload. By default it runs
# on the first PY_SERIES=40 series and its time is scaled by 200 / PY_SERIES
# (every series gets the same work, so time grows in proportion); the output
# says so on every scaled line. PY_SERIES=200 runs the whole workload on both
# sides, nothing scaled.
#
# gapmark runs the whole workload on 1 thread (for the per-core ratio) and on
# all cores (its default), and the Python subset too. Printed: wall and CPU
# (user + sys) seconds, peak resident memory (/usr/bin/time -v), the load
# average around each run (the machine may be shared), the ratios, the
# library versions. Everything is also written to WORK_DIR/summary.txt.
#
#   experiments/perf/compare_python.sh [GAPMARK] [WORK_DIR]
set -euo pipefail
HERE=$(cd "$(dirname "$0")" && pwd)
GAPMARK=$(realpath "${1:-$HERE/../../build/gapmark}")
WORK=${2:-/tmp/gapmark-compare-python}
SERIES=200
POINTS=2000
PY_SERIES=${PY_SERIES:-40}
PY=/usr/bin/python3
[ "$PY_SERIES" -ge 1 ] && [ "$PY_SERIES" -le "$SERIES" ] || { echo "PY_SERIES must be 1..$SERIES" >&2; exit 2; }
mkdir -p "$WORK"
cd "$WORK"
exec > >(tee summary.txt) 2>&1

peak_mb() { awk -F': ' '/Maximum resident set size/ {printf "%.0f", $2 / 1024}' "$1"; }
wall_s() { awk -F': ' '/Elapsed \(wall clock\)/ {n = split($2, p, ":"); s = 0; for (i = 1; i <= n; i++) s = s * 60 + p[i]; printf "%.2f", s}' "$1"; }
cpu_s() { awk -F': ' '/User time/ {u = $2} /System time/ {s = $2} END {printf "%.2f", u + s}' "$1"; }
load() { cut -d' ' -f1-3 /proc/loadavg; }
timed() {  # timed LABEL TIMEFILE COMMAND...: run under /usr/bin/time -v, note the load before and after
  local label=$1 file=$2
  shift 2
  local before
  before=$(load)
  /usr/bin/time -v "$@" 2>"$file" || { cat "$file"; exit 1; }
  printf "   %-46s wall %8.2f s  CPU %8.2f s  peak %5s MB   load %s -> %s\n" "$label" "$(wall_s "$file")" \
    "$(cpu_s "$file")" "$(peak_mb "$file")" "$before" "$(load)"
}

echo "== $(date -u +%Y-%m-%dT%H:%MZ), $(nproc) cores, $("$GAPMARK" --version)"
echo "== workload: $SERIES invented series x $POINTS points (make_workload.py)"
[ -s rooms.csv ] || $PY "$HERE/make_workload.py" --series $SERIES --points $POINTS --out rooms.csv
$PY -c "import pandas as pd; pd.read_csv('rooms.csv', index_col=0).iloc[:, :$PY_SERIES].to_csv('rooms_subset.csv')"

write_spec() {  # write_spec FILE DATA OUTPUT
  cat >"$1" <<JSON
{
  "name": "gapmark vs a Python pipeline (invented cold-room data)",
  "seed": 4242, "replicates": 10, "holdout": 0, "output": "$3",
  "data": [{"file": "$2", "period": 24}],
  "schemes": [{"name": "random", "rates": [0.1, 0.2, 0.4]},
              {"name": "blocks", "length_mean": 8, "rates": [0.1, 0.2, 0.4]}],
  "methods": ["linear", "natural-spline", "pchip", "carry-forward", "seasonal-mean", "kalman:model=level"],
  "metrics": ["error"]
}
JSON
}
write_spec workload.json rooms.csv out-full
write_spec subset.json rooms_subset.csv out-subset

echo "== exporting the masks for the Python side (gapmark mask --flags; counted on neither side)"
rm -rf masks masks.log && mkdir masks
for scheme in random blocks:length_mean=8; do
  name=${scheme%%:*}
  sep=$([ "$name" = "$scheme" ] && echo ":" || echo ",")
  for rate in 0.1 0.2 0.4; do
    for rep in $(seq 0 9); do
      "$GAPMARK" mask rooms_subset.csv --period 24 --scheme "$scheme${sep}rate=$rate" --seed 4242 \
        --replicate "$rep" --flags --out "masks/$name@$rate@$rep.csv" 2>>masks.log || { cat masks.log; exit 1; }
    done
  done
done
echo "   60 mask files, $PY_SERIES series each"

echo "== runs"
rm -rf out-full out-full-threads out-subset
timed "gapmark, whole workload, 1 thread" time_g1.txt "$GAPMARK" run workload.json --threads 1 --quiet
timed "gapmark, whole workload, all $(nproc) cores" time_gn.txt "$GAPMARK" run workload.json --out out-full-threads --quiet
if [ "$PY_SERIES" -lt "$SERIES" ]; then
  timed "gapmark, first $PY_SERIES series, 1 thread" time_gs.txt "$GAPMARK" run subset.json --threads 1 --quiet
fi
timed "Python, first $PY_SERIES series" time_py.txt \
  $PY "$HERE/python_pipeline.py" --truth rooms_subset.csv --masks masks --period 24 --out py_cells.csv --trials py_trials.csv
grep "python pipeline" time_py.txt | sed 's/^/   /'

echo "== same masks, same points scored, same RMSE, trial by trial (the whole-workload run's trials)"
$PY - "$PY_SERIES" <<'PY'
import json
import sys
import pandas as pd
r = json.load(open("out-full/results.json"))
g = pd.DataFrame([{"series": t["series"], "scheme": t["scheme"].split(":")[0], "rate": t["rate"],
                   "replicate": t["replicate"],
                   "method": "kalman-level" if t["method"].startswith("kalman") else t["method"],
                   "masked_g": t["masked"], "scored_g": t["masked"] - t["unfilled"],
                   "rmse_g": t["metrics"]["rmse"], "status_g": t["status"]} for t in r["trials"]])
p = pd.read_csv("py_trials.csv")
g = g[g["series"].isin(set(p["series"]))]
m = g.merge(p, on=["series", "scheme", "rate", "replicate", "method"], how="inner")
problems = []
if not len(m) == len(g) == len(p):
    problems.append(f"trials do not pair up: gapmark {len(g)}, Python {len(p)}, paired {len(m)}")
if (m["status_g"] != "ok").any() or (m["status"] != "ok").any():
    problems.append("failed trials: gapmark %d, Python %d" % ((m["status_g"] != "ok").sum(), (m["status"] != "ok").sum()))
if (m["masked_g"] != m["masked"]).any() or (m["scored_g"] != m["scored"]).any():
    problems.append("masked or scored counts differ in %d trials" %
                    ((m["masked_g"] != m["masked"]) | (m["scored_g"] != m["scored"])).sum())
m["rel"] = (m["rmse_g"] - m["rmse"]).abs() / m["rmse"].abs().clip(lower=1e-12)
for method, d in m.groupby("method"):
    tolerance = 1e-3 if method == "kalman-level" else 1e-9
    worst = d["rel"].max()
    print(f"   {method:15s} {len(d):6d} trials  {int(d['scored'].sum()):9d} points scored  "
          f"RMSE relative difference max {worst:.1e} median {d['rel'].median():.1e}  (tolerance {tolerance:g})")
    if not worst <= tolerance:
        problems.append(f"{method}: RMSE differs by up to {worst:.2e} relative")
if problems:
    print("   NOT THE SAME WORK: " + "; ".join(problems))
    sys.exit(1)
print(f"   same masks and scores on the {sys.argv[1]} series compared")
PY

echo "== the whole-workload results do not depend on the thread count"
$PY - <<'PY'
import json
a, b = (json.load(open(f + "/results.json")) for f in ("out-full", "out-full-threads"))
same = all(a[k] == b[k] for k in a if k != "timing")
print("   results.json outside timing, 1 thread vs all cores: " + ("identical" if same else "DIFFERENT"))
PY

echo "== fill seconds by method (wall time inside the fills)"
$PY - <<'PY'
import json
import os
import re
same_series = "out-subset/results.json" if os.path.exists("out-subset/results.json") else "out-full/results.json"
g = json.load(open(same_series))["timing"]["fill_seconds_by_method"]
line = open("time_py.txt").read()
p = dict((k, float(v)) for k, v in re.findall(r"([a-z-]+) ([0-9.]+)", line.split("fill seconds:")[1].split(")")[0]))
for method, seconds in sorted(p.items()):
    ours = g.get("kalman" if method == "kalman-level" else method, float("nan"))
    print(f"   {method:15s} Python {seconds:8.2f} s   gapmark {ours:8.3f} s   (same series)")
PY

g1=$(wall_s time_g1.txt); gn=$(wall_s time_gn.txt); py=$(wall_s time_py.txt)
g1c=$(cpu_s time_g1.txt); gnc=$(cpu_s time_gn.txt); pyc=$(cpu_s time_py.txt)
scale=$(echo "$SERIES / $PY_SERIES" | bc -l)
pyx=$(echo "$py * $scale" | bc -l); pyxc=$(echo "$pyc * $scale" | bc -l)
note=""
[ "$PY_SERIES" -lt "$SERIES" ] && note=" (Python measured on $PY_SERIES series, scaled x$(printf %.0f "$scale"))"
echo
echo "== results$note"
printf "   Python pipeline, whole workload:         %8.0f s wall  %8.0f s CPU%s\n" "$pyx" "$pyxc" \
  "$([ -n "$note" ] && echo "   SCALED from $PY_SERIES series")"
printf "   gapmark, whole workload, 1 thread:       %8.2f s wall  %8.2f s CPU\n" "$g1" "$g1c"
printf "   gapmark, whole workload, %d cores:        %8.2f s wall  %8.2f s CPU\n" "$(nproc)" "$gn" "$gnc"
printf "   ratio per core (CPU time, 1 thread each):                       %5.0fx\n" "$(echo "$pyxc / $g1c" | bc -l)"
printf "   ratio wall clock, gapmark on 1 thread:                          %5.0fx\n" "$(echo "$pyx / $g1" | bc -l)"
printf "   ratio wall clock, gapmark on all cores (its default):           %5.0fx\n" "$(echo "$pyx / $gn" | bc -l)"
if [ "$PY_SERIES" -lt "$SERIES" ]; then
  gs=$(wall_s time_gs.txt); gsc=$(cpu_s time_gs.txt)
  printf "   ratio on the same %d series, both measured, 1 thread, CPU time:  %5.0fx\n" "$PY_SERIES" "$(echo "$pyc / $gsc" | bc -l)"
fi
printf "   peak memory: gapmark %s MB (1 thread), %s MB (%d cores); Python %s MB%s\n" "$(peak_mb time_g1.txt)" \
  "$(peak_mb time_gn.txt)" "$(nproc)" "$(peak_mb time_py.txt)" \
  "$([ -n "$note" ] && echo " on $PY_SERIES series (not scaled)")"
grep "python pipeline libraries" time_py.txt | sed 's/^python pipeline libraries: /   Python side: /'
