// The fit's own coordinates. Newton's method is affine invariant in exact
// arithmetic, but its damping, step cap and Cholesky pivots are not, and a
// design column such as 1/kelvin (≈ 0.003) or a time in seconds (≈ 10^7)
// would otherwise put the parameters on scales 10^10 apart. So the fit works
// with centred, unit-spread design columns and the response scale
// y' = (y - centre)/spread, and maps estimates and covariance back exactly:
//   y = centre + spread·y',  x'_j = (x_j - m_j)/s_j  give
//   β_j = spread γ_j / s_j,  β_0 = centre + spread γ_0 - Σ_j β_j m_j,
//   ln σ = ln σ' + ln spread,
// a linear map θ = J θ' + o whose covariance is J C' Jᵀ.
import type { DesignMatrix } from '../../types.ts';

export interface StandardisedDesign {
  /** Estimable design columns in the fit's coordinates, column-major. */
  columns: Float64Array[];
  /** Index (into `columns`) of the intercept, or -1. */
  intercept: number;
  means: Float64Array;
  spreads: Float64Array;
}

/** Centred (with an intercept) and unit-spread copies of the estimable columns. */
export function standardiseDesign(design: DesignMatrix, estimable: readonly number[]): StandardisedDesign {
  const n = design.rows;
  const intercept = estimable.findIndex((j) => design.termOfColumn[j] === -1);
  const means = new Float64Array(estimable.length);
  const spreads = new Float64Array(estimable.length).fill(1);
  const columns = estimable.map((j, k) => {
    const x = new Float64Array(n);
    for (let i = 0; i < n; i++) x[i] = design.high[j][i] + design.low[j][i];
    if (k === intercept) return x;
    let mean = 0;
    if (intercept >= 0) {
      for (let i = 0; i < n; i++) mean += x[i];
      mean /= n;
    }
    let square = 0;
    for (let i = 0; i < n; i++) square += (x[i] - mean) * (x[i] - mean);
    const spread = Math.sqrt(square / n);
    means[k] = mean;
    spreads[k] = spread > 0 ? spread : 1;
    for (let i = 0; i < n; i++) x[i] = (x[i] - mean) / spreads[k];
    return x;
  });
  return { columns, intercept, means, spreads };
}

export interface ResponseScaling {
  centre: number;
  spread: number;
}

/**
 * J (row-major m×m) and o of θ = J θ' + o, for θ' = (γ, s') and θ = (β, s);
 * `extraFree` adds the last row and column for s = s' + ln spread.
 */
export function backTransform(design: StandardisedDesign, scaling: ResponseScaling, extraFree: boolean): { jacobian: Float64Array; offset: Float64Array; dimension: number } {
  const p = design.columns.length;
  const m = p + (extraFree ? 1 : 0);
  const jacobian = new Float64Array(m * m);
  const offset = new Float64Array(m);
  const { spread, centre } = scaling;
  for (let j = 0; j < p; j++) {
    if (j === design.intercept) continue;
    jacobian[j * m + j] = spread / design.spreads[j];
    if (design.intercept >= 0) jacobian[design.intercept * m + j] = -spread * design.means[j] / design.spreads[j];
  }
  if (design.intercept >= 0) {
    jacobian[design.intercept * m + design.intercept] = spread;
    offset[design.intercept] = centre;
  }
  if (extraFree) {
    jacobian[p * m + p] = 1;
    offset[p] = Math.log(spread);
  }
  return { jacobian, offset, dimension: m };
}

/** θ' = J⁻¹(θ - o) for the location part: the fit's coordinates of coefficients on the data's scale. */
export function toFitCoordinates(design: StandardisedDesign, scaling: ResponseScaling, beta: ArrayLike<number>): Float64Array {
  const p = design.columns.length;
  const gamma = new Float64Array(p);
  let interceptShift = 0;
  for (let j = 0; j < p; j++) {
    if (j === design.intercept) continue;
    gamma[j] = beta[j] * design.spreads[j] / scaling.spread;
    interceptShift += beta[j] * design.means[j];
  }
  if (design.intercept >= 0) gamma[design.intercept] = (beta[design.intercept] + interceptShift - scaling.centre) / scaling.spread;
  return gamma;
}
