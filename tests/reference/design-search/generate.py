"""Reference values for the design search and the continuous bound, computed with numpy alone.

Run with: /usr/bin/python3 tests/reference/design-search/generate.py  (numpy 1.24)
Writes design-search.json beside this script. Nothing here is random except the plan of
case 4, drawn from a fixed seed, so the output is the same byte for byte on every run; the
script ends by comparing the SHA-256 of what it wrote with CHECKSUMS below and exits 1 when
they differ (update CHECKSUMS only together with a deliberate change of the script).
CI reads the JSON and never needs Python.

1. exhaustive: every N-run design (multiset of grid points) on small grids, by brute force;
   the largest ln det(X'X) and how many designs reach it. The exact search must reach it.
2. continuous: the D-optimal continuous design of the two-factor quadratic on the 3x3 grid,
   by the multiplicative algorithm (Silvey, Titterington & Torsney 1978) run until
   max_i f_i'M(w)^-1 f_i <= p(1 + 1e-11) (Kiefer & Wolfowitz 1960 equivalence theorem).
   The same, to 1e-10, for the three-factor quadratic on the 3^3 grid (cube3Optimum).
3. trajectory: the state after a few iterations of the multiplicative algorithm, each
   followed by Boehning's (1986) vertex-exchange step, written out here independently of
   tierplan: ln det M and max variance after each iteration and the weights after the last (5 iterations: a near-tie at the sixth makes the pick rounding-dependent),
   on a 3x3 grid with uneven middle levels (no ties between candidates).
4. sampledBound: the continuous D-optimal design on the whole 9^4 grid (full quadratic,
   p = 15) and the D-efficiency of a seeded 19-run plan relative to it; tierplan's sampled
   bound path must report an efficiency no lower, and a guaranteed bound no higher.
5. gEfficiency: first-order model in three factors on a 5-run design that leaves (1, 1, 1)
   out; the prediction variance of a first-order model is a convex quadratic in x, so its
   maximum over the cube is at a vertex, and the maximum over the 8 vertices is exact; the
   variance at every vertex is recorded too.
6. cutRegion: the best 13-run design for the three-factor quadratic on the cut 3^3 grid found
   by 200 seeded starts of a plain Fedorov exchange (too many designs to enumerate).
7. iOptimum: the I-optimal 9-run design on the 3x3 grid by enumeration.
"""
import itertools
import json
import pathlib
import sys

sys.path.insert(0, str(pathlib.Path(__file__).resolve().parents[1]))
import reproducible  # noqa: E402  (tests/reference/reproducible.py)

reproducible.pin_blas()  # before numpy loads OpenBLAS

import numpy as np

CHECKSUMS = {
    "design-search.json": "f5e451517c78b947650b74923c62ae3a3f173a0543224ceaa029727045eb236a",
}
HERE = pathlib.Path(__file__).parent


def grid(levels):
    return np.array(list(itertools.product(*levels)), dtype=float)


def expand(points, exponents):
    return np.stack([np.prod(points ** np.array(e, dtype=float), axis=1) for e in exponents], axis=1)


def quadratic_exponents(k):
    unit = lambda j, e: [e if m == j else 0 for m in range(k)]
    terms = [[0] * k] + [unit(j, 1) for j in range(k)] + [unit(j, 2) for j in range(k)]
    terms += [[1 if m in (a, b) else 0 for m in range(k)] for a, b in itertools.combinations(range(k), 2)]
    return terms


