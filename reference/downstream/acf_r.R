# Sample autocorrelation (mean-centred, denominator n) of open series from R's
# `datasets` package, by R's own stats::acf. Writes values/acf_r.json.
# Run from this folder:  /usr/bin/Rscript acf_r.R
lag_max <- 30
series <- list(LakeHuron = LakeHuron, lynx = lynx)
entries <- vapply(names(series), function(name) {
  r <- acf(series[[name]], lag.max = lag_max, type = "correlation", demean = TRUE, plot = FALSE)
  sprintf('    "%s": [%s]', name, paste(sprintf("%.17g", as.numeric(r$acf)), collapse = ", "))
}, character(1))
out <- c("{",
         sprintf('  "source": "stats::acf(x, lag.max = %d, demean = TRUE), %s",', lag_max, R.version.string),
         sprintf('  "max_lag": %d,', lag_max),
         '  "acf": {',
         paste(entries, collapse = ",\n"),
         "  }",
         "}")
writeLines(out, "values/acf_r.json")
