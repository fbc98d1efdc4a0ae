"""Reference transmon levels and wave-function derivative for test/sim/mover-sample.test.ts.

stdin: {"ec": E_C (GHz), "ej": E_J (GHz), "levels": K, "ncut": N}
Charge basis n = -N..N at n_g = 0: H = 4 E_C n^2 - (E_J / 2)(|n><n+1| + h.c.) (Koch et al.,
Phys. Rev. A 76, 042319 (2007)), numpy.linalg.eigh at E_J and E_J +- h (eigenvector signs fixed
by overlap with the E_J ones); T_mm' = <m| d/dE_J m'> by central differences (h = 1e-5 E_J).
stdout (last line): {"energies": [...], "t": [row-major K x K]}
"""
import json
import sys

import numpy as np


def eig(ec, ej, n):
    ns = np.arange(-n, n + 1)
    h = np.diag(4 * ec * ns.astype(float) ** 2) - 0.5 * ej * (np.eye(2 * n + 1, k=1) + np.eye(2 * n + 1, k=-1))
    return np.linalg.eigh(h)


def main():
    p = json.load(sys.stdin)
    ec, ej, k, n = p["ec"], p["ej"], int(p["levels"]), int(p["ncut"])
    w, v = eig(ec, ej, n)
    step = 1e-5 * ej
    _, vp = eig(ec, ej + step, n)
    _, vm = eig(ec, ej - step, n)
    for m in range(k):
        if vp[:, m] @ v[:, m] < 0:
            vp[:, m] *= -1
        if vm[:, m] @ v[:, m] < 0:
            vm[:, m] *= -1
    dv = (vp[:, :k] - vm[:, :k]) / (2 * step)
    t = v[:, :k].T @ dv
    print(json.dumps({"energies": w[:k].tolist(), "t": t.reshape(-1).tolist()}))


if __name__ == "__main__":
    main()
