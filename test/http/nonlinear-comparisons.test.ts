// Nonlinear candidates through POST /v1/comparisons end to end: a sample of the
// NIST StRD nonlinear problems (certified values, test/reference/nist-nls/),
// a mechanistic model ranked beside a polynomial on one likelihood scale
// against R's nls() and lm() (test/reference/nonlinear/kiln-drying-r.json,
// made by scripts/make-nonlinear-wire-reference.R), predictions and their
// average across both kinds, and the refusals: each names its field, none
// writes a record.
import { readFileSync } from 'node:fs';
import t, { type Test } from 'tap';
import { buildTestApp } from '../helper.ts';
import { loadNls, nlsExpression, type StartKey } from '../reference/nist-nls/strd-nls.ts';
import { lre } from '../reference/nist/strd.ts';

// A nonlinear fit is priced at its iteration cap, which puts even a small one
// above COMPUTE_INLINE_WORK (price-candidate.ts); these tests check numbers,
// not where they are computed (limits/nonlinear-inline-and-pool does that), so
// they compute on the main thread rather than start a worker pool per app.
const ON_MAIN_THREAD = { computeInlineWork: 1e12 };

const r = JSON.parse(readFileSync(new URL('../reference/nonlinear/kiln-drying-r.json', import.meta.url), 'utf8'));
const kiln = { hours: r.data.hours as number[], moisture: r.data.moisture as number[], w: r.data.w as number[] };
const equilibrium = { name: 'equilibrium', expression: 'eq + (m0 - eq)*exp(-k*hours)', start: { eq: 5, m0: 40, k: 0.03 } };
const decay = { name: 'decay', expression: 'm0*exp(-k*hours)', start: { m0: 40, k: 0.03 } };
const quadratic = { name: 'quadratic', terms: ['hours', { kind: 'power', of: 'hours', degree: 2 }] };

/** Relative agreement of two numbers in digits (15 when equal). */
const digits = (a: number, b: number) => (a === b ? 15 : -Math.log10(Math.abs(a - b) / Math.abs(b)));

function nistRequest(file: string, start: StartKey | 'both') {
  const ds = loadNls(file);
  const vector = (key: StartKey) => Object.fromEntries(ds.parameterNames.map((name, j) => [name, ds.startValues[key][j]]));
  const candidate = {
    name: ds.name, expression: nlsExpression(ds),
    ...(start === 'both' ? { starts: [vector('start1'), vector('start2')] } : { start: vector(start) }),
    ...(ds.response === 'log(y)' ? { response: { fn: 'log' } } : {}),
  };
  return { ds, payload: { data: { columns: ds.data }, response: 'y', candidates: [candidate] } };
}

