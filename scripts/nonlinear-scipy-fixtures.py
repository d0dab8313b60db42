#!/usr/bin/python3
"""Random nonlinear least-squares problems with known solutions, solved by
scipy.optimize.least_squares, written to test/reference/nonlinear/scipy-random.json
for test/core/models/nonlinear/scipy-random.test.ts.

Each problem draws its true parameters and noise from a seeded generator
(numpy.random.default_rng), so the file is reproducible. scipy solves it with
an analytic Jacobian and tolerances at rounding level (ftol = xtol = gtol =
1e-15; 'lm' = MINPACK without bounds, 'trf' with bounds); standard errors
are s * sqrt(diag((J'WJ)^-1)) from numpy at scipy's solution, and mean-response
predictions at three new points carry delta-method standard errors
sqrt(g' C g) with the model's analytic gradient g.

Run with Debian's Python (it has numpy and scipy):
    /usr/bin/python3 scripts/nonlinear-scipy-fixtures.py
"""
import json
import sys
from pathlib import Path

import numpy as np
import scipy
from scipy.optimize import least_squares

OUT = Path(__file__).resolve().parent.parent / "test" / "reference" / "nonlinear" / "scipy-random.json"

# Each family: expression in the service's grammar, the same model and its
# Jacobian in numpy, parameter names, how to draw the truth, x and noise.
FAMILIES = {
    "decay": dict(
        expression="a*exp(-k*t) + c",
        names=["a", "k", "c"],
        f=lambda b, t: b[0] * np.exp(-b[1] * t) + b[2],
        jac=lambda b, t: np.column_stack([np.exp(-b[1] * t), -b[0] * t * np.exp(-b[1] * t), np.ones_like(t)]),
        truth=lambda r: [r.uniform(5, 20), r.uniform(0.05, 0.5), r.uniform(-2, 2)],
        x=lambda r, n: np.sort(r.uniform(0, 30, n)),
        noise=0.2,
    ),
    "saturation": dict(
        expression="vmax*s/(km + s)",
        names=["vmax", "km"],
        f=lambda b, s: b[0] * s / (b[1] + s),
        jac=lambda b, s: np.column_stack([s / (b[1] + s), -b[0] * s / (b[1] + s) ** 2]),
        truth=lambda r: [r.uniform(50, 200), r.uniform(0.5, 5)],
        x=lambda r, n: np.sort(r.uniform(0.1, 20, n)),
        noise=2.0,
    ),
    "logistic": dict(
        expression="top/(1 + exp(-rate*(t - mid)))",
        names=["top", "rate", "mid"],
        f=lambda b, t: b[0] / (1 + np.exp(-b[1] * (t - b[2]))),
        jac=lambda b, t: np.column_stack([
            1 / (1 + np.exp(-b[1] * (t - b[2]))),
            b[0] * (t - b[2]) * np.exp(-b[1] * (t - b[2])) / (1 + np.exp(-b[1] * (t - b[2]))) ** 2,
            -b[0] * b[1] * np.exp(-b[1] * (t - b[2])) / (1 + np.exp(-b[1] * (t - b[2]))) ** 2,
        ]),
        truth=lambda r: [r.uniform(80, 120), r.uniform(0.3, 1.0), r.uniform(8, 12)],
        x=lambda r, n: np.sort(r.uniform(0, 20, n)),
        noise=1.5,
    ),
    "peak": dict(
        expression="h*exp(-((t - c)/w)^2/2) + base",
        names=["h", "c", "w", "base"],
        f=lambda b, t: b[0] * np.exp(-(((t - b[1]) / b[2]) ** 2) / 2) + b[3],
        jac=lambda b, t: np.column_stack([
            np.exp(-(((t - b[1]) / b[2]) ** 2) / 2),
            b[0] * np.exp(-(((t - b[1]) / b[2]) ** 2) / 2) * (t - b[1]) / b[2] ** 2,
            b[0] * np.exp(-(((t - b[1]) / b[2]) ** 2) / 2) * (t - b[1]) ** 2 / b[2] ** 3,
            np.ones_like(t),
        ]),
        truth=lambda r: [r.uniform(20, 50), r.uniform(40, 60), r.uniform(3, 8), r.uniform(1, 5)],
        x=lambda r, n: np.sort(r.uniform(20, 80, n)),
        noise=0.8,
    ),
    "power": dict(
        expression="a*x^p",
        names=["a", "p"],
        f=lambda b, x: b[0] * x ** b[1],
        jac=lambda b, x: np.column_stack([x ** b[1], b[0] * x ** b[1] * np.log(x)]),
        truth=lambda r: [r.uniform(1, 4), r.uniform(0.3, 1.7)],
        x=lambda r, n: np.sort(r.uniform(1, 50, n)),
        noise=0.5,
    ),
    "rational": dict(
        expression="(p0 + p1*x)/(1 + q1*x)",
        names=["p0", "p1", "q1"],
        f=lambda b, x: (b[0] + b[1] * x) / (1 + b[2] * x),
        jac=lambda b, x: np.column_stack([1 / (1 + b[2] * x), x / (1 + b[2] * x), -x * (b[0] + b[1] * x) / (1 + b[2] * x) ** 2]),
        truth=lambda r: [r.uniform(1, 3), r.uniform(2, 6), r.uniform(0.05, 0.3)],
        x=lambda r, n: np.sort(r.uniform(0, 40, n)),
        noise=0.1,
    ),
    "oscillation": dict(
        expression="m + amp*sin(2*pi*t/period + phase)",
        names=["m", "amp", "period", "phase"],
        f=lambda b, t: b[0] + b[1] * np.sin(2 * np.pi * t / b[2] + b[3]),
        jac=lambda b, t: np.column_stack([
            np.ones_like(t),
            np.sin(2 * np.pi * t / b[2] + b[3]),
            -b[1] * np.cos(2 * np.pi * t / b[2] + b[3]) * 2 * np.pi * t / b[2] ** 2,
            b[1] * np.cos(2 * np.pi * t / b[2] + b[3]),
        ]),
        truth=lambda r: [r.uniform(10, 20), r.uniform(2, 5), r.uniform(11, 13), r.uniform(0.2, 1.2)],
        x=lambda r, n: np.sort(r.uniform(0, 60, n)),
        noise=0.6,
    ),
    "arrhenius": dict(
        expression="log(a) - ea/(8.314*temp)",
        names=["a", "ea"],
        f=lambda b, t: np.log(b[0]) - b[1] / (8.314 * t),
        jac=lambda b, t: np.column_stack([np.full_like(t, 1 / b[0]), -1 / (8.314 * t)]),
        truth=lambda r: [r.uniform(1e6, 1e8), r.uniform(4e4, 8e4)],
        x=lambda r, n: np.sort(r.uniform(300, 400, n)),
        noise=0.05,
    ),
}


