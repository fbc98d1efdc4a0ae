"""Independent reference for a spectator's error on a two-qubit gate (test/budget/spectator-error.test.ts).

Three transmons (NumPy only, sharing no code with fluxlane): H = 4 E_C n^2 - E_J(Phi) cos(phi) each in
its charge basis |n| <= N (Koch et al., PRA 76, 042319 (2007)); the mover A in the fixed eigenbasis
of its parking flux (K_A levels), partner B and spectator S in their eigenbases at their static
fluxes (K_B, K_S levels); couplings G_AB n_A n_B + G_AS n_A n_S with g = G |<0|n|1>| |<0|n|1>| at
Phi = 0. Propagation by fourth-order Magnus (two Gauss-Legendre nodes) on the piecewise-linear flux.
Dressed computational states |a b s> by largest overlap with the bare product states.

Error definitions (as documented in src/budget/spectator-error.ts): with S in |0> the gate's
fidelity after its own best virtual-Z phases (scipy.optimize); with S in |1> the fidelity with
those phases and the S = 0 lab frame; the spectator's error is their average minus the pair's
own infidelity (the same waveform without S, best phases).

stdin:  {"mover": {"ec", "ejs", "d"}, "partner": {...}, "spectator": {...}, "gAB", "gAS" (or "gBS": S on the partner),
         "partnerFlux", "spectatorFlux", "time": [...], "flux": [...], "theta", "N", "KA", "KB", "KS", "dt",
         optional "KAfar": that many eigenstates at the waveform's farthest mover flux added to the mover's basis}
stdout: {"error", "leakage", "ground", "excited", "pair"}
"""
import json
import sys
from functools import reduce

import numpy as np
from scipy.optimize import minimize

TWO_PI = 2 * np.pi


def ej(q, flux):
    return q["ejs"] * np.sqrt(np.cos(np.pi * flux) ** 2 + q["d"] ** 2 * np.sin(np.pi * flux) ** 2)


def eigenbasis(q, flux, N, K):
    n = np.diag(np.arange(-N, N + 1, dtype=float))
    cos = 0.5 * (np.eye(2 * N + 1, k=1) + np.eye(2 * N + 1, k=-1))
    w, v = np.linalg.eigh(4 * q["ec"] * n @ n - ej(q, flux) * cos)
    v = v[:, :K]
    return w[:K], v.T @ n @ v, v.T @ cos @ v


def mover_basis(q, park, flux, N, KA, KAfar):
    """K_A eigenstates at parking; with KAfar > 0 also KAfar eigenstates at the waveform's flux of
    largest |E_J - E_J(park)|, orthonormalised (QR) and re-diagonalised with H at parking (a
    Rayleigh-Ritz basis that follows a large excursion with few states)."""
    if not KAfar:
        return eigenbasis(q, park, N, KA)
    n = np.diag(np.arange(-N, N + 1, dtype=float))
    cos = 0.5 * (np.eye(2 * N + 1, k=1) + np.eye(2 * N + 1, k=-1))
    far = flux[int(np.argmax(np.abs(ej(q, flux) - ej(q, park))))]
    cols = []
    for f, k in ((park, KA), (far, KAfar)):
        _, v = np.linalg.eigh(4 * q["ec"] * n @ n - ej(q, f) * cos)
        cols.append(v[:, :k])
    Q, _ = np.linalg.qr(np.hstack(cols))
    h = Q.T @ (4 * q["ec"] * n @ n - ej(q, park) * cos) @ Q
    w, y = np.linalg.eigh(0.5 * (h + h.T))
    v = Q @ y
    return w, v.T @ n @ v, v.T @ cos @ v


def kron(*ops):
    return reduce(np.kron, ops)


