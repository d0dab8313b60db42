// The price of a GLM candidate in the cost model's unit: priceGlm's
// floating-point operations over GLM_FLOPS_PER_UNIT (set from
// scripts/bench-pricing.ts), with the
// design width from the terms as for least squares, and the iterative fit
// dearer than the one least-squares solve of the same shape.
import t from 'tap';
import { CANDIDATE_PRICES } from '../../../../src/core/pricing/index.ts';
import { shapeOfColumns } from '../../../../src/core/pricing/data-shape.ts';
import { priceGlm } from '../../../../src/core/models/glm/index.ts';
import { FIXED_WORK, leastSquaresFit } from '../../../../src/core/pricing/least-squares-cost.ts';
import { GLM_FLOPS_PER_UNIT } from '../../../../src/core/models/glm/price.ts';

const columns = { x: Array.from({ length: 1000 }, (_, i) => i), g: Array.from({ length: 1000 }, (_, i) => ['a', 'b', 'c'][i % 3]) };
const ctx = { shape: shapeOfColumns(columns), fromSummary: false, predictionRows: 0, maxDesignColumns: 50 };

t.test('a GLM candidate costs priceGlm / GLM_FLOPS_PER_UNIT over the fixed cost of a model fitted here', async (t) => {
  const cost = CANDIDATE_PRICES.glm({ form: 'glm', name: 'p', terms: ['x', 'g'], intercept: true, family: 'poisson' }, ctx);
  t.equal(cost.designColumns, 4, 'intercept, x and two columns for a three-level factor');
  const checks = leastSquaresFit(1000, 4).work - leastSquaresFit(1000, 4, false).work;
  t.ok(checks > 0);
  t.equal(cost.fit.work, FIXED_WORK.modelFittedHere + priceGlm({ rows: 1000, columns: 4, family: 'poisson' }) / GLM_FLOPS_PER_UNIT + checks, 'the fit, and its checks priced as least squares prices the same machinery');
  t.same(cost.prediction, { work: 0, heldBytes: 0, passingBytes: 0, resultBytes: 0 }, 'no prediction rows, no prediction cost');
  t.equal(cost.widestTerm, 1, 'the factor makes the widest term');
  const ls = CANDIDATE_PRICES.fit({ form: 'fit', name: 'l', terms: ['x', 'g'], intercept: true }, ctx);
  t.ok(cost.fit.work > ls.fit.work, 'an iterative fit costs more than one least-squares solve');
  const nb = CANDIDATE_PRICES.glm({ form: 'glm', name: 'n', terms: ['x', 'g'], intercept: true, family: 'negativeBinomial' }, ctx);
  t.ok(nb.fit.work > cost.fit.work, 'the negative binomial alternates with θ, so costs more');
});

t.test('means fitted elsewhere cost a pass over them', async (t) => {
  const cost = CANDIDATE_PRICES.fitted({ form: 'fitted', name: 'f', family: 'poisson', fitted: new Array(1000).fill(1), parameters: 2 }, ctx);
  t.equal(cost.designColumns, null);
  t.ok(cost.fit.work < 100_000, `${cost.fit.work}`);
});

t.test('predictions are priced per new row, as least squares and the inverse link', async (t) => {
  const candidate = { form: 'glm' as const, name: 'p', terms: ['x', 'g'], intercept: true, family: 'poisson' as const };
  const none = CANDIDATE_PRICES.glm(candidate, ctx);
  const some = CANDIDATE_PRICES.glm(candidate, { ...ctx, predictionRows: 100 });
  const more = CANDIDATE_PRICES.glm(candidate, { ...ctx, predictionRows: 1000 });
  t.equal(some.fit.work, none.fit.work, 'the fit does not depend on the prediction rows');
  t.ok(some.prediction.work > 100 * FIXED_WORK.predictionRow, `${some.prediction.work}`);
  t.ok(more.prediction.work > 5 * some.prediction.work, 'grows with the rows');
  t.equal(some.prediction.resultBytes, 100 * 256, 'one prediction object per row');
});
