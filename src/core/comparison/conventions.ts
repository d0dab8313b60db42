// What every response says it did, in words a reviewer can check against the
// README. Bump CONVENTIONS_VERSION whenever any number could change meaning.
import type { RankingCriterion } from '../scoring/criteria.ts';
import type { RankByChoice } from '../scoring/policy.ts';
import { ALIAS_TOLERANCE } from '../fit/index.ts';
import { PIVOT_TOLERANCE } from '../search/sweep.ts';
import { NONLINEAR_CONVENTIONS } from '../models/nonlinear/conventions.ts';

// 2: coefficient labels of the service's own; predictions of a transformed
// response on the original scale (the median); averaged coefficients over one
// scale and predictions over all; the collinearity condition number of the
// centred regressors; zero weights leave rows out.
export const CONVENTIONS_VERSION = '2';

export interface Conventions {
  version: string;
  parameterCount: string;
  logLikelihood: string;
  weights: string;
  r2: string;
  commonRows: string;
  rank: string;
  fittedElsewhere: string;
  responseTransforms: string;
  rankBy: RankingCriterion;
  rankByReason: string;
  confidenceLevel: number;
  inference: string;
  predictions: string;
  intervalLevel: number;
  /** How lifetime candidates are scored; present only when the comparison has some. */
  lifetime?: Record<string, string>;
  /** The convention of nonlinear candidates, present when the comparison has one. */
  nonlinear?: typeof NONLINEAR_CONVENTIONS;
}

/** The rank rule of a fit by QR on the rows (src/core/fit). */
export const ROWS_RANK_RULE = `a design column is aliased when the part of it not explained by the columns before it, after centring and scaling, is below ${ALIAS_TOLERANCE} of its norm`;

/**
 * The rank rule of a sweep of cross products (fits from a data summary, the
 * subset search's screening). The normal equations carry rounding of about
 * eps times the squared condition number, so the rows' rule (a squared-norm
 * ratio of 1e-20) is below their noise; the sweep's own threshold is stated.
 */
export const SWEEP_RANK_RULE = `a design column is aliased when its sum of squares not explained by the columns before it (centred with an intercept) is below ${PIVOT_TOLERANCE} of its own sum of squares — a remaining-norm ratio of ${Math.sqrt(PIVOT_TOLERANCE).toExponential()}, coarser than the ${ALIAS_TOLERANCE} of a fit on the rows, because normal equations lose digits to the squared condition number`;

/** How coefficients are tested and intervals built (models fitted here, from rows or from a summary). */
export const INFERENCE_RULE =
  'per coefficient of a model fitted here: tStatistic = estimate / standardError and a two-sided pValue from Student\'s t with n − p degrees of freedom (p the rank of the design), and lower/upper = estimate ± t_{(1+L)/2, n−p} · standardError at L = intervalLevel; with weights, the standard errors are those of the weighted fit (σ̂² = Σ w e² / (n − p))';

/** How predictions, their intervals and their average are made. */
export const PREDICTION_RULE =
  'lower/upper: μ̂ ± t_{(1+L)/2, n−p} · standardError for the mean response; predictionLower/predictionUpper: μ̂ ± t · √(σ̂²/w₀ + standardError²) for a new observation of weight w₀ — 1, or its value in the weights column when the prediction rows carry that column. '
  + 'A model of a transformed response g(y) predicts on the original scale as the median g⁻¹(μ̂) (exp(μ̂) for log, μ̂² for sqrt, (1 + λμ̂)^(1/λ) for Box–Cox), its intervals g⁻¹ of the transformed-scale intervals and its standard error by the delta method; for a model of y the mean and the median coincide, so every prediction is of the median response. '
  + 'averaged.predictions: Σ w ŷ over every model that can predict (weights renormalised over them), the unconditional standard error of Burnham & Anderson (2002), and the model-averaged tail-area intervals of Turek & Fletcher (2012), each model\'s interval built on its own scale';

export function conventions(choice: RankByChoice, confidenceLevel: number, intervalLevel: number, rank: string = ROWS_RANK_RULE): Conventions {
  return {
    version: CONVENTIONS_VERSION,
    parameterCount: 'k = estimable coefficients (numerical rank of the design) plus one for the error variance; for a model fitted elsewhere, k as the caller states it',
    logLikelihood: 'full Gaussian maximum-likelihood value, constants included: -n/2 (ln 2π + ln(RSS/n) + 1) + ½ Σ ln w (+ the Jacobian of a response transform)',
    weights: 'relative weights w: RSS = Σ w e², and ½ Σ ln w is added to the log-likelihood; a row of weight 0 is left out (counted in rowsDropped); negative weights are refused',
    r2: 'R² = 1 - RSS/TSS with TSS about the (weighted) mean; uncentred (about 0) for a model without intercept; for a model fitted elsewhere, centred with p = k - 1 coefficients',
    commonRows: 'a row with a missing value in any column any candidate uses, or a weight of 0, is dropped for every candidate',
    rank,
    fittedElsewhere: 'residuals and RSS become the Gaussian log-likelihood above; a stated logLikelihood is used as given (constants are the caller\'s responsibility); observation counts must equal the rows used',
    responseTransforms: 'a model of g(y) gains Σ ln g\'(y): log -Σ ln y, sqrt -Σ ln(2√y), Box–Cox (λ-1) Σ ln y, so its likelihood is on the scale of y',
    rankBy: choice.rankBy,
    rankByReason: choice.reason,
    confidenceLevel,
    inference: INFERENCE_RULE,
    predictions: PREDICTION_RULE,
    intervalLevel,
  };
}
