"""Reference REML fits of split-plot data: a random whole-plot intercept plus fixed effects.

Run with: /usr/bin/python3 tests/reference/reml/generate.py
          (Debian's python3 with python3-statsmodels 0.13, numpy 1.24, scipy 1.10)
Writes reml.json next to this script; the output is the same byte for byte on every run
(fixed seeds). CI reads the JSON and never needs Python.

Two independent references per case:
- statsmodels MixedLM(reml=True): fixed effects, whole-plot variance (cov_re), run variance
  (scale) and the restricted log-likelihood (llf);
- a direct maximisation, with scipy.optimize.minimize_scalar, of the restricted
  log-likelihood in Harville's (1977) form, written with dense matrices and numpy.linalg.inv:
    l_R = -1/2 [ (n-p) ln 2pi + ln|V| + ln|X'V^-1 X| + r'V^-1 r ],  V = s2 (I + g Z Z').
Standard errors are the plug-in GLS ones, sqrt(diag(s2 (X' H^-1 X)^-1)) at the estimates.
(statsmodels' bse_fe comes from the inverse of the joint observed information of fixed
effects and variance parameters, which differs from the plug-in value in the third or fourth
digit; it is recorded too, as `statsmodelsBse`, and not used by the tests.)
Containment df and prediction intervals for one new run in a new whole plot are computed
here by their definitions (see src/core/analysis/wholePlotReml.ts).
"""
import json
import pathlib
import sys
import warnings

sys.path.insert(0, str(pathlib.Path(__file__).resolve().parents[1]))
import reproducible  # noqa: E402  (tests/reference/reproducible.py)

reproducible.pin_blas()  # before numpy loads OpenBLAS

import numpy as np
import scipy
import statsmodels
import statsmodels.api as sm
from scipy import optimize, stats

CHECKSUMS = {
    "reml.json": "436515fb4af011fe93b800e459ab1e55834080dde7a3e0312b94c4e6095e3ed0",
}

warnings.simplefilter("ignore")


def H_matrix(plots, gamma):
    same = (plots[:, None] == plots[None, :]).astype(float)
    return np.eye(len(plots)) + gamma * same


def profile(X, y, plots, gamma):
    n, p = X.shape
    H = H_matrix(plots, gamma)
    Hi = np.linalg.inv(H)
    A = X.T @ Hi @ X
    beta = np.linalg.solve(A, X.T @ Hi @ y)
    r = y - X @ beta
    s2 = float(r @ Hi @ r) / (n - p)
    V = s2 * H
    Vi = np.linalg.inv(V)
    ll = -0.5 * ((n - p) * np.log(2 * np.pi) + np.linalg.slogdet(V)[1] + np.linalg.slogdet(X.T @ Vi @ X)[1] + float(r @ Vi @ r))
    return ll, beta, s2, A


def reml_direct(X, y, plots):
    res = optimize.minimize_scalar(lambda t: -profile(X, y, plots, np.exp(t))[0], bounds=(-14, 14), method="bounded",
                                   options={"xatol": 1e-12})
    gamma = float(np.exp(res.x))
    ll0 = profile(X, y, plots, 0.0)[0]
    if ll0 >= -res.fun:
        gamma = 0.0
    ll, beta, s2, A = profile(X, y, plots, gamma)
    cov = s2 * np.linalg.inv(A)
    return gamma, ll, beta, s2, cov


def containment_df(X, plots):
    W = len(np.unique(plots))
    whole = [all(np.ptp(X[plots == g, j]) == 0 for g in np.unique(plots)) for j in range(X.shape[1])]
    rw = sum(whole)
    n, p = X.shape
    return whole, W - rw, n - W - (p - rw)


def case(X, y, plots, new_rows, with_statsmodels=True):
    gamma, ll, beta, s2, cov = reml_direct(X, y, plots)
    whole, wdf, sdf = containment_df(X, plots)
    df = [wdf if w else sdf for w in whole]
    se = np.sqrt(np.diag(cov))
    pred_df = wdf if gamma > 0 else sdf
    tq = stats.t.ppf(0.975, pred_df)
    new_rows = np.asarray(new_rows, dtype=float)
    pred = new_rows @ beta
    half = tq * np.sqrt(np.einsum("ij,jk,ik->i", new_rows, cov, new_rows) + gamma * s2 + s2)
    out = {
        "X": X.tolist(),
        "y": y.tolist(),
        "wholePlot": (plots + 1).tolist(),
        "direct": {
            "ratio": gamma,
            "wholePlotVariance": gamma * s2,
            "runVariance": s2,
            "restrictedLogLikelihood": ll,
            "coefficients": beta.tolist(),
            "standardErrors": se.tolist(),
            "t": (beta / se).tolist(),
            "p": [float(2 * stats.t.sf(abs(b / s), d)) for b, s, d in zip(beta, se, df)],
        },
        "wholePlotLevel": whole,
        "wholePlotDf": int(wdf),
        "withinPlotDf": int(sdf),
        "newRows": new_rows.tolist(),
        "prediction": {"predicted": pred.tolist(), "lower": (pred - half).tolist(), "upper": (pred + half).tolist(), "df": int(pred_df)},
    }
    if with_statsmodels:
        fit = sm.MixedLM(y, X, groups=plots).fit(reml=True)
        sm_g = float(fit.cov_re[0, 0]) / float(fit.scale)
        _, _, _, A = profile(X, y, plots, sm_g)
        out["statsmodels"] = {
            "coefficients": fit.fe_params.tolist(),
            "wholePlotVariance": float(fit.cov_re[0, 0]),
            "runVariance": float(fit.scale),
            "restrictedLogLikelihood": float(fit.llf),
            "plugInStandardErrors": np.sqrt(np.diag(float(fit.scale) * np.linalg.inv(A))).tolist(),
            "statsmodelsBse": fit.bse_fe.tolist(),
            "converged": bool(fit.converged),
        }
    return out


