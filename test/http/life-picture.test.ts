// The life-data picture: computed when the comparison runs and stored with
// its result (lifePicture), then drawn by GET /v1/comparisons/{id}/life.svg
// and in the report without refitting. The stored Kaplan–Meier steps are
// survival::survfit's (test/reference/lifetime/survfit-nonparametric.json),
// the fitted curves are the distributions' own formulas evaluated here from
// the reported parameters, and the drawing is bounded and refuses what it
// cannot draw.
import t from 'tap';
import { buildTestApp } from '../helper.ts';
import { readReference, response, solderJoints, SOLDER_TERMS } from '../core/models/lifetime/fixtures.ts';
import { PICTURE_POINTS, PICTURE_RISE, turnbull } from '../../src/core/models/lifetime/index.ts';

const survfit = readReference('survfit-nonparametric.json');
const solder = solderJoints();

const rightOnly = {
  data: { columns: solder }, response: 'rightOnlyCycles', censoring: { status: 'rightOnlyStatus' },
  candidates: [
    { name: 'weibull', distribution: 'weibull' },
    { name: 'weibull-by-oven', distribution: 'weibull', terms: SOLDER_TERMS },
  ],
  label: 'solder joints, right-censored',
};

t.test('Kaplan–Meier and the fitted curves are stored with the result', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: rightOnly });
  t.equal(res.statusCode, 200, res.body.slice(0, 600));
  const body = res.json();
  const picture = body.lifePicture;
  t.equal(picture.logTime, true);
  t.equal(picture.times.length, PICTURE_POINTS);
  t.equal(picture.estimate.method, 'kaplanMeier');
  const km = survfit.kaplanMeier;
  t.ok(picture.estimate.steps.length <= Math.ceil(1 / PICTURE_RISE) + 1, 'bounded by the thinning rule');
  let previous = 0;
  for (const step of picture.estimate.steps) {
    const k = km.time.indexOf(step.time);
    t.ok(k >= 0, `a kept step is a survfit failure time (${step.time})`);
    t.ok(Math.abs(step.fractionFailed - (1 - km.survival[k])) < 1e-12, `F(${step.time}) = 1 − survfit S`);
    t.ok(Math.abs(step.lower - (1 - km.upper[k])) < 1e-9 && Math.abs(step.upper - (1 - km.lower[k])) < 1e-9, 'band = 1 − survfit log-log band');
    previous = step.fractionFailed;
  }
  t.ok(Math.abs(previous - (1 - km.survival[km.survival.length - 1])) < 1e-12, 'the last step is kept');
  // Between kept steps the full estimate never rises by PICTURE_RISE or more.
  const kept = new Set(picture.estimate.steps.map((s: { time: number }) => s.time));
  let last = 0;
  km.time.forEach((time: number, k: number) => {
    const f = 1 - km.survival[k];
    if (kept.has(time)) last = f;
    else t.ok(f - last < PICTURE_RISE, `a dropped step at ${time} stays within ${PICTURE_RISE}`);
  });

  const plain = body.models.find((m: { name: string }) => m.name === 'weibull');
  const shape = plain.distributionParameters.find((p: { name: string }) => p.name === 'shape').estimate;
  const scale = plain.distributionParameters.find((p: { name: string }) => p.name === 'scale').estimate;
  const curve = picture.curves.find((c: { model: string }) => c.model === 'weibull');
  t.equal(curve.reference, 'single');
  picture.times.forEach((time: number, j: number) => {
    const want = -Math.expm1(-((time / scale) ** shape));
    t.ok(Math.abs(curve.fractionFailed[j] - want) < 1e-9, `Weibull F(${time.toPrecision(4)}) = 1 − exp(−(t/η)^β)`);
  });

  // With terms: the average over the rows of 1 − exp(−(t/e^{x'β})^{1/σ}), from the reported coefficients.
  const aft = body.models.find((m: { name: string }) => m.name === 'weibull-by-oven');
  const b = aft.coefficients.map((c: { estimate: number }) => c.estimate);
  const beta = aft.distributionParameters.find((p: { name: string }) => p.name === 'shape').estimate;
  const rows = solder.kelvin.map((_, i) => b[0] + b[1] / (solder.kelvin[i] as number) + b[2] * (solder.finish[i] === 'gloss' ? 1 : 0) + b[3] * (solder.load[i] as number));
  const averaged = picture.curves.find((c: { model: string }) => c.model === 'weibull-by-oven');
  t.equal(averaged.reference, 'rowAverage');
  for (const j of [10, 40, 60]) {
    const time = picture.times[j];
    const want = rows.reduce((s, mu) => s - Math.expm1(-((time / Math.exp(mu)) ** beta)), 0) / rows.length;
    t.ok(Math.abs(averaged.fractionFailed[j] - want) < 1e-7, `row-averaged F(${time.toPrecision(4)}): ${averaged.fractionFailed[j]} vs ${want}`);
  }

  const svg = await app.inject({ method: 'GET', url: `/v1/comparisons/${body.id}/life.svg` });
  t.equal(svg.statusCode, 200);
  t.match(svg.headers['content-type'], /^image\/svg\+xml/);
  t.match(svg.headers['cache-control'], /immutable/);
  t.match(svg.body, /data-estimate="kaplanMeier"/);
  const paths = [...svg.body.matchAll(/class="fitted-curve" data-model="([^"]*)" data-reference="([^"]*)" d="([^"]*)"/g)];
  t.same(paths.map((p) => [p[1], p[2]]), [['weibull', 'single'], ['weibull-by-oven', 'rowAverage']]);
  for (const p of paths) t.equal(p[3].split(/[ML]/).filter(Boolean).length, PICTURE_POINTS, 'one vertex per stored point');
  t.match(svg.body, /averaged over the rows/);
  t.match(svg.body, /do not validate/);
  t.notOk(/NaN|Infinity/.test(svg.body));

  const tile = await app.inject({ method: 'GET', url: `/v1/comparisons/${body.id}/life.svg?size=tile` });
  t.match(tile.body, /width="420" height="280"/);
  const bad = await app.inject({ method: 'GET', url: `/v1/comparisons/${body.id}/life.svg?width=3` });
  t.equal(bad.statusCode, 400);
  t.match(bad.headers['content-type'], /problem\+json/);

  const report = await app.inject({ method: 'GET', url: `/v1/comparisons/${body.id}/report` });
  t.equal(report.statusCode, 200);
  t.match(report.body, /id="life-picture"/);
  t.match(report.body, /data-estimate="kaplanMeier"/);
});

