import t from 'tap';
import norris from '../../reference/nist/norris.json' with { type: 'json' };
import { predictMeanResponse } from '../../../src/core/predict.ts';
import { designWithIntercept, makeDesign, referenceFit } from '../inference/reference-fit.ts';

t.test('simple regression: estimate and standard error of the mean follow the textbook formula', async (t) => {
  // se(yhat0) = s sqrt(1/n + (x0 - xbar)^2 / Sxx) (common practice), NIST Norris data.
  const x = norris.data.x, y = norris.data.y, n = x.length;
  const data = designWithIntercept({ x });
  const fit = referenceFit(data, y);
  const xbar = x.reduce((a, b) => a + b, 0) / n;
  const sxx = x.reduce((s, v) => s + (v - xbar) ** 2, 0);
  const at = [0, 150, 500, 1200];
  const { predictions, issues } = predictMeanResponse(fit, data, designWithIntercept({ x: at }));
  t.same(issues, []);
  at.forEach((x0, k) => {
    const estimate = (fit.coefficients[0] as number) + (fit.coefficients[1] as number) * x0;
    const se = fit.sigma! * Math.sqrt(1 / n + (x0 - xbar) ** 2 / sxx);
    t.ok(Math.abs(predictions[k].estimate! - estimate) < 1e-12 * Math.abs(estimate) + 1e-12);
    t.ok(Math.abs(predictions[k].standardError! - se) / se < 1e-10, `x0 = ${x0}`);
  });
});

t.test('weighted fit: a unit row for column j reproduces that coefficient and its standard error', async (t) => {
  const data = designWithIntercept({ x: [1, 2, 3, 4, 5, 6, 7], z: [2, 1, 4, 3, 6, 5, 8] });
  const y = [1.1, 1.9, 3.4, 3.8, 5.6, 5.9, 7.7];
  const w = [1, 0.5, 2, 1, 1, 3, 0.7];
  const fit = referenceFit(data, y, w);
  const unit = makeDesign(data.labels, [[1, 0, 0], [0, 1, 0], [0, 0, 1]], true);
  const { predictions } = predictMeanResponse(fit, data, unit, w);
  predictions.forEach((p, j) => {
    t.ok(Math.abs(p.estimate! - (fit.coefficients[j] as number)) < 1e-12);
    t.ok(Math.abs(p.standardError! - (fit.standardErrors[j] as number)) / (fit.standardErrors[j] as number) < 1e-10);
  });
});

t.test('rows that break an exact relation among columns are not estimable', async (t) => {
  const x = [1, 2, 3, 4, 5, 6], z = [3, 1, 4, 1, 5, 9];
  const data = designWithIntercept({ x, z, total: x.map((v, i) => v + z[i]) });
  const fit = referenceFit(data, [2, 2.5, 4.1, 3.9, 6.2, 8.8]);
  t.same(fit.aliased, ['total']);
  const rows = designWithIntercept({ x: [2, 2], z: [3, 3], total: [5, 6] });
  const { predictions, issues } = predictMeanResponse(fit, data, rows);
  t.ok(predictions[0].estimate !== null);
  t.equal(predictions[1].estimate, null);
  t.same(issues.map((i) => i.code), ['prediction-not-estimable']);
  const mismatch = predictMeanResponse(fit, data, designWithIntercept({ x: [1] }));
  t.same(mismatch.issues.map((i) => i.code), ['prediction-columns-differ']);
});
