#!/usr/bin/env python3
"""Reference p-values for the org.roseate.listen tests.

Writes src/test/resources/reference/listen/binomial.json: for n in a set of trial counts and every
k = 0..n, scipy.stats.binomtest(k, n, p=0.5, alternative='greater').pvalue, the one-sided exact
binomial test an ABX result is judged by.

Run from the project root:  python3 src/test/python/gen_binomial_reference.py
"""
import json
import os

import numpy as np
import scipy
from scipy import stats

OUT = os.path.join(os.path.dirname(__file__), "..", "resources", "reference", "listen")
GENERATOR = f"gen_binomial_reference.py, scipy {scipy.__version__}, numpy {np.__version__}"


def main():
    os.makedirs(OUT, exist_ok=True)
    cases = []
    for n in (5, 6, 10, 16, 20, 25, 32, 50, 100, 200):
        p = [float(stats.binomtest(k, n, p=0.5, alternative="greater").pvalue) for k in range(n + 1)]
        cases.append({"trials": n, "pValue": p})
    with open(os.path.join(OUT, "binomial.json"), "w") as f:
        json.dump({"generator": GENERATOR, "cases": cases}, f, indent=1)
        f.write("\n")


if __name__ == "__main__":
    main()
