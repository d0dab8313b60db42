// Life distributions and censored observations through POST /v1/comparisons:
// a sample of the lifetime core's reference fits (test/reference/lifetime,
// made by scripts/lifetime-reference.R and .py) reproduced through HTTP at
// their stated tolerances, the refusals of censored data that cannot be
// scored, and a Weibull beside a lognormal on censored data end to end.
import t from 'tap';
import { buildTestApp } from '../helper.ts';
import { bearings, readReference, relativeError, solderJoints, SOLDER_TERMS } from '../core/models/lifetime/fixtures.ts';

const survreg = readReference('survreg-aft.json');
const scipyBearings = readReference('bearings-scipy.json');
const solder = solderJoints();

type Model = {
  name: string; logLikelihood: number; parameters: number; source: string; distribution: string;
  coefficients: { term: string; estimate: number; standardError: number; tStatistic: number; lower: number; upper: number }[];
  distributionParameters: { name: string; estimate: number; standardError: number | null }[];
  percentiles: { probability: number; estimate: number; lower: number; upper: number }[] | null;
  convergence: { converged: boolean; iterations: number };
  censoring: Record<string, number>;
};

function solderRequest(extra: Record<string, unknown> = {}) {
  return {
    data: { columns: solder },
    response: 'cycles',
    censoring: { status: 'status', upper: 'upper' },
    ...extra,
  };
}

async function post(t: Parameters<typeof buildTestApp>[0], payload: unknown) {
  const { app } = await buildTestApp(t);
  return app.inject({ method: 'POST', url: '/v1/comparisons', payload: payload as object });
}

t.test('accelerated-life fits with right, left and interval censoring match survreg through HTTP', async (t) => {
  // survreg: relative log-likelihood change 1e-13, so its log-likelihood is
  // the maximum to rounding (1e-10 relative) and its estimates within ~1e-7
  // (1e-6 relative), the tolerances of test/core/models/lifetime/survreg.test.ts.
  const families = ['weibull', 'lognormal', 'loglogistic', 'exponential', 'normal'];
  const res = await post(t, solderRequest({ candidates: families.map((d) => ({ name: d, distribution: d, terms: SOLDER_TERMS })) }));
  t.equal(res.statusCode, 200, res.body.slice(0, 600));
  const models: Model[] = res.json().models;
  for (const d of families) {
    const m = models.find((x) => x.name === d)!;
    const ref = survreg.mixed[d];
    t.equal(m.source, 'lifetime');
    t.equal(m.distribution, d);
    t.ok(relativeError(m.logLikelihood, ref.logLikelihood) < 1e-10, `${d}: logLik ${m.logLikelihood} vs survreg ${ref.logLikelihood}`);
    t.same(m.coefficients.map((c) => c.term), survreg.terms, `${d}: terms in survreg's order`);
    m.coefficients.forEach((c, k) => {
      t.ok(relativeError(c.estimate, ref.coefficients[k]) < 1e-6, `${d} ${c.term} ${c.estimate} vs ${ref.coefficients[k]}`);
      t.ok(relativeError(c.standardError, ref.standardErrors[k]) < 1e-6, `${d} se(${c.term})`);
      t.ok(Math.abs(c.tStatistic - c.estimate / c.standardError) < 1e-12 * Math.abs(c.tStatistic) + 1e-300, 'Wald z');
    });
    const free = d !== 'exponential';
    t.equal(m.parameters, survreg.terms.length + (free ? 1 : 0), `${d}: k = coefficients${free ? ' + scale' : ''}`);
    if (d === 'weibull') t.ok(relativeError(m.distributionParameters[0].estimate, 1 / ref.scale) < 1e-6, 'Weibull shape = 1/σ');
    if (d === 'lognormal') t.ok(relativeError(m.distributionParameters[0].estimate, ref.scale) < 1e-6, 'sdlog = σ');
    t.equal(m.convergence.converged, true);
  }
  const counts = models[0].censoring;
  t.equal(counts.exact + counts.right + counts.left + counts.interval, 90, 'every board is used: null upper values off interval rows drop nothing');
  t.ok(counts.left > 0 && counts.interval > 0 && counts.right > 0, 'all kinds of censoring present');
});

