// The response, trials, offset and weights of a generalised linear model,
// checked against the family's support before any fitting: a count family
// needs whole counts, the binomial successes between 0 and their trials (0/1
// without trials), gamma and inverse Gaussian positive measurements. Each
// issue names the first offending data row of its field.
import { issue, type Issue, type IssuePath } from '../../issues.ts';
import type { GlmFamilyName } from './types.ts';

export interface GlmFieldPaths {
  candidate: IssuePath;
  response: IssuePath;
  trials: IssuePath;
  offset: IssuePath;
  weights: IssuePath;
}

export interface GlmDataInput {
  /** The response on the used rows: successes (with trials) or 0/1 for the binomial, counts, or measurements. */
  response: Float64Array;
  /** Trials per row for a grouped binomial; read by the binomial only. */
  trials?: Float64Array | null;
  /** Added to the linear predictor as it is (e.g. the log of an exposure). */
  offset?: Float64Array | null;
  /** Relative weights, Gaussian family only (as for least squares). */
  weights?: Float64Array | null;
  /** Data positions of the used rows, so that issues name the caller's rows (default 0, 1, …). */
  rows?: readonly number[];
}

/** The checked rows: response as sent, prior weights (trials for the binomial) and the offset. */
export interface GlmRows {
  y: Float64Array;
  prior: Float64Array;
  offset: Float64Array | null;
}

const SUPPORT: Partial<Record<GlmFamilyName, string>> = {
  gamma: 'greater than 0',
  inverseGaussian: 'greater than 0',
};

const isCount = (v: number) => Number.isInteger(v) && v >= 0;

export function checkGlmData(family: GlmFamilyName, data: GlmDataInput, paths: GlmFieldPaths): { rows: GlmRows } | { issues: Issue[] } {
  const n = data.response.length;
  const rowOf = (i: number) => (data.rows ? data.rows[i] : i);
  const issues: Issue[] = [];
  if (data.weights && family !== 'gaussian') issues.push(issue('glm_weights_not_supported', paths.weights, { family }));

  let prior = new Float64Array(n).fill(1);
  const trials = family === 'binomial' ? data.trials ?? null : null;
  if (trials) {
    const bad = trials.findIndex((m) => !(Number.isInteger(m) && m >= 1));
    if (bad >= 0) issues.push(issue('glm_trials_invalid', paths.trials, { row: rowOf(bad), value: trials[bad] }));
    prior = Float64Array.from(trials);
  } else if (family === 'gaussian' && data.weights) {
    prior = Float64Array.from(data.weights);
  }

  const y = data.response;
  for (let i = 0; i < n; i++) {
    const v = y[i];
    const row = rowOf(i);
    let found: Issue | null = null;
    if (!Number.isFinite(v)) {
      found = issue('glm_response_outside_support', paths.response, { family, row, value: v, support: 'a finite number' });
    } else if (family === 'binomial' || family === 'poisson' || family === 'negativeBinomial') {
      if (!Number.isInteger(v)) found = issue('glm_count_not_integer', paths.response, { family, row, value: v });
      else if (v < 0) found = issue('glm_response_outside_support', paths.response, { family, row, value: v, support: 'a count of 0 or more' });
      else if (family === 'binomial' && !trials && v > 1) {
        found = issue('glm_response_outside_support', paths.response, {
          family, row, value: v, support: '0 or 1 (send trials to model counts of successes)',
        });
      } else if (trials && isCount(trials[i]) && v > trials[i]) {
        found = issue('glm_successes_above_trials', paths.response, { row, successes: v, trials: trials[i] });
      }
    } else if (SUPPORT[family] && !(v > 0)) {
      found = issue('glm_response_outside_support', paths.response, { family, row, value: v, support: SUPPORT[family]! });
    }
    if (found) {
      issues.push(found);
      break;
    }
  }

  const offset = data.offset ?? null;
  if (offset) {
    const bad = offset.findIndex((v) => !Number.isFinite(v));
    if (bad >= 0) issues.push(issue('value_not_finite', paths.offset, { column: 'offset', row: rowOf(bad) }));
  }
  return issues.length > 0 ? { issues } : { rows: { y, prior, offset } };
}
