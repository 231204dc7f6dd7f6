"""Index tables as an independent Sobol' estimator writes them, for tests/io (study intake).

The Ishigami function f(x) = sin(x1) + a sin^2(x2) + b x3^4 sin(x1), x_i ~ U(-pi, pi),
a = 7, b = 0.1 (Ishigami & Homma 1990, "An importance quantification technique in
uncertainty analysis for computer models") is run through scipy.stats.sobol_indices
(scipy 1.17; Saltelli 2010 first-order and Jansen 1999 total estimators) with a small
sample, so that the estimates carry the noise real tables carry — the first-order index of
x3 (exactly 0) comes out slightly negative or positive, bounds straddle 0. Bootstrap 95 %
intervals give the *_low / *_high columns.

Outputs (all invented demo inputs, computed here, nothing copied):
  indices.csv            comma-separated, "." decimals, full precision, one comment line
  indices-semicolon.csv  the same numbers with ";" separators and decimal commas
  ishigami-intake.json   the estimates, the bounds and the closed-form indices
                         (Sobol' & Levitan 1999; Saltelli et al. 2008, The Primer, ch. 4)

Run: python3 tests/reference/ishigami-intake/generate.py   (numpy 2.4 + scipy 1.17: needs
scipy.stats.sobol_indices, scipy >= 1.11, so not Debian's /usr/bin/python3 with scipy 1.10).
Seeded throughout, so the output is the same byte for byte on every run; the script ends by
comparing the SHA-256 of the three files with CHECKSUMS and exits 1 when they differ (update
CHECKSUMS only with a deliberate change of the script). CI reads the files, never Python.
"""
import json
import math
import pathlib
import sys

sys.path.insert(0, str(pathlib.Path(__file__).resolve().parents[1]))
import reproducible  # noqa: E402  (tests/reference/reproducible.py)

reproducible.pin_blas()  # before numpy loads OpenBLAS

import numpy as np
from scipy import stats

A_COEF, B_COEF = 7.0, 0.1
N = 2**9
SEED = 424242
CHECKSUMS = {
    "indices.csv": "b734f8d0e1b4de7a235c1e209ff1f8793e8e4442ab21921354c297164e3b776d",
    "indices-semicolon.csv": "c9a2c83197c9ac2da53fac636f426a7cacdd746bb36872d8a587ba6472d7641a",
    "ishigami-intake.json": "bf033b05f44d96264e66c76048ac74254eb5107cfa602d4b0b5822cd614a0122",
}
HERE = pathlib.Path(__file__).parent
FACTORS = ["x1", "x2", "x3"]


def ishigami(x):
    # scipy passes x with shape (d, n) and wants (outputs, n)
    return np.atleast_2d(np.sin(x[0]) + A_COEF * np.sin(x[1]) ** 2 + B_COEF * x[2] ** 4 * np.sin(x[0]))


def closed_form():
    pi = math.pi
    v1 = 0.5 * (1 + B_COEF * pi**4 / 5) ** 2
    v2 = A_COEF**2 / 8
    v13 = 8 * B_COEF**2 * pi**8 / 225
    v = A_COEF**2 / 8 + B_COEF * pi**4 / 5 + B_COEF**2 * pi**8 / 18 + 0.5
    return {"first": [v1 / v, v2 / v, 0.0], "total": [(v1 + v13) / v, v2 / v, v13 / v]}


def main():
    rng = np.random.default_rng(SEED)
    dists = [stats.uniform(loc=-math.pi, scale=2 * math.pi)] * 3
    result = stats.sobol_indices(func=ishigami, n=N, dists=dists, rng=rng)
    # SobolResult.bootstrap takes no generator: scipy.stats.bootstrap then draws from numpy's
    # global RandomState (check_random_state(None)), so that is seeded here.
    np.random.seed(SEED)
    boot = result.bootstrap(confidence_level=0.95, n_resamples=199)
    # one output: scipy may drop the output axis, so put it back before indexing
    first = np.atleast_2d(result.first_order)[0]
    total = np.atleast_2d(result.total_order)[0]
    first_low = np.atleast_2d(boot.first_order.confidence_interval.low)[0]
    first_high = np.atleast_2d(boot.first_order.confidence_interval.high)[0]
    total_low = np.atleast_2d(boot.total_order.confidence_interval.low)[0]
    total_high = np.atleast_2d(boot.total_order.confidence_interval.high)[0]
    rows = []
    for i, factor in enumerate(FACTORS):
        rows.append(
            {
                "factor": factor,
                "response": "y",
                "first": float(first[i]),
                "total": float(total[i]),
                "first_low": float(first_low[i]),
                "first_high": float(first_high[i]),
                "total_low": float(total_low[i]),
                "total_high": float(total_high[i]),
            }
        )
    columns = ["factor", "response", "first", "total", "first_low", "first_high", "total_low", "total_high"]
    comment = "# Sobol' indices of the Ishigami function estimated by scipy.stats.sobol_indices, n = 512 (see generate.py)"
    with open(HERE / "indices.csv", "w", encoding="utf-8", newline="") as out:
        out.write(comment + "\n" + ",".join(columns) + "\n")
        for row in rows:
            out.write(",".join(row[c] if isinstance(row[c], str) else repr(row[c]) for c in columns) + "\n")
    with open(HERE / "indices-semicolon.csv", "w", encoding="utf-8", newline="") as out:
        out.write(comment.replace(",", "") + "\r\n" + ";".join(columns) + "\r\n")
        for row in rows:
            cells = [row[c] if isinstance(row[c], str) else repr(row[c]).replace(".", ",") for c in columns]
            out.write(";".join(cells) + "\r\n")
    with open(HERE / "ishigami-intake.json", "w", encoding="utf-8") as out:
        json.dump({"n": N, "seed": SEED, "rows": rows, "closedForm": closed_form()}, out, indent=2)
        out.write("\n")
    reproducible.check(HERE, CHECKSUMS)


if __name__ == "__main__":
    main()
