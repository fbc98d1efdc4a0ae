"""Landau-Zener reference for test/plan/landau-zener.test.ts, independent of fluxlane.

Two diabatic states with H/h = [[v t / 2, g], [g, -v t / 2]] (frequencies in GHz, time in ns,
v in GHz/ns), integrated with scipy.integrate.solve_ivp (DOP853, rtol 1e-10) from t = -T to T
starting in diabatic state |0>. The transferred population is the population that ends in the
OTHER diabatic state, P = |<1|psi(t)>|^2 for t >> 0 (the system followed the adiabatic state).
Starting in the lower adiabatic state at -T and projecting on the lower adiabatic state at +T
removes the finite-window transients (a diabatic start and end leave an interference term of
relative size ~ 2 g / (v T sqrt(P))).

stdin:  {"cases": [{"g": GHz, "v": GHz/ns}, ...]}
stdout: {"results": [P, ...]}
"""
import json
import sys

import numpy as np
from scipy.integrate import solve_ivp


def transfer(g, v):
    # Half-window: the detuning reaches 200 g (at least 1 GHz) at the ends.
    T = max(200.0 * g, 1.0) * 2.0 / v
    two_pi = 2.0 * np.pi

    def ham(t):
        return np.array([[v * t / 2.0, g], [g, -v * t / 2.0]])

    def rhs(t, y):
        psi = y[:2] + 1j * y[2:]
        d = -1j * two_pi * (ham(t) @ psi)
        return np.concatenate([d.real, d.imag])

    # Start in the lower adiabatic state, end by projecting on the lower adiabatic state: the
    # population that followed it is the transferred one (diabatic |0> -> diabatic |1>), and
    # adiabatic-basis start and end remove the finite-window transients.
    w0, u0 = np.linalg.eigh(ham(-T))
    start = u0[:, 0]
    sol = solve_ivp(rhs, (-T, T), np.concatenate([start, np.zeros(2)]), method="DOP853", rtol=1e-11, atol=1e-13)
    y = sol.y[:, -1]
    psi = y[:2] + 1j * y[2:]
    w1, u1 = np.linalg.eigh(ham(T))
    return float(abs(np.vdot(u1[:, 0], psi)) ** 2)


def main():
    data = json.load(sys.stdin)
    print(json.dumps({"results": [transfer(c["g"], c["v"]) for c in data["cases"]]}))


main()
