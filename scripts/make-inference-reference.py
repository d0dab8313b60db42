#!/usr/bin/python3
"""Reference values for coefficient tests, prediction intervals, back-transformed
predictions, model-averaged prediction intervals and centred condition numbers,
computed with general-purpose libraries (statsmodels, scipy, numpy) so the
service's own numbers can be checked against them.

Run with Debian's Python, which has the libraries:

    /usr/bin/python3 scripts/make-inference-reference.py > test/reference/tables/inference-reference.json

Sources of the data:
  * NIST StRD Longley (public domain), from the copy embedded in test/reference/nist;
  * two small data sets generated here from a fixed numpy seed (a scenario of
    our own: a spray-coating line and a fatigue rig), written into the output
    so the tests post exactly these numbers.

What each value is:
  * coefficients: statsmodels OLS/WLS params, bse, tvalues, pvalues and
    conf_int(alpha) — Student's t with n - p degrees of freedom;
  * predictions: get_prediction(exog, weights).summary_frame(alpha): mean,
    mean_se, mean_ci_*, obs_ci_* (new observation of weight 1 unless weights
    are given, as statsmodels interprets them: variance scale / weight);
  * back-transformed: the statsmodels log-scale frame passed through exp()
    (the median of y when log y is normal), and the delta-method standard
    error exp(mean) * mean_se;
  * averaged: Akaike weights from AICc with statsmodels' full log-likelihood
    (the log model's shifted by its Jacobian -sum(ln y)), k = parameters + 1;
    the weighted average of the models' back-transformed predictions; the
    unconditional standard error sqrt(sum w (se^2 + (yhat - ybar)^2)); and the
    model-averaged tail-area (MATA) Wald bounds: b solving
    sum_i w_i T_df((g_i(b) - mu_i)/s_i) = alpha/2 (resp. 1 - alpha/2), found
    with scipy.optimize.brentq, s_i the mean standard error (or the new
    observation's) on model i's own scale;
  * centred condition numbers: numpy SVD of the centred regressors scaled to
    unit length, s_max / s_min.
"""
import json
import os
import sys

import numpy as np
import scipy
import statsmodels
import statsmodels.api as sm
from scipy import optimize, stats

HERE = os.path.dirname(os.path.abspath(__file__))
NIST = os.path.join(HERE, '..', 'test', 'reference', 'nist')


def floats(a):
    return [float(v) for v in np.asarray(a).ravel()]


def coefficient_table(res, alpha):
    ci = np.asarray(res.conf_int(alpha=alpha))
    return {
        'estimate': floats(res.params),
        'standardError': floats(res.bse),
        'tStatistic': floats(res.tvalues),
        'pValue': floats(res.pvalues),
        'lower': floats(ci[:, 0]),
        'upper': floats(ci[:, 1]),
    }


def prediction_table(res, exog, alpha, weights=None):
    frame = res.get_prediction(exog, weights=weights).summary_frame(alpha=alpha)
    return {
        'estimate': floats(frame['mean']),
        'standardError': floats(frame['mean_se']),
        'lower': floats(frame['mean_ci_lower']),
        'upper': floats(frame['mean_ci_upper']),
        'predictionLower': floats(frame['obs_ci_lower']),
        'predictionUpper': floats(frame['obs_ci_upper']),
    }


def centred_condition(columns):
    z = np.column_stack(columns).astype(float)
    z = z - z.mean(axis=0)
    z = z / np.linalg.norm(z, axis=0)
    s = np.linalg.svd(z, compute_uv=False)
    return float(s[0] / s[-1])


def summary_of(columns, weights=None):
    """rows, means and centred cross products of the listed columns (numpy), the data.summary form."""
    x = np.column_stack(columns).astype(float)
    w = np.ones(len(x)) if weights is None else np.asarray(weights, dtype=float)
    means = (w[:, None] * x).sum(axis=0) / w.sum()
    d = x - means
    out = {'rows': len(x), 'means': floats(means), 'centredCrossProducts': [floats(r) for r in (d.T * w) @ d]}
    if weights is not None:
        out['weights'] = {'sum': float(w.sum()), 'sumLog': float(np.log(w).sum())}
    return out