// Lower (Misra1a), average (Nelson: a model of log y, two predictors) and higher
// difficulty (MGH09, Thurber, BoxBOD), and MGH10 from both NIST starts at once.
for (const [file, start] of [['misra1a', 'start1'], ['nelson', 'start2'], ['mgh09', 'start1'], ['thurber', 'start2'], ['boxbod', 'start1'], ['mgh10', 'both']] as const) {
  t.test(`NIST StRD ${file} (${start}) through POST /v1/comparisons`, async (t) => {
    const { app } = await buildTestApp(t, ON_MAIN_THREAD);
    const { ds, payload } = nistRequest(file, start);
    const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload });
    t.equal(res.statusCode, 200, res.statusCode === 200 ? 'answered' : res.body.slice(0, 400));
    const [m] = res.json().models;
    const cert = ds.certified;
    t.equal(m.parameters, cert.parameters.length + 1, 'k = parameters + 1 (the error variance)');
    t.equal(m.observations, ds.observations);
    t.equal(m.expression, nlsExpression(ds));
    t.same(m.coefficients.map((c: { term: string }) => c.term), ds.parameterNames, 'term = parameter name');
    cert.parameters.forEach((c, j) => {
      t.ok(lre(m.coefficients[j].estimate, c.estimate) >= 6, `${c.name} estimate to 6 digits (NIST certified)`);
      t.ok(lre(m.coefficients[j].standardError, c.standardDeviation) >= 4, `${c.name} standard deviation to 4 digits (NIST certified)`);
      const { estimate, standardError: se, tStatistic, lower, upper } = m.coefficients[j];
      t.ok(Math.abs(tStatistic - estimate / se) <= 1e-12 * Math.abs(tStatistic), 't = estimate / standard error');
      t.ok(lower < estimate && estimate < upper, 'the interval holds the estimate');
    });
    t.ok(lre(m.rss, cert.residualSumOfSquares) >= 6, 'RSS to 6 digits (NIST certified)');
    // The convention (README): −n/2 (ln 2π + ln(RSS/n) + 1), plus −Σ ln y for a model of log y; from NIST's certified RSS.
    const n = ds.observations;
    const rss = Number(cert.residualSumOfSquares);
    const jacobian = ds.response === 'log(y)' ? -ds.data.y.reduce((s, y) => s + Math.log(y), 0) : 0;
    const expected = -n / 2 * (Math.log(2 * Math.PI) + Math.log(rss / n) + 1) + jacobian;
    t.ok(Math.abs(m.logLikelihood - expected) <= 1e-6 * Math.abs(expected), `logLikelihood ${m.logLikelihood} on the response's scale as sent`);
    t.equal(m.aic, -2 * m.logLikelihood + 2 * m.parameters);
    t.equal(m.convergence.converged, true);
    t.ok(m.convergence.iterations > 0);
    t.type(m.convergence.rule, 'string');
    t.equal(m.convergence.starts.length, start === 'both' ? 2 : 1, 'every start vector\'s outcome');
    t.ok(m.cautions.some((c: { code: string }) => c.code === 'nonlinear_linearised'));
  });
}

t.test('a mechanistic model ranks beside a polynomial on one scale (R: nls and lm)', async (t) => {
  const { app } = await buildTestApp(t, ON_MAIN_THREAD);
  const res = await app.inject({
    method: 'POST', url: '/v1/comparisons',
    payload: {
      data: { columns: { hours: kiln.hours, moisture: kiln.moisture } }, response: 'moisture',
      candidates: [equilibrium, decay, quadratic, { ...equilibrium, name: 'log-equilibrium', expression: 'log(eq + (m0 - eq)*exp(-k*hours))', response: { fn: 'log' } }],
    },
  });
  t.equal(res.statusCode, 200, res.statusCode === 200 ? 'answered' : res.body.slice(0, 400));
  const body = res.json();
  const byName = Object.fromEntries(body.models.map((m: { name: string }) => [m.name, m]));
  for (const [name, ref] of [['equilibrium', r.equilibrium], ['decay', r.decay], ['quadratic', r.quadratic]] as const) {
    const m = byName[name];
    t.ok(digits(m.logLikelihood, ref.logLik) >= 9, `${name}: logLik ${m.logLikelihood} vs R ${ref.logLik}`);
    t.equal(m.parameters, ref.df, `${name}: k as R counts it`);
    t.ok(digits(m.aic, ref.aic) >= 9, `${name}: AIC`);
    t.ok(digits(m.bic, ref.bic) >= 9, `${name}: BIC`);
  }
  for (const [j, name] of ['eq', 'm0', 'k'].entries()) {
    const c = byName.equilibrium.coefficients[j];
    t.equal(c.term, name);
    t.ok(digits(c.estimate, r.equilibrium.coefficients[name]) >= 6, `${name} as R's nls`);
    t.ok(digits(c.standardError, r.equilibrium.standardErrors[name]) >= 5, `${name} standard error as R's nls`);
  }
  // R's logLik of the log model is on the log scale; with the Jacobian −Σ ln y it is on the scale of moisture.
  const logModel = byName['log-equilibrium'];
  t.ok(digits(logModel.logLikelihood, r.logEquilibrium.logLik + r.logEquilibrium.jacobian) >= 9, 'log model: R\'s logLik plus the Jacobian');
  t.ok(digits(logModel.responseTransform.jacobian, r.logEquilibrium.jacobian) >= 12);
  t.equal(body.rankings.aicc[0].name, 'equilibrium', 'the mechanistic model ranks first');
  t.equal(body.verdict.chosen, 'equilibrium');
  t.equal(byName.equilibrium.intercept, null, 'an expression has no intercept term of its own');
  t.equal(byName.quadratic.expression, undefined, 'a linear candidate carries no expression');
  t.ok(byName.equilibrium.press > 0, 'linearised leave-one-out');
  t.ok(byName.equilibrium.cautions.some((c: { code: string }) => c.code === 'loo_linearised'), 'and says it is linearised');
  t.equal(byName.equilibrium.diagnostics.available, true);
  t.equal(byName.equilibrium.diagnostics.multicollinearity.passed, null, 'no design to inflate');
});

