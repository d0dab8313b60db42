// Nonparametric estimates for the picture, against R's survival::survfit
// (test/reference/lifetime/survfit-nonparametric.json; versions there):
// Kaplan–Meier with Greenwood's variance and log-log intervals, and
// Turnbull's estimate for interval- and left-censored data. With exact and
// right-censored data alone the Turnbull estimate is the Kaplan–Meier one
// (Turnbull 1976), a property checked on random data.
import t from 'tap';
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { kaplanMeier, nonparametricEstimate, turnbull, type CensoredResponse } from '../../../../src/core/models/lifetime/index.ts';
import { readReference, relativeError, response, solderJoints } from './fixtures.ts';

const survfit = readReference('survfit-nonparametric.json');

t.test('Kaplan–Meier equals survfit: steps, at-risk counts, Greenwood errors, log-log intervals', async (t) => {
  const c = solderJoints();
  const r = response(c, 'rightOnlyCycles', { status: 'rightOnlyStatus' });
  const km = nonparametricEstimate(r, 0.95);
  t.equal(km.method, 'kaplanMeier');
  if (km.method !== 'kaplanMeier') return;
  const ref = survfit.kaplanMeier;
  t.equal(km.steps.length, ref.time.length);
  km.steps.forEach((s, k) => {
    t.equal(s.time, ref.time[k]);
    t.equal(s.atRisk, ref.atRisk[k]);
    t.equal(s.failures, ref.failures[k]);
    t.ok(relativeError(s.survival, ref.survival[k]) < 1e-14, `S(${s.time})`);
    if (ref.logStandardError[k] !== null) t.ok(relativeError(s.standardError! / s.survival, ref.logStandardError[k]) < 1e-12, `se at ${s.time}`);
    if (ref.lower[k] !== null) t.ok(relativeError(s.lower!, ref.lower[k]) < 1e-12 && relativeError(s.upper!, ref.upper[k]) < 1e-12, `interval at ${s.time}`);
  });
  t.equal(km.censoredTimes.length, 15);
});

function sealData(): CensoredResponse {
  const path = fileURLToPath(new URL('../../../reference/lifetime/seal-inspections.csv', import.meta.url));
  const lines = readFileSync(path, 'utf8').trim().split('\n').slice(1).map((l) => l.split(','));
  const c = { day: lines.map((l) => Number(l[0])), upper: lines.map((l) => (l[1] === '' ? null : Number(l[1]))), status: lines.map((l) => l[2]) };
  return response(c, 'day', { status: 'status', upper: 'upper' });
}

/** Whether innermost interval iv lies inside observation i's set of times. */
function inside(r: CensoredResponse, i: number, iv: { left: number; right: number; leftClosed: boolean }): boolean {
  const s = r.status[i];
  const t = r.time[i];
  if (s === 0) return iv.left === t && iv.right === t;
  const lo = s === 2 ? -Infinity : t;
  const hi = s === 1 ? Infinity : s === 3 ? r.upper[i] : t;
  // The observation is open at lo: a closed innermost interval [lo, …] is not inside it.
  return (iv.left > lo || (iv.left === lo && !iv.leftClosed)) && iv.right <= hi;
}

/** Σ_i ln P(A_i) under masses on the innermost intervals. */
function logLikelihoodOf(r: CensoredResponse, intervals: { left: number; right: number; leftClosed: boolean }[], mass: number[]): number {
  let total = 0;
  for (let i = 0; i < r.time.length; i++) total += Math.log(intervals.reduce((p, iv, j) => p + (inside(r, i, iv) ? mass[j] : 0), 0));
  return total;
}