def problem(family, seed, n, weighted=False, bound=None, starts=1):
    spec = FAMILIES[family]
    rng = np.random.default_rng(seed)
    truth = np.array(spec["truth"](rng), dtype=float)
    x = spec["x"](rng, n)
    weights = rng.uniform(0.5, 2.0, n) if weighted else np.ones(n)
    y = spec["f"](truth, x) + rng.normal(0, spec["noise"], n) / np.sqrt(weights)
    # Starts: the truth perturbed by up to 15% (several for a multi-start problem).
    start_list = [truth * rng.uniform(0.85, 1.15, truth.size) for _ in range(starts)]
    lower = np.full(truth.size, -np.inf)
    upper = np.full(truth.size, np.inf)
    if bound is not None:
        j, side, value = bound
        (lower if side == "lower" else upper)[j] = value
        for s in start_list:
            s[j] = max(s[j], value) if side == "lower" else min(s[j], value)
    sw = np.sqrt(weights)
    fun = lambda b: sw * (spec["f"](b, x) - y)
    jac = lambda b: sw[:, None] * spec["jac"](b, x)
    best = None
    for s in start_list:
        method = "trf" if bound is not None else "lm"
        kw = dict(ftol=1e-15, xtol=1e-15, gtol=1e-15, method=method, jac=jac)
        if bound is not None:
            kw["bounds"] = (lower, upper)
        else:
            kw["x_scale"] = "jac"
        res = least_squares(fun, s, **kw)
        rss = float(np.sum(res.fun ** 2))
        if best is None or rss < best[1]:
            best = (res, rss)
    res, rss = best
    J = jac(res.x)
    dof = n - truth.size
    cov = np.linalg.inv(J.T @ J) * rss / dof
    # Mean-response predictions at three new points inside the data's range,
    # with delta-method standard errors sqrt(g' C g), g the model's gradient.
    new_x = np.quantile(x, [0.1, 0.5, 0.9]) + 0.01
    g = spec["jac"](res.x, new_x)
    predictions = {
        "at": new_x.tolist(),
        "estimate": spec["f"](res.x, new_x).tolist(),
        "standardError": np.sqrt(np.einsum("ij,jk,ik->i", g, cov, g)).tolist(),
    }
    # The expression's data column: the one name not a parameter or function.
    data_name = [w for w in ["t", "s", "x", "temp"] if w in tokens(spec["expression"])][0]
    columns = {data_name: x.tolist()}
    out = {
        "name": f"{family}-{seed}" + ("-weighted" if weighted else "") + ("-bounded" if bound else "") + ("-starts" if starts > 1 else ""),
        "family": family,
        "expression": spec["expression"],
        "parameters": spec["names"],
        "truth": truth.tolist(),
        "starts": [s.tolist() for s in start_list],
        "columns": columns,
        "response": y.tolist(),
        "weights": weights.tolist() if weighted else None,
        "bounds": None,
        "scipy": {
            "method": "trf" if bound is not None else "lm",
            "estimates": res.x.tolist(),
            "standardErrors": np.sqrt(np.diag(cov)).tolist(),
            "rss": rss,
            "status": int(res.status),
            "nfev": int(res.nfev),
            "activeMask": res.active_mask.tolist(),
            "predictions": predictions,
        },
    }
    if bound is not None:
        j, side, value = bound
        out["bounds"] = {spec["names"][j]: [value, None] if side == "lower" else [None, value]}
    return out


