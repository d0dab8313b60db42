// The shapes of a generalised linear model: family and link names (fixed in
// the public contract), the fit's result and the state its after-ranking
// statistics read.
import type { LeastSquaresFit } from '../../types.ts';

export const FAMILY_NAMES = ['gaussian', 'binomial', 'poisson', 'negativeBinomial', 'gamma', 'inverseGaussian'] as const;
export type GlmFamilyName = (typeof FAMILY_NAMES)[number];

export const LINK_NAMES = ['identity', 'log', 'logit', 'probit', 'cloglog', 'inverse', 'sqrt', 'inverseSquare'] as const;
export type GlmLinkName = (typeof LINK_NAMES)[number];

/** A probability mass (discrete responses) or a density (continuous ones): never compared with each other. */
export type Measure = 'mass' | 'density';

/** θ of the negative binomial, shape of the gamma, dispersion φ of the inverse Gaussian and Gaussian (σ²). */
export type DistributionParameterName = 'theta' | 'shape' | 'dispersion';

export interface DistributionParameter {
  name: DistributionParameterName;
  estimate: number;
  standardError: number | null;
}

export interface GlmCoefficient {
  term: string;
  /** Null for an aliased column. */
  estimate: number | null;
  standardError: number | null;
}

export interface GlmConvergence {
  converged: boolean;
  /** Weighted least-squares solves, every one counted (all of a negative binomial's alternations). */
  iterations: number;
  /** Steps shortened because the deviance rose or the mean left the family's range. */
  stepHalvings: number;
  rule: string;
}

export interface GlmCaution {
  code: string;
  message: string;
}

/**
 * What the after-ranking statistics need and nothing else reads. `fit` is the
 * last weighted least-squares solve with the model's coefficients in place of
 * its own and sigma = sqrt(dispersion): its unscaled covariance is
 * (X'WX)^-1 at the final IRLS weights, so leverages, prediction variances and
 * estimability come from the least-squares machinery unchanged.
 */
export interface GlmWorkingState {
  fit: LeastSquaresFit;
  /** IRLS weights w_i = prior_i (dμ/dη)² / V(μ_i) of that solve. */
  weights: Float64Array;
  /** The response as sent: successes for the binomial. */
  y: Float64Array;
  /** Prior weights: trials for the binomial, relative weights for the Gaussian, else 1. */
  prior: Float64Array;
  offset: Float64Array | null;
  /** θ of a negative binomial (variance μ + μ²/θ); null for the other families. */
  theta: number | null;
}

export interface GlmFit {
  ok: true;
  family: GlmFamilyName;
  link: GlmLinkName;
  measure: Measure;
  /** Rows used (groups for a grouped binomial, not trials). */
  observations: number;
  /** k: estimable coefficients plus one for θ, the gamma shape or the dispersion where the family estimates one. */
  parameters: number;
  rank: number;
  /** Full log-likelihood, every constant included; null only for a Gaussian exact fit (unbounded). */
  logLikelihood: number | null;
  deviance: number;
  /** Deviance of the intercept-only model with the same offset (the offset-only model without an intercept); null when it cannot be fitted. */
  nullDeviance: number | null;
  /** 1 - deviance / nullDeviance; null when the null deviance is null or 0. */
  devianceExplained: number | null;
  pearsonChiSquare: number;
  /** n - rank. */
  residualDf: number;
  coefficients: GlmCoefficient[];
  aliased: string[];
  /** dispersion × (X'WX)^-1 over the estimable columns, in design order. */
  covariance: { terms: string[]; matrix: number[][] };
  /** The dispersion φ the standard errors use, and where it comes from. */
  dispersion: { value: number; basis: string };
  distributionParameters: DistributionParameter[];
  convergence: GlmConvergence;
  conditionNumber: number | null;
  /** Fitted means μ per row (success probabilities for the binomial). */
  fitted: Float64Array;
  /** η per row, offset included. */
  linearPredictor: Float64Array;
  cautions: GlmCaution[];
  working: GlmWorkingState;
}

/** The per-model fields of a generalised linear model (names fixed by the public contract). */
export interface GlmReportFields {
  family: GlmFamilyName;
  /** Null for means fitted elsewhere (the service does not know the link). */
  link: GlmLinkName | null;
  deviance: number | null;
  nullDeviance: number | null;
  pearsonChiSquare: number | null;
  distributionParameters: DistributionParameter[];
  /** Null for means fitted elsewhere. */
  convergence: { converged: boolean; iterations: number; stepHalvings: number; rule: string } | null;
  devianceExplained: number | null;
}
