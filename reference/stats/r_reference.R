# Reference values from R's stats package for the statistics in
# include/gapmark/stats/. Called by make_reference.py, which writes the input
# file; base R only (no extra packages).
#
# Input: tab-separated lines  kind  name  a  b  values  extra
#   values: comma-separated numbers (NA allowed); a, b, extra depend on kind.
# Output (stdout): tab-separated lines  name  quantity  value  (value "%.17g" or NA)
args <- commandArgs(trailingOnly = TRUE)
lines <- readLines(args[1])

emit <- function(name, quantity, value) {
  text <- if (is.na(value)) "NA" else sprintf("%.17g", value)
  cat(name, "\t", quantity, "\t", text, "\n", sep = "")
}
parse_values <- function(text) {
  if (text == "") return(numeric(0))
  as.numeric(strsplit(text, ",", fixed = TRUE)[[1]])
}

for (line in lines) {
  f <- strsplit(line, "\t", fixed = TRUE)[[1]]
  kind <- f[1]; name <- f[2]; a <- f[3]; b <- f[4]
  values <- parse_values(f[5]); extra <- f[6]
  if (kind == "friedman") {
    # a = blocks (rows), b = treatments (columns); values row-major.
    y <- matrix(values, nrow = as.integer(a), ncol = as.integer(b), byrow = TRUE)
    r <- friedman.test(y)
    emit(name, "statistic", unname(r$statistic))
    emit(name, "df", unname(r$parameter))
    emit(name, "p", r$p.value)
  } else if (kind == "wilcoxon") {
    # extra = "exact" or "normal"; the normal approximation without continuity
    # correction (correct = FALSE) to match the library's rule.
    exact <- extra == "exact"
    r <- suppressWarnings(wilcox.test(values, mu = 0, alternative = "two.sided",
                                      exact = exact, correct = FALSE))
    emit(name, "V", unname(r$statistic))
    emit(name, "p", r$p.value)
  } else if (kind == "holm") {
    adjusted <- p.adjust(values, method = "holm")
    for (i in seq_along(adjusted)) emit(name, paste0("adjusted_", i - 1), adjusted[i])
  } else if (kind == "tinterval") {
    level <- as.numeric(extra)
    r <- t.test(values, conf.level = level)
    emit(name, "low", r$conf.int[1])
    emit(name, "high", r$conf.int[2])
  } else if (kind == "qtukey") {
    # a = k, b = df ("Inf" allowed), extra = probability
    emit(name, "q", qtukey(as.numeric(extra), nmeans = as.integer(a), df = as.numeric(b)))
  } else if (kind == "ptukey") {
    # a = k, b = df, extra = q
    emit(name, "cdf", ptukey(as.numeric(extra), nmeans = as.integer(a), df = as.numeric(b)))
  } else {
    stop(paste("unknown kind", kind))
  }
}