def exhaustive(name, levels, exponents, runs):
    points = grid(levels)
    F = expand(points, exponents)
    p = F.shape[1]
    best, count = -np.inf, 0
    combos = np.array(list(itertools.combinations_with_replacement(range(len(points)), runs)))
    for chunk in np.array_split(combos, max(1, len(combos) // 20000)):
        X = F[chunk]  # (batch, runs, p)
        sign, logdet = np.linalg.slogdet(np.einsum("bri,brj->bij", X, X))
        logdet = np.where(sign > 0, logdet, -np.inf)
        top = logdet.max()
        if top > best + 1e-9:
            best, count = top, 0
        count += int(np.sum(logdet > best - 1e-9))
    return {
        "name": name,
        "levels": levels,
        "exponents": exponents,
        "runs": runs,
        "designsEnumerated": len(combos),
        "maxLogDetXtX": float(best),
        "maxLogDetPerRun": float(best - p * np.log(runs)),
        "optimalDesigns": count,
    }


def information(F, w):
    return F.T @ (F * w[:, None])


def variances(F, M):
    return np.einsum("ij,jk,ik->i", F, np.linalg.inv(M), F)


def vertex_exchange(F, w, d_before, M):
    inv = np.linalg.inv(M)
    positive = np.where(w > 0)[0]
    j = positive[np.argmin(d_before[positive])]
    k = int(np.argmax(d_before))
    if j == k:
        return
    gj = inv @ F[j]
    dj, djk, dk = gj @ F[j], gj @ F[k], F[k] @ inv @ F[k]
    curvature = 2 * (dj * dk - djk * djk)
    step = min(w[j], (dk - dj) / curvature) if curvature > 0 else w[j]
    if step > 0:
        w[j] -= step
        w[k] += step


def continuous(F, epsilon, exchange, max_iterations, record=False):
    n, p = F.shape
    w = np.full(n, 1.0 / n)
    history = []
    for it in range(max_iterations + 1):
        M = information(F, w)
        d = variances(F, M)
        if record:
            history.append({"iteration": it, "logDet": float(np.linalg.slogdet(M)[1]), "maxVariance": float(d.max())})
        if d.max() <= p * (1 + epsilon) or it == max_iterations:
            return w, float(np.linalg.slogdet(M)[1]), float(d.max()), it, history
        w = w * d / p
        if exchange:
            vertex_exchange(F, w, d, information(F, w))


out = {"source": "numpy (see generate.py)"}

# 1. Exhaustive enumeration.
three, two = [-1.0, 0.0, 1.0], [-1.0, 1.0]
mixed = [[0, 0, 0], [1, 0, 0], [0, 1, 0], [0, 0, 1], [2, 0, 0], [1, 1, 0], [1, 0, 1], [0, 1, 1]]
out["exhaustive"] = [
    exhaustive("two-factor quadratic on the 3x3 grid, 7 runs", [three, three], quadratic_exponents(2), 7),
    exhaustive("x1 quadratic with all two-factor interactions on the 3x2x2 grid, 9 runs", [three, two, two], mixed, 9),
]

# 2. Continuous D-optimal weights on the 3x3 grid.
square = grid([three, three])
F2 = expand(square, quadratic_exponents(2))
w, logdet, maxd, iterations, _ = continuous(F2, 1e-11, True, 2_000_000)
out["continuous"] = {
    "points": square.tolist(),
    "weights": w.tolist(),
    "logDet": logdet,
    "maxVariance": maxd,
    "iterations": iterations,
}

# 2b. Continuous D-optimum of the three-factor quadratic on the 3^3 grid (p = 10).
F3 = expand(grid([three] * 3), quadratic_exponents(3))
_, logdet3, maxd3, _, _ = continuous(F3, 1e-10, True, 2_000_000)
out["cube3Optimum"] = {"logDet": logdet3, "maxVariance": maxd3}

# 3. Trajectory with and without the vertex-exchange step, on a 3x3 grid with uneven middle
#    levels so that no two candidates tie on variance (ties would make the pick arbitrary).
uneven = [[-1.0, 0.2, 1.0], [-1.0, -0.4, 1.0]]
Fu = expand(grid(uneven), quadratic_exponents(2))
w_ex, _, _, _, with_exchange = continuous(Fu, 0.0, True, 5, record=True)
w_mult, _, _, _, without_exchange = continuous(Fu, 0.0, False, 5, record=True)
out["trajectory"] = {
    "levels": uneven,
    "withVertexExchange": with_exchange,
    "weightsAfter5": w_ex.tolist(),
    "multiplicativeOnly": without_exchange,
    "multiplicativeWeightsAfter5": w_mult.tolist(),
}

# 4. Sampled bound path: the optimum on the whole 9^4 grid and a seeded plan's efficiency.
nine = [round(-1 + 2 * i / 8, 3) for i in range(9)]
k4 = quadratic_exponents(4)
F4 = expand(grid([nine] * 4), k4)
w4, logdet4, maxd4, it4, _ = continuous(F4, 1e-7, True, 200_000)
cube3 = grid([three] * 4)
rng = np.random.default_rng(20261205)
plan = cube3[np.sort(rng.choice(len(cube3), 19, replace=False))]
X = expand(plan, k4)
plan_logdet = float(np.linalg.slogdet(X.T @ X)[1] - 15 * np.log(len(plan)))
out["sampledBound"] = {
    "levels": nine,
    "exponents": k4,
    "plan": plan.tolist(),
    "planLogDetPerRun": plan_logdet,
    "optimumLogDet": logdet4,
    "optimumMaxVariance": maxd4,
    "iterations": it4,
    # Upper end: relative to the found design; lower end: the equivalence-theorem guarantee.
    "efficiencyHigh": float(100 * np.exp((plan_logdet - logdet4) / 15)),
    "efficiencyLow": float(100 * np.exp((plan_logdet - logdet4) / 15) * 15 / maxd4),
}

# 5. G-efficiency with the peak at a vertex the design leaves out.
design = np.array([[-1, -1, -1], [1, -1, -1], [-1, 1, -1], [-1, -1, 1], [0, 0, 0]], dtype=float)
first = [[0, 0, 0], [1, 0, 0], [0, 1, 0], [0, 0, 1]]
Xg = expand(design, first)
vertices = grid([two] * 3)
dv = variances(expand(vertices, first), Xg.T @ Xg)
out["gEfficiency"] = {
    "design": design.tolist(),
    "exponents": first,
    "maxVariance": float(dv.max()),
    "argmax": vertices[int(np.argmax(dv))].tolist(),
    "maxScaledVariance": float(len(design) * dv.max()),
    "gEfficiency": float(100 * 4 / (len(design) * dv.max())),
    "vertices": vertices.tolist(),
    "vertexVariances": dv.tolist(),
}

# 6. The three-factor quadratic on the 3^3 grid cut by x1 + x2 + x3 <= 1 (23 feasible points),
#    13 runs: C(35, 13) multisets are too many to enumerate, so this is the best ln det(X'X)
#    over 200 seeded starts of a plain Fedorov exchange (Fedorov 1972: each pass makes the best
#    single swap of a design row for a candidate, with every determinant recomputed by slogdet),
#    not a proven optimum; how many starts reach it is recorded too.
def fedorov(F, runs, rng):
    p = F.shape[1]
    while True:
        rows = rng.choice(len(F), runs)
        sign, current = np.linalg.slogdet(F[rows].T @ F[rows])
        if sign > 0:
            break
    while True:
        best, swap = current, None
        for i in range(runs):
            X = np.repeat(F[rows][None, :, :], len(F), axis=0)
            X[:, i, :] = F
            sign, logdet = np.linalg.slogdet(np.einsum("bri,brj->bij", X, X))
            logdet = np.where(sign > 0, logdet, -np.inf)
            j = int(np.argmax(logdet))
            if logdet[j] > best + 1e-10:
                best, swap = logdet[j], (i, j)
        if swap is None:
            return current - p * np.log(runs)
        rows[swap[0]] = swap[1]
        current = best


cut_points = np.array([x for x in grid([three] * 3) if x.sum() <= 1])
F_cut = expand(cut_points, quadratic_exponents(3))
rng_cut = np.random.default_rng(20261206)
cut_values = np.array([fedorov(F_cut, 13, rng_cut) for _ in range(200)])
out["cutRegion"] = {
    "name": "three-factor quadratic on the 3^3 grid with x1 + x2 + x3 <= 1, 13 runs",
    "candidates": len(cut_points),
    "runs": 13,
    "starts": 200,
    "bestLogDetPerRun": float(cut_values.max()),
    "startsReachingBest": int(np.sum(cut_values > cut_values.max() - 1e-9)),
}

# 7. I-optimum of the two-factor quadratic on the 3x3 grid, 9 runs, by enumerating all
#    C(17, 9) = 24310 multisets: min trace((X'X)^-1 W), W the moments of the model over the
#    square [-1, 1]^2 with uniform weight, by 8-point Gauss-Legendre product quadrature (exact
#    for these degrees). Also the I-criterion of the 3^2 factorial, for comparison.
nodes, gl_weights = np.polynomial.legendre.leggauss(8)
quad_points = grid([nodes, nodes])
quad_weights = np.outer(gl_weights, gl_weights).ravel() / 4
Fq = expand(quad_points, quadratic_exponents(2))
W2 = Fq.T @ (Fq * quad_weights[:, None])
combos9 = np.array(list(itertools.combinations_with_replacement(range(len(square)), 9)))
X9 = F2[combos9]
M9 = np.einsum("bri,brj->bij", X9, X9)
sign9, logdet9 = np.linalg.slogdet(M9)
usable = np.where((sign9 > 0) & (logdet9 > -20))[0]
traces = np.einsum("bij,ji->b", np.linalg.inv(M9[usable]), W2)
factorial_trace = float(np.trace(np.linalg.inv(F2.T @ F2) @ W2))
out["iOptimum"] = {
    "name": "two-factor quadratic on the 3x3 grid, 9 runs, I-criterion",
    "designsEnumerated": len(combos9),
    "bestICriterion": float(traces.min()),
    "optimalDesigns": int(np.sum(traces < traces.min() + 1e-12)),
    "factorialICriterion": factorial_trace,
}

path = HERE / "design-search.json"
text = json.dumps(out, indent=1) + "\n"
path.write_text(text)
reproducible.check(pathlib.Path(__file__).parent, CHECKSUMS)
