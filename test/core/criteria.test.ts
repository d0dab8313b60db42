// Criteria under the fixed conventions of api.md. Worked values are computed
// by hand in the comments; identities are facts of the trade (common practice).
import t from 'tap';
import fc from 'fast-check';
import { CRITERIA, CRITERION_NAMES, computeCriteria, type FitSummary } from '../../src/core/scoring/criteria.ts';

const base: FitSummary = {
  logLikelihood: -10, parameters: 3, observations: 20, rss: 4, tss: 16, coefficientsIncludingIntercept: 2, intercept: true,
};

t.test('worked example', async (t) => {
  const c = computeCriteria(base);
  // aic = 20 + 6 = 26; aicc = 26 + 2·3·4/(20-3-1) = 26 + 1.5 = 27.5
  t.equal(c.aic, 26);
  t.equal(c.aicc, 27.5);
  // bic = 20 + 3 ln 20 = 20 + 8.987196820661973; hqc = 20 + 6 ln(ln 20) = 20 + 6·1.0971887003...
  t.ok(Math.abs(c.bic! - (20 + 3 * Math.log(20))) < 1e-12);
  t.ok(Math.abs(c.bic! - 28.987196820661973) < 1e-12);
  t.ok(Math.abs(c.hqc! - (20 + 6 * Math.log(Math.log(20)))) < 1e-12);
  // r2 = 1 - 4/16 = 0.75; adjusted = 1 - 0.25·19/18 = 0.7361111...
  t.equal(c.r2, 0.75);
  t.ok(Math.abs(c.adjustedR2! - (1 - 0.25 * 19 / 18)) < 1e-15);
  t.equal(c.r2Basis, 'centred');
  t.same(c.cautions, []);
});

t.test('without an intercept the adjustment uses n, not n - 1', async (t) => {
  const c = computeCriteria({ ...base, intercept: false, coefficientsIncludingIntercept: 1 });
  // 1 - 0.25·20/19
  t.ok(Math.abs(c.adjustedR2! - (1 - 0.25 * 20 / 19)) < 1e-15);
  t.equal(c.r2Basis, 'uncentred');
});

t.test("BIC's penalty exceeds AIC's exactly when n >= 8 (ln 7 < 2 < ln 8; common practice)", async (t) => {
  for (let n = 2; n <= 40; n++) {
    const c = computeCriteria({ ...base, observations: n });
    t.equal(c.bic! > c.aic!, n >= 8, `n = ${n}`);
  }
});

t.test('adjusted R² < R² when p > 1 and R² < 1 (textbook identity, property)', async (t) => {
  const arb = fc.record({
    n: fc.integer({ min: 4, max: 500 }),
    p: fc.integer({ min: 2, max: 3 }),
    rss: fc.double({ min: 1e-6, max: 99, noNaN: true }),
    intercept: fc.boolean(),
  });
  fc.assert(fc.property(arb, ({ n, p, rss, intercept }) => {
    const c = computeCriteria({ ...base, observations: n, coefficientsIncludingIntercept: p, rss, tss: 100, intercept });
    return c.adjustedR2! < c.r2!;
  }));
});

t.test('undefined quantities are null with a caution, never NaN or Infinity', async (t) => {
  const small = computeCriteria({ ...base, observations: 4 });
  t.equal(small.aicc, null, 'n - k - 1 = 0');
  t.match(small.cautions, [{ code: 'aicc_undefined', quantities: ['aicc'] }]);
  t.match(small.cautions[0].message, /n - k - 1 = 0/);

  const exact = computeCriteria({ ...base, logLikelihood: null, rss: 0 });
  t.same([exact.aic, exact.aicc, exact.bic, exact.hqc], [null, null, null, null]);
  t.equal(exact.r2, 1);
  t.match(exact.cautions, [{ code: 'likelihood_undefined_exact_fit', quantities: ['aic', 'aicc', 'bic', 'hqc'] }]);

  const one = computeCriteria({ ...base, observations: 1, parameters: 1, coefficientsIncludingIntercept: 0 });
  t.equal(one.hqc, null);
  t.ok(one.cautions.some((c) => c.code === 'hqc_undefined'));

  const noSums = computeCriteria({ ...base, rss: null, tss: null });
  t.equal(noSums.r2, null);
  t.equal(noSums.adjustedR2, null);
  t.match(noSums.cautions, [{ code: 'r2_unavailable', quantities: ['r2', 'adjustedR2'] }]);
  t.equal(noSums.aic, 26, 'the likelihood criteria do not need the sums of squares');

  const flat = computeCriteria({ ...base, tss: 0 });
  t.match(flat.cautions, [{ code: 'r2_undefined' }]);

  const saturated = computeCriteria({ ...base, observations: 2 });
  t.equal(saturated.adjustedR2, null);
  t.ok(saturated.cautions.some((c) => c.code === 'adjusted_r2_undefined'));

  const huge = computeCriteria({ ...base, logLikelihood: -1e308 });
  t.equal(huge.aic, null);
  t.ok(huge.cautions.some((c) => c.code === 'value_not_finite'));

  const anyValues = fc.record({
    logLikelihood: fc.option(fc.double(), { nil: null }),
    parameters: fc.integer({ min: 0, max: 50 }),
    observations: fc.integer({ min: 0, max: 60 }),
    rss: fc.option(fc.double(), { nil: null }),
    tss: fc.option(fc.double(), { nil: null }),
    coefficientsIncludingIntercept: fc.option(fc.integer({ min: 0, max: 50 }), { nil: null }),
    intercept: fc.boolean(),
  });
  fc.assert(fc.property(anyValues, (s) => {
    const c = computeCriteria(s);
    return [...CRITERION_NAMES, 'r2' as const].every((q) => c[q] === null || Number.isFinite(c[q]));
  }), { numRuns: 2000 });
});

t.test('the registry: one entry per criterion', async (t) => {
  t.same(CRITERION_NAMES, ['aic', 'aicc', 'bic', 'hqc', 'adjustedR2']);
  t.same(CRITERIA.map((c) => [c.direction, c.weighted]),
    [['smaller', true], ['smaller', true], ['smaller', true], ['smaller', true], ['larger', false]]);
});
