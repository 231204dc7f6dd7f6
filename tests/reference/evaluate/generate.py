"""Reference values for the evaluation tests, from scipy and numpy (independent of tierplan).

Run with: python3 tests/reference/evaluate/generate.py  (numpy 2.4, scipy 1.17)
Writes evaluate.json next to this script. CI reads the JSON and never needs Python.
"""
import itertools
import json
import pathlib
import sys

sys.path.insert(0, str(pathlib.Path(__file__).resolve().parents[1]))
import reproducible  # noqa: E402  (tests/reference/reproducible.py)

reproducible.pin_blas()  # before numpy loads OpenBLAS

import numpy as np
from scipy import stats
from scipy.stats import qmc

CHECKSUMS = {
    "evaluate.json": "5256cbdcdf92e265afba6b2237ce8621c1b9273e192a3c289e898eb4af679cf6",
}

out = {"generatedBy": f"numpy {np.__version__}, scipy {__import__('scipy').__version__}"}

# 1. Noncentral t cdf and two-sided t-test power (scipy.stats.nct, scipy.stats.t).
nct_cases = []
for df, ncp, x in [(1, 0.5, 1.0), (3, 1.0, 2.0), (4, 2.5, 2.776), (7, 3.0, -1.0), (10, 1.5, 2.1), (25, 4.0, 2.06), (60, 0.3, 1.5), (5, -2.0, 0.5)]:
    nct_cases.append({"df": df, "ncp": ncp, "x": x, "cdf": float(stats.nct.cdf(x, df, ncp))})
out["nctCdf"] = nct_cases

power_cases = []
for df, ncp, alpha in [(1, 2.0, 0.05), (2, 3.0, 0.05), (4, 2.0, 0.05), (5, 3.3166, 0.05), (8, 1.0, 0.10), (12, 2.5, 0.01), (20, 4.0, 0.05), (40, 0.5, 0.05)]:
    tc = stats.t.ppf(1 - alpha / 2, df)
    power = 1 - stats.nct.cdf(tc, df, ncp) + stats.nct.cdf(-tc, df, ncp)
    power_cases.append({"df": df, "ncp": ncp, "alpha": alpha, "power": float(power)})
out["twoSidedPower"] = power_cases


def quadratic_row(x1, x2):
    return [1, x1, x2, x1 * x2, x1 * x1, x2 * x2]


# 2. The 3^2 grid for the full quadratic model in two factors.
grid = [(a, b) for a in (-1, 0, 1) for b in (-1, 0, 1)]
X = np.array([quadratic_row(*pt) for pt in grid], dtype=float)
N, p = X.shape
XtX = X.T @ X
C = np.linalg.inv(XtX)
# Region moments by Gauss–Legendre quadrature (exact for these polynomial degrees), uniform on [-1,1]^2.
nodes, weights = np.polynomial.legendre.leggauss(6)
W = np.zeros((p, p))
for (u, wu), (v, wv) in itertools.product(zip(nodes, weights), zip(nodes, weights)):
    f = np.array(quadratic_row(u, v))
    W += wu * wv * np.outer(f, f) / 4.0
# VIF by the regression definition 1 / (1 - R^2_j), each non-intercept column on the others.
vif = []
for j in range(1, p):
    y = X[:, j]
    others = np.delete(X, j, axis=1)  # keeps the intercept column
    coef, *_ = np.linalg.lstsq(others, y, rcond=None)
    resid = y - others @ coef
    r2 = 1 - resid @ resid / np.sum((y - y.mean()) ** 2)
    vif.append(float(1 / (1 - r2)))
# Power per term, delta = 2, alpha = 0.05: coefficient delta/range, range 2 for x, x*z and 1 for x^2.
ranges = [None, 2, 2, 2, 1, 1]
df = N - p
tc = stats.t.ppf(0.975, df)
power = [None]
for j in range(1, p):
    ncp = 2 / ranges[j] / np.sqrt(C[j, j])
    power.append(float(1 - stats.nct.cdf(tc, df, ncp) + stats.nct.cdf(-tc, df, ncp)))
d_grid = np.array(quadratic_row(0, 0))
spv = [float(N * np.array(quadratic_row(*pt)) @ C @ np.array(quadratic_row(*pt))) for pt in grid]
out["grid3x3Quadratic"] = {
    "points": [list(pt) for pt in grid],
    "dEfficiency": float(100 * np.linalg.det(XtX) ** (1 / p) / N),
    "aCriterion": float(np.trace(C) / p),
    "iCriterion": float(np.trace(C @ W)),
    "moments": W.flatten().tolist(),
    "standardErrors": np.sqrt(np.diag(C)).tolist(),
    "vif": vif,
    "power": power,
    "gEfficiencyOnGrid": float(100 * p / max(spv)),
}

