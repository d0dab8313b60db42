// What a model reports from the R factor of its last weighted solve: the
// unscaled covariance (X'WX)^-1 in the caller's columns and the condition
// number of the weighted, centred, unit-length design.
//
// In the factor's basis V_k = √W (x_k - c_k) / s_k (the intercept
// uncentred) the covariance is (R'R)^-1 = U U' with U = R^-1, as the
// least-squares engine's plain route computes it (fit/covariance.ts, error
// about 2 κ eps). The caller's coefficients are b = L γ with
//   b_k = γ_k / s_k                                   (k not the intercept)
//   b_0 = γ_0 / s_0 - Σ_k (c_k / a) γ_k / s_k          (intercept column = a)
// so Cov(b) = L U U' L'. Centring puts the other columns near the intercept's
// orthogonal complement, so the intercept's row of that sum loses no more
// digits than the factor itself.
import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { inverseUpper, type StepFactor } from './weighted-step.ts';

/** Estimable columns in design order, and (X'WX)^-1 over them in that order. */
export function factorCovariance(factor: StepFactor): { estimable: number[]; covariance: number[][] } {
  const q = factor.columns.length;
  const width = q + 1;
  const u = inverseUpper(factor.r, width, q);
  // Rows of L U: (L U)_k = Σ_m L_km U_m.
  const lu: Float64Array[] = [];
  for (let k = 0; k < q; k++) {
    const row = new Float64Array(q);
    for (let l = 0; l < q; l++) row[l] = u[k * q + l] / factor.scale[k];
    lu.push(row);
  }
  if (factor.intercept && factor.centre) {
    const a = factor.interceptValue;
    for (let k = 1; k < q; k++) {
      const f = factor.centre[k] / a;
      for (let l = 0; l < q; l++) lu[0][l] -= f * lu[k][l];
    }
  }
  const order = factor.columns.map((j, k) => [j, k] as const).sort((x, y) => x[0] - y[0]);
  const covariance = order.map(([, a]) => order.map(([, b]) => {
    let s = 0;
    for (let l = 0; l < q; l++) s += lu[a][l] * lu[b][l];
    return s;
  }));
  return { estimable: order.map(([j]) => j), covariance };
}

/** σ_max / σ_min of R11 (the weighted, centred, unit-length design); NaN with no columns. */
export function factorCondition(factor: StepFactor): number {
  const q = factor.columns.length;
  if (q === 0) return Number.NaN;
  const width = q + 1;
  const rows = Array.from({ length: q }, (_, k) => Array.from({ length: q }, (_, l) => (l >= k ? factor.r[k * width + l] : 0)));
  const s = new SingularValueDecomposition(new Matrix(rows), { computeLeftSingularVectors: false, computeRightSingularVectors: false }).diagonal;
  const min = Math.min(...s);
  return min > 0 ? Math.max(...s) / min : Infinity;
}
