// Likelihood-ratio tests between nested life models, found among the
// comparison's lifetime models (lifetime/nested.ts says which nest: the same
// distribution with a subset of the terms, or the exponential inside the
// Weibull or the gamma), in the shape of every nested test of the answer.
// There is no residual sum of squares, so no F test: `reason` says so and
// names the restriction. Pairs named in options.tests are least-squares
// pairs only (README: life data).
import type { NestedTest } from '../inference/nested.ts';
import type { ScoredModel } from '../models/scored-model.ts';
import { lifetimeNestedTests } from '../models/lifetime/index.ts';

export function lifetimeLikelihoodRatioTests(scored: readonly ScoredModel[], sample: string): NestedTest[] {
  const candidates = scored.flatMap((m) => (m.capabilities.lifetimeNesting ? [m.capabilities.lifetimeNesting(sample)] : []));
  if (candidates.length < 2) return [];
  const observations = new Map(candidates.map((c) => [c.name, c.observations]));
  const parameters = new Map(candidates.map((c) => [c.name, c.parameters]));
  return lifetimeNestedTests(candidates).tests.map((test) => ({
    smaller: test.smaller,
    larger: test.larger,
    df: test.df,
    residualDf: observations.get(test.larger)! - parameters.get(test.larger)!,
    fStatistic: null,
    fPValue: null,
    lrStatistic: test.lrStatistic,
    lrPValue: test.pValue,
    reason: `life models: a likelihood-ratio test of ${test.restriction}, against χ² with ${test.df} degree${test.df === 1 ? '' : 's'} of freedom; no F test (there is no residual sum of squares)`,
  }));
}
