"""Reference product-basis Hamiltonian for test/pair/product-basis.test.ts, built with numpy.kron:
H = sum_i 1 x .. x diag(E_i) x .. x 1 + sum_(a,b) G_ab (.. n_a .. n_b ..), first transmon most
significant (row-major |m_0 m_1 ...>).

stdin:  {"parts": [{"energies": [...], "charge": [K*K]}, ...], "couplings": [{"a", "b", "gCharge"}]}
stdout: {"h": [size*size], "size": size}
"""
import json
import sys
from functools import reduce

import numpy as np


def main():
    doc = json.load(sys.stdin)
    parts = doc["parts"]
    dims = [len(p["energies"]) for p in parts]
    eyes = [np.eye(k) for k in dims]

    def embed(ops):
        return reduce(np.kron, [ops.get(i, eyes[i]) for i in range(len(dims))])

    size = int(np.prod(dims))
    h = np.zeros((size, size))
    for i, p in enumerate(parts):
        h += embed({i: np.diag(p["energies"])})
    for c in doc["couplings"]:
        a, b = int(c["a"]), int(c["b"])
        na = np.array(parts[a]["charge"]).reshape(dims[a], dims[a])
        nb = np.array(parts[b]["charge"]).reshape(dims[b], dims[b])
        h += float(c["gCharge"]) * embed({a: na, b: nb})
    print(json.dumps({"h": h.reshape(-1).tolist(), "size": size}))


main()
