#!/usr/bin/env bash
# Installs what gapmark needs to build and test on Debian 12, from Debian's
# own packages. Runs apt-get directly as root, through sudo otherwise.
# Installs only what is missing, so a second run is quick.
set -euo pipefail
packages=(
  build-essential cmake ninja-build git
  libeigen3-dev libboost-dev libcli11-dev nlohmann-json3-dev doctest-dev
  libnlopt-cxx-dev liblapack-dev libhowardhinnant-date-dev libssl-dev
  # the Python module (python/) and its tests
  pybind11-dev python3-dev python3-numpy python3-pandas python3-pytest
)
# Extra packages for optional checks, named on the command line:
#   --browser  Chromium, for the report's browser test
#   --fuzz     clang and its runtimes, for the fuzz targets
#   --slurm    Slurm and munge, for the one-node cluster test (tests/slurm/)
#   --refs     Python and R libraries that regenerate reference values
for arg in "$@"; do
  case "$arg" in
    --browser) packages+=(chromium) ;;
    --fuzz) packages+=(clang libclang-rt-14-dev) ;;
    --slurm) packages+=(slurm-wlm munge) ;;
    --refs) packages+=(python3-numpy python3-scipy python3-pandas python3-statsmodels r-base-core) ;;
    *) echo "install-deps.sh: unknown option '$arg' (known: --browser --fuzz --slurm --refs)" >&2; exit 2 ;;
  esac
done
missing=()
for p in "${packages[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
if [ ${#missing[@]} -eq 0 ]; then
  echo "install-deps.sh: everything needed is installed"
  exit 0
fi
as_root=()
[ "$(id -u)" -eq 0 ] || as_root=(sudo)
echo "install-deps.sh: installing ${missing[*]}"
"${as_root[@]}" apt-get update -qq
DEBIAN_FRONTEND=noninteractive "${as_root[@]}" apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
