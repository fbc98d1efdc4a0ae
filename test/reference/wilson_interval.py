"""Wilson score intervals from SciPy, for test/yield/wilson.test.ts:
scipy.stats.binomtest(k, n).proportion_ci(confidence_level, method='wilson').

stdin:  {"cases": [[k, n], ...], "confidence": 0.95}
stdout: {"intervals": [[low, high], ...], "z": norm.ppf(0.5 + confidence / 2)}
"""
import json
import sys

from scipy.stats import binomtest, norm


def main():
    doc = json.load(sys.stdin)
    c = float(doc["confidence"])
    out = []
    for k, n in doc["cases"]:
        ci = binomtest(int(k), int(n)).proportion_ci(confidence_level=c, method="wilson")
        out.append([float(ci.low), float(ci.high)])
    print(json.dumps({"intervals": out, "z": float(norm.ppf(0.5 + c / 2))}))


main()
