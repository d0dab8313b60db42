// Statistics after the ranking that have no R fixture of their own: QAIC and
// ĉ (Burnham & Anderson 2002, §2.5: QAIC = -2 ℓ/ĉ + 2k, QAICc adds
// 2k(k+1)/(n-k-1), k counting ĉ), the Gaussian nested tests against the
// least-squares ones, predictions on the mean scale, warm starts and the
// price of a fit.
import t from 'tap';
import {
  estimateCHat, fitGlm, glmNestedTest, glmNestingOrder, overdispersion, predictGlm, priceGlm, quasiCriteria, type GlmFit,
} from '../../../../src/core/models/glm/index.ts';
import { leanStepFlops } from '../../../../src/core/models/glm/pricing.ts';
import { fitLeastSquares } from '../../../../src/core/fit/index.ts';
import { nestedTest } from '../../../../src/core/inference/nested.ts';
import { design } from './glm-fixtures.ts';
import { fitCase, referenceCase, relativeError } from './reference-data.ts';

t.test('QAIC and QAICc by their formulas; k counts ĉ', async (t) => {
  const q = quasiCriteria({ logLikelihood: -100, parameters: 4, observations: 50 }, 2);
  t.equal(q.parameters, 5);
  t.equal(q.qaic, 200 / 2 + 2 * 5);
  t.ok(relativeError(q.qaicc, 110 + (2 * 5 * 6) / (50 - 5 - 1)) < 1e-15);
  const one = quasiCriteria({ logLikelihood: -100, parameters: 4, observations: 50 }, 1);
  t.equal(one.qaic, 200 + 2 * 5, 'ĉ = 1: AIC plus 2 for the counted ĉ');
  t.equal(quasiCriteria({ logLikelihood: -10, parameters: 4, observations: 6 }, 1.5).qaicc, null, 'n - k - 1 = 0');
  t.equal(quasiCriteria({ logLikelihood: null, parameters: 4, observations: 50 }, 1.5).qaic, null);
  t.equal(quasiCriteria({ logLikelihood: -10, parameters: 4, observations: 50 }, 0).qaic, null, 'ĉ must be positive');
});

t.test('ĉ = Pearson χ² / (n - rank), against R\'s Pearson χ² of the same fit', async (t) => {
  const c = referenceCase('seams-poisson-offset');
  const { fit } = fitCase(c);
  const estimate = estimateCHat(fit)!;
  t.equal(estimate.df, 60 - 4);
  t.ok(relativeError(estimate.cHat, c.pearsonChiSquare / 56) < 1e-10);
  t.equal(estimate.belowOne, estimate.cHat < 1);
  t.equal(overdispersion(fit).ratio, estimate.cHat);
  t.equal(estimateCHat({ pearsonChiSquare: 3, residualDf: 0 }), null);
});

t.test('Gaussian identity: the nested tests are the least-squares F and LR tests', async (t) => {
  const x1 = [1.2, 2.3, 3.1, 4.8, 5.5, 6.1, 7.9, 8.4, 9.0, 10.7, 11.2, 12.6];
  const x2 = [5.1, 3.2, 6.6, 2.4, 7.9, 4.5, 6.0, 3.3, 8.8, 2.1, 5.5, 7.2];
  const y = x1.map((v, i) => 3 + 0.8 * v + 0.1 * x2[i] + [0.4, -0.3, 0.2, -0.5, 0.1, 0.6, -0.2, 0.3, -0.4, 0.5, -0.1, 0.2][i]);
  const small = design({ x1 }, ['x1']);
  const large = design({ x1, x2 }, ['x1', 'x2']);
  const fit = (d: typeof small) => fitGlm({ family: 'gaussian', design: d, response: Float64Array.from(y) }) as GlmFit;
  const a = { name: 'small', keys: small.keys!, fit: fit(small), sample: 's' };
  const b = { name: 'large', keys: large.keys!, fit: fit(large), sample: 's' };
  const order = glmNestingOrder(b, a);
  t.ok('smaller' in order && order.smaller.name === 'small', 'oriented smaller first');
  const glm = glmNestedTest(a, b);
  const ls = nestedTest(
    { name: 'small', keys: small.keys!, fit: fitLeastSquares(small, Float64Array.from(y)), sample: 's' },
    { name: 'large', keys: large.keys!, fit: fitLeastSquares(large, Float64Array.from(y)), sample: 's' },
  );
  t.ok(relativeError(glm.fStatistic, ls.fStatistic!) < 1e-12, 'F');
  t.ok(relativeError(glm.fPValue, ls.fPValue!) < 1e-11, 'F p-value');
  t.ok(relativeError(glm.lrStatistic, ls.lrStatistic!) < 1e-9, 'LR');
  t.equal(glm.df, ls.df);
  t.equal(glm.residualDf, ls.residualDf);
  const other = fitGlm({ family: 'gaussian', link: 'log', design: large, response: Float64Array.from(y) }) as GlmFit;
  t.match(glmNestingOrder(a, { name: 'log', keys: large.keys!, fit: other, sample: 's' }), { reason: /family or link/ });
  t.match(glmNestingOrder(a, { ...b, sample: 'other rows' }), { reason: /same sample/ });
});

t.test('predictions on the mean scale: the inverse link of the link-scale interval', async (t) => {
  const c = referenceCase('pumps-gamma-inverse');
  const { fit, design: X } = fitCase(c);
  const { predictions } = predictGlm(fit, X, X, { level: 0.9 });
  predictions.forEach((p, i) => {
    t.ok(relativeError(p.mean!.estimate, fit.fitted[i]) < 1e-12, `row ${i}: the fitted mean`);
    // The inverse link is decreasing: the upper η end gives the lower mean.
    t.ok(relativeError(p.mean!.lower, 1 / p.link!.upper!) < 1e-15 && relativeError(p.mean!.upper, 1 / p.link!.lower!) < 1e-15);
    t.ok(relativeError(p.mean!.standardError, p.link!.standardError! / (p.link!.estimate * p.link!.estimate)) < 1e-12, 'delta method');
    t.ok(relativeError(p.link!.upper! - p.link!.estimate, 1.6448536269514722 * p.link!.standardError!) < 1e-12, 'normal quantile 0.95 (tables)');
  });
});

