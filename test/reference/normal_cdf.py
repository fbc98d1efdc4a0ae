"""Standard normal CDF from SciPy (scipy.stats.norm.cdf), for the yield tests
(test/yield/draw.test.ts, test/yield/gaussian-yield.test.ts).

stdin:  {"x": [numbers]}
stdout: {"cdf": [numbers]}
"""
import json
import sys

from scipy.stats import norm


def main():
    doc = json.load(sys.stdin)
    print(json.dumps({"cdf": [float(norm.cdf(float(x))) for x in doc["x"]]}))


main()
