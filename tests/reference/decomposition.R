# Reference fixtures for Lagbook's seasonal decomposition (server/analysis/decompose-classical.ts
# and server/analysis/stl.ts).
#
# Runs R's stats::decompose and stats::stl on datasets that ship with R and writes the inputs,
# the exact calls and the results as JSON, so the comparison test needs no R installed.
#
#   Rscript --vanilla tests/reference/decomposition.R
#
# Writes tests/reference/fixtures/decomposition-classical.json and decomposition-stl.json.
# Base R only (no jsonlite): numbers are written with 17 significant digits, NA as null.

out_dir <- file.path("tests", "reference", "fixtures")
dir.create(out_dir, showWarnings = FALSE, recursive = TRUE)

json_num <- function(v) {
  v <- as.numeric(v)
  paste0("[", paste(ifelse(is.na(v), "null", sprintf("%.17g", v)), collapse = ","), "]")
}
json_str <- function(s) paste0("\"", gsub("\"", "\\\\\"", s), "\"")
json_obj <- function(fields) {
  paste0("{", paste(paste0(json_str(names(fields)), ":", unlist(fields)), collapse = ","), "}")
}

r_version <- R.version.string

# Writes one fixture file: where the values come from, then the cases (JSON objects).
write_fixture <- function(file, source, cases_json, note = NULL) {
  header <- list(source = json_str(source), r = json_str(r_version),
                 script = json_str("tests/reference/decomposition.R"))
  if (!is.null(note)) header$note <- json_str(note)
  header$cases <- paste0("[", paste(cases_json, collapse = ",\n"), "]")
  writeLines(json_obj(header), file.path(out_dir, file))
}

# ---- classical moving-average decomposition -------------------------------------------------

# Series with an odd period: daily maximum temperatures (airquality$Temp, New York, May-Sep 1973)
# read with a weekly period; airquality$Ozone has 37 NAs and exercises missing values.
temp7 <- ts(airquality$Temp, frequency = 7)
ozone7 <- ts(airquality$Ozone, frequency = 7)
# Leading and trailing NAs are accepted by decompose() itself.
nottem_padded <- ts(c(NA, NA, NA, as.numeric(nottem), NA), frequency = 12)

# decompose() refuses internal NAs only through its length check (na.omit.ts stops on them);
# the computation itself (filter() gives NA where a window holds one, the figure uses
# mean(na.rm = TRUE)) is defined for them. decompose_with_na is stats::decompose unchanged
# except that its length check counts the non-missing values instead of stopping.
decompose_with_na <- stats::decompose
environment(decompose_with_na) <- list2env(
  list(na.omit = function(object, ...) object[!is.na(object)]),
  parent = asNamespace("stats")
)

classical_cases <- list(
  list(name = "co2-additive", dataset = "co2", x = co2, type = "additive",
       call = quote(decompose(co2, type = "additive"))),
  list(name = "nottem-additive", dataset = "nottem", x = nottem, type = "additive",
       call = quote(decompose(nottem, type = "additive"))),
  list(name = "airpassengers-multiplicative", dataset = "AirPassengers", x = AirPassengers,
       type = "multiplicative", call = quote(decompose(AirPassengers, type = "multiplicative"))),
  list(name = "ukdriverdeaths-multiplicative", dataset = "UKDriverDeaths", x = UKDriverDeaths,
       type = "multiplicative", call = quote(decompose(UKDriverDeaths, type = "multiplicative"))),
  list(name = "ldeaths-additive", dataset = "ldeaths", x = ldeaths, type = "additive",
       call = quote(decompose(ldeaths, type = "additive"))),
  list(name = "airquality-temp-weekly-additive", dataset = "ts(airquality$Temp, frequency = 7)",
       x = temp7, type = "additive", call = quote(decompose(temp7, type = "additive"))),
  list(name = "nottem-leading-trailing-na-additive",
       dataset = "ts(c(NA, NA, NA, as.numeric(nottem), NA), frequency = 12)", x = nottem_padded,
       type = "additive", call = quote(decompose(nottem_padded, type = "additive"))),
  list(name = "airquality-ozone-weekly-additive-with-na",
       dataset = "ts(airquality$Ozone, frequency = 7)", x = ozone7, type = "additive",
       call = quote(decompose_with_na(ozone7, type = "additive"))),
  list(name = "airquality-ozone-weekly-multiplicative-with-na",
       dataset = "ts(airquality$Ozone, frequency = 7)", x = ozone7, type = "multiplicative",
       call = quote(decompose_with_na(ozone7, type = "multiplicative")))
)

classical_json <- vapply(classical_cases, function(cs) {
  res <- eval(cs$call)
  json_obj(list(
    name = json_str(cs$name),
    dataset = json_str(cs$dataset),
    call = json_str(deparse1(cs$call)),
    period = frequency(cs$x),
    type = json_str(cs$type),
    input = json_num(cs$x),
    expected = json_obj(list(
      trend = json_num(res$trend),
      seasonal = json_num(res$seasonal),
      remainder = json_num(res$random),
      figure = json_num(res$figure)
    ))
  ))
}, character(1))

write_fixture("decomposition-classical.json", "stats::decompose", classical_json)

# ---- STL ------------------------------------------------------------------------------------

# A long period whose cycle-subseries (12 values each) are shorter than the seasonal
# window: exercises the loess branch where the span exceeds the series length.
sunspots132 <- ts(as.numeric(sunspot.month)[1:1584], frequency = 132)

