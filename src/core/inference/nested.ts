// Tests between nested least-squares candidates: the partial F test and the
// likelihood-ratio test. Two fitted candidates are nested when every design
// column of the smaller one is also a column of the larger one, and both were
// fitted to the same sample (same response on the same scale, same weights,
// same rows). Columns are compared by their keys (design/column-identity.ts),
// never by labels: a data column may be named "x^2" or "intercept", and
// kiln=west against east is not kiln=west against north. Equal keys are
// equal columns, so a subset of keys means the smaller column space lies
// inside the larger one.
//
// Degrees of freedom come from ranks, not column counts, so aliased columns
// do not inflate them: df = rank(larger) - rank(smaller). df = 0 means both
// span the same space; that pair is not tested.
import type { LeastSquaresFit } from '../types.ts';
import { chiSquareUpperTail, fUpperTail } from './distributions.ts';
import type { StatisticsIssue } from './issue.ts';
import { collectNestedTests, type NestedPairRequest, type NestingRules } from './nested-pairs.ts';

export interface NestedCandidate {
  name: string;
  /**
   * Design column keys (DesignMatrix.keys), in design order, aliased ones
   * included; null when the design carries none, which nests with nothing.
   */
  keys: readonly string[] | null;
  fit: LeastSquaresFit;
  /**
   * Identity of the sample the candidate was fitted to: response and its
   * transform, weights column and rows. Equal strings mean the same sample.
   */
  sample: string;
}

export interface NestedTest {
  smaller: string;
  larger: string;
  /** Numerator degrees of freedom of F, and the chi-square degrees of freedom: rank difference. */
  df: number;
  /** Denominator degrees of freedom of F: the larger model's residual df, n - rank(larger). */
  residualDf: number;
  fStatistic: number | null;
  fPValue: number | null;
  lrStatistic: number | null;
  lrPValue: number | null;
  /** Why statistics are null, in plain words; null when all are present. */
  reason: string | null;
}

export type { NestedPairRequest };

function isKeySubset(small: readonly string[] | null, large: readonly string[] | null): boolean {
  if (small === null || large === null) return false;
  const present = new Set(large);
  return small.every((key) => present.has(key));
}

/** Orientation of a nested pair, or null when the two are not nested (df = 0 included). */
export function nestingOrder(
  a: NestedCandidate,
  b: NestedCandidate,
): { smaller: NestedCandidate; larger: NestedCandidate } | null {
  if (a.sample !== b.sample || a.fit.observations !== b.fit.observations) return null;
  if (a.fit.rank < b.fit.rank && isKeySubset(a.keys, b.keys)) return { smaller: a, larger: b };
  if (b.fit.rank < a.fit.rank && isKeySubset(b.keys, a.keys)) return { smaller: b, larger: a };
  return null;
}

/**
 * Partial F = ((RSS_s - RSS_l) / df) / (RSS_l / (n - rank_l)), on (df, n - rank_l).
 * LR = 2 (logL_l - logL_s) = n ln(RSS_s / RSS_l) under the Gaussian
 * convention of the contract (the weight and Jacobian terms of logL are equal
 * for both models and cancel), referred to chi-square(df).
 * The caller guarantees the pair is nested (see nestingOrder).
 */
export function nestedTest(smaller: NestedCandidate, larger: NestedCandidate): NestedTest {
  const n = larger.fit.observations;
  const df = larger.fit.rank - smaller.fit.rank;
  const residualDf = n - larger.fit.rank;
  const base = { smaller: smaller.name, larger: larger.name, df, residualDf };
  if (!Number.isFinite(smaller.fit.rss) || !Number.isFinite(larger.fit.rss)) {
    return {
      ...base, fStatistic: null, fPValue: null, lrStatistic: null, lrPValue: null,
      reason: 'A residual sum of squares is too large for double precision, so the models cannot be tested; rescale the response.',
    };
  }
  if (larger.fit.exactFit || !(larger.fit.rss > 0)) {
    return {
      ...base, fStatistic: null, fPValue: null, lrStatistic: null, lrPValue: null,
      reason: `"${larger.name}" fits the data exactly (residuals at rounding level), so there is no residual variance to test against.`,
    };
  }
  // Rounding can leave the smaller RSS a hair below the larger one; the true
  // difference of nested fits is >= 0.
  const reduction = Math.max(0, smaller.fit.rss - larger.fit.rss);
  const lrStatistic = n * Math.log1p(reduction / larger.fit.rss);
  const lrPValue = chiSquareUpperTail(lrStatistic, df);
  if (residualDf <= 0) {
    return {
      ...base, fStatistic: null, fPValue: null, lrStatistic, lrPValue,
      reason: `"${larger.name}" leaves no residual degrees of freedom, so the F test is undefined.`,
    };
  }
  const fStatistic = (reduction / df) / (larger.fit.rss / residualDf);
  return { ...base, fStatistic, fPValue: fUpperTail(fStatistic, df, residualDf), lrStatistic, lrPValue, reason: null };
}

/** What "nested" means between least-squares fits and what a test computes (see nested-pairs.ts). */
export const LEAST_SQUARES_NESTING: NestingRules<NestedCandidate, { smaller: NestedCandidate; larger: NestedCandidate }, NestedTest> = {
  order: nestingOrder,
  test: (order) => nestedTest(order.smaller, order.larger),
  notNested: (pair, a, b) => ({
    code: 'nested-test-not-nested',
    message: notNestedReason(a, b),
    facts: { smaller: pair.smaller, larger: pair.larger, smallerRank: a.fit.rank, largerRank: b.fit.rank },
  }),
  unknownCandidate: 'A requested nested test names a candidate that is not among those compared, or one that is not tested on request: requested tests are F and likelihood-ratio tests between least-squares candidates fitted here, linear or nonlinear (not a model fitted elsewhere, a generalised linear or life candidate; a pair naming a life model is tested by the likelihood-ratio test between life models).',
};

/**
 * Every nested pair among the candidates (in candidate order of the smaller,
 * then the larger), plus the pairs a request names. A named pair that is not
 * nested, or names an unknown candidate, becomes an issue; a named pair that
 * is also found automatically is reported once.
 */
export function nestedTests(
  candidates: readonly NestedCandidate[],
  requested: readonly NestedPairRequest[] = [],
): { tests: NestedTest[]; issues: StatisticsIssue[] } {
  return collectNestedTests(candidates, requested, LEAST_SQUARES_NESTING);
}

function notNestedReason(a: NestedCandidate, b: NestedCandidate): string {
  if (a.sample !== b.sample || a.fit.observations !== b.fit.observations) {
    return `"${a.name}" and "${b.name}" were not fitted to the same response, weights and rows, so they cannot be tested against each other.`;
  }
  if (a.fit.rank === b.fit.rank && isKeySubset(a.keys, b.keys) && isKeySubset(b.keys, a.keys)) {
    return `"${a.name}" and "${b.name}" have the same columns; there is nothing to test.`;
  }
  if (a.fit.rank === b.fit.rank) {
    return `"${a.name}" and "${b.name}" estimate the same number of coefficients, so neither is nested in the other (after aliased columns are set aside).`;
  }
  return `Neither of "${a.name}" and "${b.name}" has all its columns inside the other's, so they are not nested.`;
}
