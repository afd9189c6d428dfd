"""Reference for src/core/models/tbats/: trigonometric seasonality and Box-Cox + STL readings.

Fairlead's TBATS (De Livera, Hyndman & Snyder 2011, JASA 106(496)) is checked against what
general-purpose libraries compute for the same ingredients; no forecasting product is used.

Fixtures (the datasets ship with statsmodels):

* `tbats_co2_uc.json`: Mauna Loa CO2 (`statsmodels.datasets.co2`) prepared exactly as in
  make_sarima.py (`co2_weekly`, imported, not copied: weeks ending Saturday, mean, gaps
  linearly interpolated in time), the last 572 weeks (1991-01-19 .. 2001-12-29, none of them a
  gap); training = the first 520, holdout = the last 52. For K = 1..8 harmonics, statsmodels
  UnobservedComponents(train, level='local linear trend', freq_seasonal=[{'period': 365.25/7,
  'harmonics': K}]) at its maximum likelihood, with its 52-week point forecasts, 80%/95%
  intervals and holdout MASE.
* `tbats_elec_equip_stl.json`: the monthly EU electrical-equipment index
  (`statsmodels.datasets.elec_equip`, whole series, 1995-01 .. 2016-05, 257 months): the
  scipy.stats.boxcox maximum-likelihood lambda with its profile 95% interval, and robust STL
  (period 12, statsmodels' default windows) of log(y) and of boxcox(y, lambda_mle), summarised
  as per-calendar-month seasonal effects and multiplicative monthly factors.

The UC model. Its trigonometric seasonal is the same recursion as TBATS's (De Livera et al.
2011, eq. (2)): for harmonic j, lambda_j = 2 pi j / P,
    s_j,t  =  s_j,t-1 cos lambda_j + s*_j,t-1 sin lambda_j + w_j,t
    s*_j,t = -s_j,t-1 sin lambda_j + s*_j,t-1 cos lambda_j + w*_j,t
and y_t = level_t + sum_j s_j,t + irregular_t, the level a local linear trend (statsmodels
structural.py builds exactly these 2x2 blocks). Unlike TBATS (one error source, innovations
form), UC has independent disturbances: four variances (irregular, level, trend, and one shared
by all 2K seasonal states) are the only estimated parameters for every K, so `k_params` is 4
and AIC ranks K by llf alone; TBATS counts its smoothing parameters and seed states instead.
A P of 365.25/7 = 52.18 is not an integer, so every harmonic has both states (2K states).

What statsmodels' UC log-likelihood is (read from statsmodels 0.13.5 structural.py
`initialize_default` and mlemodel.py, and asserted in `co2_case`): with the default
use_exact_diffuse=False it is *not* an exact diffuse likelihood. Every state (2 + 2K) gets an
approximate diffuse start, a_1 = 0 and P_1 = 1e6 * I (`ssm.initial_variance`), and
`loglikelihood_burn` is set to the number of states, 2 + 2K; `llf` is the Gaussian
prediction-error log-likelihood summed over t = burn+1 .. n only (`nobs_effective` =
520 - 2 - 2K = sum of `llf_obs[burn:]`). `aic` = -2 llf + 2 df_model, df_model = 4 (the
approximate start adds no diffuse-state count), so statsmodels' AIC ranks K by llf alone, on
samples that shrink by 2 weeks per harmonic; `llf_common`/`aic_common` sum the same `llf_obs`
over the common window t > 18 (the burn of K = 8).

The approximate start is far from diffuse here, and it matters: over the first 2 + 2K weeks
the low-frequency harmonics (2 pi j / 52.18) are nearly collinear with level and slope, so a
prior variance of 1e6 still constrains them after the burn-in. Refiltering at the MLE with
1e5 / 1e7 (`checks.llf_initial_variance`) moves llf by about +0.7 / -0.2 at K = 1 and +6.8 /
-6.8 at K = 8 (the forecasts by at most 2e-4 / 2e-5 ppm); the shift grows with K, so a
ranking of K by this llf rests partly on the arbitrary 1e6. statsmodels' exact diffuse filter
(use_exact_diffuse=True) works at K = 1 but for K >= 2 never leaves the diffuse phase
(`checks.exact_diffuse_nobs_diffuse` = 520, its llf meaningless). So `augmented` evaluates two
kappa-free log-likelihoods at the same parameters with de Jong's (1991) augmented filter:
`llf_diffuse` (a_1 ~ N(0, kappa I), kappa -> infinity; equal to statsmodels' exact diffuse
llf at K = 1 to 1e-6, asserted) and `llf_seed_profile` (a_1 estimated by GLS, all 520 weeks:
the same treatment of seed states as Fairlead's TBATS, De Livera et al. 2011, estimation
section, cited from memory); `aic_seed_profile` counts the 2 + 2K seed states as parameters.
These are evaluated at statsmodels' MLE, not maximised themselves, so
`best_K_by_aic_diffuse_at_uc_mle` and `best_K_by_aic_seed_profile_at_uc_mle` are diagnostics:
they choose K = 3 where statsmodels' AIC chooses K = 2. Even the seed-profile llf is not
comparable with a TBATS llf in value (UC has four independent disturbances, TBATS one
innovation), so compare llf within each family, and forecasts across them.

The MLE (`OPTIMISER`) is statsmodels' own (its llf above), in its unconstrained
parameterisation (each variance the square of a free number, so a variance can reach 0; the
trend variance essentially does). From each of several starts (statsmodels' start_params, the
same with the trend and seasonal variances x1e-4, every variance var(diff y)/4, and for K > 1
the best parameters of K - 1) the chain lbfgs (tight stopping rules) -> Nelder-Mead -> Powell
-> lbfgs is run and the largest llf over every stage of every start is kept; all
deterministic. `starts` records each start's final llf. K = 1 has two local maxima (-339.75,
reached from statsmodels' start_params, and -337.78); when this script was written a scan from
12 random starts (not stored) found no higher llf at any K, and a Nelder-Mead/Powell polish
in log-variances moved no llf by more than 1e-6.

MASE is Fairlead's: mean |actual - forecast| over the 52 holdout weeks divided by the
in-sample mean |y_t - y_t-52| over the 520 training weeks (468 differences).

Box-Cox and STL on elec_equip: `scipy.stats.boxcox(y)` (Brent search of the profile
log-likelihood) gives lambda_mle; `scipy.stats.boxcox(y, alpha=0.05)` the interval of lambdas
whose profile log-likelihood is within chi2_1(0.95)/2 of the maximum. STL is statsmodels'
(Cleveland et al. 1990) with robust=True and every other setting left at statsmodels' default
(`stl_config`: seasonal 7, trend 23, low_pass 13, degrees 1, jumps 1; fit() defaults for robust:
inner 2, outer 15 iterations), since the point is a reading of the series, not a test of STL
(make_stl.py does that). Monthly effects are the mean of the seasonal component per calendar
month (index 0 = January; the series starts in January), centred to mean zero over the 12
months; `last60` repeats that over the last 5 years (2011-06 .. 2016-05, 5 values per month).
Multiplicative factors are exp(mean log-seasonal per month) normalised to mean 1 (centring
first would only rescale, which the normalisation removes).

`stl_profile_lambda` is a model-based Box-Cox + STL reading of lambda: the grid value (step
0.01 over [0, 1.5]) that maximises the Gaussian profile log-likelihood of the remainder of a
non-robust STL of boxcox(y, lambda), Jacobian included, with the grid points within
chi2_1(0.95)/2 of the maximum as an approximate 95% interval. scipy's lambda_mle treats the
257 values as one iid sample, which a trending seasonal series is not, so it answers a
different question from a model's lambda.

Fit times are printed to stderr, not stored, so a rerun gives the same bytes.
"""
import math
import sys
import time
import warnings

