# Reference values for Lagbook's inference engine (trendTest, prewhitenedCcf, compareMeans),
# computed with R's `stats` and the `sandwich` package on datasets that ship with R, plus one
# seeded simulation made here with set.seed. Writes tests/reference/fixtures/inference-r.json,
# holding the series, the exact call behind every value and the versions, so the TypeScript
# tests need no R at run time.
#
# Run from the repository root:  Rscript --vanilla tests/reference/inference.R

suppressPackageStartupMessages(library(sandwich))
out_file <- "tests/reference/fixtures/inference-r.json"

# The minimal base-R JSON writer `json()` of correlation.R (jsonlite is not assumed), taken from
# that script without running the rest of it.
for (e in parse("tests/reference/correlation.R")) {
  if (is.call(e) && identical(e[[1]], as.name("<-")) && identical(e[[2]], as.name("json"))) eval(e)
}
stopifnot(is.function(json))

# A seeded transfer-function pair in the spirit of Box & Jenkins' gas-furnace example: an AR(1)
# input and a response that answers it after 3 steps with its own persistence.
set.seed(20261203)
sim_input <- as.numeric(arima.sim(list(ar = 0.7), n = 400))
sim_response <- numeric(400)
shock <- rnorm(400)
for (t in seq_along(sim_response)) {
  sim_response[t] <- (if (t > 1) 0.9 * sim_response[t - 1] else 0) +
    (if (t > 3) 0.5 * sim_input[t - 3] else 0) + shock[t]
}
# mdeaths / fdeaths with a few readings blanked out, for the na.pass path.
mdeaths_gaps <- as.numeric(mdeaths); mdeaths_gaps[c(10, 40, 41)] <- NA
fdeaths_gaps <- as.numeric(fdeaths); fdeaths_gaps[c(25, 60)] <- NA

series <- list(
  Nile = as.numeric(Nile),
  LakeHuron = as.numeric(LakeHuron),
  co2 = as.numeric(co2),
  lh = as.numeric(lh),
  presidents = as.numeric(presidents),
  mdeaths = as.numeric(mdeaths),
  fdeaths = as.numeric(fdeaths),
  mdeaths.gaps = mdeaths_gaps,
  fdeaths.gaps = fdeaths_gaps,
  # ccf(LakeHuron, Nile) aligns the two by time (ts.intersect): the years 1875-1970.
  LakeHuron.1875to1970 = as.numeric(window(LakeHuron, 1875, 1970)),
  Nile.1875to1970 = as.numeric(window(Nile, 1875, 1970)),
  sim.response = sim_response,
  sim.input = sim_input,
  # Cobb (1978, Biometrika 65:243-251): the Nile's flow drops from 1898 (Aswan dam works).
  Nile.1871to1897 = as.numeric(window(Nile, end = 1897)),
  Nile.1898to1970 = as.numeric(window(Nile, start = 1898)),
  sleep.group1 = sleep$extra[sleep$group == 1],
  sleep.group2 = sleep$extra[sleep$group == 2],
  lh.first24 = as.numeric(lh)[1:24],
  lh.last24 = as.numeric(lh)[25:48],
  # Quarterly approval ratings with NAs: t.test drops them; tau uses acf(..., na.action = na.pass).
  presidents.1945to1959 = as.numeric(window(presidents, end = c(1959, 4))),
  presidents.1960to1974 = as.numeric(window(presidents, start = 1960))
)
get_series <- function(name) series[[name]]

# --- trendTest: lm(x ~ t), t = seq_along(x), NeweyWest(prewhite = FALSE, adjust = FALSE) ---
default_lag <- function(n) floor(4 * (n / 100)^(2 / 9))
trend_cases <- list(
  list("Nile", NULL), list("Nile", 10L), list("LakeHuron", NULL), list("LakeHuron", 0L),
  list("co2", NULL), list("co2", 24L), list("lh", NULL), list("lh", 6L), list("presidents", NULL)
)
trend_out <- lapply(trend_cases, function(cs) {
  x <- get_series(cs[[1]])
  t <- seq_along(x)
  fit <- lm(x ~ t, na.action = na.omit)
  n_used <- length(residuals(fit))
  lag <- if (is.null(cs[[2]])) default_lag(n_used) else cs[[2]]
  vc <- NeweyWest(fit, lag = lag, prewhite = FALSE, adjust = FALSE)
  slope <- unname(coef(fit)[2])
  se_hac <- sqrt(vc[2, 2])
  t_hac <- slope / se_hac
  z <- qnorm(0.975)
  list(series = cs[[1]], lag = lag, lagGiven = !is.null(cs[[2]]), nonMissing = n_used,
       call = sprintf("fit <- lm(x ~ t, na.action = na.omit), t = seq_along(%s); NeweyWest(fit, lag = %d, prewhite = FALSE, adjust = FALSE)",
                      cs[[1]], lag),
       slope = slope, intercept = unname(coef(fit)[1]),
       standardErrorOls = unname(sqrt(diag(vcov(fit)))[2]),
       standardErrorHac = se_hac, standardErrorInterceptHac = sqrt(vc[1, 1]),
       tHac = t_hac, pValueHac = 2 * pnorm(-abs(t_hac)),
       interval = slope + c(-1, 1) * z * se_hac,
       intervalOls = unname(confint(fit, "t", level = 0.95)[1, ]))
})

