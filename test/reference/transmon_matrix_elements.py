"""Transmon levels and matrix elements from a dense NumPy diagonalisation of the full
charge-basis Hamiltonian (numpy.linalg.eigh within the parity eigenspaces of n -> -n),
for test/transmon/parity-eigenbasis.test.ts.

H = 4 E_C (n - n_g)^2 - (E_J/2) sum (|n><n+1| + h.c.), |n| <= N.
Sign convention as src/transmon/levels.ts at n_g = 0: even levels c_0 > 0, odd levels c_1 > 0.

stdin:  {"cases": [{"ec": GHz, "ej": GHz, "levels": K, "cutoff": N}, ...]}
stdout: {"results": [{"energies": [K], "charge": [K*K], "cosPhi": [K*K]}, ...]}
"""
import json
import sys

import numpy as np


def solve(ec, ej, k, n_cut):
    n = np.arange(-n_cut, n_cut + 1)
    dim = len(n)
    h = np.diag(4.0 * ec * n.astype(float) ** 2)
    shift = np.diag(np.ones(dim - 1), 1)  # e^{-i phi}|n+1> = |n>: <n|shift|n+1> = 1
    h -= 0.5 * ej * (shift + shift.T)
    # Diagonalise within the charge-parity eigenspaces of Pi|n> = |-n> (found by numpy.linalg.eigh
    # of Pi), so nearly degenerate levels of opposite parity are not mixed by round-off.
    pi = np.fliplr(np.eye(dim))
    pw, pv = np.linalg.eigh(pi)
    ws, vs = [], []
    for sign in (1.0, -1.0):
        basis = pv[:, np.isclose(pw, sign)]
        sw, sv = np.linalg.eigh(basis.T @ h @ basis)
        ws.append(sw)
        vs.append(basis @ sv)
    w = np.concatenate(ws)
    v = np.concatenate(vs, axis=1)
    order = np.argsort(w, kind="stable")
    w, v = w[order][:k], v[:, order][:, :k]
    for m in range(k):
        ref = v[n_cut, m] if m % 2 == 0 else v[n_cut + 1, m]
        if ref < 0:
            v[:, m] = -v[:, m]
    charge = v.T @ np.diag(n.astype(float)) @ v
    cos_phi = v.T @ (0.5 * (shift + shift.T)) @ v
    return {"energies": w.tolist(), "charge": charge.reshape(-1).tolist(), "cosPhi": cos_phi.reshape(-1).tolist()}


def main():
    doc = json.load(sys.stdin)
    print(json.dumps({"results": [solve(float(c["ec"]), float(c["ej"]), int(c["levels"]), int(c["cutoff"])) for c in doc["cases"]]}))


main()