t.test('warm starts reach the same fit in fewer solves', async (t) => {
  const c = referenceCase('beetle-probit');
  const { fit, design: X } = fitCase(c);
  const start = new Map(fit.coefficients.map((b) => [b.term, b.estimate!]));
  const warm = fitGlm({
    family: 'binomial', link: 'probit', design: X, start,
    response: Float64Array.from(c.data.killed as number[]), trials: Float64Array.from(c.data.exposed as number[]),
  }) as GlmFit;
  t.ok(warm.coefficients.every((b, j) => relativeError(b.estimate, fit.coefficients[j].estimate!) < 1e-10));
  t.ok(warm.convergence.iterations < fit.convergence.iterations, `${warm.convergence.iterations} < ${fit.convergence.iterations}`);
  // A search refits a subset from its parent: the child's columns start at the parent's values.
  const seams = referenceCase('seams-poisson-offset');
  const parent = fitCase(seams).fit;
  const child = fitCase(seams, ['current']);
  const warmChild = fitGlm({
    family: 'poisson', design: child.design, start: new Map(parent.coefficients.map((b) => [b.term, b.estimate!])),
    response: Float64Array.from(seams.data.defects as number[]), offset: Float64Array.from(seams.data.logLength as number[]),
  }) as GlmFit;
  t.ok(warmChild.coefficients.every((b, j) => relativeError(b.estimate, child.fit.coefficients[j].estimate!) < 1e-10), 'same child fit');
  // A start outside the family's range falls back to the starting means.
  const bad = fitGlm({
    family: 'gamma', link: 'inverse', design: X, start: new Map([['intercept', -5]]),
    response: Float64Array.from([3, 2, 4, 1.5, 2.2, 3.3, 1.1, 0.9]),
  });
  t.notOk('issues' in bad, 'an invalid warm start is not an error');
});

t.test('pricing grows with the work and bounds the iterations the fit may take', async (t) => {
  const base = { rows: 10_000, columns: 10, family: 'binomial' as const };
  const p = priceGlm(base);
  t.ok(priceGlm({ ...base, rows: 20_000 }) > 1.9 * p, 'linear in rows');
  t.ok(priceGlm({ ...base, columns: 60 }) > 2.5 * priceGlm({ ...base, columns: 30 }), 'the n p² of the QR dominates at width');
  t.equal(priceGlm({ ...base, maxIterations: 50 }) - p, 25 * (leanStepFlops(10_000, 10) + leanStepFlops(10_000, 1)), 'each allowed solve adds one step of the model and of its null model');
  t.ok(priceGlm({ ...base, family: 'negativeBinomial' }) > 3 * priceGlm({ ...base, family: 'poisson' }), 'the negative binomial alternates');
  t.ok(priceGlm({ ...base, family: 'gaussian' }) < p, 'the Gaussian identity model is one least-squares solve');
  t.ok(priceGlm({ ...base, family: 'gaussian', link: 'log' }) > priceGlm({ ...base, family: 'gaussian' }));
  // The cap the price assumes is the cap the fit obeys.
  const c = referenceCase('beetle-cloglog');
  for (const cap of [1, 3, 6]) {
    const out = fitGlm({
      family: 'binomial', link: 'cloglog', design: fitCase(c).design, maxIterations: cap,
      response: Float64Array.from(c.data.killed as number[]), trials: Float64Array.from(c.data.exposed as number[]),
    });
    t.equal('issues' in out ? out.issues[0].code : 'fitted', 'glm_not_converged', `stops at ${cap}`);
  }
});

t.test('aliased columns are reported as least squares reports them', async (t) => {
  const hours = [2, 4, 6, 8, 10, 12, 14, 16, 18, 20];
  const minutes = hours.map((h) => 60 * h);
  const line = ['a', 'a', 'b', 'b', 'c', 'c', 'a', 'b', 'c', 'a'];
  const X = design({ hours, minutes, line }, ['hours', 'minutes', 'line']);
  const y = [1, 3, 2, 5, 4, 8, 6, 7, 9, 12];
  const fit = fitGlm({ family: 'poisson', design: X, response: Float64Array.from(y) }) as GlmFit;
  const ls = fitLeastSquares(X, Float64Array.from(y));
  t.same(fit.aliased, ls.aliased, 'the same columns, by the same rule');
  t.same(fit.aliased, ['minutes']);
  t.equal(fit.parameters, fit.rank, 'k counts the estimable coefficients');
  t.equal(fit.rank, 4);
  const minutesColumn = fit.coefficients.find((c) => c.term === 'minutes')!;
  t.same([minutesColumn.estimate, minutesColumn.standardError], [null, null]);
  t.same(fit.covariance.terms, ['intercept', 'hours', 'line=b', 'line=c']);
  t.match(fit.cautions.map((c) => c.code), ['aliased_columns']);
  // The same model without the aliased column: identical estimates.
  const plain = fitGlm({ family: 'poisson', design: design({ hours, line }, ['hours', 'line']), response: Float64Array.from(y) }) as GlmFit;
  t.ok(plain.coefficients.every((c) => relativeError(c.estimate, fit.coefficients.find((d) => d.term === c.term)!.estimate!) < 1e-12));
  t.ok(relativeError(plain.logLikelihood, fit.logLikelihood!) < 1e-14);
});
