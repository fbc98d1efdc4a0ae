"""Independent reference for the quasi-static flux-noise error of a two-qubit gate
(test/budget/gate-flux-noise.test.ts).

Model (NumPy only, written from the physics, sharing no code with fluxlane):
  each transmon H = 4 E_C n^2 - E_J(Phi) cos(phi) in the charge basis |n| <= N (n_g = 0),
  E_J(Phi) = E_JS sqrt(cos^2(pi Phi) + d^2 sin^2(pi Phi)) (Koch et al., PRA 76, 042319 (2007));
  the mover A in the fixed eigenbasis of its parking flux (K_A levels; H_A(t) = H_A(park) -
  (E_J(t) - E_J(park)) <cos phi>), the partner B in its eigenbasis at its static flux (K_B levels),
  coupling G n_A n_B with g = G |<0|n|1>_A| |<0|n|1>_B| at Phi = 0.
Propagation: fourth-order Magnus with two Gauss-Legendre nodes per step (Blanes, Casas and Ros,
BIT 40, 434 (2000)) on the piecewise-linear flux, steps of at most `dt` ns, exponentials by eigh.
Metrics: lab-frame block M on the dressed |00>, |01>, |10>, |11> (largest overlap with the bare
states) at the nominal parking; F = [Tr(M M^dag) + |Tr(V^dag M)|^2] / 20 (Pedersen et al. 2007)
with V = diag(1, e^{ib}, e^{ia}, e^{i(theta + a + b)}) maximised by scipy.optimize on the nominal
gate and then held fixed; the nominal dressed energies set the lab frame for every offset.
Flux-noise average: Gauss-Hermite (numpy.polynomial.hermite_e.hermegauss) over a static offset
of the mover's whole trajectory and, separately, of the partner's flux.

stdin:  {"mover": {"ec", "ejs", "d"}, "partner": {...}, "g", "partnerFlux", "time": [...], "flux": [...],
         "theta", "sigmaMover", "sigmaPartner", "nodes", "N", "KA", "KB", "dt"}
stdout: {"nominalError", "mover", "partner", "conditionalPhase", "leakage"}
"""
import json
import sys

import numpy as np
from numpy.polynomial.hermite_e import hermegauss
from scipy.optimize import minimize

TWO_PI = 2 * np.pi


def ej(q, flux):
    return q["ejs"] * np.sqrt(np.cos(np.pi * flux) ** 2 + q["d"] ** 2 * np.sin(np.pi * flux) ** 2)


def charge_ops(N):
    n = np.diag(np.arange(-N, N + 1, dtype=float))
    cos = 0.5 * (np.eye(2 * N + 1, k=1) + np.eye(2 * N + 1, k=-1))
    return n, cos


def eigenbasis(q, flux, N, K):
    n, cos = charge_ops(N)
    h = 4 * q["ec"] * n @ n - ej(q, flux) * cos
    w, v = np.linalg.eigh(h)
    v = v[:, :K]
    return w[:K], v.T @ n @ v, v.T @ cos @ v