def tokens(expression):
    import re
    return set(re.findall(r"[A-Za-z_][A-Za-z0-9_]*", expression))


def main():
    problems = []
    seed = 1000
    for family in FAMILIES:
        for n in (12, 40, 200):
            seed += 1
            problems.append(problem(family, seed, n))
    problems.append(problem("decay", 2001, 60, weighted=True))
    problems.append(problem("logistic", 2002, 80, weighted=True))
    problems.append(problem("peak", 2003, 120, starts=3))
    problems.append(problem("saturation", 2004, 30, starts=2))
    # Bounds active at the solution: the floor of a decay held at 0.5 above its
    # unconstrained estimate, and a power law's exponent capped below its estimate.
    free = problem("decay", 2005, 50)
    floor = free["scipy"]["estimates"][2] + 0.5
    problems.append(problem("decay", 2005, 50, bound=(2, "lower", floor)))
    free = problem("power", 2006, 50)
    cap = free["scipy"]["estimates"][1] - 0.05
    problems.append(problem("power", 2006, 50, bound=(1, "upper", cap)))
    doc = {
        "source": "scripts/nonlinear-scipy-fixtures.py",
        "generator": "numpy.random.default_rng(seed); scipy.optimize.least_squares with analytic Jacobians, ftol = xtol = gtol = 1e-15",
        "versions": {"python": sys.version.split()[0], "numpy": np.__version__, "scipy": scipy.__version__},
        "problems": problems,
    }
    OUT.parent.mkdir(parents=True, exist_ok=True)
    OUT.write_text(json.dumps(doc, indent=1) + "\n")
    print(f"wrote {len(problems)} problems to {OUT}")


if __name__ == "__main__":
    main()
