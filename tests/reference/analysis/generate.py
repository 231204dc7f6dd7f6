"""Reference values for the least-squares analysis tests, from numpy and scipy (independent of tierplan).

Run with: python3 tests/reference/analysis/generate.py  (numpy 2.4, scipy 1.17)
Writes analysis.json next to this script; the output is the same byte for byte on every run
(fixed seed). CI reads the JSON and never needs Python.

Every quantity is computed the textbook way, on purpose unlike the TypeScript code:
coefficients by numpy.linalg.lstsq (SVD), the hat matrix as X (X'X)^-1 X' from numpy.linalg.inv,
PRESS from refitting without each run, prediction intervals from scipy.stats.t, engineering
coefficients by fitting the same model directly in engineering units.

Cases
1. montgomeryCcd: the two-factor central composite design of Montgomery, "Design and Analysis of
   Experiments" (the chemical-process yield example: time 80-90 min, temperature 170-180 degC,
   axial distance sqrt(2), five centre runs). The 13 yields are typed FROM MEMORY; this script
   is the independent check that they reproduce the published fit (see the test for the
   published values).
2. diagnostics: an invented face-centred composite design in three factors (14 distinct points,
   four centre runs), full quadratic model, responses from a cubic truth plus seeded noise;
   four interior holdout points.
3. blocked: case 2 split into two sessions (effects-coded block column) with a session shift.
"""
import itertools
import json
import pathlib
import sys

sys.path.insert(0, str(pathlib.Path(__file__).resolve().parents[1]))
import reproducible  # noqa: E402  (tests/reference/reproducible.py)

reproducible.pin_blas()  # before numpy loads OpenBLAS

import numpy as np
import scipy
from scipy import stats

CHECKSUMS = {
    "analysis.json": "2091a21490d3f61da1e375bf29dc1e68f9d52dc8eb5af234b808f1f126d08fbf",
}

out = {"generatedBy": f"numpy {np.__version__}, scipy {scipy.__version__}"}


def quadratic_terms(k):
    """Exponent vectors of the full quadratic model: intercept, mains, squares, two-factor interactions."""
    terms = [[0] * k]
    for j in range(k):
        e = [0] * k; e[j] = 1; terms.append(e)
    for j in range(k):
        e = [0] * k; e[j] = 2; terms.append(e)
    for a, b in itertools.combinations(range(k), 2):
        e = [0] * k; e[a] = 1; e[b] = 1; terms.append(e)
    return terms


def rows(points, terms):
    return np.array([[np.prod([x[j] ** e[j] for j in range(len(e))]) for e in terms] for x in points], dtype=float)


def full_analysis(points, y, terms, groups, holdouts, holdout_y, extra_columns=None, holdout_extra=None):
    X = rows(points, terms)
    if extra_columns is not None:
        X = np.hstack([X, extra_columns])
    n, q = X.shape
    beta, *_ = np.linalg.lstsq(X, y, rcond=None)
    XtXi = np.linalg.inv(X.T @ X)
    H = X @ XtXi @ X.T
    h = np.diag(H)
    fitted = X @ beta
    e = y - fitted
    df = n - q
    rss = float(e @ e)
    s = np.sqrt(rss / df)
    se = s * np.sqrt(np.diag(XtXi))
    t = beta / se
    tcrit = stats.t.ppf(0.975, df)
    r = e / (s * np.sqrt(1 - h))
    cook = r ** 2 * h / (q * (1 - h))
    # PRESS by refitting n times without each run.
    press = 0.0
    for i in range(n):
        keep = np.arange(n) != i
        b_i, *_ = np.linalg.lstsq(X[keep], y[keep], rcond=None)
        press += float((y[i] - X[i] @ b_i) ** 2)
    sst = float(((y - y.mean()) ** 2).sum())
    # Baseline: intercept plus any extra (block) columns.
    B = np.ones((n, 1)) if extra_columns is None else np.hstack([np.ones((n, 1)), extra_columns])
    bb, *_ = np.linalg.lstsq(B, y, rcond=None)
    rss0 = float(((y - B @ bb) ** 2).sum())
    model_df = q - B.shape[1]
    model_ss = rss0 - rss
    model_f = model_ss / model_df / (rss / df)
    # Pure error from replicate groups.
    groups = np.asarray(groups)
    pe_ss = float(sum(((y[groups == g] - y[groups == g].mean()) ** 2).sum() for g in np.unique(groups)))
    m = len(np.unique(groups))
    pe_df = n - m
    lof_df = m - q
    lof_ss = rss - pe_ss
    lof_f = lof_ss / lof_df / (pe_ss / pe_df)
    res = {
        "coefficients": beta.tolist(),
        "standardErrors": se.tolist(),
        "t": t.tolist(),
        "p": (2 * stats.t.sf(np.abs(t), df)).tolist(),
        "lower": (beta - tcrit * se).tolist(),
        "upper": (beta + tcrit * se).tolist(),
        "fitted": fitted.tolist(),
        "residuals": e.tolist(),
        "leverages": h.tolist(),
        "studentised": r.tolist(),
        "cooksDistance": cook.tolist(),
        "residualSd": float(s),
        "residualDf": int(df),
        "rSquared": 1 - rss / sst,
        "adjustedRSquared": 1 - rss / df / (sst / (n - 1)),
        "press": press,
        "predictedRSquared": 1 - press / sst,
        "anova": {
            "model": {"df": int(model_df), "ss": model_ss, "F": model_f, "p": float(stats.f.sf(model_f, model_df, df))},
            "residual": {"df": int(df), "ss": rss},
            "lackOfFit": {"df": int(lof_df), "ss": lof_ss, "F": lof_f, "p": float(stats.f.sf(lof_f, lof_df, pe_df))},
            "pureError": {"df": int(pe_df), "ss": pe_ss},
        },
    }
    if holdouts is not None:
        Xh = rows(holdouts, terms)
        if holdout_extra is not None:
            Xh = np.hstack([Xh, holdout_extra])
        pred = Xh @ beta
        half = tcrit * s * np.sqrt(1 + np.einsum("ij,jk,ik->i", Xh, XtXi, Xh))
        lower, upper = pred - half, pred + half
        inside = (holdout_y >= lower) & (holdout_y <= upper)
        err = holdout_y - pred
        res["holdout"] = {
            "predicted": pred.tolist(),
            "lower": lower.tolist(),
            "upper": upper.tolist(),
            "inside": inside.tolist(),
            "rmsPredictionError": float(np.sqrt(np.mean(err ** 2))),
        }
    return res


