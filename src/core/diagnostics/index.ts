// Assumption checks of one least-squares fit: residual normality,
// heteroscedasticity, autocorrelation, multicollinearity and influence.
import type { DesignMatrix, LeastSquaresFit } from '../types.ts';
import { modelGeometry, type ModelGeometry } from '../inference/model-geometry.ts';
import { diagnosticCautions } from './cautions.ts';
import { cooksDistances } from './influence.ts';
import { designColumn, multicollinearityCheck } from './multicollinearity.ts';
import { breuschPaganFromAuxiliary, breuschPaganKoenker, durbinWatson, jarqueBera } from './residual-tests.ts';
import { DIAGNOSTIC_THRESHOLDS as T } from './thresholds.ts';
import type { DiagnosedFit } from './types.ts';

export type { DiagnosedFit, ModelDiagnostics } from './types.ts';
export { DIAGNOSTIC_THRESHOLDS } from './thresholds.ts';
export { diagnosticCautions } from './cautions.ts';
export { jarqueBera, breuschPaganKoenker, breuschPaganFromAuxiliary, durbinWatson } from './residual-tests.ts';
export { varianceInflationFactors, scaledConditionNumber } from './collinearity.ts';
export { cooksDistances } from './influence.ts';

export const NORMALITY_NOTE = 'Jarque–Bera compares the residuals\' skewness and kurtosis with a normal distribution; its chi-square p-value is a large-sample approximation and is lenient below about 30 rows.';
export const TIME_ORDER_NOTE = 'Durbin–Watson is meaningful only when the row order is time (or another sequence) order; otherwise ignore it.';

/**
 * Every check from one pass over the design: the model's geometry (R factor
 * and leverages, see inference/model-geometry.ts) is computed here unless the
 * caller passes the one it already has for the leave-one-out error.
 */
export function diagnoseFit(
  fit: LeastSquaresFit,
  design: DesignMatrix,
  weights?: ArrayLike<number>,
  geometry: ModelGeometry = modelGeometry(fit, design, weights),
): DiagnosedFit {
  const n = fit.observations;
  const p = fit.rank;
  const leverageThreshold = (T.leverageMultiple * p) / n;
  const multicollinearity = multicollinearityCheck(fit, design, weights, geometry);

  // Residuals beyond about 1e154 square past the largest double: every moment
  // and distance would be Infinity or NaN, so the checks are not made.
  const overflow = !Number.isFinite(fit.rss);
  const residualsUsable = fit.sigma !== null && !fit.exactFit && n > p && !overflow;
  if (!residualsUsable) {
    const reason = fit.exactFit
      ? 'The model fits the data exactly, so its residuals carry no information about the errors.'
      : overflow
        ? 'The residuals are too large to square in double precision, so the residual checks cannot be made; rescale the response.'
        : 'The model leaves no residual degrees of freedom, so the residual checks cannot be made.';
    const partial = {
      available: false,
      reason,
      residualNormality: { test: 'Jarque–Bera' as const, statistic: null, df: 2 as const, pValue: null, skewness: null, kurtosis: null, alpha: T.alpha, passed: null, note: NORMALITY_NOTE },
      heteroscedasticity: { test: 'Breusch–Pagan (studentised, Koenker)' as const, statistic: null, df: null, pValue: null, alpha: T.alpha, passed: null, note: reason },
      autocorrelation: { test: 'Durbin–Watson' as const, statistic: null, acceptableRange: T.durbinWatsonRange, passed: null, note: TIME_ORDER_NOTE },
      multicollinearity,
      influence: { maxCooksDistance: null, maxCooksDistanceRow: null, cooksDistanceThreshold: T.cooksDistance, leverageThreshold, highLeverageRows: 0, highLeverageRowIndices: [], passed: null },
    };
    return { ...partial, cautions: diagnosticCautions(partial) };
  }

  const standardised = fit.residuals.map((e, i) => Math.sqrt(weights ? weights[i] : 1) * e);
  const jb = jarqueBera(standardised);
  // The geometry holds the auxiliary regression when the model's basis spans
  // it (no weights, an intercept); otherwise the regressors are factorised here.
  const bp = geometry.squaredResidualRegression
    ? breuschPaganFromAuxiliary(standardised.length, geometry.squaredResidualRegression)
    : breuschPaganKoenker(standardised, fit.estimable.filter((j) => design.termOfColumn[j] !== -1).map((j) => designColumn(design, j)));
  const dw = durbinWatson(standardised);
  const h = geometry.leverages;
  const cooks = cooksDistances(fit.residuals, h, p, fit.sigma as number, weights);
  let maxCooks: number | null = null;
  let maxCooksRow: number | null = null;
  for (let i = 0; i < cooks.length; i++) {
    const d = cooks[i];
    if (d !== null && (maxCooks === null || d > maxCooks)) { maxCooks = d; maxCooksRow = i; }
  }
  const highLeverageRowIndices: number[] = [];
  for (let i = 0; i < h.length; i++) if (h[i] > leverageThreshold) highLeverageRowIndices.push(i);

  const partial = {
    available: true,
    reason: null,
    residualNormality: {
      test: 'Jarque–Bera' as const, statistic: jb.statistic, df: jb.df, pValue: jb.pValue, skewness: jb.skewness, kurtosis: jb.kurtosis,
      alpha: T.alpha, passed: jb.pValue === null ? null : jb.pValue >= T.alpha,
      note: jb.undefinedReason === null ? NORMALITY_NOTE : `${jb.undefinedReason} ${NORMALITY_NOTE}`,
    },
    heteroscedasticity: {
      test: 'Breusch–Pagan (studentised, Koenker)' as const,
      statistic: bp.df > 0 ? bp.statistic : null, df: bp.df, pValue: bp.pValue, alpha: T.alpha,
      passed: bp.pValue === null ? null : bp.pValue >= T.alpha,
      note: bp.df > 0 ? null : 'The model has no regressor that varies from row to row, so there is nothing for the error variance to depend on.',
    },
    autocorrelation: {
      test: 'Durbin–Watson' as const, statistic: dw, acceptableRange: T.durbinWatsonRange,
      passed: dw >= T.durbinWatsonRange[0] && dw <= T.durbinWatsonRange[1], note: TIME_ORDER_NOTE,
    },
    multicollinearity,
    influence: {
      maxCooksDistance: maxCooks, maxCooksDistanceRow: maxCooksRow, cooksDistanceThreshold: T.cooksDistance,
      leverageThreshold, highLeverageRows: highLeverageRowIndices.length, highLeverageRowIndices,
      // Rank 0: nothing was estimated, so there is no influence to judge (see the multicollinearity note).
      passed: p === 0 ? null : (maxCooks === null || maxCooks <= T.cooksDistance) && highLeverageRowIndices.length === 0,
    },
  };
  return { ...partial, cautions: diagnosticCautions(partial) };
}