import numpy as np
import pandas as pd
from scipy import stats
from statsmodels.datasets import elec_equip
from statsmodels.tsa.seasonal import STL
from statsmodels.tsa.statespace.structural import UnobservedComponents

from make_sarima import co2_weekly

PERIOD = 365.25 / 7.0
N_TOTAL, N_TRAIN, H = 572, 520, 52
SEASON = 52  # lag of the MASE scaling differences (weekly data, yearly season)
HARMONICS = range(1, 9)
COMMON_BURN = 2 + 2 * max(HARMONICS)  # the largest statsmodels burn-in over the K grid

MAXITER = 20000
# Tight scipy stopping rules; statsmodels minimises -llf / nobs, so ftol is on that scale.
STAGES = [
    ("lbfgs", dict(method="lbfgs", maxiter=MAXITER, pgtol=1e-10, factr=10.0)),
    ("nm", dict(method="nm", maxiter=MAXITER, maxfun=MAXITER, xtol=1e-10, ftol=1e-14)),
    ("powell", dict(method="powell", maxiter=MAXITER, maxfun=MAXITER, xtol=1e-10, ftol=1e-14)),
    ("lbfgs_again", dict(method="lbfgs", maxiter=MAXITER, pgtol=1e-10, factr=10.0)),
]
OPTIMISER = (
    "statsmodels MLEModel.fit from each start in `starts`, chained lbfgs(pgtol=1e-10, factr=10) "
    "-> nm(xtol=1e-10, ftol=1e-14) -> powell(xtol=1e-10, ftol=1e-14) -> lbfgs, maxiter %d, each "
    "stage started at the previous stage's result; the MLE is the largest llf over every stage "
    "of every start" % MAXITER
)
LIKELIHOOD_OF = (
    "statsmodels 0.13.5 UnobservedComponents default: approximate diffuse initialisation of all "
    "2 + 2K states (mean 0, covariance initial_variance * I, initial_variance = 1e6), "
    "loglikelihood_burn = 2 + 2K, llf = sum of the Gaussian prediction-error log-densities over "
    "t = burn+1 .. n (nobs_effective terms); aic = -2 llf + 2 df_model, df_model = 4"
)