# 1. Montgomery's two-factor central composite design (data typed from memory; see the docstring).
a = np.sqrt(2)
ccd_points = [(-1, -1), (-1, 1), (1, -1), (1, 1), (0, 0), (0, 0), (0, 0), (0, 0), (0, 0), (a, 0), (-a, 0), (0, a), (0, -a)]
ccd_yield = np.array([76.5, 77.0, 78.0, 79.5, 79.9, 80.3, 80.0, 79.7, 79.8, 78.4, 75.6, 78.5, 77.0])
ccd_terms = [[0, 0], [1, 0], [0, 1], [2, 0], [0, 2], [1, 1]]
ccd_groups = [0, 1, 2, 3, 4, 4, 4, 4, 4, 5, 6, 7, 8]
ccd = full_analysis(ccd_points, ccd_yield, ccd_terms, ccd_groups, None, None)
# Engineering units: time = 85 + 5 x1 (min), temperature = 175 + 5 x2 (degC), fitted directly.
eng_points = [(85 + 5 * u, 175 + 5 * v) for u, v in ccd_points]
ccd["engineering"] = np.linalg.lstsq(rows(eng_points, ccd_terms), ccd_yield, rcond=None)[0].tolist()
out["montgomeryCcd"] = {
    "terms": ccd_terms,
    "points": [list(map(float, pt)) for pt in ccd_points],
    "observed": ccd_yield.tolist(),
    "ranges": [[80, 90], [170, 180]],
    **ccd,
}

# 2. Invented face-centred composite in three factors, quadratic model, cubic truth.
rng = np.random.default_rng(20240611)
k = 3
corners = list(itertools.product([-1.0, 1.0], repeat=k))
axial = []
for j in range(k):
    for s_ in (-1.0, 1.0):
        pt = [0.0] * k; pt[j] = s_; axial.append(tuple(pt))
centre = [(0.0, 0.0, 0.0)] * 4
points = corners + axial + centre
terms = quadratic_terms(k)


def truth(x):
    x1, x2, x3 = x
    return 50 + 4 * x1 - 2.5 * x2 + 1.2 * x3 - 3 * x1 ** 2 + 0.8 * x2 ** 2 + 1.5 * x1 * x2 - 0.6 * x2 * x3 + 1.1 * x1 ** 3


noise_sd = 0.6
y = np.array([truth(x) for x in points]) + rng.normal(0, noise_sd, len(points))
groups = []
seen = {}
for pt in points:
    groups.append(seen.setdefault(pt, len(seen)))
holdouts = [(0.5, -0.5, 0.5), (-0.5, 0.5, -0.5), (0.5, 0.5, -0.5), (-0.5, -0.5, 0.5)]
holdout_y = np.array([truth(x) for x in holdouts]) + rng.normal(0, noise_sd, len(holdouts))
diag = full_analysis(points, y, terms, groups, holdouts, holdout_y)
ranges = [[160.0, 200.0], [8.0, 14.0], [0.3, 0.7]]
eng = [tuple(lo + (c + 1) / 2 * (hi - lo) for c, (lo, hi) in zip(pt, ranges)) for pt in points]
diag["engineering"] = np.linalg.lstsq(rows(eng, terms), y, rcond=None)[0].tolist()
out["diagnostics"] = {
    "terms": terms,
    "points": [list(pt) for pt in points],
    "observed": y.tolist(),
    "ranges": ranges,
    "holdoutPoints": [list(pt) for pt in holdouts],
    "holdoutObserved": holdout_y.tolist(),
    **diag,
}

# 3. The same runs in two sessions: runs alternate between sessions 1 and 2, session 2 reads
#    1.5 higher. Effects coding: +1 in session 1, -1 in session 2. Replicates are groups of
#    identical points within one session.
sessions = [1 + (i % 2) for i in range(len(points))]
shift = np.array([0.0 if s_ == 1 else 1.5 for s_ in sessions])
y_blocked = y + shift
block = np.array([[1.0 if s_ == 1 else -1.0] for s_ in sessions])
bgroups = []
bseen = {}
for pt, s_ in zip(points, sessions):
    bgroups.append(bseen.setdefault((pt, s_), len(bseen)))
blocked = full_analysis(points, y_blocked, terms, bgroups, None, None, extra_columns=block)
out["blocked"] = {
    "terms": terms,
    "points": [list(pt) for pt in points],
    "sessions": sessions,
    "observed": y_blocked.tolist(),
    **blocked,
}

path = pathlib.Path(__file__).with_name("analysis.json")
path.write_text(json.dumps(out, indent=1) + "\n")
print(f"wrote {path}")
reproducible.check(pathlib.Path(__file__).parent, CHECKSUMS)
