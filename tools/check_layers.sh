#!/bin/bash
# Fails when a lower layer includes a higher one. Layers, bottom to top:
#   core; stats, forecast; mask, fill, score; experiment; analysis;
#   report, compare, data; cli
# A file's layer is its folder under src/ or include/gapmark/ (headers
# directly in include/gapmark/ are core); an include's layer is the folder
# after "gapmark/" (none: core). Layers of one rank may include each other.
# Usage: tools/check_layers.sh SOURCE_DIR
set -euo pipefail
root=${1:-.}
declare -A rank=([core]=0 [stats]=1 [forecast]=1 [mask]=2 [fill]=2 [score]=2 [experiment]=3
                 [analysis]=4 [report]=5 [compare]=5 [data]=5 [cli]=6)
layer_of_path() {  # src/fill/x.cpp -> fill; include/gapmark/x.hpp -> core
  local rel=${1#"$root"/}
  case $rel in
    include/gapmark/*/*) rel=${rel#include/gapmark/}; echo "${rel%%/*}" ;;
    include/gapmark/*) echo core ;;
    src/*/*) rel=${rel#src/}; echo "${rel%%/*}" ;;
    *) echo "" ;;
  esac
}
bad=0 files=0
while IFS= read -r -d '' file; do
  from=$(layer_of_path "$file")
  [ -n "$from" ] || continue
  if [ -z "${rank[$from]+x}" ]; then
    echo "$file: folder '$from' has no place in the layer order (add it to tools/check_layers.sh)"
    bad=$((bad + 1))
    continue
  fi
  files=$((files + 1))
  while IFS= read -r line; do
    inc=${line#*\"gapmark/}
    inc=${inc%%\"*}
    case $inc in */*) to=${inc%%/*} ;; *) to=core ;; esac
    if [ -z "${rank[$to]+x}" ]; then
      echo "$file: includes gapmark/$inc, of folder '$to' that has no place in the layer order"
      bad=$((bad + 1))
    elif [ "${rank[$to]}" -gt "${rank[$from]}" ]; then
      echo "$file: $from (layer ${rank[$from]}) includes gapmark/$inc ($to, layer ${rank[$to]})"
      bad=$((bad + 1))
    fi
  done < <(grep -E '^[[:space:]]*#[[:space:]]*include[[:space:]]*"gapmark/' "$file" || true)
done < <(find "$root/src" "$root/include/gapmark" \( -name '*.cpp' -o -name '*.hpp' -o -name '*.cpp.in' \) -print0)
if [ "$files" -lt 100 ]; then
  echo "only $files files read under $root/src and $root/include/gapmark: wrong folder?"
  exit 1
fi
echo "$files files read, $bad includes against the layer order"
[ "$bad" -eq 0 ]
