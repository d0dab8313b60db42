// Tests between nested generalised linear models of one family and link on
// one sample (same response, trials, offset and rows: the caller's `sample`
// identity says so). Columns are compared by their design keys, as for
// least squares (inference/nested.ts).
//  - Likelihood ratio: 2 (ℓ_larger - ℓ_smaller) on k_larger - k_smaller
//    degrees of freedom, referred to χ². For the binomial and Poisson it is
//    the difference of the deviances; a negative binomial, gamma or inverse
//    Gaussian model brings its own maximum-likelihood θ, shape or dispersion.
//  - F, where the family estimates a dispersion (Gaussian, gamma, inverse
//    Gaussian): ((D_smaller - D_larger) / df) / φ̂ with φ̂ = Pearson χ² /
//    (n - rank) of the larger model, on (df, n - rank_larger) — R's
//    anova.glm(test = "F").
import { chiSquareUpperTail, fUpperTail } from '../../inference/distributions.ts';
import type { NestedTest } from '../../inference/nested.ts';
import type { NestingRules } from '../../inference/nested-pairs.ts';
import type { NestingOffer } from '../../inference/nesting-offers.ts';
import type { GlmFit } from './types.ts';

export interface GlmNestedCandidate {
  name: string;
  /** DesignMatrix.keys of the model's design; null nests with nothing. */
  keys: readonly string[] | null;
  fit: GlmFit;
  /** Identity of the sample (response, trials, offset, rows): equal strings mean the same sample. */
  sample: string;
}

export interface GlmNestedTest {
  smaller: string;
  larger: string;
  df: number;
  lrStatistic: number | null;
  lrPValue: number | null;
  /** Null where the family's dispersion is fixed (binomial, Poisson, negative binomial). */
  fStatistic: number | null;
  fPValue: number | null;
  residualDf: number;
}

const ESTIMATED_DISPERSION = new Set(['gaussian', 'gamma', 'inverseGaussian']);

/** The pair oriented smaller-first, or the reason it cannot be tested. */
export function glmNestingOrder(a: GlmNestedCandidate, b: GlmNestedCandidate):
  { smaller: GlmNestedCandidate; larger: GlmNestedCandidate } | { reason: string } {
  if (a.fit.family !== b.fit.family || a.fit.link !== b.fit.link) {
    return { reason: 'the models differ in family or link; a likelihood-ratio test between nested models needs one family and one link.' };
  }
  if (a.sample !== b.sample || a.fit.observations !== b.fit.observations) {
    return { reason: 'the models were not fitted to the same sample (response, trials, offset and rows).' };
  }
  const subset = (s: readonly string[] | null, l: readonly string[] | null) => {
    if (s === null || l === null) return false;
    const present = new Set(l);
    return s.every((k) => present.has(k));
  };
  if (a.fit.rank < b.fit.rank && subset(a.keys, b.keys)) return { smaller: a, larger: b };
  if (b.fit.rank < a.fit.rank && subset(b.keys, a.keys)) return { smaller: b, larger: a };
  return { reason: 'neither model\'s columns are all columns of the other with fewer estimable coefficients.' };
}

export function glmNestedTest(smaller: GlmNestedCandidate, larger: GlmNestedCandidate): GlmNestedTest {
  const s = smaller.fit;
  const l = larger.fit;
  const df = l.parameters - s.parameters;
  const residualDf = l.residualDf;
  let lrStatistic: number | null = null;
  let lrPValue: number | null = null;
  if (s.logLikelihood !== null && l.logLikelihood !== null) {
    lrStatistic = Math.max(0, 2 * (l.logLikelihood - s.logLikelihood));
    lrPValue = chiSquareUpperTail(lrStatistic, df);
  }
  let fStatistic: number | null = null;
  let fPValue: number | null = null;
  if (ESTIMATED_DISPERSION.has(l.family) && residualDf > 0) {
    const phi = l.pearsonChiSquare / residualDf;
    const rankDf = l.rank - s.rank;
    fStatistic = Math.max(0, (s.deviance - l.deviance) / rankDf / phi);
    fPValue = fUpperTail(fStatistic, rankDf, residualDf);
  }
  return { smaller: smaller.name, larger: larger.name, df, lrStatistic, lrPValue, fStatistic, fPValue, residualDf };
}

/** The test in the shape every nested test of the answer has, `reason` saying what was and was not computed. */
export function glmNestedTestResult(smaller: GlmNestedCandidate, larger: GlmNestedCandidate): NestedTest {
  const test = glmNestedTest(smaller, larger);
  const family = larger.fit.family;
  let reason: string | null = null;
  if (test.lrStatistic === null) reason = 'a log-likelihood is not finite, so there is no likelihood-ratio test';
  else if (!ESTIMATED_DISPERSION.has(family)) {
    reason = `${family}: the dispersion is fixed by the family, so the likelihood-ratio (deviance) test against χ² is the test; no F test`;
  } else if (test.fStatistic === null) reason = `"${larger.name}" leaves no residual degrees of freedom, so the F test is undefined`;
  return { ...test, reason };
}

/** What "nested" means between GLM fits (one family and link, one sample, a subset of columns) and what a test computes. */
export const GLM_NESTING: NestingRules<GlmNestedCandidate, { smaller: GlmNestedCandidate; larger: GlmNestedCandidate }, NestedTest> = {
  order: (a, b) => {
    const order = glmNestingOrder(a, b);
    return 'reason' in order ? null : order;
  },
  test: (order) => glmNestedTestResult(order.smaller, order.larger),
  notNested: (pair, a, b) => {
    const order = glmNestingOrder(a, b);
    return {
      code: 'nested-test-not-nested',
      message: `"${a.name}" and "${b.name}" cannot be tested against each other: ${'reason' in order ? order.reason : 'they are not nested.'}`,
      facts: { smaller: pair.smaller, larger: pair.larger },
    };
  },
  unknownCandidate: 'A requested nested test names a candidate that is not among the generalised linear models fitted here.',
};

export function glmNestingOffer(candidate: GlmNestedCandidate): NestingOffer<GlmNestedCandidate> {
  return { candidate, rules: GLM_NESTING };
}