def uc(y, K, **kwargs):
    return UnobservedComponents(y, level="local linear trend",
                                freq_seasonal=[{"period": PERIOD, "harmonics": K}], **kwargs)


def mle(model, starts):
    """Run the STAGES chain from every start; return the best params and per-start records."""
    best_p, best_llf, best_where = None, -np.inf, None
    records = []
    for label, start in starts:
        p = np.asarray(start, dtype=float)
        final = None
        for stage, opts in STAGES:
            with warnings.catch_warnings():
                # Non-convergence of one stage is expected (the next stage carries on); the
                # outcome is judged by the llf, and the best over all stages is kept.
                warnings.simplefilter("ignore")
                res = model.fit(start_params=p, disp=False, **opts)
            llf = float(res.llf)
            if np.isfinite(llf):
                p = np.asarray(res.params, dtype=float)
                final = llf
                if llf > best_llf:
                    best_p, best_llf, best_where = p, llf, "%s/%s" % (label, stage)
        records.append({"start": label, "start_params": np.asarray(start, dtype=float), "llf": final})
    return best_p, best_llf, best_where, records


def augmented(y, K, params):
    """Seed-state-free log-likelihoods at `params` by de Jong's (1991) augmented filter.

    With the initial state a_1 known and P_1 = 0 the Kalman gains and F_t do not depend on
    a_1, and the innovations are linear in it: v_t(a) = v_t(0) + X_t a, X's columns being
    v(e_i) - v(0). Then, with S = X' F^-1 X and SSR(a) = sum (v_t(a))^2 / F_t:
      seed profile llf = -1/2 [n log 2 pi + sum log F_t + min_a SSR(a)]   (a_1 estimated by
        GLS, like TBATS's seed states x_0; all n observations count);
      diffuse llf = seed profile llf - 1/2 log|S|   (a_1 ~ N(0, kappa I), kappa -> infinity,
        the diverging -k/2 log kappa dropped; de Jong 1991, Durbin & Koopman 2012 section 7.2).
    No approximate kappa, no burn-in; the diffuse value equals statsmodels' exact diffuse llf
    where that filter works (K = 1, asserted in co2_case)."""
    model = uc(y, K)
    k = model.k_states

    def run(a1):
        model.ssm.initialize_known(np.asarray(a1, dtype=float), np.zeros((k, k)))
        model.ssm.loglikelihood_burn = 0
        res = model.filter(params)
        return (np.asarray(res.forecasts_error[0], dtype=float),
                np.asarray(res.forecasts_error_cov[0, 0], dtype=float), float(res.llf))

    v0, F, _ = run(np.zeros(k))
    X = np.column_stack([run(e)[0] - v0 for e in np.eye(k)])
    w, Xw = v0 / np.sqrt(F), X / np.sqrt(F)[:, None]
    a_hat = np.linalg.lstsq(Xw, -w, rcond=None)[0]
    ssr = float(np.sum((w + Xw @ a_hat) ** 2))
    logdet_s = 2.0 * float(np.sum(np.log(np.abs(np.diag(np.linalg.qr(Xw, mode="r"))))))
    profile = -0.5 * (len(y) * math.log(2 * math.pi) + float(np.sum(np.log(F))) + ssr)
    llf_at_a_hat = run(a_hat)[2]  # the filter started at the GLS seed reproduces the profile
    assert abs(llf_at_a_hat - profile) <= 1e-8 * abs(profile), (llf_at_a_hat, profile)
    return {"llf_seed_profile": profile, "llf_diffuse": profile - 0.5 * logdet_s,
            "seed_a1": a_hat, "log_det_S": logdet_s, "cond_X": float(np.linalg.cond(Xw))}


