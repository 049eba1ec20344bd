"""Second reference for Lagbook's seasonal decomposition: Python's statsmodels.

Reads the inputs of the R fixtures (tests/reference/fixtures/decomposition-{classical,stl}.json,
made by decomposition.R), runs statsmodels' seasonal_decompose and STL on the same series, prints
how far statsmodels lies from R, and writes tests/reference/fixtures/decomposition-statsmodels.json.

    /usr/bin/python3 tests/reference/decomposition.py

Use Debian's /usr/bin/python3 (package python3-statsmodels); a pyenv python earlier on PATH may
lack statsmodels.

statsmodels' STL has other defaults than R's stl, so each call passes R's resolved windows,
degrees, jumps and inner/outer passes explicitly (even windows raised to the next odd value, as
stl.f does). R's 'periodic' is run as seasonal = 10 n + 1 with degree 0 followed by the mean of
each cycle position, which is what R does. statsmodels finds the robustness scale with an exact
median, R's stl.f with a partial sort that can miss it, so robust cases may differ from R.
"""

import json
import platform
import sys
from pathlib import Path

import numpy as np
import statsmodels
from statsmodels.tsa.seasonal import STL, seasonal_decompose

FIXTURES = Path(__file__).resolve().parent / "fixtures"


def odd(window):
    window = max(3, int(window))
    return window + 1 if window % 2 == 0 else window


def as_json_list(values):
    """NaN (undefined ends of a moving average) becomes null, as in the R fixtures."""
    return [None if np.isnan(v) else float(v) for v in np.asarray(values, dtype=float)]


def classical_case(case):
    x = np.array([np.nan if v is None else v for v in case["input"]], dtype=float)
    if np.isnan(x).any():
        return None, "seasonal_decompose does not accept missing values"
    call = (
        f"seasonal_decompose(x, model={case['type']!r}, period={case['period']}, two_sided=True)"
    )
    res = seasonal_decompose(x, model=case["type"], period=case["period"], two_sided=True)
    return {
        "name": case["name"],
        "call": call,
        "period": case["period"],
        "type": case["type"],
        "input": case["input"],
        "expected": {
            "trend": as_json_list(res.trend),
            "seasonal": as_json_list(res.seasonal),
            "remainder": as_json_list(res.resid),
        },
    }, None


def stl_case(case):
    x = np.array(case["input"], dtype=float)
    period = case["period"]
    s_win, t_win, l_win = (odd(w) for w in case["windows"])
    s_deg, t_deg, l_deg = (int(d) for d in case["degrees"])
    s_jump, t_jump, l_jump = (int(j) for j in case["jumps"])
    if t_win <= period or l_win <= period:
        return None, f"statsmodels needs trend and low_pass windows above the period ({t_win}, {l_win} for {period})"
    robust = case["outer"] > 0
    kwargs = dict(
        period=period, seasonal=s_win, trend=t_win, low_pass=l_win,
        seasonal_deg=s_deg, trend_deg=t_deg, low_pass_deg=l_deg,
        seasonal_jump=s_jump, trend_jump=t_jump, low_pass_jump=l_jump, robust=robust,
    )
    fit_kwargs = dict(inner_iter=case["inner"], outer_iter=case["outer"])
    res = STL(x, **kwargs).fit(**fit_kwargs)
    seasonal = np.array(res.seasonal)
    trend = np.array(res.trend)
    periodic = case["options"].get("seasonalWindow") == "periodic"
    if periodic:
        for phase in range(period):
            seasonal[phase::period] = seasonal[phase::period].mean()
    args = ", ".join(f"{k}={v!r}" for k, v in kwargs.items())
    fit_args = ", ".join(f"{k}={v!r}" for k, v in fit_kwargs.items())
    call = f"STL(x, {args}).fit({fit_args})"
    if periodic:
        call += "; seasonal[p::period] = mean(seasonal[p::period]) for each phase p"
    weights = np.array(res.weights) if robust else np.ones_like(x)
    return {
        "name": case["name"],
        "call": call,
        "period": period,
        "options": case["options"],
        "input": case["input"],
        "expected": {
            "seasonal": as_json_list(seasonal),
            "trend": as_json_list(trend),
            "remainder": as_json_list(x - seasonal - trend),
            "weights": as_json_list(weights),
        },
    }, None


def max_diff(ours, theirs):
    a = np.array([np.nan if v is None else v for v in ours], dtype=float)
    b = np.array([np.nan if v is None else v for v in theirs], dtype=float)
    both = ~np.isnan(a) & ~np.isnan(b)
    if not np.array_equal(np.isnan(a), np.isnan(b)):
        return float("inf")
    return float(np.max(np.abs(a[both] - b[both]))) if both.any() else 0.0


def main():
    classical_r = json.loads((FIXTURES / "decomposition-classical.json").read_text())
    stl_r = json.loads((FIXTURES / "decomposition-stl.json").read_text())
    out = {
        "source": "statsmodels.tsa.seasonal (seasonal_decompose, STL)",
        "statsmodels": statsmodels.__version__,
        "numpy": np.__version__,
        "python": platform.python_version(),
        "script": "tests/reference/decomposition.py",
        "classical": [],
        "stl": [],
        "skipped": [],
    }
    print("case".ljust(46), "max |statsmodels - R| per component")
    for kind, cases, run in (("classical", classical_r["cases"], classical_case),
                             ("stl", stl_r["cases"], stl_case)):
        for case in cases:
            made, why = run(case)
            if made is None:
                out["skipped"].append({"name": case["name"], "reason": why})
                print(case["name"].ljust(46), "skipped:", why)
                continue
            out[kind].append(made)
            diffs = {k: max_diff(v, case["expected"][k]) for k, v in made["expected"].items()}
            print(case["name"].ljust(46), " ".join(f"{k}={d:.1e}" for k, d in diffs.items()))
    (FIXTURES / "decomposition-statsmodels.json").write_text(json.dumps(out, allow_nan=False))
    print(f"wrote {len(out['classical'])} classical and {len(out['stl'])} STL cases", file=sys.stderr)


if __name__ == "__main__":
    main()
