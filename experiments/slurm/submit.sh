#!/bin/bash
# Runs a gapmark experiment as a Slurm job array of N shards, then merges
# them in a job that waits for every shard to succeed.
#
#   experiments/slurm/submit.sh SPEC N [OUT]
# Environment: GAPMARK (default: gapmark on PATH), SBATCH_OPTIONS (extra
# sbatch options for both jobs, e.g. "--partition=short --account=me").
# Prints the two job ids; the results land in OUT/merged (default OUT:
# gapmark-shards). A failed shard can be submitted again alone
# (sbatch --array=K ...): it resumes where it stopped.
set -euo pipefail
HERE=$(cd "$(dirname "$0")" && pwd)
SPEC=$(realpath "${1:?usage: submit.sh SPEC N [OUT]}")
N=${2:?usage: submit.sh SPEC N [OUT]}
OUT=$(realpath -m "${3:-gapmark-shards}")
GAPMARK=${GAPMARK:-gapmark}
mkdir -p "$OUT"
# shellcheck disable=SC2086
array=$(sbatch --parsable ${SBATCH_OPTIONS:-} --array=1-"$N" --chdir="$OUT" \
  --export=ALL,SPEC="$SPEC",OUT="$OUT",GAPMARK="$GAPMARK" "$HERE/shard.sbatch")
array=${array%%;*}
# shellcheck disable=SC2086
merge=$(sbatch --parsable ${SBATCH_OPTIONS:-} --dependency=afterok:"$array" --kill-on-invalid-dep=yes \
  --chdir="$OUT" --export=ALL,SPEC="$SPEC",OUT="$OUT",GAPMARK="$GAPMARK" "$HERE/merge.sbatch")
merge=${merge%%;*}
echo "shards: job array $array (1-$N); merge: job $merge, after every shard succeeds"
echo "results: $OUT/merged/results.json"
