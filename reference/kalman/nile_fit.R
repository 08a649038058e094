# Reference values for `gapmark fill --fit` on the Nile flow (R's datasets::Nile,
# annual flow of the Nile at Aswan, 1871-1970, 10^8 m^3): the full series and
# a copy with some years removed, as the CSV files the command reads, and
# R's StructTS local-level fit on each.
# Run from the repository root:  /usr/bin/Rscript reference/kalman/nile_fit.R
# Writes reference/kalman/nile_fit/nile.csv, nile_gaps.csv and structts.json.
out_dir <- "reference/kalman/nile_fit"
dir.create(out_dir, showWarnings = FALSE)

year <- 1871:1970
flow <- as.numeric(datasets::Nile)
removed <- c(1890:1899, 1935:1939, 1960)          # years removed for the gap copy
gaps <- flow; gaps[year %in% removed] <- NA

write.csv(data.frame(year = year, flow = flow), file.path(out_dir, "nile.csv"), row.names = FALSE)
write.csv(data.frame(year = year, flow = gaps), file.path(out_dir, "nile_gaps.csv"), row.names = FALSE, na = "")

fit_of <- function(y) {
  fit <- StructTS(ts(y, start = 1871), type = "level")
  sprintf('{"variance_irregular": %.10g, "variance_level": %.10g}',
          fit$coef[["epsilon"]], fit$coef[["level"]])
}
json <- paste0('{\n "source": "R datasets::Nile; StructTS(ts(y, start = 1871), type = \\"level\\")",\n',
               ' "r_version": "', R.version.string, '",\n',
               ' "removed_years": [', paste(removed, collapse = ", "), '],\n',
               ' "nile": ', fit_of(flow), ',\n',
               ' "nile_gaps": ', fit_of(gaps), '\n}\n')
writeLines(json, file.path(out_dir, "structts.json"), sep = "")