def longley():
    d = json.load(open(os.path.join(NIST, 'longley.json')))
    names = d['predictors']
    x = np.column_stack([d['data'][p] for p in names]).astype(float)
    y = np.array(d['data']['y'], dtype=float)
    res = sm.OLS(y, sm.add_constant(x)).fit()
    # New rows: the column means, and two rows of the data itself.
    at = np.vstack([x.mean(axis=0), x[0], x[-1]])
    return {
        'source': 'NIST StRD Longley (test/reference/nist/longley.json)',
        'columns': names,
        'newRows': {p: floats(at[:, j]) for j, p in enumerate(names)},
        'coefficients95': coefficient_table(res, 0.05),
        'coefficients90': coefficient_table(res, 0.10),
        'predictions95': prediction_table(res, sm.add_constant(at, has_constant='add'), 0.05),
        'centredConditionNumber': centred_condition([x[:, j] for j in range(x.shape[1])]),
    }


def coating():
    # Film thickness (um) on a spray-coating line against conveyor speed and
    # nozzle pressure; each row averages `readings` gauge readings, so its
    # variance is sigma^2 / readings: weighted least squares with w = readings.
    rng = np.random.default_rng(20260301)
    n = 40
    speed = np.round(rng.uniform(0.8, 2.4, n), 2)
    pressure = np.round(rng.uniform(2.0, 4.0, n), 2)
    readings = rng.integers(1, 9, n).astype(float)
    thickness = np.round(61.0 - 9.5 * speed + 4.2 * pressure + rng.normal(0, 1.8, n) / np.sqrt(readings), 3)
    x = sm.add_constant(np.column_stack([speed, pressure]))
    res = sm.WLS(thickness, x, weights=readings).fit()
    at = np.array([[1.0, 1.2, 3.1], [1.0, 2.0, 2.5]])
    return {
        'source': f'generated here: numpy default_rng(20260301), n = {n}',
        'data': {'thickness': floats(thickness), 'speed': floats(speed), 'pressure': floats(pressure), 'readings': floats(readings)},
        'newRows': {'speed': [1.2, 2.0], 'pressure': [3.1, 2.5]},
        'newRowWeights': [2.0, 0.5],
        'coefficients95': coefficient_table(res, 0.05),
        'predictions95': prediction_table(res, at, 0.05),
        'predictions95Weighted': prediction_table(res, at, 0.05, weights=np.array([2.0, 0.5])),
        'summary': {'columns': ['speed', 'pressure', 'thickness'], **summary_of([speed, pressure, thickness], readings)},
        'centredConditionNumber': centred_condition([speed, pressure]),
    }


