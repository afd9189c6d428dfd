#!/usr/bin/python3
"""Peer timing for the SARIMA benchmark: statsmodels SARIMAX on the model Fairlead fits.

Reads one JSON object from stdin:
    {"y": [...], "order": [p,d,q], "seasonal": [P,D,Q,s], "exog": [[col], ...] or [], "repeats": k}
and prints one JSON line:
    {"peer": "statsmodels SARIMAX <version>", "median_seconds": x, "llf": x, "nobs": n,
     "params": {name: value}}

The model is the one test/reference/make_sarima.py builds: SARIMAX(simple_differencing=True,
trend='n', enforce_stationarity=True, enforce_invertibility=True), exog given on the level
scale (statsmodels differences it with y when simple_differencing=True), Kalman filter
steady-state shortcut off (ssm.tolerance = 0). The fit is make_sarima.py's too: L-BFGS
(pgtol 1e-9, factr 10) with sigma2 concentrated out, then on the full parameter vector started
there, keeping the better of the two. seasonal with P = D = Q = 0 means no seasonal part,
whatever s is. Exog columns are named x1..xk in "params".
"""
import json
import statistics
import sys
import time
import warnings

import numpy as np
import pandas as pd
import statsmodels
from statsmodels.tsa.statespace.sarimax import SARIMAX

LBFGS = dict(method="lbfgs", maxiter=5000, disp=False, pgtol=1e-9, factr=10.0)


def build(y, X, order, seasonal, **extra):
    model = SARIMAX(y, exog=X, order=order, seasonal_order=seasonal, trend="n",
                    simple_differencing=True, enforce_stationarity=True,
                    enforce_invertibility=True, **extra)
    model.ssm.tolerance = 0.0
    return model


def fit_once(y, X, order, seasonal):
    # Timed: construction of both models and both fits (construction is a few ms).
    t0 = time.perf_counter()
    conc = build(y, X, order, seasonal, concentrate_scale=True).fit(**LBFGS)
    model = build(y, X, order, seasonal)
    start = np.r_[np.asarray(conc.params, dtype=float), conc.scale]
    full = model.fit(start_params=start, **LBFGS)
    seconds = time.perf_counter() - t0
    # Not timed: pick the better of the two (the concentrated optimum can be the better one).
    llf_start = float(model.loglike(start))
    params = np.asarray(full.params, dtype=float) if full.llf >= llf_start else start
    return seconds, model, params, max(float(full.llf), llf_start)


def main():
    spec = json.load(sys.stdin)
    y = np.asarray(spec["y"], dtype=float)
    order = tuple(int(v) for v in spec["order"])
    P, D, Q, s = (int(v) for v in spec.get("seasonal", [0, 0, 0, 0]))
    seasonal = (P, D, Q, s) if (P or D or Q) else (0, 0, 0, 0)
    exog = spec.get("exog") or []
    # Named frame: with a bare array statsmodels calls a column that is constant after
    # differencing (a drift) 'const' instead of x1.
    X = (pd.DataFrame(np.column_stack([np.asarray(c, dtype=float) for c in exog]),
                      columns=["x%d" % (i + 1) for i in range(len(exog))]) if exog else None)
    repeats = max(1, int(spec.get("repeats", 3)))

    times = []
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")  # convergence chatter would not be JSON
        for _ in range(repeats):
            seconds, model, params, llf = fit_once(y, X, order, seasonal)
            times.append(seconds)
    res = model.filter(params)
    out = {
        "peer": "statsmodels SARIMAX %s" % statsmodels.__version__,
        "median_seconds": statistics.median(times),
        "llf": float(res.llf),
        "nobs": int(res.nobs - res.loglikelihood_burn),
        "params": {name: float(v) for name, v in zip(model.param_names, params)},
    }
    sys.stdout.write(json.dumps(out) + "\n")


if __name__ == "__main__":
    main()
