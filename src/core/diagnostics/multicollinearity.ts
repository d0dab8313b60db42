// The multicollinearity check of one fit, read off the model's geometry. The
// check rests on the centred regressors: their variance inflation factors and
// the condition number of the centred columns scaled to unit length. With the
// intercept factorised first, the trailing block of the R factor is exactly
// that, so the n x p design is not factorised again. The condition number of
// the uncentred design (Belsley, Kuh & Welsch's scaled one, intercept
// included) is reported as information only: it is large for any data far
// from zero — a one-regressor model of kiln temperatures near 1200 — though
// nothing is collinear. Only a design without an intercept (whose centred
// columns the basis does not hold) or with numerically dependent columns
// factorises its columns here.
import type { DesignMatrix, LeastSquaresFit } from '../types.ts';
import { keyKind } from '../design/column-identity.ts';
import type { ModelGeometry } from '../inference/model-geometry.ts';
import { designFactor } from '../inference/orthonormal-basis.ts';
import { scaledConditionNumber } from './collinearity.ts';
import { centredConditionFromFactor, centringFactor, conditionFromFactor, inflationFromFactor } from './scaled-factor.ts';
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
  // Information only: the uncentred number grows with the data's distance from zero.
  const uncentredConditionNumber = basis
    ? conditionFromFactor(designFactor(basis), basis.order.length, design.rows)
    : scaledConditionNumber(fit.estimable.map((j) => designColumn(design, j)), weights);
  // The basis lists the slopes in fit order after the intercept, as slopeIndices does.
  const centred = basis && basis.interceptFirst
    ? { r: basis.r, p: basis.order.length }
    : { r: centringFactor(slopeIndices.map((j) => designColumn(design, j)), weights), p: slopeIndices.length + 1 };
  const vifs = slopeIndices.length === 0 ? [] : inflationFromFactor(centred.r, centred.p, design.rows);
  const conditionNumber = slopeIndices.length === 0 ? null : centredConditionFromFactor(centred.r, centred.p, design.rows);
  const finiteVifs = vifs.filter((v): v is number => v !== null);
  // A null VIF on a column that varies means exact collinearity once centred
  // (possible only without an intercept): inflation without bound.
  const unbounded = vifs.some((v, k) => v === null && !isConstant(design, slopeIndices[k]));
  const maxVif = unbounded || finiteVifs.length === 0 ? null : Math.max(...finiteVifs);
  const notes: string[] = [];
  if (fit.rank === 0) notes.push(NO_COEFFICIENTS_NOTE);
  else if (slopeIndices.length === 0) notes.push('The model has no regressor besides the intercept, so nothing can be collinear.');
  else if (!design.intercept) notes.push('The model has no intercept; the variance inflation factors and the condition number are computed on centred columns all the same.');
  if (unbounded) notes.push('Once centred, some columns are exactly collinear, so their variance inflation is unbounded.');
  const built = builtFromInflated(design, slopeIndices, vifs);
  if (built.length > 0) {
    notes.push(`${built.map((l) => JSON.stringify(l)).join(', ')} ${built.length === 1 ? 'is a power or product' : 'are powers or products'} of columns far from zero, nearly collinear with the columns ${built.length === 1 ? 'it is' : 'they are'} built from by construction: the fit and the criteria are unaffected, and centring those columns before forming the power or product (the same model) removes most of it.`);
  }
  return {
    varianceInflationFactors: slopeIndices.map((j, k) => ({ term: design.labels[j], vif: vifs[k] ?? null })),
    maxVarianceInflation: maxVif,
    varianceInflationThreshold: T.varianceInflation,
    conditionNumber,
    conditionNumberThreshold: T.conditionNumber,
    uncentredConditionNumber,
    passed: unbounded
      ? false
      : slopeIndices.length === 0 || conditionNumber === null
        ? null
        : (maxVif === null || maxVif <= T.varianceInflation) && conditionNumber <= T.conditionNumber,
    note: notes.length ? notes.join(' ') : null,
  };
}

/**
 * Inflated columns that are powers or products (by their identity, never
 * their label): their collinearity with their own factors is structural, and
 * centring before forming them is the usual remedy (common practice).
 */
function builtFromInflated(design: DesignMatrix, slopeIndices: readonly number[], vifs: readonly (number | null)[]): string[] {
  if (!design.keys) return [];
  const out: string[] = [];
  slopeIndices.forEach((j, k) => {
    const v = vifs[k];
    const kind = keyKind(design.keys![j]);
    if (v !== null && v > T.varianceInflation && (kind === 'power' || kind === 'product')) out.push(design.labels[j]);
  });
  return out;
}
