# The committed demo reports under reports/ equal a fresh run of
# experiments/demo.json: report.html, ranking.md, methods.md and
# references.bib, with the version and source commit set aside (they change
# with every commit). When this fails after a change meant to alter the
# demo's results, run `bash reports/regenerate.sh build/gapmark` and commit.
source "$(dirname "$0")/lib/common.bash"
"$GAPMARK" run "$SRC/experiments/demo.json" --out demo --quiet
# gapmark X.Y.Z (commit abcdef123456) / (source commit abcdef123456)
normalise() { sed -E 's/gapmark [0-9]+\.[0-9]+\.[0-9]+/gapmark VERSION/g; s/commit [0-9a-f]{7,40}|commit unknown/commit COMMIT/g' "$1"; }
for f in report.html ranking.md methods.md references.bib; do
  if cmp -s <(normalise "$SRC/reports/$f") <(normalise "demo/$f"); then
    ok
  else
    fail "reports/$f differs from a fresh demo run (bash reports/regenerate.sh BUILD/gapmark rewrites it); first differences:"
    diff <(normalise "$SRC/reports/$f") <(normalise "demo/$f") | head -n 8 >&2 || true
  fi
done
finish
