#!/usr/bin/env python3
"""Two-sided Gaussian exceedance P(|x| > k*sigma) = erfc(k/sqrt(2)) from scipy.special.erfc,
for org.roseate.budget.GaussianTest. Run from the project root:

    python3 src/test/python/gen_gaussian_exceedance.py > src/test/resources/reference/budget/gaussian_exceedance.csv
"""
import numpy as np
import scipy
from scipy.special import erfc

print(f"# scipy {scipy.__version__}: k = swing/sigma, p = erfc(k/sqrt(2))")
print("k,p")
for k in [0.0, 0.1, 0.5, 1.0, 1.5, 2.0, 2.5, 3.0, 3.5, 4.0, 4.5, 5.0, 6.0, 7.0, 8.0, 10.0, 12.0]:
    print(f"{k!r},{float(erfc(k / np.sqrt(2.0)))!r}")
