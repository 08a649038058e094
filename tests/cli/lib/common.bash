# Shared helpers for the end-to-end tests. Each test is run as
#   bash tests/cli/NAME.sh GAPMARK_BINARY SOURCE_DIR WORK_DIR
set -euo pipefail
GAPMARK=$1
SRC=$2
WORK=$3
rm -rf "$WORK"
mkdir -p "$WORK"
cd "$WORK"
passed=0
failed=0

ok() { passed=$((passed + 1)); }
fail() { echo "FAIL: $*" >&2; failed=$((failed + 1)); }

# expect_fail EXIT_CODE PATTERN -- command...: the command must exit with
# EXIT_CODE and print exactly one line on stderr matching PATTERN.
expect_fail() {
  local code=$1 pattern=$2
  shift 3
  local status=0
  "$@" >out.txt 2>err.txt || status=$?
  local lines
  lines=$(wc -l <err.txt)
  if [ "$status" -ne "$code" ]; then
    fail "$* exited $status, expected $code; stderr: $(cat err.txt)"
  elif [ "$lines" -ne 1 ]; then
    fail "$* printed $lines lines on stderr, expected one: $(cat err.txt)"
  elif ! grep -qE -- "$pattern" err.txt; then
    fail "$* stderr does not match '$pattern': $(cat err.txt)"
  else
    ok
  fi
}

check() {  # check DESCRIPTION command...
  local what=$1
  shift
  if "$@"; then ok; else fail "$what"; fi
}

finish() {
  echo "$passed passed, $failed failed"
  [ "$failed" -eq 0 ]
}
