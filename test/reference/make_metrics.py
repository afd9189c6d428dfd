"""Accuracy measures computed directly with numpy, from their published definitions,
on an invented weekly rate history and two forecast sets (the data are made here,
seeded, so nothing depends on a product's output)."""
import numpy as np


def mase_scale(hist, lag):
    d = np.abs(hist[lag:] - hist[:-lag])
    return d.mean()


def build():
    rng = np.random.RandomState(7)
    weeks = np.arange(160)
    hist = 1500 + 2.0 * weeks + 180 * np.sin(2 * np.pi * weeks / 52.18) + rng.normal(0, 40, size=160)
    actual = hist[-12:]
    train = hist[:-12]
    fc = actual + rng.normal(15, 60, size=12)
    lo = fc - 90
    hi = fc + 90
    out = {"train": train, "actual": actual, "forecast": fc, "lower": lo, "upper": hi, "level": 80}
    e = actual - fc
    out["me"] = e.mean()
    out["mae"] = np.abs(e).mean()
    out["rmse"] = np.sqrt((e ** 2).mean())
    out["mape"] = 100 * np.mean(np.abs(e / actual))
    out["smape"] = 200 * np.mean(np.abs(e) / (np.abs(actual) + np.abs(fc)))
    s52 = mase_scale(train, 52)
    out["mase_scale_52"] = s52
    out["mase"] = np.abs(e).mean() / s52
    short = train[-80:]
    out["short_train"] = short
    out["mase_scale_short_lag1"] = mase_scale(short, 1)
    alpha = 0.2
    score = (hi - lo) + (2 / alpha) * (lo - actual) * (actual < lo) + (2 / alpha) * (actual - hi) * (actual > hi)
    out["coverage"] = 100 * np.mean((actual >= lo) & (actual <= hi))
    out["winkler"] = score.mean()
    out["msis"] = score.mean() / s52
    return {"metrics.json": out}
