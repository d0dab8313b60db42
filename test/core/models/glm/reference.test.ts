// Generalised linear models against R: every fitted case of
// test/reference/glm/glm-reference.json (R's glm, MASS's glm.nb machinery and
// gamma.shape, run by scripts/glm-reference.R; versions in the file), plus
// published values for the beetle data of Bliss (1935) quoted from memory.
import t from 'tap';
import {
  glmInfluence, glmNestedTest, glmResiduals, predictGlm, logBinomialCoefficient, fitGlm,
} from '../../../../src/core/models/glm/index.ts';
import { buildDesign } from '../../../../src/core/design/index.ts';
import type { Columns } from '../../../../src/core/types.ts';
import { FITTED_CASES, REFERENCE, fitCase, referenceCase, relativeError, worstRelativeError } from './reference-data.ts';

t.test(`reference fits (${REFERENCE.generatedWith})`, async (t) => {
  for (const name of FITTED_CASES) {
    t.test(name, async (t) => {
      const c = referenceCase(name);
      const { fit, design } = fitCase(c);
      t.equal(fit.family, c.family);
      t.equal(fit.link, c.link);
      t.equal(fit.convergence.converged, true);
      if (c.coefficientBasis) {
        // R fitted an orthogonal basis of the same column space: only basis-free numbers compare.
        t.ok(fit.conditionNumber! > 225, `condition ${fit.conditionNumber}: the extended covariance route`);
      } else {
        t.same(fit.coefficients.map((x) => x.term), c.coefficients.map((x) => x.term), 'same columns in the same order');
        t.ok(worstRelativeError(fit.coefficients.map((x) => x.estimate), c.coefficients.map((x) => x.estimate)) < 1e-9, 'estimates to 1e-9');
        t.ok(worstRelativeError(fit.coefficients.map((x) => x.standardError), c.coefficients.map((x) => x.standardError)) < 1e-9, 'standard errors to 1e-9');
      }
      t.ok(relativeError(fit.deviance, c.deviance) < 1e-10, `deviance ${fit.deviance} vs ${c.deviance}`);
      t.ok(relativeError(fit.nullDeviance, c.nullDeviance) < 1e-10, 'null deviance');
      t.ok(relativeError(fit.pearsonChiSquare, c.pearsonChiSquare) < 1e-10, 'Pearson chi-square');
      t.ok(relativeError(fit.logLikelihood, c.logLikelihood) < 1e-12, `log-likelihood ${fit.logLikelihood} vs ${c.logLikelihood}`);
      t.equal(fit.parameters, c.parameters, 'k');
      t.ok(relativeError(-2 * fit.logLikelihood! + 2 * fit.parameters, c.aic) < 1e-12, 'AIC');
      t.ok(relativeError(fit.dispersion.value, c.dispersion) < 1e-10, 'dispersion used for standard errors');
      if (c.distributionParameter) {
        const [p] = fit.distributionParameters;
        t.equal(p.name, c.distributionParameter.name);
        t.ok(relativeError(p.estimate, c.distributionParameter.estimate) < 1e-10, `${p.name} ${p.estimate}`);
        t.ok(relativeError(p.standardError, c.distributionParameter.standardError) < 1e-9, `${p.name} standard error`);
      } else {
        t.same(fit.distributionParameters, []);
      }
      t.equal(fit.measure, c.family === 'binomial' || c.family === 'poisson' || c.family === 'negativeBinomial' ? 'mass' : 'density');
      t.ok(relativeError(fit.devianceExplained, 1 - c.deviance / c.nullDeviance) < 1e-10, 'deviance explained');

      const influence = glmInfluence(fit, design);
      t.ok(worstRelativeError(influence.leverages, c.leverages) < 1e-9, 'leverages (R hatvalues)');
      t.ok(worstRelativeError(influence.cooksDistances, c.cooksDistances) < 1e-8, 'Cook\'s distances (R cooks.distance)');
      const residuals = glmResiduals(fit);
      t.ok(worstRelativeError(residuals.deviance, c.devianceResiduals) < 1e-8, 'deviance residuals');
      t.ok(worstRelativeError(residuals.pearson, c.pearsonResiduals) < 1e-8, 'Pearson residuals');

      if (c.prediction) {
        const rows = [...Object.values(c.prediction.rows)[0].keys()];
        // New rows go through the builder with the data's factor levels: stack them under the data.
        const stacked: Columns = Object.fromEntries(Object.keys(c.prediction.rows).map((k) => [k, [...c.data[k], ...c.prediction!.rows[k]]]));
        const built = buildDesign(stacked, c.terms, true, rows.map((i) => i + design.rows));
        if ('issues' in built) throw new Error(built.issues[0].message);
        const { predictions } = predictGlm(fit, design, built.design, {
          offset: c.prediction.offset ? Float64Array.from(c.prediction.offset) : undefined,
        });
        t.ok(worstRelativeError(predictions.map((p) => p.link!.estimate), c.prediction.link) < 1e-9, 'link-scale predictions (R predict.glm)');
        t.ok(worstRelativeError(predictions.map((p) => p.link!.standardError), c.prediction.standardError) < 1e-9, 'their standard errors');
      }
    });
  }
});