t.test('right-censored Weibull matches survreg through HTTP', async (t) => {
  const res = await post(t, {
    data: { columns: solder }, response: 'rightOnlyCycles', censoring: { status: 'rightOnlyStatus' },
    candidates: [{ name: 'w', distribution: 'weibull', terms: SOLDER_TERMS }],
  });
  t.equal(res.statusCode, 200, res.body.slice(0, 600));
  const m: Model = res.json().models[0];
  t.ok(relativeError(m.logLikelihood, survreg.right.weibull.logLikelihood) < 1e-10, `logLik ${m.logLikelihood}`);
});

t.test('every distribution on the uncensored bearing endurances matches scipy, percentiles included', async (t) => {
  // bearings-scipy.json: estimates from the score equations (brentq to 1e-15);
  // test/core/models/lifetime/bearings.test.ts holds them to 1e-12 (logLik) and 1e-9.
  const names = Object.keys(scipyBearings.fits);
  const probabilities = [0.01, 0.1, 0.5, 0.9];
  const res = await post(t, {
    data: { columns: { millions: bearings() } }, response: 'millions',
    candidates: names.map((d) => ({ name: d, distribution: d })),
    options: { percentiles: probabilities, intervalLevel: 0.9 },
  });
  t.equal(res.statusCode, 200, res.body.slice(0, 600));
  const body = res.json();
  for (const m of body.models as Model[]) {
    const ref = scipyBearings.fits[m.name];
    t.ok(relativeError(m.logLikelihood, ref.logLikelihood) < 1e-12, `${m.name}: logLik ${m.logLikelihood} vs scipy ${ref.logLikelihood}`);
    for (const p of m.distributionParameters) {
      if (p.name in ref) t.ok(relativeError(p.estimate, ref[p.name]) < 1e-9, `${m.name} ${p.name} ${p.estimate} vs ${ref[p.name]}`);
    }
    t.same(m.percentiles!.map((q) => q.probability), probabilities);
    for (const q of m.percentiles!) {
      const want = ref.percentiles?.[String(q.probability)];
      if (want !== undefined) t.ok(relativeError(q.estimate, want) < 1e-9, `${m.name} t_${q.probability} ${q.estimate} vs ${want}`);
      t.ok(q.lower < q.estimate && q.estimate < q.upper, `${m.name} t_${q.probability} inside its interval`);
    }
  }
  t.equal(body.conventions.intervalLevel, 0.9);
  t.match(body.conventions.lifetime.logTimeAlternative, /logLikelihoodLogTime/);
});

t.test('a Weibull beside a lognormal on censored data: ranked, recorded, cautioned', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({
    method: 'POST', url: '/v1/comparisons',
    payload: solderRequest({ candidates: [
      { name: 'weibull-arrhenius', distribution: 'weibull', terms: SOLDER_TERMS },
      { name: 'lognormal-arrhenius', distribution: 'lognormal', terms: SOLDER_TERMS },
    ] }),
  });
  t.equal(res.statusCode, 200, res.body.slice(0, 600));
  const body = res.json();
  const w = body.models[0];
  const l = body.models[1];
  const best = w.aic < l.aic ? w.name : l.name;
  t.equal(body.rankings.aic[0].name, best, 'ranked by AIC from the time-scale likelihood');
  t.ok(Math.abs(w.aic - (-2 * w.logLikelihood + 2 * w.parameters)) < 1e-9, 'AIC = −2ℓ + 2k');
  t.equal(w.rss, null, 'no RSS for a life model');
  t.equal(w.percentiles, null, 'with terms a percentile depends on the row');
  t.ok(w.logLikelihoodLogTime > w.logLikelihood, 'the log-time likelihood gains Σ ln t over exact failures');
  t.same(body.rankings.loo.map((e: { value: null }) => e.value), [null, null], 'no leave-one-out for censored lives');
  t.ok(body.cautions.some((c: { code: string }) => c.code === 'life_model_review'));
  t.match(body.conventions.lifetime.inference, /Wald z/);
  const stored = await app.inject({ method: 'GET', url: `/v1/comparisons/${body.id}` });
  t.equal(stored.statusCode, 200);
  t.same(stored.json().result.models, body.models, 'the record holds the life models');
  const replay = await app.inject({ method: 'POST', url: `/v1/comparisons/${body.id}/replay` });
  t.equal(replay.statusCode, 200, replay.body.slice(0, 300));
  t.equal(replay.json().identical, true, 'a replay refits the life models to the last digit');
  for (const picture of ['chart.svg', 'report']) {
    const drawn = await app.inject({ method: 'GET', url: `/v1/comparisons/${body.id}/${picture}` });
    t.equal(drawn.statusCode, 200, `${picture} of a life comparison: ${drawn.body.slice(0, 200)}`);
    t.match(drawn.body, /weibull-arrhenius/);
  }
});

