"""Reference for TBATS's calendar regressors (src/core/models/tbats/filter.ts, SeedRegression
with regressor columns): regression with a local-level error, checked against statsmodels.

With no trend, no seasonality and no ARMA part, TBATS is the local level model
    z_t = l_{t-1} + b'u_t + e_t,   l_t = l_{t-1} + alpha e_t,
i.e. z_t - b'u_t follows ARIMA(0,1,1) with MA coefficient theta = alpha - 1 (Hyndman et al.
2008, ch. 11, the ETS(A,N,N) equivalence; from memory). For a given alpha, Fairlead's b is the
least squares of the one-step errors over the seed level l_0 and b jointly; that equals the GLS
estimate of b in the regression with ARIMA(0,1,1) errors on the differenced data (l_0 treated
as unknown, which the differencing removes). So at fixed theta:

* statsmodels SARIMAX(y, exog=X, order=(0,1,1), trend='n', simple_differencing=True) with
  ma.L1 held at theta (`fit_constrained`): its MLE of b (= the GLS estimate), sigma2 and the
  observed-information standard errors (cov_type='oim');
* the same GLS computed directly with numpy on the differenced data, Sigma the MA(1)
  autocovariance (1 + theta^2 on the diagonal, theta beside it): b, diag((X'S^-1X)^-1) and the
  quadratic form r'S^-1r; asserted here to agree with statsmodels.

Data: the Nile annual flow (statsmodels.datasets.nile, 'volume', 1871-1970) with three
regressors: a pulse in 1913 (the driest year of the record), a pulse in 1877, and a step from
1899 (the first Aswan dam; a dense column, which Fairlead filters directly rather than by
convolution).
"""
import numpy as np
from statsmodels.datasets import nile
from statsmodels.tsa.statespace.sarimax import SARIMAX

ALPHAS = [0.25, 0.6]


def gls(y, X, theta):
    dy = np.diff(y)
    dX = np.diff(X, axis=0)
    m = len(dy)
    S = np.diag(np.full(m, 1 + theta * theta)) + np.diag(np.full(m - 1, theta), 1) + np.diag(np.full(m - 1, theta), -1)
    Si = np.linalg.inv(S)
    A = dX.T @ Si @ dX
    b = np.linalg.solve(A, dX.T @ Si @ dy)
    r = dy - dX @ b
    return b, np.diag(np.linalg.inv(A)), float(r @ Si @ r)


def build():
    data = nile.load_pandas().data
    years = data["year"].to_numpy(dtype=int)
    y = data["volume"].to_numpy(dtype=float)
    n = len(y)
    X = np.zeros((n, 3))
    X[years == 1913, 0] = 1
    X[years == 1877, 1] = 1
    X[years >= 1899, 2] = 1
    cases = []
    for alpha in ALPHAS:
        theta = alpha - 1
        mod = SARIMAX(y, exog=X, order=(0, 1, 1), trend="n", simple_differencing=True)
        res = mod.fit_constrained({"ma.L1": theta}, disp=False, cov_type="oim", method="bfgs", maxiter=2000, gtol=1e-10)
        names = list(res.model.param_names)
        beta_sm = np.array([res.params[names.index("x%d" % (j + 1))] for j in range(3)])
        bse_sm = np.array([res.bse[names.index("x%d" % (j + 1))] for j in range(3)])
        sigma2_sm = float(res.params[names.index("sigma2")])
        b, inv_diag, quad = gls(y, X, theta)
        assert np.max(np.abs(b - beta_sm)) < 1e-3 * np.max(np.abs(b)), (b, beta_sm)
        assert abs(quad / (n - 1) - sigma2_sm) < 1e-4 * sigma2_sm, (quad / (n - 1), sigma2_sm)
        cases.append({
            "alpha": alpha,
            "theta": theta,
            "statsmodels": {"beta": beta_sm, "bse_oim": bse_sm, "sigma2": sigma2_sm},
            "gls": {"beta": b, "inverse_diagonal": inv_diag, "quadratic_form": quad, "n_differenced": n - 1},
        })
    return {
        "tbats_local_level_regression.json": {
            "series": "statsmodels.datasets.nile volume, 1871-1970",
            "regressors": ["pulse 1913", "pulse 1877", "step from 1899"],
            "y": y,
            "X": X.T,
            "cases": cases,
        }
    }
