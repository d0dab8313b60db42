// What a life model offers after the ranking, through POST /v1/comparisons:
// values at options.predict rows (location, median life, percentiles and
// survival with intervals) and survival at options.survivalAt for a model
// without terms, against R's survival::survreg (test/reference/lifetime/
// survreg-predictions.json, made by scripts/lifetime-reference.R); no silent
// null percentiles for a model with terms; options.tests naming life models
// routed to the likelihood-ratio test, with a 422 naming the pair when it is
// not nested.
import t from 'tap';
import { buildTestApp } from '../helper.ts';
import { bearings, readReference, relativeError, solderJoints, SOLDER_TERMS } from '../core/models/lifetime/fixtures.ts';

const ref = readReference('survreg-predictions.json');
const solder = solderJoints();
const FAMILIES = ['weibull', 'lognormal', 'loglogistic'] as const;
/** survreg's estimates agree with ours to ~1e-7 (rel.tolerance 1e-13, test/http/lifetime.test.ts); derived values within 1e-5 relative. */
const TOLERANCE = 1e-5;

async function post(t: Parameters<typeof buildTestApp>[0], payload: unknown) {
  const { app } = await buildTestApp(t);
  return app.inject({ method: 'POST', url: '/v1/comparisons', payload: payload as object });
}

function close(t: { ok(v: boolean, m: string): unknown }, got: number | null, want: number, what: string) {
  t.ok(got !== null && relativeError(got, want) < TOLERANCE, `${what}: ${got} vs survreg ${want}`);
}

t.test('an accelerated-failure-time model at stated rows matches survreg', async (t) => {
  const res = await post(t, {
    data: { columns: solder },
    response: 'cycles',
    censoring: { status: 'status', upper: 'upper' },
    candidates: FAMILIES.map((d) => ({ name: d, distribution: d, terms: SOLDER_TERMS })),
    options: { percentiles: ref.probabilities, survivalAt: ref.times, predict: { columns: ref.rows } },
  });
  t.equal(res.statusCode, 200, res.body.slice(0, 600));
  const body = res.json();
  for (const d of FAMILIES) {
    const m = body.models.find((x: { name: string }) => x.name === d);
    t.equal(m.percentiles, null, `${d}: no single percentile for a model with terms`);
    t.equal(m.survival, null);
    const caution = m.cautions.find((c: { code: string }) => c.code === 'life_values_depend_on_row');
    t.match(caution?.message, /lifePredictions/, `${d}: the caution says where the values are`);
    t.equal(m.predictions, null, 'no mean response for a life model');
    t.equal(m.lifePredictions.length, 2);
    m.lifePredictions.forEach((row: any, i: number) => {
      const want = ref.aft[d][i];
      close(t, row.location.estimate, want.location, `${d} row ${i} location`);
      close(t, row.location.standardError, want.locationSE, `${d} row ${i} se(location)`);
      close(t, row.medianLife.estimate, want.percentile[1], `${d} row ${i} median life`);
      close(t, row.medianLife.lower, want.percentileLower[1], `${d} row ${i} median lower`);
      row.percentiles.forEach((p: any, k: number) => {
        t.equal(p.probability, ref.probabilities[k]);
        close(t, p.estimate, want.percentile[k], `${d} row ${i} t_${p.probability}`);
        close(t, p.lower, want.percentileLower[k], `${d} row ${i} lower t_${p.probability}`);
        close(t, p.upper, want.percentileUpper[k], `${d} row ${i} upper t_${p.probability}`);
      });
      row.survival.forEach((s: any, k: number) => {
        t.equal(s.time, ref.times[k]);
        close(t, s.estimate, want.survival[k], `${d} row ${i} S(${s.time})`);
        close(t, s.lower, want.survivalLower[k], `${d} row ${i} lower S(${s.time})`);
        close(t, s.upper, want.survivalUpper[k], `${d} row ${i} upper S(${s.time})`);
      });
    });
  }
});

