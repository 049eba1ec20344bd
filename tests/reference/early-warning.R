# Reference values for Lagbook's early-warning projection (server/services/alerts/early-warning/
# project-crossing.ts): forecasting by decomposition as R does it by hand — the seasonal part taken
# off with `stl(x, "periodic", robust = TRUE)` and continued by repeating its last cycle, an ARMA model fitted to
# what remains with `arima(…, method = "ML")`, the projection `predict(fit, n.ahead = h)` plus the
# continued seasonal part, and the 80 % band pred ± qnorm(0.9) · se. Without a cycle the ARMA is
# fitted to the series itself. The chance of passing a limit within the horizon comes from R's own
# simulated future paths (forecast 8.20 `simulate(fit, nsim = h, future = TRUE)`, 20,000 paths),
# plus the continued seasonal part. Cases with d = 1 fit `arima(…, order = c(p, 1, q))`: the
# level's changes are modelled and the projection starts from the last value.
#
# Datasets (all ship with R's `datasets` package): nottem (monthly air temperatures at Nottingham,
# 1920–1939, °F; a yearly cycle of 12 steps), ldeaths (monthly UK lung-disease deaths, 12 steps),
# LakeHuron (yearly lake level, ft), Nile (yearly flow), nhtemp (yearly mean temperature in New
# Haven, °F). Writes tests/reference/fixtures/early-warning-r.json.
#
# Run from the repository root:  Rscript --vanilla tests/reference/early-warning.R

out_file <- "tests/reference/fixtures/early-warning-r.json"
source("tests/reference/to-json.R")
suppressMessages(library(forecast))

LEVEL <- 0.8
case <- function(name, x, period, p, q, h, limit, side, d = 0) {
  x <- as.numeric(x)
  n <- length(x)
  if (period > 0) {
    s <- stl(ts(x, frequency = period), "periodic", robust = TRUE)
    seasonal <- as.numeric(s$time.series[, "seasonal"])
    cont <- seasonal[n - period + ((seq_len(h) - 1) %% period) + 1]
  } else {
    seasonal <- rep(0, n)
    cont <- rep(0, h)
  }
  adj <- x - seasonal
  fit <- suppressWarnings(arima(adj, order = c(p, d, q), method = "ML"))
  pr <- predict(fit, n.ahead = h)
  z <- qnorm(0.5 + LEVEL / 2)
  set.seed(4242)
  paths <- replicate(20000, as.numeric(simulate(fit, nsim = h, future = TRUE)) + cont)
  if (is.null(dim(paths))) paths <- matrix(paths, nrow = 1)
  crossed <- if (side == "high") apply(paths, 2, max) > limit else apply(paths, 2, min) < limit
  co <- coef(fit)
  pick <- function(prefix, k) if (k == 0) numeric(0) else unname(co[paste0(prefix, seq_len(k))])
  list(
    name = name, period = period, p = p, d = d, q = q, h = h, limit = limit, side = side, level = LEVEL,
    call = sprintf(
      "%sfit <- arima(%s, order = c(%d, %d, %d), method = \"ML\"); predict(fit, n.ahead = %d)$pred + continued seasonal; ± qnorm(%.1f) * se; set.seed(4242); 20000 x simulate(fit, nsim = %d, future = TRUE)",
      if (period > 0) sprintf("s <- stl(ts(x, frequency = %d), \"periodic\", robust = TRUE); ", period) else "",
      if (period > 0) "x - seasonal(s)" else "x", p, d, q, h, 0.5 + LEVEL / 2, h
    ),
    x = x, seasonal = seasonal, continued = cont,
    ar = pick("ar", p), ma = pick("ma", q), mean = if (d == 0) unname(co["intercept"]) else 0, sigma2 = fit$sigma2, optimCode = fit$code,
    pred = as.numeric(pr$pred) + cont, se = as.numeric(pr$se),
    lower = as.numeric(pr$pred) + cont - z * as.numeric(pr$se),
    upper = as.numeric(pr$pred) + cont + z * as.numeric(pr$se),
    chance = mean(crossed), draws = 20000
  )
}

cases <- list(
  case("nottem", nottem, 12, 1, 0, 8, 62, "high"),
  case("nottem", nottem, 12, 1, 1, 6, 37, "low"),
  case("ldeaths", ldeaths, 12, 1, 0, 6, 2900, "high"),
  case("LakeHuron", LakeHuron, 0, 2, 0, 10, 580.5, "high"),
  case("Nile", Nile, 0, 1, 1, 8, 700, "low"),
  case("nhtemp", nhtemp, 0, 1, 0, 5, 52, "high"),
  # d = 1: the level's changes modelled (no mean), the level carried from its last value
  case("nottem", nottem, 12, 0, 1, 6, 60, "high", d = 1),
  case("LakeHuron", LakeHuron, 0, 1, 0, 10, 577, "low", d = 1),
  case("Nile", Nile, 0, 1, 1, 8, 1000, "high", d = 1),
  case("nhtemp", nhtemp, 0, 0, 1, 5, 52, "high", d = 1)
)

doc <- list(
  generator = list(tool = R.version.string, script = "tests/reference/early-warning.R",
                   packages = sprintf("stats (stl, arima, predict.Arima), forecast %s (simulate.Arima)", as.character(packageVersion("forecast")))),
  cases = cases
)
writeLines(to_json(doc), out_file)
cat("wrote", out_file, "\n")
