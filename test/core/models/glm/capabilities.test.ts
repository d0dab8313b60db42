// What a GLM offers after the ranking (src/core/models/glm/capabilities.ts and
// model-checks.ts), against R 4.2 (test/reference/glm/glm-reference.json, made
// by scripts/glm-reference.R; versions in the file): the standardised deviance
// residuals, Pearson's goodness-of-fit test, the mean with its link-scale
// interval mapped back (R predict.glm + family$linkinv), and deviance and F
// tests (R anova.glm) through the nesting seam.
import t from 'tap';
import { buildDesign } from '../../../../src/core/design/index.ts';
import { glmInfluence, glmResiduals } from '../../../../src/core/models/glm/index.ts';
import { glmModelPredictions } from '../../../../src/core/models/glm/capabilities.ts';
import { glmModelChecks, overdispersionCheck, standardisedDevianceResiduals } from '../../../../src/core/models/glm/model-checks.ts';
import { glmNestingOffer } from '../../../../src/core/models/glm/nested-tests.ts';
import { testNestingOffers } from '../../../../src/core/inference/nesting-offers.ts';
import { LEAST_SQUARES_NESTING } from '../../../../src/core/inference/nested.ts';
import { fitLeastSquares } from '../../../../src/core/fit/index.ts';
import { durbinWatson, jarqueBera } from '../../../../src/core/diagnostics/index.ts';
import type { Columns } from '../../../../src/core/types.ts';
import { FITTED_CASES, REFERENCE, fitCase, referenceCase, relativeError, worstRelativeError } from './reference-data.ts';

const FIXED = new Set(['binomial', 'poisson', 'negativeBinomial']);

t.test(`checks against R (${REFERENCE.generatedWith})`, async (t) => {
  for (const name of FITTED_CASES) {
    const c = referenceCase(name);
    const { fit, design } = fitCase(c);
    const { leverages } = glmInfluence(fit, design);
    const r = standardisedDevianceResiduals(fit, glmResiduals(fit).deviance, leverages);
    t.ok(worstRelativeError(r, c.standardisedDevianceResiduals) < 1e-8, `${name}: standardised deviance residuals`);
    const o = overdispersionCheck(fit, c.trials !== null);
    t.ok(relativeError(o.ratio, c.pearsonChiSquare / (design.rows - fit.rank)) < 1e-10, `${name}: Pearson χ²/df`);
    if (FIXED.has(c.family)) {
      t.ok(relativeError(o.pValue, c.pearsonPValue) < 1e-8, `${name}: Pearson p ${o.pValue} vs R ${c.pearsonPValue}`);
      t.ok(relativeError(o.threshold, c.overdispersionThreshold) < 1e-10, `${name}: threshold (R qchisq(0.95, df)/df)`);
      t.equal(o.passed, c.pearsonPValue >= 0.05);
    } else {
      t.same([o.threshold, o.pValue, o.passed], [null, null, null], `${name}: the family estimates its dispersion, nothing to check`);
      t.match(o.note, /estimates its dispersion/);
    }
    // The report's summary of the same numbers, rows as the data's.
    const rows = Array.from({ length: design.rows }, (_, i) => 100 + i);
    const checks = glmModelChecks(fit, design, { rows, grouped: c.trials !== null });
    const influence = checks.diagnostics.influence;
    const maxCook = Math.max(...c.cooksDistances);
    t.ok(relativeError(influence.maxCooksDistance, maxCook) < 1e-8, `${name}: largest Cook's distance`);
    t.equal(influence.maxCooksDistanceRow, 100 + c.cooksDistances.indexOf(maxCook), 'its data row');
    const cut = (2 * fit.rank) / design.rows;
    t.same(influence.highLeverageRowIndices, c.leverages.flatMap((h, i) => (h > cut ? [100 + i] : [])), `${name}: rows above 2p/n (R hatvalues)`);
    const largest = Math.max(...c.standardisedDevianceResiduals.map(Math.abs));
    t.ok(relativeError(checks.diagnostics.glm!.devianceResiduals.maxAbsolute, largest) < 1e-8, `${name}: largest |r|`);
    t.same(checks.diagnostics.glm!.devianceResiduals.largeRowIndices, c.standardisedDevianceResiduals.flatMap((v, i) => (Math.abs(v) > 3 ? [100 + i] : [])));
    t.same([checks.press, checks.looRmse], [null, null], 'no leave-one-out');
    t.match(checks.looNote, /new IRLS fit/);
    if (c.family !== 'gaussian') t.equal(checks.diagnostics.residualNormality.passed, null, 'no normality check outside the Gaussian family');
    else {
      // Gaussian family: Jarque–Bera on the Pearson residuals, here against the same statistic of R's residuals(type = "pearson").
      const fromR = jarqueBera(c.pearsonResiduals);
      t.ok(relativeError(checks.diagnostics.residualNormality.statistic, fromR.statistic!) < 1e-8, `${name}: Jarque–Bera on the Pearson residuals`);
    }
    t.ok(relativeError(checks.diagnostics.autocorrelation.statistic, durbinWatson(c.pearsonResiduals)) < 1e-8, `${name}: Durbin–Watson on R's Pearson residuals`);
  }
});