t.test('weights enter a nonlinear likelihood as a linear one\'s (R: nls and lm with weights)', async (t) => {
  const { app } = await buildTestApp(t, ON_MAIN_THREAD);
  const res = await app.inject({
    method: 'POST', url: '/v1/comparisons',
    payload: { data: { columns: kiln }, response: 'moisture', weights: 'w', candidates: [equilibrium, quadratic] },
  });
  t.equal(res.statusCode, 200, res.statusCode === 200 ? 'answered' : res.body.slice(0, 400));
  const [eq, quad] = res.json().models;
  t.ok(digits(eq.logLikelihood, r.weightedEquilibrium.logLik) >= 9, `weighted nls logLik ${eq.logLikelihood} vs R ${r.weightedEquilibrium.logLik}`);
  t.ok(digits(quad.logLikelihood, r.weightedQuadratic.logLik) >= 9, 'weighted lm logLik');
  t.ok(digits(eq.coefficients[2].standardError, r.weightedEquilibrium.standardErrors.k) >= 5);
});

t.test('a nonlinear model predicts with delta-method standard errors, averaged with a polynomial', async (t) => {
  const { app } = await buildTestApp(t, ON_MAIN_THREAD);
  const res = await app.inject({
    method: 'POST', url: '/v1/comparisons',
    payload: {
      data: { columns: { hours: kiln.hours, moisture: kiln.moisture } }, response: 'moisture',
      candidates: [equilibrium, quadratic], options: { predict: { columns: { hours: r.equilibrium.predictAt } } },
    },
  });
  t.equal(res.statusCode, 200, res.statusCode === 200 ? 'answered' : res.body.slice(0, 400));
  const body = res.json();
  const eq = body.models[0];
  eq.predictions.forEach((p: { estimate: number; standardError: number; lower: number; upper: number; predictionLower: number }, i: number) => {
    t.ok(digits(p.estimate, r.equilibrium.predictions[i]) >= 6, `prediction ${i} as R's predict.nls`);
    t.ok(digits(p.standardError, r.equilibrium.predictionStandardErrors[i]) >= 5, `standard error ${i}: R's deriv() gradient and vcov()`);
    t.ok(p.lower < p.estimate && p.estimate < p.upper && p.predictionLower < p.lower, 'intervals nest');
  });
  t.equal(eq.predictionScale.backTransform, 'none');
  t.equal(body.averaged.predictions.length, 3, 'averaged across the linear and the nonlinear model');
  const w = Object.fromEntries(body.rankings.aicc.map((e: { name: string; weight: number }) => [e.name, e.weight]));
  const mixed = w.equilibrium * eq.predictions[0].estimate + w.quadratic * body.models[1].predictions[0].estimate;
  t.ok(digits(body.averaged.predictions[0].estimate, mixed) >= 12, 'the average is the Akaike-weighted mean of the two');
});

async function refused(t: Test, payload: Record<string, unknown>, status: number) {
  const { app } = await buildTestApp(t, ON_MAIN_THREAD);
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload });
  t.equal(res.statusCode, status, res.statusCode === status ? 'refused' : res.body.slice(0, 400));
  t.match(res.headers['content-type'], /application\/problem\+json/);
  const list = await app.inject({ method: 'GET', url: '/v1/comparisons' });
  t.equal(list.json().records.length, 0, 'nothing recorded');
  return res.json();
}