def mase(actual, forecast, train):
    scale = np.mean(np.abs(train[SEASON:] - train[:-SEASON]))
    return float(np.mean(np.abs(actual - forecast)) / scale), float(scale)


def co2_case():
    y, info = co2_weekly(N_TOTAL)
    assert info["gaps_filled_in_window"] == 0
    dates = pd.date_range(info["index_first"], periods=N_TOTAL, freq="W-SAT")
    assert dates[-1].strftime("%Y-%m-%d") == info["index_last"]
    iso = dates.strftime("%Y-%m-%d").tolist()
    train, hold = y[:N_TRAIN], y[N_TRAIN:]
    _, scale = mase(hold, hold, train)

    fits, prev = [], None
    for K in HARMONICS:
        t0 = time.perf_counter()
        model = uc(train, K)
        names = list(model.param_names)
        sp = np.asarray(model.start_params, dtype=float)
        small = sp.copy()
        small[2] *= 1e-4  # trend variance
        small[3] *= 1e-4  # seasonal variance
        starts = [("statsmodels_start_params", sp),
                  ("trend_seasonal_var_x1e-4", small),
                  ("all_var_diff_over_4", np.full(4, np.var(np.diff(train)) / 4.0))]
        if prev is not None:
            starts.append(("best_of_K-1", prev))
        params, llf, where, records = mle(model, starts)
        prev = params
        res = model.filter(params)
        assert abs(float(res.llf) - llf) <= 1e-9 * abs(llf)
        burn = int(res.loglikelihood_burn)
        assert burn == model.k_states == 2 + 2 * K
        llf_obs = np.asarray(res.llf_obs, dtype=float)
        assert abs(llf_obs[burn:].sum() - res.llf) <= 1e-8 * abs(res.llf)
        llf_common = float(llf_obs[COMMON_BURN:].sum())

        fc = res.get_forecast(H)
        point = np.asarray(fc.predicted_mean, dtype=float)
        ci80 = np.asarray(fc.conf_int(alpha=0.2))
        ci95 = np.asarray(fc.conf_int(alpha=0.05))
        m, _ = mase(hold, point, train)

        # How much the approximate diffuse variance matters once the burn-in is dropped.
        kappa = []
        for v in (1e5, 1e7):
            alt = uc(train, K)
            alt.initialize_default(approximate_diffuse_variance=v)
            ares = alt.filter(params)
            kappa.append({"initial_variance": v, "llf": float(ares.llf),
                          "forecast_max_abs_change": float(np.max(np.abs(
                              np.asarray(ares.get_forecast(H).predicted_mean) - point)))})
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            exact = uc(train, K, use_exact_diffuse=True).filter(params)
        aug = augmented(train, K, params)
        if exact.nobs_diffuse < N_TRAIN:  # statsmodels' exact diffuse filter left the diffuse phase
            assert abs(float(exact.llf) - aug["llf_diffuse"]) <= 1e-6 * abs(aug["llf_diffuse"])
        n_seed = 2 + 2 * K

        fits.append({
            "K": K,
            "param_names": names,
            "params": params,
            "variances": {"irregular": params[0], "level": params[1], "trend": params[2],
                          "seasonal": params[3]},
            "llf": llf,
            "aic": float(res.aic),
            "bic": float(res.bic),
            "k_params": int(len(params)),
            "df_model": int(res.df_model),
            "nobs": int(res.nobs),
            "nobs_effective": int(res.nobs_effective),
            "loglikelihood_burn": burn,
            "k_states": int(model.k_states),
            "llf_common": llf_common,
            "aic_common": -2.0 * llf_common + 2.0 * len(params),
            "llf_diffuse": aug["llf_diffuse"],
            "aic_diffuse": -2.0 * aug["llf_diffuse"] + 2.0 * len(params),
            "llf_seed_profile": aug["llf_seed_profile"],
            "aic_seed_profile": -2.0 * aug["llf_seed_profile"] + 2.0 * (len(params) + n_seed),
            "seed_profile_a1": aug["seed_a1"],
            "best_found_at": where,
            "starts": records,
            "forecast": {"point": point,
                         "se": np.asarray(fc.se_mean, dtype=float),
                         "lower80": ci80[:, 0], "upper80": ci80[:, 1],
                         "lower95": ci95[:, 0], "upper95": ci95[:, 1]},
            "mase": m,
            "checks": {"llf_initial_variance": kappa,
                       "exact_diffuse_nobs_diffuse": int(exact.nobs_diffuse),
                       "exact_diffuse_llf": float(exact.llf),
                       "augmented_log_det_S": aug["log_det_S"],
                       "augmented_cond_X": aug["cond_X"]},
        })
        print("  K=%d llf=%.6f aic=%.4f mase=%.4f diffuse=%.6f seed_profile=%.6f best at %s, "
              "starts %s (%.1fs)" % (K, llf, res.aic, m, aug["llf_diffuse"], aug["llf_seed_profile"],
                                     where, ["%.6f" % r["llf"] for r in records],
                                     time.perf_counter() - t0), file=sys.stderr)

    best = {c: min(fits, key=lambda f: f[c])["K"]
            for c in ("aic", "aic_common", "aic_diffuse", "aic_seed_profile")}
    return {
        "source": "statsmodels.datasets.co2 via make_sarima.co2_weekly(572) (W-SAT mean, gaps "
                  "interpolated in time), train = first 520, holdout = last 52; "
                  "UnobservedComponents(train, level='local linear trend', freq_seasonal="
                  "[{'period': 365.25/7, 'harmonics': K}]), K = 1..8",
        "likelihood_of": LIKELIHOOD_OF,
        "optimiser": OPTIMISER,
        "period": PERIOD,
        "first_date": iso[0],
        "train_dates": iso[:N_TRAIN],
        "holdout_dates": iso[N_TRAIN:],
        "train": train,
        "holdout": hold,
        "n_train": N_TRAIN,
        "horizon": H,
        "mase_scale": scale,
        "mase_definition": "mean |holdout - forecast| over the 52 holdout weeks / mean |y_t - "
                           "y_{t-52}| over the 520 training weeks (468 differences)",
        "common_burn": COMMON_BURN,
        "fits": fits,
        "best_K_by_aic": best["aic"],
        "best_K_by_aic_common": best["aic_common"],
        "best_K_by_aic_diffuse_at_uc_mle": best["aic_diffuse"],
        "best_K_by_aic_seed_profile_at_uc_mle": best["aic_seed_profile"],
    }