# 3. Face-centred composite in 2 factors with 3 centre runs, quadratic model: FDS median on the
#    unscrambled Halton sample of scipy (points 21..4116 mapped to [-1,1]^2).
ccd = [(-1, -1), (1, -1), (-1, 1), (1, 1), (-1, 0), (1, 0), (0, -1), (0, 1), (0, 0), (0, 0), (0, 0)]
Xc = np.array([quadratic_row(*pt) for pt in ccd], dtype=float)
Cc = np.linalg.inv(Xc.T @ Xc)
halton = qmc.Halton(d=2, scramble=False)
halton.fast_forward(21)
sample = 2 * halton.random(4096) - 1
upv = np.array([np.array(quadratic_row(*s)) @ Cc @ np.array(quadratic_row(*s)) for s in sample])
vif_ccd = []
for j in range(1, Xc.shape[1]):
    y = Xc[:, j]
    others = np.delete(Xc, j, axis=1)
    coef, *_ = np.linalg.lstsq(others, y, rcond=None)
    resid = y - others @ coef
    vif_ccd.append(float(np.sum((y - y.mean()) ** 2) / (resid @ resid)))
out["ccdFace2FdsSample"] = {
    "points": [list(pt) for pt in ccd],
    "vif": vif_ccd,
    "firstSamplePoint": sample[0].tolist(),
    "medianVariance": float(np.median(upv)),
    "quantile90Variance": float(np.quantile(upv, 0.9)),
    "maxVariance": float(upv.max()),
    "minVariance": float(upv.min()),
}

# 4. 2^3 full factorial + 3 centre runs, model with main effects and two-factor interactions.
ff = [list(v) for v in itertools.product((-1, 1), repeat=3)] + [[0, 0, 0]] * 3
Xf = np.array([[1, a, b, c, a * b, a * c, b * c] for a, b, c in ff], dtype=float)
Cf = np.linalg.inv(Xf.T @ Xf)
dff = Xf.shape[0] - Xf.shape[1]
tcf = stats.t.ppf(0.975, dff)
ncpf = 1 / np.sqrt(Cf[1, 1])
out["factorial2cubedCentre3"] = {
    "dEfficiency": float(100 * np.linalg.det(Xf.T @ Xf) ** (1 / 7) / len(ff)),
    "residualDf": int(dff),
    "mainEffectPower": float(1 - stats.nct.cdf(tcf, dff, ncpf) + stats.nct.cdf(-tcf, dff, ncpf)),
}

# 5. One factor at four equally spaced levels (-1, -1/3, 1/3, 1), each twice, + 3 centre runs,
#    cubic model 1, x, x^2, x^3. Power convention of termPower.ts: the term alone moves the
#    response by delta*sigma across [-1, 1], so beta = delta/2 for x and x^3 (range 2) and
#    delta/1 for x^2 (range 1); delta = 2, alpha = 0.05. VIF = 1/(1 - R^2) of each column
#    regressed on the others (with intercept), the textbook definition.
levels4 = [-1.0, -1.0 / 3.0, 1.0 / 3.0, 1.0]
xc = np.array(levels4 * 2 + [0.0] * 3)
Xc = np.column_stack([np.ones_like(xc), xc, xc**2, xc**3])
Cc = np.linalg.inv(Xc.T @ Xc)
dfc = Xc.shape[0] - Xc.shape[1]
tcc = stats.t.ppf(0.975, dfc)
ranges = [None, 2.0, 1.0, 2.0]
cubic_terms = []
for j, name in enumerate(["1", "x", "x^2", "x^3"]):
    se = float(np.sqrt(Cc[j, j]))
    if j == 0:
        cubic_terms.append({"term": name, "standardError": se, "vif": None, "power": None})
        continue
    ncp = 2.0 / ranges[j] / se
    others = np.delete(Xc, j, axis=1)
    coef, *_ = np.linalg.lstsq(others, Xc[:, j], rcond=None)
    resid = Xc[:, j] - others @ coef
    r2 = 1 - resid @ resid / np.sum((Xc[:, j] - Xc[:, j].mean()) ** 2)
    cubic_terms.append({
        "term": name,
        "standardError": se,
        "vif": float(1 / (1 - r2)),
        "power": float(stats.nct.sf(tcc, dfc, ncp) + stats.nct.cdf(-tcc, dfc, ncp)),
    })
out["cubic1FourLevels"] = {"points": [[float(v)] for v in xc], "residualDf": int(dfc), "terms": cubic_terms}

path = pathlib.Path(__file__).with_name("evaluate.json")
path.write_text(json.dumps(out, indent=2) + "\n")
print(f"wrote {path}")
reproducible.check(pathlib.Path(__file__).parent, CHECKSUMS)
