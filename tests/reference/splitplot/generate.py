"""Reference values for the GLS information of split-plot designs run in sessions.

Independent route: build V = I + eta * Z Z' and the session indicator matrix B explicitly,
then numpy's dense linear algebra gives
  - X' V^-1 X                       (the GLS information, blocks excluded)
  - the GLS covariance of beta in the model [X | B] (sessions as fixed effects, the
    intercept dropped because it lies in the span of B), in sigma_eps^2 units
  - informationKept = (det of the block-adjusted information / det of the
    intercept-adjusted unblocked information) ** (1 / (p - 1)).
Run with /usr/bin/python3 (numpy); writes gls.json beside this script. Seeded; the output is
byte-for-byte reproducible.
"""
import json
import os
import pathlib
import sys

sys.path.insert(0, str(pathlib.Path(__file__).resolve().parents[1]))
import reproducible  # noqa: E402  (tests/reference/reproducible.py)

reproducible.pin_blas()  # before numpy loads OpenBLAS

import numpy as np

CHECKSUMS = {
    "gls.json": "bf63bb7019c815ed9ee90c11be7dd1a58155d71b0e4ffbc731cfd208c9fb1ef3",
}

rng = np.random.default_rng(20261202)


def model_rows(points):
    # Full quadratic in two factors, the term order of tierplan: 1, x1, x2, x1*x2, x1^2, x2^2.
    x1, x2 = points[:, 0], points[:, 1]
    return np.column_stack([np.ones(len(points)), x1, x2, x1 * x2, x1 ** 2, x2 ** 2])


def case(name, plot_sizes, sessions_of_plot, eta):
    n = int(sum(plot_sizes))
    plot_of = np.repeat(np.arange(len(plot_sizes)), plot_sizes)
    levels = np.array([-1.0, 0.0, 1.0])
    hard = levels[rng.integers(0, 3, len(plot_sizes))][plot_of]
    easy = levels[rng.integers(0, 3, n)]
    points = np.column_stack([hard, easy])
    X = model_rows(points)
    Z = np.zeros((n, len(plot_sizes)))
    Z[np.arange(n), plot_of] = 1.0
    V = np.eye(n) + eta * Z @ Z.T
    Vinv = np.linalg.inv(V)
    M = X.T @ Vinv @ X
    sessions = int(max(sessions_of_plot)) + 1
    session_of_run = np.asarray(sessions_of_plot)[plot_of]
    out = {
        "name": name,
        "points": points.tolist(),
        "wholePlotOf": plot_of.tolist(),
        "sessionOfWholePlot": list(map(int, sessions_of_plot)),
        "varianceRatio": eta,
        "glsInformation": M.tolist(),
        "logDetPerRun": float(np.linalg.slogdet(M / n)[1]),
    }
    p = X.shape[1]
    if sessions > 1:
        B = np.zeros((n, sessions))
        B[np.arange(n), session_of_run] = 1.0
        F = np.column_stack([X[:, 1:], B])
        cov = np.linalg.inv(F.T @ Vinv @ F)[: p - 1, : p - 1]
        adjusted = np.linalg.inv(cov)
        m11 = M[0, 0]
        unblocked = M[1:, 1:] - np.outer(M[1:, 0], M[0, 1:]) / m11
        kept = np.exp((np.linalg.slogdet(adjusted)[1] - np.linalg.slogdet(unblocked)[1]) / (p - 1))
        out.update({"adjustedInformation": adjusted.tolist(), "covariance": cov.tolist(), "informationKept": float(kept)})
    else:
        out.update({"covariance": np.linalg.inv(M).tolist()})
    return out


cases = [
    case("eight plots of three, one session, eta 1", [3] * 8, [0] * 8, 1.0),
    case("six plots of various sizes, three sessions, eta 2.5", [4, 3, 3, 4, 2, 4], [0, 0, 1, 1, 2, 2], 2.5),
    case("twelve single runs, four sessions, eta 0", [1] * 12, [0, 0, 0, 1, 1, 1, 2, 2, 2, 3, 3, 3], 0.0),
]
path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "gls.json")
with open(path, "w") as handle:
    json.dump({"source": "numpy dense GLS with explicit V and session indicators (generate.py)", "cases": cases}, handle, indent=1)
    handle.write("\n")
reproducible.check(pathlib.Path(__file__).parent, CHECKSUMS)
