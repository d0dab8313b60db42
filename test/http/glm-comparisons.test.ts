// Generalised linear candidates through POST /v1/comparisons, checked against
// the R fits in test/reference/glm/glm-reference.json (R's glm and MASS, run
// by scripts/glm-reference.R; versions in the file) to the tolerances the
// core's own reference test states, plus the rules of the contract: Gaussian
// unchanged, mass and density never ranked together, refusals naming fields.
import t from 'tap';
import { buildTestApp } from '../helper.ts';
import { inlineAndPooled } from './limits/inline-and-pooled.ts';
import { REFERENCE, referenceCase, relativeError, worstRelativeError } from '../core/models/glm/reference-data.ts';

type Case = ReturnType<typeof referenceCase>;

function request(c: Case, name: string, extra: Record<string, unknown> = {}) {
  return {
    data: { columns: c.data },
    response: c.response,
    ...(c.trials ? { trials: c.trials } : {}),
    candidates: [{ name, terms: c.terms, family: c.family, link: c.link, ...(c.offset ? { offset: c.offset } : {}), ...extra }],
  };
}

t.test(`reference fits through HTTP (${REFERENCE.generatedWith})`, async (t) => {
  const { app } = await buildTestApp(t);
  for (const name of ['beetle-logit', 'beetle-cloglog', 'seams-poisson-offset', 'valves-negative-binomial', 'pumps-gamma-log', 'pumps-gamma-inverse']) {
    const c = referenceCase(name);
    const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: request(c, name) });
    t.equal(res.statusCode, 200, res.statusCode === 200 ? name : `${name}: ${res.body.slice(0, 400)}`);
    const body = res.json();
    const [m] = body.models;
    t.equal(m.family, c.family, `${name} family`);
    t.equal(m.link, c.link, `${name} link`);
    t.same(m.coefficients.map((x: { term: string }) => x.term), c.coefficients.map((x) => x.term), `${name}: same columns`);
    t.ok(worstRelativeError(m.coefficients.map((x: { estimate: number }) => x.estimate), c.coefficients.map((x) => x.estimate)) < 1e-9, `${name}: estimates to 1e-9`);
    t.ok(worstRelativeError(m.coefficients.map((x: { standardError: number }) => x.standardError), c.coefficients.map((x) => x.standardError)) < 1e-9, `${name}: standard errors to 1e-9`);
    t.ok(relativeError(m.logLikelihood, c.logLikelihood) < 1e-12, `${name}: log-likelihood ${m.logLikelihood} vs R ${c.logLikelihood}`);
    t.equal(m.parameters, c.parameters, `${name}: k`);
    t.ok(relativeError(m.aic, c.aic) < 1e-12, `${name}: AIC`);
    t.ok(relativeError(m.deviance, c.deviance) < 1e-10, `${name}: deviance`);
    t.ok(relativeError(m.nullDeviance, c.nullDeviance) < 1e-10, `${name}: null deviance`);
    t.ok(relativeError(m.pearsonChiSquare, c.pearsonChiSquare) < 1e-10, `${name}: Pearson chi-square`);
    t.ok(relativeError(m.devianceExplained, 1 - c.deviance / c.nullDeviance) < 1e-10, `${name}: deviance explained`);
    if (c.distributionParameter) {
      t.equal(m.distributionParameters[0].name, c.distributionParameter.name);
      t.ok(relativeError(m.distributionParameters[0].estimate, c.distributionParameter.estimate) < 1e-10, `${name}: ${c.distributionParameter.name}`);
      t.ok(relativeError(m.distributionParameters[0].standardError, c.distributionParameter.standardError) < 1e-9, `${name}: its standard error`);
    } else t.same(m.distributionParameters, []);
    t.equal(m.convergence.converged, true);
    t.equal(m.r2, null, 'no R² for a non-Gaussian family');
    t.ok(m.cautions.some((x: { code: string }) => x.code === 'r2_not_defined'), 'and a caution says why');
    t.type(body.conventions.glm.logLikelihood, 'string', 'the convention in words');
  }
});

t.test('family gaussian (identity) is least squares: the same answer as no family at all', async (t) => {
  const { app } = await buildTestApp(t);
  const c = referenceCase('pumps-gamma-log');
  const plain = { data: { columns: c.data }, response: c.response, candidates: [{ name: 'ls', terms: c.terms }] };
  const named = { ...plain, candidates: [{ name: 'ls', terms: c.terms, family: 'gaussian', link: 'identity' }] };
  const a = (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: plain })).json();
  const b = (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: named })).json();
  t.same(b.models, a.models, 'models identical, bit for bit');
  t.same(b.rankings, a.rankings);
  t.equal(a.models[0].family, undefined, 'no GLM fields on a least-squares model');
});

