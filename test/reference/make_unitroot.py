"""Reference for src/core/diagnostics/unitroot/: ADF, KPSS, Phillips-Perron and MacKinnon values.

Datasets shipped with statsmodels:
  - Nile: annual Nile flow at Aswan, 1871-1970 (`statsmodels.datasets.nile`, 100 values);
  - sunspots: yearly sunspot activity, 1700-2008 (`statsmodels.datasets.sunspots`, 309 values);
  - lgdp: log real GDP from the quarterly US macrodata (`statsmodels.datasets.macrodata`, 203);
  - co2: the weekly Mauna Loa CO2 series (`statsmodels.datasets.co2`), resampled to one value
    a week (weeks ending Sunday) with its gaps filled by linear interpolation; the exact series
    used is written into the fixture, so the TypeScript side never repeats the resampling.

ADF: `statsmodels.tsa.stattools.adfuller` for regression n/c/ct, autolag AIC/BIC/t-stat with
maxlag given as Schwert's (1989) floor(12 (n/100)^(1/4)) (statsmodels' own default rounds up,
so it is passed explicitly), and with fixed lags (autolag=None).
KPSS: `statsmodels.tsa.stattools.kpss` for c/ct with nlags = floor(12 (n/100)^(1/4)) and with
given lags.
Phillips-Perron: statsmodels has no PP test, so Z(alpha) and Z(t) are assembled here from
statsmodels OLS pieces in the form of Phillips & Perron (1988): the residualised lagged level
(Frisch-Waugh, a separate OLS of y_{t-1} on the deterministic terms) gives the sum
sum(y~_{t-1}^2), and the long-run variance uses Bartlett weights (Newey & West 1987).
MacKinnon: `statsmodels.tsa.adfvalues.mackinnonp` on a grid of tau and `mackinnoncrit` on a
grid of sample sizes, for N = 1.
"""
import math
import warnings

import numpy as np
import pandas as pd
import statsmodels.api as sm
from statsmodels.tsa.adfvalues import mackinnoncrit, mackinnonp
from statsmodels.tsa.stattools import adfuller, kpss


def datasets():
    from statsmodels.datasets import co2, macrodata, nile, sunspots
    out = {
        "nile": nile.load_pandas().data["volume"].to_numpy(dtype=float),
        "sunspots": sunspots.load_pandas().data["SUNACTIVITY"].to_numpy(dtype=float),
        "lgdp": np.log(macrodata.load_pandas().data["realgdp"].to_numpy(dtype=float)),
    }
    c = co2.load_pandas().data["co2"]
    weekly = c.resample("W").mean().interpolate(method="linear")
    out["co2"] = weekly.to_numpy(dtype=float)
    return out


def schwert(n):
    return int(math.floor(12.0 * (n / 100.0) ** 0.25))


def adf_cases(name, y):
    cases = []
    maxlag = schwert(len(y))
    for reg in ["n", "c", "ct"]:
        for autolag in ["AIC", "BIC", "t-stat"]:
            stat, p, usedlag, nobs, crit, icbest = adfuller(y, maxlag=maxlag, regression=reg, autolag=autolag)
            cases.append({"dataset": name, "regression": reg, "autolag": autolag, "maxlag": maxlag,
                          "stat": stat, "pvalue": p, "usedlag": usedlag, "nobs": nobs,
                          "crit": [crit["1%"], crit["5%"], crit["10%"]], "icbest": icbest})
        for lags in [0, 4]:
            stat, p, usedlag, nobs, crit = adfuller(y, maxlag=lags, regression=reg, autolag=None)
            cases.append({"dataset": name, "regression": reg, "autolag": None, "maxlag": lags,
                          "stat": stat, "pvalue": p, "usedlag": usedlag, "nobs": nobs,
                          "crit": [crit["1%"], crit["5%"], crit["10%"]]})
    return cases


