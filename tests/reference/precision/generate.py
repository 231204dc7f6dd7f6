"""Reference values for the precision tests (effect sizes, noncentral F power, orthogonal
polynomial coding, the potential-term prior and exhaustive design optima), from numpy/scipy.

Run with: python3 tests/reference/precision/generate.py  (numpy 2.4, scipy 1.17)
Writes precision.json next to this script, byte for byte the same on every run (fixed seeds,
sorted keys). CI reads the JSON and never needs Python.

Independent of the TypeScript code paths:
- noncentral F from scipy.stats.ncf (Boost's implementation), critical values from scipy.stats.f;
- inverses and determinants with numpy.linalg (LU / LAPACK), never Cholesky;
- Sobol' indices both in closed form and estimated by scipy.stats.sobol_indices (Saltelli/Jansen
  estimators, seeded);
- Legendre polynomials from numpy.polynomial.legendre;
- exact design optima by enumerating every multiset of candidate points.
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
from numpy.polynomial import legendre
from numpy.polynomial.legendre import leggauss
from scipy import stats

CHECKSUMS = {
    "precision.json": "b3746fdcda8aae21e02c536cba8a027f882c1b1f1669655ca94c29d80efbdf7e",
}

out = {"generatedBy": f"numpy {np.__version__}, scipy {scipy.__version__}"}


def r(x):
    """Rounded to 15 significant digits, so the JSON does not change with the last bit of LAPACK."""
    return float(f"{float(x):.15g}")


# 1. Noncentral F: cdf and power 1 - F_nc(F_crit(q, nu, alpha); q, nu, lambda).
cdf_cases = []
for x, dfn, dfd, nc in [
    (0.5, 1, 4, 0.0), (2.0, 1, 4, 8.0), (7.7086, 1, 4, 18.0), (1.0, 2, 10, 1.5), (3.5, 3, 7, 12.0),
    (0.2, 4, 20, 0.5), (5.0, 2, 30, 40.0), (2.5, 6, 15, 100.0), (1.2, 1, 2, 3.0), (12.0, 3, 60, 250.0),
    (0.05, 2, 5, 0.2), (30.0, 1, 3, 900.0),
]:
    cdf_cases.append({"x": x, "dfn": dfn, "dfd": dfd, "nc": nc, "cdf": r(stats.ncf.cdf(x, dfn, dfd, nc)) if nc > 0 else r(stats.f.cdf(x, dfn, dfd))})
out["ncfCdf"] = cdf_cases

power_cases = []
for q, nu, lam, alpha in [
    (1, 4, 8.0, 0.05), (1, 4, 18.0, 0.05), (2, 10, 6.0, 0.05), (3, 12, 15.0, 0.05), (2, 5, 20.0, 0.01),
    (1, 30, 4.0, 0.10), (4, 8, 0.0, 0.05), (2, 3, 35.0, 0.05), (3, 100, 9.0, 0.05), (1, 1, 50.0, 0.05),
    (2, 20, 400.0, 0.05), (5, 40, 2.0, 0.05),
]:
    crit = stats.f.ppf(1 - alpha, q, nu)
    power = stats.ncf.sf(crit, q, nu, lam) if lam > 0 else alpha
    power_cases.append({"q": q, "nu": nu, "lambda": lam, "alpha": alpha, "critical": r(crit), "power": r(power)})
out["ncfPower"] = power_cases

# 2. The 2^3 factorial, main-effects model (p = 4), N = 8, nu = 4: a main effect that moves the
#    response by Delta across the range has coded coefficient beta = Delta / 2; C_jj = 1/8, so
#    lambda = beta^2 / (sigma^2 C_jj) = 8 beta^2 / sigma^2.
X = np.array([[1, a, b, c] for a in (-1, 1) for b in (-1, 1) for c in (-1, 1)], dtype=float)
C = np.linalg.inv(X.T @ X)
crit = stats.f.ppf(0.95, 1, 4)
factorial = {"covariance": r(C[1, 1]), "critical": r(crit), "cases": []}
for delta in (2.0, 3.0):
    beta = delta / 2
    lam = beta ** 2 / C[1, 1]
    factorial["cases"].append({"deltaInNoise": delta, "beta": beta, "lambda": r(lam), "power": r(stats.ncf.sf(crit, 1, 4, lam))})
out["factorial2cubed"] = factorial

# 3. Joint test of a factor block: one factor at 4 levels (-1, -1/3, 1/3, 1) twice each plus two
#    runs at 0 of a second factor ... kept simple: design rows below, model 1, x, x^2, x^3, z.
pts = [(-1, -1), (-1, 1), (-1 / 3, 0), (1 / 3, 0), (1, -1), (1, 1), (0, -1), (0, 1), (-1 / 3, 1), (1 / 3, -1)]
def row_block(x, z):
    return [1, x, x * x, x ** 3, z]
Xb = np.array([row_block(*pt) for pt in pts])
Cb = np.linalg.inv(Xb.T @ Xb)
T = [1, 2, 3]
C_TT = Cb[np.ix_(T, T)]
b = np.array([0.7, 0.0, 0.0])
lam = float(b @ np.linalg.solve(C_TT, b))
nu = len(pts) - Xb.shape[1]
crit = stats.f.ppf(0.95, 3, nu)
out["blockPower"] = {
    "points": [list(map(r, pt)) for pt in pts],
    "terms": ["1", "x", "x^2", "x^3", "z"],
    "block": T,
    "coefficients": b.tolist(),
    "sigma": 1.0,
    "covarianceBlock": [[r(v) for v in rowv] for rowv in C_TT],
    "nu": nu,
    "lambda": r(lam),
    "power": r(stats.ncf.sf(crit, 3, nu, lam)),
    # The same effect with sigma = 0.5 (lambda x 4).
    "powerHalfSigma": r(stats.ncf.sf(crit, 3, nu, 4 * lam)),
}

# 4. Sobol' indices <-> coefficients. y = x1 + 2 x2 + 3 x3, x uniform on [-1, 1]: Var = 14/3,
#    S_i = c_i^2 / 14. y = x1 x2: Var = 1/9, S_12 = 1 (first orders 0).
rng = np.random.default_rng(20261202)
dists = [stats.uniform(loc=-1, scale=2)] * 3
def linear(x):
    return x[0] + 2 * x[1] + 3 * x[2]
res = stats.sobol_indices(func=linear, n=2 ** 14, dists=dists, rng=rng)
rng2 = np.random.default_rng(20261203)
def bilinear(x):
    return x[0] * x[1]
res2 = stats.sobol_indices(func=bilinear, n=2 ** 14, dists=[stats.uniform(loc=-1, scale=2)] * 2, rng=rng2)
out["sobol"] = {
    "linear": {
        "coefficients": [1, 2, 3],
        "spread": r(np.sqrt(14 / 3)),
        "firstExact": [r(1 / 14), r(4 / 14), r(9 / 14)],
        "firstScipy": [r(v) for v in res.first_order],
        "totalScipy": [r(v) for v in res.total_order],
    },
    "bilinear": {
        "coefficient": 1,
        "spread": r(1 / 3),
        "firstScipy": [r(v) for v in res2.first_order],
        "totalScipy": [r(v) for v in res2.total_order],
        # S_12 = total - first of either factor (two inputs only).
        "secondScipy": r(res2.total_order[0] - res2.first_order[0]),
    },
}

# 5. Raw against Legendre coding: one factor at 5 levels, cubic model, 7 runs.
levels = [-1, -0.5, 0, 0.5, 1]
xs = np.array([-1, -1, -0.5, 0, 0.5, 1, 1], dtype=float)
raw = np.stack([xs ** d for d in range(4)], axis=1)
leg = np.stack([legendre.legval(xs, [0] * d + [1]) for d in range(4)], axis=1)
def se_and_vif(M):
    Cm = np.linalg.inv(M.T @ M)
    se = np.sqrt(np.diag(Cm))
    vif = []
    for j in range(1, M.shape[1]):
        yv = M[:, j]
        others = np.delete(M, j, axis=1)
        coef, *_ = np.linalg.lstsq(others, yv, rcond=None)
        resid = yv - others @ coef
        r2 = 1 - resid @ resid / np.sum((yv - yv.mean()) ** 2)
        vif.append(r(1 / (1 - r2)))
    return [r(v) for v in se], vif
se_raw, vif_raw = se_and_vif(raw)
se_leg, vif_leg = se_and_vif(leg)
# A true cubic 0.4 x^3 + 0.3 x: noncentrality of the top-order term's t test in each coding.
true_raw = np.array([0.0, 0.3, 0.0, 0.4])
# x^3 = (2 P3 + 3 P1) / 5, so the same function in Legendre coefficients:
true_leg = np.array([0.0, 0.3 + 0.4 * 3 / 5, 0.0, 0.4 * 2 / 5])
out["legendre"] = {
    "points": xs.tolist(),
    "seRaw": se_raw, "vifRaw": vif_raw,
    "seLegendre": se_leg, "vifLegendre": vif_leg,
    "topNoncentralityRaw": r(true_raw[3] / se_raw[3]),
    "topNoncentralityLegendre": r(true_leg[3] / se_leg[3]),
    "p3At": {str(v): r(legendre.legval(v, [0, 0, 0, 1])) for v in levels},
}

# 6. Potential terms (DuMouchel & Jones 1994): potential columns regressed on the primary ones
#    over the candidate set, residuals R scaled by their range: Z = R / (max R - min R).
#    Bayesian D criterion |X~'X~ + K / tau^2| with X~ = [X_pri, Z], K = diag(0, I).
def dj_case(cands, primary, potential, design_idx, tau=1.0):
    Fp = np.array([[f(x) for f in primary] for x in cands])
    Fq = np.array([[f(x) for f in potential] for x in cands])
    alpha, *_ = np.linalg.lstsq(Fp, Fq, rcond=None)
    R = Fq - Fp @ alpha
    rng_ = R.max(axis=0) - R.min(axis=0)
    Z = R / rng_
    Xt = np.hstack([Fp, Z])[design_idx]
    K = np.diag([0.0] * Fp.shape[1] + [1.0] * Fq.shape[1])
    crit = np.linalg.slogdet(Xt.T @ Xt + K / tau ** 2)[1]
    Xraw = np.hstack([Fp, Fq])[design_idx]
    return {
        "alpha": [[r(v) for v in rowv] for rowv in alpha],
        "ranges": [r(v) for v in rng_],
        "adjustedRows": [[r(v) for v in rowv] for rowv in np.hstack([Fp, Z])],
        "design": list(map(int, design_idx)),
        "logDetBayes": r(crit),
        "logDetPlain": r(np.linalg.slogdet(Xraw[:, : Fp.shape[1]].T @ Xraw[:, : Fp.shape[1]])[1]),
    }

cands1 = [(-1,), (-1 / 3,), (1 / 3,), (1,)]
out["potentialOneFactor"] = {
    "candidates": [list(map(r, c)) for c in cands1],
    "primary": ["1", "x", "x^2"], "potential": ["x^3"],
    **dj_case(cands1, [lambda x: 1.0, lambda x: x[0], lambda x: x[0] ** 2], [lambda x: x[0] ** 3], np.array([0, 0, 1, 2, 3, 3])),
}
cands2 = [(a, b) for a in (-1, 0, 1) for b in (-1, 0, 1)]
out["potentialTwoFactors"] = {
    "candidates": [list(c) for c in cands2],
    "primary": ["1", "x1", "x2"], "potential": ["x1*x2", "x1^2", "x2^2"],
    **dj_case(
        cands2,
        [lambda x: 1.0, lambda x: x[0], lambda x: x[1]],
        [lambda x: x[0] * x[1], lambda x: x[0] ** 2, lambda x: x[1] ** 2],
        np.array([0, 2, 4, 6, 8, 1]),
    ),
}

# 7. Exact optima by exhaustive enumeration of every multiset of N candidate points.
def exponents_row(exps, x):
    return [np.prod([xi ** e for xi, e in zip(x, t)]) for t in exps]

def box_moments(exps, k):
    nodes, weights = leggauss(8)
    W = np.zeros((len(exps), len(exps)))
    for idx in itertools.product(range(len(nodes)), repeat=k):
        x = [nodes[i] for i in idx]
        w = np.prod([weights[i] for i in idx]) / 2 ** k
        f = np.array(exponents_row(exps, x))
        W += w * np.outer(f, f)
    return W

def exhaustive(name, levels, feasible, exps, N, criterion="D"):
    k = len(levels)
    cands = [x for x in itertools.product(*levels) if feasible(x)]
    F = np.array([exponents_row(exps, x) for x in cands])
    p = F.shape[1]
    combos = np.array(list(itertools.combinations_with_replacement(range(len(cands)), N)))
    Xs = F[combos]  # (m, N, p)
    M = np.einsum("mni,mnj->mij", Xs, Xs)
    sign, logdet = np.linalg.slogdet(M)
    ok = sign > 0
    entry = {"name": name, "levels": levels, "exponents": exps, "runs": N, "candidates": len(cands), "criterion": criterion}
    if criterion == "D":
        best = logdet[ok].max()
        entry["bestLogDetPerRun"] = r(best - p * np.log(N))
        entry["optimalDesigns"] = int(np.sum(np.abs(logdet[ok] - best) < 1e-9))
    else:
        W = box_moments(exps, k)
        good = np.where(ok & (logdet > -20))[0]
        inv = np.linalg.inv(M[good])
        tr = np.einsum("mij,ji->m", inv, W)
        entry["bestICriterion"] = r(tr.min())
        entry["multisets"] = int(len(combos))
    entry["multisets"] = int(len(combos))
    return entry

third = 1 / 3
quad2 = [[0, 0], [1, 0], [0, 1], [2, 0], [0, 2], [1, 1]]
out["exhaustive"] = [
    exhaustive("one factor, 5 levels, cubic, 6 runs", [[-1, -0.5, 0, 0.5, 1]], lambda x: True, [[0], [1], [2], [3]], 6),
    exhaustive("3x3 grid, full quadratic, 7 runs", [[-1, 0, 1], [-1, 0, 1]], lambda x: True, quad2, 7),
    exhaustive("5x5 grid cut to the band |x1 - x2| <= 0.5, full quadratic, 7 runs",
               [[-1, -0.5, 0, 0.5, 1]] * 2, lambda x: abs(x[0] - x[1]) <= 0.5 + 1e-12, quad2, 7),
    exhaustive("4x4 grid without the corner x1 + x2 > 2/3, full quadratic, 8 runs",
               [[-1, -third, third, 1]] * 2, lambda x: x[0] + x[1] <= 2 / 3 + 1e-12, quad2, 8),
    exhaustive("3x3 grid, full quadratic, 8 runs, I-criterion", [[-1, 0, 1], [-1, 0, 1]], lambda x: True, quad2, 8, "I"),
]

path = pathlib.Path(__file__).with_name("precision.json")
path.write_text(json.dumps(out, indent=1, sort_keys=True) + "\n")
reproducible.check(pathlib.Path(__file__).parent, CHECKSUMS)