t.test('censored data are refused where they cannot be scored, naming the field', async (t) => {
  const { app } = await buildTestApp(t);
  const send = (payload: object) => app.inject({ method: 'POST', url: '/v1/comparisons', payload });
  const weibull = { name: 'w', distribution: 'weibull' };
  const cases: [string, object, number, string, string][] = [
    ['least squares on censored rows', solderRequest({ candidates: [weibull, { name: 'ls', terms: ['load'] }] }), 422, 'candidates/1', 'censored_response_refused'],
    ['residuals on censored rows', solderRequest({ candidates: [weibull, { name: 'r', residuals: solder.cycles.map(() => 0), parameters: 2 }] }), 422, 'candidates/1', 'censored_response_refused'],
    ['an unknown status', { data: { columns: { t: [5, 6, 7], s: ['exact', 'failed', 'right'] } }, response: 't', censoring: { status: 's' }, candidates: [weibull] }, 422, 'censoring/status', 'censoring_status_unknown'],
    ['an unknown status column', { data: { columns: { t: [5, 6, 7] } }, response: 't', censoring: { status: 'state' }, candidates: [weibull] }, 422, 'censoring/status', 'unknown_column'],
    ['upper not above the response', { data: { columns: { t: [5, 6, 7], s: ['exact', 'interval', 'right'], u: [null, 6, null] } }, response: 't', censoring: { status: 's', upper: 'u' }, candidates: [weibull] }, 422, 'censoring/upper', 'censoring_upper_not_above'],
    ['an interval without an upper column', { data: { columns: { t: [5, 6, 7], s: ['exact', 'interval', 'right'] } }, response: 't', censoring: { status: 's' }, candidates: [weibull] }, 422, 'censoring', 'censoring_upper_missing'],
    ['a zero time for a positive distribution', { data: { columns: { t: [0, 6, 7], s: ['exact', 'exact', 'right'] } }, response: 't', censoring: { status: 's' }, candidates: [weibull] }, 422, 'candidates/0/distribution', 'lifetime_time_not_positive'],
    ['no failures', { data: { columns: { t: [5, 6, 7], s: ['right', 'right', 'right'] } }, response: 't', censoring: { status: 's' }, candidates: [weibull] }, 422, 'candidates/0', 'lifetime_no_failures'],
    ['weights with a life model', { data: { columns: { t: [5, 6, 7, 9], w: [1, 2, 1, 1] } }, response: 't', weights: 'w', candidates: [weibull] }, 422, 'weights', 'lifetime_weights_not_supported'],
    ['a percentile outside (0, 1)', { data: { columns: { t: [5, 6, 7, 9] } }, response: 't', candidates: [weibull], options: { percentiles: [1] } }, 400, 'options/percentiles/0', ''],
    ['an unknown status value in censoring', { data: { columns: { t: [5, 6, 7] } }, response: 't', censoring: { status: 't', lower: 'x' }, candidates: [weibull] }, 400, 'censoring', ''],
  ];
  for (const [what, payload, status, path, code] of cases) {
    const res = await send(payload);
    t.equal(res.statusCode, status, `${what}: ${res.body.slice(0, 400)}`);
    t.match(res.headers['content-type'], /application\/problem\+json/);
    const errors: { path: string; code?: string; message: string }[] = res.json().errors ?? [];
    t.ok(errors.some((e) => e.path.startsWith(path) && (code === '' || e.code === code)), `${what}: ${JSON.stringify(errors).slice(0, 600)}`);
  }
  const noFailures = await send({ data: { columns: { t: [5, 6, 7], s: ['right', 'right', 'right'] } }, response: 't', censoring: { status: 's' }, candidates: [weibull] });
  t.same(noFailures.json().errors[0].notEstimable, ['scale', 'shape'], 'names the parameters that cannot be estimated');
  const records = await app.inject({ method: 'GET', url: '/v1/comparisons' });
  t.equal(records.statusCode, 200);
  t.equal(records.json().records.length, 0, 'nothing was recorded');
});

