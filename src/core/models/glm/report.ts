// A generalised linear model as the answer reports it: the shared ModelResult
// (criteria from the full log-likelihood, coefficients with their Wald tests)
// plus the fields only this kind has (family, link, deviances, distribution
// parameters, convergence). R² exists only for the Gaussian family; every
// other family reports devianceExplained instead and says why R² is null.
import { chiSquareUpperTail, normalQuantile } from '../../inference/distributions.ts';
import { coefficientTest, twoSidedCritical, type CoefficientTest } from '../../inference/coefficient-tests.ts';
import { computeCriteria } from '../../scoring/criteria.ts';
import type { Caution } from '../../scoring/cautions.ts';
import { criteriaFields, finiteOrNull, NOT_CHECKED } from '../model-fields.ts';
import type { CoefficientResult, ModelResult } from '../model-result.ts';
import type { GlmFamilyName, GlmFit } from './types.ts';

/** Families whose dispersion is estimated, so their Wald statistics are referred to t on n − rank df (as R's summary.glm does). */
const ESTIMATED_DISPERSION: ReadonlySet<GlmFamilyName> = new Set(['gaussian', 'gamma', 'inverseGaussian']);

export function r2Caution(family: GlmFamilyName): Caution {
  return {
    code: 'r2_not_defined',
    message: `R² and adjusted R² are null: they measure squared error about the mean, which is not the ${family} model's likelihood; devianceExplained (1 − deviance/nullDeviance) is reported instead.`,
  };
}

/** The Wald test of one coefficient: z against the standard normal when the dispersion is fixed at 1, else t. */
function waldTest(estimate: number | null, se: number | null, family: GlmFamilyName, df: number, level: number): CoefficientTest {
  if (ESTIMATED_DISPERSION.has(family)) return coefficientTest(estimate, se, df, twoSidedCritical(level, df));
  if (estimate === null || se === null || !(se > 0) || !Number.isFinite(se)) return { tStatistic: null, pValue: null, lower: null, upper: null };
  const z = estimate / se;
  const half = normalQuantile((1 + level) / 2) * se;
  return { tStatistic: finiteOrNull(z), pValue: finiteOrNull(chiSquareUpperTail(z * z, 1)), lower: estimate - half, upper: estimate + half };
}

export function glmModelResult(name: string, fit: GlmFit, intercept: boolean, intervalLevel: number): ModelResult {
  const gaussian = fit.family === 'gaussian';
  const criteria = computeCriteria({
    logLikelihood: fit.logLikelihood,
    parameters: fit.parameters,
    observations: fit.observations,
    // R² for the Gaussian family only: its deviance is the residual sum of squares.
    rss: gaussian ? fit.deviance : null,
    tss: gaussian ? fit.nullDeviance : null,
    coefficientsIncludingIntercept: fit.rank,
    intercept,
  });
  const cautions: Caution[] = [...fit.cautions];
  for (const c of criteria.cautions) cautions.push({ code: c.code, message: c.message });
  if (!gaussian) cautions.push(r2Caution(fit.family));
  const coefficients: CoefficientResult[] = fit.coefficients.map((c) => ({
    ...c, ...waldTest(c.estimate, c.standardError, fit.family, fit.residualDf, intervalLevel),
  }));
  return {
    name,
    source: 'fit',
    estimation: 'ml',
    intercept,
    parameters: fit.parameters,
    observations: fit.observations,
    ...criteriaFields(fit.logLikelihood, gaussian ? fit.deviance : null, criteria),
    r2Basis: gaussian ? (intercept ? 'centred' : 'uncentred') : null,
    sigma: gaussian && fit.residualDf > 0 ? Math.sqrt(fit.deviance / fit.residualDf) : null,
    responseTransform: null,
    coefficients,
    aliased: fit.aliased,
    conditionNumber: fit.conditionNumber,
    ...NOT_CHECKED,
    cautions,
    family: fit.family,
    link: fit.link,
    deviance: finiteOrNull(fit.deviance),
    nullDeviance: finiteOrNull(fit.nullDeviance),
    pearsonChiSquare: finiteOrNull(fit.pearsonChiSquare),
    distributionParameters: fit.distributionParameters,
    convergence: fit.convergence,
    devianceExplained: finiteOrNull(fit.devianceExplained),
  };
}
