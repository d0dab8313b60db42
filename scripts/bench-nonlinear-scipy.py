#!/usr/bin/python3
"""The scipy side of scripts/bench-nonlinear.ts: reads problems (expression in
the service's grammar, columns, response, start) as JSON on stdin, fits each
with scipy.optimize.least_squares and prints, as JSON, the fastest CPU
time of each fit, its status and estimates.

scipy is given what a user of a general-purpose solver gives it for an
expression: the residual function and a finite-difference Jacobian
('2-point'); 'lm' is MINPACK's lmdif (Levenberg-Marquardt with Moré's trust
region, compiled Fortran). Two tolerance settings: scipy's defaults
(ftol = xtol = gtol = 1e-8) and rounding level (1e-15), the service's.
"""
import json
import re
import sys
import time

import numpy as np
import scipy
from scipy.optimize import least_squares

FUNCTIONS = {"exp": "np.exp", "log": "np.log", "log10": "np.log10", "sqrt": "np.sqrt", "abs": "np.abs",
             "sin": "np.sin", "cos": "np.cos", "tan": "np.tan", "atan": "np.arctan", "pi": "np.pi"}


def to_python(expression, parameters):
    """The grammar maps onto Python's: ^ is **, which binds tighter than unary minus and is right-associative."""
    def name(m):
        word = m.group(0)
        if word in FUNCTIONS:
            return FUNCTIONS[word]
        if word in parameters:
            return f"b[{parameters.index(word)}]"
        return f"c[{word!r}]"
    text = re.sub(r"(?<![\w.])[A-Za-z_]\w*", name, expression)
    return text.replace("^", "**")


def main():
    request = json.load(sys.stdin)
    out = []
    with np.errstate(all="ignore"):
        for p in request["problems"]:
            code = compile(to_python(p["expression"], p["parameters"]), "<expression>", "eval")
            c = {k: np.asarray(v, dtype=float) for k, v in p["columns"].items()}
            y = np.asarray(p["y"], dtype=float)
            fun = lambda b: eval(code, {"np": np, "b": b, "c": c}) - y  # noqa: E731 (trusted: our own benchmark problems)
            x0 = np.asarray(p["start"], dtype=float)
            row = {"name": p["name"]}
            for label, tol in (("default", 1e-8), ("tight", 1e-15)):
                # As on the TypeScript side: CPU time (time.process_time), a warm-up,
                # then at least `repeats` runs, short ones repeated for 0.3 s (at
                # most 50); the fastest counts.
                least_squares(fun, x0, method="lm", jac="2-point", ftol=tol, xtol=tol, gtol=tol, max_nfev=100000)
                best = float("inf")
                spent = 0.0
                runs = 0
                while runs < 50 and (runs < request["repeats"] or spent < 0.3):
                    t0 = time.process_time()
                    res = least_squares(fun, x0, method="lm", jac="2-point", ftol=tol, xtol=tol, gtol=tol, max_nfev=100000)
                    elapsed = time.process_time() - t0
                    spent += elapsed
                    runs += 1
                    best = min(best, elapsed)
                estimates = [v if np.isfinite(v) else None for v in res.x.tolist()]
                row[label] = {"seconds": best, "status": int(res.status), "estimates": estimates, "nfev": int(res.nfev)}
            out.append(row)
    json.dump({"versions": {"python": sys.version.split()[0], "numpy": np.__version__, "scipy": scipy.__version__}, "results": out}, sys.stdout)


if __name__ == "__main__":
    main()