# --- prewhitenedCcf: ar(input), filter(both), ccf(filtered response, filtered input) --------
ccf_cases <- list(
  list("mdeaths", "fdeaths", 15L), list("LakeHuron.1875to1970", "Nile.1875to1970", 12L),
  list("Nile.1875to1970", "LakeHuron.1875to1970", 12L), list("sim.response", "sim.input", 20L),
  list("mdeaths.gaps", "fdeaths.gaps", 12L)
)
ccf_out <- lapply(ccf_cases, function(cs) {
  response <- get_series(cs[[1]]); input <- get_series(cs[[2]])
  fit <- ar(input, na.action = na.pass)   # Yule-Walker, order by AIC, default order.max, demean
  phi <- as.numeric(fit$ar)
  coefs <- c(1, -phi)
  rf <- as.numeric(stats::filter(response - mean(response, na.rm = TRUE), coefs, sides = 1))
  xf <- as.numeric(stats::filter(input - mean(input, na.rm = TRUE), coefs, sides = 1))
  r <- ccf(rf, xf, lag.max = cs[[3]], plot = FALSE, na.action = na.pass)
  pairs <- sum(!is.na(rf) & !is.na(xf))
  m <- 2 * cs[[3]] + 1
  list(response = cs[[1]], input = cs[[2]], maxLag = cs[[3]],
       call = sprintf("fit <- ar(%s, na.action = na.pass); f <- c(1, -fit$ar); ccf(filter(%s - mean(%s, na.rm = TRUE), f, sides = 1), filter(%s - mean(%s, na.rm = TRUE), f, sides = 1), lag.max = %d, na.action = na.pass)",
                      cs[[2]], cs[[1]], cs[[1]], cs[[2]], cs[[2]], cs[[3]]),
       order = fit$order, coefficients = phi, variance = fit$var.pred, pairs = pairs,
       lags = as.numeric(r$lag), values = as.numeric(r$acf),
       band = qnorm(0.975) / sqrt(pairs),
       simultaneousBand = qnorm(1 - (1 - 0.95^(1 / m)) / 2) / sqrt(pairs))
})

# --- compareMeans: Welch t.test(b, a) and the effective-size interval by hand ---------------
# tau by Geyer's initial monotone sequence on R's acf (na.pass), capped as effectiveSampleSize
# documents (tau >= 1/log10(max(n, 10))); SE^2 = s^2 / nEff; Welch-Satterthwaite df on nEff.
geyer_tau <- function(x) {
  n <- sum(!is.na(x))
  r <- as.numeric(acf(x, lag.max = length(x) - 1, plot = FALSE, na.action = na.pass)$acf)
  total <- 0; previous <- Inf; m <- 0
  while (2 * m + 1 <= length(x) - 1) {
    pair <- min(r[2 * m + 1] + r[2 * m + 2], previous)   # rho_{2m} + rho_{2m+1}, 1-based
    if (pair <= 0) break
    total <- total + pair; previous <- pair; m <- m + 1
  }
  max(-1 + 2 * total, 1 / log10(max(n, 10)))
}
compare_cases <- list(
  list("Nile.1871to1897", "Nile.1898to1970"), list("sleep.group1", "sleep.group2"),
  list("lh.first24", "lh.last24"), list("presidents.1945to1959", "presidents.1960to1974")
)
compare_out <- lapply(compare_cases, function(cs) {
  a <- get_series(cs[[1]]); b <- get_series(cs[[2]])
  w <- t.test(b, a)   # Welch (var.equal = FALSE): estimate mean(b) - mean(a)
  side <- function(x) {
    tau <- geyer_tau(x)      # on the series with its gaps (na.pass), as effectiveSampleSize
    x <- x[!is.na(x)]
    list(n = length(x), mean = mean(x), sd = sd(x), tau = tau, nEff = length(x) / tau)
  }
  sa <- side(a); sb <- side(b)
  va <- sa$sd^2 / sa$nEff; vb <- sb$sd^2 / sb$nEff
  se <- sqrt(va + vb)
  df <- (va + vb)^2 / (va^2 / (sa$nEff - 1) + vb^2 / (sb$nEff - 1))
  d <- sb$mean - sa$mean
  list(a = cs[[1]], b = cs[[2]],
       call = sprintf("t.test(%s, %s)  # Welch; effective part by hand from acf(..., lag.max = n - 1)", cs[[2]], cs[[1]]),
       difference = d,
       welch = list(statistic = unname(w$statistic), df = unname(w$parameter), pValue = w$p.value,
                    interval = as.numeric(w$conf.int), standardError = unname(w$stderr)),
       effective = list(standardError = se, df = df, statistic = d / se,
                        pValue = 2 * pt(-abs(d / se), df),
                        interval = d + c(-1, 1) * qt(0.975, df) * se),
       summaryA = sa, summaryB = sb)
})

doc <- list(
  generator = list(tool = R.version.string, sandwich = as.character(packageVersion("sandwich")),
                   script = "tests/reference/inference.R",
                   command = "Rscript --vanilla tests/reference/inference.R",
                   note = "Scalar values are stored as one-element arrays; NA is null."),
  series = series, trend = trend_out, prewhitenedCcf = ccf_out, compareMeans = compare_out
)
writeLines(json(doc), out_file)
cat("wrote", out_file, "\n")