def fatigue():
    # Crack length (mm) after a fixed cycle count on a fatigue rig, against
    # the load amplitude (kN): multiplicative scatter, so log(length) is the
    # natural model; a straight line in length competes with it.
    rng = np.random.default_rng(20260302)
    n = 30
    load = np.round(rng.uniform(10, 40, n), 1)
    length = np.round(np.exp(0.4 + 0.045 * load + rng.normal(0, 0.18, n)), 3)
    x = sm.add_constant(load)
    raw = sm.OLS(length, x).fit()
    logged = sm.OLS(np.log(length), x).fit()
    at_load = np.array([15.0, 30.0, 38.0])
    at = sm.add_constant(at_load, has_constant='add')
    alpha = 0.05
    raw_frame = prediction_table(raw, at, alpha)
    log_frame = prediction_table(logged, at, alpha)
    back = {key: floats(np.exp(log_frame[key])) for key in ['estimate', 'lower', 'upper', 'predictionLower', 'predictionUpper']}
    back['standardError'] = floats(np.exp(log_frame['estimate']) * np.array(log_frame['standardError']))

    # Akaike weights from AICc; both models have k = 2 coefficients + 1 for the error variance.
    k = 3
    jacobian = -float(np.log(length).sum())
    ll = {'line': float(raw.llf), 'log-line': float(logged.llf) + jacobian}
    aicc = {m: -2 * v + 2 * k + 2 * k * (k + 1) / (n - k - 1) for m, v in ll.items()}
    best = min(aicc.values())
    rel = {m: np.exp(-(v - best) / 2) for m, v in aicc.items()}
    total = sum(rel.values())
    w = {m: float(v / total) for m, v in rel.items()}

    df = n - 2
    mu = {'line': np.array(raw_frame['estimate']), 'log-line': np.array(log_frame['estimate'])}
    se = {'line': np.array(raw_frame['standardError']), 'log-line': np.array(log_frame['standardError'])}
    scale = float(raw.scale), float(logged.scale)
    se_new = {'line': np.sqrt(se['line'] ** 2 + scale[0]), 'log-line': np.sqrt(se['log-line'] ** 2 + scale[1])}
    g = {'line': lambda b: b, 'log-line': lambda b: np.log(b) if b > 0 else -np.inf}
    yhat = {'line': mu['line'], 'log-line': np.exp(mu['log-line'])}
    se_y = {'line': se['line'], 'log-line': np.exp(mu['log-line']) * se['log-line']}

    def mata(r, spread, target):
        f = lambda b: sum(w[m] * stats.t.cdf((g[m](b) - mu[m][r]) / spread[m][r], df) for m in w) - target
        return float(optimize.brentq(f, 1e-9, 1e3, xtol=1e-14, rtol=1e-15, maxiter=500))

    averaged = {'estimate': [], 'standardError': [], 'lower': [], 'upper': [], 'predictionLower': [], 'predictionUpper': []}
    for r in range(len(at_load)):
        ybar = sum(w[m] * yhat[m][r] for m in w)
        averaged['estimate'].append(float(ybar))
        averaged['standardError'].append(float(np.sqrt(sum(w[m] * (se_y[m][r] ** 2 + (yhat[m][r] - ybar) ** 2) for m in w))))
        averaged['lower'].append(mata(r, se, alpha / 2))
        averaged['upper'].append(mata(r, se, 1 - alpha / 2))
        averaged['predictionLower'].append(mata(r, se_new, alpha / 2))
        averaged['predictionUpper'].append(mata(r, se_new, 1 - alpha / 2))
    return {
        'source': f'generated here: numpy default_rng(20260302), n = {n}',
        'data': {'length': floats(length), 'load': floats(load)},
        'newRows': {'load': floats(at_load)},
        'line': {'coefficients95': coefficient_table(raw, alpha), 'predictions95': raw_frame, 'logLikelihood': ll['line']},
        'logLine': {
            'coefficients95': coefficient_table(logged, alpha),
            'logScalePredictions95': log_frame,
            'backTransformed95': back,
            'logLikelihood': ll['log-line'],
        },
        'aiccWeights': w,
        'averaged95': averaged,
    }


out = {
    'generatedWith': f'statsmodels {statsmodels.__version__}, scipy {scipy.__version__}, numpy {np.__version__}, Python {sys.version.split()[0]} (Debian)',
    'script': 'scripts/make-inference-reference.py',
    'longley': longley(),
    'coating': coating(),
    'fatigue': fatigue(),
    'centredConditionNumbers': {},
}
for name in ['pontius', 'norris']:
    d = json.load(open(os.path.join(NIST, name + '.json')))
    x = np.array(d['data']['x'], dtype=float)
    out['centredConditionNumbers'][name] = centred_condition([x ** p for p in range(1, d['polynomialDegree'] + 1)])
json.dump(out, sys.stdout, indent=1)
sys.stdout.write('\n')
