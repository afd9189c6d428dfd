"""Reference for src/core/math/ols.ts: statsmodels OLS on the Longley and macrodata sets.

The Longley (1967) employment data ship with statsmodels (`statsmodels.datasets.longley`).
TOTEMP is regressed on GNPDEFL, GNP, UNEMP, ARMED, POP, YEAR and a constant, the NIST StRD
"Longley" problem. The fit is deliberately ill-conditioned, so agreement tests the solver.
"""
import numpy as np
import statsmodels.api as sm
from statsmodels.datasets import longley

REGRESSORS = ["GNPDEFL", "GNP", "UNEMP", "ARMED", "POP", "YEAR"]


def build_longley():
    data = longley.load_pandas().data
    y = data["TOTEMP"].to_numpy(dtype=float)
    exog = data[REGRESSORS].to_numpy(dtype=float)
    X = np.column_stack([np.ones(len(y)), exog])
    res = sm.OLS(y, X).fit()
    out = {
        "names": ["const"] + REGRESSORS,
        "y": y,
        "X": X,
        "params": res.params,
        "bse": res.bse,
        "cov_params": res.cov_params(),
        "tvalues": res.tvalues,
        "pvalues": res.pvalues,
        "fittedvalues": res.fittedvalues,
        "resid": res.resid,
        "ssr": res.ssr,
        "scale": res.scale,
        "df_resid": res.df_resid,
        "rsquared": res.rsquared,
        "rsquared_adj": res.rsquared_adj,
        "llf": res.llf,
        "aic": res.aic,
        "bic": res.bic,
        "nobs": res.nobs,
    }
    # The same regressors without the constant: statsmodels then reports the uncentred R².
    res0 = sm.OLS(y, exog).fit()
    out["no_constant"] = {
        "params": res0.params,
        "bse": res0.bse,
        "rsquared": res0.rsquared,
        "rsquared_adj": res0.rsquared_adj,
        "llf": res0.llf,
        "aic": res0.aic,
        "bic": res0.bic,
    }
    return out


def build_macro():
    """A well-conditioned, larger fit: quarterly US macrodata shipped with statsmodels,
    log real consumption on a constant, log real GDP, log real investment and the
    unemployment rate (203 quarters)."""
    from statsmodels.datasets import macrodata
    d = macrodata.load_pandas().data
    y = np.log(d["realcons"].to_numpy(dtype=float))
    X = np.column_stack([np.ones(len(y)), np.log(d["realgdp"].to_numpy(dtype=float)),
                         np.log(d["realinv"].to_numpy(dtype=float)), d["unemp"].to_numpy(dtype=float)])
    res = sm.OLS(y, X).fit()
    return {"y": y, "X": X, "params": res.params, "bse": res.bse, "pvalues": res.pvalues,
            "rsquared": res.rsquared, "rsquared_adj": res.rsquared_adj, "llf": res.llf,
            "aic": res.aic, "bic": res.bic, "scale": res.scale}


def build():
    return {"ols_longley.json": build_longley(), "ols_macrodata.json": build_macro()}
