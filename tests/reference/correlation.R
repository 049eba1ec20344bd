# Reference values for Lagbook's correlation engine, computed with R's own `stats` package on
# datasets that ship with R. Writes tests/reference/fixtures/correlation-r.json, holding the
# series themselves, the exact call behind every value and the R version, so the TypeScript
# tests need no R at run time.
#
# Run from the repository root:  Rscript --vanilla tests/reference/correlation.R

out_file <- "tests/reference/fixtures/correlation-r.json"

# --- a minimal JSON writer (base R only; jsonlite is not assumed) -------------------------
json <- function(x) {
  if (is.null(x)) return("null")
  if (is.list(x)) {
    if (!is.null(names(x))) {
      items <- vapply(names(x), function(k) paste0(json(k), ": ", json(x[[k]])), "")
      return(paste0("{", paste(items, collapse = ", "), "}"))
    }
    return(paste0("[", paste(vapply(x, json, ""), collapse = ", "), "]"))
  }
  if (is.character(x)) {
    s <- gsub("\\\\", "\\\\\\\\", x)
    s <- gsub("\"", "\\\\\"", s)
    v <- paste0("\"", s, "\"")
    return(if (length(x) == 1L) v else paste0("[", paste(v, collapse = ", "), "]"))
  }
  if (is.logical(x) && length(x) == 1L) return(if (is.na(x)) "null" else tolower(as.character(x)))
  v <- ifelse(is.na(x), "null", sprintf("%.17g", as.numeric(x)))
  paste0("[", paste(v, collapse = ", "), "]")
}
series <- list(
  lh = as.numeric(lh),
  LakeHuron = as.numeric(LakeHuron),
  Nile = as.numeric(Nile),
  sunspot.year = as.numeric(sunspot.year),
  presidents = as.numeric(presidents),
  mdeaths = as.numeric(mdeaths),
  fdeaths = as.numeric(fdeaths),
  co2 = as.numeric(co2),
  # ccf(LakeHuron, Nile) aligns the two by time (ts.intersect): the years 1875-1970.
  LakeHuron.1875to1970 = as.numeric(window(LakeHuron, 1875, 1970)),
  Nile.1875to1970 = as.numeric(window(Nile, 1875, 1970))
)
get_series <- function(name) series[[name]]

acf_cases <- list(
  list(series = "lh", lag = 20L, type = "correlation", demean = TRUE),
  list(series = "LakeHuron", lag = 25L, type = "correlation", demean = TRUE),
  list(series = "LakeHuron", lag = 10L, type = "covariance", demean = TRUE),
  list(series = "Nile", lag = 20L, type = "correlation", demean = FALSE),
  list(series = "sunspot.year", lag = 100L, type = "correlation", demean = TRUE),
  list(series = "co2", lag = 200L, type = "correlation", demean = TRUE),
  list(series = "co2", lag = 120L, type = "covariance", demean = TRUE),
  list(series = "presidents", lag = 30L, type = "correlation", demean = TRUE),
  list(series = "presidents", lag = 12L, type = "covariance", demean = TRUE)
)
acf_out <- lapply(acf_cases, function(cs) {
  x <- get_series(cs$series)
  r <- acf(x, lag.max = cs$lag, type = cs$type, demean = cs$demean, plot = FALSE, na.action = na.pass)
  list(
    series = cs$series, maxLag = cs$lag, type = cs$type, demean = cs$demean,
    call = sprintf("acf(%s, lag.max = %d, type = \"%s\", demean = %s, plot = FALSE, na.action = na.pass)",
                   cs$series, cs$lag, cs$type, cs$demean),
    values = as.numeric(r$acf)
  )
})

default_lag <- lapply(c("lh", "sunspot.year", "co2"), function(name) {
  r <- acf(get_series(name), plot = FALSE)
  list(series = name, call = sprintf("acf(%s, plot = FALSE)", name), maxLag = length(r$acf) - 1L)
})

pacf_cases <- list(list("lh", 20L), list("LakeHuron", 20L), list("sunspot.year", 40L), list("co2", 80L), list("presidents", 20L))
pacf_out <- lapply(pacf_cases, function(cs) {
  r <- pacf(get_series(cs[[1]]), lag.max = cs[[2]], plot = FALSE, na.action = na.pass)
  list(series = cs[[1]], maxLag = cs[[2]],
       call = sprintf("pacf(%s, lag.max = %d, plot = FALSE, na.action = na.pass)", cs[[1]], cs[[2]]),
       values = as.numeric(r$acf))
})

# Bands exactly as stats:::plot.acf draws them (ci = 0.95 and 0.99).
band_cases <- list(list("lh", 20L, 0.95), list("sunspot.year", 30L, 0.95), list("LakeHuron", 15L, 0.99))
band_out <- lapply(band_cases, function(cs) {
  r <- acf(get_series(cs[[1]]), lag.max = cs[[2]], plot = FALSE)
  clim0 <- qnorm((1 + cs[[3]]) / 2) / sqrt(r$n.used)
  ma <- clim0 * sqrt(cumsum(c(1, 2 * r$acf[-1, 1, 1]^2)))
  list(series = cs[[1]], maxLag = cs[[2]], alpha = 1 - cs[[3]], n = r$n.used,
       call = sprintf("stats:::plot.acf band code on acf(%s, lag.max = %d), ci = %s", cs[[1]], cs[[2]], cs[[3]]),
       white = clim0, bartlett = ma[-length(ma)])
})