t.test('without prediction rows a model with terms says where its percentiles would be', async (t) => {
  const res = await post(t, {
    data: { columns: solder }, response: 'cycles', censoring: { status: 'status', upper: 'upper' },
    candidates: [{ name: 'weibull', distribution: 'weibull', terms: SOLDER_TERMS }],
    options: { percentiles: [0.1] },
  });
  t.equal(res.statusCode, 200, res.body.slice(0, 600));
  const m = res.json().models[0];
  t.equal(m.percentiles, null);
  t.match(m.cautions.find((c: { code: string }) => c.code === 'life_values_depend_on_row')?.message, /options\.predict/);
  t.notOk('lifePredictions' in m);
});

t.test('a model without terms gives survival at options.survivalAt, as survreg', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: {
    data: { columns: { endurance: bearings() } }, response: 'endurance',
    candidates: FAMILIES.map((d) => ({ name: d, distribution: d })),
    options: { percentiles: ref.probabilities, survivalAt: ref.bearingTimes },
  } });
  t.equal(res.statusCode, 200, res.body.slice(0, 600));
  const report = await app.inject({ method: 'GET', url: `/v1/comparisons/${res.json().id}/report` });
  t.match(report.body, /id="survival"/, 'the report lists survival probabilities');
  const survivalTable = /<table[^>]*id="survival"[\s\S]*?<\/table>/.exec(report.body)?.[0] ?? '';
  t.equal((survivalTable.match(/<tr data-model="weibull"/g) ?? []).length, ref.bearingTimes.length, 'one row per time for the Weibull');
  for (const d of FAMILIES) {
    const m = res.json().models.find((x: { name: string }) => x.name === d);
    const want = ref.bearings[d][0];
    m.survival.forEach((s: any, k: number) => {
      close(t, s.estimate, want.survival[k], `${d} S(${s.time})`);
      close(t, s.lower, want.survivalLower[k], `${d} lower S(${s.time})`);
      close(t, s.upper, want.survivalUpper[k], `${d} upper S(${s.time})`);
    });
    m.percentiles.forEach((p: any, k: number) => close(t, p.lower, want.percentileLower[k], `${d} lower t_${p.probability}`));
    t.notOk(m.cautions.some((c: { code: string }) => c.code === 'life_values_depend_on_row'));
  }
});

t.test('options.tests naming life models runs the likelihood-ratio test', async (t) => {
  const base = { data: { columns: { endurance: bearings() } }, response: 'endurance' };
  const candidates = [
    { name: 'exponential', distribution: 'exponential' },
    { name: 'weibull', distribution: 'weibull' },
    { name: 'lognormal', distribution: 'lognormal' },
  ];
  const ok = await post(t, { ...base, candidates, options: { tests: [{ smaller: 'exponential', larger: 'weibull' }] } });
  t.equal(ok.statusCode, 200, ok.body.slice(0, 600));
  const body = ok.json();
  const tests = body.nestedTests.filter((x: { smaller: string; larger: string }) => x.smaller === 'exponential' && x.larger === 'weibull');
  t.equal(tests.length, 1, 'found automatically and named: tested once');
  const ll = (name: string) => body.models.find((m: { name: string }) => m.name === name).logLikelihood;
  t.ok(Math.abs(tests[0].lrStatistic - 2 * (ll('weibull') - ll('exponential'))) < 1e-9, 'LR = 2(ℓ_weibull − ℓ_exponential)');
  t.equal(tests[0].fStatistic, null, 'no F test for life models');

  const notNested = await post(t, { ...base, candidates, options: { tests: [{ smaller: 'lognormal', larger: 'weibull' }] } });
  t.equal(notNested.statusCode, 422);
  const problem = notNested.json();
  t.equal(problem.errors[0].path, 'options/tests/0');
  t.match(problem.errors[0].message, /special case/);

  const mixed = await post(t, {
    ...base,
    candidates: [{ name: 'mean-only', terms: [] }, { name: 'normal', distribution: 'normal' }],
    options: { tests: [{ smaller: 'mean-only', larger: 'normal' }] },
  });
  t.equal(mixed.statusCode, 422, mixed.body.slice(0, 400));
  t.equal(mixed.json().errors[0].path, 'options/tests/0');
  t.match(mixed.json().errors[0].message, /only against another life model/);
});
