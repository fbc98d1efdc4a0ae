"""Reference eigenvalues for the linalg kernel tests (test/linalg/*.test.ts).

stdin: {"problems": [ ... ]}, each problem one of
  {"kind": "tridiagonal", "d": [...], "e": [...]}                 -> scipy.linalg.eigh_tridiagonal
  {"kind": "tridiagonal-lowest", "d": [...], "e": [...], "k": k}  -> eigh_tridiagonal(select='i')
  {"kind": "symmetric", "n": n, "a": [row-major]}                 -> numpy.linalg.eigh
  {"kind": "hermitian", "n": n, "re": [...], "im": [...]}         -> numpy.linalg.eigh (complex)
stdout (last line): {"results": [{"values": [...], "vectors": [row-major, column k = vector k]} ...]}
"""
import json
import sys

import numpy as np
import scipy.linalg as sl


def solve(p):
    kind = p["kind"]
    if kind == "tridiagonal":
        d = np.array(p["d"], dtype=float)
        e = np.array(p["e"], dtype=float)
        w, v = sl.eigh_tridiagonal(d, e)
        return {"values": w.tolist(), "vectors": v.reshape(-1).tolist()}
    if kind == "tridiagonal-lowest":
        d = np.array(p["d"], dtype=float)
        e = np.array(p["e"], dtype=float)
        k = int(p["k"])
        if len(d) == 1:  # SciPy's select='i' path rejects a 1 x 1 matrix
            return {"values": d.tolist()}
        w = sl.eigh_tridiagonal(d, e, eigvals_only=True, select="i", select_range=(0, k - 1))
        return {"values": w.tolist()}
    if kind == "symmetric":
        n = int(p["n"])
        a = np.array(p["a"], dtype=float).reshape(n, n)
        w, v = np.linalg.eigh(a)
        return {"values": w.tolist(), "vectors": v.reshape(-1).tolist()}
    if kind == "hermitian":
        n = int(p["n"])
        a = (np.array(p["re"], dtype=float) + 1j * np.array(p["im"], dtype=float)).reshape(n, n)
        w = np.linalg.eigvalsh(a)
        return {"values": w.tolist()}
    raise ValueError("unknown problem kind " + kind)


def main():
    doc = json.load(sys.stdin)
    print(json.dumps({"results": [solve(p) for p in doc["problems"]]}))


main()
