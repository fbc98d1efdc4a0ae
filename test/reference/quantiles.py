"""Quantiles (NumPy's default linear interpolation) and the mean, for test/yield/cycle-error.test.ts.

stdin:  {"values": [numbers], "q": [fractions]}
stdout: {"quantiles": [numbers], "mean": number}
"""
import json
import sys

import numpy as np


def main():
    doc = json.load(sys.stdin)
    v = np.asarray(doc["values"], dtype=float)
    print(json.dumps({"quantiles": [float(x) for x in np.quantile(v, doc["q"])], "mean": float(np.mean(v))}))


main()
