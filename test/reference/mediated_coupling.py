"""Mediated exchange reference for test/plan/mediated-coupling.test.ts, independent of fluxlane.

Single-excitation sector of qubits i, k and mediators S_1..S_m (exchange couplings, RWA):
H/h = diag(f_i, f_k, f_S...) + g_iS (|i><S| + h.c.) + g_kS (|k><S| + h.c.). Sweeping f_i
through f_k = f gives an avoided crossing of the two states near f; its minimum gap (found with
scipy.optimize.minimize_scalar over f_i, numpy.linalg.eigvalsh at each point) is 2 |g_eff|, the
coupling a Landau-Zener sweep sees. The script returns half the minimum gap.

stdin:  {"cases": [{"f": GHz, "mediators": [{"f": GHz, "gi": GHz, "gk": GHz}, ...]}, ...]}
stdout: {"results": [half_gap, ...]}
"""
import json
import sys

import numpy as np
from scipy.optimize import minimize_scalar


def gap(fi, fk, mediators):
    n = 2 + len(mediators)
    h = np.zeros((n, n))
    h[0, 0] = fi
    h[1, 1] = fk
    for s, m in enumerate(mediators):
        h[2 + s, 2 + s] = m["f"]
        h[0, 2 + s] = h[2 + s, 0] = m["gi"]
        h[1, 2 + s] = h[2 + s, 1] = m["gk"]
    w = np.linalg.eigvalsh(h)
    near = sorted(w, key=lambda x: abs(x - fk))[:2]
    return abs(near[0] - near[1])


def half_gap(f, mediators):
    shift = sum((m["gi"] ** 2 + m["gk"] ** 2) / abs(f - m["f"]) for m in mediators)
    res = minimize_scalar(lambda fi: gap(fi, f, mediators), bounds=(f - 4 * shift, f + 4 * shift), method="bounded",
                          options={"xatol": 1e-14})
    return float(res.fun / 2.0)


def main():
    data = json.load(sys.stdin)
    print(json.dumps({"results": [half_gap(c["f"], c["mediators"]) for c in data["cases"]]}))


main()
