// After the ranking: values at new design rows (location, percentiles,
// survival), Cox–Snell residuals and the fitted distribution curve, and the
// pricing function. References: survreg's linear predictor for the location
// (test/reference/lifetime/survreg-aft.json), closed forms of the Weibull
// for percentiles and survival, and consistency with the fit itself.
import t from 'tap';
import { predictionDesign } from '../../../../src/core/comparison/extras/prediction-rows.ts';
import {
  coxSnellResiduals, fitLifetime, fittedDistributionCurve, predictLifetime, priceLifetime, priceNonparametric, uncensoredResponse,
  type LifetimeFit,
} from '../../../../src/core/models/lifetime/index.ts';
import { bearings, design, readReference, relativeError, response, solderJoints, SOLDER_TERMS } from './fixtures.ts';

const columns = solderJoints();
const rows = columns.cycles.map((_, i) => i);
const X = design(columns, SOLDER_TERMS);
const data = response(columns, 'rightOnlyCycles', { status: 'rightOnlyStatus' });

function fit(distribution: string): LifetimeFit {
  const f = fitLifetime({ name: distribution, distribution, design: X }, data);
  if ('issues' in f) throw new Error(JSON.stringify(f.issues));
  return f;
}

const newRows = { kelvin: [398.15, 448.15, 373.15], finish: ['gloss', 'matte', 'matte'], load: [1, 0.5, 1.5] };

t.test('Weibull AFT at new rows: location from survreg\'s coefficients, percentiles and survival in closed form', async (t) => {
  const f = fit('weibull');
  const built = predictionDesign(columns, rows, newRows, 3, SOLDER_TERMS, true, 0);
  if ('issues' in built) throw new Error('rows');
  const { predictions, issues } = predictLifetime(f, X, built.design, { percentiles: [0.1, 0.5], survivalAt: [500, 1500] });
  t.same(issues, []);
  const ref = readReference('survreg-aft.json').right.weibull;
  const sigma = ref.scale;
  newRows.kelvin.forEach((k, i) => {
    const x = [1, 1 / k, newRows.finish[i] === 'gloss' ? 1 : 0, newRows.load[i]];
    const mu = x.reduce((s, v, j) => s + v * ref.coefficients[j], 0);
    const p = predictions[i]!;
    t.ok(relativeError(p.location.estimate, mu) < 1e-8, `μ at row ${i}`);
    // Weibull: t_p = e^μ (-ln(1-p))^σ; S(t) = exp(-(t/e^μ)^(1/σ)) (closed forms).
    p.percentiles.forEach((q) => {
      t.ok(relativeError(q.estimate, Math.exp(mu) * Math.pow(-Math.log(1 - q.probability), sigma)) < 1e-7, `t_${q.probability} at row ${i}`);
      t.ok(q.lower! < q.estimate && q.estimate < q.upper!);
    });
    p.survival.forEach((s) => {
      t.ok(Math.abs(s.estimate - Math.exp(-Math.pow(s.time / Math.exp(mu), 1 / sigma))) < 1e-8, `S(${s.time}) at row ${i}`);
      t.ok(s.lower! <= s.estimate && s.estimate <= s.upper!);
    });
  });
  // The standard error of the location is sqrt(x' V x) with survreg's covariance.
  const x0 = [1, 1 / 398.15, 1, 1];
  const v = x0.reduce((s, a, j) => s + a * x0.reduce((u, b, k) => u + ref.covariance[j][k] * b, 0), 0);
  t.ok(relativeError(predictions[0]!.location.standardError!, Math.sqrt(v)) < 1e-6);
  // 373.15 K lies outside the tested temperatures: the service still answers (extrapolation is the caller's judgement, the README cautions).
  t.ok(predictions[2]!.location.standardError! > predictions[0]!.location.standardError!, 'extrapolating widens the interval');
});

t.test('a model without terms: predictions equal the fit\'s own percentiles and survival', async (t) => {
  const b = bearings();
  const r = b.map((_, i) => i);
  const X0 = design({ t: b }, [], r);
  const f = fitLifetime({ name: 'g', distribution: 'gamma', design: X0 }, uncensoredResponse(Float64Array.from(b), r, 't'), { percentiles: [0.1, 0.9], survivalAt: [50, 100] });
  if ('issues' in f) throw new Error('fit');
  const { predictions } = predictLifetime(f, X0, design({ t: [1] }, [], [0]), { percentiles: [0.1, 0.9], survivalAt: [50, 100] });
  t.same(predictions[0]!.percentiles, f.percentiles);
  t.same(predictions[0]!.survival, f.survival);
});

t.test('Cox–Snell residuals: bounds by censoring; exact ones average about 1 on well-fitting data', async (t) => {
  const f = fit('weibull');
  const { lower, upper } = coxSnellResiduals(f, data);
  data.status.forEach((s, i) => {
    if (s === 0) t.equal(lower[i], upper[i]);
    else t.equal(upper[i], Infinity);
  });
  // Σ of Cox–Snell residuals over all units equals the number of failures at a
  // Weibull (and exponential) MLE with an intercept: the score equation of the
  // intercept says Σ_i e^{z_i} = number of failures (common practice).
  const failures = data.status.filter((s) => s === 0).length;
  t.ok(Math.abs(lower.reduce((a, v) => a + v, 0) - failures) < 1e-8, 'Σ H(t_i) = failures');
});

t.test('the fitted distribution curve rises from 0 to 1 and averages the rows', async (t) => {
  const f = fit('lognormal');
  const curve = fittedDistributionCurve(f, [1, 100, 500, 1000, 1e6]);
  t.ok(curve[0] < 1e-6 && curve[4] > 1 - 1e-6);
  t.ok(curve.every((v, i) => i === 0 || v >= curve[i - 1]));
});

t.test('prices grow with rows, columns and the iteration cap; censored gamma rows cost more', async (t) => {
  const base = { rows: 10_000, designColumns: 4, distribution: 'weibull' as const };
  const p = priceLifetime(base);
  t.ok(p > 0 && Number.isFinite(p));
  t.ok(priceLifetime({ ...base, rows: 20_000 }) > p);
  t.ok(priceLifetime({ ...base, designColumns: 8 }) > p);
  t.ok(priceLifetime({ ...base, maxIterations: 100 }) > p);
  t.ok(priceLifetime({ ...base, distribution: 'gamma' }) > priceLifetime({ ...base, distribution: 'gamma', censoredRows: 0 }));
  t.ok(priceNonparametric({ rows: 1000, leftOrIntervalCensored: true }) > priceNonparametric({ rows: 1000, leftOrIntervalCensored: false }));
});
