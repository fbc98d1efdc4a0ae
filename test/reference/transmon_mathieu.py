"""Reference transmon levels from Mathieu characteristic values (test/transmon/*.test.ts).

Koch et al., Phys. Rev. A 76, 042319 (2007), Eq. 2.5: with q = E_J / (2 E_C),
  n_g = 0:   E_m / E_C = sorted {a_0, b_2, a_2, b_4, a_4, ...}(q)
  n_g = 1/2: E_m / E_C = sorted {a_1, b_1, a_3, b_3, ...}(q)
(scipy.special.mathieu_a, mathieu_b). Each case also returns the levels of the charge-basis
matrix with a large cutoff N = 80 from scipy.linalg.eigh_tridiagonal ("dense"), so a test can
state how accurate SciPy's Mathieu values themselves are.

stdin:  {"cases": [{"ec": GHz, "ej": GHz, "levels": k, "ng": n_g}, ...]}
stdout: {"results": [{"mathieu": [...k] or null (n_g not 0 or 1/2), "dense": [...k]}, ...]}
"""
import json
import sys

import numpy as np
import scipy.linalg as sl
from scipy.special import mathieu_a, mathieu_b


def mathieu_levels(ec, ej, k, ng):
    q = ej / (2.0 * ec)
    vals = []
    if ng == 0:
        vals.append(mathieu_a(0, q))
        r = 2
        while len(vals) < k + 2:
            vals.append(mathieu_b(r, q))
            vals.append(mathieu_a(r, q))
            r += 2
    elif ng == 0.5:
        r = 1
        while len(vals) < k + 2:
            vals.append(mathieu_a(r, q))
            vals.append(mathieu_b(r, q))
            r += 2
    else:
        return None  # no Mathieu form used here for other n_g; "dense" still answers
    return [ec * v for v in sorted(vals)[:k]]


def dense_levels(ec, ej, k, ng, n_cut=80):
    n = np.arange(-n_cut, n_cut + 1)
    d = 4.0 * ec * (n - ng) ** 2
    e = -0.5 * ej * np.ones(2 * n_cut)
    w = sl.eigh_tridiagonal(d, e, eigvals_only=True, select="i", select_range=(0, k - 1))
    return w.tolist()


def main():
    doc = json.load(sys.stdin)
    out = []
    for c in doc["cases"]:
        ec, ej, k, ng = float(c["ec"]), float(c["ej"]), int(c["levels"]), float(c.get("ng", 0))
        out.append({"mathieu": mathieu_levels(ec, ej, k, ng), "dense": dense_levels(ec, ej, k, ng)})
    print(json.dumps({"results": out}))


main()
