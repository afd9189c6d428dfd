"""Reference for src/core/diagnostics/residuals/: statsmodels 0.13 correlogram and tests.

Outside reference only: statsmodels is called here, never read or ported.

- `statsmodels.tsa.stattools.acf` (adjusted=False, i.e. denominators n; fft=False, the direct
  sums of the definition) to 60 lags, with `alpha=0.05`, whose confint is Bartlett's (1946)
  band centred on the estimate, so half-width = confint[:, 1] - acf.
- `statsmodels.tsa.stattools.pacf` with method "ldb" ("Levinson-Durbin recursion without bias
  correction", statsmodels 0.13 docs): Durbin-Levinson on the biased (denominator n) sample
  ACF, the Yule-Walker estimator. Method "ywm" (Yule-Walker without adjustment) solves the
  same equations directly; the maker checks the two agree and records the largest gap.
  statsmodels refuses PACF lags at or beyond half the sample, so PACF lags = min(60, n//2 - 1).
- `statsmodels.stats.diagnostic.acorr_ljungbox` at lags 1..30, with and without `model_df`
  (NaN p-values where lag <= model_df, as statsmodels returns them).
- `statsmodels.stats.stattools.jarque_bera`: (JB, p, skewness, kurtosis).

Datasets shipped with statsmodels: Nile (annual flow, n = 100), yearly sunspots (n = 309),
log-differenced real GDP from macrodata (n = 202), and the Mauna Loa weekly CO2 record
resampled to weeks ending Saturday, gaps filled by linear interpolation in time, then
first-differenced (n = 2283). Each series is stored as used, so the tests need no Python.

A white-noise size study: R replications of n Gaussian draws from numpy's legacy
RandomState (which src/core/math/rng.ts reproduces draw for draw), with the number of
Ljung-Box rejections at 5% with m = 10 lags as statsmodels computes it.
"""
import numpy as np
from statsmodels.datasets import co2, macrodata, nile, sunspots
from statsmodels.stats.diagnostic import acorr_ljungbox
from statsmodels.stats.stattools import jarque_bera
from statsmodels.tsa.stattools import acf, pacf

ACF_LAGS = 60
LB_LAGS = 30
ALPHA = 0.05

SIZE_SEED = 20260417
SIZE_R = 500
SIZE_N = 200
SIZE_LAGS = 10


def series():
    out = {}
    out["nile"] = nile.load_pandas().data["volume"].to_numpy(dtype=float)
    out["sunspots"] = sunspots.load_pandas().data["SUNACTIVITY"].to_numpy(dtype=float)
    gdp = macrodata.load_pandas().data["realgdp"].to_numpy(dtype=float)
    out["gdp_dlog"] = np.diff(np.log(gdp))
    c = co2.load_pandas().data["co2"]
    weekly = c.resample("W-SAT").mean().interpolate(method="time")
    out["co2_weekly_diff"] = np.diff(weekly.to_numpy(dtype=float))
    return out


def one(name, y, model_df):
    n = len(y)
    r, conf = acf(y, nlags=ACF_LAGS, adjusted=False, fft=False, alpha=ALPHA)
    plags = min(ACF_LAGS, n // 2 - 1)
    p, pconf = pacf(y, nlags=plags, method="ldb", alpha=ALPHA)
    p_yw = pacf(y, nlags=plags, method="ywm")
    gap = float(np.max(np.abs(p - p_yw)))
    assert gap < 1e-10, (name, gap)
    lb = acorr_ljungbox(y, lags=list(range(1, LB_LAGS + 1)), return_df=True)
    lb_df = acorr_ljungbox(y, lags=list(range(1, LB_LAGS + 1)), model_df=model_df, return_df=True)
    jb, jbp, skew, kurt = jarque_bera(y)
    return {
        "name": name,
        "n": n,
        "y": y,
        "acf": r,
        "acf_bartlett_halfwidth": conf[:, 1] - r,
        "pacf_lags": plags,
        "pacf": p,
        "pacf_halfwidth": pconf[:, 1] - p,
        "pacf_ldb_vs_ywm_max_gap": gap,
        "lb_stat": lb["lb_stat"].to_numpy(),
        "lb_pvalue": lb["lb_pvalue"].to_numpy(),
        "model_df": model_df,
        "lb_df_stat": lb_df["lb_stat"].to_numpy(),
        "lb_df_pvalue": lb_df["lb_pvalue"].to_numpy(),
        "jb": float(jb),
        "jb_pvalue": float(jbp),
        "skewness": float(skew),
        "kurtosis": float(kurt),
    }


def size_study():
    rs = np.random.RandomState(SIZE_SEED)
    rejections = 0
    first_p = None
    for i in range(SIZE_R):
        e = rs.standard_normal(SIZE_N)
        lb = acorr_ljungbox(e, lags=[SIZE_LAGS], return_df=True)
        pv = float(lb["lb_pvalue"].iloc[0])
        if i == 0:
            first_p = pv
        if pv < ALPHA:
            rejections += 1
    return {"seed": SIZE_SEED, "R": SIZE_R, "n": SIZE_N, "lags": SIZE_LAGS, "level": ALPHA,
            "rejections": rejections, "first_pvalue": first_p}


def build():
    s = series()
    # model_df values are illustrative parameter counts (e.g. an ARMA(1,1) has 2; ARMA(2,1) has 3).
    model_dfs = {"nile": 1, "sunspots": 3, "gdp_dlog": 2, "co2_weekly_diff": 2}
    cases = [one(k, s[k], model_dfs[k]) for k in ["nile", "sunspots", "gdp_dlog", "co2_weekly_diff"]]
    return {"residuals.json": {"alpha": ALPHA, "cases": cases, "size": size_study()}}
