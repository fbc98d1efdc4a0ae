"""QuTiP reference for the simulator's decoherence (test/sim/qutip.test.ts).

Lindblad equation with H(t) = sum_k f_k(t) O_k and collapse operators sqrt(rate) L (constant
or times an array coefficient), solved with mesolve for each input operator rho0 (which may be
a non-Hermitian |k><l|; the equation is linear). The trajectory is piecewise linear in flux, so
the coefficients have kinks (and the du/dt coefficients jumps) at its samples; cubic splines
across those would ring, so each segment is solved on its own with its own smooth coefficient
arrays (QobjEvo with tlist), chaining the states.
Input: {"ops": [[re, im], ...], "cops": [{"op": [re, im], "scale": s, "timeDependent": bool}],
"segments": [{"tlist": [...], "coeffs": [[...] per op], "ccoeffs": [[...] per time-dependent cop]}],
"rho0": [[re, im], ...], "atol", "rtol"}.
Output: {"re": [...], "im": [...]} final matrices (row-major lists), "seconds".
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
    ops = [qutip.Qobj(mat(o)) for o in d["ops"]]
    cops = [(qutip.Qobj(mat(c["op"])) * c.get("scale", 1.0), c.get("timeDependent", False)) for c in d["cops"]]
    opts = qutip.Options(atol=d.get("atol", 1e-12), rtol=d.get("rtol", 1e-10), nsteps=10**7)
    segments = []
    for seg in d["segments"]:
        tlist = np.array(seg["tlist"], dtype=float)
        h = qutip.QobjEvo([[op, np.array(c, dtype=float)] for op, c in zip(ops, seg["coeffs"])], tlist=tlist)
        c_ops = []
        k = 0
        for op, td in cops:
            if td:
                c_ops.append(qutip.QobjEvo([[op, np.array(seg["ccoeffs"][k], dtype=float)]], tlist=tlist))
                k += 1
            else:
                c_ops.append(op)
        segments.append((tlist, h, c_ops))
    out_re, out_im = [], []
    t0 = time.perf_counter()
    for r in d["rho0"]:
        rho = qutip.Qobj(mat(r))
        for tlist, h, c_ops in segments:
            res = qutip.mesolve(h, rho, [tlist[0], tlist[-1]], c_ops, [], options=opts)
            rho = res.states[-1]
        final = rho.full()
        out_re.append(final.real.ravel().tolist())
        out_im.append(final.imag.ravel().tolist())
    print(json.dumps({"re": out_re, "im": out_im, "seconds": time.perf_counter() - t0}))


if __name__ == "__main__":
    main()
