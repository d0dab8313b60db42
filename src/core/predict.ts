// Estimated mean response at new rows, x'b, with its standard error
// sigma * sqrt(x' (X'WX)^-1 x). The new rows must already have gone through
// the same design builder as the data (same labels, same factor coding), so
// this file only does the algebra.
//
// With aliased columns the fit fixed their coefficients at zero; that choice
// is arbitrary, and x'b depends on it unless x lies in the row space of X.
// A new row is estimable when each aliased column's value equals the same
// combination of estimable columns that the data obey (X_a = X_E c_a); rows
// that are not get a null prediction and an issue.
import type { DesignMatrix, LeastSquaresFit } from './types.ts';
import { estimableRow, quadraticForm, weightAt } from './inference/design-rows.ts';
import type { StatisticsIssue } from './inference/issue.ts';
import { basisQuadraticForm, weightedBasis } from './inference/orthonormal-basis.ts';
import type { ModelGeometry } from './inference/model-geometry.ts';

export interface MeanPrediction {
  estimate: number | null;
  /** Standard error of the estimated mean (not of a new observation); null when sigma is undefined. */
  standardError: number | null;
}

/** Relative size of |x_a - x_E' c_a| below which a new row counts as estimable. */
const ESTIMABILITY_TOLERANCE = 1e-7;

/** c_a = C X_E' W X_a for each aliased column a: the exact linear relation the data obey. */
export function aliasRelations(fit: LeastSquaresFit, data: DesignMatrix, weights?: ArrayLike<number>): Map<number, Float64Array> {
  const relations = new Map<number, Float64Array>();
  const estimable = new Set(fit.estimable);
  const p = fit.estimable.length;
  for (let a = 0; a < data.labels.length; a++) {
    if (estimable.has(a)) continue;
    const g = new Float64Array(p);
    for (let i = 0; i < data.rows; i++) {
      const xa = weightAt(weights, i) * (data.high[a][i] + data.low[a][i]);
      if (xa === 0) continue;
      for (let k = 0; k < p; k++) {
        const j = fit.estimable[k];
        g[k] += (data.high[j][i] + data.low[j][i]) * xa;
      }
    }
    const c = new Float64Array(p);
    for (let k = 0; k < p; k++) {
      let s = 0;
      for (let m = 0; m < p; m++) s += fit.unscaledCovariance[k][m] * g[m];
      c[k] = s;
    }
    relations.set(a, c);
  }
  return relations;
}

export function predictMeanResponse(
  fit: LeastSquaresFit,
  data: DesignMatrix,
  rows: DesignMatrix,
  weights?: ArrayLike<number>,
  geometry?: ModelGeometry,
): { predictions: MeanPrediction[]; issues: StatisticsIssue[] } {
  const issues: StatisticsIssue[] = [];
  if (rows.labels.length !== data.labels.length || rows.labels.some((l, j) => l !== data.labels[j])) {
    issues.push({
      code: 'prediction-columns-differ',
      message: 'The prediction rows did not produce the same design columns as the data, so the model cannot be applied to them.',
      facts: { expected: data.labels.join(', '), received: rows.labels.join(', ') },
    });
    return { predictions: [], issues };
  }
  const relations = aliasRelations(fit, data, weights);
  // x' (X'WX)^-1 x through an orthonormal basis of the data design, which
  // keeps its accuracy on ill-conditioned designs; the fit's explicit
  // inverse is the fallback. The model's geometry, when passed, already
  // holds that basis.
  const basis = geometry ? geometry.basis : weightedBasis(fit, data, weights);
  const varianceFactor = (x: Float64Array) =>
    basis ? basisQuadraticForm(basis, x) : quadraticForm(fit.unscaledCovariance, x);
  const predictions: MeanPrediction[] = [];
  const notEstimable: number[] = [];
  for (let i = 0; i < rows.rows; i++) {
    const x = estimableRow(rows, fit, i);
    if (!isEstimable(rows, i, x, relations)) {
      notEstimable.push(i);
      predictions.push({ estimate: null, standardError: null });
      continue;
    }
    let estimate = 0;
    for (let k = 0; k < x.length; k++) estimate += x[k] * (fit.coefficients[fit.estimable[k]] as number);
    const standardError = fit.sigma === null ? null : fit.sigma * Math.sqrt(varianceFactor(x));
    predictions.push({ estimate, standardError });
  }
  if (notEstimable.length > 0) {
    issues.push({
      code: 'prediction-not-estimable',
      message: 'Some prediction rows break a linear relation among columns that holds exactly in the data (aliased columns), so the model cannot say what the response would be there.',
      facts: { rows: notEstimable.join(', '), aliased: fit.aliased.join(', ') },
    });
  }
  return { predictions, issues };
}

export function isEstimable(rows: DesignMatrix, i: number, x: Float64Array, relations: Map<number, Float64Array>): boolean {
  for (const [a, c] of relations) {
    const xa = rows.high[a][i] + rows.low[a][i];
    let implied = 0;
    let scale = Math.abs(xa);
    for (let k = 0; k < x.length; k++) {
      implied += x[k] * c[k];
      scale += Math.abs(x[k] * c[k]);
    }
    if (Math.abs(xa - implied) > ESTIMABILITY_TOLERANCE * Math.max(scale, Number.MIN_VALUE)) return false;
  }
  return true;
}
