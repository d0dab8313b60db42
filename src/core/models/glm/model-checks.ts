// The checks of a generalised linear model, in the shape every model reports
// (ModelDiagnostics) plus the family's own (`glm`): overdispersion and the
// standardised deviance residuals. Leverage and Cook's distance come from the
// weighted design at the final IRLS weights (after-ranking.ts), as do the
// variance inflation factors. The normal-error checks of least squares mean
// nothing for a count or pass/fail family: they are made (on Pearson
// residuals) only for the Gaussian family, and said not to apply otherwise.
import { chiSquareQuantile, chiSquareUpperTail } from '../../inference/distributions.ts';
import { modelGeometry, type ModelGeometry } from '../../inference/model-geometry.ts';
import { diagnosticCautions, DIAGNOSTIC_THRESHOLDS as T, NORMALITY_NOTE, TIME_ORDER_NOTE } from '../../diagnostics/index.ts';
import { multicollinearityCheck } from '../../diagnostics/multicollinearity.ts';
import { durbinWatson, jarqueBera } from '../../diagnostics/residual-tests.ts';
import type { DevianceResidualCheck, ModelDiagnostics, OverdispersionCheck } from '../../diagnostics/types.ts';
import type { Caution } from '../../scoring/cautions.ts';
import type { DesignMatrix } from '../../types.ts';
import type { ModelChecks } from '../scored-model.ts';
import { glmInfluence, glmResiduals } from './after-ranking.ts';
import type { GlmFit } from './types.ts';

/** |standardised deviance residual| above this is a poorly described row (common practice: rare, about 3 in 1000, for a standard normal). */
export const DEVIANCE_RESIDUAL_THRESHOLD = 3;
/** A ratio above this reads as lack of fit more than extra variation (Burnham & Anderson 2002; from memory). */
const STRUCTURAL_RATIO = 4;
const FIXED_DISPERSION = new Set(['binomial', 'poisson', 'negativeBinomial']);

export const GLM_LOO_NOTE = 'Leave-one-out error is not reported for a generalised linear model: leaving a row out needs a new IRLS fit (there is no exact shortcut as for least squares), and the one-step approximation is not an exact leave-one-out. Compare these models by their criteria and deviance tests.';

const NOT_NORMAL_NOTE = 'Not a check for this family: a generalised linear model takes the response\'s distribution from its family, not from normal errors; see glm.devianceResiduals and glm.overdispersion.';
const VARIANCE_NOTE = 'Not a check for this family: its variance function states how the spread grows with the mean, and glm.overdispersion tests that as a whole.';

export interface GlmCheckContext {
  /** Data row of each row the fit used. */
  rows: readonly number[];
  /** A binomial fitted to successes out of trials (false for a 0/1 response). */
  grouped: boolean;
}

export function overdispersionCheck(fit: GlmFit, grouped: boolean): OverdispersionCheck {
  const df = fit.residualDf;
  const x2 = fit.pearsonChiSquare;
  const ratio = df > 0 ? x2 / df : null;
  const base = { pearsonChiSquare: x2, residualDf: df, ratio, threshold: null, pValue: null, passed: null };
  if (!FIXED_DISPERSION.has(fit.family)) {
    return { ...base, note: `The ${fit.family} family estimates its dispersion, so Pearson χ²/df is an estimate of it rather than a check of the family's variance.` };
  }
  if (ratio === null) return { ...base, note: 'The model leaves no residual degrees of freedom, so overdispersion cannot be assessed.' };
  if (fit.family === 'binomial' && !grouped) {
    return { ...base, note: 'With a 0/1 response each row is one trial, and Pearson χ² does not measure overdispersion; send successes out of trials (request-level trials) to check it.' };
  }
  const threshold = chiSquareQuantile(1 - T.alpha, df) / df;
  const pValue = chiSquareUpperTail(x2, df);
  return {
    ...base, threshold, pValue, passed: pValue >= T.alpha,
    note: `The threshold is the upper ${T.alpha} point of χ²(${df})/${df}: under the family's variance Pearson χ² is roughly χ² on the residual degrees of freedom, so a ratio above it is unlikely by chance (large-sample; unreliable when many expected counts are below about 5).`,
  };
}

function devianceResidualCheck(fit: GlmFit, deviance: Float64Array, leverages: Float64Array, rows: readonly number[]): DevianceResidualCheck {
  const phi = fit.dispersion.value;
  let maxAbsolute: number | null = null;
  let maxAt: number | null = null;
  const large: number[] = [];
  for (let i = 0; i < deviance.length; i++) {
    // A row of leverage 1 is fitted exactly whatever its value: its residual has no spread to standardise by.
    const spread = phi * (1 - leverages[i]);
    if (!(spread > 1e-12 * phi)) continue;
    const r = Math.abs(deviance[i]) / Math.sqrt(spread);
    if (maxAbsolute === null || r > maxAbsolute) { maxAbsolute = r; maxAt = i; }
    if (r > DEVIANCE_RESIDUAL_THRESHOLD) large.push(rows[i]);
  }
  return {
    maxAbsolute, maxAbsoluteRow: maxAt === null ? null : rows[maxAt], threshold: DEVIANCE_RESIDUAL_THRESHOLD,
    largeRows: large.length, largeRowIndices: large, passed: maxAbsolute === null ? null : large.length === 0,
    note: `Deviance residuals divided by √(φ (1 − h)), φ = ${phi === 1 ? '1 (fixed by the family)' : 'the dispersion the standard errors use'}: roughly standard normal where the model holds, less so for small counts.`,
  };
}

