"""SplitMix64 (Steele, Lea and Flood, OOPSLA 2014) in Python integers, for
test/util/random.test.ts: the first two outputs from the 64-bit state `key`.

stdin:  {"keys": ["decimal 64-bit integers"]}
stdout: {"outputs": [["decimal", "decimal"], ...]}
"""
import json
import sys

MASK = (1 << 64) - 1


def splitmix64(state):
    state = (state + 0x9E3779B97F4A7C15) & MASK
    z = state
    z = ((z ^ (z >> 30)) * 0xBF58476D1CE4E5B9) & MASK
    z = ((z ^ (z >> 27)) * 0x94D049BB133111EB) & MASK
    return state, z ^ (z >> 31)


def main():
    doc = json.load(sys.stdin)
    out = []
    for k in doc["keys"]:
        s = int(k)
        s, a = splitmix64(s)
        s, b = splitmix64(s)
        out.append([str(a), str(b)])
    print(json.dumps({"outputs": out}))


main()
