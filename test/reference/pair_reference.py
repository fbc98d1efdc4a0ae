"""Reference results for two capacitively coupled transmons (test/pair/*.test.ts), computed
independently of fluxlane with NumPy:

H = H_A (x) 1 + 1 (x) H_B + G n_A (x) n_B, each H = 4 E_C n^2 - (E_J/2) sum (|n><n+1| + h.c.),
|n| <= N (charge basis, n_g = 0).

"exact": dense numpy.linalg.eigh of H in the full product CHARGE basis (no level truncation);
         each requested label (i, j) is the dressed state of largest overlap with the bare
         product state |i>_A |j>_B (bare states from numpy.linalg.eigh of H_A, H_B).
"pt2":   full second-order perturbation theory in G for E_00, E_01, E_10, E_11 over ALL product
         states of the lowest `ptLevels` levels of each transmon (counter-rotating terms included,
         exact charge matrix elements):
           E_ij^(2) = sum_{(k,l) != (i,j)} G^2 |<i|n|k>_A <j|n|l>_B|^2 / (E_ij - E_kl),
         and zeta2 = E_11^(2) - E_10^(2) - E_01^(2) + E_00^(2) (first order vanishes at n_g = 0).

stdin:  {"cases": [{"ecA", "ejA", "ecB", "ejB", "G", "cutoff": N, "labels": [[i, j], ...],
                    "ptLevels": K, "exact": bool}, ...]}
stdout: {"results": [{"exact": {"energies": [...], "overlaps": [...]} | null, "pt2": {"zz": z,
                      "shifts": [E00, E01, E10, E11], "bare": [...4]}}, ...]}
"""
import json
import sys

import numpy as np


def transmon(ec, ej, n_cut):
    n = np.arange(-n_cut, n_cut + 1).astype(float)
    dim = len(n)
    h = np.diag(4.0 * ec * n**2) - 0.5 * ej * (np.eye(dim, k=1) + np.eye(dim, k=-1))
    w, v = np.linalg.eigh(h)
    return h, np.diag(n), w, v


def solve(c):
    n_cut = int(c["cutoff"])
    ha, na, wa, va = transmon(c["ecA"], c["ejA"], n_cut)
    hb, nb, wb, vb = transmon(c["ecB"], c["ejB"], n_cut)
    g = float(c["G"])
    dim = ha.shape[0]
    out = {"exact": None}
    if c.get("exact", True):
        eye = np.eye(dim)
        h = np.kron(ha, eye) + np.kron(eye, hb) + g * np.kron(na, nb)
        w, v = np.linalg.eigh(h)
        energies, overlaps = [], []
        for i, j in c["labels"]:
            bare = np.kron(va[:, i], vb[:, j])
            ov = (bare @ v) ** 2
            best = int(np.argmax(ov))
            energies.append(float(w[best]))
            overlaps.append(float(ov[best]))
        out["exact"] = {"energies": energies, "overlaps": overlaps}
    k = int(c.get("ptLevels", 12))
    ea, eb = wa[:k], wb[:k]
    ma = va[:, :k].T @ na @ va[:, :k]
    mb = vb[:, :k].T @ nb @ vb[:, :k]
    shifts = []
    for i, j in [(0, 0), (0, 1), (1, 0), (1, 1)]:
        e0 = ea[i] + eb[j]
        s = 0.0
        for a in range(k):
            for b in range(k):
                if a == i and b == j:
                    continue
                amp = ma[i, a] * mb[j, b]
                if amp == 0.0:
                    continue
                s += g * g * amp * amp / (e0 - (ea[a] + eb[b]))
        shifts.append(s)
    zz = shifts[3] - shifts[2] - shifts[1] + shifts[0]
    out["pt2"] = {"zz": zz, "shifts": shifts, "bare": [ea[0] + eb[0], ea[0] + eb[1], ea[1] + eb[0], ea[1] + eb[1]]}
    return out


def main():
    doc = json.load(sys.stdin)
    print(json.dumps({"results": [solve(c) for c in doc["cases"]]}))


main()
