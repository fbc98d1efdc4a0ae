"""QuTiP reference for the simulator's decoherence (test/sim/qutip.test.ts).

Lindblad equation with H(t) = sum_k f_k(t) O_k (array coefficients on `tlist`) and collapse
operators sqrt(rate) L, constant or with an array coefficient, solved with mesolve for each
input operator rho0 (which may be a non-Hermitian |k><l|; the equation is linear).
Input: {"terms": [{"op": n x n complex as [re, im], "coeff": [...]}], "collapse": [{"op": [re, im],
"coeff": [...] or null, "scale": number}], "tlist": [...], "rho0": [[re, im], ...], "atol", "rtol"}.
Output: {"re": [...], "im": [...]} final matrices (row-major lists).
"""
import json
import sys
import time

import numpy as np
import qutip


def mat(x):
    return np.array(x[0], dtype=float) + 1j * np.array(x[1], dtype=float)


def main():
    d = json.load(sys.stdin)
    tlist = np.array(d["tlist"], dtype=float)
    h = []
    for term in d["terms"]:
        h.append([qutip.Qobj(mat(term["op"])), np.array(term["coeff"], dtype=float)])
    c_ops = []
    for c in d["collapse"]:
        op = qutip.Qobj(mat(c["op"])) * c.get("scale", 1.0)
        if c.get("coeff") is None:
            c_ops.append(op)
        else:
            c_ops.append([op, np.array(c["coeff"], dtype=float)])
    opts = qutip.Options(atol=d.get("atol", 1e-12), rtol=d.get("rtol", 1e-10), nsteps=10**7)
    out_re, out_im = [], []
    t0 = time.perf_counter()
    for r in d["rho0"]:
        rho = qutip.Qobj(mat(r))
        res = qutip.mesolve(h, rho, tlist, c_ops, [], options=opts)
        final = res.states[-1].full()
        out_re.append(final.real.ravel().tolist())
        out_im.append(final.imag.ravel().tolist())
    print(json.dumps({"re": out_re, "im": out_im, "seconds": time.perf_counter() - t0}))


if __name__ == "__main__":
    main()