t.test("Turnbull's estimate is stored thinned, for inspection data", async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({
    method: 'POST', url: '/v1/comparisons',
    payload: { data: { columns: solder }, response: 'cycles', censoring: { status: 'status', upper: 'upper' }, candidates: [{ name: 'lognormal', distribution: 'lognormal' }] },
  });
  t.equal(res.statusCode, 200, res.body.slice(0, 600));
  const stored = res.json().lifePicture.estimate;
  t.equal(stored.method, 'turnbull');
  const full = turnbull(response(solder, 'cycles', { status: 'status', upper: 'upper' }));
  const afters = full.intervals.map((iv) => iv.cdfAfter);
  for (const iv of stored.intervals) t.ok(afters.some((a) => Math.abs(a - iv.after) < 1e-12), `stored F ${iv.after} is the full estimate's`);
  t.ok(Math.abs(stored.intervals[stored.intervals.length - 1].after - afters[afters.length - 1]) < 1e-12, 'ends where the estimate ends');
  const svg = await app.inject({ method: 'GET', url: `/v1/comparisons/${res.json().id}/life.svg` });
  t.match(svg.body, /class="undetermined"/);
});

t.test('a comparison without life models has no life picture', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({
    method: 'POST', url: '/v1/comparisons',
    payload: { data: { columns: { x: [1, 2, 3, 4, 5], y: [1.1, 2.3, 2.8, 4.2, 5.1] } }, response: 'y', candidates: [{ name: 'line', terms: ['x'] }] },
  });
  t.equal(res.statusCode, 200);
  t.notOk('lifePicture' in res.json());
  const svg = await app.inject({ method: 'GET', url: `/v1/comparisons/${res.json().id}/life.svg` });
  t.equal(svg.statusCode, 422);
  t.match(svg.headers['content-type'], /problem\+json/);
});
