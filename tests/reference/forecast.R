# Reference values for Lagbook's ARMA forecasts (forecastArma), computed with R's own
# `stats::predict(arima(x, order, method = "ML"), n.ahead = h)` on datasets that ship with R and
# a seeded `arima.sim` series. Writes tests/reference/fixtures/forecast-r.json with the input
# series, the exact call behind every value, the fitted coefficients and sigma2 (so the
# recursion can be checked on R's own parameters) and the R version, so the TypeScript tests run
# without R.
#
# Run from the repository root:  Rscript --vanilla tests/reference/forecast.R

out_file <- "tests/reference/fixtures/forecast-r.json"

source("tests/reference/to-json.R")

series <- list(
  lh = as.numeric(lh),
  LakeHuron = as.numeric(LakeHuron),
  Nile = as.numeric(Nile),
  log10.lynx = as.numeric(log10(lynx)),
  presidents = as.numeric(presidents)
)
set.seed(207)
series$sim.arma21.500 <- as.numeric(arima.sim(model = list(ar = c(1.2, -0.4), ma = 0.5), n = 500)) + 10
sim_call <- "set.seed(207); arima.sim(model = list(ar = c(1.2, -0.4), ma = 0.5), n = 500) + 10"

H <- 24
forecast_case <- function(name, p, q) {
  x <- series[[name]]
  fit <- suppressWarnings(arima(x, order = c(p, 0, q), method = "ML"))
  pr <- predict(fit, n.ahead = H)
  co <- coef(fit)
  pick <- function(prefix, k) if (k == 0) numeric(0) else unname(co[paste0(prefix, seq_len(k))])
  list(
    series = name, p = p, q = q,
    call = sprintf("predict(arima(x, order = c(%d, 0, %d), method = \"ML\"), n.ahead = %d)", p, q, H),
    ar = pick("ar", p), ma = pick("ma", q), mean = unname(co["intercept"]), sigma2 = fit$sigma2,
    loglik = fit$loglik, optimCode = fit$code,
    pred = as.numeric(pr$pred), se = as.numeric(pr$se)
  )
}
cases <- list(
  forecast_case("lh", 1, 0), forecast_case("lh", 3, 0), forecast_case("lh", 1, 1),
  forecast_case("LakeHuron", 2, 0), forecast_case("LakeHuron", 1, 1),
  forecast_case("Nile", 1, 1),
  forecast_case("log10.lynx", 2, 0),
  forecast_case("presidents", 1, 0), forecast_case("presidents", 1, 1),
  forecast_case("sim.arma21.500", 2, 1)
)

# --- chance of crossing a limit within a horizon, by R's own simulated future paths ------------
# forecast 8.20's simulate.Arima(fit, nsim = h, future = TRUE) draws one future path conditional
# on the data; the share of 20,000 paths whose maximum (minimum) passes the limit is R's estimate,
# with Monte Carlo standard error sqrt(p (1 - p) / 20000). AR models only: for them the path is
# conditioned on the last p values exactly, as a Kalman filter does.
suppressMessages(library(forecast))
crossing_case <- function(name, p, limit, side, steps) {
  x <- series[[name]]
  fit <- suppressWarnings(arima(x, order = c(p, 0, 0), method = "ML"))
  set.seed(4242)
  paths <- replicate(20000, as.numeric(simulate(fit, nsim = steps, future = TRUE)))
  if (is.null(dim(paths))) paths <- matrix(paths, nrow = 1)
  crossed <- if (side == "above") apply(paths, 2, max) > limit else apply(paths, 2, min) < limit
  list(
    series = name, p = p, limit = limit, side = side, steps = steps,
    call = sprintf("set.seed(4242); replicate(20000, simulate(arima(x, order = c(%d, 0, 0), method = \"ML\"), nsim = %d, future = TRUE)); share %s %s", p, steps, if (side == "above") "max >" else "min <", format(limit)),
    chance = mean(crossed), draws = 20000,
    # exact chance of crossing at the first step: the normal tail of the one-step forecast
    oneStepExact = { pr <- predict(fit, n.ahead = 1); if (side == "above") pnorm(limit, pr$pred[1], pr$se[1], lower.tail = FALSE) else pnorm(limit, pr$pred[1], pr$se[1]) },
    ar = unname(coef(fit)[paste0("ar", seq_len(p))]), mean = unname(coef(fit)["intercept"]), sigma2 = fit$sigma2
  )
}
crossings <- list(
  crossing_case("lh", 1, 3.2, "above", 6),
  crossing_case("lh", 3, 1.8, "below", 12),
  crossing_case("LakeHuron", 2, 581, "above", 8),
  crossing_case("log10.lynx", 2, 2.2, "below", 10),
  crossing_case("sim.arma21.500", 2, 12, "above", 1)
)

doc <- list(
  generator = list(tool = R.version.string, script = "tests/reference/forecast.R", packages = "stats (arima, predict.Arima, arima.sim)"),
  simulation = sim_call,
  horizon = H,
  series = series,
  cases = cases,
  forecastPackage = as.character(packageVersion("forecast")),
  crossings = crossings
)
writeLines(to_json(doc), out_file)
cat("wrote", out_file, "\n")
