"""scipy.stats cdf, sf and quantiles on a grid that reaches into the tails."""
import numpy as np
from scipy import stats


def build():
    xs = [-38.0, -12.5, -8.0, -5.0, -3.0, -1.96, -1.0, -0.1, 0.0, 0.3, 1.0, 1.6449, 2.5, 4.0, 7.5, 9.0]
    ps = [1e-12, 1e-8, 1e-5, 0.001, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 0.75, 0.9, 0.95, 0.975, 0.99, 0.999, 1 - 1e-6]
    pos = [1e-6, 0.01, 0.2, 0.5, 1.0, 2.0, 3.84, 7.0, 15.0, 40.0, 120.0]
    out = {"normal": {"x": xs, "cdf": stats.norm.cdf(xs), "sf": stats.norm.sf(xs), "p": ps, "ppf": stats.norm.ppf(ps)}}
    out["t"] = []
    for df in [1, 2.5, 5, 12, 30, 200]:
        out["t"].append({"df": df, "x": xs, "cdf": stats.t.cdf(xs, df), "sf": stats.t.sf(xs, df),
                         "p": ps, "ppf": stats.t.ppf(ps, df)})
    out["chi2"] = []
    for df in [1, 2, 4.5, 10, 52, 300]:
        out["chi2"].append({"df": df, "x": pos, "cdf": stats.chi2.cdf(pos, df), "sf": stats.chi2.sf(pos, df),
                            "p": ps, "ppf": stats.chi2.ppf(ps, df)})
    out["f"] = []
    for d1, d2 in [(1, 10), (3, 47), (5, 2.5), (12, 300), (52, 52)]:
        out["f"].append({"d1": d1, "d2": d2, "x": pos, "cdf": stats.f.cdf(pos, d1, d2), "sf": stats.f.sf(pos, d1, d2),
                         "p": ps, "ppf": stats.f.ppf(ps, d1, d2)})
    return {"distributions.json": out}
