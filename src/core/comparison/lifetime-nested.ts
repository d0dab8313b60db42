// Likelihood-ratio tests between nested life models, found among the
// comparison's lifetime models (lifetime/nested.ts says which nest: the same
// distribution with a subset of the terms, or the exponential inside the
// Weibull or the gamma), in the shape of every nested test of the answer.
// There is no residual sum of squares, so no F test: `reason` says so and
// names the restriction. A pair named in options.tests that names a life
// model is tested here, never by the least-squares F test; a named pair
// that is not nested (or mixes a life model with another kind) is an issue.
import type { NestedTest } from '../inference/nested.ts';
import type { StatisticsIssue } from '../inference/issue.ts';
import type { NestedPairRequest } from '../inference/nested-pairs.ts';
import type { ScoredModel } from '../models/scored-model.ts';
import { lifetimeNestedTests } from '../models/lifetime/index.ts';

/** Requested pairs split by who tests them: any pair naming a life model goes to the likelihood-ratio test. */
export function routeRequestedTests(
  scored: readonly ScoredModel[],
  requested: readonly NestedPairRequest[],
): { leastSquares: NestedPairRequest[]; lifetime: NestedPairRequest[] } {
  const life = new Set(scored.filter((m) => m.capabilities.lifetimeNesting).map((m) => m.name));
  const lifetime = requested.filter((p) => life.has(p.smaller) || life.has(p.larger));
  return { leastSquares: requested.filter((p) => !lifetime.includes(p)), lifetime };
}

export function lifetimeLikelihoodRatioTests(
  scored: readonly ScoredModel[],
  sample: string,
  requested: readonly NestedPairRequest[] = [],
): { tests: NestedTest[]; issues: StatisticsIssue[] } {
  const candidates = scored.flatMap((m) => (m.capabilities.lifetimeNesting ? [m.capabilities.lifetimeNesting(sample)] : []));
  if (candidates.length < 2 && requested.length === 0) return { tests: [], issues: [] };
  const observations = new Map(candidates.map((c) => [c.name, c.observations]));
  const parameters = new Map(candidates.map((c) => [c.name, c.parameters]));
  const found = lifetimeNestedTests(candidates, requested);
  return {
    issues: found.issues,
    tests: found.tests.map((test) => ({
      smaller: test.smaller,
      larger: test.larger,
      df: test.df,
      residualDf: observations.get(test.larger)! - parameters.get(test.larger)!,
      fStatistic: null,
      fPValue: null,
      lrStatistic: test.lrStatistic,
      lrPValue: test.pValue,
      reason: `life models: a likelihood-ratio test of ${test.restriction}, against χ² with ${test.df} degree${test.df === 1 ? '' : 's'} of freedom; no F test (there is no residual sum of squares)`,
    })),
  };
}
