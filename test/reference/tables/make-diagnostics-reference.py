# Builds diagnostics-reference.json: reference values for the assumption
# checks, computed with numpy straight from the published formulas (scipy and
# statsmodels are not available on the machine that made the fixture).
# Residuals come from NIST's certified parameters (exact rational arithmetic).
# Data: NIST StRD linear least squares datasets Longley, Pontius and Norris
# (US government public domain), copied into the fixture.
#   Jarque & Bera (1987): JB = n/6 (S^2 + (K-3)^2/4), moment estimators.
#   Koenker (1981) studentised Breusch-Pagan: LM = n R^2 of e^2 on [1, X].
#   Durbin & Watson (1950): d = sum (e_t - e_{t-1})^2 / sum e_t^2.
#   VIF_j = 1 / (1 - R_j^2) from the auxiliary regression of column j on the rest.
#   Belsley, Kuh & Welsch (1980) condition number: unit-length columns of X.
# Chi-square upper tails in closed form: for even df,
#   Q(df/2, x/2) = exp(-x/2) sum_{j < df/2} (x/2)^j / j!;  for df = 1, erfc(sqrt(x/2)).
import json, math, os, sys
import numpy as np

SRC = os.path.join(os.path.dirname(os.path.abspath(__file__)), '..', 'nist') + os.sep  # the embedded NIST copies

def chi2_sf(x, df):
    if df == 1:
        return math.erfc(math.sqrt(x / 2))
    assert df % 2 == 0
    h = x / 2
    return math.exp(-h) * sum(h ** j / math.factorial(j) for j in range(df // 2))

def r_squared(Z, y):
    # Centred, unit-length columns: the same regression, better conditioned.
    Zc = Z - Z.mean(axis=0)
    Zc = Zc / np.linalg.norm(Zc, axis=0)
    A = np.column_stack([np.ones(len(y)), Zc])
    b, *_ = np.linalg.lstsq(A, y, rcond=None)
    r = y - A @ b
    yc = y - y.mean()
    return 1 - (r @ r) / (yc @ yc)

def certified_residuals(d, columns):
    # Residuals from NIST's certified parameters in exact rational arithmetic,
    # rounded once: far more accurate than any double fit on Pontius or Longley.
    from fractions import Fraction
    b = [Fraction(p['estimate']) for p in d['certified']['parameters']]
    y = d['data']['y']
    out = []
    for i in range(len(y)):
        fitted = b[0] + sum(b[k + 1] * Fraction(columns[k][i]) for k in range(len(columns)))
        out.append(float(Fraction(y[i]) - fitted))
    return np.array(out)

def case(name, columns, y, e):
    X = np.column_stack([np.ones(len(y))] + columns)
    n = len(y)
    d = e - e.mean()
    m2, m3, m4 = (d ** 2).mean(), (d ** 3).mean(), (d ** 4).mean()
    S, K = m3 / m2 ** 1.5, m4 / m2 ** 2
    jb = n / 6 * (S ** 2 + (K - 3) ** 2 / 4)
    Z = np.column_stack(columns)
    lm = n * r_squared(Z, e ** 2)
    k = Z.shape[1]
    dw = float(np.sum(np.diff(e) ** 2) / np.sum(e ** 2))
    vifs = [1 / (1 - r_squared(np.delete(Z, j, axis=1), Z[:, j])) for j in range(k)] if k > 1 else [1.0]
    Xs = X / np.linalg.norm(X, axis=0)
    s = np.linalg.svd(Xs, compute_uv=False)
    return {
        'jarqueBera': {'statistic': jb, 'pValue': chi2_sf(jb, 2), 'skewness': S, 'kurtosis': K},
        'breuschPaganKoenker': {'statistic': lm, 'df': k, 'pValue': chi2_sf(lm, k)},
        'durbinWatson': dw,
        'varianceInflationFactors': vifs,
        'conditionNumber': float(s[0] / s[-1]),
    }

out = {
    'generatedWith': f'numpy {np.__version__}, Python {sys.version.split()[0]} (formulas above; no statistics library)',
    'dataSource': 'NIST Statistical Reference Datasets, linear least squares: Longley, Pontius, Norris (public domain)',
    'cases': {},
}
for name, fname in [('Longley', 'longley'), ('Pontius', 'pontius'), ('Norris', 'norris')]:
    d = json.load(open(SRC + fname + '.json'))
    y = np.array(d['data']['y'], dtype=float)
    if d['polynomialDegree']:
        x = np.array(d['data']['x'], dtype=float)
        names = ['x'] + [f'x^{p}' for p in range(2, d['polynomialDegree'] + 1)]
        cols = [x ** p for p in range(1, d['polynomialDegree'] + 1)]
        exact_cols = [[v ** p for v in d['data']['x']] for p in range(1, d['polynomialDegree'] + 1)]
        data = {'x': d['data']['x'], 'y': d['data']['y']}
    else:
        names = d['predictors']
        cols = [np.array(d['data'][p], dtype=float) for p in names]
        exact_cols = [d['data'][p] for p in names]
        data = d['data']
    out['cases'][name] = {'columns': names, 'data': data, 'polynomialDegree': d['polynomialDegree'], **case(name, cols, y, certified_residuals(d, exact_cols))}
json.dump(out, open(sys.argv[1] if len(sys.argv) > 1 else 'diagnostics-reference.json', 'w'), indent=1)
