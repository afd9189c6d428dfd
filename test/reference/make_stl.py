"""Reference for src/core/diagnostics/seasonality/stl.ts: statsmodels STL.

statsmodels.tsa.seasonal.STL (Cleveland, Cleveland, McRae & Terpenning, 1990) is run as an
outside reference on open datasets that ship with statsmodels:

* the Mauna Loa weekly CO2 series (`statsmodels.datasets.co2`, weeks ending Saturday),
  resampled to one value per week ending Saturday, gaps filled by linear interpolation, last
  730 weeks (about 14 years, ending 2001-12-29), period 52;
* the Nile annual flow (`statsmodels.datasets.nile`, 100 values), period 10, where a
  cycle-subseries has only 10 points, so a seasonal window of 13 is wider than the subseries;
* the yearly sunspot numbers (`statsmodels.datasets.sunspots`, 309 values), period 11.

statsmodels' own defaults differ from the paper's in the speed-up "jumps" (statsmodels uses 1,
i.e. no speed-up; the paper suggests ceil(window / 10)) and its trend default is the paper's
rule. Every setting below is therefore passed explicitly (trend, low_pass, the three degrees,
the three jumps, inner and outer iterations), so both implementations run the same settings;
`statsmodels_defaults` records what statsmodels would have chosen by itself.

Residuals are not stored: statsmodels' resid is exactly observed - trend - seasonal, and the
tests rebuild it that way (keeps the fixture small).
"""
import math

import numpy as np
from statsmodels.datasets import co2, nile, sunspots
from statsmodels.tsa.seasonal import STL


def odd_at_least(x):
    """Smallest odd integer >= x."""
    k = int(math.ceil(x - 1e-12))
    return k if k % 2 == 1 else k + 1


def paper_trend(period, seasonal):
    # Cleveland et al. (1990), section 3: n_t = smallest odd integer >= 1.5 n_p / (1 - 1.5 / n_s).
    return odd_at_least(1.5 * period / (1.0 - 1.5 / seasonal))


def paper_jump(window):
    # Cleveland et al. (1990), section 4 (implementation, the speed-ups): jump about window / 10.
    return int(math.ceil(window / 10.0))


def co2_weekly():
    s = co2.load_pandas().data["co2"].resample("W-SAT").mean().interpolate(method="linear")
    s = s.iloc[-730:]
    return s.index.strftime("%Y-%m-%d").tolist(), s.to_numpy(dtype=float)


def run(y, period, seasonal, robust, deg=1, jumps="none", trend=None, low_pass=None):
    trend = paper_trend(period, seasonal) if trend is None else trend
    low_pass = odd_at_least(period + 0.5) if low_pass is None else low_pass  # smallest odd > period
    if jumps == "paper":
        sj, tj, lj = paper_jump(seasonal), paper_jump(trend), paper_jump(low_pass)
    else:
        sj = tj = lj = 1
    inner = 2 if robust else 5
    outer = 15 if robust else 0
    settings = {
        "period": period, "seasonal": seasonal, "trend": trend, "low_pass": low_pass,
        "seasonal_deg": deg, "trend_deg": deg, "low_pass_deg": deg,
        "seasonal_jump": sj, "trend_jump": tj, "low_pass_jump": lj,
        "robust": robust, "inner_iter": inner, "outer_iter": outer,
    }
    model = STL(y, period=period, seasonal=seasonal, trend=trend, low_pass=low_pass,
                seasonal_deg=deg, trend_deg=deg, low_pass_deg=deg,
                seasonal_jump=sj, trend_jump=tj, low_pass_jump=lj, robust=robust)
    res = model.fit(inner_iter=inner, outer_iter=outer)
    out = {"settings": settings, "trend": res.trend, "seasonal": res.seasonal}
    if robust:
        out["weights"] = res.weights
    return out


def build():
    dates, y = co2_weekly()
    cases = {
        "s7": run(y, 52, 7, False),
        "s13": run(y, 52, 13, False),
        "s53": run(y, 52, 53, False),
        "s13_robust": run(y, 52, 13, True),
        "s7_deg0": run(y, 52, 7, False, deg=0),
        "s13_jumps": run(y, 52, 13, False, jumps="paper"),
        "s13_robust_jumps": run(y, 52, 13, True, jumps="paper"),
        "s7_deg0_robust_jumps": run(y, 52, 7, True, deg=0, jumps="paper"),
    }
    defaults = STL(y, period=52, seasonal=13).config
    ny = nile.load_pandas().data["volume"].to_numpy(dtype=float)
    sy = sunspots.load_pandas().data["SUNACTIVITY"].to_numpy(dtype=float)
    short = {
        "nile_s7": run(ny, 10, 7, False),
        "nile_s13_robust": run(ny, 10, 13, True),
        "nile_s7_robust_jumps_deg0": run(ny, 10, 7, True, deg=0, jumps="paper"),
        "sunspots_s53": run(sy, 11, 53, False),
        "sunspots_s7_robust": run(sy, 11, 7, True, jumps="paper"),
    }
    return {
        "stl_co2.json": {"dates": dates, "y": y, "cases": cases, "statsmodels_defaults": defaults},
        "stl_short.json": {"nile": ny, "sunspots": sy, "cases": short},
    }
