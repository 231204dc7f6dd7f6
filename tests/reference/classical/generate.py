"""Independent reference for the published two-level fractions used in the classical-design tests.

For each fraction in PUBLISHED (generators as tabulated in the sources named beside them), this
script builds the design matrix with numpy and finds the defining relation *from the runs
themselves*: a set S of factors is a defining word exactly when the product of the columns in S
is constant over all runs. That is a different route from the generator algebra in
src/core/classical/wordLengthPattern.ts, so agreement checks both.

Run:  python3 tests/reference/classical/generate.py  (numpy 2.x)
Writes tests/reference/classical/published-fractions.json next to this file.
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
    "published-fractions.json": "5801b386927102f6a7bdc4f059156860144441419d83d83b68aa9f2744b62cc2",
}

LETTERS = "ABCDEFGHJKLMNOPQRSTUVWXYZ"  # I skipped: it names the identity

# (k, generators, source). Sources (all recalled from memory, not looked up during this work):
#   NIST = NIST/SEMATECH e-Handbook of Statistical Methods, section 5.3.3.4.7,
#          "Summary tables of useful fractional factorial designs"
#   BHH  = Box, Hunter & Hunter (2005), Statistics for Experimenters, 2nd ed., Table 6.22
PUBLISHED = [
    (4, ["D=ABC"], "NIST 5.3.3.4.7; BHH Table 6.22: 2^(4-1) IV"),
    (5, ["E=ABCD"], "NIST 5.3.3.4.7; BHH Table 6.22: 2^(5-1) V"),
    (5, ["D=AB", "E=AC"], "NIST 5.3.3.4.7; BHH Table 6.22: 2^(5-2) III"),
    (6, ["F=ABCDE"], "NIST 5.3.3.4.7; BHH Table 6.22: 2^(6-1) VI"),
    (6, ["E=ABC", "F=BCD"], "NIST 5.3.3.4.7; BHH Table 6.22: 2^(6-2) IV"),
    (6, ["D=AB", "E=AC", "F=BC"], "NIST 5.3.3.4.7; BHH Table 6.22: 2^(6-3) III"),
    (7, ["G=ABCDEF"], "NIST 5.3.3.4.7; BHH Table 6.22: 2^(7-1) VII"),
    (7, ["F=ABCD", "G=ABDE"], "NIST 5.3.3.4.7; BHH Table 6.22: 2^(7-2) IV"),
    (7, ["E=ABC", "F=BCD", "G=ACD"], "NIST 5.3.3.4.7; BHH Table 6.22: 2^(7-3) IV"),
    (7, ["D=AB", "E=AC", "F=BC", "G=ABC"], "NIST 5.3.3.4.7; BHH Table 6.22: 2^(7-4) III"),
    (8, ["G=ABCD", "H=ABEF"], "NIST 5.3.3.4.7; BHH Table 6.22: 2^(8-2) V"),
    (8, ["F=ABC", "G=ABD", "H=BCDE"], "NIST 5.3.3.4.7; BHH Table 6.22: 2^(8-3) IV"),
    (8, ["E=BCD", "F=ACD", "G=ABC", "H=ABD"], "NIST 5.3.3.4.7; BHH Table 6.22: 2^(8-4) IV"),
    (9, ["H=ACDFG", "J=BCEFG"], "NIST 5.3.3.4.7; BHH Table 6.22: 2^(9-2) VI"),
    (9, ["F=BCDE", "G=ACDE", "H=ABDE", "J=ABCE"], "NIST 5.3.3.4.7; BHH Table 6.22: 2^(9-4) IV"),
    (10, ["H=ABCG", "J=BCDE", "K=ACDF"], "NIST 5.3.3.4.7; BHH Table 6.22: 2^(10-3) V"),
    (10, ["F=ABCD", "G=ABCE", "H=ABDE", "J=ACDE", "K=BCDE"], "NIST 5.3.3.4.7; BHH Table 6.22: 2^(10-5) IV"),
    (11, ["H=ABCG", "J=BCDE", "K=ACDF", "L=ABCDEFG"], "NIST 5.3.3.4.7; BHH Table 6.22: 2^(11-4) V"),
    (11, ["F=ABC", "G=BCD", "H=CDE", "J=ACD", "K=ADE", "L=BDE"], "NIST 5.3.3.4.7; BHH Table 6.22: 2^(11-6) IV"),
]


def design_matrix(k, generators):
    added = {g.split("=")[0]: g.split("=")[1] for g in generators}
    base = [LETTERS[j] for j in range(k) if LETTERS[j] not in added]
    m = len(base)
    runs = 2**m
    columns = {}
    for b, letter in enumerate(base):
        # standard order: first base factor alternates fastest
        columns[letter] = np.array([1 if (i >> b) & 1 else -1 for i in range(runs)], dtype=np.int64)
    for letter, word in added.items():
        sign = -1 if word.startswith("-") else 1
        columns[letter] = sign * np.prod([columns[c] for c in word.lstrip("+-")], axis=0)
    return np.stack([columns[LETTERS[j]] for j in range(k)], axis=1)


def defining_words(X):
    k = X.shape[1]
    words = []
    for size in range(1, k + 1):
        for subset in itertools.combinations(range(k), size):
            product = np.prod(X[:, list(subset)], axis=1)
            if np.all(product == product[0]):
                words.append(("-" if product[0] < 0 else "") + "".join(LETTERS[j] for j in subset))
    return words


def main():
    out = []
    for k, generators, source in PUBLISHED:
        X = design_matrix(k, generators)
        words = defining_words(X)
        lengths = [len(w.lstrip("-")) for w in words]
        pattern = [lengths.count(j) for j in range(3, k + 1)]
        out.append({
            "k": k,
            "generators": generators,
            "source": source,
            "runs": int(X.shape[0]),
            "distinctRuns": int(len({tuple(r) for r in X.tolist()})),
            "resolution": min(lengths),
            "wordLengthPattern": pattern,
            "definingWords": words,
        })
    path = pathlib.Path(__file__).with_name("published-fractions.json")
    path.write_text(json.dumps({
        "generatedBy": "tests/reference/classical/generate.py (numpy " + np.__version__ + ")",
        "fractions": out,
    }, indent=1) + "\n")


if __name__ == "__main__":
    main()
    reproducible.check(pathlib.Path(__file__).parent, CHECKSUMS)
