"""Reference for the non-seasonal special cases of src/core/models/tbats/: statsmodels'
ETSModel (innovations state-space exponential smoothing, Hyndman et al. 2008) on the Nile flow
(`statsmodels.datasets.nile`, 'volume', 100 years).

TBATS without Box-Cox, seasonality or ARMA errors is ETS(A,N,N) (no trend) or ETS(A,A,N)
(an undamped additive trend), with the initial states estimated: the same model and the same
Gaussian likelihood (sigma^2 at its estimate SSE/n). What is checked: the smoothing weights, the
log-likelihood and, for ETS(A,N,N), the standard error of alpha from the Hessian of the
log-likelihood (statsmodels' `bse`).

Fits: `ETSModel(y, error="add", trend=None | "add", seasonal=None,
initialization_method="estimated").fit(disp=False, maxiter=10000)`, statsmodels' defaults
otherwise. Its optimiser stops where the likelihood is flat in the initial level, so its llf can
sit a little below the maximum (measured: 0.08 below the maximum our seed regression reaches);
the TypeScript test therefore asks for a likelihood at least statsmodels', not equal to it.
"""
import numpy as np
from statsmodels.datasets import nile
from statsmodels.tsa.exponential_smoothing.ets import ETSModel


def fit(y, trend):
    r = ETSModel(y, error="add", trend=trend, seasonal=None, initialization_method="estimated").fit(disp=False, maxiter=10000)
    return {
        "trend": trend or "none",
        "param_names": list(r.param_names),
        "params": [float(v) for v in r.params],
        "bse": [float(v) for v in r.bse],
        "llf": float(r.llf),
        "converged": bool(r.mle_retvals.get("converged", False)),
    }


def build():
    y = nile.load_pandas().data["volume"].to_numpy(dtype=float)
    return {
        "ets_nile.json": {
            "source": "statsmodels.datasets.nile, 'volume' (annual flow of the Nile at Aswan, 1871-1970)",
            "y": [float(v) for v in y],
            "fits": [fit(y, None), fit(y, "add")],
        }
    }
