#!/usr/bin/env bash
# Runs every fuzz target for a bounded time each, starting from its committed
# seed corpus (fuzz/corpus/<target>/, copied so that the repository is not
# written). Any crash, leak, sanitizer report or uncaught exception fails.
#
#   fuzz/run_all.sh BUILD_DIR [SECONDS_PER_TARGET=60]
# BUILD_DIR was configured with -DGAPMARK_FUZZ=ON and clang, e.g.
#   CXX=clang++-14 cmake -S . -B build-fuzz -G Ninja -DGAPMARK_FUZZ=ON -DGAPMARK_TESTS=OFF
#   cmake --build build-fuzz --target fuzz_all
set -euo pipefail
HERE=$(cd "$(dirname "$0")" && pwd)
BUILD=$(realpath "${1:?usage: fuzz/run_all.sh BUILD_DIR [SECONDS]}")
SECONDS_EACH=${2:-60}
WORK=$BUILD/fuzz-work
mkdir -p "$WORK"
shopt -s nullglob
targets=("$BUILD"/fuzz/fuzz_*)
if [ ${#targets[@]} -eq 0 ]; then
  echo "run_all.sh: no fuzz targets in $BUILD/fuzz (build the fuzz_all target first)" >&2
  exit 2
fi
# Targets listed in fuzz/provisional.txt are new and have not yet had a clean
# run under libFuzzer on the build machine: their findings are printed and
# their inputs kept exactly as for the others, but do not fail the run. A
# session that has run them clean (or fixed what they found) removes them
# from the list, and from then on they fail like every other target.
provisional=()
[ -f "$HERE/provisional.txt" ] && mapfile -t provisional < <(grep -v '^#' "$HERE/provisional.txt" | grep -v '^$')
failed=0
for target in "${targets[@]}"; do
  [ -f "$target" ] && [ -x "$target" ] || continue
  name=$(basename "$target")
  corpus=$WORK/$name
  rm -rf "$corpus" "$WORK/$name"-crash-* "$WORK/$name"-leak-* "$WORK/$name"-timeout-* "$WORK/$name"-oom-*
  mkdir -p "$corpus"
  cp "$HERE/corpus/$name/"* "$corpus/" 2>/dev/null || true
  dict=()
  [ -f "$HERE/$name.dict" ] && dict=(-dict="$HERE/$name.dict")
  echo "== $name: ${SECONDS_EACH}s from $(ls "$corpus" | wc -l) seeds"
  if (cd "$WORK" && "$target" "$corpus" "${dict[@]}" -max_total_time="$SECONDS_EACH" -max_len=16384 \
        -timeout=10 -rss_limit_mb=2048 -artifact_prefix="$WORK/$name-" -print_final_stats=1 \
        >"$WORK/$name.log" 2>&1); then
    grep -E "^stat::number_of_executed_units|^#[0-9]+.*DONE" "$WORK/$name.log" | tail -2 | sed 's/^/   /'
  elif [[ " ${provisional[*]} " == *" $name "* ]]; then
    echo "FINDING (provisional target, does not fail this run): $name found a crash; the input is in $WORK/$name-{crash,leak,timeout,oom}-*"
    grep -E "ERROR|SUMMARY|Test unit written|terminate" "$WORK/$name.log" | head -10 | sed 's/^/   /'
  else
    failed=1
    echo "FAIL: $name found a crash; the input is in $WORK/$name-{crash,leak,timeout,oom}-*;"
    echo "      run it again with: $target INPUT"
    grep -E "ERROR|SUMMARY|Test unit written|terminate" "$WORK/$name.log" | head -10 | sed 's/^/   /'
  fi
done
exit $failed