stl_cases <- list(
  list(name = "co2-periodic", dataset = "co2", x = co2, args = list(s.window = "periodic")),
  list(name = "nottem-s7", dataset = "nottem", x = nottem, args = list(s.window = 7)),
  list(name = "co2-s13", dataset = "co2", x = co2, args = list(s.window = 13)),
  list(name = "ukdriverdeaths-s13-robust", dataset = "UKDriverDeaths", x = UKDriverDeaths,
       args = list(s.window = 13, robust = TRUE)),
  list(name = "airpassengers-s7-degree1-robust", dataset = "AirPassengers", x = AirPassengers,
       args = list(s.window = 7, s.degree = 1, robust = TRUE)),
  list(name = "ldeaths-periodic-robust", dataset = "ldeaths", x = ldeaths,
       args = list(s.window = "periodic", robust = TRUE)),
  list(name = "airquality-temp-weekly-s9", dataset = "ts(airquality$Temp, frequency = 7)",
       x = temp7, args = list(s.window = 9)),
  list(name = "co2-jump-heavy", dataset = "co2", x = co2,
       args = list(s.window = 35, s.jump = 9, t.window = 101, t.jump = 40,
                   l.window = 25, l.jump = 15, l.degree = 0)),
  list(name = "nottem-jumps-beyond-half-window-robust", dataset = "nottem", x = nottem,
       args = list(s.window = 9, s.jump = 7, t.window = 31, t.jump = 23, l.window = 13,
                   l.jump = 11, t.degree = 0, robust = TRUE, inner = 2, outer = 3)),
  list(name = "ldeaths-even-windows", dataset = "ldeaths", x = ldeaths,
       args = list(s.window = 8, t.window = 20, l.window = 14)),
  list(name = "sunspots-period132-s51-robust",
       dataset = "ts(as.numeric(sunspot.month)[1:1584], frequency = 132)", x = sunspots132,
       args = list(s.window = 51, robust = TRUE))
)

# R argument names -> Lagbook's stl() option names.
option_names <- c(s.window = "seasonalWindow", s.degree = "seasonalDegree", s.jump = "seasonalJump",
                  t.window = "trendWindow", t.degree = "trendDegree", t.jump = "trendJump",
                  l.window = "lowpassWindow", l.degree = "lowpassDegree", l.jump = "lowpassJump",
                  robust = "robust", inner = "inner", outer = "outer")
json_value <- function(v) {
  if (length(v) == 1 && is.na(v)) "null" else if (is.character(v)) json_str(v) else if (is.logical(v)) tolower(as.character(v)) else format(v)
}

# R's stl.f finds the median absolute residual with a partial sort (psort) that does not
# always return the middle order statistics; Lagbook uses the exact median. For every robust
# case, rerun with outer = 1, 2, ... and check each pass's weights against the bisquare of the
# exact median of the previous pass's residuals. A periodic fit is rerun with its numeric
# equivalent (s.window = 10 n + 1, s.degree = 0), whose residuals are the ones the weights
# were computed from (R only averages the periodic seasonal afterwards).
median_exact_in_r <- function(x, args) {
  if (!isTRUE(args$robust)) return(NA)
  outer <- if (is.null(args$outer)) 15 else args$outer
  if (identical(args$s.window, "periodic")) args$s.window <- 10 * length(x) + 1
  run <- function(o) { a <- args; a$outer <- o; do.call(stl, c(list(x), a)) }
  previous <- run(0)
  for (o in seq_len(outer)) {
    current <- run(o)
    r <- abs(previous$time.series[, "remainder"])
    scale <- 6 * median(r)
    # stl.f's cut-offs 0.001 and 0.999 are single-precision literals promoted to double.
    w <- ifelse(r <= 0.0010000000474974513 * scale, 1,
                ifelse(r <= 0.99900001287460327 * scale, (1 - (r / scale)^2)^2, 0))
    if (max(abs(w - current$weights)) > 1e-9) return(FALSE)
    previous <- current
  }
  TRUE
}

stl_json <- vapply(stl_cases, function(cs) {
  plain <- make.names(cs$dataset) == cs$dataset
  symbol <- as.name(if (plain) cs$dataset else "y")
  y <- cs$x
  call <- as.call(c(quote(stl), symbol, cs$args))
  res <- eval(call)
  call_text <- if (plain) deparse1(call) else paste0("y <- ", cs$dataset, "; ", deparse1(call))
  ts_ <- res$time.series
  options <- lapply(cs$args, json_value)
  names(options) <- option_names[names(cs$args)]
  json_obj(list(
    name = json_str(cs$name),
    dataset = json_str(cs$dataset),
    call = json_str(call_text),
    period = frequency(cs$x),
    options = json_obj(options),
    windows = json_num(res$win),
    degrees = json_num(res$deg),
    jumps = json_num(res$jump),
    inner = res$inner,
    outer = res$outer,
    medianExactInR = json_value(median_exact_in_r(cs$x, cs$args)),
    input = json_num(cs$x),
    expected = json_obj(list(
      seasonal = json_num(ts_[, "seasonal"]),
      trend = json_num(ts_[, "trend"]),
      remainder = json_num(ts_[, "remainder"]),
      weights = json_num(res$weights)
    ))
  ))
}, character(1))

write_fixture(
  "decomposition-stl.json", "stats::stl (netlib stl.f)", stl_json,
  note = paste(
    "medianExactInR is false where R's partial sort returned a wrong median in some robustness",
    "pass; Lagbook uses the exact median, so those cases are compared with statsmodels instead.")
)

cat("wrote", length(classical_cases), "classical and", length(stl_cases), "STL cases to", out_dir, "\n")