out = {"generatedBy": f"statsmodels {statsmodels.__version__}, numpy {np.__version__}, scipy {scipy.__version__}"}

# 1. Eight whole plots of four runs. Whole-plot factor w (hard to change) at -1, 0, 1; within-plot
#    factors s1 (three levels) and s2 (two levels). Model: 1, w, s1, s2, w*s1, w*s2, s1*s2, s1^2.
rng = np.random.default_rng(31)
w_levels = np.array([-1, 1, 0, -1, 1, 0, 1, -1], dtype=float)
plots = np.repeat(np.arange(8), 4)
w = w_levels[plots]
s1 = rng.choice([-1.0, 0.0, 1.0], size=32)
s2 = rng.choice([-1.0, 1.0], size=32)


def split_rows(w, s1, s2):
    return np.column_stack([np.ones_like(w), w, s1, s2, w * s1, w * s2, s1 * s2, s1 ** 2])


X1 = split_rows(w, s1, s2)
truth = X1 @ np.array([20.0, 2.0, -1.5, 0.8, 0.6, 0.0, -0.4, 1.0])
y1 = truth + rng.normal(0, 0.8, 8)[plots] + rng.normal(0, 0.4, 32)
new1 = split_rows(np.array([0.5, -0.5]), np.array([0.5, -0.5]), np.array([0.5, 0.5]))
out["splitPlot"] = case(X1, y1, plots, new1)

# 2. Twelve whole plots of three runs in three sessions (four plots each); sessions are fixed
#    blocks with effects coding (session 1: +1, 0; session 2: 0, +1; session 3: -1, -1).
#    Model: 1, w, s1, w*s1, then the two session columns.
rng = np.random.default_rng(47)
plots2 = np.repeat(np.arange(12), 3)
session_of_plot = np.repeat(np.arange(3), 4)
w2 = np.array([-1, 1, -1, 1, 1, -1, 1, -1, -1, 1, 1, -1], dtype=float)[plots2]
s12 = np.tile([-1.0, 0.0, 1.0], 12)
rng.shuffle(s12)
sess = session_of_plot[plots2]
b1 = np.select([sess == 0, sess == 1], [1.0, 0.0], -1.0)
b2 = np.select([sess == 0, sess == 1], [0.0, 1.0], -1.0)
X2 = np.column_stack([np.ones(36), w2, s12, w2 * s12, b1, b2])
y2 = X2 @ np.array([10.0, 1.2, -0.7, 0.5, 0.9, -0.3]) + rng.normal(0, 0.6, 12)[plots2] + rng.normal(0, 0.3, 36)
new2 = np.array([[1.0, 0.3, -0.2, -0.06, 0.0, 0.0]])
out["sessions"] = case(X2, y2, plots2, new2)
out["sessions"]["session"] = (sess + 1).tolist()

# 3. No whole-plot variance in the data: the first seed whose REML maximum lies on the boundary
#    gamma = 0, where the fit equals ordinary least squares.
for seed in range(100, 200):
    rng = np.random.default_rng(seed)
    s1b = rng.choice([-1.0, 0.0, 1.0], size=32)
    s2b = rng.choice([-1.0, 1.0], size=32)
    X3 = split_rows(w, s1b, s2b)
    y3 = X3 @ np.array([5.0, 1.0, 0.5, -0.5, 0.0, 0.3, 0.2, -0.6]) + rng.normal(0, 0.5, 32)
    if reml_direct(X3, y3, plots)[0] == 0.0:
        out["boundary"] = case(X3, y3, plots, new1, with_statsmodels=False)
        out["boundary"]["seed"] = seed
        break

path = pathlib.Path(__file__).with_name("reml.json")
path.write_text(json.dumps(out, indent=1) + "\n")
print(f"wrote {path}")
reproducible.check(pathlib.Path(__file__).parent, CHECKSUMS)
