#!/bin/sh
# Regenerates every stored value in this folder, in order: the R export
# first (the Python scripts read data/r_datasets.json).
set -e
cd "$(dirname "$0")"
/usr/bin/Rscript export_datasets.R
/usr/bin/Rscript acf_r.R
/usr/bin/python3 acf_statsmodels.py
/usr/bin/python3 seasonal_naive_statsmodels.py
/usr/bin/python3 holt_winters_statsmodels.py
/usr/bin/python3 crps_scipy.py
/usr/bin/python3 sample_crps_scipy.py