t.test('overdispersion: a plain-words caution when the counts vary too much, none for a 0/1 response', async (t) => {
  // Valve leak counts are overdispersed (simulated negative binomial, θ = 2.5): a Poisson fit fails the check.
  const nb = referenceCase('valves-negative-binomial');
  const { fit, design } = fitCase({ ...nb, family: 'poisson' });
  const checks = glmModelChecks(fit, design, { rows: [...Array(design.rows).keys()], grouped: false });
  const o = checks.diagnostics.glm!.overdispersion;
  t.equal(o.passed, false, `ratio ${o.ratio} above ${o.threshold}`);
  t.ok(o.ratio! > o.threshold!);
  t.ok(checks.cautions.some((x) => x.code === 'assumption_check' && /vary more than the poisson family allows/.test(x.message) && /QAIC/.test(x.message)));
  const binary = overdispersionCheck({ ...fit, family: 'binomial' }, false);
  t.equal(binary.passed, null);
  t.match(binary.note, /0\/1 response/);
});

t.test('predictions: the mean, with the link-scale 95% interval mapped by the inverse link (R predict.glm, family$linkinv)', async (t) => {
  for (const name of FITTED_CASES) {
    const c = referenceCase(name);
    if (!c.prediction) continue;
    const { fit, design } = fitCase(c);
    const count = Object.values(c.prediction.rows)[0].length;
    const stacked: Columns = Object.fromEntries(Object.keys(c.prediction.rows).map((k) => [k, [...c.data[k], ...c.prediction!.rows[k]]]));
    const built = buildDesign(stacked, c.terms, true, Array.from({ length: count }, (_, i) => i + design.rows));
    if ('issues' in built) throw new Error(built.issues[0].message);
    const p = glmModelPredictions(fit, design, built.design, c.prediction.offset, 0.95);
    t.equal(p.scale.backTransform, 'inverseLink');
    t.ok(worstRelativeError(p.results.map((r) => r.estimate), c.prediction.mean) < 1e-9, `${name}: mean`);
    t.ok(worstRelativeError(p.results.map((r) => r.lower), c.prediction.lower) < 1e-9, `${name}: lower end`);
    t.ok(worstRelativeError(p.results.map((r) => r.upper), c.prediction.upper) < 1e-9, `${name}: upper end`);
    t.ok(p.results.every((r) => r.predictionLower === null && r.predictionUpper === null), 'no interval for a new observation');
  }
});

