# Reference values for Lagbook's ARMA engine (fitArma, selectArma), computed with R's own
# `stats::arima(method = "ML")` and `stats::Box.test` on datasets that ship with R and on seeded
# `arima.sim` series. Writes tests/reference/fixtures/arma-r.json with the input series, the exact
# call behind every value and the R version, so the TypeScript tests run without R.
#
# Run from the repository root:  Rscript --vanilla tests/reference/arma.R

out_file <- "tests/reference/fixtures/arma-r.json"

source("tests/reference/to-json.R")

# --- input series ----------------------------------------------------------------------------
series <- list(
  lh = as.numeric(lh),
  LakeHuron = as.numeric(LakeHuron),
  Nile = as.numeric(Nile),
  log10.lynx = as.numeric(log10(lynx)),
  sqrt.sunspot.year = as.numeric(sqrt(sunspot.year)),
  presidents = as.numeric(presidents),
  diff.LakeHuron = as.numeric(diff(LakeHuron))
)
simulate <- function(name, seed, model, n) {
  set.seed(seed)
  series[[name]] <<- as.numeric(arima.sim(model = model, n = n))
  sprintf("set.seed(%d); arima.sim(model = %s, n = %d)", seed, paste(deparse(model), collapse = ""), n)
}
sim_calls <- list(
  sim.ar1.300 = simulate("sim.ar1.300", 101, list(ar = 0.9), 300),
  sim.ar1.2000 = simulate("sim.ar1.2000", 102, list(ar = 0.9), 2000),
  sim.ma2.300 = simulate("sim.ma2.300", 103, list(ma = c(0.5, -0.3)), 300),
  sim.ma2.2000 = simulate("sim.ma2.2000", 104, list(ma = c(0.5, -0.3)), 2000),
  sim.arma11.300 = simulate("sim.arma11.300", 105, list(ar = 0.6, ma = 0.3), 300),
  sim.arma11.2000 = simulate("sim.arma11.2000", 106, list(ar = 0.6, ma = 0.3), 2000)
)

# --- single fits -----------------------------------------------------------------------------
fit_case <- function(name, p, q, include.mean = TRUE) {
  x <- series[[name]]
  call <- sprintf("arima(x, order = c(%d, 0, %d), include.mean = %s, method = \"ML\")", p, q, include.mean)
  warned <- character(0)
  fit <- withCallingHandlers(
    arima(x, order = c(p, 0, q), include.mean = include.mean, method = "ML"),
    warning = function(w) { warned <<- c(warned, conditionMessage(w)); invokeRestart("muffleWarning") }
  )
  co <- coef(fit)
  se <- sqrt(diag(fit$var.coef))
  pick <- function(v, prefix, k) if (k == 0) numeric(0) else unname(v[paste0(prefix, seq_len(k))])
  list(
    series = name, p = p, q = q, includeMean = include.mean, call = call,
    ar = pick(co, "ar", p), ma = pick(co, "ma", q),
    mean = if (include.mean) unname(co["intercept"]) else NULL,
    seAr = pick(se, "ar", p), seMa = pick(se, "ma", q),
    seMean = if (include.mean) unname(se["intercept"]) else NULL,
    sigma2 = fit$sigma2, loglik = fit$loglik, aic = fit$aic, nobs = fit$nobs,
    optimCode = fit$code, warnings = if (length(warned)) warned else "none",
    residuals = as.numeric(residuals(fit))
  )
}
fits <- list(
  fit_case("lh", 1, 0), fit_case("lh", 3, 0), fit_case("lh", 1, 1),
  fit_case("LakeHuron", 2, 0), fit_case("LakeHuron", 1, 1),
  fit_case("Nile", 1, 1), fit_case("Nile", 0, 1),
  fit_case("log10.lynx", 2, 0), fit_case("log10.lynx", 2, 1),
  fit_case("sqrt.sunspot.year", 2, 0), fit_case("sqrt.sunspot.year", 3, 1),
  fit_case("presidents", 1, 0), fit_case("presidents", 1, 1),
  fit_case("diff.LakeHuron", 0, 1, include.mean = FALSE),
  fit_case("sim.ar1.300", 1, 0), fit_case("sim.ar1.2000", 1, 0),
  fit_case("sim.ma2.300", 0, 2), fit_case("sim.ma2.2000", 0, 2),
  fit_case("sim.arma11.300", 1, 1), fit_case("sim.arma11.2000", 1, 1),
  fit_case("sim.arma11.300", 1, 1, include.mean = FALSE),
  fit_case("sim.ar1.300", 1, 0, include.mean = FALSE)
)

# --- order selection tables (p, q <= 3, with mean) -------------------------------------------
smallest_root <- function(ar, ma) {
  m <- Inf
  if (length(ar) && any(ar != 0)) m <- min(m, Mod(polyroot(c(1, -ar))))
  if (length(ma) && any(ma != 0)) m <- min(m, Mod(polyroot(c(1, ma))))
  m
}
select_case <- function(name) {
  x <- series[[name]]
  n <- sum(!is.na(x))
  rows <- list()
  best <- NULL
  for (p in 0:3) for (q in 0:3) {
    fit <- tryCatch(suppressWarnings(arima(x, order = c(p, 0, q), method = "ML")), error = function(e) NULL)
    if (is.null(fit)) { rows[[length(rows) + 1]] <- list(p = p, q = q, loglik = NA, aicc = NA, optimCode = -1, smallestRoot = NA); next }
    k <- p + q + 2
    aicc <- -2 * fit$loglik + 2 * k + 2 * k * (k + 1) / (n - k - 1)
    co <- coef(fit)
    root <- smallest_root(co[grep("^ar", names(co))], co[grep("^ma", names(co))])
    rows[[length(rows) + 1]] <- list(p = p, q = q, loglik = fit$loglik, aicc = aicc, optimCode = fit$code, smallestRoot = if (is.finite(root)) root else NULL)
    if (fit$code == 0 && root >= 1.01 && (is.null(best) || aicc < best$aicc)) best <- list(p = p, q = q, aicc = aicc, fit = fit)
  }
  lag <- max(min(10, floor(n / 5)), best$p + best$q + 1)
  box <- Box.test(residuals(best$fit), lag = lag, type = "Ljung-Box", fitdf = best$p + best$q)
  list(
    series = name,
    call = "for p, q in 0..3: arima(x, order = c(p, 0, q), method = \"ML\"); AICc = -2 loglik + 2k + 2k(k+1)/(n-k-1), k = p + q + 2; chosen = lowest AICc with optim code 0 and every AR/MA root modulus >= 1.01",
    candidates = rows, chosenP = best$p, chosenQ = best$q,
    boxCall = sprintf("Box.test(residuals(fit), lag = %d, type = \"Ljung-Box\", fitdf = %d)", lag, best$p + best$q),
    boxStatistic = unname(box$statistic), boxDf = unname(box$parameter), boxPValue = box$p.value
  )
}
selections <- lapply(c("lh", "LakeHuron", "log10.lynx", "sim.arma11.300", "sim.ma2.300"), select_case)

doc <- list(
  generator = list(tool = R.version.string, script = "tests/reference/arma.R", packages = "stats (arima, Box.test, arima.sim)"),
  simulations = sim_calls,
  series = series,
  fits = fits,
  selections = selections
)
dir.create(dirname(out_file), showWarnings = FALSE, recursive = TRUE)
writeLines(to_json(doc), out_file)
cat("wrote", out_file, "\n")
