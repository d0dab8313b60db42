// The convention logL = -n/2 (ln 2π + ln(RSS/n) + 1) + ½ Σ ln w_i checked
// against a direct computation: the sum of Gaussian log-densities of the
// residuals at the maximum-likelihood variance σ̂² = RSS/n (the standard
// Gaussian likelihood of a regression at its ML estimates), and for weights
// the sum of log N(e_i; 0, σ̂²/w_i) with σ̂² = Σ w e²/n. The densities come
// from @stdlib/stats-base-dists-normal (general-purpose reference library).
import t from 'tap';
import fc from 'fast-check';
import normal from '@stdlib/stats-base-dists-normal';
import { gaussianLogLikelihood, residualSumOfSquares, sumOfLogs } from '../../src/core/likelihood.ts';

function directLogLikelihood(residuals: number[], weights?: number[]): number {
  const w = weights ?? residuals.map(() => 1);
  const sigma2 = residuals.reduce((s, e, i) => s + w[i] * e * e, 0) / residuals.length;
  return residuals.reduce((s, e, i) => s + normal.logpdf(e, 0, Math.sqrt(sigma2 / w[i])), 0);
}

const residualsArb = fc.array(fc.double({ min: -100, max: 100, noNaN: true }), { minLength: 2, maxLength: 40 })
  .filter((r) => r.some((e) => Math.abs(e) > 1e-3));

t.test('unweighted: equals the sum of log N(e_i; 0, RSS/n) densities (property)', async (t) => {
  fc.assert(fc.property(residualsArb, (e) => {
    const got = gaussianLogLikelihood({ n: e.length, rss: residualSumOfSquares(e) })!;
    const want = directLogLikelihood(e);
    return Math.abs(got - want) <= 1e-9 * Math.max(1, Math.abs(want));
  }));
});

t.test('weighted: equals the sum of log N(e_i; 0, σ̂²/w_i) densities (property)', async (t) => {
  const arb = residualsArb.chain((e) =>
    fc.tuple(fc.constant(e), fc.array(fc.double({ min: 0.01, max: 100, noNaN: true }), { minLength: e.length, maxLength: e.length })));
  fc.assert(fc.property(arb, ([e, w]) => {
    const got = gaussianLogLikelihood({ n: e.length, rss: residualSumOfSquares(e, w), sumLogWeights: sumOfLogs(w) })!;
    const want = directLogLikelihood(e, w);
    return Math.abs(got - want) <= 1e-9 * Math.max(1, Math.abs(want));
  }));
});

t.test('rescaling every relative weight leaves the likelihood unchanged (property)', async (t) => {
  // -n/2 ln c from the RSS cancels +n/2 ln c from Σ ln(c w): an identity of the formula.
  const arb = fc.tuple(residualsArb, fc.double({ min: 1e-3, max: 1e3, noNaN: true }));
  fc.assert(fc.property(arb, ([e, c]) => {
    const w = e.map((_, i) => 1 + (i % 3));
    const cw = w.map((x) => c * x);
    const a = gaussianLogLikelihood({ n: e.length, rss: residualSumOfSquares(e, w), sumLogWeights: sumOfLogs(w) })!;
    const b = gaussianLogLikelihood({ n: e.length, rss: residualSumOfSquares(e, cw), sumLogWeights: sumOfLogs(cw) })!;
    return Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a));
  }));
});

t.test('a worked value and the undefined cases', async (t) => {
  // Residuals 1, -1, 1, -1: RSS = 4, n = 4, σ̂² = 1, so logL = -2 (ln 2π + 1)
  // = -2 (1.8378770664093453 + 1) = -5.675754132818691 (by hand).
  t.ok(Math.abs(gaussianLogLikelihood({ n: 4, rss: 4 })! - -5.675754132818691) < 1e-14);
  t.equal(gaussianLogLikelihood({ n: 4, rss: 4, jacobian: -1.5 })! - gaussianLogLikelihood({ n: 4, rss: 4 })!, -1.5);
  t.equal(gaussianLogLikelihood({ n: 4, rss: 0 }), null, 'an exact fit has no finite likelihood');
  t.equal(gaussianLogLikelihood({ n: 0, rss: 1 }), null);
  t.equal(gaussianLogLikelihood({ n: 4, rss: Infinity }), null);
  // A tiny RSS does not underflow through RSS/n.
  t.ok(Number.isFinite(gaussianLogLikelihood({ n: 1e6, rss: 5e-324 })!));
});

t.test('residualSumOfSquares keeps the digits of a small sum', async (t) => {
  // 0.1² computed in double-double then rounded equals the correctly rounded
  // square of the double 0.1 (0.010000000000000002 in decimal, Python decimal check).
  t.equal(residualSumOfSquares([0.1]), 0.010000000000000002);
  t.equal(residualSumOfSquares([3, 4]), 25);
  t.equal(residualSumOfSquares([3, 4], [2, 0.5]), 26);
});
