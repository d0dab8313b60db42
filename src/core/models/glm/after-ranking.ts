// Statistics of one fitted model after the ranking, each the GLM form of its
// least-squares counterpart (McCullagh & Nelder 1989, §12; R's
// residuals.glm, hatvalues, cooks.distance.glm):
//   response residual  y - μ (mean scale: proportions for the binomial)
//   Pearson residual   (y - μ) √(prior / V(μ))
//   deviance residual  sign(y - μ) √(prior × unit deviance)
//   working residual   (y - μ) / (dμ/dη)
//   leverage           h_i = w_i x_i'(X'WX)^-1 x_i at the final IRLS weights
//   Cook's distance    (r_P / (1 - h))² h / (φ p), r_P Pearson, p = rank
//   overdispersion     Pearson χ² / (n - rank), about 1 when the family's variance holds
import type { DesignMatrix } from '../../types.ts';
import { modelGeometry, type ModelGeometry } from '../../inference/model-geometry.ts';
import { cooksDistances } from '../../diagnostics/influence.ts';
import { FAMILIES } from './families.ts';
import { LINKS } from './links.ts';
import type { GlmFit } from './types.ts';

export interface GlmResiduals {
  response: Float64Array;
  pearson: Float64Array;
  deviance: Float64Array;
  working: Float64Array;
}

export function glmResiduals(fit: GlmFit): GlmResiduals {
  const family = FAMILIES[fit.family];
  const link = LINKS[fit.link];
  const { y, prior } = fit.working;
  const theta = fit.working.theta ?? Number.NaN;
  const n = y.length;
  const out: GlmResiduals = {
    response: new Float64Array(n), pearson: new Float64Array(n), deviance: new Float64Array(n), working: new Float64Array(n),
  };
  for (let i = 0; i < n; i++) {
    const mu = fit.fitted[i];
    const eta = fit.linearPredictor[i];
    const c = link.complement(eta);
    const r = family.residual(y[i], prior[i], mu, c);
    out.response[i] = r;
    out.pearson[i] = r * Math.sqrt(prior[i] / family.variance(mu, c, theta));
    out.deviance[i] = Math.sign(r) * Math.sqrt(Math.max(0, family.deviance(y[i], prior[i], mu, c, theta)));
    out.working[i] = r / link.derivative(eta);
  }
  return out;
}

export interface GlmInfluence {
  leverages: Float64Array;
  /** Null for a row of leverage 1 (undefined there). */
  cooksDistances: (number | null)[];
}

/** `design` is the design the model was fitted on; `geometry` its factorisation at the IRLS weights, when already made. */
export function glmInfluence(
  fit: GlmFit,
  design: DesignMatrix,
  geometry: ModelGeometry = modelGeometry(fit.working.fit, design, fit.working.weights),
  pearson: Float64Array = glmResiduals(fit).pearson,
): GlmInfluence {
  const { leverages } = geometry;
  return { leverages, cooksDistances: cooksDistances(pearson, leverages, fit.rank, Math.sqrt(fit.dispersion.value)) };
}

export interface Overdispersion {
  /** Pearson χ² / residual df; null with no residual degrees of freedom. */
  ratio: number | null;
  pearsonChiSquare: number;
  residualDf: number;
}

export function overdispersion(fit: Pick<GlmFit, 'pearsonChiSquare' | 'residualDf'>): Overdispersion {
  return {
    ratio: fit.residualDf > 0 ? fit.pearsonChiSquare / fit.residualDf : null,
    pearsonChiSquare: fit.pearsonChiSquare,
    residualDf: fit.residualDf,
  };
}