def run(doc, with_spectator, s_level, lab=None, vz=None):
    A, B, S = doc["mover"], doc["partner"], doc["spectator"]
    N, KA, KB, KS, dt = doc.get("N", 20), doc.get("KA", 8), doc.get("KB", 5), doc.get("KS", 4), doc.get("dt", 0.02)
    t = np.array(doc["time"], dtype=float)
    x = np.array(doc["flux"], dtype=float)
    parkA = x[0]
    _, nA0, _ = eigenbasis(A, 0.0, N, 2)
    _, nB0, _ = eigenbasis(B, 0.0, N, 2)
    _, nS0, _ = eigenbasis(S, 0.0, N, 2)
    GAB = doc["gAB"] / (abs(nA0[0, 1]) * abs(nB0[0, 1]))
    # the spectator is coupled to the mover (gAS) or, on an 11-02 crossing, to the partner (gBS)
    GAS = doc.get("gAS", 0.0) / (abs(nA0[0, 1]) * abs(nS0[0, 1]))
    GBS = doc.get("gBS", 0.0) / (abs(nB0[0, 1]) * abs(nS0[0, 1]))
    eA, nA, cA = mover_basis(A, parkA, x, N, KA, doc.get("KAfar", 0))
    KA = len(eA)
    eB, nB, _ = eigenbasis(B, doc["partnerFlux"], N, KB)
    IA, IB = np.eye(KA), np.eye(KB)
    if with_spectator:
        eS, nS, _ = eigenbasis(S, doc["spectatorFlux"], N, KS)
        IS = np.eye(KS)
        h0 = kron(np.diag(eA), IB, IS) + kron(IA, np.diag(eB), IS) + kron(IA, IB, np.diag(eS)) + GAB * kron(nA, nB, IS) + GAS * kron(nA, IB, nS) + GBS * kron(IA, nB, nS)
        C = kron(cA, IB, IS)
        labels = [(0, 0, s_level), (0, 1, s_level), (1, 0, s_level), (1, 1, s_level)]
        index = lambda a, b, s: (a * KB + b) * KS + s
    else:
        h0 = np.kron(np.diag(eA), IB) + np.kron(IA, np.diag(eB)) + GAB * np.kron(nA, nB)
        C = np.kron(cA, IB)
        labels = [(0, 0), (0, 1), (1, 0), (1, 1)]
        index = lambda a, b: a * KB + b
    w, v = np.linalg.eigh(h0)
    idx = [int(np.argmax(np.abs(v[index(*lb), :]))) for lb in labels]
    P = v[:, idx]
    energies = w[idx]
    if lab is None:
        lab = energies
    ej0 = ej(A, parkA)
    H = lambda tt: h0 - (ej(A, np.interp(tt, t, x)) - ej0) * C
    U = np.eye(h0.shape[0], dtype=complex)
    g1, g2 = 0.5 - np.sqrt(3) / 6, 0.5 + np.sqrt(3) / 6
    for k in range(len(t) - 1):
        a, b = t[k], t[k + 1]
        m = max(1, int(np.ceil((b - a) / dt)))
        h = (b - a) / m
        for s in range(m):
            t0 = a + s * h
            H1, H2 = H(t0 + g1 * h), H(t0 + g2 * h)
            herm = TWO_PI * 0.5 * h * (H1 + H2) - 1j * (np.sqrt(3) / 12) * h * h * TWO_PI ** 2 * (H2 @ H1 - H1 @ H2)
            ww, vv = np.linalg.eigh(herm)
            U = (vv * np.exp(-1j * ww)) @ vv.conj().T @ U
    T = t[-1] - t[0]
    e00, e01, e10 = lab[0], lab[1], lab[2]
    eloc = np.array([e00, e01, e10, e10 + e01 - e00])
    M = np.diag(np.exp(1j * TWO_PI * eloc * T)) @ P.T @ U @ P
    theta = doc["theta"]

    def fid(a, b):
        V = np.diag([1, np.exp(1j * b), np.exp(1j * a), np.exp(1j * (theta + a + b))])
        return (np.trace(M @ M.conj().T).real + abs(np.trace(V.conj().T @ M)) ** 2) / 20

    if vz is None:
        best = None
        for a0 in np.linspace(-np.pi, np.pi, 5):
            for b0 in np.linspace(-np.pi, np.pi, 5):
                r = minimize(lambda p: -fid(p[0], p[1]), [a0, b0], method="Nelder-Mead", options={"xatol": 1e-10, "fatol": 1e-14, "maxiter": 4000})
                if best is None or r.fun < best.fun:
                    best = r
        vz = best.x
    return 1 - fid(vz[0], vz[1]), 1 - np.trace(M.conj().T @ M).real / 4, energies, vz


def main():
    doc = json.load(sys.stdin)
    pair, pair_leak, _, _ = run(doc, False, 0)
    ground, leak0, lab, vz = run(doc, True, 0)
    excited, leak1, _, _ = run(doc, True, 1, lab=lab, vz=vz)
    print(json.dumps({"error": 0.5 * (ground + excited) - pair, "leakage": 0.5 * (leak0 + leak1) - pair_leak, "ground": ground, "excited": excited, "pair": pair}))


main()
