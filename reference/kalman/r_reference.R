# Reference values for the kalman fill method from R (stats::StructTS,
# stats::tsSmooth, stats::KalmanSmooth) on open data from R's datasets package.
# Run from the repository root:  /usr/bin/Rscript reference/kalman/r_reference.R
# Writes reference/kalman/data.csv, r_reference.csv and r_version.txt.
out_dir <- "reference/kalman"

long <- function(series, x) data.frame(series = series, index = seq_along(x), value = as.numeric(x))

nile <- as.numeric(datasets::Nile)                  # annual flow of the Nile at Aswan, 1871-1970
nile_gaps <- nile; nile_gaps[c(21:40, 61:80)] <- NA # stretches removed, as in the textbook example
lake <- as.numeric(datasets::LakeHuron)             # level of Lake Huron in feet, 1875-1972
gas <- log(as.numeric(datasets::UKgas))             # log UK gas consumption, quarterly 1960-1986
drivers <- log(as.numeric(datasets::UKDriverDeaths))# log UK drivers killed or seriously injured, monthly 1969-1984

data <- rbind(long("nile", nile), long("lake_huron", lake), long("log_ukgas", gas),
              long("log_ukdriverdeaths", drivers))
write.csv(data, file.path(out_dir, "data.csv"), row.names = FALSE, na = "")

rows <- list()
add <- function(case, quantity, value, index = seq_along(value))
  rows[[length(rows) + 1L]] <<- data.frame(case = case, quantity = quantity, index = index,
                                           value = as.numeric(value))

# Maximum likelihood with StructTS (its own approximate diffuse start) and
# the smoothed level from tsSmooth.
for (case in c("nile_full", "nile_gaps")) {
  y <- if (case == "nile_full") nile else nile_gaps
  fit <- StructTS(ts(y, start = 1871), type = "level")
  add(case, "structts_var_level", fit$coef[["level"]], 1L)
  add(case, "structts_var_irregular", fit$coef[["epsilon"]], 1L)
  add(case, "structts_smoothed_level", tsSmooth(fit))
}

# Smoothing at fixed variances (the published Nile estimates) with a very
# large initial variance, an approximately diffuse start.
kappa <- 1e11
for (case in c("nile_full", "nile_gaps")) {
  y <- if (case == "nile_full") nile else nile_gaps
  mod <- list(T = matrix(1), Z = 1, h = 15099, V = matrix(1469.1), a = 0,
              P = matrix(kappa), Pn = matrix(kappa))
  sm <- KalmanSmooth(y, mod, nit = 0L)
  add(case, "fixed_smoothed_level", sm$smooth[, 1])
  add(case, "fixed_smoothed_variance", sm$var[, 1, 1])
}

write.csv(do.call(rbind, rows), file.path(out_dir, "r_reference.csv"), row.names = FALSE)
writeLines(c(R.version.string, paste("kappa for fixed-variance smoothing:", kappa)),
           file.path(out_dir, "r_version.txt"))