box_cases <- list(
  list("lh", "Ljung-Box", 10L, 0L), list("lh", "Box-Pierce", 10L, 0L),
  list("LakeHuron", "Ljung-Box", 5L, 2L), list("LakeHuron", "Box-Pierce", 5L, 2L),
  list("Nile", "Ljung-Box", 20L, 0L), list("sunspot.year", "Ljung-Box", 24L, 3L),
  list("presidents", "Ljung-Box", 8L, 0L), list("presidents", "Box-Pierce", 8L, 1L),
  list("mdeaths", "Ljung-Box", 1L, 0L)
)
box_out <- lapply(box_cases, function(cs) {
  x <- get_series(cs[[1]])
  r <- Box.test(x, lag = cs[[3]], type = cs[[2]], fitdf = cs[[4]])
  list(series = cs[[1]], type = cs[[2]], lag = cs[[3]], fitdf = cs[[4]],
       call = sprintf("Box.test(%s, lag = %d, type = \"%s\", fitdf = %d)", cs[[1]], cs[[3]], cs[[2]], cs[[4]]),
       statistic = unname(r$statistic), df = unname(r$parameter), pValue = r$p.value,
       pValueUpperTail = pchisq(unname(r$statistic), unname(r$parameter), lower.tail = FALSE))
})

ccf_cases <- list(list("mdeaths", "fdeaths", 15L), list("lh", "lh", 10L), list("LakeHuron.1875to1970", "Nile.1875to1970", 12L))
ccf_out <- lapply(ccf_cases, function(cs) {
  x <- get_series(cs[[1]]); y <- get_series(cs[[2]])
  r <- ccf(x, y, lag.max = cs[[3]], plot = FALSE)
  # Same values as ccf(LakeHuron, Nile, ...) on the ts objects; checked here.
  if (cs[[1]] == "LakeHuron.1875to1970") stopifnot(all.equal(as.numeric(r$acf), as.numeric(ccf(LakeHuron, Nile, lag.max = cs[[3]], plot = FALSE)$acf), tolerance = 1e-15))
  list(x = cs[[1]], y = cs[[2]], maxLag = cs[[3]],
       call = sprintf("ccf(%s, %s, lag.max = %d, plot = FALSE)", cs[[1]], cs[[2]], cs[[3]]),
       lags = as.numeric(r$lag), values = as.numeric(r$acf))
})
ccf_default <- {
  r <- ccf(series$mdeaths, series$fdeaths, plot = FALSE)
  list(call = "ccf(mdeaths, fdeaths, plot = FALSE)", maxLag = (length(r$lag) - 1L) / 2)
}

ar_cases <- list(list("lh", NULL), list("LakeHuron", NULL), list("sunspot.year", NULL), list("Nile", 8L), list("co2", 30L), list("presidents", NULL))
ar_out <- lapply(ar_cases, function(cs) {
  x <- get_series(cs[[1]])
  r <- if (is.null(cs[[2]])) ar.yw(x, na.action = na.pass) else ar.yw(x, order.max = cs[[2]], na.action = na.pass)
  list(series = cs[[1]], maxOrder = if (is.null(cs[[2]])) NULL else cs[[2]],
       call = sprintf("ar.yw(%s%s, na.action = na.pass)", cs[[1]],
                      if (is.null(cs[[2]])) "" else sprintf(", order.max = %d", cs[[2]])),
       order = r$order, orderMax = r$order.max, coefficients = as.numeric(r$ar), variance = r$var.pred,
       aic = as.numeric(r$aic), mean = r$x.mean)
})
ar_fixed <- {
  r <- ar.yw(series$lh, aic = FALSE, order.max = 3)
  list(series = "lh", call = "ar.yw(lh, aic = FALSE, order.max = 3)", order = r$order,
       coefficients = as.numeric(r$ar), variance = r$var.pred)
}

diff_cases <- list(list("co2", 1L, 1L), list("co2", 12L, 1L), list("co2", 1L, 2L), list("presidents", 4L, 2L))
diff_out <- lapply(diff_cases, function(cs) {
  list(series = cs[[1]], lag = cs[[2]], differences = cs[[3]],
       call = sprintf("diff(%s, lag = %d, differences = %d)", cs[[1]], cs[[2]], cs[[3]]),
       values = as.numeric(diff(get_series(cs[[1]]), lag = cs[[2]], differences = cs[[3]])))
})

doc <- list(
  generator = list(tool = R.version.string, script = "tests/reference/correlation.R",
                   command = "Rscript --vanilla tests/reference/correlation.R",
                   note = "Scalar values are stored as one-element arrays; NA is null."),
  series = series,
  acf = acf_out, acfDefaultLag = default_lag, pacf = pacf_out, bands = band_out,
  box = box_out, ccf = ccf_out, ccfDefaultLag = ccf_default, ar = ar_out, arFixedOrder = ar_fixed,
  diff = diff_out
)
writeLines(json(doc), out_file)
cat("wrote", out_file, "\n")
