"""Cross-checks of Lagbook's correlation engine against statsmodels (Debian's python3-statsmodels).

Reads the series that tests/reference/correlation.R stored (datasets that ship with R), computes
statsmodels' ACF, PACF, CCF, Ljung-Box/Box-Pierce and ADF values, and writes
tests/reference/fixtures/correlation-statsmodels.json with the series, every call and the
library versions.

Run from the repository root, after correlation.R:  /usr/bin/python3 tests/reference/correlation.py
"""
import json

import numpy as np
import scipy
import statsmodels
from statsmodels.stats.diagnostic import acorr_ljungbox
from statsmodels.tsa.stattools import acf, adfuller, ccf, pacf

SOURCE = "tests/reference/fixtures/correlation-r.json"
OUT = "tests/reference/fixtures/correlation-statsmodels.json"

with open(SOURCE) as f:
    r_series = json.load(f)["series"]
names = ["lh", "LakeHuron", "Nile", "sunspot.year", "mdeaths", "fdeaths", "co2", "LakeHuron.1875to1970", "Nile.1875to1970"]
series = {name: np.array(r_series[name], dtype=float) for name in names}


def floats(values):
    return [float(v) for v in np.asarray(values).ravel()]


acf_out = []
for name, lags, use_fft in [("lh", 20, False), ("sunspot.year", 100, True), ("co2", 200, True), ("Nile", 30, False)]:
    values = acf(series[name], nlags=lags, adjusted=False, fft=use_fft, missing="none")
    acf_out.append({
        "series": name, "maxLag": lags,
        "call": f"acf({name}, nlags={lags}, adjusted=False, fft={use_fft})",
        "values": floats(values),
    })

pacf_out = []
for name, lags in [("lh", 20), ("sunspot.year", 40), ("LakeHuron", 20)]:
    values = pacf(series[name], nlags=lags, method="ldb")
    pacf_out.append({
        "series": name, "maxLag": lags,
        "call": f"pacf({name}, nlags={lags}, method='ldb')",
        "values": floats(values[1:]),
    })

# statsmodels' ccf(x, y)[k] = corr(x[t+k], y[t]) for k >= 0 (R's positive lags).
ccf_out = []
for x, y, lags in [("mdeaths", "fdeaths", 15), ("LakeHuron.1875to1970", "Nile.1875to1970", 12)]:
    values = ccf(series[x], series[y], adjusted=False)[: lags + 1]
    ccf_out.append({
        "x": x, "y": y, "maxLag": lags,
        "call": f"ccf({x}, {y}, adjusted=False)[:{lags + 1}]",
        "values": floats(values),
    })

box_out = []
for name, lag in [("lh", 10), ("Nile", 20), ("sunspot.year", 24)]:
    table = acorr_ljungbox(series[name], lags=[lag], boxpierce=True, return_df=True)
    box_out.append({
        "series": name, "lag": lag,
        "call": f"acorr_ljungbox({name}, lags=[{lag}], boxpierce=True)",
        "ljungBox": {"statistic": float(table["lb_stat"].iloc[0]), "pValue": float(table["lb_pvalue"].iloc[0])},
        "boxPierce": {"statistic": float(table["bp_stat"].iloc[0]), "pValue": float(table["bp_pvalue"].iloc[0])},
    })

adf_out = []
for name, lags in [("LakeHuron", 2), ("Nile", 4), ("co2", 13), ("sunspot.year", 9)]:
    stat, _, used, nobs, crit = adfuller(series[name], maxlag=lags, autolag=None, regression="c")
    adf_out.append({
        "series": name, "lags": lags,
        "call": f"adfuller({name}, maxlag={lags}, autolag=None, regression='c')",
        "statistic": float(stat), "nobs": int(nobs),
        "criticalValues": {k: float(v) for k, v in crit.items()},
    })

doc = {
    "generator": {
        "tool": f"statsmodels {statsmodels.__version__}, numpy {np.__version__}, scipy {scipy.__version__}",
        "script": "tests/reference/correlation.py",
        "command": "/usr/bin/python3 tests/reference/correlation.py",
        "seriesFrom": "datasets shipped with R, as stored by tests/reference/correlation.R",
    },
    "series": {name: floats(values) for name, values in series.items()},
    "acf": acf_out, "pacf": pacf_out, "ccf": ccf_out, "box": box_out, "adf": adf_out,
}
with open(OUT, "w") as f:
    json.dump(doc, f, indent=1)
print("wrote", OUT)
