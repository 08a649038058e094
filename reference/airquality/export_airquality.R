# Exports R's `airquality` data set (package `datasets`, shipped with
# Debian's r-base-core: daily air-quality readings in New York, May to
# September 1973, as documented in ?airquality) to airquality.csv for the
# checks of `gapmark quick` on real gaps. Month and Day become an ISO 8601
# date; missing values are empty cells. Column names are lower-cased and the
# dot dropped (solar_r).
# Run from this folder:  /usr/bin/Rscript export_airquality.R
d <- datasets::airquality
date <- sprintf("1973-%02d-%02d", d$Month, d$Day)
cell <- function(x) ifelse(is.na(x), "", format(x, trim = TRUE, scientific = FALSE))
out <- data.frame(date = date, ozone = cell(d$Ozone), solar_r = cell(d$Solar.R),
                  wind = cell(d$Wind), temp = cell(d$Temp))
write.csv(out, "airquality.csv", row.names = FALSE, quote = FALSE)
writeLines(R.version.string, "r_version.txt")
