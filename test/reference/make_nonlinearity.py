"""Reference for src/core/diagnostics/nonlinearity/: the nonlinearity tests on datasets that
ship with statsmodels, computed here independently of the TypeScript code.

Datasets: the Nile annual flow (100 years, `statsmodels.datasets.nile`), the yearly sunspot
numbers (309 years, `statsmodels.datasets.sunspots`) and the quarterly growth of US real GDP,
diff(log(realgdp)) (202 quarters, `statsmodels.datasets.macrodata`).

Pieces and where they come from:
- AR order: statsmodels OLS fits of y_t on 1, y_{t-1..t-p}, p = 1..P, P = min(12, n // 10),
  all on the common sample t = P+1..n; the smallest `aic` wins (ties to the smaller p).
- Keenan (1985, Biometrika 72): three statsmodels OLS regressions as in the paper,
  F = eta^2 (n - 2p - 2) / (sum e^2 - eta^2), F(1, n - 2p - 2).
- Tsay (1986, Biometrika 73): products y_{t-i} y_{t-j} (i <= j) regressed on the AR regressors
  by statsmodels OLS; the paper's quadratic form (sum X a)' (sum X X')^-1 (sum X a) / m over
  the residual mean square of a on X, with n - p - m - 1 denominator degrees of freedom.
- Teräsvirta, Lin & Granger (1993, JTSA 14): the F form from statsmodels' `compare_f_test`
  of y on [AR regressors + 2nd and 3rd order lag products] against y on the AR regressors,
  and the chi-squared form T * R^2 from the `rsquared` of the AR residuals on all regressors.
- McLeod & Li (1983, JTSA 4): `acorr_ljungbox` on the squared AR residuals,
  L = min(20, N // 4), N the residual count.
- BDS (Brock et al., 1996): `statsmodels.tsa.stattools.bds` with `distance=1.5`. Its
  `distance` is a multiple of the sample standard deviation with divisor N - 1: the script
  checks that `distance=d` equals `epsilon=d * x.std(ddof=1)` and not `d * x.std()`.
- When the order is chosen by AIC, Tsay and Teräsvirta use the largest q <= p whose
  regression keeps >= 3 observations per coefficient (the project's documented rule).
"""
import numpy as np
import statsmodels.api as sm
from statsmodels.stats.diagnostic import acorr_ljungbox
from statsmodels.tsa.stattools import bds
from scipy import stats


def datasets():
    nile = sm.datasets.nile.load_pandas().data["volume"].to_numpy(dtype=float)
    sun = sm.datasets.sunspots.load_pandas().data["SUNACTIVITY"].to_numpy(dtype=float)
    gdp = sm.datasets.macrodata.load_pandas().data["realgdp"].to_numpy(dtype=float)
    return {"nile": nile, "sunspots": sun, "gdp_growth": np.diff(np.log(gdp))}


def lag_matrix(y, p, start):
    n = len(y)
    cols = [np.ones(n - start)] + [y[start - i:n - i] for i in range(1, p + 1)]
    return y[start:], np.column_stack(cols)


def products(L, degree):
    p = L.shape[1]
    out = []
    for i in range(p):
        for j in range(i, p):
            if degree == 2:
                out.append(L[:, i] * L[:, j])
            else:
                for k in range(j, p):
                    out.append(L[:, i] * L[:, j] * L[:, k])
    return np.column_stack(out)


def aic_order(y, P):
    aics = []
    for p in range(1, P + 1):
        target, X = lag_matrix(y, p, P)
        aics.append(sm.OLS(target, X).fit().aic)
    return int(np.argmin(aics)) + 1, aics


def cap(n, p, coefficients):
    q = p
    while q > 1 and n - q < 3 * coefficients(q):
        q -= 1
    return q


def keenan(y, p):
    n = len(y)
    target, X = lag_matrix(y, p, p)
    r1 = sm.OLS(target, X).fit()
    xi = sm.OLS(r1.fittedvalues ** 2, X).fit().resid
    e = r1.resid
    eta0 = (e @ xi) / (xi @ xi)
    eta = eta0 * np.sqrt(xi @ xi)
    df2 = n - 2 * p - 2
    F = eta ** 2 * df2 / (e @ e - eta ** 2)
    return {"order": p, "F": F, "df1": 1, "df2": df2, "p": stats.f.sf(F, 1, df2)}


