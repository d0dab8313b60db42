// Likelihood-ratio tests between lifetime candidates where one is a special
// case of the other, fitted to the same observations:
// - the same distribution with the smaller model's design columns a subset of
//   the larger's (a covariate subset of an AFT model);
// - the exponential inside the Weibull (σ = 1) or inside the gamma (κ = 1),
//   with the exponential's design columns a subset of the other's.
// Columns are compared by their keys (design/column-identity.ts), as the
// linear nested tests do. LR = 2(ℓ_larger - ℓ_smaller) is referred to
// χ²(k_larger - k_smaller). The restrictions are interior points of the
// larger model's parameter space (σ = 1, κ = 1, a coefficient 0), so the
// usual χ² reference applies (common practice; Wilks 1938).
import { chiSquareUpperTail } from '../../inference/distributions.ts';
import type { StatisticsIssue } from '../../inference/issue.ts';
import { collectNestedTests, type NestedPairRequest } from '../../inference/nested-pairs.ts';
import type { DesignMatrix } from '../../types.ts';
import type { DistributionName } from './distributions.ts';
import type { LifetimeFit } from './lifetime-result.ts';

export interface LifetimeNestingCandidate {
  name: string;
  distribution: DistributionName;
  /** Design column keys of the location (DesignMatrix.keys); null nests with nothing. */
  keys: readonly string[] | null;
  parameters: number;
  logLikelihood: number;
  observations: number;
  /** Identity of the observations (response, censoring, rows): equal strings, same sample. */
  sample: string;
}

export interface LifetimeLikelihoodRatioTest {
  smaller: string;
  larger: string;
  /** What makes the smaller model a special case, in words. */
  restriction: string;
  df: number;
  lrStatistic: number;
  pValue: number;
}

/** The facts nesting needs from a fitted candidate; `sample` identifies its observations (response, censoring, rows). */
export function nestingCandidateOf(fit: LifetimeFit, design: DesignMatrix, sample: string): LifetimeNestingCandidate {
  return {
    name: fit.name, distribution: fit.distribution, keys: design.keys ?? null, parameters: fit.parameters,
    logLikelihood: fit.logLikelihood, observations: fit.observations, sample,
  };
}

const SPECIAL_CASES: Partial<Record<DistributionName, { inside: DistributionName; restriction: string }[]>> = {
  exponential: [
    { inside: 'weibull', restriction: 'Weibull shape fixed at 1' },
    { inside: 'gamma', restriction: 'gamma shape fixed at 1' },
  ],
};

function isSubset(small: readonly string[] | null, large: readonly string[] | null): boolean {
  if (small === null || large === null) return false;
  const present = new Set(large);
  return small.every((k) => present.has(k));
}

/** Why `smaller` is a special case of `larger`, or null when it is not. */
function restrictionOf(smaller: LifetimeNestingCandidate, larger: LifetimeNestingCandidate): string | null {
  if (smaller.sample !== larger.sample || smaller.observations !== larger.observations) return null;
  if (smaller.parameters >= larger.parameters || !isSubset(smaller.keys, larger.keys)) return null;
  const dropped = (larger.keys ?? []).filter((k) => !(smaller.keys ?? []).includes(k)).length;
  const terms = dropped > 0 ? `${dropped} location column${dropped === 1 ? '' : 's'} set to 0` : null;
  if (smaller.distribution === larger.distribution) return terms;
  const special = SPECIAL_CASES[smaller.distribution]?.find((s) => s.inside === larger.distribution);
  if (!special) return null;
  return terms ? `${special.restriction}, ${terms}` : special.restriction;
}

export function lifetimeNestingOrder(
  a: LifetimeNestingCandidate,
  b: LifetimeNestingCandidate,
): { smaller: LifetimeNestingCandidate; larger: LifetimeNestingCandidate; restriction: string } | null {
  const ab = restrictionOf(a, b);
  if (ab !== null) return { smaller: a, larger: b, restriction: ab };
  const ba = restrictionOf(b, a);
  if (ba !== null) return { smaller: b, larger: a, restriction: ba };
  return null;
}

export function lifetimeLikelihoodRatioTest(
  smaller: LifetimeNestingCandidate,
  larger: LifetimeNestingCandidate,
  restriction: string,
): LifetimeLikelihoodRatioTest {
  const df = larger.parameters - smaller.parameters;
  // The larger model's maximum is at least the smaller's; a hair below is rounding.
  const lrStatistic = Math.max(0, 2 * (larger.logLikelihood - smaller.logLikelihood));
  return { smaller: smaller.name, larger: larger.name, restriction, df, lrStatistic, pValue: chiSquareUpperTail(lrStatistic, df) };
}

/**
 * Every nested pair among the candidates, plus the pairs a request names
 * (options.tests): see inference/nested-pairs.ts.
 */
export function lifetimeNestedTests(
  candidates: readonly LifetimeNestingCandidate[],
  requested: readonly NestedPairRequest[] = [],
): { tests: LifetimeLikelihoodRatioTest[]; issues: StatisticsIssue[] } {
  return collectNestedTests(candidates, requested, {
    order: lifetimeNestingOrder,
    test: (order) => lifetimeLikelihoodRatioTest(order.smaller, order.larger, order.restriction),
    notNested: (pair, a, b) => ({
      code: 'nested-test-not-nested',
      message: `Neither of "${a.name}" (${a.distribution}) and "${b.name}" (${b.distribution}) is a special case of the other on the same observations: a lifetime model nests another only with the same distribution and a subset of its terms, or as the exponential inside a Weibull or gamma with a subset of its terms.`,
      facts: { smaller: pair.smaller, larger: pair.larger },
    }),
    unknownCandidate: 'A requested nested test pairs a life model with a candidate that is not one: a life model can be tested only against another life model fitted to the same observations (by a likelihood-ratio test).',
  });
}