t.test('a Gaussian model with a log link is a GLM with R² and the reference numbers', async (t) => {
  const { app } = await buildTestApp(t);
  const c = referenceCase('pumps-gaussian-log');
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: request(c, 'g-log') });
  t.equal(res.statusCode, 200, res.body.slice(0, 400));
  const [m] = res.json().models;
  t.ok(relativeError(m.logLikelihood, c.logLikelihood) < 1e-12, 'log-likelihood');
  t.ok(relativeError(m.rss, c.deviance) < 1e-10, 'rss = deviance');
  t.ok(relativeError(m.r2, 1 - c.deviance / c.nullDeviance) < 1e-10, 'R² = 1 − RSS/TSS');
});

t.test('means fitted elsewhere score to the same log-likelihood as the fit here', async (t) => {
  const { app } = await buildTestApp(t);
  const c = referenceCase('seams-poisson-offset');
  // The means of R's fit: exp(Xβ + offset) from its coefficients (the factor gas coded as the design builder codes it).
  const fit = (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: request(c, 'here') })).json().models[0];
  const beta = new Map<string, number>(c.coefficients.map((x) => [x.term, x.estimate]));
  const gasLevels = fit.coefficients.map((x: { term: string }) => x.term).filter((l: string) => l.startsWith('gas='));
  const fitted = c.data.defects.map((_: unknown, i: number) => {
    let eta = beta.get('intercept')! + beta.get('current')! * (c.data.current[i] as number) + (c.data.logLength[i] as number);
    for (const l of gasLevels) if (`gas=${c.data.gas[i]}` === l) eta += beta.get(l)!;
    return Math.exp(eta);
  });
  const payload = {
    data: { columns: c.data }, response: c.response,
    candidates: [{ name: 'here', terms: c.terms, family: 'poisson', offset: 'logLength' }, { name: 'elsewhere', family: 'poisson', fitted, parameters: c.parameters }],
  };
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload });
  t.equal(res.statusCode, 200, res.body.slice(0, 400));
  const [here, elsewhere] = res.json().models;
  t.equal(elsewhere.source, 'fitted');
  t.ok(relativeError(elsewhere.logLikelihood, c.logLikelihood) < 1e-10, `${elsewhere.logLikelihood} vs R ${c.logLikelihood}`);
  t.ok(relativeError(elsewhere.deviance, here.deviance) < 1e-9, 'deviance at the same means');
  t.equal(elsewhere.link, null);
  t.equal(elsewhere.convergence, null);

  const short = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { ...payload, candidates: [payload.candidates[1], { ...payload.candidates[1], name: 'short', fitted: fitted.slice(1) }] } });
  t.equal(short.statusCode, 422);
  t.equal(short.json().errors[0].code, 'glm_fitted_count_mismatch');
  t.equal(short.json().errors[0].path, 'candidates/1/fitted');
});

t.test('a probability mass beside a density is refused, naming both candidates', async (t) => {
  const { app, store } = await buildTestApp(t);
  const c = referenceCase('beetle-logit');
  const payload = {
    data: { columns: c.data }, response: c.response, trials: 'exposed',
    candidates: [{ name: 'logit', terms: ['dose'], family: 'binomial' }, { name: 'straight-line', terms: ['dose'] }],
  };
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload });
  t.equal(res.statusCode, 422, res.body.slice(0, 400));
  const [e] = res.json().errors;
  t.equal(e.code, 'measures_mixed');
  t.match(e.message, /"logit"/);
  t.match(e.message, /"straight-line"/);
  t.equal((await store.list({ limit: 5 })).records.length, 0, 'nothing recorded');
});

t.test('refusals name the field: a link the family does not admit, separation, a text offset', async (t) => {
  const { app } = await buildTestApp(t);
  const c = referenceCase('seams-poisson-offset');
  const bad = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: request(c, 'p', { link: 'logit' }) });
  t.equal(bad.statusCode, 422);
  t.equal(bad.json().errors[0].code, 'glm_link_not_allowed');
  t.equal(bad.json().errors[0].path, 'candidates/0/link');

  const unknown = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: request(c, 'p', { family: 'weibull' }) });
  t.equal(unknown.statusCode, 400, 'an unknown family is a malformed request');

  const separated = {
    data: { columns: { x: [1, 2, 3, 4, 5, 6], y: [0, 0, 0, 1, 1, 1] } }, response: 'y',
    candidates: [{ name: 'sep', terms: ['x'], family: 'binomial' }],
  };
  const sep = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: separated });
  t.equal(sep.statusCode, 422, sep.body.slice(0, 300));
  t.equal(sep.json().errors[0].code, 'glm_separation');
  t.same(sep.json().errors[0].terms, ['intercept', 'x'], 'the direction along which the likelihood keeps rising');

  const text = { data: { columns: { x: [1, 2, 3, 4], e: ['a', 'b', 'c', 'd'], y: [1, 3, 2, 5] } }, response: 'y', candidates: [{ name: 'p', terms: ['x'], family: 'poisson', offset: 'e' }] };
  const off = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: text });
  t.equal(off.statusCode, 422, off.body.slice(0, 300));
  t.equal(off.json().errors[0].code, 'glm_column_not_numeric');
  t.equal(off.json().errors[0].path, 'candidates/0/offset');
});

