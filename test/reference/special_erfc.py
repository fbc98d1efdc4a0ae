"""scipy.special.erf / erfc reference for test/util/erf.test.ts, independent of fluxlane.

stdin:  {"x": [...]}
stdout: {"erf": [...], "erfc": [...]}
"""
import json
import sys

from scipy.special import erf, erfc

xs = json.load(sys.stdin)["x"]
print(json.dumps({"erf": [float(erf(x)) for x in xs], "erfc": [float(erfc(x)) for x in xs]}))
