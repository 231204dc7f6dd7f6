"""Reference values for the exact-design criteria and inverse updates, computed with numpy/scipy.

Run:  python3 tests/reference/design/generate.py  (writes design.json beside this script)
numpy 2.4 / scipy 1.17. The TypeScript tests read design.json; they never need Python.

Independent of the TypeScript code paths:
- determinants and inverses with numpy.linalg (LU / LAPACK), not Cholesky updates;
- region moments by Gauss-Legendre product quadrature (numpy.polynomial.legendre.leggauss,
  exact for these polynomial degrees) and, for a cut region, scipy.integrate.dblquad;
- inverse updates by re-inverting the changed X'X from scratch.
"""
import json
import pathlib
import sys

sys.path.insert(0, str(pathlib.Path(__file__).resolve().parents[1]))
import reproducible  # noqa: E402  (tests/reference/reproducible.py)

reproducible.pin_blas()  # before numpy loads OpenBLAS

import numpy as np
from numpy.polynomial.legendre import leggauss
from scipy import integrate

CHECKSUMS = {
    "design.json": "6ac3534f3efeca788ab9327872522d381c937d961e2454ada3ddf3c86019341a",
}


def expand(exponents, x):
    return np.array([np.prod([xi ** e for xi, e in zip(x, term)]) for term in exponents])


def model_matrix(exponents, points):
    return np.array([expand(exponents, x) for x in points])


def quadratic_exponents(k):
    terms = [[0] * k]
    for j in range(k):
        t = [0] * k; t[j] = 1; terms.append(t)
    for j in range(k):
        t = [0] * k; t[j] = 2; terms.append(t)
    for a in range(k):
        for b in range(a + 1, k):
            t = [0] * k; t[a] = 1; t[b] = 1; terms.append(t)
    return terms


def cube_moments_quadrature(exponents, k, nodes=6):
    """W = E[f f'] for x uniform on [-1,1]^k by tensor Gauss-Legendre quadrature."""
    x, w = leggauss(nodes)
    grids = np.meshgrid(*([x] * k), indexing="ij")
    weights = np.ones_like(grids[0])
    for g in np.meshgrid(*([w] * k), indexing="ij"):
        weights = weights * g
    pts = np.stack([g.ravel() for g in grids], axis=1)
    wts = weights.ravel() / 2 ** k
    F = model_matrix(exponents, pts)
    return (F * wts[:, None]).T @ F


def criteria(exponents, points, W):
    X = model_matrix(exponents, points)
    M = X.T @ X
    n, p = X.shape
    sign, logdet = np.linalg.slogdet(M)
    assert sign > 0
    Minv = np.linalg.inv(M)
    return {
        "exponents": exponents,
        "points": points,
        "logDetXtX": logdet,
        "logDetPerRun": logdet - p * np.log(n),
        "dEfficiency": 100 * np.exp(logdet / p) / n,
        "iCriterion": float(np.trace(Minv @ W)),
        "moments": W.ravel().tolist(),
    }


rng = np.random.default_rng(20261201)
cases = []

# 1. Two-factor quadratic on a 9-point 3^2 grid plus two extra centre-edge points.
ex2 = quadratic_exponents(2)
pts2 = [[a, b] for a in (-1, 0, 1) for b in (-1, 0, 1)] + [[0, 0], [1, 0]]
W2 = cube_moments_quadrature(ex2, 2)
cases.append({"name": "two-factor quadratic, 11 runs", **criteria(ex2, pts2, W2)})

# 2. Three-factor quadratic, a random 14-run design on the 3^3 grid.
ex3 = quadratic_exponents(3)
pts3 = rng.choice([-1.0, 0.0, 1.0], size=(14, 3)).tolist()
W3 = cube_moments_quadrature(ex3, 3)
cases.append({"name": "three-factor quadratic, random 14 runs", **criteria(ex3, pts3, W3)})

# 3. One 4-level factor with a cubic, two 3-level quadratic factors, two interactions.
ex_mixed = [[0, 0, 0], [1, 0, 0], [2, 0, 0], [3, 0, 0], [0, 1, 0], [0, 2, 0], [0, 0, 1], [0, 0, 2], [1, 1, 0], [1, 0, 1]]
four = [-1, -1 / 3, 1 / 3, 1]
pts_mixed = [[four[rng.integers(4)], float(rng.choice([-1, 0, 1])), float(rng.choice([-1, 0, 1]))] for _ in range(13)]
W_mixed = cube_moments_quadrature(ex_mixed, 3)
cases.append({"name": "4-level cubic with two 3-level quadratic factors, random 13 runs", **criteria(ex_mixed, pts_mixed, W_mixed)})

# Inverse updates: replace design row x by y in case 2 and re-invert from scratch.
X = model_matrix(ex3, pts3)
M = X.T @ X
Minv = np.linalg.inv(M)
fx = X[4]
y = [1.0, -1.0, 0.0]
fy = expand(ex3, y)
M_new = M - np.outer(fx, fx) + np.outer(fy, fy)
M_add = M + np.outer(fy, fy)
updates = {
    "exponents": ex3,
    "points": pts3,
    "replaceRow": 4,
    "replacement": y,
    "inverse": Minv.ravel().tolist(),
    "dx": float(fx @ Minv @ fx),
    "dy": float(fy @ Minv @ fy),
    "dxy": float(fx @ Minv @ fy),
    "determinantRatio": float(np.linalg.det(M_new) / np.linalg.det(M)),
    "inverseAfterExchange": np.linalg.inv(M_new).ravel().tolist(),
    "inverseAfterAdd": np.linalg.inv(M_add).ravel().tolist(),
    "logDetChangeAdd": float(np.linalg.slogdet(M_add)[1] - np.linalg.slogdet(M)[1]),
    "traceAfterExchange": float(np.trace(np.linalg.inv(M_new) @ W3)),
}

# Region moments of the first-order-with-interaction model 1, x1, x2, x1*x2, x1^2 on the
# square [-1,1]^2 cut by x1 + x2 <= 0.5 (uniform measure on the cut region), by dblquad.
ex_cut = [[0, 0], [1, 0], [0, 1], [1, 1], [2, 0]]
def indicator_integral(g):
    # integrate over x1 in [-1, 1], x2 in [-1, min(1, 0.5 - x1)]
    value, _ = integrate.dblquad(lambda x2, x1: g(x1, x2), -1, 1, lambda x1: -1, lambda x1: min(1.0, 0.5 - x1), epsabs=1e-12, epsrel=1e-12)
    return value
area = indicator_integral(lambda a, b: 1.0)
W_cut = np.zeros((5, 5))
for i, ti in enumerate(ex_cut):
    for j, tj in enumerate(ex_cut):
        W_cut[i, j] = indicator_integral(lambda a, b: (a ** (ti[0] + tj[0])) * (b ** (ti[1] + tj[1]))) / area
cut = {"exponents": ex_cut, "constraint": "x1 + x2 <= 0.5", "area": area, "moments": W_cut.ravel().tolist()}

out = {
    "generator": "tests/reference/design/generate.py (numpy %s, scipy %s)" % (np.__version__, __import__("scipy").__version__),
    "criteria": cases,
    "updates": updates,
    "cutRegionMoments": cut,
}
path = pathlib.Path(__file__).with_name("design.json")
path.write_text(json.dumps(out, indent=1))
print("wrote", path)
reproducible.check(pathlib.Path(__file__).parent, CHECKSUMS)
