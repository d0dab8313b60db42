// What the after-ranking statistics of one fit need from its design, from a
// single factorisation and a single pass over the rows: the R factor of the
// weighted design (prediction variances, the condition number, the variance
// inflation factors), the leverages (leave-one-out error, Cook's distances,
// high-leverage rows) and, when the design's own basis spans its regressors,
// the Breusch–Pagan auxiliary regression. Computed once per model and passed
// to leaveOneOutError, diagnoseFit and predictMeanResponse, so none of them
// refactorises the n x p design.
import type { DesignMatrix, LeastSquaresFit } from '../types.ts';
import { estimableRow, quadraticForm, weightAt } from './design-rows.ts';
import { weightedBasis, type WeightedBasis } from './orthonormal-basis.ts';
import { leveragesAndProjections } from './streamed-qr.ts';

export interface AuxiliaryRegression {
  /** R^2 of the regression on a constant and the regressors. */
  rSquared: number;
  /** Independent non-constant regressors. */
  slopes: number;
}

export interface ModelGeometry {
  /** Null when the estimable columns are numerically dependent; leverages then come from the fit's covariance. */
  basis: WeightedBasis | null;
  /** h_ii = w_i x_i' (X'WX)^-1 x_i per row. */
  leverages: Float64Array;
  /**
   * The squared residuals regressed on a constant and the model's regressors
   * (Koenker's Breusch–Pagan test), when that regression's column space is the
   * basis's own: no weights and an estimable intercept. Null otherwise (the
   * diagnostics then factorise the regressors themselves).
   */
  squaredResidualRegression: AuxiliaryRegression | null;
}

export function modelGeometry(fit: LeastSquaresFit, design: DesignMatrix, weights?: ArrayLike<number>): ModelGeometry {
  const basis = weightedBasis(fit, design, weights);
  if (!basis) return { basis, leverages: covarianceLeverages(fit, design, weights), squaredResidualRegression: null };
  const spansRegressors = weights === undefined && basis.interceptFirst;
  const n = design.rows;
  const centred = new Float64Array(n);
  let total = 0;
  if (spansRegressors) {
    let mean = 0;
    for (let i = 0; i < n; i++) mean += fit.residuals[i] * fit.residuals[i];
    mean /= n;
    for (let i = 0; i < n; i++) {
      centred[i] = fit.residuals[i] * fit.residuals[i] - mean;
      total += centred[i] * centred[i];
    }
  }
  const { leverages, projections } = leveragesAndProjections(basis.columns, basis.r, spansRegressors ? [centred] : []);
  let squaredResidualRegression: AuxiliaryRegression | null = null;
  if (spansRegressors) {
    // The centred response is orthogonal to the constant (basis column 0), so
    // the explained part is its projection on the other columns.
    let explained = 0;
    for (let k = 1; k < basis.order.length; k++) explained += projections[0][k] * projections[0][k];
    squaredResidualRegression = total > 0 && basis.order.length > 1
      ? { rSquared: Math.min(1, explained / total), slopes: basis.order.length - 1 }
      : { rSquared: 0, slopes: 0 };
  }
  return { basis, leverages: leverages!, squaredResidualRegression };
}

/** The fallback for dependent columns: w_i x_i' C x_i from the fit's unscaled covariance. */
function covarianceLeverages(fit: LeastSquaresFit, design: DesignMatrix, weights?: ArrayLike<number>): Float64Array {
  const h = new Float64Array(design.rows);
  for (let i = 0; i < design.rows; i++) {
    h[i] = weightAt(weights, i) * quadraticForm(fit.unscaledCovariance, estimableRow(design, fit, i));
  }
  return h;
}