/** Standardised deviance residuals r_D / √(φ (1 − h)); null at a row of leverage 1. */
export function standardisedDevianceResiduals(fit: GlmFit, deviance: Float64Array, leverages: Float64Array): (number | null)[] {
  const phi = fit.dispersion.value;
  return Array.from(deviance, (r, i) => {
    const spread = phi * (1 - leverages[i]);
    return spread > 1e-12 * phi ? r / Math.sqrt(spread) : null;
  });
}

function familyCautions(fit: GlmFit, o: OverdispersionCheck, d: DevianceResidualCheck): Caution[] {
  const out: Caution[] = [];
  if (o.passed === false) {
    const structural = o.ratio! > STRUCTURAL_RATIO
      ? ` A ratio above ${STRUCTURAL_RATIO} usually means the model itself is wrong (a missing term, a wrong link) more than extra variation; a correction for overdispersion would hide that.`
      : '';
    out.push({
      code: 'assumption_check',
      message: `The data vary more than the ${fit.family} family allows (Pearson χ²/df = ${fmt(o.ratio)}, above ${fmt(o.threshold)}, p = ${fmt(o.pValue)}). Its standard errors are then too small and AIC-type criteria favour larger models; consider options.overdispersion (QAIC), a negative binomial family for counts, or a missing term.${structural}`,
    });
  }
  if (d.passed === false) {
    out.push({
      code: 'assumption_check',
      message: `${d.largeRows} row(s) are described poorly (standardised deviance residual beyond ±${d.threshold}; the largest, ${fmt(d.maxAbsolute)}, at row ${d.maxAbsoluteRow}): check them for recording errors and see whether the ranking changes without them.`,
    });
  }
  return out;
}

export function glmModelChecks(
  fit: GlmFit,
  design: DesignMatrix,
  { rows, grouped }: GlmCheckContext,
  geometry: ModelGeometry = modelGeometry(fit.working.fit, design, fit.working.weights),
): ModelChecks {
  const residuals = glmResiduals(fit);
  const { leverages, cooksDistances } = glmInfluence(fit, design, geometry, residuals.pearson);
  const n = fit.observations;
  const leverageThreshold = (T.leverageMultiple * fit.rank) / n;
  let maxCooks: number | null = null;
  let maxCooksAt: number | null = null;
  cooksDistances.forEach((c, i) => {
    if (c !== null && (maxCooks === null || c > maxCooks)) { maxCooks = c; maxCooksAt = i; }
  });
  const high: number[] = [];
  leverages.forEach((h, i) => { if (h > leverageThreshold) high.push(rows[i]); });
  const gaussian = fit.family === 'gaussian' && fit.residualDf > 0;
  const jb = gaussian ? jarqueBera(residuals.pearson) : null;
  const dw = fit.residualDf > 0 ? durbinWatson(residuals.pearson) : null;
  const overdispersion = overdispersionCheck(fit, grouped);
  const devianceResiduals = devianceResidualCheck(fit, residuals.deviance, leverages, rows);
  const diagnostics: ModelDiagnostics = {
    available: true,
    reason: null,
    residualNormality: {
      test: 'Jarque–Bera', statistic: jb?.statistic ?? null, df: 2, pValue: jb?.pValue ?? null, skewness: jb?.skewness ?? null, kurtosis: jb?.kurtosis ?? null,
      alpha: T.alpha, passed: jb === null || jb.pValue === null ? null : jb.pValue >= T.alpha, note: gaussian ? `On the Pearson residuals. ${NORMALITY_NOTE}` : NOT_NORMAL_NOTE,
    },
    heteroscedasticity: { test: 'Breusch–Pagan (studentised, Koenker)', statistic: null, df: null, pValue: null, alpha: T.alpha, passed: null, note: VARIANCE_NOTE },
    autocorrelation: {
      test: 'Durbin–Watson', statistic: dw, acceptableRange: T.durbinWatsonRange,
      passed: dw === null ? null : dw >= T.durbinWatsonRange[0] && dw <= T.durbinWatsonRange[1], note: `On the Pearson residuals. ${TIME_ORDER_NOTE}`,
    },
    multicollinearity: multicollinearityCheck(fit.working.fit, design, fit.working.weights, geometry),
    influence: {
      maxCooksDistance: maxCooks, maxCooksDistanceRow: maxCooksAt === null ? null : rows[maxCooksAt], cooksDistanceThreshold: T.cooksDistance,
      leverageThreshold, highLeverageRows: high.length, highLeverageRowIndices: high,
      passed: (maxCooks === null || maxCooks <= T.cooksDistance) && high.length === 0,
    },
    glm: { overdispersion, devianceResiduals },
  };
  const cautions: Caution[] = [
    ...diagnosticCautions(diagnostics).map((message) => ({ code: 'assumption_check', message })),
    ...familyCautions(fit, overdispersion, devianceResiduals),
  ];
  return { press: null, looRmse: null, looNote: GLM_LOO_NOTE, diagnostics, cautions };
}

function fmt(x: number | null): string {
  if (x === null) return 'n/a';
  if (x !== 0 && (Math.abs(x) < 1e-3 || Math.abs(x) >= 1e5)) return x.toExponential(2);
  return String(Math.round(x * 1000) / 1000);
}
