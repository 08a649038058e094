# Reference values for the arima fill method from R's stats::arima (exact ML,
# missing values by the Kalman filter) and stats::KalmanSmooth on the fitted
# model, on open data from R's datasets package with values removed.
# Run from the repository root:  /usr/bin/Rscript reference/arima/r_reference.R
# Writes reference/arima/r_reference.csv (case,quantity,index,value) and r_version.txt;
# statsmodels_reference.py then adds statsmodels' values and writes arima_reference.json.
out_dir <- "reference/arima"

remove <- function(x, idx) { x[idx] <- NA; x }
cases <- list(
  # lh: luteinizing hormone in blood samples at 10-minute intervals, 48 values (datasets::lh)
  list(name = "lh_ar1", y = remove(as.numeric(datasets::lh), c(5, 17:19, 40)), order = c(1, 0, 0),
       seasonal = c(0, 0, 0), period = 1),
  list(name = "lh_arma11", y = remove(as.numeric(datasets::lh), c(5, 17:19, 40)), order = c(1, 0, 1),
       seasonal = c(0, 0, 0), period = 1),
  # LakeHuron: level of Lake Huron in feet, 1875-1972, 98 values (datasets::LakeHuron)
  list(name = "lakehuron_ar2", y = remove(as.numeric(datasets::LakeHuron), c(1:3, 30:34, 60, 71:75)),
       order = c(2, 0, 0), seasonal = c(0, 0, 0), period = 1),
  list(name = "lakehuron_011", y = remove(as.numeric(datasets::LakeHuron), c(1:3, 30:34, 60, 71:75)),
       order = c(0, 1, 1), seasonal = c(0, 0, 0), period = 1),
  list(name = "lakehuron_111", y = remove(as.numeric(datasets::LakeHuron), c(30:34, 60, 71:75, 98)),
       order = c(1, 1, 1), seasonal = c(0, 0, 0), period = 1),
  # UKDriverDeaths, log scale: monthly UK car drivers killed or seriously injured,
  # 1969-1984, 192 values (datasets::UKDriverDeaths)
  list(name = "ukdriverdeaths_011_011", y = remove(log(as.numeric(datasets::UKDriverDeaths)),
                                                  c(2, 40:47, 100, 150:160)),
       order = c(0, 1, 1), seasonal = c(0, 1, 1), period = 12),
  list(name = "ukdriverdeaths_100_100", y = remove(log(as.numeric(datasets::UKDriverDeaths)),
                                                  c(2, 40:47, 100, 150:160)),
       order = c(1, 0, 0), seasonal = c(1, 0, 0), period = 12),
  list(name = "ukdriverdeaths_101_011", y = remove(log(as.numeric(datasets::UKDriverDeaths)),
                                                  c(1:4, 40:47, 100, 150:160, 190:192)),
       order = c(1, 0, 1), seasonal = c(0, 1, 1), period = 12)
)

rows <- list()
add <- function(case, quantity, value, index = seq_along(value))
  rows[[length(rows) + 1L]] <<- data.frame(case = case, quantity = quantity, index = index,
                                           value = as.numeric(value))
for (cs in cases) {
  y <- ts(cs$y, frequency = cs$period)
  # kappa: the prior variance of the differenced part's starting values (in
  # units of sigma^2). R's default 1e6 approximates the diffuse prior (its
  # log-likelihood is 3e-4 off on LakeHuron, levels near 580); 1e10 is within 1e-6 of the limit.
  fit <- arima(y, order = cs$order, seasonal = list(order = cs$seasonal, period = cs$period),
               method = "ML", kappa = 1e10, optim.control = list(maxit = 1000, reltol = 1e-12))
  fit_default <- arima(y, order = cs$order, seasonal = list(order = cs$seasonal, period = cs$period),
                       method = "ML", optim.control = list(maxit = 1000, reltol = 1e-12))
  add(cs$name, "loglik_default_kappa", fit_default$loglik, 1L)
  add(cs$name, "data", cs$y)
  add(cs$name, "order", c(cs$order, cs$seasonal, cs$period))
  add(cs$name, "coef", fit$coef)
  add(cs$name, "coef_names_code", match(names(fit$coef), c("ar1", "ar2", "ma1", "sar1", "sma1", "intercept")))
  add(cs$name, "loglik", fit$loglik, 1L)
  add(cs$name, "sigma2", fit$sigma2, 1L)
  mu <- if ("intercept" %in% names(fit$coef)) fit$coef[["intercept"]] else 0
  # fit$model holds the state at the end of the series (for forecasting); the
  # smoother starts from the model rebuilt at its initial state.
  m0 <- makeARIMA(fit$model$phi, fit$model$theta, fit$model$Delta, kappa = 1e6)
  sm <- KalmanSmooth(as.numeric(y) - mu, m0, nit = 0L)
  z <- m0$Z
  miss <- which(is.na(cs$y))
  add(cs$name, "smooth_index", miss)
  add(cs$name, "smooth_mean", (sm$smooth %*% z)[miss] + mu)
  add(cs$name, "smooth_var", fit$sigma2 * sapply(miss, function(t) drop(t(z) %*% sm$var[t, , ] %*% z)))
}
write.csv(do.call(rbind, rows), file.path(out_dir, "r_reference.csv"), row.names = FALSE)
writeLines(c(R.version.string, "arima(method = \"ML\", kappa = 1e10); KalmanSmooth on makeARIMA(kappa = 1e6)"),
           file.path(out_dir, "r_version.txt"))

# complete series for the KPSS statistics computed by statsmodels_reference.py
kp <- list(complete_lh = as.numeric(datasets::lh), complete_lakehuron = as.numeric(datasets::LakeHuron),
           complete_log_ukdriverdeaths = log(as.numeric(datasets::UKDriverDeaths)))
extra <- do.call(rbind, lapply(names(kp), function(k)
  data.frame(case = "kpss", quantity = k, index = seq_along(kp[[k]]), value = kp[[k]])))
write.table(extra, file.path(out_dir, "r_reference.csv"), append = TRUE, sep = ",", col.names = FALSE,
            row.names = FALSE)