def month_means(seasonal, months, centre=True):
    """Mean of `seasonal` per calendar month (index 0 = January), optionally centred."""
    out = np.array([seasonal[months == m].mean() for m in range(1, 13)])
    return out - out.mean() if centre else out


def elec_case():
    s = elec_equip.load_pandas().data.iloc[:, 0]
    y = s.to_numpy(dtype=float)
    assert np.all(y > 0)
    months = s.index.month.to_numpy()
    assert months[0] == 1  # the series starts in January, so index 0 of every 12-vector is Jan
    _, lam = stats.boxcox(y)
    _, lam2, (lo, hi) = stats.boxcox(y, alpha=0.05)
    assert lam2 == lam
    tail = slice(len(y) - 60, None)

    readings, config = {}, None
    for name, z in (("log", np.log(y)), ("boxcox_mle", stats.boxcox(y, lmbda=lam))):
        model = STL(z, period=12, robust=True)
        config = model.config
        res = model.fit()
        seas = np.asarray(res.seasonal, dtype=float)
        readings[name] = {
            "transformed": z,
            "seasonal": seas,
            "trend": np.asarray(res.trend, dtype=float),
            "monthly_effect": month_means(seas, months),
            "monthly_effect_last60": month_means(seas[tail], months[tail]),
        }
    # A model-based reading of lambda: for each lambda on a grid, STL (period 12, not robust, so
    # every month counts fully) of boxcox(y, lambda), scored by the Gaussian profile
    # log-likelihood of its remainder with the Box-Cox Jacobian,
    #   llf(lambda) = -n/2 log(mean(remainder^2)) + (lambda - 1) sum(log y),
    # i.e. the lambda under which trend + seasonal + iid noise of constant variance fits best.
    # That is the question TBATS's own lambda answers (scipy's lambda_mle above treats the
    # values as one iid sample, which a trending seasonal series is not).
    grid = np.round(np.arange(0.0, 1.5001, 0.01), 2)
    prof = []
    for g in grid:
        z = np.log(y) if g == 0 else (y ** g - 1) / g
        rem = np.asarray(STL(z, period=12, robust=False).fit().resid, dtype=float)
        prof.append(-0.5 * len(y) * math.log(np.mean(rem ** 2)) + (g - 1) * np.log(y).sum())
    prof = np.array(prof)
    at = int(np.argmax(prof))
    within = grid[prof >= prof[at] - 0.5 * stats.chi2.ppf(0.95, 1)]
    stl_profile = {"lambda": float(grid[at]), "ci95": [float(within.min()), float(within.max())],
                   "grid_step": 0.01, "grid": [0.0, 1.5],
                   "method": "argmax over the grid of -n/2 log(mean(STL remainder^2)) + (lambda-1) "
                             "sum(log y), STL(period=12, robust=False) of boxcox(y, lambda); "
                             "ci95: grid points within chi2_1(0.95)/2 of the maximum"}
    log_seas = readings["log"]["seasonal"]
    factors = {}
    for label, sl in (("all", slice(None)), ("last60", tail)):
        f = np.exp(month_means(log_seas[sl], months[sl], centre=False))
        factors[label] = f / f.mean()
    print("  elec_equip lambda_mle=%.6f (%.6f, %.6f)" % (lam, lo, hi), file=sys.stderr)
    return {
        "source": "statsmodels.datasets.elec_equip (monthly, whole series as loaded)",
        "y": y,
        "n": len(y),
        "index_first": s.index[0].strftime("%Y-%m-%d"),
        "index_last": s.index[-1].strftime("%Y-%m-%d"),
        "last60_first": s.index[len(y) - 60].strftime("%Y-%m-%d"),
        "boxcox": {"lmbda_mle": float(lam), "ci95": [float(lo), float(hi)],
                   "llf_at_mle": float(stats.boxcox_llf(lam, y)),
                   "method": "scipy.stats.boxcox(y) (Brent, profile llf); interval from "
                             "scipy.stats.boxcox(y, alpha=0.05)"},
        "stl_profile_lambda": stl_profile,
        "stl_config": config,
        "stl_fit": {"inner_iter": 2, "outer_iter": 15,
                    "note": "statsmodels STL.fit() defaults for robust=True"},
        "stl": readings,
        "multiplicative_factors": factors,
        "month_order": "index 0 = January .. 11 = December",
    }


def build():
    return {"tbats_co2_uc.json": co2_case(), "tbats_elec_equip_stl.json": elec_case()}