def main():
    doc = json.load(sys.stdin)
    A, B = doc["mover"], doc["partner"]
    N, KA, KB, dt = doc.get("N", 20), doc.get("KA", 8), doc.get("KB", 5), doc.get("dt", 0.02)
    theta = doc["theta"]
    t = np.array(doc["time"], dtype=float)
    x = np.array(doc["flux"], dtype=float)
    _, nA0, _ = eigenbasis(A, 0.0, N, 2)
    _, nB0, _ = eigenbasis(B, 0.0, N, 2)
    G = doc["g"] / (abs(nA0[0, 1]) * abs(nB0[0, 1]))
    parkA = x[0]

    def gate(deltaA, deltaB, lab=None, comp=None):
        eA, nA, cA = eigenbasis(A, parkA + deltaA, N, KA)
        eB, nB, _ = eigenbasis(B, doc["partnerFlux"] + deltaB, N, KB)
        IA, IB = np.eye(KA), np.eye(KB)
        h0 = np.kron(np.diag(eA), IB) + np.kron(IA, np.diag(eB)) + G * np.kron(nA, nB)
        C = np.kron(cA, IB)
        ej0 = ej(A, parkA + deltaA)
        # dressed computational states at (perturbed) parking, by overlap with bare product states
        w, v = np.linalg.eigh(h0)
        idx = []
        for (i, j) in [(0, 0), (0, 1), (1, 0), (1, 1)]:
            bare = i * KB + j
            idx.append(int(np.argmax(np.abs(v[bare, :]))))
        P = v[:, idx]
        energies = w[idx]
        if lab is None:
            lab = energies

        def H(tt):
            flux = np.interp(tt, t, x) + deltaA
            return h0 - (ej(A, flux) - ej0) * C

        U = np.eye(KA * KB, dtype=complex)
        g1, g2 = 0.5 - np.sqrt(3) / 6, 0.5 + np.sqrt(3) / 6
        for k in range(len(t) - 1):
            a, b = t[k], t[k + 1]
            m = max(1, int(np.ceil((b - a) / dt)))
            h = (b - a) / m
            for s in range(m):
                t0 = a + s * h
                H1, H2 = H(t0 + g1 * h), H(t0 + g2 * h)
                # Omega = -i 2pi h/2 (H1 + H2) + (sqrt3/12) h^2 (2pi)^2 [H2, H1]  (A = -i 2 pi H)
                herm = TWO_PI * 0.5 * h * (H1 + H2) - 1j * (np.sqrt(3) / 12) * h * h * TWO_PI ** 2 * (H2 @ H1 - H1 @ H2)
                ww, vv = np.linalg.eigh(herm)
                U = (vv * np.exp(-1j * ww)) @ vv.conj().T @ U
        T = t[-1] - t[0]
        e00, e01, e10 = lab[0], lab[1], lab[2]
        eloc = np.array([e00, e00 + (e01 - e00), e00 + (e10 - e00), e00 + (e10 - e00) + (e01 - e00)])
        M = np.diag(np.exp(1j * TWO_PI * eloc * T)) @ P.T @ U @ P
        return M, energies

    def fid(M, a, b):
        V = np.diag([1, np.exp(1j * b), np.exp(1j * a), np.exp(1j * (theta + a + b))])
        return (np.trace(M @ M.conj().T).real + abs(np.trace(V.conj().T @ M)) ** 2) / 20

    M0, lab = gate(0.0, 0.0)
    best = None
    for a0 in np.linspace(-np.pi, np.pi, 5):
        for b0 in np.linspace(-np.pi, np.pi, 5):
            r = minimize(lambda p: -fid(M0, p[0], p[1]), [a0, b0], method="Nelder-Mead", options={"xatol": 1e-10, "fatol": 1e-14, "maxiter": 4000})
            if best is None or r.fun < best.fun:
                best = r
    a, b = best.x
    e0 = 1 - fid(M0, a, b)
    nodes, weights = hermegauss(int(doc.get("nodes", 5)))
    weights = weights / weights.sum()

    def excess(sigma, which):
        if sigma <= 0:
            return 0.0
        s = 0.0
        for xk, wk in zip(nodes, weights):
            if xk == 0:
                s += wk * e0
                continue
            M, _ = gate(sigma * xk, 0.0, lab) if which == "A" else gate(0.0, sigma * xk, lab)
            s += wk * (1 - fid(M, a, b))
        return s - e0

    ph = np.angle(M0[3, 3]) - np.angle(M0[2, 2]) - np.angle(M0[1, 1]) + np.angle(M0[0, 0])
    out = {
        "nominalError": e0,
        "mover": excess(doc["sigmaMover"], "A"),
        "partner": excess(doc["sigmaPartner"], "B"),
        "conditionalPhase": float(np.angle(np.exp(1j * ph))),
        "leakage": float(1 - np.trace(M0.conj().T @ M0).real / 4),
    }
    print(json.dumps(out))


main()