t.test('a GLM comparison inline and on a worker of the pool: the same answer, and a replay reproduces it', async (t) => {
  const c = referenceCase('valves-negative-binomial');
  const payload = {
    data: { columns: c.data }, response: c.response,
    candidates: [
      { name: 'nb', terms: c.terms, family: 'negativeBinomial', offset: 'logValves' },
      { name: 'poisson', terms: c.terms, family: 'poisson', offset: 'logValves' },
    ],
  };
  const { b, pooled } = await inlineAndPooled(t, payload);
  const replay = await pooled.app.inject({ method: 'POST', url: `/v1/comparisons/${b.json().id}/replay` });
  t.equal(replay.statusCode, 200);
  t.equal(replay.json().identical, true, 'a replay in the pool reproduces the stored result');
});

t.test('options.overdispersion: QAIC and QAICc under ĉ from the most general model (Burnham & Anderson 2002, §2.5), by hand from R\'s numbers', async (t) => {
  const { app } = await buildTestApp(t);
  const c = referenceCase('seams-poisson-offset');
  const n = c.data.defects.length;
  const payload = (cHat: number | 'estimate') => ({
    data: { columns: c.data }, response: c.response,
    candidates: [{ name: 'full', terms: c.terms, family: 'poisson', offset: 'logLength' }, { name: 'current', terms: ['current'], family: 'poisson', offset: 'logLength' }],
    options: { overdispersion: { cHat } },
  });
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: payload('estimate') });
  t.equal(res.statusCode, 200, res.body.slice(0, 400));
  const body = res.json();
  // ĉ = Pearson χ² / (n − rank) of the candidate with the most parameters (rank = k for the Poisson).
  const cHat = c.pearsonChiSquare / (n - c.parameters);
  t.ok(relativeError(body.overdispersion.cHat, cHat) < 1e-10, `ĉ ${body.overdispersion.cHat} vs ${cHat}`);
  t.equal(body.overdispersion.source, 'full');
  t.equal(body.overdispersion.df, n - c.parameters);
  const k = c.parameters + 1; // k counts ĉ
  const qaic = (-2 * c.logLikelihood) / cHat + 2 * k;
  const full = body.models.find((m: { name: string }) => m.name === 'full');
  t.ok(relativeError(full.qaic, qaic) < 1e-10, `QAIC ${full.qaic} vs ${qaic}`);
  t.ok(relativeError(full.qaicc, qaic + (2 * k * (k + 1)) / (n - k - 1)) < 1e-10, 'QAICc');
  const ranking = body.rankings.qaic;
  t.equal(ranking.length, 2);
  t.ok(Math.abs(ranking.reduce((s: number, e: { weight: number }) => s + e.weight, 0) - 1) < 1e-12, 'weights sum to 1');
  t.ok(body.rankings.qaicc.every((e: { band: string | null }) => typeof e.band === 'string'), 'Δ worded by the Akaike bands');

  const given = (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: payload(1.8) })).json();
  t.same(given.overdispersion, { cHat: 1.8, source: 'given', df: null, belowOne: false });
  t.ok(relativeError(given.models[0].qaic, (-2 * c.logLikelihood) / 1.8 + 2 * k) < 1e-10);

  const plain = (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { ...payload(1), options: {} } })).json();
  t.equal(plain.rankings.qaic, undefined, 'no QAIC unless asked');
  t.equal(plain.models[0].qaic, undefined);

  const ls = { data: { columns: c.data }, response: c.response, candidates: [{ name: 'line', terms: ['current'] }], options: { overdispersion: { cHat: 'estimate' } } };
  const refused = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: ls });
  t.equal(refused.statusCode, 422);
  t.equal(refused.json().errors[0].code, 'overdispersion_no_model');
  t.equal(refused.json().errors[0].path, 'options/overdispersion/cHat');
  const zero = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: payload(0) });
  t.equal(zero.statusCode, 400, 'ĉ must be positive');
});

t.test('a request-level field at fault is named once, however many GLM candidates read it', async (t) => {
  const { app } = await buildTestApp(t);
  const c = referenceCase('seams-poisson-offset');
  const payload = {
    data: { columns: { ...c.data, w: c.data.defects.map(() => 2) } }, response: c.response, weights: 'w',
    candidates: [{ name: 'a', terms: ['current'], family: 'poisson' }, { name: 'b', terms: c.terms, family: 'poisson' }],
  };
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload });
  t.equal(res.statusCode, 422);
  t.same(res.json().errors.map((e: { code: string; path: string }) => [e.code, e.path]), [['glm_weights_not_supported', 'weights']]);
});