t.test('Turnbull on overlapping inspection windows: at least survfit\'s likelihood, and its estimate to 2e-3', async (t) => {
  const r = sealData();
  const tb = turnbull(r);
  t.ok(tb.converged, `converged after ${tb.iterations} iterations`);
  const ref = survfit.sealsTurnbull;
  // survfit reports S at a point inside each innermost interval (after its mass): read its masses from the drops.
  const refMass = tb.intervals.map((iv) => {
    const k = ref.time.findIndex((x: number) => x > iv.left && x <= iv.right);
    if (k < 0) return 0;
    return (k === 0 ? 1 : ref.survival[k - 1]) - ref.survival[k];
  });
  const refLogLik = logLikelihoodOf(r, tb.intervals, refMass);
  t.ok(relativeError(logLikelihoodOf(r, tb.intervals, tb.intervals.map((iv) => iv.mass)), tb.logLikelihood) < 1e-12, 'its stated log-likelihood');
  t.ok(tb.logLikelihood >= refLogLik - 1e-9, `log-likelihood ${tb.logLikelihood} at least survfit's ${refLogLik}`);
  t.ok(tb.logLikelihood - refLogLik < 1e-3, 'and close to it (both near the maximum)');
  // survfit's EM stops earlier (its likelihood is lower): masses agree to 5e-3.
  tb.intervals.forEach((iv, j) => t.ok(Math.abs(iv.mass - refMass[j]) < 5e-3, `mass on (${iv.left}, ${iv.right}]: ${iv.mass} vs ${refMass[j]}`));
  // The maximum itself (Kuhn–Tucker, Gentleman & Geyer 1994): no innermost interval gains
  // likelihood from more mass, d_j = (1/n) Σ_i [j ⊂ A_i] / P(A_i) <= 1 (to the stopping rule).
  const n = r.time.length;
  tb.intervals.forEach((iv, j) => {
    let d = 0;
    for (let i = 0; i < n; i++) {
      if (!inside(r, i, iv)) continue;
      d += 1 / tb.intervals.reduce((p, w) => p + (inside(r, i, w) ? w.mass : 0), 0);
    }
    t.ok(n * (d / n - 1) <= 1e-6 + 1e-9, `d_${j} = ${d / n}`);
  });
  t.ok(Math.abs(tb.intervals.reduce((s, iv) => s + iv.mass, 0) - 1) < 1e-12, 'masses sum to 1');
});

t.test('Turnbull on the mixed solder-joint data equals survfit where the estimate is determined', async (t) => {
  const c = solderJoints();
  const tb = nonparametricEstimate(response(c, 'cycles', { status: 'status', upper: 'upper' }), 0.95);
  t.equal(tb.method, 'turnbull');
  if (tb.method !== 'turnbull') return;
  const ref = survfit.turnbull;
  ref.time.forEach((time: number, k: number) => {
    const passed = tb.intervals.filter((iv) => iv.right <= time).reduce((s, iv) => s + iv.mass, 0);
    t.ok(Math.abs(1 - passed - ref.survival[k]) < 1e-4, `S(${time}) ${1 - passed} vs ${ref.survival[k]}`);
  });
});

t.test('with exact and right-censored data only, Turnbull equals Kaplan–Meier (property)', async (t) => {
  const arb = fc.array(fc.tuple(fc.integer({ min: 1, max: 30 }), fc.boolean()), { minLength: 2, maxLength: 40 })
    .filter((rows) => rows.some(([, failed]) => failed));
  fc.assert(fc.property(arb, (rows) => {
    const time = Float64Array.from(rows, ([v]) => v);
    const status = Uint8Array.from(rows, ([, failed]) => (failed ? 0 : 1));
    const r: CensoredResponse = { rows: rows.map((_, i) => i), time, upper: new Float64Array(rows.length).fill(NaN), status, timeColumn: 't', upperColumn: null };
    const km = kaplanMeier(time, Array.from(rows, ([, f]) => f), 0.95);
    const tb = turnbull(r);
    return km.steps.every((s) => {
      const passed = tb.intervals.filter((iv) => iv.right <= s.time).reduce((a, iv) => a + iv.mass, 0);
      return Math.abs(1 - passed - s.survival) < 1e-6;
    });
  }), { numRuns: 200 });
});
