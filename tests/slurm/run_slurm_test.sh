#!/usr/bin/env bash
# Integration test of the Slurm recipe (experiments/slurm/): starts a private
# single-node Slurm cluster from Debian's slurm-wlm and munge packages (no
# systemd, no cgroups: ProctrackType=proctrack/linuxproc, TaskPlugin=task/none),
# submits a 3-shard job array and its dependent merge job with submit.sh,
# waits, and compares the merged results.json with a single-machine run.
# Everything lives in WORK_DIR; the daemons are stopped at the end.
#
#   tests/slurm/run_slurm_test.sh GAPMARK SOURCE_DIR WORK_DIR
# Needs root (munged and slurmd run as root here) and the packages
# (tools/install-deps.sh --slurm). Exits 77 (skipped) when they are missing
# or the daemons cannot start on this machine, saying why; fails (exit 1)
# when the cluster ran and the merged results differ or are missing. The
# verdict line is also written to WORK_DIR/verdict.txt (CI prints it).
set -euo pipefail
GAPMARK=$(realpath "$1")
SRC=$(realpath "$2")
WORK=$(realpath -m "$3")
rm -rf "$WORK"
mkdir -p "$WORK"/{munge,state,spool,out}
verdict() { echo "$*"; echo "$*" >"$WORK/verdict.txt"; }
skip() { verdict "SKIP: $*"; exit 77; }
for tool in munged mungekey slurmctld slurmd sbatch squeue sinfo scontrol; do
  if ! command -v "$tool" >/dev/null && [ ! -x "/usr/sbin/$tool" ]; then
    skip "$tool not found (tools/install-deps.sh --slurm)"
  fi
done
[ "$(id -u)" -eq 0 ] || skip "needs root to run munged and slurmd"
export PATH=/usr/sbin:$PATH

chmod 700 "$WORK/munge"
cd "$WORK"
pids=()
cleanup() {
  for p in "${pids[@]}"; do kill "$p" 2>/dev/null || true; done
  for p in "${pids[@]}"; do wait "$p" 2>/dev/null || true; done
}
trap cleanup EXIT
logs() { for f in munge/munged.log slurmctld.log slurmd.log slurmctld.out slurmd.out; do echo "--- $f" >&2; tail -20 "$f" >&2 || true; done; }
fail() { verdict "FAIL: $*" >&2; logs; exit 1; }
# The daemons could not start: this machine cannot host the test (say why, skip).
cannot_start() { logs; skip "Slurm could not start on this machine: $*"; }

# --- munge with a key made here
mungekey --create --keyfile="$WORK/munge/munge.key" --bits=1024
chmod 600 "$WORK/munge/munge.key"
munged --foreground --force --key-file="$WORK/munge/munge.key" --socket="$WORK/munge/munge.socket" \
  --pid-file="$WORK/munge/munged.pid" --log-file="$WORK/munge/munged.log" --seed-file="$WORK/munge/seed" \
  >/dev/null 2>&1 &
pids+=($!)
for _ in $(seq 1 50); do [ -S "$WORK/munge/munge.socket" ] && break; sleep 0.1; done
[ -S "$WORK/munge/munge.socket" ] || cannot_start "munged did not start"

# --- a one-node cluster on private ports
node=$(hostname -s)
cpus=$(nproc)
port=$((20000 + RANDOM % 20000))
cat >slurm.conf <<CONF
ClusterName=gapmarktest
SlurmctldHost=$node(127.0.0.1)
SlurmctldPort=$port
SlurmdPort=$((port + 1))
SlurmUser=root
SlurmdUser=root
AuthType=auth/munge
CredType=cred/munge
AuthInfo=socket=$WORK/munge/munge.socket
ProctrackType=proctrack/linuxproc
TaskPlugin=task/none
JobAcctGatherType=jobacct_gather/none
AccountingStorageType=accounting_storage/none
JobCompType=jobcomp/none
SchedulerType=sched/backfill
SelectType=select/cons_tres
SelectTypeParameters=CR_CPU
MpiDefault=none
ReturnToService=2
StateSaveLocation=$WORK/state
SlurmdSpoolDir=$WORK/spool
SlurmctldPidFile=$WORK/slurmctld.pid
SlurmdPidFile=$WORK/slurmd.pid
SlurmctldLogFile=$WORK/slurmctld.log
SlurmdLogFile=$WORK/slurmd.log
SlurmctldDebug=info
SlurmdDebug=info
NodeName=$node NodeAddr=127.0.0.1 CPUs=$cpus State=UNKNOWN
PartitionName=test Nodes=$node Default=YES MaxTime=INFINITE State=UP
CONF
export SLURM_CONF=$WORK/slurm.conf
slurmctld -D -i -f "$SLURM_CONF" >slurmctld.out 2>&1 &
pids+=($!)
slurmd -D -f "$SLURM_CONF" -N "$node" >slurmd.out 2>&1 &
pids+=($!)
ready=0
for _ in $(seq 1 100); do
  if sinfo -h -N -o "%T" 2>/dev/null | grep -qE "^idle"; then ready=1; break; fi
  sleep 0.2
done
[ "$ready" -eq 1 ] || cannot_start "the node did not come up: $(sinfo -N 2>&1 | tail -1)"
echo "slurm is up: $(sinfo -h -N -o '%N %T %c CPUs')"

# --- the experiment: invented demo data, 3 shards, merged by a dependent job
cat >spec.json <<JSON
{
  "name": "slurm test (invented demo data)", "seed": 8, "replicates": 6, "holdout": 24,
  "data": [{"file": "$SRC/experiments/demo/pen3_hourly.csv", "period": 24,
            "columns": ["dissolved_oxygen_mg_l", "water_level_m"]}],
  "schemes": [{"name": "random", "rates": [0.1, 0.3]}, {"name": "blocks", "length_mean": 6, "rates": [0.2]}],
  "methods": ["mean", "carry-forward", "linear", "pchip", "seasonal-mean"],
  "metrics": ["error", "acf"]
}
JSON
SBATCH_OPTIONS="--cpus-per-task=1" GAPMARK="$GAPMARK" bash "$SRC/experiments/slurm/submit.sh" spec.json 3 out | tee submit.txt
merge_job=$(sed -n 's/.*merge: job \([0-9]*\).*/\1/p' submit.txt)
[ -n "$merge_job" ] || fail "no merge job id"
for _ in $(seq 1 600); do
  [ -z "$(squeue -h -o %i 2>/dev/null)" ] && break
  sleep 0.5
done
[ -z "$(squeue -h -o %i)" ] || fail "jobs still queued after 5 minutes: $(squeue)"
[ -s out/merged/results.json ] || fail "the merge job wrote no results.json ($(cat out/gapmark-*.log 2>/dev/null | tail -5))"
for k in 1 2 3; do [ -s "out/shard-$k/shard.json" ] || fail "shard $k did not finish"; done

"$GAPMARK" run spec.json --out single --quiet
strip_timing() { sed '/^ "timing": {/,/^ }/d' "$1"; }
cmp <(strip_timing single/results.json) <(strip_timing out/merged/results.json) ||
  fail "merged results.json differs from the single-machine run"
for f in ranking.md ranking.csv; do cmp single/$f out/merged/$f || fail "$f differs"; done
verdict "PASS: 3 Slurm array shards merged by a dependent job equal the single-machine run"
