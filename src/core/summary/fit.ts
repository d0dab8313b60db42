// Least squares from a summary: the normal equations in their centred form,
// solved by sweeping the predictor columns of the cross-product matrix.
//   slopes b = Cxx^-1 Cxy,  RSS = Cyy - Cyx b,  intercept = mean(y) - mean(x) b
//   var(b) = s^2 Cxx^-1,    var(intercept) = s^2 (1/W + mean(x)^T Cxx^-1 mean(x))
// with W the row count (unweighted) or the weight sum (weighted), s^2 =
// RSS/(n - p). Forming cross products squares the condition number, so RSS
// and coefficients from a summary are less accurate than QR on the rows;
// centring removes the worst of it (the intercept's collinearity with large
// means). Without an intercept the raw sums are needed and are rebuilt as
// C + W mean mean^T, which brings that cancellation back: less accurate
// still, and said so by `uncentred: true`.

import { EXACT_FIT_FACTOR } from '../fit/exact-fit.ts';
import { INTERCEPT_LABEL } from '../design/labels.ts';
import { PIVOT_TOLERANCE, sweepPivot } from '../search/sweep.ts';
import type { DataSummary, SummaryIssue } from './types.ts';

/**
 * The residual sum of squares at or below which a fit from cross products is
 * exact. The rows' rule (||e|| <= 64 eps ||y||, src/core/fit/exact-fit.ts)
 * bounds a residual computed from the rows; an RSS from the normal equations
 * is a difference Cyy - Cyx b that carries a rounding of about eps * Cyy
 * however exact the fit, so the rule here is on the sum of squares itself:
 * RSS <= 64 eps * responseSquares, with responseSquares the response's sum
 * of squares the fit starts from (Cyy with an intercept, Cyy + W mean(y)^2
 * without). The subset search uses the same floor.
 */
export function exactFitFloor(responseSquares: number): number {
  return Math.max(responseSquares, Number.MIN_VALUE) * EXACT_FIT_FACTOR * Number.EPSILON;
}

export interface SummaryFit {
  observations: number;
  rank: number;
  /** Labels in design order: the intercept label first when there is one, then the predictors. */
  labels: string[];
  coefficients: (number | null)[];
  standardErrors: (number | null)[];
  aliased: string[];
  rss: number;
  /** About the (weighted) mean with an intercept, about 0 without. */
  tss: number;
  sigma: number | null;
  /** RSS at the rounding floor of the normal equations (exactFitFloor of the response's sum of squares). */
  exactFit: boolean;
  /** True when raw sums had to be rebuilt from means (no intercept). */
  uncentred: boolean;
  /**
   * What a prediction at new values of the predictors needs: the positions
   * (in the predictor list) of the estimable predictors, M = the inverse of
   * their cross products (centred with an intercept, raw without), their
   * means and W (rows, or the weight sum). var(μ̂) = σ̂² (1/W + (x − x̄)'M(x − x̄))
   * with an intercept, σ̂² x'Mx without.
   */
  predictionFactor: { estimable: number[]; inverse: number[][]; means: number[]; weightSum: number };
}

export type SummaryFitOutcome = { ok: true; fit: SummaryFit } | { ok: false; issues: SummaryIssue[] };

export function fitFromSummary(summary: DataSummary, response: string, predictors: readonly string[], intercept = true): SummaryFitOutcome {
  const index = new Map(summary.columns.map((c, j) => [c, j]));
  const missing = [...predictors, response].filter((c) => !index.has(c));
  if (missing.length > 0) {
    return {
      ok: false,
      issues: missing.map((c) => ({
        code: 'summary_column_unknown' as const,
        path: ['data', 'summary', 'columns'],
        message: `The summary lists no column ${JSON.stringify(c)}.`,
        facts: { column: c },
      })),
    };
  }
  const cols = [...predictors, response].map((c) => index.get(c) as number);
  const p = predictors.length;
  const d = p + 1;
  const W = summary.weights ? summary.weights.sum : summary.rows;
  const n = summary.rows;
  const a = new Float64Array(d * d);
  for (let i = 0; i < d; i++)
    for (let j = 0; j < d; j++) {
      let v = summary.centredCrossProducts[cols[i]][cols[j]];
      if (!intercept) v += W * summary.means[cols[i]] * summary.means[cols[j]];
      a[i * d + j] = v;
    }
  const original = Array.from({ length: d }, (_, k) => a[k * d + k]);
  const swept: boolean[] = new Array(p).fill(false);
  for (let k = 0; k < p; k++) {
    if (original[k] > 0 && a[k * d + k] > PIVOT_TOLERANCE * original[k]) {
      sweepPivot(a, d, k, 1);
      swept[k] = true;
    }
  }
  const rank = swept.filter(Boolean).length + (intercept ? 1 : 0);
  const rss = Math.max(a[d * d - 1], 0);
  const tss = original[d - 1];
  const dof = n - rank;
  const sigma = dof > 0 ? Math.sqrt(rss / dof) : null;
  const s2 = sigma === null ? null : sigma * sigma;
  const slopes = predictors.map((_, k) => (swept[k] ? a[k * d + p] : null));
  const slopeSe = predictors.map((_, k) => (swept[k] && s2 !== null && s2 > 0 ? Math.sqrt(s2 * -a[k * d + k]) : null));
  const labels = [...(intercept ? [INTERCEPT_LABEL] : []), ...predictors];
  const coefficients: (number | null)[] = [];
  const standardErrors: (number | null)[] = [];
  if (intercept) {
    const mx = cols.slice(0, p).map((c) => summary.means[c]);
    let b0 = summary.means[cols[p]];
    let q = 0;
    for (let k = 0; k < p; k++) {
      if (!swept[k]) continue;
      b0 -= mx[k] * (slopes[k] as number);
      for (let l = 0; l < p; l++) if (swept[l]) q += mx[k] * -a[k * d + l] * mx[l];
    }
    coefficients.push(b0);
    standardErrors.push(s2 !== null && s2 > 0 ? Math.sqrt(s2 * (1 / W + q)) : null);
  }
  coefficients.push(...slopes);
  standardErrors.push(...slopeSe);
  return {
    ok: true,
    fit: {
      observations: n,
      rank,
      labels,
      coefficients,
      standardErrors,
      aliased: predictors.filter((_, k) => !swept[k]),
      rss,
      tss,
      sigma,
      exactFit: rss <= exactFitFloor(tss),
      uncentred: !intercept,
      predictionFactor: {
        estimable: predictors.flatMap((_, k) => (swept[k] ? [k] : [])),
        // The swept block holds −M (the sweep's sign convention).
        inverse: predictors.flatMap((_, k) => (swept[k] ? [predictors.flatMap((__, l) => (swept[l] ? [-a[k * d + l]] : []))] : [])),
        means: cols.slice(0, p).map((c) => summary.means[c]),
        weightSum: W,
      },
    },
  };
}