// Dobson & Barnett, An Introduction to Generalized Linear Models (3rd ed.,
// 2008), the beetle mortality example of chapter 7 — values quoted from memory, to the
// digits printed there.
t.test('Bliss (1935) beetles: published estimates and deviances (from memory)', async (t) => {
  const published = {
    logit: { b: [-60.72, 34.27], se: [5.18, 2.91], deviance: 11.23 },
    probit: { b: [-34.94, 19.73], se: [2.65, 1.49], deviance: 10.12 },
    cloglog: { b: [-39.57, 22.04], se: [3.24, 1.80], deviance: 3.45 },
  };
  for (const [link, values] of Object.entries(published)) {
    const { fit } = fitCase(referenceCase(`beetle-${link}`));
    fit.coefficients.forEach((c, j) => {
      t.equal(Number(c.estimate!.toFixed(2)), values.b[j], `${link} ${c.term}`);
      t.equal(Number(c.standardError!.toFixed(2)), values.se[j], `${link} ${c.term} standard error`);
    });
    t.equal(Number(fit.deviance.toFixed(2)), values.deviance, `${link} deviance`);
  }
});

t.test('0/1 logistic equals the grouped binomial; log-likelihoods differ by exactly Σ ln C(m, y)', async (t) => {
  const grouped = referenceCase('beetle-logit');
  const ungrouped = REFERENCE.cases['beetle-logit-ungrouped'] as unknown as {
    coefficients: { estimate: number; standardError: number }[]; logLikelihood: number; deviance: number; sumLogBinomialCoefficients: number; rows: number;
  };
  const dose: number[] = [];
  const dead: number[] = [];
  (grouped.data.exposed as number[]).forEach((m, i) => {
    const y = grouped.data.killed[i] as number;
    for (let k = 0; k < m; k++) {
      dose.push(grouped.data.dose[i] as number);
      dead.push(k < y ? 1 : 0);
    }
  });
  t.equal(dead.length, ungrouped.rows);
  const built = buildDesign({ dose }, ['dose'], true, [...dose.keys()]);
  if ('issues' in built) throw new Error('design');
  const each = fitGlm({ family: 'binomial', design: built.design, response: Float64Array.from(dead) });
  if ('issues' in each) throw new Error(each.issues[0].message);
  const { fit: groups } = fitCase(grouped);
  each.coefficients.forEach((c, j) => {
    t.ok(relativeError(c.estimate, groups.coefficients[j].estimate!) < 1e-10, `${c.term} equals the grouped estimate`);
    t.ok(relativeError(c.standardError, groups.coefficients[j].standardError!) < 1e-9, `${c.term} standard error equals the grouped one`);
    t.ok(relativeError(c.estimate, ungrouped.coefficients[j].estimate) < 1e-9, `${c.term} against R's 0/1 fit`);
  });
  const sumLogC = (grouped.data.exposed as number[]).reduce((s, m, i) => s + logBinomialCoefficient(m, grouped.data.killed[i] as number), 0);
  t.ok(relativeError(sumLogC, ungrouped.sumLogBinomialCoefficients) < 1e-13, 'Σ ln C(m, y) against R lchoose');
  t.ok(Math.abs(groups.logLikelihood! - each.logLikelihood! - sumLogC) < 1e-10, `grouped - ungrouped = Σ ln C: ${groups.logLikelihood! - each.logLikelihood!} vs ${sumLogC}`);
  t.ok(relativeError(each.logLikelihood, ungrouped.logLikelihood) < 1e-12, 'ungrouped log-likelihood against R');
  t.equal(each.observations, 481, 'n counts rows: 481 beetles');
  t.equal(groups.observations, 8, 'n counts rows: 8 groups');
});

t.test('nested tests against R anova', async (t) => {
  const cases = { 'seams-poisson-lr': 'seams-poisson-offset', 'valves-negative-binomial-lr': 'valves-negative-binomial', 'pumps-gamma-f': 'pumps-gamma-log' } as const;
  for (const [testName, caseName] of Object.entries(cases)) {
    const ref = REFERENCE.tests[testName];
    const c = referenceCase(caseName);
    const small = fitCase(c, ref.smaller);
    const large = fitCase(c, ref.larger);
    const test = glmNestedTest(
      { name: 'smaller', keys: small.design.keys!, fit: small.fit, sample: caseName },
      { name: 'larger', keys: large.design.keys!, fit: large.fit, sample: caseName },
    );
    t.equal(test.df, ref.df, `${testName} df`);
    if (testName === 'pumps-gamma-f') {
      t.ok(relativeError(test.fStatistic, ref.statistic) < 1e-9, `F ${test.fStatistic} vs ${ref.statistic}`);
      t.ok(relativeError(test.fPValue, ref.pValue) < 1e-8, 'F p-value');
      t.equal(test.residualDf, ref.residualDf);
    } else {
      t.ok(relativeError(test.lrStatistic, ref.statistic) < 1e-9, `LR ${test.lrStatistic} vs ${ref.statistic}`);
      t.ok(relativeError(test.lrPValue, ref.pValue) < 1e-8, 'LR p-value');
      t.equal(test.fStatistic, null, 'no F test where the dispersion is fixed');
    }
  }
});
