# JSON writer shared by the reference scripts in this folder (base R only): numbers with 17
# significant digits, NA/NaN as null, named lists as objects. Sourced by arma.R and forecast.R.
to_json <- function(v) {
  if (is.null(v)) return("null")
  if (is.list(v)) {
    inner <- vapply(v, to_json, character(1))
    if (is.null(names(v))) return(paste0("[", paste(inner, collapse = ","), "]"))
    return(paste0("{", paste0("\"", names(v), "\":", inner, collapse = ","), "}"))
  }
  if (is.character(v)) {
    quoted <- paste0("\"", gsub("\"", "\\\\\"", gsub("\\\\", "\\\\\\\\", v)), "\"")
    return(if (length(v) == 1L) quoted else paste0("[", paste(quoted, collapse = ","), "]"))
  }
  if (is.logical(v) && length(v) == 1L) return(if (is.na(v)) "null" else if (v) "true" else "false")
  num <- ifelse(is.na(v) | is.nan(v), "null", sprintf("%.17g", as.numeric(v)))
  paste0("[", paste(num, collapse = ","), "]")
}

