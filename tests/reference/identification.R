# Simulated ARMA series with known orders for the process-identification benchmark, and what
# forecast::auto.arima(x, d = 0, seasonal = FALSE) picks on each (the reference Lagbook's
# identifyProcess must not do worse than). Series: stats::arima.sim with set.seed, N(0, 1)
# shocks, a burn-in of R's default length (n.start). Run from the repository root:
#   Rscript --vanilla tests/reference/identification.R [reps300] [reps2000] [output]
# The committed fixture uses 20 series per process at n = 300 and 8 at n = 2,000.
suppressPackageStartupMessages(library(forecast))
args <- commandArgs(trailingOnly = TRUE)
reps300 <- if (length(args) >= 1) as.integer(args[1]) else 20L
reps2000 <- if (length(args) >= 2) as.integer(args[2]) else 8L
out <- if (length(args) >= 3) args[3] else "tests/reference/fixtures/identification-r.json"

processes <- list(
  list(name = "white noise", model = list(), p = 0, q = 0),
  list(name = "AR(1) phi = 0.6", model = list(ar = 0.6), p = 1, q = 0),
  list(name = "AR(1) phi = 0.9", model = list(ar = 0.9), p = 1, q = 0),
  list(name = "AR(2) phi = (0.5, 0.3)", model = list(ar = c(0.5, 0.3)), p = 2, q = 0),
  list(name = "MA(1) theta = 0.6", model = list(ma = 0.6), p = 0, q = 1),
  list(name = "MA(2) theta = (0.5, 0.4)", model = list(ma = c(0.5, 0.4)), p = 0, q = 2),
  list(name = "ARMA(1,1) phi = 0.7, theta = 0.4", model = list(ar = 0.7, ma = 0.4), p = 1, q = 1)
)

json_num <- function(v) paste0("[", paste(formatC(v, digits = 8, format = "g"), collapse = ","), "]")
cases <- character(0)
for (pi in seq_along(processes)) {
  pr <- processes[[pi]]
  for (n in c(300L, 2000L)) {
    reps <- if (n == 300L) reps300 else reps2000
    for (r in seq_len(reps)) {
      seed <- 1000L * pi + (if (n == 300L) 0L else 500L) + r
      set.seed(seed)
      x <- if (length(pr$model)) arima.sim(pr$model, n = n) else rnorm(n)
      fit <- auto.arima(x, d = 0, seasonal = FALSE)
      ord <- arimaorder(fit)
      cases <- c(cases, sprintf(
        '{"process":"%s","trueP":%d,"trueQ":%d,"n":%d,"seed":%d,"autoArima":{"p":%d,"q":%d},"x":%s}',
        pr$name, pr$p, pr$q, n, seed, ord[["p"]], ord[["q"]], json_num(as.numeric(x))))
    }
  }
}
writeLines(c(
  "{",
  sprintf('"generatedBy":"tests/reference/identification.R with %s, forecast %s",', R.version.string, packageVersion("forecast")),
  '"call":"set.seed(seed); x <- arima.sim(model, n) (rnorm(n) for white noise); forecast::auto.arima(x, d = 0, seasonal = FALSE)",',
  '"cases":[', paste(cases, collapse = ",\n"), "]}"), out)
cat("wrote", length(cases), "series to", out, "\n")
