#!/usr/bin/python3
"""Extended-precision references for the nonlinear engine, computed with
mpmath at 50 digits, written to test/reference/nonlinear/mpmath-reference.json:

1. The least-squares minimum of NIST StRD Lanczos1 for its data *as the
   engine reads them* (each value rounded to the nearest double): estimates,
   residual sum of squares and standard deviations sqrt(diag((J'J)^-1) RSS/df).
   Lanczos1's certified RSS (1.4e-25) belongs to the decimal data; rounding
   the responses to doubles moves the minimum's RSS in its fourth digit, so
   the tests check the engine's RSS and standard deviations against this.
   Gauss-Newton from the certified estimates, exact Jacobian by mpmath.diff.
2. Double-double elementary functions (exp, log, log10, sin, cos, tan, atan, pow)
   at points given as hi + lo, their exact values split into hi + lo.

Run with Debian's Python (mpmath 1.2 comes with python3-mpmath/sympy):
    /usr/bin/python3 scripts/nonlinear-mpmath-fixtures.py
"""
import json
import sys
from pathlib import Path

import mpmath

ROOT = Path(__file__).resolve().parent.parent
OUT = ROOT / "test" / "reference" / "nonlinear" / "mpmath-reference.json"
mpmath.mp.dps = 50


def split(v):
    hi = float(v)
    lo = float(v - mpmath.mpf(hi))
    return [hi, lo]


def lanczos1():
    d = json.loads((ROOT / "test" / "reference" / "nist-nls" / "lanczos1.json").read_text(), parse_float=str)
    # Each data value rounded to a double, as JSON.parse gives it to the engine; mpf(float) is exact.
    xs = [mpmath.mpf(float(v)) for v in d["data"]["x"]]
    ys = [mpmath.mpf(float(v)) for v in d["data"]["y"]]

    def model(b, x):
        return b[0] * mpmath.exp(-b[1] * x) + b[2] * mpmath.exp(-b[3] * x) + b[4] * mpmath.exp(-b[5] * x)

    def gradient(b, x):
        return [
            mpmath.exp(-b[1] * x), -b[0] * x * mpmath.exp(-b[1] * x),
            mpmath.exp(-b[3] * x), -b[2] * x * mpmath.exp(-b[3] * x),
            mpmath.exp(-b[5] * x), -b[4] * x * mpmath.exp(-b[5] * x),
        ]

    b = [mpmath.mpf(p["estimate"]) for p in d["certified"]["parameters"]]
    for _ in range(40):
        J = mpmath.matrix([gradient(b, x) for x in xs])
        r = mpmath.matrix([y - model(b, x) for x, y in zip(xs, ys)])
        step = mpmath.lu_solve(J.T * J, J.T * r)
        b = [b[j] + step[j] for j in range(6)]
        if max(abs(step[j]) / abs(b[j]) for j in range(6)) < mpmath.mpf("1e-40"):
            break
    rss = sum((y - model(b, x)) ** 2 for x, y in zip(xs, ys))
    J = mpmath.matrix([gradient(b, x) for x in xs])
    cov = mpmath.inverse(J.T * J)
    df = len(xs) - 6
    sd = [mpmath.sqrt(cov[j, j] * rss / df) for j in range(6)]
    return {
        "dataset": "Lanczos1",
        "note": "least-squares minimum of the Lanczos1 data rounded to doubles, 50-digit Gauss-Newton from the certified estimates",
        "estimates": [mpmath.nstr(v, 20) for v in b],
        "standardDeviations": [mpmath.nstr(v, 20) for v in sd],
        "residualSumOfSquares": mpmath.nstr(rss, 20),
        "certifiedResidualSumOfSquares": d["certified"]["residualSumOfSquares"],
    }


def elementary():
    # Arguments hi + lo with a nonzero lo, so the low part matters.
    points = [
        # exp: both signs, the reduction's table edges (j ln2/64 +- ln2/128),
        # near 0, and close to overflow and underflow.
        ("exp", [0.5, 1e-17]), ("exp", [-0.5, -2e-17]), ("exp", [1e-9, 3e-26]), ("exp", [-1e-9, 0.0]),
        ("exp", [0.0054152123481245725, 1e-19]), ("exp", [0.016245637044373718, -1e-18]),
        ("exp", [-107.3, 4e-15]), ("exp", [-200.125, 1e-14]), ("exp", [88.7, -3e-15]), ("exp", [709.5, 1e-14]),
        ("exp", [-700.25, 2e-14]), ("exp", [3.7, 1.1e-16]), ("exp", [-25.9, -1e-15]),
        ("log", [0.7, 1.3e-17]), ("log", [1.0000001, -4e-24]), ("log", [123456.789, 3e-12]), ("log", [3.5e-8, 1e-25]),
        ("log10", [0.02, 1e-19]), ("log10", [987.65, -2e-14]),
        ("sin", [0.3, 1e-17]), ("sin", [2.5, -1e-16]), ("sin", [-7.9, 3e-16]), ("sin", [1000.5, 1e-14]), ("sin", [1.5707963267948966, 6.123233995736766e-17]),
        ("cos", [0.3, 1e-17]), ("cos", [2.5, -1e-16]), ("cos", [-7.9, 3e-16]), ("cos", [1000.5, 1e-14]), ("cos", [1.5707963267948966, 6.0e-17]),
        ("tan", [0.7, 2e-17]), ("tan", [-1.2, 1e-16]), ("tan", [40.1, -3e-15]),
        ("atan", [0.5, 1e-17]), ("atan", [-3.0, 2e-16]), ("atan", [1e-5, 1e-22]), ("atan", [250.0, 1e-14]),
        ("pow", [[2.5, 1e-16], [1.7, -3e-17]]), ("pow", [[0.3, 2e-17], [-2.25, 0.0]]), ("pow", [[-1.5, 1e-16], [3.0, 0.0]]), ("pow", [[7.0, 0.0], [-0.5, 0.0]]),
    ]
    out = []
    for fn, arg in points:
        if fn == "pow":
            (ah, al), (bh, bl) = arg
            a = mpmath.mpf(ah) + mpmath.mpf(al)
            b = mpmath.mpf(bh) + mpmath.mpf(bl)
            value = a ** b
        else:
            x = mpmath.mpf(arg[0]) + mpmath.mpf(arg[1])
            value = {"exp": mpmath.exp, "log": mpmath.log, "log10": lambda v: mpmath.log(v, 10), "sin": mpmath.sin, "cos": mpmath.cos,
                     "tan": mpmath.tan, "atan": mpmath.atan}[fn](x)
        out.append({"fn": fn, "argument": arg, "value": split(mpmath.re(value))})
    return out


def main():
    doc = {
        "source": "scripts/nonlinear-mpmath-fixtures.py",
        "versions": {"python": sys.version.split()[0], "mpmath": mpmath.__version__},
        "digits": mpmath.mp.dps,
        "lanczos1DoubleData": lanczos1(),
        "elementary": elementary(),
        "constants": {"pi": split(mpmath.pi)},
    }
    OUT.parent.mkdir(parents=True, exist_ok=True)
    OUT.write_text(json.dumps(doc, indent=1) + "\n")
    print(json.dumps(doc["lanczos1DoubleData"], indent=1))


if __name__ == "__main__":
    main()