t.test('nested tests through the seam: R anova deviance and F tests', async (t) => {
  const pairs = { 'beetle-logit-lr': 'beetle-logit', 'sensors-inverse-gaussian-f': 'sensors-inverse-gaussian-log', 'seams-poisson-lr': 'seams-poisson-offset' } as const;
  for (const [testName, caseName] of Object.entries(pairs)) {
    const ref = REFERENCE.tests[testName];
    const c = referenceCase(caseName);
    const small = fitCase(c, ref.smaller);
    const large = fitCase(c, ref.larger);
    const offers = [
      glmNestingOffer({ name: 'large', keys: large.design.keys!, fit: large.fit, sample: 's' }),
      glmNestingOffer({ name: 'small', keys: small.design.keys!, fit: small.fit, sample: 's' }),
    ];
    const { tests, issues } = testNestingOffers(offers, [{ smaller: 'small', larger: 'large' }]);
    t.same(issues, []);
    t.equal(tests.length, 1, `${testName}: found once, asked for once`);
    const [test] = tests;
    t.same([test.smaller, test.larger, test.df], ['small', 'large', ref.df]);
    if (ref.residualDf !== undefined) {
      t.ok(relativeError(test.fStatistic, ref.statistic) < 1e-9, `${testName}: F ${test.fStatistic} vs R ${ref.statistic}`);
      t.ok(relativeError(test.fPValue, ref.pValue) < 1e-8, 'F p-value');
      t.equal(test.residualDf, ref.residualDf);
      t.equal(test.reason, null);
    } else {
      t.ok(relativeError(test.lrStatistic, ref.statistic) < 1e-9, `${testName}: deviance ${test.lrStatistic} vs R ${ref.statistic}`);
      t.ok(relativeError(test.lrPValue, ref.pValue) < 1e-8, 'χ² p-value');
      t.equal(test.fStatistic, null);
      t.match(test.reason, /dispersion is fixed by the family/);
    }
  }
});

t.test('offers of different kinds are never paired; a pair named across them is refused with the reason', async (t) => {
  const c = referenceCase('pumps-gamma-log');
  const small = fitCase(c, ['age']);
  const large = fitCase(c);
  const inverse = fitCase({ ...c, link: 'inverse' });
  const y = Float64Array.from(c.data.hours as number[]);
  const ls = fitLeastSquares(large.design, y);
  const lsSmall = fitLeastSquares(small.design, y);
  const offers = [
    glmNestingOffer({ name: 'g-small', keys: small.design.keys!, fit: small.fit, sample: 's' }),
    glmNestingOffer({ name: 'g-large', keys: large.design.keys!, fit: large.fit, sample: 's' }),
    glmNestingOffer({ name: 'g-inverse', keys: large.design.keys!, fit: inverse.fit, sample: 's' }),
    { candidate: { name: 'ls-small', keys: small.design.keys!, fit: lsSmall, sample: 's' }, rules: LEAST_SQUARES_NESTING },
    { candidate: { name: 'ls-large', keys: large.design.keys!, fit: ls, sample: 's' }, rules: LEAST_SQUARES_NESTING },
  ];
  const found = testNestingOffers(offers);
  t.same(found.tests.map((x) => [x.smaller, x.larger]).sort(), [['g-small', 'g-large'], ['ls-small', 'ls-large']], 'one pair per kind; the inverse link nests with neither');
  const gamma = found.tests.find((x) => x.smaller === 'g-small')!;
  t.ok(gamma.fStatistic! > 0 && gamma.lrStatistic! > 0, 'the gamma pair has both tests');
  const asked = testNestingOffers(offers, [{ smaller: 'ls-small', larger: 'g-large' }, { smaller: 'g-small', larger: 'g-inverse' }, { smaller: 'g-small', larger: 'nobody' }]);
  t.match(asked.issues, [
    { code: 'nested-test-not-nested', message: /different kinds of model/ },
    { code: 'nested-test-unknown-candidate', facts: { missing: 'nobody' } },
    { code: 'nested-test-not-nested', message: /family or link/ },
  ]);
});
