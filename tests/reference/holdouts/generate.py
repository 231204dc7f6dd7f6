"""Reference values for tests/core/design/holdoutRuns.test.ts (invented spray-dryer sample).

Builds the holdout candidate set of the sample independently of the TypeScript code —
interior levels and midpoints between adjacent levels, in engineering units, rounded to the
settable step with exact halves towards the middle of the range — keeps the points that are
strictly feasible for the constraint, and uses scipy.spatial.distance.cdist (SciPy 1.17) for
the coded Euclidean distances to the occupied points (feasible corners of the box plus the
centre). Records, per constraint: the number of free candidates and the largest
nearest-occupied distance, with the candidates attaining it (the first maximin holdout).

Run: python3 tests/reference/holdouts/generate.py  (writes holdouts.json beside this script)
"""
import itertools
import json
import pathlib
import sys
from decimal import Decimal, ROUND_HALF_DOWN, ROUND_HALF_UP

sys.path.insert(0, str(pathlib.Path(__file__).resolve().parents[1]))
import reproducible  # noqa: E402  (tests/reference/reproducible.py)

reproducible.pin_blas()  # before numpy loads OpenBLAS

import numpy as np
from scipy.spatial.distance import cdist

CHECKSUMS = {
    "holdouts.json": "0d60eee005c3c57aa6bca7d528e88de0cde7709809d1a34c13179c46d3a54b1e",
}

# id, low, high, precision, levels (engineering, as the tool plans them for the sample)
FACTORS = [
    ("inlet_temp", 160, 200, "1", [160, 173, 187, 200]),
    ("feed_solids", 30, 45, "0.5", [30, 35, 40, 45]),
    ("feed_rate", 8, 16, "0.1", [8, 12, 16]),
    ("atomiser_speed", 15000, 25000, "100", [15000, 20000, 25000]),
]


def settable(value, low, high, precision):
    """Nearest multiple of the precision; exact halves go towards the middle of [low, high]."""
    step = Decimal(precision)
    mode = ROUND_HALF_DOWN if value > (low + high) / 2 else ROUND_HALF_UP
    return float((Decimal(repr(value)) / step).quantize(Decimal(1), rounding=mode) * step)


def coded(value, low, high):
    return (value - (low + high) / 2) / ((high - low) / 2)


def interior_values(low, high, precision, levels):
    values = set()
    for i, level in enumerate(levels):
        values.add(settable(float(level), low, high, precision))
        if i > 0:
            values.add(settable((levels[i - 1] + level) / 2, low, high, precision))
    return sorted(v for v in values if low < v < high)


def case(offset):
    """Constraint feed_rate <= 0.2 * inlet_temp - offset, strict for candidates (off the face)."""
    axes = [interior_values(low, high, p, lv) for (_, low, high, p, lv) in FACTORS]
    candidates = []
    for point in itertools.product(*axes):
        if point[2] < 0.2 * point[0] - offset - 1e-9:
            candidates.append([coded(v, f[1], f[2]) for v, f in zip(point, FACTORS)])
    corners = []
    for point in itertools.product(*[(f[1], f[2]) for f in FACTORS]):
        if point[2] <= 0.2 * point[0] - offset + 1e-9:
            corners.append([coded(v, f[1], f[2]) for v, f in zip(point, FACTORS)])
    occupied = np.array(corners + [[0.0, 0.0, 0.0, 0.0]])
    cand = np.array(candidates)
    nearest = cdist(cand, occupied).min(axis=1)
    free = nearest > 1e-9
    best = nearest[free].max()
    argmax = cand[np.abs(nearest - best) < 1e-12].tolist()
    return {
        "constraint": f"feed_rate <= 0.2 * inlet_temp - {offset}",
        "corners": len(corners),
        "freeCandidates": int(free.sum()),
        "firstMaximinDistance": float(best),
        "firstMaximinPoints": argmax,
    }


path = pathlib.Path(__file__).with_name("holdouts.json")
path.write_text(json.dumps({"source": "tests/reference/holdouts/generate.py (numpy 2.4, scipy 1.17 cdist)",
                  "cases": [case(18), case(20)]}, indent=2) + "\n")
reproducible.check(pathlib.Path(__file__).parent, CHECKSUMS)
