// A fitted lifetime candidate as the scoring side and the response need it:
// the full log-likelihood and k, coefficients of the location's terms, the
// distribution's usual parameters with delta-method standard errors, the
// covariance, convergence, and percentiles and survival probabilities when
// the location has no terms (with terms they depend on the row: see
// predict.ts for values at given rows).
import type { DesignMatrix, LeastSquaresFit } from '../../types.ts';
import { aliasRelations } from '../../predict.ts';
import type { CensoringCounts } from './censoring.ts';
import type { Distribution, DistributionName } from './distributions.ts';
import { percentileAt, survivalAt, waldQuantile, type LifePercentile, type LifeSurvival, type LifetimeEstimates } from './life-quantities.ts';
import { NEWTON_RULE } from './newton.ts';
import { DEFAULT_INTERVAL_LEVEL, type LifetimeOptions } from './options.ts';

export interface LifetimeFit {
  ok: true;
  name: string;
  distribution: DistributionName;
  /** Every lifetime likelihood is a density (or probability of a censored range) of a continuous time. */
  measure: 'density';
  observations: number;
  censoring: CensoringCounts;
  /** On the time scale as sent, every constant included. */
  logLikelihood: number;
  /** The same on the log-time scale (logLikelihood + Σ ln t over exact failures); null for the time-scale distributions. */
  logLikelihoodLogTime: number | null;
  /** k: estimable coefficients plus the scale or shape (none for the exponential). */
  parameters: number;
  coefficients: { term: string; estimate: number | null; standardError: number | null }[];
  aliased: string[];
  distributionParameters: { name: string; estimate: number; standardError: number | null }[];
  /** Covariance of the estimable coefficients and the log scale or log shape, from the observed information. */
  covariance: { labels: string[]; matrix: number[][] };
  convergence: { converged: true; iterations: number; rule: string; decrement: number };
  intervalLevel: number;
  percentiles: LifePercentile[] | null;
  survival: LifeSurvival[] | null;
  estimates: LifetimeEstimates;
  /** The fitted location μ_i of each row (of ln t, or of t for the time-scale distributions). */
  fittedLocation: Float64Array;
  /** For aliased columns, the exact relation the data obey (see predict.ts); null without aliasing. */
  aliasRelations: Map<number, Float64Array> | null;
}

export interface LifetimeResultInput {
  name: string;
  distribution: Distribution;
  design: DesignMatrix;
  leastSquares: LeastSquaresFit;
  estimates: LifetimeEstimates;
  logLikelihood: number;
  logLikelihoodLogTime: number | null;
  convergence: { iterations: number; decrement: number };
  counts: CensoringCounts;
  options: LifetimeOptions;
}

function sqrtOrNull(v: number): number | null {
  return v >= 0 && Number.isFinite(v) ? Math.sqrt(v) : null;
}

export function lifetimeResult(input: LifetimeResultInput): LifetimeFit {
  const { design, estimates, distribution } = input;
  const m = estimates.dimension;
  const variance = (k: number) => estimates.covariance[k * m + k];
  const position = new Map(estimates.estimable.map((j, k) => [j, k]));
  const coefficients = design.labels.map((term, j) => {
    const k = position.get(j);
    if (k === undefined) return { term, estimate: null, standardError: null };
    return { term, estimate: estimates.coefficients[k], standardError: sqrtOrNull(variance(k)) };
  });
  const onlyIntercept = design.labels.length === 1 && design.intercept && estimates.estimable.length === 1;
  const distributionParameters = distribution.usual
    .filter((u) => u.from === 'extra' || onlyIntercept)
    .map((u) => {
      const k = u.from === 'extra' ? m - 1 : 0;
      const v = u.from === 'extra' ? estimates.extra! : estimates.coefficients[0];
      const se = sqrtOrNull(variance(k));
      return { name: u.name, estimate: u.value(v), standardError: se === null ? null : Math.abs(u.slope(v)) * se };
    });
  const labels = [...estimates.estimable.map((j) => design.labels[j]), ...(distribution.extraLabel ? [distribution.extraLabel] : [])];
  const matrix = Array.from({ length: m }, (_, i) => Array.from(estimates.covariance.subarray(i * m, (i + 1) * m)));
  const level = input.options.intervalLevel ?? DEFAULT_INTERVAL_LEVEL;
  const q = waldQuantile(level);
  const one = [1];
  const fittedLocation = new Float64Array(design.rows);
  estimates.estimable.forEach((j, k) => {
    const b = estimates.coefficients[k];
    for (let i = 0; i < design.rows; i++) fittedLocation[i] += (design.high[j][i] + design.low[j][i]) * b;
  });
  return {
    ok: true,
    name: input.name,
    distribution: distribution.name,
    measure: 'density',
    observations: design.rows,
    censoring: input.counts,
    logLikelihood: input.logLikelihood,
    logLikelihoodLogTime: input.logLikelihoodLogTime,
    parameters: m,
    coefficients,
    aliased: input.leastSquares.aliased,
    distributionParameters,
    covariance: { labels, matrix },
    convergence: { converged: true, iterations: input.convergence.iterations, rule: NEWTON_RULE, decrement: input.convergence.decrement },
    intervalLevel: level,
    percentiles: onlyIntercept && input.options.percentiles ? input.options.percentiles.map((p) => percentileAt(estimates, one, p, q)) : null,
    survival: onlyIntercept && input.options.survivalAt ? input.options.survivalAt.map((t) => survivalAt(estimates, one, t, q)) : null,
    estimates,
    fittedLocation,
    aliasRelations: input.leastSquares.aliased.length > 0 ? aliasRelations(input.leastSquares, design) : null,
  };
}
