"""Reference for src/core/math/boxcox.ts: scipy.stats.boxcox on positive series shipped
with statsmodels.

- Nile: annual flow of the Nile at Aswan, 1871-1970 (`statsmodels.datasets.nile`).
- Sunspots: yearly sunspot activity 1700-2008 plus one, since some years are zero
  (`statsmodels.datasets.sunspots`).
- CO2: weekly Mauna Loa CO2 (`statsmodels.datasets.co2`) with missing weeks dropped.

For each: the maximum-likelihood lambda of scipy.stats.boxcox (its default Brent search),
scipy.stats.boxcox_llf at a few fixed lambdas, and the transformed values at fixed lambdas.
"""
import numpy as np
from scipy import stats
from statsmodels.datasets import co2, nile, sunspots

FIXED_LAMBDAS = [-0.5, 0.0, 0.5, 1.3]
LLF_LAMBDAS = [-1.0, -0.5, 0.0, 0.25, 0.5, 1.0, 1.3, 2.0]


def series():
    yield "nile", nile.load_pandas().data["volume"].to_numpy(dtype=float)
    yield "sunspots_plus1", sunspots.load_pandas().data["SUNACTIVITY"].to_numpy(dtype=float) + 1.0
    yield "co2", co2.load_pandas().data["co2"].dropna().to_numpy(dtype=float)


def build():
    out = {}
    for name, y in series():
        assert np.all(y > 0)
        _, lmax = stats.boxcox(y)
        out[name] = {
            "y": y,
            "lmbda_mle": float(lmax),
            "llf_at_mle": float(stats.boxcox_llf(lmax, y)),
            "llf": [{"lmbda": l, "llf": float(stats.boxcox_llf(l, y))} for l in LLF_LAMBDAS],
            "transformed": [{"lmbda": l, "values": stats.boxcox(y, lmbda=l)} for l in FIXED_LAMBDAS],
        }
    return {"boxcox.json": out}
