// The statistics after the ranking for a nonlinear fit: identities of the
// linearised model (common practice: the hat matrix of the Jacobian is a
// projection, so its trace is p and each leverage lies in [0, 1]; a
// prediction at a data row is the fitted value with standard error
// s sqrt(h_i / w_i)), and the residual checks on the standardised residuals.
// Numbers against outside references are in scipy-random.test.ts
// (predictions) and linear-equivalence.test.ts (leverages, PRESS).
import t from 'tap';
import { fitPlain, fitted } from './fit-helper.ts';
import {
  nonlinearLeaveOneOut, nonlinearLeverages, nonlinearResidualChecks, predictNonlinear, LEAVE_ONE_OUT_APPROXIMATION,
} from '../../../../src/core/models/nonlinear/index.ts';
import { jarqueBera, durbinWatson } from '../../../../src/core/diagnostics/index.ts';

// A saturating response of our own making: a kiln's board temperature
// approaching the air temperature over hours, with deterministic scatter.
const hours = Array.from({ length: 24 }, (_, i) => 0.5 * (i + 1));
const scatter = hours.map((_, i) => 0.6 * Math.sin(3.1 * i) + 0.3 * Math.cos(5.3 * i));
const temperature = hours.map((h, i) => 85 - 65 * Math.exp(-0.35 * h) + scatter[i]);
const weights = hours.map((_, i) => 0.5 + (i % 4) / 2);

const { fit, candidate } = fitted(fitPlain({
  spec: { name: 'approach', expression: 'air - (air - start)*exp(-k*hours)', start: { air: 80, start: 25, k: 0.2 } },
  columns: { hours }, y: temperature, weights,
}));

t.test('leverages: a projection of rank p', async (t) => {
  const h = nonlinearLeverages(fit);
  const trace = h.reduce((s, v) => s + v, 0);
  t.ok(Math.abs(trace - 3) < 1e-12, `trace ${trace} = p`);
  t.ok(h.every((v) => v > 0 && v < 1));
});

t.test('linearised leave-one-out error', async (t) => {
  const loo = nonlinearLeaveOneOut(fit);
  const h = nonlinearLeverages(fit);
  const press = fit.residuals.reduce((s, e, i) => s + weights[i] * (e / (1 - h[i])) ** 2, 0);
  t.ok(Math.abs(loo.press! - press) <= 1e-12 * press);
  t.ok(Math.abs(loo.looRmse! - Math.sqrt(press / weights.reduce((a, b) => a + b, 0))) < 1e-12);
  t.ok(loo.press! > fit.rss, 'leaving rows out predicts worse than fitting them');
  t.equal(loo.approximation, LEAVE_ONE_OUT_APPROXIMATION);
  t.match(loo.approximation, /Linearised/);
});

t.test('predictions at the data rows are the fitted values, with s sqrt(h/w)', async (t) => {
  const { predictions, issues } = predictNonlinear(fit, candidate, [Float64Array.from(hours)], hours.length);
  t.same(issues, []);
  const h = nonlinearLeverages(fit);
  predictions.forEach((p, i) => {
    t.ok(Math.abs(p.estimate! - fit.fitted[i]) <= 1e-12 * Math.abs(fit.fitted[i]));
    const se = fit.sigma * Math.sqrt(h[i] / weights[i]);
    t.ok(Math.abs(p.standardError! - se) <= 1e-10 * se);
    t.ok(p.lower! < p.estimate! && p.estimate! < p.upper!);
  });
  // The interval is estimate ± t(0.975; n - p) se; t(0.975; 21) = 2.0796 (scipy.stats.t.ppf: 2.0796138).
  const p0 = predictions[0];
  t.ok(Math.abs((p0.upper! - p0.estimate!) / p0.standardError! - 2.0796) < 1e-4);
});

t.test('a prediction row outside the expression\'s domain gets nulls and an issue', async (t) => {
  const logCandidate = fitted(fitPlain({
    spec: { name: 'logarithmic', expression: 'a + b*log(hours)', start: { a: 1, b: 1 } }, columns: { hours }, y: temperature,
  }));
  const { predictions, issues } = predictNonlinear(logCandidate.fit, logCandidate.candidate, [Float64Array.of(2, -1, 0)], 3);
  t.ok(predictions[0].estimate !== null);
  t.same(predictions.slice(1), [
    { estimate: null, standardError: null, lower: null, upper: null },
    { estimate: null, standardError: null, lower: null, upper: null },
  ]);
  t.match(issues, [{ code: 'prediction-not-finite', facts: { rows: '1, 2' } }]);
});

t.test('residual checks use the standardised residuals', async (t) => {
  const checks = nonlinearResidualChecks(fit);
  const standardised = fit.residuals.map((e, i) => Math.sqrt(weights[i]) * e);
  t.same(checks.normality, jarqueBera(standardised));
  t.equal(checks.durbinWatson, durbinWatson(standardised));
  t.equal(checks.heteroscedasticity.df, 1);
  t.ok(checks.heteroscedasticity.pValue! > 0 && checks.heteroscedasticity.pValue! <= 1);
  t.equal(checks.cooksDistances.length, hours.length);
  t.ok(checks.cooksDistances.every((d) => d !== null && d >= 0));
});

t.test('the coefficient table: t, p and intervals with n - p degrees of freedom', async (t) => {
  for (const c of fit.coefficients) {
    t.ok(Math.abs(c.tStatistic! - c.estimate / c.standardError!) < 1e-12 * Math.abs(c.tStatistic!));
    t.ok(c.pValue! >= 0 && c.pValue! <= 1);
    t.ok(Math.abs((c.upper! - c.lower!) / (2 * c.standardError!) - 2.0796) < 1e-4, 't(0.975; 21) = 2.0796');
  }
  t.equal(fit.residualDf, 21);
  t.equal(fit.intervalLevel, 0.95);
  // The covariance is s² (J'WJ)^-1, and its diagonal gives the standard errors.
  fit.coefficients.forEach((c, j) => t.ok(Math.abs(Math.sqrt(fit.covariance[j][j]) - c.standardError!) <= 1e-14 * c.standardError!));
});
