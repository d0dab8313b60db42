// The convention against R's nls (package stats; test/reference/nonlinear/r-nls.json,
// made by scripts/nonlinear-r-fixtures.R, R version in the file): estimates and
// standard errors; logLik, which R computes as the full Gaussian
// maximum-likelihood value with every constant and, with weights,
// + Σ ln w / 2 — the service's convention; AIC and BIC with k = parameters + 1;
// and anova()'s extra-sum-of-squares F test of a nested pair.
// R stops at its relative-offset tolerance (1e-8 there), so estimates are
// compared in units of their standard error (to 1e-5) and the likelihood,
// which is stationary at the minimum, to 1e-9.
import t from 'tap';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { fitPlain, fitted } from './fit-helper.ts';
import { extraSumOfSquaresTest } from '../../../../src/core/models/nonlinear/index.ts';

interface RFit {
  expression: string;
  start: Record<string, number>;
  estimates: number[];
  standardErrors: number[];
  rss: number;
  logLik: number;
  df: number;
  aic: number;
  bic: number;
}

const fixture = JSON.parse(readFileSync(fileURLToPath(new URL('../../../reference/nonlinear/r-nls.json', import.meta.url)), 'utf8'));
const data = fixture.data as { hours: number[]; moisture: number[]; weight: number[] };
const fits = fixture.fits as Record<'larger' | 'smaller' | 'weighted', RFit>;

function ours(name: keyof typeof fits) {
  const r = fits[name];
  return fitted(fitPlain({
    spec: { name, expression: r.expression, start: r.start },
    columns: { hours: data.hours },
    y: data.moisture,
    weights: name === 'weighted' ? data.weight : null,
  })).fit;
}

for (const name of ['larger', 'smaller', 'weighted'] as const) {
  t.test(`${name} against ${fixture.versions.R}`, async (t) => {
    const r = fits[name];
    const fit = ours(name);
    fit.coefficients.forEach((c, j) => {
      t.ok(Math.abs(c.estimate - r.estimates[j]) <= 1e-5 * r.standardErrors[j], `${c.term} estimate`);
      t.ok(Math.abs((c.standardError ?? NaN) - r.standardErrors[j]) <= 1e-6 * r.standardErrors[j], `${c.term} standard error`);
    });
    t.ok(Math.abs(fit.rss - r.rss) <= 1e-9 * r.rss, 'RSS');
    t.equal(fit.parameters, r.df, 'k counts the error variance, as logLik\'s df does');
    const logLik = fit.logLikelihood!;
    t.ok(Math.abs(logLik - r.logLik) <= 1e-9 * Math.abs(r.logLik), `logLik ${logLik} (R ${r.logLik})`);
    const n = fit.observations;
    t.ok(Math.abs(-2 * logLik + 2 * fit.parameters - r.aic) <= 1e-9 * Math.abs(r.aic), 'AIC');
    t.ok(Math.abs(-2 * logLik + Math.log(n) * fit.parameters - r.bic) <= 1e-9 * Math.abs(r.bic), 'BIC');
  });
}

t.test('extra-sum-of-squares F test against anova()', async (t) => {
  const larger = ours('larger');
  const smaller = ours('smaller');
  const facts = (fit: typeof larger) => ({
    name: fit.name, rss: fit.rss, meanParameters: fit.estimates.length, observations: fit.observations, sample: 'drying', exactFit: fit.exactFit,
  });
  const result = extraSumOfSquaresTest(facts(smaller), facts(larger));
  if (!('test' in result)) throw new Error(result.issue.message);
  const { test } = result;
  t.equal(test.df, fixture.anova.df);
  t.equal(test.residualDf, fixture.anova.residualDf);
  t.ok(Math.abs(test.fStatistic! - fixture.anova.F) <= 1e-8 * fixture.anova.F, `F ${test.fStatistic} (R ${fixture.anova.F})`);
  t.ok(Math.abs(test.fPValue! - fixture.anova.p) <= 1e-6 * fixture.anova.p, `p ${test.fPValue} (R ${fixture.anova.p})`);
  // The likelihood-ratio statistic is 2 (logL_l - logL_s) under the one convention.
  t.ok(Math.abs(test.lrStatistic! - 2 * (larger.logLikelihood! - smaller.logLikelihood!)) <= 1e-9 * test.lrStatistic!);

  const swapped = extraSumOfSquaresTest(facts(larger), facts(smaller));
  t.ok('issue' in swapped && /more/.test(swapped.issue.message), 'the larger model must have more parameters');
  const otherSample = extraSumOfSquaresTest({ ...facts(smaller), sample: 'other' }, facts(larger));
  t.ok('issue' in otherSample, 'different samples are refused');
  const worse = extraSumOfSquaresTest(facts(smaller), { ...facts(larger), rss: smaller.rss * 1.01 });
  t.ok('issue' in worse && /local minimum/.test(worse.issue.message), 'a larger model fitting worse is refused with the likely reasons');
});
