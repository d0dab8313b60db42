// Invariances of generalised linear models over random data (fast-check).
// Each is an identity of the definitions (common practice), not a fitted
// number: the Gaussian identity model is least squares; the likelihood does
// not depend on the order of the rows; under a log link a common factor in
// every row's exposure is absorbed by the intercept alone.
import t from 'tap';
import fc from 'fast-check';
import { fitGlm, type GlmFamilyName, type GlmFit } from '../../../../src/core/models/glm/index.ts';
import { fitLeastSquares } from '../../../../src/core/fit/index.ts';
import { gaussianLogLikelihood, sumOfLogs } from '../../../../src/core/likelihood.ts';
import { design } from './glm-fixtures.ts';

const decimal = (min: number, max: number) => fc.integer({ min: min * 100, max: max * 100 }).map((v) => v / 100);
const RUNS = { numRuns: 25 };

function fitted(outcome: ReturnType<typeof fitGlm>): GlmFit {
  if ('issues' in outcome) throw new Error(outcome.issues[0].message);
  return outcome;
}

t.test('gaussian with the identity link is least squares, bit for bit', async (t) => {
  const data = fc.integer({ min: 6, max: 30 }).chain((n) => fc.record({
    x1: fc.array(decimal(-50, 50), { minLength: n, maxLength: n }),
    x2: fc.array(decimal(0.5, 20), { minLength: n, maxLength: n }),
    y: fc.array(decimal(-100, 100), { minLength: n, maxLength: n }),
    w: fc.option(fc.array(decimal(0.1, 5), { minLength: n, maxLength: n })),
    offset: fc.option(fc.array(decimal(-10, 10), { minLength: n, maxLength: n })),
  })).filter((d) => new Set(d.x1).size > 3 && new Set(d.x2).size > 3 && new Set(d.y).size > 3);
  fc.assert(fc.property(data, (d) => {
    const X = design({ x1: d.x1, x2: d.x2 }, ['x1', 'x2']);
    const weights = d.w ? Float64Array.from(d.w) : undefined;
    const glm = fitted(fitGlm({
      family: 'gaussian', design: X, response: Float64Array.from(d.y), weights, offset: d.offset ? Float64Array.from(d.offset) : undefined,
    }));
    const target = Float64Array.from(d.y, (v, i) => (d.offset ? v - d.offset[i] : v));
    const ls = fitLeastSquares(X, target, weights);
    const logL = ls.exactFit ? null : gaussianLogLikelihood({ n: X.rows, rss: ls.rss, sumLogWeights: weights ? sumOfLogs(weights) : 0 });
    return glm.coefficients.every((c, j) => Object.is(c.estimate, ls.coefficients[j]) && Object.is(c.standardError, ls.standardErrors[j]))
      && Object.is(glm.logLikelihood, logL) && glm.parameters === ls.rank + 1 && Object.is(glm.deviance, ls.rss)
      && Object.is(glm.nullDeviance, ls.tss) && Object.is(glm.conditionNumber, ls.conditionNumber);
  }), RUNS);
});

/** A seeded data set with a known model, so the fits exist; fast-check chooses the permutation. */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1103515245) + 12345) >>> 0) + 0.5) / 4294967296;
}
function poissonDraw(mu: number, u: number): number {
  let k = 0;
  let p = Math.exp(-mu);
  let cdf = p;
  while (u > cdf && k < 500) {
    k++;
    p *= mu / k;
    cdf += p;
  }
  return k;
}
const N = 40;
const random = lcg(7);
const temperature = Array.from({ length: N }, () => Math.round(200 + 100 * random()) / 10);
const hours = Array.from({ length: N }, () => Math.round(5 + 95 * random()));
const shift = Array.from({ length: N }, (_, i) => ['day', 'night', 'swing'][i % 3]);
const base: Record<GlmFamilyName, number[] | null> = {
  poisson: temperature.map((x, i) => poissonDraw(hours[i] * Math.exp(-3 + 0.05 * x), random())),
  binomial: temperature.map((x) => (random() < 1 / (1 + Math.exp(-(x - 25) / 3)) ? 1 : 0)),
  gamma: temperature.map((x) => Math.round(10 * (1 + x / 10) * -Math.log(random() * random())) / 10 + 0.1),
  negativeBinomial: null, inverseGaussian: null, gaussian: null,
};

function fitIn(family: GlmFamilyName, order: number[], scale = 1): GlmFit {
  const y = base[family]!;
  const pick = <T>(v: T[]) => order.map((i) => v[i]);
  const offset = family === 'poisson' ? Float64Array.from(pick(hours), (h) => Math.log(scale * h)) : undefined;
  return fitted(fitGlm({
    family, link: family === 'gamma' ? 'log' : undefined,
    design: design({ temperature: pick(temperature), shift: pick(shift) }, ['temperature', 'shift']),
    response: Float64Array.from(pick(y)), offset,
  }));
}

const close = (a: number | null, b: number | null, tolerance: number) =>
  a !== null && b !== null && Math.abs(a - b) <= tolerance * Math.max(Math.abs(b), 1e-300);

t.test('permuting the rows changes nothing', async (t) => {
  const identity = [...Array(N).keys()];
  for (const family of ['poisson', 'binomial', 'gamma'] as const) {
    const reference = fitIn(family, identity);
    fc.assert(fc.property(fc.shuffledSubarray(identity, { minLength: N, maxLength: N }), (order) => {
      const f = fitIn(family, order);
      return f.coefficients.every((c, j) => close(c.estimate, reference.coefficients[j].estimate, 1e-9)
        && close(c.standardError, reference.coefficients[j].standardError, 1e-9))
        && close(f.deviance, reference.deviance, 1e-11) && close(f.logLikelihood, reference.logLikelihood, 1e-12)
        && close(f.pearsonChiSquare, reference.pearsonChiSquare, 1e-10);
    }), RUNS);
    t.pass(family);
  }
});

t.test('scaling every exposure by c shifts only the intercept, by -ln c (Poisson, log link, offset ln exposure)', async (t) => {
  const identity = [...Array(N).keys()];
  const reference = fitIn('poisson', identity);
  fc.assert(fc.property(fc.double({ min: 1e-3, max: 1e3, noNaN: true }), (c) => {
    const f = fitIn('poisson', identity, c);
    const [b0, ...rest] = f.coefficients;
    const [r0, ...restRef] = reference.coefficients;
    return Math.abs(b0.estimate! - (r0.estimate! - Math.log(c))) <= 1e-9 * r0.standardError!
      && rest.every((b, j) => Math.abs(b.estimate! - restRef[j].estimate!) <= 1e-9 * restRef[j].standardError!)
      && f.coefficients.every((b, j) => close(b.standardError, reference.coefficients[j].standardError, 1e-9))
      && close(f.deviance, reference.deviance, 1e-10) && close(f.logLikelihood, reference.logLikelihood, 1e-12);
  }), RUNS);
});
