"""Reference Sobol' indices of polynomials in independent uniform inputs on [-1, 1].

Run with: python3 tests/reference/sobol/generate.py  (numpy 2.4, scipy 1.17)
Writes sobol.json next to this script; the output is the same byte for byte on every run
(fixed seeds). CI reads the JSON and never needs Python.

Two independent references per polynomial:
- exact: variances of conditional expectations by tensor Gauss-Legendre quadrature (numpy),
  exact for these degrees; gives first-order, total and second-order (pure pair) indices;
- scipy.stats.sobol_indices (Saltelli et al. 2010 first-order and Jansen 1999 total
  estimators, scrambled Sobol' sequence), repeated with REPLICATES independent scramblings
  (seeds 1000·case + r); the mean and the standard deviation over the replicates set the
  test's Monte Carlo tolerance. (scipy's bootstrap draws from an unseeded generator, so its
  intervals would not regenerate byte for byte.)
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
    "sobol.json": "52d0711c945e21684a7ab72732ddd05c7a73e5cbb73156ed225a951111cae824",
}

NODES = 8  # Gauss-Legendre rule exact for degree <= 15 per coordinate
MC_POWER = 12  # 2^12 base samples per replicate
REPLICATES = 10


def evaluate(terms, x):
    """terms: list of (coefficient, exponents); x: array of shape (k, N)."""
    y = np.zeros(x.shape[1])
    for coefficient, exponents in terms:
        value = np.full(x.shape[1], float(coefficient))
        for j, e in enumerate(exponents):
            if e:
                value = value * x[j] ** e
        y = y + value
    return y


def exact_indices(terms, k):
    nodes, weights = np.polynomial.legendre.leggauss(NODES)
    weights = weights / 2  # uniform density 1/2 on [-1, 1]
    grids = np.meshgrid(*([nodes] * k), indexing="ij")
    x = np.array([g.ravel() for g in grids])
    values = evaluate(terms, x).reshape([NODES] * k)
    w = weights
    for _ in range(k - 1):
        w = np.multiply.outer(w, weights)
    mean = float((values * w).sum())
    variance = float(((values - mean) ** 2 * w).sum())

    def closed(subset):
        """Var(E[y | x_subset])."""
        others = tuple(j for j in range(k) if j not in subset)
        if not subset:
            return 0.0
        reduced = values
        wr = w
        cond = (values * w).sum(axis=others) / w.sum(axis=others) if others else values
        wsub = w.sum(axis=others) if others else w
        return float(((cond - mean) ** 2 * wsub).sum())

    first = [closed((j,)) / variance for j in range(k)]
    total = [1 - closed(tuple(i for i in range(k) if i != j)) / variance for j in range(k)]
    pairs = []
    for a, b in itertools.combinations(range(k), 2):
        pure = closed((a, b)) - closed((a,)) - closed((b,))
        pairs.append({"factors": [a, b], "index": pure / variance})
    return {"mean": mean, "variance": variance, "first": first, "total": total, "pairs": pairs}


def monte_carlo(terms, k, case_number):
    first, total = [], []
    for r in range(REPLICATES):
        result = stats.sobol_indices(
            func=lambda x: evaluate(terms, x),
            n=2 ** MC_POWER,
            dists=[stats.uniform(loc=-1, scale=2)] * k,
            rng=np.random.default_rng(1000 * case_number + r),
        )
        first.append(result.first_order)
        total.append(result.total_order)
    first, total = np.array(first), np.array(total)
    return {
        "replicates": REPLICATES,
        "samplesPerReplicate": 2 ** MC_POWER,
        "firstMean": first.mean(axis=0).tolist(),
        "firstSd": first.std(axis=0, ddof=1).tolist(),
        "totalMean": total.mean(axis=0).tolist(),
        "totalSd": total.std(axis=0, ddof=1).tolist(),
    }


cases = {
    # Exact by hand: S = 1/14, 4/14, 9/14, no interaction.
    "linear123": (3, [(1, [1, 0, 0]), (2, [0, 1, 0]), (3, [0, 0, 1])]),
    # Exact by hand: S1 = S2 = 0, S12 = 1, totals 1.
    "product": (2, [(1, [1, 1])]),
    # Quadratic with two interactions in three factors.
    "quadratic3": (3, [(1, [0, 0, 0]), (2, [1, 0, 0]), (-1, [0, 1, 0]), (0.5, [0, 0, 1]), (1.5, [2, 0, 0]),
                       (-1, [0, 2, 0]), (2, [1, 1, 0]), (0.7, [0, 1, 1])]),
    # Cubic and a mixed term x1 x2^2 (its Legendre form puts variance on x1 alone and on the pair).
    "cubic2": (2, [(1, [3, 0]), (1, [1, 2]), (0.5, [0, 1])]),
    # Four factors, a three-factor product and squares: support sets of size 1, 2 and 3.
    "mixed4": (4, [(3, [1, 0, 0, 0]), (-2, [0, 2, 0, 0]), (1, [0, 0, 1, 1]), (1.5, [1, 1, 1, 0]), (0.8, [0, 0, 0, 3]),
                   (-1.2, [2, 0, 0, 1])]),
}

out = {"generatedBy": f"numpy {np.__version__}, scipy {scipy.__version__}", "cases": {}}
for seed, (name, (k, terms)) in enumerate(cases.items(), start=1):
    out["cases"][name] = {
        "k": k,
        "terms": [{"coefficient": c, "exponents": e} for c, e in terms],
        "exact": exact_indices(terms, k),
        "scipy": monte_carlo(terms, k, seed),
    }

path = pathlib.Path(__file__).with_name("sobol.json")
path.write_text(json.dumps(out, indent=1) + "\n")
print(f"wrote {path}")
reproducible.check(pathlib.Path(__file__).parent, CHECKSUMS)