def tsay(y, p):
    n = len(y)
    target, X = lag_matrix(y, p, p)
    a = sm.OLS(target, X).fit().resid
    Z = products(X[:, 1:], 2)
    m = Z.shape[1]
    Xh = np.column_stack([sm.OLS(Z[:, c], X).fit().resid for c in range(m)])
    g = Xh.T @ a
    num = g @ np.linalg.solve(Xh.T @ Xh, g) / m
    eps = sm.OLS(a, Xh).fit().resid
    df2 = n - p - m - 1
    F = num / ((eps @ eps) / df2)
    return {"order": p, "F": F, "df1": m, "df2": df2, "p": stats.f.sf(F, m, df2)}


def terasvirta(y, p):
    target, X = lag_matrix(y, p, p)
    T = len(target)
    L = X[:, 1:]
    W = np.column_stack([X, products(L, 2), products(L, 3)])
    m = W.shape[1] - X.shape[1]
    restricted = sm.OLS(target, X).fit()
    full = sm.OLS(target, W).fit()
    F, pF, df_diff = full.compare_f_test(restricted)
    lm = T * sm.OLS(restricted.resid, W).fit().rsquared
    return {"order": p, "F": F, "p": pF, "df1": int(df_diff), "df2": int(full.df_resid),
            "lm": lm, "lm_p": stats.chi2.sf(lm, m)}


def ar_resid(y, p):
    target, X = lag_matrix(y, p, p)
    return sm.OLS(target, X).fit().resid


def mcleod_li(y, p, L=None):
    e = ar_resid(y, p)
    if L is None:
        L = max(1, min(20, len(e) // 4))
    lb = acorr_ljungbox(e ** 2, lags=[L], return_df=True)
    return {"order": p, "lags": L, "Q": float(lb["lb_stat"].iloc[0]), "p": float(lb["lb_pvalue"].iloc[0])}


def bds_ref(x, max_dim=5, distance=1.5):
    z, pv = bds(x, max_dim=max_dim, distance=distance)
    # The distance convention, checked by calling: d times the N - 1 standard deviation.
    z1, _ = bds(x, max_dim=max_dim, epsilon=distance * np.std(x, ddof=1))
    z0, _ = bds(x, max_dim=max_dim, epsilon=distance * np.std(x))
    assert np.allclose(z, z1, rtol=1e-12, atol=0), "bds distance is not d * std(ddof=1)"
    assert not np.allclose(z, z0, rtol=1e-9, atol=0)
    assert np.allclose(pv, 2 * stats.norm.sf(np.abs(z)), rtol=1e-10), "bds p-value is not two-sided"
    return {"distance": distance, "max_dim": max_dim, "z": np.atleast_1d(z), "p": np.atleast_1d(pv)}


def build():
    out = {}
    for name, y in datasets().items():
        n = len(y)
        P = min(12, n // 10)
        p, aics = aic_order(y, P)
        q_tsay = cap(n, p, lambda q: 1 + q + q * (q + 1) // 2)
        q_ter = cap(n, p, lambda q: 1 + q + q * (q + 1) // 2 + q * (q + 1) * (q + 2) // 6)
        e = ar_resid(y, p)
        out[name] = {
            "y": y,
            "max_order": P,
            "aic": aics,
            "order": p,
            "auto": {
                "keenan": keenan(y, p),
                "tsay": tsay(y, q_tsay),
                "terasvirta": terasvirta(y, q_ter),
                "mcleod_li": mcleod_li(y, p),
                "bds": bds_ref(e),
            },
            "fixed": {
                str(k): {
                    "keenan": keenan(y, k),
                    "tsay": tsay(y, k),
                    "terasvirta": terasvirta(y, k),
                    "mcleod_li": mcleod_li(y, k, 10),
                    "bds_07": bds_ref(ar_resid(y, k), 4, 0.7),
                }
                for k in (1, 2, 3)
            },
            "bds_raw": bds_ref(y),
        }
    return {"nonlinearity.json": out}
