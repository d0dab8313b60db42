// One subset of a generalised-linear search, fitted by the same fitGlm a
// comparison candidate is fitted by, on the columns the combined design
// already holds for its terms (the preparation proved each term's columns are
// the ones its own design would have), optionally started from its parent's
// coefficients. A fit without a maximum-likelihood answer comes back as a
// failure to count, never as an error.
import { fitGlm } from '../../models/glm/index.ts';
import { computeCriteria } from '../../scoring/criteria.ts';
import type { DesignMatrix } from '../../types.ts';
import type { SearchCriterion } from '../types.ts';
import type { GlmFitFailures, GlmSearchData } from './types.ts';

/** Coefficients by design label: the start a child subset takes from its parent. */
export type Coefficients = ReadonlyMap<string, number>;

export type SubsetFit =
  | {
      ok: true;
      /** Null when the criterion has no value (AICc with n - k - 1 <= 0, an unbounded likelihood). */
      value: number | null;
      logLikelihood: number | null;
      parameters: number;
      rankDeficient: boolean;
      coefficients: Coefficients;
      solves: number;
    }
  | { ok: false; failure: Exclude<keyof GlmFitFailures, 'examples'> | 'empty'; code: string };

/** The design of pool terms `subset` (ascending) and every always term, cut from the combined design. */
export function subsetDesign(data: GlmSearchData, subset: readonly number[]): DesignMatrix {
  const { design, poolSize } = data;
  const position = new Map<number, number>();
  subset.forEach((j, q) => position.set(j, q));
  const picked: number[] = [];
  const termOf: number[] = [];
  design.termOfColumn.forEach((term, c) => {
    if (term === -1) {
      picked.push(c);
      termOf.push(-1);
    }
  });
  for (const j of subset) {
    design.termOfColumn.forEach((term, c) => {
      if (term === j) {
        picked.push(c);
        termOf.push(position.get(j)!);
      }
    });
  }
  design.termOfColumn.forEach((term, c) => {
    if (term >= poolSize) {
      picked.push(c);
      termOf.push(subset.length + term - poolSize);
    }
  });
  return {
    rows: design.rows,
    labels: picked.map((c) => design.labels[c]),
    ...(design.keys ? { keys: picked.map((c) => design.keys![c]) } : {}),
    high: picked.map((c) => design.high[c]),
    low: picked.map((c) => design.low[c]),
    intercept: design.intercept,
    termOfColumn: termOf,
  };
}

const FAILURE_OF: Record<string, Exclude<keyof GlmFitFailures, 'examples'>> = {
  glm_separation: 'separation',
  glm_not_converged: 'notConverged',
  glm_step_outside_domain: 'notConverged',
  glm_no_valid_start: 'notConverged',
  glm_theta_unbounded: 'notConverged',
};

export function fitSubset(data: GlmSearchData, subset: readonly number[], criterion: SearchCriterion, start?: Coefficients): SubsetFit {
  const design = subsetDesign(data, subset);
  if (design.labels.length === 0) return { ok: false, failure: 'empty', code: 'no_columns' };
  const fit = fitGlm({
    family: data.family, link: data.link, design, response: data.y, trials: data.trials, offset: data.offset,
    weights: data.weights, rows: data.rows, ...(start ? { start } : {}),
  });
  if ('issues' in fit) {
    const code = fit.issues[0]?.code ?? 'unknown';
    return { ok: false, failure: FAILURE_OF[code] ?? 'other', code };
  }
  const criteria = computeCriteria({
    logLikelihood: fit.logLikelihood, parameters: fit.parameters, observations: fit.observations,
    rss: null, tss: null, coefficientsIncludingIntercept: fit.rank, intercept: design.intercept,
  });
  const coefficients = new Map<string, number>();
  for (const c of fit.coefficients) if (c.estimate !== null) coefficients.set(c.term, c.estimate);
  return {
    ok: true,
    value: criteria[criterion],
    logLikelihood: fit.logLikelihood,
    parameters: fit.parameters,
    rankDeficient: fit.aliased.length > 0,
    coefficients,
    solves: fit.convergence.iterations,
  };
}
