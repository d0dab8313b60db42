// The request options a lifetime candidate reads, checked once with the
// request's own paths: percentiles are probabilities strictly between 0 and 1,
// survival times finite numbers, the interval level between 0 and 1, the
// iteration cap a whole number from 1 to 1000.
import { issue, type Issue } from '../../issues.ts';

export interface LifetimeOptions {
  /** Probabilities at which to report percentiles of life (options.percentiles). */
  percentiles?: readonly number[];
  /** Times at which to report survival probabilities (options.survivalAt). */
  survivalAt?: readonly number[];
  /** Level of the Wald intervals (options.intervalLevel); 0.95 by default. */
  intervalLevel?: number;
  /** Newton–Raphson iteration cap; 50 by default. */
  maxIterations?: number;
}

export const DEFAULT_INTERVAL_LEVEL = 0.95;
export const DEFAULT_MAX_ITERATIONS = 50;

export function checkLifetimeOptions(options: LifetimeOptions): Issue[] {
  const issues: Issue[] = [];
  (options.percentiles ?? []).forEach((p, i) => {
    if (!(p > 0 && p < 1)) {
      issues.push(issue('lifetime_option_invalid', ['options', 'percentiles', i], { option: 'percentiles', value: p, rule: 'a percentile is asked for by its probability, strictly between 0 and 1' }));
    }
  });
  (options.survivalAt ?? []).forEach((t, i) => {
    if (!Number.isFinite(t)) {
      issues.push(issue('lifetime_option_invalid', ['options', 'survivalAt', i], { option: 'survivalAt', value: t, rule: 'a survival time must be a finite number' }));
    }
  });
  const level = options.intervalLevel;
  if (level !== undefined && !(level > 0 && level < 1)) {
    issues.push(issue('lifetime_option_invalid', ['options', 'intervalLevel'], { option: 'intervalLevel', value: level, rule: 'an interval level is strictly between 0 and 1, e.g. 0.95' }));
  }
  const cap = options.maxIterations;
  if (cap !== undefined && !(Number.isInteger(cap) && cap >= 1 && cap <= 1000)) {
    issues.push(issue('lifetime_option_invalid', ['options', 'maxIterations'], { option: 'maxIterations', value: cap, rule: 'the iteration cap is a whole number from 1 to 1000' }));
  }
  return issues;
}
