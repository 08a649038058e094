# `gapmark methods|schemes|metrics` list what the registries hold, as text and JSON.
source "$(dirname "$0")/lib/common.bash"
"$GAPMARK" methods --json >methods.json
for m in zero mean median carry-forward carry-backward linear; do
  check "methods --json lists $m" grep -q "\"name\": \"$m\"" methods.json
done
check "methods --json lists parameters" grep -q '"name": "edges"' methods.json
"$GAPMARK" methods >methods.txt
check "methods text shows needs" grep -q "needs:" methods.txt
"$GAPMARK" schemes --json >schemes.json
for s in random blocks seasonal; do check "schemes lists $s" grep -q "\"name\": \"$s\"" schemes.json; done
"$GAPMARK" metrics >metrics.txt
check "metrics lists error" grep -q "^error" metrics.txt
"$GAPMARK" --help >help.txt
check "help lists run" grep -q "run" help.txt
check "--version" bash -c "'$GAPMARK' --version | grep -q '^gapmark [0-9]'"
finish
