"""Reference for the quasi-static 1/f coherence (test/transmon/coherence.test.ts): the in-phase
part of E[exp(i 2 pi t (f1 x + f2 x^2 / 2))] exp(-i 2 pi t f2 sigma^2 / 2) for x ~ N(0, sigma^2),
integrated numerically with scipy.integrate.quad (the mean frequency shift f2 sigma^2 / 2 removed).

stdin:  {"cases": [{"t", "f1", "f2", "sigma"}]}   (ns, GHz/Phi0, GHz/Phi0^2, Phi0)
stdout: {"values": [...]}
"""
import json
import sys

import numpy as np
from scipy import integrate


def main():
    doc = json.load(sys.stdin)
    out = []
    for c in doc["cases"]:
        t, f1, f2, s = c["t"], c["f1"], c["f2"], c["sigma"]
        mean_shift = 0.5 * f2 * s * s

        def integrand(x):
            phase = 2 * np.pi * t * (f1 * x + 0.5 * f2 * x * x - mean_shift)
            return np.cos(phase) * np.exp(-0.5 * (x / s) ** 2) / (s * np.sqrt(2 * np.pi))

        v, _ = integrate.quad(integrand, -12 * s, 12 * s, limit=2000, epsabs=1e-13, epsrel=1e-12)
        out.append(v)
    print(json.dumps({"values": out}))


main()
