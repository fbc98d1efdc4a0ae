"""QuTiP reference for the CZ simulator (test/sim/qutip.test.ts).

Coherent: sesolve with H(t) = H0 + u(t) C given as array coefficients (QuTiP's fastest
time-dependent form; the arrays are interpolated by cubic splines on `tlist`, passed to QobjEvo so
the solver itself runs from tlist[0] to tlist[-1] with its own steps).
Input (JSON on stdin): {"h0": n x n, "c": n x n (rad/ns), "tlist": [...], "u": [...] (same length),
"psi0": [[re...], ...], "atol", "rtol", "nsteps"}.
Output: {"re": [[...]], "im": [[...]], "seconds": wall time of the solves}.
"""
import json
import sys
import time

import numpy as np
import qutip


def main():
    d = json.load(sys.stdin)
    h0 = qutip.Qobj(np.array(d["h0"], dtype=float))
    c = qutip.Qobj(np.array(d["c"], dtype=float))
    tlist = np.array(d["tlist"], dtype=float)
    u = np.array(d["u"], dtype=float)
    opts = qutip.Options(atol=d.get("atol", 1e-12), rtol=d.get("rtol", 1e-12), nsteps=d.get("nsteps", 10**7), max_step=d.get("max_step", 0))
    res_re, res_im = [], []
    t0 = time.perf_counter()
    for v in d["psi0"]:
        psi = qutip.Qobj(np.array(v, dtype=complex).reshape((-1, 1)))
        # Coefficients on their own grid (QobjEvo tlist); the solver reports only the final time,
        # so it is not forced to stop at every coefficient sample.
        h = qutip.QobjEvo([h0, [c, u]], tlist=tlist)
        out = qutip.sesolve(h, psi, [tlist[0], tlist[-1]], [], options=opts)
        final = out.states[-1].full().ravel()
        res_re.append(final.real.tolist())
        res_im.append(final.imag.tolist())
    seconds = time.perf_counter() - t0
    print(json.dumps({"re": res_re, "im": res_im, "seconds": seconds, "version": qutip.__version__}))


if __name__ == "__main__":
    main()