t.test('life models and censoring need rows, not a summary', async (t) => {
  const summary = { rows: 10, columns: ['x', 'y'], means: [1, 2], centredCrossProducts: [[2, 1], [1, 3]] };
  const life = await post(t, { data: { summary }, response: 'y', candidates: [{ name: 'w', distribution: 'weibull' }] });
  t.equal(life.statusCode, 422, life.body.slice(0, 300));
  t.equal(life.json().errors[0].path, 'candidates/0/distribution');
  const censored = await post(t, { data: { summary }, response: 'y', censoring: { status: 's' }, candidates: [{ name: 'ls', terms: ['x'] }] });
  t.equal(censored.statusCode, 422, censored.body.slice(0, 300));
  t.equal(censored.json().errors[0].path, 'censoring');
});

t.test('an unknown distribution is refused at its field, with the known ones', async (t) => {
  const res = await post(t, { data: { columns: { t: [5, 6, 7] } }, response: 't', candidates: [{ name: 'x', distribution: 'frechet' }] });
  t.equal(res.statusCode, 400);
  t.ok(res.json().errors.some((e: { path: string; message: string }) => e.path === 'candidates/0/distribution' && /"weibull"/.test(e.message)), res.body.slice(0, 600));
});

t.test('a life comparison gives the same answer inline and on a worker of the pool', async (t) => {
  const payload = solderRequest({ candidates: [
    { name: 'weibull', distribution: 'weibull', terms: SOLDER_TERMS },
    { name: 'gamma', distribution: 'gamma' },
  ], options: { percentiles: [0.1] } });
  const inline = await buildTestApp(t, { computeInlineWork: 1e12 });
  const pooled = await buildTestApp(t, { computeInlineWork: 0 });
  const a = await inline.app.inject({ method: 'POST', url: '/v1/comparisons', payload });
  const b = await pooled.app.inject({ method: 'POST', url: '/v1/comparisons', payload });
  t.equal(a.statusCode, 200, a.body.slice(0, 300));
  t.equal(b.statusCode, 200, b.body.slice(0, 300));
  const strip = (r: Record<string, unknown>) => ({ ...r, id: undefined, createdAt: undefined });
  t.same(strip(b.json()), strip(a.json()), 'the same answer to the last digit');
  t.equal(a.json().models[1].percentiles.length, 1, 'the gamma without terms reports its B10 life');
});

t.test('the exponential inside the Weibull: a likelihood-ratio test from survreg\'s two maxima', async (t) => {
  const res = await post(t, solderRequest({ candidates: [
    { name: 'exponential', distribution: 'exponential', terms: SOLDER_TERMS },
    { name: 'weibull', distribution: 'weibull', terms: SOLDER_TERMS },
    { name: 'weibull-no-load', distribution: 'weibull', terms: SOLDER_TERMS.slice(0, 2) },
    { name: 'lognormal', distribution: 'lognormal', terms: SOLDER_TERMS },
  ] }));
  t.equal(res.statusCode, 200, res.body.slice(0, 600));
  const tests: { smaller: string; larger: string; df: number; lrStatistic: number; lrPValue: number; fStatistic: null; reason: string }[] = res.json().nestedTests;
  const shape = tests.find((x) => x.smaller === 'exponential' && x.larger === 'weibull')!;
  t.ok(shape, JSON.stringify(tests));
  t.equal(shape.df, 1);
  // 2(ℓ_weibull − ℓ_exponential) from survreg's log-likelihoods (survreg-aft.json, "mixed").
  const lr = 2 * (survreg.mixed.weibull.logLikelihood - survreg.mixed.exponential.logLikelihood);
  t.ok(Math.abs(shape.lrStatistic - lr) < 1e-8 * lr, `LR ${shape.lrStatistic} vs ${lr}`);
  // scipy.stats.chi2.sf(28.48875689574936, 1) with scipy 1.10.1.
  t.ok(relativeError(shape.lrPValue, 9.424417263010856e-08) < 1e-6, `p ${shape.lrPValue}`);
  t.equal(shape.fStatistic, null);
  t.match(shape.reason, /Weibull shape fixed at 1/);
  t.ok(tests.some((x) => x.smaller === 'weibull-no-load' && x.larger === 'weibull' && x.df === 1), 'a subset of the terms nests');
  t.notOk(tests.some((x) => x.smaller === 'lognormal' || x.larger === 'lognormal'), 'the lognormal nests with none of them');
});