const kilnRequest = (candidate: object, extra: object = {}) => ({
  data: { columns: { hours: kiln.hours, moisture: kiln.moisture, kiln: kiln.hours.map((_, i) => (i % 2 ? 'east' : 'west')) } },
  response: 'moisture', candidates: [candidate, quadratic], ...extra,
});

t.test('an expression that cannot be read is a 400 naming the offset and what was expected', async (t) => {
  const body = await refused(t, kilnRequest({ ...equilibrium, expression: 'eq + (m0 - eq*exp(-k*hours)' }), 400);
  const [e] = body.errors;
  t.equal(e.path, 'candidates/0/expression');
  t.match(e.message, /offset 27: expected .*'\)'.*found the end/);
  const fn = await refused(t, kilnRequest({ ...equilibrium, expression: 'eq + (m0 - eq)*expo(-k*hours)' }), 400);
  t.equal(fn.errors[0].path, 'candidates/0/expression');
  t.match(fn.errors[0].message, /expo/);
});

t.test('what needs the data is a 422 naming the candidate', async (t) => {
  const column = await refused(t, kilnRequest({ ...equilibrium, expression: 'eq + (m0 - eq)*exp(-k*hour)' }), 422);
  t.match(column.errors[0], { path: 'candidates/0/expression', code: 'expression_unknown_column', offset: 22, column: 'hour' });
  const text = await refused(t, kilnRequest({ ...equilibrium, expression: 'eq + (m0 - eq)*exp(-k*kiln)' }), 422);
  t.match(text.errors[0], { path: 'candidates/0/expression', code: 'expression_column_not_numeric', column: 'kiln' });
  const deficient = await refused(t, kilnRequest({ name: 'entangled', expression: 'a*b*exp(-k*hours)', start: { a: 6, b: 7, k: 0.03 } }), 422);
  t.match(deficient.errors[0], { path: 'candidates/0', code: 'nonlinear_rank_deficient', candidate: 'entangled' });
  const nonFinite = await refused(t, kilnRequest({ name: 'sqrt-of-negative', expression: 'a*sqrt(c - hours)', start: { a: 1, c: 10 } }), 422);
  t.match(nonFinite.errors[0], { path: 'candidates/0/start', code: 'nonlinear_start_not_finite', candidate: 'sqrt-of-negative' });
  const both = await refused(t, kilnRequest({ ...equilibrium, starts: [equilibrium.start] }), 422);
  t.match(both.errors[0], { path: 'candidates/0', code: 'start_missing' });
  const bound = await refused(t, kilnRequest({ ...equilibrium, bounds: { k: [0.05, null] } }), 422);
  t.match(bound.errors[0], { path: 'candidates/0/start/k', code: 'start_outside_bounds' });
  const unused = await refused(t, kilnRequest({ ...decay, start: { ...decay.start, eq: 5 } }), 422);
  t.match(unused.errors[0], { path: 'candidates/0/start/eq', code: 'parameter_unused' });
  // A parameter named like a function: the name is the fault (422 at start/exp), not the syntax it breaks (400).
  const named = await refused(t, kilnRequest({ name: 'named-exp', expression: 'exp*hours', start: { exp: 1 } }), 422);
  t.match(named.errors, [{ path: 'candidates/0/start/exp', code: 'parameter_name_invalid', parameter: 'exp' }]);
  t.match(named.errors[0].message, /function or constant/);
  const namedInStarts = await refused(t, kilnRequest({ name: 'named-pi', expression: 'pi*hours + b', starts: [{ pi: 1, b: 0 }] }), 422);
  t.match(namedInStarts.errors[0], { path: 'candidates/0/starts/0/pi', code: 'parameter_name_invalid' });
});

