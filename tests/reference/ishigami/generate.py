"""Reference Sobol' indices of the Ishigami function, for tests/core/sensitivity.

f(x) = sin(x1) + a sin^2(x2) + b x3^4 sin(x1),  x_i ~ U(-pi, pi) independent,
a = 7, b = 0.1 (Ishigami & Homma 1990, "An importance quantification technique in
uncertainty analysis for computer models"). Closed-form partial variances as tabulated in
Saltelli et al. 2008, *Global Sensitivity Analysis: The Primer*, and in Sobol' & Levitan
1999:

  V1  = (1 + b pi^4 / 5)^2 / 2
  V2  = a^2 / 8
  V3  = 0
  V13 = b^2 pi^8 (1/18 - 1/50) = 8 b^2 pi^8 / 225
  V   = a^2 / 8 + b pi^4 / 5 + b^2 pi^8 / 18 + 1/2

Cross-check: a Monte Carlo estimate from independent sample matrices A, B and the mixed
matrices AB_i (A with column i from B), first-order by the Saltelli et al. 2010 estimator
  S_i  ~ mean(f(B) (f(AB_i) - f(A))) / V
and total by the Jansen 1999 estimator
  ST_i ~ mean((f(A) - f(AB_i))^2) / 2 / V
(Saltelli et al. 2010, "Variance based sensitivity analysis of model output. Design and
estimator for the total sensitivity index", Table 2). The script stops if the Monte Carlo
values disagree with the formulas by more than 5 standard errors (bootstrap) or 0.01.

Run: python3 tests/reference/ishigami/generate.py   (numpy only; writes ishigami.json)
"""
import json
import math
import pathlib
import sys

sys.path.insert(0, str(pathlib.Path(__file__).resolve().parents[1]))
import reproducible  # noqa: E402  (tests/reference/reproducible.py)

reproducible.pin_blas()  # before numpy loads OpenBLAS

import numpy as np

CHECKSUMS = {
    "ishigami.json": "8d93f5dabae8e96739d123886eadd0a24c5d36f577f7899163ca96ea31453d18",
}

A_COEF = 7.0
B_COEF = 0.1
N = 2**18
SEED = 20261201
BOOTSTRAP = 200


def ishigami(x):
    return np.sin(x[:, 0]) + A_COEF * np.sin(x[:, 1]) ** 2 + B_COEF * x[:, 2] ** 4 * np.sin(x[:, 0])


def analytic():
    pi = math.pi
    v1 = 0.5 * (1 + B_COEF * pi**4 / 5) ** 2
    v2 = A_COEF**2 / 8
    v3 = 0.0
    v13 = 8 * B_COEF**2 * pi**8 / 225
    v = A_COEF**2 / 8 + B_COEF * pi**4 / 5 + B_COEF**2 * pi**8 / 18 + 0.5
    return {
        "variance": v,
        "first": [v1 / v, v2 / v, v3 / v],
        "total": [(v1 + v13) / v, v2 / v, v13 / v],
        "second": {"x1,x2": 0.0, "x1,x3": v13 / v, "x2,x3": 0.0},
    }


def monte_carlo():
    rng = np.random.default_rng(SEED)
    a = rng.uniform(-math.pi, math.pi, size=(N, 3))
    b = rng.uniform(-math.pi, math.pi, size=(N, 3))
    fa, fb = ishigami(a), ishigami(b)
    f_ab = []
    for i in range(3):
        ab = a.copy()
        ab[:, i] = b[:, i]
        f_ab.append(ishigami(ab))

    def estimate(index):
        var = np.var(np.concatenate([fa[index], fb[index]]))
        first = [np.mean(fb[index] * (f_ab[i][index] - fa[index])) / var for i in range(3)]
        total = [np.mean((fa[index] - f_ab[i][index]) ** 2) / 2 / var for i in range(3)]
        return np.array(first), np.array(total)

    first, total = estimate(np.arange(N))
    boot = [estimate(rng.integers(0, N, N)) for _ in range(BOOTSTRAP)]
    first_se = np.std([f for f, _ in boot], axis=0, ddof=1)
    total_se = np.std([t for _, t in boot], axis=0, ddof=1)
    return {
        "n": N,
        "seed": SEED,
        "first": first.tolist(),
        "total": total.tolist(),
        "firstStdError": first_se.tolist(),
        "totalStdError": total_se.tolist(),
        # 95 % percentile-free normal intervals from the bootstrap standard error.
        "firstLow": (first - 1.96 * first_se).tolist(),
        "firstHigh": (first + 1.96 * first_se).tolist(),
        "totalLow": (total - 1.96 * total_se).tolist(),
        "totalHigh": (total + 1.96 * total_se).tolist(),
    }


def main():
    exact = analytic()
    mc = monte_carlo()
    for kind in ("first", "total"):
        for i in range(3):
            gap = abs(exact[kind][i] - mc[kind][i])
            limit = max(5 * mc[kind + "StdError"][i], 0.01)
            if gap > limit:
                raise SystemExit(f"{kind}[{i}] Monte Carlo {mc[kind][i]:.4f} vs exact {exact[kind][i]:.4f}")
    out = {
        "source": "Ishigami & Homma 1990; closed form as tabulated in Saltelli et al. 2008, The Primer; "
        "Monte Carlo cross-check: Saltelli et al. 2010 first-order and Jansen 1999 total estimators (numpy)",
        "a": A_COEF,
        "b": B_COEF,
        "factors": ["x1", "x2", "x3"],
        "analytic": exact,
        "monteCarlo": mc,
    }
    path = pathlib.Path(__file__).with_name("ishigami.json")
    path.write_text(json.dumps(out, indent=2) + "\n")
    print(json.dumps({"analytic": exact, "mcFirst": mc["first"], "mcTotal": mc["total"]}, indent=2))


if __name__ == "__main__":
    main()
    reproducible.check(pathlib.Path(__file__).parent, CHECKSUMS)
