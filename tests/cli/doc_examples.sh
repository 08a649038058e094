# Every shell example in README.md, docs/*.md and experiments/raw/README.md
# that is cheap to run is run, in a scratch copy of experiments/ and
# reference/ per document, with `gapmark` and `./build/gapmark` both meaning the binary
# under test; each must exit 0. Skipped: blocks that install, build or test
# (apt-get, install-deps, cmake, ctest), that need Python, R or Slurm, that
# run the full demo (its outputs are checked by cli_reports_match_demo), or
# that are marked `# not run by the test`.
source "$(dirname "$0")/lib/common.bash"
mkdir -p bin build
ln -s "$GAPMARK" bin/gapmark
ln -s "$GAPMARK" build/gapmark
export PATH="$PWD/bin:$PATH"
skip='install-deps|apt-get|cmake|ctest|Rscript|python3|pytest|sbatch|srun|experiments/demo\.json|not run by the test'
ran=0
for doc in "$SRC/README.md" "$SRC"/docs/*.md "$SRC/experiments/raw/README.md"; do
  [ -f "$doc" ] || continue
  name=${doc#"$SRC/"}
  # one file per ```sh block: name.N.sh
  awk -v out="$PWD/blocks" -v base="$(echo "$name" | tr '/' '_')" '
    /^```sh[[:space:]]*$/ { n++; f = sprintf("%s.%s.%d.sh", out, base, n); inblock = 1; next }
    /^```/ { inblock = 0; next }
    inblock { print > f }' "$doc"
done
# The blocks of one document run in order in a folder of their own (a later
# block may read what an earlier one wrote), on a fresh copy of the data.
for block in blocks.*.sh; do
  [ -f "$block" ] || continue
  if grep -qE "$skip" "$block"; then continue; fi
  doc_dir=run.$(echo "$block" | sed -E 's/^blocks\.(.*)\.[0-9]+\.sh$/\1/')
  if [ ! -d "$doc_dir" ]; then
    mkdir "$doc_dir"
    cp -r "$SRC/experiments" "$SRC/reference" "$doc_dir/"
    ln -s ../build "$doc_dir/build"
  fi
  ran=$((ran + 1))
  if (cd "$doc_dir" && bash -e "../$block") >"$block.out" 2>&1; then
    ok
  else
    fail "example $block failed: $(head -c 300 "$block") -> $(tail -n 3 "$block.out")"
  fi
done
echo "ran $ran shell examples"
check "at least 5 shell examples were run ($ran)" test "$ran" -ge 5
finish