def kpss_cases(name, y):
    cases = []
    for reg in ["c", "ct"]:
        for lags in [schwert(len(y)), 0, 3]:
            with warnings.catch_warnings():
                warnings.simplefilter("ignore")  # "p-value is outside the table" notices
                stat, p, used, crit = kpss(y, regression=reg, nlags=lags)
            cases.append({"dataset": name, "regression": reg, "nlags": lags, "stat": stat,
                          "pvalue": p, "usedlags": used,
                          "crit": [crit["10%"], crit["5%"], crit["2.5%"], crit["1%"]]})
    return cases


def pp_case(name, y, reg, lags):
    """Phillips & Perron (1988): regress y_t on the deterministic terms and y_{t-1}, t = 2..n."""
    yt = y[1:]
    ylag = y[:-1]
    T = len(yt)
    if reg == "n":
        det = np.zeros((T, 0))
    elif reg == "c":
        det = np.ones((T, 1))
    else:
        det = np.column_stack([np.ones(T), np.arange(1, T + 1) - T / 2.0])
    X = np.column_stack([det, ylag])
    res = sm.OLS(yt, X).fit()
    rho = res.params[-1]
    t_rho = (rho - 1.0) / res.bse[-1]
    u = res.resid
    # S^2 = T^-1 sum u^2 and the Bartlett-weighted long-run variance S^2_Tl.
    s2 = np.dot(u, u) / T
    lrv = s2
    for j in range(1, lags + 1):
        lrv += 2.0 * (1.0 - j / (lags + 1.0)) * np.dot(u[j:], u[:-j]) / T
    # sum of the lagged level residualised on the deterministic terms (Frisch-Waugh).
    if det.shape[1] == 0:
        ytil = ylag
    else:
        ytil = sm.OLS(ylag, det).fit().resid
    m = np.dot(ytil, ytil) / T ** 2
    z_alpha = T * (rho - 1.0) - 0.5 * (lrv - s2) / m
    z_t = math.sqrt(s2 / lrv) * t_rho - 0.5 * (lrv - s2) / (math.sqrt(lrv) * math.sqrt(m))
    return {"dataset": name, "regression": reg, "lags": lags, "nobs": T, "rho": rho,
            "t_rho": t_rho, "s2": s2, "lrv": lrv, "z_alpha": z_alpha, "z_t": z_t,
            "z_t_pvalue": mackinnonp(z_t, regression=reg, N=1),
            "crit": mackinnoncrit(N=1, regression=reg, nobs=T)}


def pp_cases(name, y):
    T = len(y) - 1
    rule = int(math.floor(4.0 * (T / 100.0) ** (2.0 / 9.0)))
    return [pp_case(name, y, reg, lags) for reg in ["n", "c", "ct"] for lags in [rule, 0, 8]]


def mackinnon_grid():
    taus = np.round(np.arange(-20.0, 3.01, 0.1), 10)
    # Points near the published cut-offs (tau_min, tau_star, tau_max) as well.
    extra = [-19.04, -18.83, -16.18, -1.04, -1.61, -2.89, 1.51, 2.74, 0.7]
    taus = np.concatenate([taus, np.array(extra) + 1e-9, np.array(extra) - 1e-9])
    pvals = {reg: [mackinnonp(float(t), regression=reg, N=1) for t in taus] for reg in ["n", "c", "ct"]}
    sizes = [10, 25, 50, 100, 250, 500, 1000, 5000]
    crit = {reg: [mackinnoncrit(N=1, regression=reg, nobs=T) for T in sizes] for reg in ["n", "c", "ct"]}
    asym = {reg: mackinnoncrit(N=1, regression=reg, nobs=np.inf) for reg in ["n", "c", "ct"]}
    return {"taus": taus, "pvalues": pvals, "sizes": sizes, "crit": crit, "crit_asymptotic": asym}


def build():
    data = datasets()
    adf, kp, pp = [], [], []
    for name, y in data.items():
        adf += adf_cases(name, y)
        kp += kpss_cases(name, y)
        pp += pp_cases(name, y)
    return {
        "unitroot_series.json": {k: v for k, v in data.items()},
        "unitroot_adf.json": adf,
        "unitroot_kpss.json": kp,
        "unitroot_pp.json": pp,
        "unitroot_mackinnon.json": mackinnon_grid(),
    }
