#!/usr/bin/env bash
# Runs the Python module's tests (tests/python/test_*.py) with pytest.
# Arguments: PYTHON MODULE_DIR GAPMARK SOURCE_DIR WORK_DIR [REASON_NOT_BUILT]
# Skips (exit 77, saying why) when the module was not built or pytest is
# missing; a skip is never a pass.
set -u
python=$1 module_dir=$2 gapmark=$3 src=$4 work=$5 not_built=${6:-}
if [ -n "$not_built" ]; then
  echo "SKIP: the Python module was not built ($not_built)"
  exit 77
fi
if ! ls "$module_dir"/gapmark/_engine*.so >/dev/null 2>&1; then
  echo "SKIP: the Python module was not built (no $module_dir/gapmark/_engine*.so; build the target gapmark_python)"
  exit 77
fi
for need in pytest:python3-pytest pandas:python3-pandas; do
  if ! "$python" -c "import ${need%%:*}" 2>/dev/null; then
    echo "SKIP: ${need%%:*} is missing for $python (Debian: ${need#*:}; tools/install-deps.sh installs it)"
    exit 77
  fi
done
rm -rf "$work" && mkdir -p "$work"
export PYTHONPATH="$module_dir${PYTHONPATH:+:$PYTHONPATH}" GAPMARK_BINARY="$gapmark" GAPMARK_SOURCE_DIR="$src"
cd "$work" && exec "$python" -m pytest -q -p no:cacheprovider --basetemp="$work/tmp" "$src/tests/python" ${GAPMARK_PYTEST_ARGS:-}
