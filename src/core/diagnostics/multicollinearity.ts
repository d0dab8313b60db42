// The multicollinearity check of one fit, read off the model's geometry: the
// R factor of the weighted design gives the scaled condition number, and with
// the intercept factorised first its trailing block gives the variance
// inflation factors, so the n x p design is not factorised again. Only a
// design without an intercept (whose centred columns the basis does not
// hold) or with numerically dependent columns factorises its columns here.
import type { DesignMatrix, LeastSquaresFit } from '../types.ts';
import type { ModelGeometry } from '../inference/model-geometry.ts';
import { designFactor } from '../inference/orthonormal-basis.ts';
import { scaledConditionNumber, varianceInflationFactors } from './collinearity.ts';
import { conditionFromFactor, inflationFromFactor } from './scaled-factor.ts';
import { DIAGNOSTIC_THRESHOLDS as T } from './thresholds.ts';
import type { MulticollinearityCheck } from './types.ts';

/** Column j of the design, high + low rounded once. */
export function designColumn(design: DesignMatrix, j: number): Float64Array {
  const out = new Float64Array(design.rows);
  const high = design.high[j], low = design.low[j];
  for (let i = 0; i < design.rows; i++) out[i] = high[i] + low[i];
  return out;
}

function isConstant(design: DesignMatrix, j: number): boolean {
  const first = design.high[j][0] + design.low[j][0];
  for (let i = 1; i < design.rows; i++) if (design.high[j][i] + design.low[j][i] !== first) return false;
  return true;
}

/** Said once, here, for both checks that need estimated coefficients (the influence check has no note of its own). */
export const NO_COEFFICIENTS_NOTE =
  'The model estimates no coefficients, so there are no columns to be collinear and no fitted value a single row could move: the multicollinearity and influence checks do not apply.';

export function multicollinearityCheck(
  fit: LeastSquaresFit,
  design: DesignMatrix,
  weights: ArrayLike<number> | undefined,
  geometry: ModelGeometry,
): MulticollinearityCheck {
  const slopeIndices = fit.estimable.filter((j) => design.termOfColumn[j] !== -1);
  const basis = geometry.basis;
  const conditionNumber = basis
    ? conditionFromFactor(designFactor(basis), basis.order.length, design.rows)
    : scaledConditionNumber(fit.estimable.map((j) => designColumn(design, j)), weights);
  // The basis lists the slopes in fit order after the intercept, as slopeIndices does.
  const vifs = basis && basis.interceptFirst
    ? inflationFromFactor(basis.r, basis.order.length, design.rows)
    : varianceInflationFactors(slopeIndices.map((j) => designColumn(design, j)), weights);
  const finiteVifs = vifs.filter((v): v is number => v !== null);
  // A null VIF on a column that varies means exact collinearity once centred
  // (possible only without an intercept): inflation without bound.
  const unbounded = vifs.some((v, k) => v === null && !isConstant(design, slopeIndices[k]));
  const maxVif = unbounded || finiteVifs.length === 0 ? null : Math.max(...finiteVifs);
  const notes: string[] = [];
  if (fit.rank === 0) notes.push(NO_COEFFICIENTS_NOTE);
  else if (!design.intercept) notes.push('The model has no intercept; the variance inflation factors are computed on centred columns all the same.');
  if (unbounded) notes.push('Once centred, some columns are exactly collinear, so their variance inflation is unbounded.');
  return {
    varianceInflationFactors: slopeIndices.map((j, k) => ({ term: design.labels[j], vif: vifs[k] })),
    maxVarianceInflation: maxVif,
    varianceInflationThreshold: T.varianceInflation,
    conditionNumber,
    conditionNumberThreshold: T.conditionNumber,
    passed: conditionNumber === null
      ? null
      : !unbounded && (maxVif === null || maxVif <= T.varianceInflation) && conditionNumber <= T.conditionNumber,
    note: notes.length ? notes.join(' ') : null,
  };
}
