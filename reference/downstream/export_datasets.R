# Exports the open series used by the downstream checks from R's `datasets`
# package (shipped with Debian's r-base-core) to data/r_datasets.json.
# Run from this folder:  /usr/bin/Rscript export_datasets.R
series <- list(LakeHuron = LakeHuron, lynx = lynx, co2 = co2, UKDriverDeaths = UKDriverDeaths)

num <- function(x) paste(sprintf("%.17g", as.numeric(x)), collapse = ", ")
entries <- vapply(names(series), function(name) {
  x <- series[[name]]
  sprintf('    "%s": {"start": %s, "frequency": %s, "values": [%s]}',
          name, sprintf("%.17g", tsp(x)[1]), sprintf("%.17g", frequency(x)), num(x))
}, character(1))

out <- c("{",
         sprintf('  "source": "R datasets package, %s",', R.version.string),
         '  "series": {',
         paste(entries, collapse = ",\n"),
         "  }",
         "}")
writeLines(out, "data/r_datasets.json")