t.test('a fit that does not converge, or runs out of its domain, is a 422 naming the candidate, never ranked', async (t) => {
  const x = Array.from({ length: 20 }, (_, i) => 1 + i / 2);
  // Deterministic scatter of our own making about zero, and a line through the origin.
  const scatter = x.map((_, i) => 0.01 * Math.sin(7 * i));
  const line = x.map((v, i) => 5 * v + scatter[i]);
  // The least-squares point of sqrt(b1)*x for data about zero is b1 = 0, where sqrt is not smooth: no certified minimum.
  const kink = await refused(t, { data: { columns: { x, y: scatter } }, response: 'y', candidates: [{ name: 'kink', expression: 'sqrt(b1)*x', start: { b1: 1 } }] }, 422);
  t.match(kink.errors[0], { path: 'candidates/0', code: 'nonlinear_not_converged', reason: 'no minimum', candidate: 'kink' });
  t.match(kink.errors[0].message, /"kink".*it is not ranked/);
  // The slope 5 lies beyond log(1 - b1)'s domain (b1 < 1): the fit cannot step there.
  const edge = await refused(t, { data: { columns: { x, y: line } }, response: 'y', candidates: [{ name: 'edge', expression: 'b1*x + 0*log(1 - b1)', start: { b1: 0 } }] }, 422);
  t.match(edge.errors[0], { path: 'candidates/0', code: 'nonlinear_non_finite', candidate: 'edge' });
});

t.test('a nonlinear candidate needs rows: a summary is refused, and so is a request without data', async (t) => {
  const { app } = await buildTestApp(t, ON_MAIN_THREAD);
  const csv = ['hours,moisture', ...kiln.hours.map((h, i) => `${h},${kiln.moisture[i]}`)].join('\n');
  const folded = await app.inject({ method: 'POST', url: '/v1/summaries?columns=hours,moisture', headers: { 'content-type': 'text/csv' }, payload: csv });
  t.equal(folded.statusCode, 200, folded.body.slice(0, 200));
  const body = await refused(t, { data: { summary: folded.json().summary }, response: 'moisture', candidates: [equilibrium, quadratic] }, 422);
  t.match(body.errors[0], { path: 'candidates/0/expression', code: 'summary_rows_needed' });
  const none = await refused(t, { candidates: [equilibrium, { name: 'stated', logLikelihood: -40, parameters: 3, observations: 40 }] }, 422);
  t.match(none.errors[0], { path: 'candidates/0', code: 'data_required' });
});

t.test('beside linear, fitted-elsewhere and generalised linear candidates on one measure; a probability mass is refused', async (t) => {
  const { app } = await buildTestApp(t, ON_MAIN_THREAD);
  const columns = { hours: kiln.hours, moisture: kiln.moisture };
  const gammaGlm = { name: 'gamma-log', terms: ['hours'], family: 'gamma', link: 'log' };
  const res = await app.inject({
    method: 'POST', url: '/v1/comparisons',
    payload: { data: { columns }, response: 'moisture', candidates: [equilibrium, quadratic, gammaGlm, { name: 'kiln-log', rss: 120, parameters: 3, observations: kiln.hours.length }] },
  });
  t.equal(res.statusCode, 200, res.statusCode === 200 ? 'answered' : res.body.slice(0, 400));
  const body = res.json();
  t.same(body.rankings.aicc.map((e: { name: string }) => e.name).sort(), ['equilibrium', 'gamma-log', 'kiln-log', 'quadratic'], 'all four kinds ranked together');
  for (const m of body.models) t.equal(m.aic, -2 * m.logLikelihood + 2 * m.parameters, `${m.name}: one AIC formula`);
  // Counts would be a probability mass: not on the scale of a density, so not ranked beside it.
  const counts = kiln.moisture.map((v) => Math.round(v));
  const mixed = await app.inject({
    method: 'POST', url: '/v1/comparisons',
    payload: { data: { columns: { ...columns, counts } }, response: 'counts', candidates: [{ ...equilibrium, start: { eq: 5, m0: 40, k: 0.03 } }, { name: 'poisson', terms: ['hours'], family: 'poisson' }] },
  });
  t.equal(mixed.statusCode, 422, mixed.body.slice(0, 300));
  t.match(mixed.json().errors[0].message, /equilibrium/);
  t.match(mixed.json().errors[0].message, /poisson/);
});
